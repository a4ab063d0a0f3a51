package pdf

import (
	"fmt"
	"math"
	"strconv"

	"github.com/go-pdf/fpdf"

	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// planIndexPages is how many pages come before the bay pages in
// site/plan.pdf: the index.
const planIndexPages = 1

// bayPage is the page number of bay k of the site model in site/plan.pdf.
func bayPage(k int) int { return planIndexPages + k + 1 }

// drawPlanIndex draws the index page of site/plan.pdf: the whole bay
// grid, each bay that holds parts with its page number (a link to the
// page), and the same as a list, bay by bay, with the caution. The
// bay pages carry bookmarks; links is one link id per bay, set by the
// bay pages.
func drawPlanIndex(pdf *fpdf.Fpdf, m *layout.Site, links []int) {
	rep := m.Rep
	pdf.Bookmark("Index: bays and pages", 0, 0)
	x, y := planMarginMM, planMarginMM
	w := planPageW - 2*planMarginMM
	pdf.SetTextColor(0, 0, 0)
	pdf.SetFont("Helvetica", "B", 12)
	pdf.Text(x, y+4.5, fitText(pdf, pdfText(rep.Title), w))
	pdf.SetFont("Helvetica", "B", 20)
	pdf.Text(x, y+14, "Bays and pages")
	pdf.SetFont("Helvetica", "", 10)
	pdf.Text(x, y+20, pdfText(fmt.Sprintf("assembly plan, a page per bay; bays %g x %g mm, columns lettered along x (no I, no O), rows numbered along y; %d bays with parts on pages %d to %d",
		m.Grid.SizeMM[0], m.Grid.SizeMM[1], len(m.Bays), bayPage(0), bayPage(len(m.Bays)-1))))

	// The grid, left: every bay with parts shaded, its name and page.
	top := y + 26
	listW := 112.0
	gw, gh := w-listW-planGapMM, planPageH-planMarginMM-top-24
	cols, rows := m.GridRange()
	lab := 8.0
	cell := math.Min((gw-lab)/float64(cols), (gh-lab)/float64(rows))
	ox, oy := x+lab, top+lab+float64(rows)*cell // lower-left of A1
	pdf.SetLineWidth(0.2)
	pdf.SetDrawColor(150, 150, 150)
	pdf.SetFillColor(225, 225, 225)
	// Text in a cell: the bay and its page, at least 2.5 mm high where
	// the cells allow, smaller in a grid too large for the page (the list
	// beside it always says it).
	size := math.Min(minPlanPt*1.2, cell/2.6/ptMM)
	for k, bb := range m.Bays {
		cx, cy := ox+float64(bb.Col)*cell, oy-float64(bb.Row+1)*cell
		pdf.Rect(cx, cy, cell, cell, "FD")
		pdf.Link(cx, cy, cell, cell, links[k])
		if size >= 3 {
			pdf.SetFont("Helvetica", "B", size)
			s := pdfText(bb.Name)
			pdf.Text(cx+(cell-pdf.GetStringWidth(s))/2, cy+cell/2-0.15*size*ptMM, s)
			pdf.SetFont("Helvetica", "", size)
			p := "p. " + strconv.Itoa(bayPage(k))
			pdf.Text(cx+(cell-pdf.GetStringWidth(p))/2, cy+cell/2+1.15*size*ptMM, p)
		}
	}
	pdf.SetDrawColor(0, 0, 0)
	pdf.Rect(ox, oy-float64(rows)*cell, float64(cols)*cell, float64(rows)*cell, "D")
	hs := math.Min(minPlanPt, cell/ptMM*0.8)
	pdf.SetFont("Helvetica", "", hs)
	for c := range cols {
		s := quadnet.ColumnLetters(c)
		pdf.Text(ox+(float64(c)+0.5)*cell-pdf.GetStringWidth(s)/2, top+lab-2, s)
	}
	for r := range rows {
		s := strconv.Itoa(r + 1)
		pdf.Text(ox-2-pdf.GetStringWidth(s), oy-(float64(r)+0.5)*cell+capHeight*hs*ptMM/2, s)
	}

	// The list, right: bay, page, parts; as many columns as it needs.
	lx := x + w - listW
	pdf.SetFont("Helvetica", "B", minPlanPt)
	step := 1.3 * minPlanPt * ptMM
	ly0 := top + step
	colW := listW / 2
	perCol := int((planPageH - planMarginMM - 24 - ly0) / step)
	if n := (len(m.Bays) + perCol - 1) / perCol; n > 2 {
		// More bays than two columns hold: narrower columns, smaller text
		// (a job of hundreds of bays; the grid still links every bay).
		colW = listW / float64(n)
		perCol = (len(m.Bays) + n - 1) / n
		step = (planPageH - planMarginMM - 24 - ly0) / float64(perCol)
	}
	pt := math.Min(minPlanPt, step/1.3/ptMM)
	for k, bb := range m.Bays {
		c, r := k/perCol, k%perCol
		cx, cy := lx+float64(c)*colW, ly0+float64(r)*step
		pdf.SetFont("Helvetica", "B", pt)
		pdf.Text(cx, cy, pdfText("Bay "+bb.Name))
		pdf.SetFont("Helvetica", "", pt)
		p := "page " + strconv.Itoa(bayPage(k))
		pdf.Text(cx+colW-2-pdf.GetStringWidth(p), cy, p)
		pdf.Link(cx, cy-step+0.3*step, colW-2, step, links[k])
	}

	// Caution at the foot.
	pdf.SetFont("Helvetica", "", 7)
	pdf.SetXY(x, planPageH-planMarginMM-14)
	pdf.MultiCell(w, 3.2, pdfText("CAUTION: "+report.Caution), "", "L", false)
}
