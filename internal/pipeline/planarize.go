package pipeline

import (
	"fmt"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/internal/num"
	"pqfab/panels"
	"pqfab/quadnet"
)

// Planarize runs the planarization of net with opt, reporting each
// iteration to obs as stage "planarize". It returns the result (nil only
// when opt is bad) and, when the tolerance or the move limit is not met,
// a *panels.PlanarizeError beside it.
func Planarize(net *quadnet.Net, topo *quadnet.Topology, opt panels.PlanarizeOptions, obs Observer) (*panels.PlanarizeResult, error) {
	opt.Progress = func(p panels.Progress) {
		obs.Step("planarize", p.Iter, p.MaxIter, fmt.Sprintf("planarize: worst %.3f mm, %d over by %.1f mm in all", p.MaxFlatMM, p.OverTol, p.ExcessMM))
	}
	return panels.Planarize(net, topo, opt)
}

// Moved returns a copy of net with the planarized positions.
func Moved(net *quadnet.Net, res *panels.PlanarizeResult) *quadnet.Net {
	flat := net.Clone()
	for i := range flat.Nodes {
		flat.Nodes[i].Pos = res.Positions[i]
	}
	return flat
}

// PlanarizeReport is the JSON report of a planarization: `planarize
// --report`, and the diagnostic report a failed build writes.
type PlanarizeReport struct {
	WrittenBy string  `json:"written_by"` // "pqfab": marks the file as pqfab's own
	Net       string  `json:"net"`
	TolMM     float64 `json:"tolerance_mm"`
	Converged bool    `json:"converged"`
	// StoppedBy names the limit that stopped a planarization short of the
	// tolerance; NeededMoveMM is the largest node move a run without the
	// move limit needed to reach it (when the move limit stopped it and
	// that run succeeded).
	StoppedBy    string          `json:"stopped_by,omitempty"`
	NeededMoveMM float64         `json:"needed_move_mm,omitempty"`
	OverTol      int             `json:"panels_over_tolerance"`
	Iterations   int             `json:"iterations"`
	Supports     int             `json:"supports"` // nodes held fixed
	MaxMoveMM    float64         `json:"max_move_mm"`
	RMSMoveMM    float64         `json:"rms_move_mm"`
	FlatBefore   panels.Spread   `json:"flatness_before_mm"`
	FlatAfter    panels.Spread   `json:"flatness_after_mm"`
	Nodes        []NodeMoveRow   `json:"nodes"`
	Panels       []PanelFlatness `json:"panels"`
	Caution      string          `json:"caution"`
}

// NodeMoveRow is one node's move.
type NodeMoveRow struct {
	ID      string     `json:"id"`
	Support bool       `json:"support"`
	MoveMM  float64    `json:"move_mm"`
	Vector  [3]float64 `json:"vector_mm"`
}

// PanelFlatness is one panel's flatness before and after.
type PanelFlatness struct {
	ID       string  `json:"id"`
	BeforeMM float64 `json:"flatness_before_mm"`
	AfterMM  float64 `json:"flatness_after_mm"`
}

// NewPlanarizeReport builds the report of a planarization.
func NewPlanarizeReport(net *quadnet.Net, opt panels.PlanarizeOptions, res *panels.PlanarizeResult) *PlanarizeReport {
	r := &PlanarizeReport{WrittenBy: "pqfab", Net: net.Source, TolMM: opt.TolMM, Converged: res.Converged, Iterations: res.Iterations,
		MaxMoveMM: num.Round(res.MaxMoveMM, 3), RMSMoveMM: num.Round(res.RMSMoveMM, 3),
		FlatBefore: panels.SpreadOf(res.Before).Rounded(3), FlatAfter: panels.SpreadOf(res.After).Rounded(4),
		NeededMoveMM: num.Round(res.NeedMoveMM, 1),
		Caution:      "Caution: " + Caution}
	if res.Stop != panels.StopNone {
		r.StoppedBy = res.Stop.String()
	}
	for _, f := range res.After {
		if f > opt.TolMM {
			r.OverTol++
		}
	}
	for i, nd := range net.Nodes {
		if opt.Fixed != nil && opt.Fixed[i] {
			r.Supports++
		}
		m := res.Moves[i]
		r.Nodes = append(r.Nodes, NodeMoveRow{ID: nd.ID, Support: opt.Fixed != nil && opt.Fixed[i], MoveMM: num.Round(r3.Norm(m), 3),
			Vector: [3]float64{num.Round(m.X, 3), num.Round(m.Y, 3), num.Round(m.Z, 3)}})
	}
	for f, face := range net.Faces {
		r.Panels = append(r.Panels, PanelFlatness{ID: face.ID, BeforeMM: num.Round(res.Before[f], 3), AfterMM: num.Round(res.After[f], 4)})
	}
	return r
}
