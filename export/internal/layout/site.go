package layout

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"pqfab/internal/report"
	"pqfab/quadnet"
)

// HubFrameNote defines the hub angles for the people who read them; it is
// in the legends of the plans (pdf.HubFrameShort is on every node tag).
const HubFrameNote = "Hub angles: z = node axis; azimuth 0 = grid north (+y of the plan) projected on the plane square to the axis " +
	"(the hub's face), found with the plan before any member is in and marked on the hub " +
	"(up, +z, instead where the axis lies within 5° of the north-south line); azimuth counter-clockwise seen " +
	"from above the hub along the axis, 0 to 360°, arms listed going round the hub; elevation above (+) or " +
	"below (-) the plane square to the axis. Axis tilt: the axis's angle from vertical and the plan direction it leans " +
	"toward, counter-clockwise from grid north."

// NumberingNote says how parts are numbered inside a bay (quadnet.Bays.Label).
const NumberingNote = "Numbering in a bay: row by row from the bay's lower-left corner, by x along a row. " +
	"Members and panels take the bay of their midpoint or centre."

// Bay is one bay that holds parts, with the parts' indices in the
// report (each list in label order).
type Bay struct {
	Col, Row               int
	Name                   string
	Nodes, Members, Panels []int
	Lo, Hi                 [2]float64 // plan rectangle (mm)
	ExtLo, ExtHi           [2]float64 // plan extent of the bay's parts (mm)
}

// Site is what the site files share: node positions by label, the
// bays that hold parts in column-then-row order, and the plan extent.
type Site struct {
	Rep     *report.Report
	Grid    report.BayGrid
	NodeIdx map[string]int
	Bays    []*Bay
	bayIdx  map[[2]int]int
	Lo, Hi  [2]float64 // plan extent of the nodes
	SpanMM  float64    // mean member system length
	maxLen  float64    // longest member, plan length
}

// NewSite indexes a report for the site files. Every label must
// carry a bay (as pqfab's labels do).
func NewSite(rep *report.Report) (*Site, error) {
	g := rep.Bays
	if !(g.SizeMM[0] > 0) || !(g.SizeMM[1] > 0) {
		return nil, fmt.Errorf("the bay grid has no size (%g × %g mm)", g.SizeMM[0], g.SizeMM[1])
	}
	m := &Site{Rep: rep, Grid: g, NodeIdx: make(map[string]int, len(rep.Nodes)), bayIdx: map[[2]int]int{},
		Lo: [2]float64{math.Inf(1), math.Inf(1)}, Hi: [2]float64{math.Inf(-1), math.Inf(-1)}}
	for i, n := range rep.Nodes {
		m.NodeIdx[n.Label] = i
		m.Lo = [2]float64{math.Min(m.Lo[0], n.Pos[0]), math.Min(m.Lo[1], n.Pos[1])}
		m.Hi = [2]float64{math.Max(m.Hi[0], n.Pos[0]), math.Max(m.Hi[1], n.Pos[1])}
	}
	if len(rep.Nodes) == 0 {
		m.Lo, m.Hi = g.OriginMM, g.OriginMM
	}
	bay := func(label string) (*Bay, error) {
		c, rw, ok := quadnet.ParseBay(label)
		if !ok {
			return nil, fmt.Errorf("label %q names no bay", label)
		}
		k, found := m.bayIdx[[2]int{c, rw}]
		if !found {
			k = len(m.Bays)
			m.bayIdx[[2]int{c, rw}] = k
			lo := [2]float64{g.OriginMM[0] + float64(c)*g.SizeMM[0], g.OriginMM[1] + float64(rw)*g.SizeMM[1]}
			m.Bays = append(m.Bays, &Bay{Col: c, Row: rw, Name: quadnet.ColumnLetters(c) + strconv.Itoa(rw+1),
				Lo: lo, Hi: [2]float64{lo[0] + g.SizeMM[0], lo[1] + g.SizeMM[1]}, ExtLo: lo, ExtHi: [2]float64{lo[0] + g.SizeMM[0], lo[1] + g.SizeMM[1]}})
		}
		return m.Bays[k], nil
	}
	grow := func(b *Bay, p [3]float64) {
		b.ExtLo = [2]float64{math.Min(b.ExtLo[0], p[0]), math.Min(b.ExtLo[1], p[1])}
		b.ExtHi = [2]float64{math.Max(b.ExtHi[0], p[0]), math.Max(b.ExtHi[1], p[1])}
	}
	for i, n := range rep.Nodes {
		b, err := bay(n.Label)
		if err != nil {
			return nil, err
		}
		b.Nodes = append(b.Nodes, i)
		grow(b, n.Pos)
	}
	for i, mb := range rep.Members {
		b, err := bay(mb.Label)
		if err != nil {
			return nil, err
		}
		ia, oka := m.NodeIdx[mb.NodeA]
		ib, okb := m.NodeIdx[mb.NodeB]
		if !oka || !okb {
			return nil, fmt.Errorf("member %s: end node %s or %s is not in the report", mb.Label, mb.NodeA, mb.NodeB)
		}
		b.Members = append(b.Members, i)
		pa, pb := rep.Nodes[ia].Pos, rep.Nodes[ib].Pos
		grow(b, pa)
		grow(b, pb)
		m.SpanMM += mb.LengthMM
		m.maxLen = math.Max(m.maxLen, math.Hypot(pb[0]-pa[0], pb[1]-pa[1]))
	}
	if len(rep.Members) > 0 {
		m.SpanMM /= float64(len(rep.Members))
	}
	for i, p := range rep.Panels {
		b, err := bay(p.Label)
		if err != nil {
			return nil, err
		}
		b.Panels = append(b.Panels, i)
		for _, c := range p.Corners {
			k, ok := m.NodeIdx[c]
			if !ok {
				return nil, fmt.Errorf("panel %s: corner %s is not in the report", p.Label, c)
			}
			grow(b, rep.Nodes[k].Pos)
		}
	}
	slices.SortFunc(m.Bays, func(a, b *Bay) int {
		if d := cmp.Compare(a.Col, b.Col); d != 0 {
			return d
		}
		return cmp.Compare(a.Row, b.Row)
	})
	for k, b := range m.Bays {
		m.bayIdx[[2]int{b.Col, b.Row}] = k
		byLabel := func(labels func(int) string) func(a, b int) int {
			return func(a, b int) int { return strings.Compare(labels(a), labels(b)) }
		}
		slices.SortFunc(b.Nodes, byLabel(func(i int) string { return rep.Nodes[i].Label }))
		slices.SortFunc(b.Members, byLabel(func(i int) string { return rep.Members[i].Label }))
		slices.SortFunc(b.Panels, byLabel(func(i int) string { return rep.Panels[i].Label }))
	}
	return m, nil
}

// Pos returns a node's position by label.
func (m *Site) Pos(label string) [3]float64 { return m.Rep.Nodes[m.NodeIdx[label]].Pos }

// GridRange returns the columns and rows of the grid that cover the
// nodes' plan extent.
func (m *Site) GridRange() (cols, rows int) {
	g := m.Grid
	cols = max(1, int(math.Ceil((m.Hi[0]-g.OriginMM[0])/g.SizeMM[0]-1e-9)))
	rows = max(1, int(math.Ceil((m.Hi[1]-g.OriginMM[1])/g.SizeMM[1]-1e-9)))
	for _, b := range m.Bays {
		cols, rows = max(cols, b.Col+1), max(rows, b.Row+1)
	}
	return cols, rows
}

// HeightText is a node's height as printed: z in whole millimetres.
func HeightText(z float64) string { return fmt.Sprintf("z %.0f", r(z, 0)) }

// Bubble is a grid bubble of the plans: its centre and its text (a column
// letter or a row number).
type Bubble struct {
	X, Y float64
	Text string
}
