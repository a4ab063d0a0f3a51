package pdf

import (
	"fmt"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"slices"

	"github.com/go-pdf/fpdf"
)

// Plan pages: A3 landscape (420 × 297 mm, ISO 216), the drawing on the
// left, key plan, legend and title block in a column on the right.
const (
	planPageW, planPageH = 420.0, 297.0
	planMarginMM         = 10.0
	planSideW            = 112.0 // right-hand column
	planGapMM            = 6.0   // between the drawing and the column
	planRoomMM           = 14.0  // paper kept free around the bay's parts for their labels
)

// PlanScales are the scales (1:n) a plan page may use: the largest of them
// at which the bay's parts, with room for their labels, fit the drawing
// area. 1:50 and 1:100 are the usual scales of assembly plans; the
// coarser ones are for bays too large for them.
var PlanScales = []float64{50, 100, 200, 500, 1000, 2000, 5000, 10000}

// Text sizes on the plan pages (pt). Labels are at least 2.5 mm high
// (capital height, the nominal size of lettering in ISO 3098-1) at
// print size, the smallest lettering read on drawings by hand (from
// memory): minPlanPt.
const (
	minPlanPt    = 2.5 / capHeight / ptMM // 9.87 pt
	planNodePt   = 1.1 * minPlanPt
	planInfoPt   = minPlanPt
	planMemberPt = minPlanPt
	planPanelPt  = minPlanPt
	planBubblePt = 1.1 * minPlanPt
)

// drawing area of a plan page, in page mm (y down).
var planDraw = struct{ x0, y0, x1, y1 float64 }{planMarginMM, planMarginMM,
	planPageW - planMarginMM - planSideW - planGapMM, planPageH - planMarginMM}

// WritePlanPDF writes site/plan.pdf: an index page (the bay grid with
// each bay's page, and the list of bays and pages, each a link to its
// page), then a page per bay that holds parts (in bay order A1, A2, …,
// B1, …, each with a bookmark), A3 landscape, at the largest of PlanScales
// that fits, stated on the page. Each page shows the bay grid with its
// letters and numbers, the members around the bay in grey and the bay's
// own members black, the bay's node labels with node type and height,
// member and panel labels (placed as on the assembly plan, no two
// overlapping, text at 0° or 90° so it reads from below or from the
// right), a scale bar, a key plan with the bay marked, the legend and the
// title block with the caution. Above MaxPlanPages bays it writes one page
// that says so. Safe to call concurrently.
func WritePlanPDF(w io.Writer, rep *report.Report) error {
	m, err := layout.NewSite(rep)
	if err != nil {
		return err
	}
	pdf := newPDF("L", "A3", rep.Title, "assembly plan, a page per bay")
	if len(m.Bays) > report.MaxPlanPages {
		pdf.AddPage()
		limitPage(pdf, planPageW, rep.Title, fmt.Sprintf("This job spans %d bays, more than the %d bay pages pqfab prints in one file, "+
			"so this file holds no bay pages. assembly-plan.dxf shows every bay, node, member and panel with its label; "+
			"view.html finds any label in 3D; schedule.xlsx lists every part.", len(m.Bays), report.MaxPlanPages))
		return writePDF(w, pdf)
	}
	members := membersByBay(m)
	links := make([]int, len(m.Bays))
	for k := range links {
		links[k] = pdf.AddLink()
	}
	pdf.AddPage()
	drawPlanIndex(pdf, m, links)
	for k, b := range m.Bays {
		pdf.AddPage()
		pdf.SetLink(links[k], 0, -1)
		pdf.Bookmark(pdfText(fmt.Sprintf("Bay %s (page %d)", b.Name, bayPage(k))), 0, 0)
		drawBayPage(pdf, m, members, k, b)
	}
	return writePDF(w, pdf)
}

// limitPage writes the one page of a site file whose job is above the
// size limit.
func limitPage(pdf *fpdf.Fpdf, pageW float64, title, msg string) {
	pdf.SetFont("Helvetica", "B", 16)
	pdf.SetXY(20, 30)
	pdf.MultiCell(pageW-40, 8, fitText(pdf, pdfText(title), pageW-40), "", "L", false)
	pdf.SetFont("Helvetica", "", 11)
	pdf.SetXY(20, 50)
	pdf.MultiCell(pageW-40, 6, pdfText(msg), "", "L", false)
	pdf.SetXY(20, pdf.GetY()+6)
	pdf.SetFont("Helvetica", "", 8)
	pdf.MultiCell(pageW-40, 4, pdfText("CAUTION: "+report.Caution), "", "L", false)
}

// membersByBay lists, per bay, the members whose plan line may enter the
// page of a bay near it: each member under every bay its line's box
// touches.
func membersByBay(m *layout.Site) map[[2]int][]int {
	out := map[[2]int][]int{}
	g := m.Grid
	for i, mb := range m.Rep.Members {
		a, b := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		c0 := int(math.Floor((math.Min(a[0], b[0]) - g.OriginMM[0]) / g.SizeMM[0]))
		c1 := int(math.Floor((math.Max(a[0], b[0]) - g.OriginMM[0]) / g.SizeMM[0]))
		r0 := int(math.Floor((math.Min(a[1], b[1]) - g.OriginMM[1]) / g.SizeMM[1]))
		r1 := int(math.Floor((math.Max(a[1], b[1]) - g.OriginMM[1]) / g.SizeMM[1]))
		for c := c0; c <= c1; c++ {
			for r := r0; r <= r1; r++ {
				out[[2]int{c, r}] = append(out[[2]int{c, r}], i)
			}
		}
	}
	return out
}

// pageView maps plan mm to page mm for one bay page.
type pageView struct {
	scale      float64    // 1:scale
	wx0, wy0   float64    // plan point at the drawing area's lower-left corner
	wx1, wy1   float64    // and upper-right
	drawX0     float64    // page x of the drawing area's left edge
	drawBottom float64    // page y (down) of its bottom edge
	area       [4]float64 // x0, y0, x1, y1 of the drawing area in paper-up mm
}

// up returns the paper point (mm, y up from the page's bottom edge) of
// plan point (x, y).
func (v *pageView) up(x, y float64) [2]float64 {
	return [2]float64{v.drawX0 + (x-v.wx0)/v.scale, (planPageH - v.drawBottom) + (y-v.wy0)/v.scale}
}

// page turns a paper-up point into fpdf's page coordinates (y down).
func page(p [2]float64) (float64, float64) { return p[0], planPageH - p[1] }

// bayView chooses the scale and the window of a bay page.
func bayView(b *layout.Bay) *pageView {
	dw, dh := planDraw.x1-planDraw.x0, planDraw.y1-planDraw.y0
	lo := [2]float64{math.Min(b.Lo[0], b.ExtLo[0]), math.Min(b.Lo[1], b.ExtLo[1])}
	hi := [2]float64{math.Max(b.Hi[0], b.ExtHi[0]), math.Max(b.Hi[1], b.ExtHi[1])}
	scale := PlanScales[len(PlanScales)-1]
	for _, s := range PlanScales {
		if (hi[0]-lo[0])/s+2*planRoomMM <= dw && (hi[1]-lo[1])/s+2*planRoomMM <= dh {
			scale = s
			break
		}
	}
	cx, cy := (lo[0]+hi[0])/2, (lo[1]+hi[1])/2
	v := &pageView{scale: scale, wx0: cx - dw*scale/2, wy0: cy - dh*scale/2, wx1: cx + dw*scale/2, wy1: cy + dh*scale/2,
		drawX0: planDraw.x0, drawBottom: planDraw.y1}
	v.area = [4]float64{planDraw.x0, planPageH - planDraw.y1, planDraw.x1, planPageH - planDraw.y0}
	return v
}

// pdfLabel is a label placed on a page (paper-up mm).
type pdfLabel struct {
	lines  []string // translated text
	styles []string // font style of each line
	sizes  []float64
	colour [3]int
	at     layout.Placement
	angle  float64 // 0 or 90
	anchor [2]float64
}

func drawBayPage(pdf *fpdf.Fpdf, m *layout.Site, members map[[2]int][]int, k int, b *layout.Bay) {
	rep := m.Rep
	v := bayView(b)
	g := m.Grid
	inBay := map[int]bool{}
	for _, i := range b.Members {
		inBay[i] = true
	}
	// Members near the window: those filed under the bays it covers.
	c0 := int(math.Floor((v.wx0 - g.OriginMM[0]) / g.SizeMM[0]))
	c1 := int(math.Floor((v.wx1 - g.OriginMM[0]) / g.SizeMM[0]))
	r0 := int(math.Floor((v.wy0 - g.OriginMM[1]) / g.SizeMM[1]))
	r1 := int(math.Floor((v.wy1 - g.OriginMM[1]) / g.SizeMM[1]))
	seen := map[int]bool{}
	var near []int
	for c := c0; c <= c1; c++ {
		for r := r0; r <= r1; r++ {
			for _, i := range members[[2]int{c, r}] {
				if !seen[i] {
					seen[i] = true
					near = append(near, i)
				}
			}
		}
	}
	slices.Sort(near)
	nearNodes := map[int]bool{}
	for _, i := range near {
		nearNodes[m.NodeIdx[rep.Members[i].NodeA]] = true
		nearNodes[m.NodeIdx[rep.Members[i].NodeB]] = true
	}

	// Obstacles: everything outside the drawing area, member lines, node
	// dots; then the labels in label order: nodes, members, panels.
	const clear, dot = 0.7, 0.9
	a := v.area
	ix := layout.NewBoxIndex(8, [2]float64{0, 0}, [2]float64{planPageW, planPageH})
	big := 1000.0
	ix.Add(layout.AxisBox(a[0]-big/2, (a[1]+a[3])/2, big, big))
	ix.Add(layout.AxisBox(a[2]+big/2, (a[1]+a[3])/2, big, big))
	ix.Add(layout.AxisBox((a[0]+a[2])/2, a[1]-big/2, big, big))
	ix.Add(layout.AxisBox((a[0]+a[2])/2, a[3]+big/2, big, big))
	bubbles := pageBubbles(v, g)
	for _, bb := range bubbles {
		ix.Add(layout.AxisBox(bb.X, bb.Y, 9, 9))
	}
	sb := scaleBar(v)
	ix.Add(layout.AxisBox((sb.box[0]+sb.box[2])/2, (sb.box[1]+sb.box[3])/2, sb.box[2]-sb.box[0], sb.box[3]-sb.box[1]))
	for _, i := range near {
		mb := rep.Members[i]
		pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		ix.Add(layout.SegmentBox(v.up(pa[0], pa[1]), v.up(pb[0], pb[1]), clear))
	}
	for i := range nearNodes {
		p := rep.Nodes[i].Pos
		q := v.up(p[0], p[1])
		ix.Add(layout.AxisBox(q[0], q[1], 2*dot, 2*dot))
	}
	// Labels are never shrunk below their size on paper (minPlanPt): one
	// without room moves away on a leader.
	pp := &layout.Placer{Index: ix, Ring: 3, Rings: 8, OverflowX: a[2] + 100, OverflowY: a[3], Scales: []float64{1}}
	var labels []*pdfLabel
	width := func(s, style string, size float64) float64 {
		pdf.SetFont("Helvetica", style, size)
		return pdf.GetStringWidth(s)
	}
	const pad = 0.5
	for _, i := range b.Nodes {
		n := rep.Nodes[i]
		lab, info := pdfText(n.Label), pdfText(n.Type+"  "+layout.HeightText(n.Pos[2]))
		hl, hi := capHeight*planNodePt*ptMM, capHeight*planInfoPt*ptMM
		w := math.Max(width(lab, "B", planNodePt), width(info, "", planInfoPt)) + 2*pad
		h := hl + 0.35*hl + hi + 2*pad
		q := v.up(n.Pos[0], n.Pos[1])
		gap := dot + pad
		labels = append(labels, &pdfLabel{lines: []string{lab, info}, styles: []string{"B", ""}, sizes: []float64{planNodePt, planInfoPt},
			colour: [3]int{170, 0, 0}, anchor: q,
			at: pp.Place(q, w, h, func(s float64) []layout.Box { return layout.NodeCandidates(q[0], q[1], w, h, gap, s) })})
	}
	for _, i := range b.Members {
		mb := rep.Members[i]
		pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
		qa, qb := v.up(pa[0], pa[1]), v.up(pb[0], pb[1])
		lab := pdfText(mb.Label)
		w, h := width(lab, "", planMemberPt)+2*pad, capHeight*planMemberPt*ptMM+2*pad
		// Text at 0° beside members within 45° of x, else at 90°.
		angle, ux, uy := 0.0, 1.0, 0.0
		if math.Abs(qb[1]-qa[1]) > math.Abs(qb[0]-qa[0]) {
			angle, ux, uy = 90, 0, 1
		}
		mid := [2]float64{(qa[0] + qb[0]) / 2, (qa[1] + qb[1]) / 2}
		at := pp.Place(mid, w, h, func(s float64) []layout.Box { return sideCandidates(qa, qb, w, h, clear, s, ux, uy) })
		if at.Leader {
			angle = 0
		}
		labels = append(labels, &pdfLabel{lines: []string{lab}, styles: []string{""}, sizes: []float64{planMemberPt},
			colour: [3]int{140, 90, 0}, at: at, angle: angle, anchor: mid})
	}
	for _, i := range b.Panels {
		p := rep.Panels[i]
		pts := make([][2]float64, len(p.Corners))
		for k, c := range p.Corners {
			q := m.Pos(c)
			pts[k] = v.up(q[0], q[1])
		}
		cx, cy, size := layout.LabelSpot(pts)
		lab := pdfText(p.Label)
		w, h := width(lab, "", planPanelPt)+2*pad, capHeight*planPanelPt*ptMM+2*pad
		labels = append(labels, &pdfLabel{lines: []string{lab}, styles: []string{""}, sizes: []float64{planPanelPt},
			colour: [3]int{0, 110, 0}, anchor: [2]float64{cx, cy},
			at: pp.Place([2]float64{cx, cy}, w, h, func(s float64) []layout.Box { return layout.PanelCandidates(cx, cy, size, w, h, s) })})
	}

	// The drawing, clipped to its area.
	pdf.SetLineCapStyle("round")
	pdf.ClipRect(planDraw.x0, planDraw.y0, planDraw.x1-planDraw.x0, planDraw.y1-planDraw.y0, false)
	lo, hi := v.up(b.Lo[0], b.Lo[1]), v.up(b.Hi[0], b.Hi[1])
	pdf.SetFillColor(255, 248, 220)
	x, y := page([2]float64{lo[0], hi[1]})
	pdf.Rect(x, y, hi[0]-lo[0], hi[1]-lo[1], "F")
	// Grid lines, dash-dot.
	pdf.SetDrawColor(150, 150, 150)
	pdf.SetLineWidth(0.2)
	pdf.SetDashPattern([]float64{6, 1.5, 0.8, 1.5}, 0)
	for c := c0; c <= c1+1; c++ {
		gx := v.up(g.OriginMM[0]+float64(c)*g.SizeMM[0], 0)[0]
		pdf.Line(gx, planDraw.y0, gx, planDraw.y1)
	}
	for r := r0; r <= r1+1; r++ {
		gy := v.up(0, g.OriginMM[1]+float64(r)*g.SizeMM[1])[1]
		_, py := page([2]float64{0, gy})
		pdf.Line(planDraw.x0, py, planDraw.x1, py)
	}
	pdf.SetDashPattern([]float64{}, 0)
	// Members: the neighbours' grey and thin, the bay's black.
	for pass := 0; pass < 2; pass++ {
		if pass == 0 {
			pdf.SetDrawColor(175, 175, 175)
			pdf.SetLineWidth(0.25)
		} else {
			pdf.SetDrawColor(0, 0, 0)
			pdf.SetLineWidth(0.45)
		}
		for _, i := range near {
			if inBay[i] != (pass == 1) {
				continue
			}
			mb := rep.Members[i]
			pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
			x0, y0 := page(v.up(pa[0], pa[1]))
			x1, y1 := page(v.up(pb[0], pb[1]))
			pdf.Line(x0, y0, x1, y1)
		}
	}
	inBayNode := map[int]bool{}
	for _, i := range b.Nodes {
		inBayNode[i] = true
	}
	for _, i := range sortedKeys(nearNodes) {
		p := rep.Nodes[i].Pos
		x, y := page(v.up(p[0], p[1]))
		if inBayNode[i] {
			pdf.SetFillColor(170, 0, 0)
			pdf.Circle(x, y, 0.75, "F")
		} else {
			pdf.SetFillColor(175, 175, 175)
			pdf.Circle(x, y, 0.5, "F")
		}
	}
	// Leaders and labels.
	pdf.SetDrawColor(120, 120, 120)
	pdf.SetLineWidth(0.15)
	for _, l := range labels {
		if l.at.Leader {
			e := l.at.Box.EdgePoint(l.anchor)
			x0, y0 := page(l.anchor)
			x1, y1 := page(e)
			pdf.Line(x0, y0, x1, y1)
		}
	}
	for _, l := range labels {
		drawPDFLabel(pdf, l, pad)
	}
	pdf.ClipEnd()

	// Bubbles at the drawing area's edges, scale bar, frame.
	pdf.SetLineWidth(0.25)
	for _, bb := range bubbles {
		x, y := page([2]float64{bb.X, bb.Y})
		pdf.SetDrawColor(90, 90, 90)
		pdf.SetFillColor(255, 255, 255)
		pdf.Circle(x, y, 4, "FD")
		pdf.SetTextColor(0, 0, 0)
		pdf.SetFont("Helvetica", "B", planBubblePt)
		s := pdfText(bb.Text)
		pdf.Text(x-pdf.GetStringWidth(s)/2, y+capHeight*planBubblePt*ptMM/2, s)
	}
	drawScaleBar(pdf, sb)
	pdf.SetDrawColor(0, 0, 0)
	pdf.SetLineWidth(0.35)
	pdf.Rect(planDraw.x0, planDraw.y0, planDraw.x1-planDraw.x0, planDraw.y1-planDraw.y0, "D")
	drawSideColumn(pdf, m, k, b, v)
}

// drawPDFLabel writes a placed label: its lines stacked top to bottom,
// each centred across the box, at the label's angle.
func drawPDFLabel(pdf *fpdf.Fpdf, l *pdfLabel, pad float64) {
	b := l.at.Box
	s := l.at.Scale
	ux, uy := b.UX, b.UY
	vx, vy := -uy, ux
	top := b.HH - s*pad
	pdf.SetTextColor(l.colour[0], l.colour[1], l.colour[2])
	for k, line := range l.lines {
		size := s * l.sizes[k]
		pdf.SetFont("Helvetica", l.styles[k], size)
		ch := capHeight * size * ptMM
		w := pdf.GetStringWidth(line)
		base := top - ch // baseline, measured along v from the centre
		// Start of the baseline in paper-up mm.
		sx := b.CX - w/2*ux + base*vx
		sy := b.CY - w/2*uy + base*vy
		x, y := page([2]float64{sx, sy})
		if l.angle != 0 && !l.at.Leader {
			pdf.TransformBegin()
			pdf.TransformRotate(l.angle, x, y)
			pdf.Text(x, y, line)
			pdf.TransformEnd()
		} else {
			pdf.Text(x, y, line)
		}
		top -= ch + 0.35*capHeight*s*l.sizes[0]*ptMM
	}
	pdf.SetTextColor(0, 0, 0)
}

// sideCandidates: beside a member (off its line by clear), with the text
// along (ux, uy) (0° or 90° on the page): at its middle and further
// along, on one side then the other.
func sideCandidates(a, b [2]float64, w, h, clear, scale, ux, uy float64) []layout.Box {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l := math.Hypot(dx, dy)
	if l == 0 {
		l = 1
	}
	nx, ny := -dy/l, dx/l // normal of the member
	out := make([]layout.Box, 0, 10)
	for _, t := range [...]float64{0.5, 0.35, 0.65, 0.22, 0.78} {
		mx, my := a[0]+t*dx, a[1]+t*dy
		box := layout.Box{UX: ux, UY: uy, HW: scale * w / 2, HH: scale * h / 2}
		// Reach of the box along the member's normal.
		reach := box.HW*math.Abs(ux*nx+uy*ny) + box.HH*math.Abs(-uy*nx+ux*ny) + layout.SideSlack*box.HH*2
		for _, side := range [...]float64{1, -1} {
			box.CX, box.CY = mx+side*(clear+reach)*nx, my+side*(clear+reach)*ny
			out = append(out, box)
		}
	}
	return out
}

func sortedKeys(m map[int]bool) []int {
	out := make([]int, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	slices.Sort(out)
	return out
}
