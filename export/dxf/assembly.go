package dxf

import (
	"fmt"
	"io"
	"math"
	"unicode/utf8"

	"github.com/yofu/dxf/color"
	"github.com/yofu/dxf/table"

	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// Layers of the assembly plan beyond the shared ones in dxf.go.
const (
	LayerGrid      = "PQ-GRID"       // bay grid lines
	LayerGridText  = "PQ-GRID-TEXT"  // bay letters and numbers in bubbles, bay names
	LayerNodeMark  = "PQ-NODE-MARK"  // a small circle at every node
	LayerNodeInfo  = "PQ-NODE-INFO"  // node type and height under each node label
	LayerLeader    = "PQ-LEADER"     // lines from labels moved away back to their part
	LayerLegend    = "PQ-LEGEND"     // legend and notes
	LayerPlanFrame = "PQ-PLAN-FRAME" // bubbles and frames of legend and title block
)

// planScale holds the sizes of the assembly plan, all from the label
// height h (mm), which follows the mean member length.
type planScale struct {
	h        float64 // node label height
	info     float64 // node type and height
	member   float64 // member label height
	panel    float64 // panel label height
	bayText  float64 // bay names in the bays
	bubble   float64 // radius of the grid bubbles
	pad      float64 // clear space around every label
	clear    float64 // half the clear band along a member line
	markR    float64 // node mark radius
	gridOver float64 // how far grid lines run past the plan
}

func newPlanScale(spanMM, sectionWidthMM float64) planScale {
	h := math.Round(math.Max(20, spanMM/16))
	return planScale{h: h, info: 0.6 * h, member: 0.7 * h, panel: 0.85 * h, bayText: 1.6 * h,
		bubble: 2 * h, pad: 0.15 * h, clear: sectionWidthMM/2 + 0.15*h, markR: 0.2 * h, gridOver: 4 * h}
}

// indexCellLabels is the cell size of the plan's label index, in node
// label heights.
const indexCellLabels = 4

// planLabel is a label placed on the assembly plan, ready to draw: one or
// two lines of text in a box.
type planLabel struct {
	lines    []string
	layers   []string  // layer of each line
	heights  []float64 // full-size height of each line
	at       layout.Placement
	angleDeg float64
	anchor   [2]float64
}

// WriteAssemblyDXF writes the assembly plan in mm, seen from above at
// z = 0: the bay grid with its column letters and row numbers in bubbles
// at the edges and every bay's name, members (their lines and the top
// faces between the hub cuts) and panel outlines, a circle at every node,
// node labels with the node type and height z under them, member labels
// beside and along their members, panel labels at their centres, and a
// legend and title block with the caution. No two labels overlap: each
// is placed greedily, in label order, at the first free spot among
// candidates off the member lines, smaller if need be, else moved away
// with a leader line. Every member is also drawn as a 3D line at its true
// height. It holds the DXF lock while it works (see dxfMu).
func WriteAssemblyDXF(w io.Writer, rep *report.Report) error {
	m, err := layout.NewSite(rep)
	if err != nil {
		return err
	}
	layers := []dxfLayer{{LayerGridText, color.Magenta, nil}, {LayerPlanFrame, color.Grey128, nil},
		{LayerPlanMember, color.White, nil}, {LayerPlanPanel, color.Grey128, nil}, {LayerPlanTop, color.Cyan, nil},
		{LayerNodeMark, color.Red, nil}, {LayerNodeLabel, color.Red, nil}, {LayerNodeInfo, color.Red, nil},
		{LayerMemberLabel, color.Yellow, nil}, {LayerPanelLabel, color.Green, nil}, {LayerLeader, color.Grey128, nil},
		{Layer3DMember, color.Blue, nil}, {LayerLegend, color.White, nil}, {LayerTitle, color.White, nil},
		{LayerGrid, color.Grey128, table.LT_DASHDOT}}
	ps := newPlanScale(m.SpanMM, rep.Section.WidthMM)
	pl := newAssemblyLayout(m, ps)
	// Dash-dot pattern of the grid lines: a dash of about two label heights.
	return writeDXF(w, layers, r(4*ps.h, 0), func(d *dxfDoc) error { return drawAssembly(d, rep, m, ps, pl) })
}

// drawAssembly draws the assembly plan.
func drawAssembly(d *dxfDoc, rep *report.Report, m *layout.Site, ps planScale, pl *assemblyLayout) error {
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	layer := func(name string) { add(func() error { return useLayer(d, name) }) }
	line := func(a, b [3]float64) {
		add(func() error {
			_, err := d.Line(a[0], a[1], a[2], b[0], b[1], b[2])
			return err
		})
	}
	circle := func(x, y, rad float64) {
		add(func() error {
			_, err := d.Circle(x, y, 0, rad)
			return err
		})
	}
	txt := func(s string, x, y, h, rot float64) {
		add(func() error { return text(d, s, x, y, 0, r(h, 3), rot) })
	}
	// Left-aligned lines: the insert point is the left end of the
	// baseline (TEXT's default alignment).
	txtLeft := func(s string, x, y, h float64) {
		add(func() error {
			_, err := d.Text(s, x, y, 0, r(h, 3))
			return err
		})
	}

	// Grid lines, bubbles and bay names.
	layer(LayerGrid)
	for _, g := range pl.gridLines {
		line([3]float64{g[0][0], g[0][1]}, [3]float64{g[1][0], g[1][1]})
	}
	layer(LayerPlanFrame)
	for _, b := range pl.bubbles {
		circle(b.X, b.Y, ps.bubble)
	}
	for _, f := range pl.frames {
		add(func() error { return closedPoly(d, f) })
	}
	layer(LayerGridText)
	for _, b := range pl.bubbles {
		txt(b.Text, b.X, b.Y, ps.bayText, 0)
	}

	// The structure seen from above.
	layer(LayerPlanMember)
	for _, mb := range rep.Members {
		a, b := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		line([3]float64{a[0], a[1]}, [3]float64{b[0], b[1]})
	}
	layer(LayerPlanPanel)
	for _, p := range rep.Panels {
		pts := make([][2]float64, len(p.Corners))
		for i, c := range p.Corners {
			q := m.Pos(c)
			pts[i] = [2]float64{q[0], q[1]}
		}
		add(func() error { return closedPoly(d, pts) })
	}
	if rep.Section.WidthMM > 0 {
		layer(LayerPlanTop)
		for _, mb := range rep.Members {
			add(func() error {
				return closedPoly(d, barOutline(mb, m.Pos(mb.NodeA), m.Pos(mb.NodeB), rep.Section.WidthMM))
			})
		}
	}
	layer(LayerNodeMark)
	for _, n := range rep.Nodes {
		circle(n.Pos[0], n.Pos[1], ps.markR)
	}
	layer(Layer3DMember)
	for _, mb := range rep.Members {
		line(m.Pos(mb.NodeA), m.Pos(mb.NodeB))
	}

	// Labels, by layer so each layer's texts sit together.
	layer(LayerLeader)
	for _, l := range pl.labels {
		if l.at.Leader {
			e := l.at.Box.EdgePoint(l.anchor)
			line([3]float64{l.anchor[0], l.anchor[1]}, [3]float64{e[0], e[1]})
		}
	}
	for _, name := range []string{LayerGridText, LayerNodeLabel, LayerNodeInfo, LayerMemberLabel, LayerPanelLabel} {
		layer(name)
		for _, l := range pl.labels {
			for k, s := range l.lines {
				if l.layers[k] != name {
					continue
				}
				c := l.lineCentre(k, ps.pad)
				txt(s, c[0], c[1], l.heights[k]*l.at.Scale, l.angleDeg)
			}
		}
	}

	// Legend and title block.
	layer(LayerLegend)
	for _, t := range pl.legend {
		txtLeft(t.s, t.x, t.y, t.h)
	}
	layer(LayerTitle)
	for _, t := range pl.title {
		txtLeft(t.s, t.x, t.y, t.h)
	}
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	return nil
}

// lineCentre returns the centre of line k of a placed label: the lines
// are stacked top to bottom inside the box with a quarter of the first
// line's height between them.
func (l *planLabel) lineCentre(k int, pad float64) [2]float64 {
	b := l.at.Box
	s := l.at.Scale
	if len(l.lines) == 1 {
		return [2]float64{b.CX, b.CY}
	}
	top := b.HH - s*pad
	y := top
	for i := 0; i < k; i++ {
		y -= s * (l.heights[i] + 0.25*l.heights[0])
	}
	y -= s * l.heights[k] / 2
	vx, vy := -b.UY, b.UX
	return [2]float64{b.CX + y*vx, b.CY + y*vy}
}

// planText is a left-aligned line: (x, y) the left end of its baseline.
type planText struct {
	s       string
	x, y, h float64
}

// assemblyLayout is everything placed on the assembly plan.
type assemblyLayout struct {
	gridLines [][2][2]float64
	bubbles   []layout.Bubble
	frames    [][][2]float64
	labels    []*planLabel
	legend    []planText
	title     []planText
}

func newAssemblyLayout(m *layout.Site, ps planScale) *assemblyLayout {
	rep := m.Rep
	g := m.Grid
	cols, rows := m.GridRange()
	x0, y0 := g.OriginMM[0], g.OriginMM[1]
	x1, y1 := x0+float64(cols)*g.SizeMM[0], y0+float64(rows)*g.SizeMM[1]
	// The plan may reach past the grid's first line (nodes on the lines).
	ex0, ey0 := math.Min(x0, m.Lo[0]), math.Min(y0, m.Lo[1])
	ex1, ey1 := math.Max(x1, m.Hi[0]), math.Max(y1, m.Hi[1])
	over := ps.gridOver
	bx0, by0 := ex0-over-ps.bubble, ey0-over-ps.bubble // bubble centres
	bx1, by1 := ex1+over+ps.bubble, ey1+over+ps.bubble
	pl := &assemblyLayout{}
	for i := 0; i <= cols; i++ {
		x := x0 + float64(i)*g.SizeMM[0]
		pl.gridLines = append(pl.gridLines, [2][2]float64{{x, ey0 - over}, {x, ey1 + over}})
	}
	for j := 0; j <= rows; j++ {
		y := y0 + float64(j)*g.SizeMM[1]
		pl.gridLines = append(pl.gridLines, [2][2]float64{{ex0 - over, y}, {ex1 + over, y}})
	}
	for i := 0; i < cols; i++ {
		x := x0 + (float64(i)+0.5)*g.SizeMM[0]
		name := quadnet.ColumnLetters(i)
		pl.bubbles = append(pl.bubbles, layout.Bubble{X: x, Y: by0, Text: name}, layout.Bubble{X: x, Y: by1, Text: name})
	}
	for j := 0; j < rows; j++ {
		y := y0 + (float64(j)+0.5)*g.SizeMM[1]
		name := fmt.Sprint(j + 1)
		pl.bubbles = append(pl.bubbles, layout.Bubble{X: bx0, Y: y, Text: name}, layout.Bubble{X: bx1, Y: y, Text: name})
	}

	ix := layout.NewBoxIndex(indexCellLabels*ps.h, [2]float64{bx0 - ps.bubble, by0 - ps.bubble}, [2]float64{bx1 + ps.bubble, by1 + ps.bubble})
	for _, b := range pl.bubbles {
		ix.Add(layout.AxisBox(b.X, b.Y, 2*ps.bubble, 2*ps.bubble))
	}
	for _, mb := range rep.Members {
		a, b := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		ix.Add(layout.SegmentBox([2]float64{a[0], a[1]}, [2]float64{b[0], b[1]}, ps.clear))
	}
	for _, n := range rep.Nodes {
		ix.Add(layout.AxisBox(n.Pos[0], n.Pos[1], 2*ps.markR+ps.pad, 2*ps.markR+ps.pad))
	}
	// Legend and title block sit right of and below the grid; labels that
	// find no room go to a column right of the legend.
	legendX, legendTop := bx1+ps.bubble+4*ps.h, by1+ps.bubble
	legend, legendW, legendH := legendBlock(m, ps, legendX, legendTop)
	pl.legend = legend
	pl.frames = append(pl.frames, rectPts(legendX-ps.h, legendTop-legendH, legendX+legendW+ps.h, legendTop))
	title, titleBox := titleBlock(rep, ps, ex0-over-2*ps.bubble, by0-ps.bubble-3*ps.h, math.Max(bx1-bx0, 60*ps.h))
	pl.title = title
	pl.frames = append(pl.frames, titleBox)
	for _, f := range pl.frames {
		ix.Add(layout.AxisBox((f[0][0]+f[2][0])/2, (f[0][1]+f[2][1])/2, f[2][0]-f[0][0], f[2][1]-f[0][1]))
	}
	pp := &layout.Placer{Index: ix, Ring: 1.5 * ps.h, Rings: 6, OverflowX: legendX + legendW + 6*ps.h, OverflowY: by1}

	// Bay names first, in a corner of their bay; then nodes, members and
	// panels, each in label order.
	for _, b := range m.Bays {
		s := b.Name
		w, h := dxfTextWidth(s, ps.bayText)+2*ps.pad, ps.bayText+2*ps.pad
		in := ps.h
		cands := func(sc float64) []layout.Box {
			ww, hh := sc*w, sc*h
			return []layout.Box{layout.AxisBox(b.Lo[0]+in+ww/2, b.Lo[1]+in+hh/2, ww, hh), layout.AxisBox(b.Lo[0]+in+ww/2, b.Hi[1]-in-hh/2, ww, hh),
				layout.AxisBox(b.Hi[0]-in-ww/2, b.Lo[1]+in+hh/2, ww, hh), layout.AxisBox(b.Hi[0]-in-ww/2, b.Hi[1]-in-hh/2, ww, hh)}
		}
		anchor := [2]float64{b.Lo[0] + in, b.Lo[1] + in}
		pl.labels = append(pl.labels, &planLabel{lines: []string{s}, layers: []string{LayerGridText}, heights: []float64{ps.bayText},
			at: pp.Place(anchor, w, h, cands), anchor: anchor})
	}
	for _, i := range layout.SortedBy(len(rep.Nodes), func(i int) string { return rep.Nodes[i].Label }) {
		n := rep.Nodes[i]
		info := n.Type + "  " + layout.HeightText(n.Pos[2])
		w := math.Max(dxfTextWidth(n.Label, ps.h), dxfTextWidth(info, ps.info)) + 2*ps.pad
		h := ps.h + 0.25*ps.h + ps.info + 2*ps.pad
		x, y := n.Pos[0], n.Pos[1]
		gap := math.Max(ps.markR, ps.clear) + ps.pad/2
		pl.labels = append(pl.labels, &planLabel{lines: []string{n.Label, info}, layers: []string{LayerNodeLabel, LayerNodeInfo},
			heights: []float64{ps.h, ps.info}, anchor: [2]float64{x, y},
			at: pp.Place([2]float64{x, y}, w, h, func(s float64) []layout.Box { return layout.NodeCandidates(x, y, w, h, gap, s) })})
	}
	for _, i := range layout.SortedBy(len(rep.Members), func(i int) string { return rep.Members[i].Label }) {
		mb := rep.Members[i]
		pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		a, b := [2]float64{pa[0], pa[1]}, [2]float64{pb[0], pb[1]}
		ang, ux, uy := uprightAngle(b[0]-a[0], b[1]-a[1])
		w, h := dxfTextWidth(mb.Label, ps.member)+2*ps.pad, ps.member+2*ps.pad
		mid := [2]float64{(a[0] + b[0]) / 2, (a[1] + b[1]) / 2}
		at := pp.Place(mid, w, h, func(s float64) []layout.Box { return memberCandidates(a, b, w, h, ps.clear, s, ux, uy) })
		if at.Leader {
			ang = 0
		}
		pl.labels = append(pl.labels, &planLabel{lines: []string{mb.Label}, layers: []string{LayerMemberLabel},
			heights: []float64{ps.member}, at: at, angleDeg: r(ang, 3), anchor: mid})
	}
	for _, i := range layout.SortedBy(len(rep.Panels), func(i int) string { return rep.Panels[i].Label }) {
		p := rep.Panels[i]
		pts := make([][2]float64, len(p.Corners))
		for k, c := range p.Corners {
			q := m.Pos(c)
			pts[k] = [2]float64{q[0], q[1]}
		}
		cx, cy, size := layout.LabelSpot(pts)
		w, h := dxfTextWidth(p.Label, ps.panel)+2*ps.pad, ps.panel+2*ps.pad
		pl.labels = append(pl.labels, &planLabel{lines: []string{p.Label}, layers: []string{LayerPanelLabel},
			heights: []float64{ps.panel}, anchor: [2]float64{cx, cy},
			at: pp.Place([2]float64{cx, cy}, w, h, func(s float64) []layout.Box { return layout.PanelCandidates(cx, cy, size, w, h, s) })})
	}
	return pl
}

// legendLines is the legend of the assembly plan, after a heading.
func legendLines(m *layout.Site) []string {
	g := m.Grid
	return []string{
		"C3-07      node label (large): bay C3, node 07. The small circle is the node.",
		"NT-012  z 7362      under it: node type, and node height z in mm (the net's datum).",
		"C3-M12      member label, beside and along its member.",
		"C3-P05      panel label, at the panel's centre.",
		"A label that finds no room beside its part sits on a leader line drawn back to the part.",
		fmt.Sprintf("Bays: columns A, B, C ... along x (letters in the bubbles at top and bottom), rows 1, 2, 3 ... "+
			"along y (numbers at left and right); each bay %g x %g mm. Bay C3 is column C, row 3.", g.SizeMM[0], g.SizeMM[1]),
		layout.NumberingNote,
		layout.HubFrameNote,
		"Parts are listed in schedule.xlsx; site/plan.pdf has a printable page per bay, site/tags.pdf a tag per part.",
	}
}

// legendBlock lays out the legend with its top-left corner at (x, top);
// it returns the texts, the block's width and height.
func legendBlock(m *layout.Site, ps planScale, x, top float64) ([]planText, float64, float64) {
	const chars = 70
	h := 1.6 * ps.h
	var out []planText
	y := top - 2.2*h
	head := "LEGEND"
	out = append(out, planText{head, x, y, 1.6 * h})
	y -= 2.5 * h
	w := float64(chars) * DXFCharWidth * h
	for _, para := range legendLines(m) {
		for _, l := range layout.WrapWords(para, chars) {
			out = append(out, planText{l, x, y, h})
			y -= 1.6 * h
		}
		y -= 0.8 * h
	}
	return out, w, top - y
}

// titleBlock lays out the title, what the drawing is, counts and the
// caution, top-left corner at (x, top), at most width wide; it returns the
// texts and the frame around them.
func titleBlock(rep *report.Report, ps planScale, x, top, width float64) ([]planText, [][2]float64) {
	var out []planText
	th := 5 * ps.h
	y := top - th - ps.h
	title := rep.Title
	if max := int(width / (DXFCharWidth * th)); utf8.RuneCountInString(title) > max && max > 3 {
		title = string([]rune(title)[:max-3]) + "..."
	}
	left := x + 2*ps.h
	out = append(out, planText{title, left, y, th})
	y -= 4 * ps.h
	sub := fmt.Sprintf("Assembly plan, seen from above (z up), all dimensions mm. %d nodes, %d members, %d panels.",
		len(rep.Nodes), len(rep.Members), len(rep.Panels))
	sh := 2 * ps.h
	out = append(out, planText{sub, left, y, sh})
	y -= 3.5 * ps.h
	ch := 1.6 * ps.h
	chars := max(20, int((width-4*ps.h)/(DXFCharWidth*ch)))
	for _, para := range append([]string{"CAUTION: " + report.Caution}, layout.WarningLines(rep.Warnings)...) {
		for _, l := range layout.WrapWords(para, chars) {
			out = append(out, planText{l, left, y, ch})
			y -= 2.6 * ps.h
		}
	}
	bottom := y - ps.h
	return out, rectPts(x, bottom, x+width, top)
}

// barOutline returns the plan outline of a member's top face: the
// section width across the member (along its frame's Y axis) and the cut
// length between the hub setbacks.
func barOutline(m report.MemberRow, a, b [3]float64, width float64) [][2]float64 {
	d := [3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}
	l := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
	at := func(t, side float64) [2]float64 {
		return [2]float64{a[0] + d[0]*t/l + m.FrameY[0]*side, a[1] + d[1]*t/l + m.FrameY[1]*side}
	}
	s0, s1 := m.Ends[0].SetbackMM, l-m.Ends[1].SetbackMM
	h := width / 2
	return [][2]float64{at(s0, -h), at(s1, -h), at(s1, h), at(s0, h)}
}

// uprightAngle turns a direction into a text angle in (-90°, 90°] so the
// text reads from the left or from below; it returns the angle in
// degrees and the matching unit vector.
func uprightAngle(dx, dy float64) (deg, ux, uy float64) {
	l := math.Hypot(dx, dy)
	if l == 0 {
		return 0, 1, 0
	}
	ux, uy = dx/l, dy/l
	if ux < 0 || (ux == 0 && uy < 0) {
		ux, uy = -ux, -uy
	}
	return math.Atan2(uy, ux) * 180 / math.Pi, ux, uy
}

// memberCandidates: beside the member (off its line by clear), parallel
// to it, at the middle and then further along, above then below.
func memberCandidates(a, b [2]float64, w, h, clear, scale float64, ux, uy float64) []layout.Box {
	vx, vy := -uy, ux
	out := make([]layout.Box, 0, 10)
	for _, t := range [...]float64{0.5, 0.38, 0.62, 0.26, 0.74} {
		mx, my := a[0]+t*(b[0]-a[0]), a[1]+t*(b[1]-a[1])
		for _, side := range [...]float64{1, -1} {
			off := clear + (0.5+layout.SideSlack)*scale*h
			out = append(out, layout.Box{CX: mx + side*off*vx, CY: my + side*off*vy, UX: ux, UY: uy, HW: scale * w / 2, HH: scale * h / 2})
		}
	}
	return out
}
