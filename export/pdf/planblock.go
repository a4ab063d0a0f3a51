package pdf

import (
	"fmt"
	"math"
	"strings"

	"github.com/go-pdf/fpdf"

	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// The furniture of a plan page around the drawing: bubbles, scale bar,
// and the right-hand column with key plan, legend and title block.

// pageBubbles returns the bay letters along the top edge of the drawing
// area and the row numbers along its left edge, for the bays in view.
func pageBubbles(v *pageView, g report.BayGrid) []layout.Bubble {
	var out []layout.Bubble
	a := v.area
	for c := int(math.Floor((v.wx0 - g.OriginMM[0]) / g.SizeMM[0])); ; c++ {
		x := v.up(g.OriginMM[0]+(float64(c)+0.5)*g.SizeMM[0], 0)[0]
		if x > a[2]-6 {
			break
		}
		if c >= 0 && x > a[0]+12 {
			out = append(out, layout.Bubble{X: x, Y: a[3] - 6, Text: quadnet.ColumnLetters(c)})
		}
	}
	for r := int(math.Floor((v.wy0 - g.OriginMM[1]) / g.SizeMM[1])); ; r++ {
		y := v.up(0, g.OriginMM[1]+(float64(r)+0.5)*g.SizeMM[1])[1]
		if y > a[3]-12 {
			break
		}
		if r >= 0 && y > a[1]+20 {
			out = append(out, layout.Bubble{X: a[0] + 6, Y: y, Text: fmt.Sprint(r + 1)})
		}
	}
	return out
}

// scaleBarSpec is a scale bar in the drawing area's lower-left corner.
type scaleBarSpec struct {
	x, y    float64 // left end, paper-up mm
	lenMM   float64 // on paper
	metres  float64 // it stands for
	box     [4]float64
	scale   float64
	steps   int
	caption string
}

func scaleBar(v *pageView) scaleBarSpec {
	// A round length near 60 mm of paper: 1, 2 or 5 times a power of ten
	// metres.
	want := 60 * v.scale / 1000
	p := math.Pow(10, math.Floor(math.Log10(want)))
	metres := p
	for _, f := range []float64{1, 2, 5, 10} {
		if f*p <= want {
			metres = f * p
		}
	}
	l := metres * 1000 / v.scale
	x, y := v.area[0]+5, v.area[1]+8
	return scaleBarSpec{x: x, y: y, lenMM: l, metres: metres, scale: v.scale, steps: 5,
		box:     [4]float64{x - 2, y - 5, x + math.Max(l, 60) + 4, y + 16}, // with the axes and north above the bar
		caption: fmt.Sprintf("0 - %g m   scale 1:%g on A3", metres, v.scale)}
}

func drawScaleBar(pdf *fpdf.Fpdf, sb scaleBarSpec) {
	x, y := page([2]float64{sb.x, sb.y})
	pdf.SetLineWidth(0.2)
	pdf.SetDrawColor(0, 0, 0)
	step := sb.lenMM / float64(sb.steps)
	for i := 0; i < sb.steps; i++ {
		if i%2 == 0 {
			pdf.SetFillColor(0, 0, 0)
		} else {
			pdf.SetFillColor(255, 255, 255)
		}
		pdf.Rect(x+float64(i)*step, y-1.5, step, 1.5, "FD")
	}
	pdf.SetFont("Helvetica", "", 6.5)
	pdf.SetTextColor(0, 0, 0)
	pdf.Text(x, y+3.2, pdfText(sb.caption))
	// The axes, so the plan reads the same way as the net; +y is grid
	// north, the hubs' azimuth 0.
	ax, ay := x, y-4
	pdf.Line(ax, ay, ax+8, ay)
	pdf.Line(ax, ay, ax, ay-8)
	pdf.Line(ax, ay-8, ax-1, ay-6)
	pdf.Line(ax, ay-8, ax+1, ay-6)
	pdf.Text(ax+8.8, ay+0.8, "x")
	pdf.Text(ax-0.8, ay-9, "y")
	pdf.Text(ax+2.5, ay-6, "grid north: azimuth 0 on every hub")
}

// drawSideColumn writes the right-hand column: title, bay, scale and page,
// the key plan, the legend and the title block with the caution.
func drawSideColumn(pdf *fpdf.Fpdf, m *layout.Site, k int, b *layout.Bay, v *pageView) {
	rep := m.Rep
	x0 := planPageW - planMarginMM - planSideW
	w := planSideW
	y := planMarginMM
	pdf.SetDrawColor(0, 0, 0)
	pdf.SetLineWidth(0.35)
	pdf.Rect(x0, y, w, planPageH-2*planMarginMM, "D")
	in := x0 + 3
	iw := w - 6
	y += 3
	pdf.SetFont("Helvetica", "B", 10)
	pdf.SetXY(in, y)
	title := pdfText(rep.Title)
	lines := splitLines(pdf, title, iw)
	if len(lines) > 2 {
		lines = []string{lines[0], strings.Join(lines[1:], " ")}
	}
	for _, l := range lines {
		pdf.Text(in, y+3.5, fitText(pdf, l, iw))
		y += 4.6
	}
	y += 1.5
	pdf.SetFont("Helvetica", "B", 20)
	pdf.Text(in, y+7, pdfText("Bay "+b.Name))
	pdf.SetFont("Helvetica", "", 8)
	pdf.Text(in+48, y+3, "assembly plan, seen from above")
	pdf.Text(in+48, y+7.2, pdfText(fmt.Sprintf("scale 1:%g on A3 landscape, mm", v.scale)))
	y += 10
	pdf.Text(in, y+3.2, pdfText(fmt.Sprintf("page %d of %d    bay %g x %g mm    %d nodes, %d members, %d panels",
		bayPage(k), planIndexPages+len(m.Bays), m.Grid.SizeMM[0], m.Grid.SizeMM[1], len(b.Nodes), len(b.Members), len(b.Panels))))
	y += 6

	// Key plan.
	kh := 62.0
	drawKeyPlan(pdf, m, b, in, y, iw, kh)
	y += kh + 3

	// Legend.
	pdf.SetFont("Helvetica", "B", 8)
	pdf.Text(in, y+3, "Legend")
	y += 5
	item := func(sample, style string, size float64, colour [3]int, text string) {
		pdf.SetFont("Helvetica", style, size)
		pdf.SetTextColor(colour[0], colour[1], colour[2])
		pdf.Text(in, y+2.6, pdfText(sample))
		pdf.SetTextColor(0, 0, 0)
		pdf.SetFont("Helvetica", "", 6.5)
		pdf.SetXY(in+24, y)
		pdf.MultiCell(iw-24, 2.9, pdfText(text), "", "L", false)
		y = math.Max(pdf.GetY(), y+3.6) + 0.8
	}
	item("C3-07", "B", planNodePt, [3]int{170, 0, 0}, "node label: bay C3, node 07; the red dot is the node")
	item("NT-012  z 7362", "", planInfoPt, [3]int{170, 0, 0}, "under it: node type, node height z in mm (the net's datum)")
	item("C3-M12", "", planMemberPt, [3]int{140, 90, 0}, "member label, beside its member (black: this bay's members; grey: neighbours')")
	item("C3-P05", "", planPanelPt, [3]int{0, 110, 0}, "panel label, at the panel's centre")
	item("- - -", "", 7, [3]int{120, 120, 120}, "bay grid; columns A, B, ... along x, rows 1, 2, ... along y; a thin grey line leads from a moved label to its part")
	pdf.SetFont("Helvetica", "", 6.5)
	for _, para := range []string{layout.NumberingNote, layout.HubFrameNote} {
		pdf.SetXY(in, y)
		pdf.MultiCell(iw, 2.9, pdfText(para), "", "L", false)
		y = pdf.GetY() + 1.2
	}

	// Title block at the bottom: caution, files.
	bottom := planPageH - planMarginMM - 3
	pdf.SetFont("Helvetica", "", 6.5)
	caution := splitLines(pdf, pdfText("CAUTION: "+report.Caution), iw)
	for _, wl := range layout.WarningLines(m.Rep.Warnings) {
		caution = append(caution, splitLines(pdf, pdfText(wl), iw)...)
	}
	top := bottom - float64(len(caution))*2.9 - 9
	pdf.SetLineWidth(0.25)
	pdf.Line(x0, top-2, x0+w, top-2)
	pdf.SetFont("Helvetica", "B", 7)
	pdf.Text(in, top+2, pdfText("pqfab  -  all dimensions mm  -  check every figure before cutting"))
	pdf.SetFont("Helvetica", "", 6.5)
	yy := top + 5.5
	for _, l := range caution {
		pdf.Text(in, yy+2.2, l)
		yy += 2.9
	}
}

// drawKeyPlan draws the bays that hold parts as grey cells in a box, the
// page's bay red, with column letters and row numbers where they fit.
func drawKeyPlan(pdf *fpdf.Fpdf, m *layout.Site, b *layout.Bay, x, y, w, h float64) {
	cols, rows := m.GridRange()
	pdf.SetFont("Helvetica", "", 6)
	pdf.Text(x, y+2.2, "Key plan")
	top := y + 4
	h -= 4
	lab := 5.0 // room for letters and numbers
	cell := math.Min((w-lab)/float64(cols), (h-lab)/float64(rows))
	ox, oy := x+lab, top+lab+float64(rows)*cell // lower-left of A1 on the page
	pdf.SetLineWidth(0.1)
	pdf.SetDrawColor(160, 160, 160)
	for _, bb := range m.Bays {
		if bb == b {
			pdf.SetFillColor(220, 30, 30)
		} else {
			pdf.SetFillColor(215, 215, 215)
		}
		pdf.Rect(ox+float64(bb.Col)*cell, oy-float64(bb.Row+1)*cell, cell, cell, "FD")
	}
	pdf.SetDrawColor(0, 0, 0)
	pdf.Rect(ox, oy-float64(rows)*cell, float64(cols)*cell, float64(rows)*cell, "D")
	size := math.Min(6, cell/ptMM*0.8)
	if size >= 3.5 {
		pdf.SetFont("Helvetica", "", size)
		for c := 0; c < cols; c++ {
			s := quadnet.ColumnLetters(c)
			pdf.Text(ox+(float64(c)+0.5)*cell-pdf.GetStringWidth(s)/2, top+lab-1, s)
		}
		for r := 0; r < rows; r++ {
			s := fmt.Sprint(r + 1)
			pdf.Text(x, oy-(float64(r)+0.5)*cell+capHeight*size*ptMM/2, s)
		}
	}
}
