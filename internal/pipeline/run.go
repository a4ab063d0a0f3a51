package pipeline

import (
	"context"
	"errors"
	"fmt"
	"time"

	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/nodes"
	"pqfab/nodes/bars"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/parttype"
	"pqfab/quadnet"
)

// Policy says what a build does when the job cannot be met in full.
type Policy struct {
	// Continue builds from the best state reached when panels miss the
	// flatness tolerance or fit no stock sheet, listing them in warnings.
	Continue bool
}

// Result is everything a job computed.
type Result struct {
	Job       *job.Job
	NetPath   string
	Net       *quadnet.Net // planarized, in canonical order
	Order     *FileOrder   // maps Net back to the net file's order (nil: Net is in it)
	Topo      *quadnet.Topology
	Supports  []bool
	Warnings  []string
	Planarize *panels.PlanarizeResult
	Bays      quadnet.Bays

	Structure      *nodes.Structure
	Flats          []panels.Flat
	PanelTypes     []panels.Type
	PanelTypeBound parttype.Bound // lower bound on the number of panel types
	// PanelTypeSetOut is each panel type's nominal set-out outline: its
	// nominal cut outline grown by the edge inset.
	PanelTypeSetOut []geom.Polygon
	// TypeSpecs is every panel type's specification (with its thickness
	// and density), by type name.
	TypeSpecs map[string]PanelSpec

	Stocks  []nest.Stock
	Nesting *nest.Result

	// Every member's blank (label and blank length), the bar stock and the
	// members' cutting plan (nil without [[bar]] tables).
	Blanks    []bars.Piece
	BarStocks []bars.Stock
	BarPlan   *bars.Plan
}

// PlanarityFailure is returned by Run when the flatness tolerance cannot be
// met within the allowed move and the policy does not continue. Report is
// the diagnostic report to hand to the user.
type PlanarityFailure struct {
	Err    *panels.PlanarizeError
	Report *PlanarizeReport
	Path   string // where Build wrote Report, if it did
}

func (e *PlanarityFailure) Error() string { return e.Err.Error() }

// Unwrap returns the planarization error.
func (e *PlanarityFailure) Unwrap() error { return e.Err }

// ErrUnplaced is wrapped by the error Run returns when panels fit no stock
// sheet, or member blanks no bar, and the policy does not continue.
var (
	ErrUnplaced        = errors.New("panels are on no stock sheet")
	ErrMembersUnplaced = errors.New("members are on no bar")
)

// Run computes job j and writes nothing (Build runs it, then writes): it
// reads the net through open, checks and planarizes it, computes nodes,
// members, panels and types, and nests the panels. Errors name the file,
// the line and the element or job key.
//
// ctx, and the job's nesting.seconds when not 0, bound the nesting's
// search in time: when either ends, the search stops early and a warning
// says so (the layout then depends on the machine;
// without a deadline it depends only on the job).
func Run(ctx context.Context, j *job.Job, open Opener, obs Observer, pol Policy) (*Result, error) {
	res := &Result{Job: j, NetPath: j.NetPath(), Stocks: j.Stocks()}
	warn := func(msg string) {
		res.Warnings = append(res.Warnings, msg)
		obs.Warn(msg)
	}
	in, err := LoadNet(open, res.NetPath, j.Unit(), j.ValidateOptions(), j.Net.Reorient)
	if err != nil {
		return nil, err
	}
	for _, w := range in.Warnings {
		warn(w)
	}
	net, topo := in.Net, in.Topo
	res.Topo, res.Order = topo, in.Order
	if res.Supports, err = Supports(j.Supports.Mode, j.Supports.Nodes, net, topo); err != nil {
		key := "supports.nodes"
		if j.Supports.Mode != "list" {
			key = "supports.mode"
		}
		return nil, j.KeyError(key, err)
	}
	popt := j.PlanarizeOptions()
	popt.Fixed = res.Supports
	pres, perr := Planarize(net, topo, popt, obs)
	if pres == nil {
		return nil, perr
	}
	if perr != nil {
		var pe *panels.PlanarizeError
		if !errors.As(perr, &pe) {
			return nil, perr
		}
		if !pol.Continue {
			return nil, &PlanarityFailure{Err: pe, Report: NewPlanarizeReport(net, popt, pres)}
		}
		warn("built with panels over the flatness tolerance: " + perr.Error())
	}
	res.Planarize = pres
	res.Net = Moved(net, pres)

	st, bays, err := Structure(res.Net, topo, j.NodeOptions(), j.Nodes.BayMM)
	switch {
	case errors.Is(err, nodes.ErrHubTooLarge):
		return nil, j.KeyError("nodes.hub_radius_mm", err)
	case err != nil:
		return nil, err
	}
	res.Structure, res.Bays = st, bays
	// The members' cutting plan is worked out beside the panels and the
	// nesting (neither needs the other); its outcome is taken in, and its
	// warnings listed, before the nesting's. A cutting plan that ends the
	// job stops the nesting early: its error is the one reported, as when
	// the bars were cut first.
	nctx, stopNest := context.WithCancel(ctx)
	defer stopNest()
	waitBars, err := startCutPlan(j, res, obs, pol, stopNest)
	if err != nil {
		return nil, err
	}
	if err := panelsAndNest(nctx, j, res, obs); err != nil {
		if berr := waitBars(warn); berr != nil {
			return nil, berr
		}
		return nil, err
	}
	if err := waitBars(warn); err != nil {
		return nil, err
	}
	if res.Nesting.Stopped {
		warn(fmt.Sprintf("the nesting search was stopped by its time limit after %d of its %d steps: this layout depends on the machine's speed; without a time limit it depends only on the job",
			res.Nesting.Steps, j.NestOptions().Steps))
	}
	if un := res.Nesting.Unplaced; len(un) > 0 {
		u := un[0]
		face := res.Net.Faces[u.Part]
		if !pol.Continue {
			return nil, j.KeyError("stock", fmt.Errorf("%d %w; the first, %s (panel %s, %s line %d), is %s",
				len(un), ErrUnplaced, res.Flats[u.Part].Label, face.ID, res.NetPath, face.Line, u.Reason))
		}
		for _, u := range un {
			warn(fmt.Sprintf("panel %s is on no sheet: %s", res.Flats[u.Part].Label, u.Reason))
		}
	}
	return res, nil
}

// startCutPlan starts cutting the members' blanks from the job's bar
// stock, if it has any, beside the caller, and returns the function (call
// it once) that waits for the plan and takes it in: unplaced members end
// the job, or are listed as warnings when the policy continues. When the
// plan will end the job, stop is called as soon as that is known. Only the
// caller's goroutine tells obs.
func startCutPlan(j *job.Job, res *Result, obs Observer, pol Policy, stop func()) (wait func(warn func(string)) error, err error) {
	pieces, err := bars.MemberPieces(res.Structure.Members, res.Structure.Section)
	if err != nil {
		return nil, err
	}
	res.Blanks, res.BarStocks = pieces, j.BarStocks()
	if len(res.BarStocks) == 0 {
		return func(func(string)) error { return nil }, nil
	}
	obs.Step("bars", 0, 1, fmt.Sprintf("bars: %d members on %d bar lengths", len(pieces), len(res.BarStocks)))
	type solved struct {
		plan *bars.Plan
		err  error
	}
	ch := make(chan solved, 1)
	stocks := res.BarStocks
	go func() {
		plan, err := bars.Solve(pieces, stocks, bars.Options{})
		if err != nil || (len(plan.Unplaced) > 0 && !pol.Continue) {
			stop()
		}
		ch <- solved{plan, err}
	}()
	return func(warn func(string)) error {
		var got solved
		select {
		case got = <-ch:
		default: // still cutting: say so while waiting
			obs.Step("bars", 0, 1, fmt.Sprintf("bars: finishing the cutting plan of %d members", len(pieces)))
			got = <-ch
			obs.Step("bars", 1, 1, "bars: done")
		}
		return takeCutPlan(j, res, got.plan, got.err, pol, warn)
	}, nil
}

// takeCutPlan takes in the members' cutting plan (startCutPlan).
func takeCutPlan(j *job.Job, res *Result, plan *bars.Plan, err error, pol Policy, warn func(string)) error {
	if err != nil {
		return j.KeyError("bar", err)
	}
	pieces := res.Blanks
	if un := plan.Unplaced; len(un) > 0 {
		if !pol.Continue {
			return j.KeyError("bar", fmt.Errorf("%d %w; the first is %s: %s", len(un), ErrMembersUnplaced, pieces[un[0].Piece].Label, un[0].Detail))
		}
		for _, u := range un {
			warn(fmt.Sprintf("member %s is on no bar: %s", pieces[u.Piece].Label, u.Detail))
		}
	}
	res.BarPlan = plan
	return nil
}

// setOutlines returns each panel type's set-out outline: its nominal cut
// outline grown back by the edge inset d (the inset's edge lines moved
// out again). For a triangle or a quad, convex or not, this cannot fail:
// growing lengthens each edge by d·(cot(a/2) + cot(b/2)) for the inner
// angles a, b at its ends (a square's edges grow by 2d), positive since
// a + b < 360° (a quad's four angles sum to 360°). With five or more
// corners an edge between two reflex corners shortens and can vanish;
// the error names the type.
func setOutlines(types []panels.Type, insetMM float64) ([]geom.Polygon, error) {
	var out []geom.Polygon
	for _, t := range types {
		grown := t.Outline
		if insetMM > 0 {
			var err error
			if grown, err = panels.Inset(t.Outline, -insetMM); err != nil {
				return nil, fmt.Errorf("panel type %s: its nominal outline cannot be grown back by the %g mm edge inset: %w", t.Name, insetMM, err)
			}
		}
		out = append(out, grown)
	}
	return out, nil
}

// panelsAndNest lays the panels flat, groups them into types and nests
// them (Run).
func panelsAndNest(ctx context.Context, j *job.Job, res *Result, obs Observer) error {
	var err error
	res.Flats, err = Panels(res.Net, res.Topo, j.Material(), res.Bays, NodeLabels(res.Structure))
	switch {
	case errors.Is(err, panels.ErrInsetTooLarge):
		return j.KeyError("panel.edge_inset_mm", err)
	case err != nil:
		return err
	}
	// Panels picked by label or bay take their table's thickness and
	// density, and never share a type with other panels.
	pick, err := pickPanels(j, res.Flats)
	if err != nil {
		return err
	}
	for f := range res.Flats {
		if pick[f] >= 0 {
			fl := &res.Flats[f]
			fl.SpecGroup = pick[f] + 1
			fl.WeightKg = panelMaterial(j, pick[f]).WeightKg(fl.AreaM2)
		}
	}
	if res.PanelTypes, res.PanelTypeBound, err = panels.Group(res.Flats, j.PanelTypeOptions()); err != nil {
		return err
	}
	// Every panel's corner 1 is its type's corner 1, so that the type
	// drawing, the cut sheets and the schedule number corners and edges
	// alike.
	for _, t := range res.PanelTypes {
		for n, f := range t.Panels {
			if err := panels.StartAt(res.Net, panelMaterial(j, pick[f]), &res.Flats[f], t.Start[n]); err != nil {
				return err
			}
			t.Start[n] = 0
		}
	}
	if res.PanelTypeSetOut, err = setOutlines(res.PanelTypes, j.Material().EdgeInsetMM); err != nil {
		return j.KeyError("panel.edge_inset_mm", err)
	}
	if res.TypeSpecs, err = typeSpecs(j, res.PanelTypes, res.Flats, pick); err != nil {
		return err
	}

	if j.Nesting.Seconds > 0 {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, time.Duration(j.Nesting.Seconds*float64(time.Second)))
		defer cancel()
	}
	res.Nesting, err = Nest(ctx, Parts(res.Flats), res.Flats, res.Stocks, j.NestOptions(), obs)
	if err != nil {
		return err
	}
	return nil
}

// FileNet returns the planarized net in the net file's order: node i and
// panel j are the file's node i and panel j, each panel starting at the
// file's first corner (see FileOrder).
func (r *Result) FileNet() *quadnet.Net {
	if r.Order == nil {
		return r.Net
	}
	return r.Order.Apply(r.Net)
}
