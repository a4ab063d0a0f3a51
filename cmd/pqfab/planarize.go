package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"strings"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/panels"
)

// planarizeFlags are the options of planarization, shared with build.
type planarizeFlags struct {
	tol, maxMove, fairness float64
	supports               string
	vertical               bool
	maxIter                int
}

func (pf *planarizeFlags) register(fs *flag.FlagSet) {
	fs.Float64Var(&pf.tol, "tol", panels.DefaultFlatTolMM, "flatness deviation every panel must reach (mm)")
	fs.Float64Var(&pf.maxMove, "max-move", panels.DefaultMaxMoveMM, "largest node move allowed (mm)")
	fs.Float64Var(&pf.fairness, "fairness", panels.DefaultFairness, "weight of smooth moves against small moves (0: off)")
	fs.StringVar(&pf.supports, "supports", "boundary", "nodes that never move: boundary, none, file (flags in a CSV net) or node ids a,b,c")
	fs.BoolVar(&pf.vertical, "vertical", false, "move nodes only along z (plan layout fixed)")
	fs.IntVar(&pf.maxIter, "max-iter", panels.DefaultMaxIter, "iteration budget")
}

// supportMask turns the --supports choice into a flag per node.
func supportMask(choice string, net *geom.Net, topo *geom.Topology) ([]bool, error) {
	fixed := make([]bool, len(net.Nodes))
	switch choice {
	case "none":
	case "boundary":
		copy(fixed, topo.BoundaryNodes(len(net.Nodes)))
	case "file":
		for i, nd := range net.Nodes {
			fixed[i] = nd.Support
		}
	default:
		byID := make(map[string]int, len(net.Nodes))
		for i, nd := range net.Nodes {
			byID[nd.ID] = i
		}
		for _, id := range strings.Split(choice, ",") {
			id = strings.TrimSpace(id)
			i, ok := byID[id]
			if !ok {
				return nil, fmt.Errorf("supports: node %q is not in %s (want boundary, none, file or node ids)", id, net.Source)
			}
			fixed[i] = true
		}
	}
	return fixed, nil
}

func (pf *planarizeFlags) options(net *geom.Net, topo *geom.Topology) (panels.PlanarizeOptions, error) {
	opt := panels.PlanarizeOptions{TolMM: pf.tol, MaxMoveMM: pf.maxMove, Fairness: pf.fairness, Vertical: pf.vertical, MaxIter: pf.maxIter}
	switch {
	case !(pf.tol > 0):
		return opt, usagef("--tol %g: must be more than 0 mm", pf.tol)
	case !(pf.maxMove > 0):
		return opt, usagef("--max-move %g: must be more than 0 mm", pf.maxMove)
	case !(pf.fairness >= 0):
		return opt, usagef("--fairness %g: must be 0 or more", pf.fairness)
	case pf.maxIter <= 0:
		return opt, usagef("--max-iter %d: must be positive", pf.maxIter)
	}
	fixed, err := supportMask(pf.supports, net, topo)
	if err != nil {
		return opt, usagef("--%v", err)
	}
	opt.Fixed = fixed
	return opt, nil
}

// planarizeReport is the JSON report of `planarize --report`.
type planarizeReport struct {
	Net        string         `json:"net"`
	TolMM      float64        `json:"tolerance_mm"`
	Converged  bool           `json:"converged"`
	Iterations int            `json:"iterations"`
	Seconds    float64        `json:"seconds"`
	MaxMoveMM  float64        `json:"max_move_mm"`
	RMSMoveMM  float64        `json:"rms_move_mm"`
	FlatBefore panels.Spread  `json:"flatness_before_mm"`
	FlatAfter  panels.Spread  `json:"flatness_after_mm"`
	Nodes      []nodeMove     `json:"nodes"`
	Panels     []panelFlatRow `json:"panels"`
	Caution    string         `json:"caution"`
}

type nodeMove struct {
	ID      string     `json:"id"`
	Support bool       `json:"support"`
	MoveMM  float64    `json:"move_mm"`
	Vector  [3]float64 `json:"vector_mm"`
}

type panelFlatRow struct {
	ID       string  `json:"id"`
	BeforeMM float64 `json:"flatness_before_mm"`
	AfterMM  float64 `json:"flatness_after_mm"`
}

func newPlanarizeReport(net *geom.Net, opt panels.PlanarizeOptions, res *panels.PlanarizeResult, secs float64) *planarizeReport {
	r := &planarizeReport{Net: net.Source, TolMM: opt.TolMM, Converged: res.Converged, Iterations: res.Iterations,
		Seconds: export.Round(secs, 3), MaxMoveMM: export.Round(res.MaxMoveMM, 3), RMSMoveMM: export.Round(res.RMSMoveMM, 3),
		FlatBefore: export.RoundSpread(panels.SpreadOf(res.Before), 3), FlatAfter: export.RoundSpread(panels.SpreadOf(res.After), 4),
		Caution: strings.ReplaceAll(caution, "\n", " ")}
	for i, nd := range net.Nodes {
		m := res.Moves[i]
		r.Nodes = append(r.Nodes, nodeMove{ID: nd.ID, Support: opt.Fixed != nil && opt.Fixed[i], MoveMM: export.Round(r3.Norm(m), 3),
			Vector: [3]float64{export.Round(m.X, 3), export.Round(m.Y, 3), export.Round(m.Z, 3)}})
	}
	for f, face := range net.Faces {
		r.Panels = append(r.Panels, panelFlatRow{ID: face.ID, BeforeMM: export.Round(res.Before[f], 3), AfterMM: export.Round(res.After[f], 4)})
	}
	return r
}

func printPlanarizeSummary(w io.Writer, r *planarizeReport, supports int) {
	fmt.Fprintf(w, "planarized %s: %d iterations, %.2f s\n", r.Net, r.Iterations, r.Seconds)
	fmt.Fprintf(w, "  supports     %d nodes held fixed\n", supports)
	fmt.Fprintf(w, "  node moves   max %.3f mm, RMS %.3f mm\n", r.MaxMoveMM, r.RMSMoveMM)
	fmt.Fprintf(w, "  flatness     before min %.3f  median %.3f  max %.3f mm\n", r.FlatBefore.Min, r.FlatBefore.Median, r.FlatBefore.Max)
	fmt.Fprintf(w, "               after  min %.4f median %.4f max %.4f mm (tolerance %.3g mm)\n", r.FlatAfter.Min, r.FlatAfter.Median, r.FlatAfter.Max, r.TolMM)
}

// planarizeNet runs the planarization with a progress bar.
func planarizeNet(net *geom.Net, topo *geom.Topology, opt panels.PlanarizeOptions, stderr io.Writer, quiet bool) (*panels.PlanarizeResult, error) {
	bar := newProgress(stderr, quiet, opt.MaxIter, "planarize")
	opt.Progress = func(p panels.Progress) {
		bar.set(p.Iter, fmt.Sprintf("planarize: worst %.3f mm, %d over", p.MaxFlatMM, p.OverTol))
	}
	res, err := panels.Planarize(net, topo, opt)
	bar.done()
	return res, err
}

func runPlanarize(args []string, _ io.Reader, stdout, stderr io.Writer) error {
	fs := newFlags("planarize", "NET -o OUT.obj", stderr)
	var nf netFlags
	var pf planarizeFlags
	nf.register(fs)
	pf.register(fs)
	out := fs.String("o", "", "planarized net, OBJ in mm (required)")
	report := fs.String("report", "", "also write the full report (per node moves, per panel flatness) as JSON")
	quiet := fs.Bool("q", false, "no progress bar")
	pos, err := parseCommand(fs, args, 1, "one net file")
	if errors.Is(err, errHelp) {
		return nil
	} else if err != nil {
		return err
	}
	if *out == "" {
		return usagef("planarize needs -o OUT.obj")
	}
	net, topo, err := loadNet(pos[0], nf, stderr)
	if err != nil {
		return err
	}
	opt, err := pf.options(net, topo)
	if err != nil {
		return err
	}
	start := time.Now()
	res, perr := planarizeNet(net, topo, opt, stderr, *quiet)
	if res == nil {
		return perr
	}
	rep := newPlanarizeReport(net, opt, res, time.Since(start).Seconds())
	supports := 0
	for _, f := range opt.Fixed {
		if f {
			supports++
		}
	}
	printPlanarizeSummary(stdout, rep, supports)
	if *report != "" {
		if err := export.WriteFileAtomic(*report, func(w io.Writer) error {
			return writeJSON(w, rep)
		}); err != nil {
			return err
		}
	}
	if perr != nil {
		return perr // nothing written but the diagnostic report
	}
	flat := net.Clone()
	for i := range flat.Nodes {
		flat.Nodes[i].Pos = res.Positions[i]
	}
	return export.WriteFileAtomic(*out, func(w io.Writer) error {
		return export.WriteOBJ(w, flat, "pqfab planarized net from "+net.Source)
	})
}
