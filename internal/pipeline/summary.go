package pipeline

import (
	"context"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/internal/num"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/quadnet"
)

// Inspection sums up a net as read: counts, bounds, members at each node,
// planarity and the worst panels.
type Inspection struct {
	File            string         `json:"file"`
	Nodes           int            `json:"nodes"`
	Supports        int            `json:"supports"`
	Panels          int            `json:"panels"`
	PanelsByCorners map[string]int `json:"panels_by_corners"`
	Edges           int            `json:"edges"`
	BoundaryEdges   int            `json:"boundary_edges"`
	BoundaryLoops   int            `json:"boundary_loops"`
	BoundaryLengthM float64        `json:"boundary_length_m"`
	BoundsMinMM     [3]float64     `json:"bounds_min_mm"`
	BoundsMaxMM     [3]float64     `json:"bounds_max_mm"`
	SizeMM          [3]float64     `json:"size_mm"`
	MembersAtNode   map[string]int `json:"members_at_node"` // nodes by the number of members meeting there
	RatioPct        panels.Spread  `json:"planarity_ratio_pct"`
	FlatnessMM      panels.Spread  `json:"flatness_mm"`
	Worst           []WorstPanel   `json:"worst_panels"`
}

// WorstPanel is one of the least flat panels.
type WorstPanel struct {
	Panel      string  `json:"panel"`
	Line       int     `json:"line,omitempty"`
	FlatnessMM float64 `json:"flatness_mm"`
	RatioPct   float64 `json:"ratio_pct"`
	GapMM      float64 `json:"diagonal_gap_mm"`
}

// Inspect sums up a checked net.
func Inspect(file string, net *quadnet.Net, topo *quadnet.Topology) (*Inspection, error) {
	in := &Inspection{File: file, Nodes: len(net.Nodes), Panels: len(net.Faces), Edges: len(topo.Edges),
		BoundaryLoops: len(topo.Loops), PanelsByCorners: map[string]int{}, MembersAtNode: map[string]int{}}
	for _, nd := range net.Nodes {
		if nd.Support {
			in.Supports++
		}
	}
	for _, f := range net.Faces {
		in.PanelsByCorners[fmt.Sprint(len(f.Corners))]++
	}
	for _, e := range topo.Edges {
		if e.Boundary() {
			in.BoundaryEdges++
		}
	}
	in.BoundaryLengthM = num.Round(topo.BoundaryLength(net)/1000, 3)
	lo, hi := net.Bounds()
	size := r3.Sub(hi, lo)
	in.BoundsMinMM = [3]float64{num.Round(lo.X, 1), num.Round(lo.Y, 1), num.Round(lo.Z, 1)}
	in.BoundsMaxMM = [3]float64{num.Round(hi.X, 1), num.Round(hi.Y, 1), num.Round(hi.Z, 1)}
	in.SizeMM = [3]float64{num.Round(size.X, 1), num.Round(size.Y, 1), num.Round(size.Z, 1)}
	for v, c := range topo.ValenceHistogram() {
		if c > 0 {
			in.MembersAtNode[fmt.Sprint(v)] = c
		}
	}
	pl, err := panels.MeasureNet(net)
	if err != nil {
		return nil, err
	}
	ratios := make([]float64, len(pl))
	flat := make([]float64, len(pl))
	for i, p := range pl {
		ratios[i] = p.Ratio * 100
		flat[i] = p.Flatness
	}
	in.RatioPct = panels.SpreadOf(ratios).Rounded(4)
	in.FlatnessMM = panels.SpreadOf(flat).Rounded(3)
	for _, f := range panels.Worst(pl, 10) {
		in.Worst = append(in.Worst, WorstPanel{Panel: net.Faces[f].ID, Line: net.Faces[f].Line,
			FlatnessMM: num.Round(pl[f].Flatness, 3), RatioPct: num.Round(pl[f].Ratio*100, 4), GapMM: num.Round(pl[f].DiagonalGap, 3)})
	}
	return in, nil
}

// TwistBins are the upper edges of the |twist| histogram (degrees).
var TwistBins = []float64{0.01, 0.1, 0.5, 1, 2, 5, math.Inf(1)}

// MemberSummary sums up members and nodes: twist spread and histogram,
// cut lengths and type counts.
type MemberSummary struct {
	Net            string        `json:"net"`
	Axis           string        `json:"axis"`
	Members        int           `json:"members"`
	Nodes          int           `json:"nodes"`
	TwistDeg       panels.Spread `json:"abs_twist_deg"`
	TwistNormalMax float64       `json:"max_abs_twist_normal_axes_deg"`
	TwistHistogram []BinCount    `json:"abs_twist_histogram"`
	CutLengthMM    panels.Spread `json:"cut_length_mm"`
	MemberTypes    int           `json:"member_types"`
	NodeTypes      int           `json:"node_types"`
	TopTypes       []TypeCount   `json:"largest_member_types"`
}

// BinCount is one bar of a histogram.
type BinCount struct {
	UpToDeg float64 `json:"up_to_deg"` // -1 for no upper limit
	Count   int     `json:"count"`
}

// TypeCount is a member type with its count.
type TypeCount struct {
	Type        string  `json:"type"`
	Count       int     `json:"count"`
	CutLengthMM float64 `json:"cut_length_mm"`
}

// SummarizeMembers sums up a structure.
func SummarizeMembers(file string, axis nodes.AxisMethod, s *nodes.Structure) *MemberSummary {
	sum := &MemberSummary{Net: file, Axis: string(axis), Members: len(s.Members), Nodes: len(s.Nodes),
		MemberTypes: len(s.MemberTypes), NodeTypes: len(s.NodeTypes), TwistNormalMax: num.Round(s.TwistNormalDeg, 6)}
	tw := make([]float64, len(s.Members))
	cut := make([]float64, len(s.Members))
	counts := make([]int, len(TwistBins))
	for i, m := range s.Members {
		tw[i] = math.Abs(m.TwistDeg)
		cut[i] = m.CutLengthMM
		for b, up := range TwistBins {
			if tw[i] <= up {
				counts[b]++
				break
			}
		}
	}
	for b, up := range TwistBins {
		if math.IsInf(up, 1) {
			up = -1
		}
		sum.TwistHistogram = append(sum.TwistHistogram, BinCount{UpToDeg: up, Count: counts[b]})
	}
	sum.TwistDeg = panels.SpreadOf(tw).Rounded(6)
	sum.CutLengthMM = panels.SpreadOf(cut).Rounded(1)
	order := make([]int, len(s.MemberTypes))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return len(s.MemberTypes[order[a]].Parts) > len(s.MemberTypes[order[b]].Parts) })
	for _, t := range order[:min(10, len(order))] {
		ty := s.MemberTypes[t]
		sum.TopTypes = append(sum.TopTypes, TypeCount{Type: ty.Name, Count: len(ty.Parts), CutLengthMM: num.Round(ty.CutLengthMM, 1)})
	}
	return sum
}

// NestSummary sums up a nesting: sheets with their parts and use, the
// fewest sheets by area per stock, and the parts on no sheet.
type NestSummary struct {
	Parts    int               `json:"parts"`
	AreaM2   float64           `json:"part_area_m2"`
	Placed   int               `json:"placed"`
	Ordering string            `json:"ordering"`
	Sheets   []NestSheetRow    `json:"sheets"`
	Stocks   []NestStockRow    `json:"stocks"`
	Unplaced []NestUnplacedRow `json:"unplaced"`
}

// NestSheetRow is one sheet of a nesting.
type NestSheetRow struct {
	Name        string   `json:"name"`
	Stock       string   `json:"stock"`
	Utilization float64  `json:"utilization"`
	Panels      []string `json:"panels"`
}

// NestStockRow sums up one stock size.
type NestStockRow struct {
	Name      string  `json:"name"`
	WidthMM   float64 `json:"width_mm"`
	HeightMM  float64 `json:"height_mm"`
	Sheets    int     `json:"sheets"`
	AreaBound int     `json:"fewest_sheets_by_area"`
}

// NestUnplacedRow is a part on no sheet.
type NestUnplacedRow struct {
	Panel  string `json:"panel"`
	Reason string `json:"reason"`
}

// SummarizeNest sums up a nesting of parts on stocks.
func SummarizeNest(res *nest.Result, stocks []nest.Stock, parts []nest.Part) *NestSummary {
	s := &NestSummary{Parts: len(parts), AreaM2: num.Round(res.PartAreaMM2/1e6, 4), Ordering: res.Ordering,
		Sheets: []NestSheetRow{}, Unplaced: []NestUnplacedRow{}}
	for i, sh := range res.Sheets {
		row := NestSheetRow{Name: nest.SheetName(i, len(res.Sheets)), Stock: stocks[sh.Stock].Name, Utilization: num.Round(sh.Utilization, 4)}
		for _, p := range sh.Placements {
			row.Panels = append(row.Panels, parts[p.Part].Label)
		}
		s.Placed += len(sh.Placements)
		s.Sheets = append(s.Sheets, row)
	}
	for _, u := range res.Stocks {
		st := stocks[u.Stock]
		s.Stocks = append(s.Stocks, NestStockRow{Name: st.Name, WidthMM: st.WidthMM, HeightMM: st.HeightMM, Sheets: u.Sheets, AreaBound: u.AreaBound})
	}
	for _, u := range res.Unplaced {
		s.Unplaced = append(s.Unplaced, NestUnplacedRow{Panel: parts[u.Part].Label, Reason: u.Reason.String()})
	}
	return s
}

// NestNet is the nest command's job on a checked net: it labels the
// panels by bays of bayMM, lays them flat in material mat and nests them
// on stocks. worstMM is the panels' largest flatness deviation: above the
// flatness tolerance the outlines are only projections of warped panels.
func NestNet(ctx context.Context, in *Loaded, mat panels.Material, stocks []nest.Stock, bayMM float64) (sum *NestSummary, worstMM float64, err error) {
	bays, err := quadnet.NewBays(in.Net.Positions(), bayMM, bayMM)
	if err != nil {
		return nil, 0, err
	}
	nodeLabels, _ := nodes.Labels(in.Net, in.Topo, bays)
	flats, err := Panels(in.Net, in.Topo, mat, bays, nodeLabels)
	if err != nil {
		return nil, 0, err
	}
	for _, f := range flats {
		worstMM = math.Max(worstMM, f.FlatnessMM)
	}
	parts := Parts(flats)
	res, err := Nest(ctx, parts, flats, stocks, nest.Options{}, Quiet{})
	if err != nil {
		return nil, 0, err
	}
	return SummarizeNest(res, stocks, parts), worstMM, nil
}
