package pipeline

import (
	"context"
	"fmt"
	"math"
	"sync"

	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/quadnet"
)

// Structure cuts the plan of net into bays of bayMM and computes node
// axes, members, hubs, labels and member and node types (nodes.Build).
func Structure(net *quadnet.Net, topo *quadnet.Topology, opt nodes.Options, bayMM float64) (*nodes.Structure, quadnet.Bays, error) {
	bays, err := quadnet.NewBays(net.Positions(), bayMM, bayMM)
	if err != nil {
		return nil, bays, err
	}
	opt.Bays = bays
	st, err := nodes.Build(net, topo, opt)
	return st, bays, err
}

// NodeLabels returns the labels of a structure's nodes.
func NodeLabels(st *nodes.Structure) []string {
	out := make([]string, len(st.Nodes))
	for i, nd := range st.Nodes {
		out[i] = nd.Label
	}
	return out
}

// Panels lays every panel of net flat with material mat and labels it by
// its bay (panels.Labels, panels.Flatten).
func Panels(net *quadnet.Net, topo *quadnet.Topology, mat panels.Material, bays quadnet.Bays, nodeLabels []string) ([]panels.Flat, error) {
	return panels.Flatten(net, topo, mat, panels.Labels(net, bays, nodeLabels))
}

// Parts returns the cut outlines of flat panels as parts to nest; part i
// is panel i. Each outline is turned so that its grain direction
// (Flat.GrainDeg) runs along x, which stock that allows only turns of 0
// and 180° keeps along the sheet's x axis; Nest turns the placements back
// to the panels' own frames.
func Parts(flats []panels.Flat) []nest.Part {
	parts := make([]nest.Part, len(flats))
	for i, f := range flats {
		out := f.Cut
		if f.GrainDeg != 0 {
			out = f.Cut.Rotate(-f.GrainDeg * math.Pi / 180)
		}
		parts[i] = nest.Part{Label: f.Label, Outline: out}
	}
	return parts
}

// nestShowing runs nest.NestWith and shows its progress to obs from this
// goroutine (the observer's one), the latest state at a time.
func nestShowing(ctx context.Context, parts []nest.Part, stocks []nest.Stock, opt nest.Options, obs Observer) (*nest.Result, error) {
	var mu sync.Mutex
	var last nest.Progress
	news := make(chan struct{}, 1)
	opt.Progress = func(p nest.Progress) {
		mu.Lock()
		last = p
		mu.Unlock()
		select {
		case news <- struct{}{}:
		default:
		}
	}
	type answer struct {
		res *nest.Result
		err error
	}
	done := make(chan answer, 1)
	go func() {
		res, err := nest.NestWith(ctx, parts, stocks, opt)
		done <- answer{res, err}
	}()
	for {
		select {
		case a := <-done:
			return a.res, a.err
		case <-news:
			mu.Lock()
			p := last
			mu.Unlock()
			note := fmt.Sprintf("nest: %s, %d sheets, %d of %d panels placed", p.Phase, p.Sheets, p.Placed, p.Parts)
			if p.Phase == nest.PhaseImprove {
				note = fmt.Sprintf("nest: %s, %d sheets", p.Phase, p.Sheets)
			}
			obs.Step("nest", p.Placed, p.Parts+1, note)
		}
	}
}

// Nest places the parts (made by Parts from flats) on the stock sheets
// with the search options opt, reporting to obs as stage "nest"; when ctx
// ends, the search stops early (Result.Stopped). Placement turns are given
// for the panels' own cut outlines.
func Nest(ctx context.Context, parts []nest.Part, flats []panels.Flat, stocks []nest.Stock, opt nest.Options, obs Observer) (*nest.Result, error) {
	obs.Step("nest", 0, 1, fmt.Sprintf("nest: %d panels on %d stock sizes", len(parts), len(stocks)))
	res, err := nestShowing(ctx, parts, stocks, opt, obs)
	obs.Step("nest", 1, 1, "nest: done")
	if err != nil {
		return nil, err
	}
	for s := range res.Sheets {
		for k := range res.Sheets[s].Placements {
			p := &res.Sheets[s].Placements[k]
			g := flats[p.Part].GrainDeg
			// Placed = turn(rot) ∘ mirror? ∘ turn(−g) applied to the cut
			// outline; a mirror turns a turn the other way.
			if p.Mirrored {
				g = -g
			}
			p.RotationDeg = math.Mod(p.RotationDeg-g+720, 360)
		}
	}
	return res, nil
}
