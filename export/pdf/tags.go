package pdf

import (
	"fmt"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"pqfab/nodes"
	"strings"

	"github.com/go-pdf/fpdf"
)

// TagLayout is a tag size and the A4 sheet the tags are printed on. Text
// and QR sizes are those of the office tag times Scale.
type TagLayout struct {
	Name           string
	SheetW, SheetH float64 // mm
	W, H           float64 // one tag (mm)
	Cols, Rows     int
	Scale          float64
	Describe       string // for the PDF's subject
}

// Tag sizes (the job's site.tag_size). Office: A4 portrait (210 × 297 mm,
// ISO 216) with 2 × 4 labels of 105 × 74 mm, a common self-adhesive
// label sheet (8 labels a sheet; common practice, layout from memory).
// Outdoor: two A5 tags (210 × 148 mm, ISO 216) to an A4 sheet, every text
// and the QR code twice as large, for weatherproof tag stock or
// lamination and for reading at arm's length on site.
var (
	TagOffice  = TagLayout{Name: "office", SheetW: 210, SheetH: 297, W: 105, H: 74, Cols: 2, Rows: 4, Scale: 1, Describe: "A4 sheets of 2 x 4 labels 105 x 74 mm"}
	TagOutdoor = TagLayout{Name: "outdoor", SheetW: 210, SheetH: 297, W: 210, H: 148, Cols: 1, Rows: 2, Scale: 2, Describe: "A4 sheets of 2 tags 210 x 148 mm (A5)"}
)

// TagSizes are the tag sizes a job may choose, by name.
var TagSizes = map[string]TagLayout{TagOffice.Name: TagOffice, TagOutdoor.Name: TagOutdoor}

// Text sizes on an office tag, as capital-letter heights (the nominal
// size of lettering, ISO 3098-1): the label at least 8 mm, so it is read
// from a few metres, and every other text at least 2.5 mm, the smallest
// lettering ISO 3098 lists for drawings that are read by hand (sizes from
// memory). Outdoor tags double them.
const (
	TagLabelCapMM = 8.0
	TagDataCapMM  = 2.5
)

// Tag geometry on an office tag (mm; times the layout's Scale).
const (
	// tagInsetMM keeps everything printed this far inside a label, for
	// printers that do not reach the sheet's edge and sheets fed askew.
	tagInsetMM = 3.0
	tagQRMM    = 25.0 // side of the QR code with its quiet zone
	tagGapMM   = 2.0  // between the QR column and the data column
	tagLeading = 1.25 // line step as a multiple of the font size
)

// HubFrameShort is the hub angle definition as it fits on a node tag.
const HubFrameShort = "az 0 = grid north (+y) on the plane square to the axis, marked on the hub; az ccw seen from above; el + above the plane square to the axis."

// tagRow is one row of a tag's data column: a line of text, or a table
// row of a name and two numbers (right-aligned in their columns).
type tagRow struct {
	text  string
	cells []string // name, value, value; nil for a text row
	bold  bool
}

// tag is one label's content.
type tag struct {
	label  string
	aside  []string // under the QR code: kind, type, bay
	rows   []tagRow
	header *tagRow // repeated at the top of a continued tag
}

// WriteTagsPDF writes site/tags.pdf: a tag per node, member and panel (in
// that order, each kind in label order) on A4 sheets of tags of the
// report's tag size (TagSizes; office when empty). A tag has a QR code
// holding exactly the part's label, the label in large type, the part's
// kind, type and bay, and what the assembler needs: a node its height,
// the tilt of its axis and its arms going round the hub (member, azimuth,
// elevation) with azimuth 0 defined on the tag; a member which end
// carries the tag and which node each end goes to, and beside its own
// cut length, end cuts and twist those of its type (what is cut); a panel
// its corners, sheet and diagonals. A part whose rows do not fit goes on
// as many tags as it needs, "(2/2)" after the label. Above MaxTags parts
// it writes one page that says so. Safe to call concurrently.
func WriteTagsPDF(w io.Writer, rep *report.Report) error {
	lay, ok := TagSizes[rep.TagSize]
	if !ok {
		lay = TagOffice
	}
	pdf := newPDF("P", "A4", rep.Title, "part tags, "+lay.Describe)
	total := len(rep.Nodes) + len(rep.Members) + len(rep.Panels)
	if total > report.MaxTags {
		pdf.AddPage()
		limitPage(pdf, lay.SheetW, rep.Title, fmt.Sprintf("This job has %d parts (%d nodes, %d members, %d panels), more than the %d tags "+
			"pqfab prints in one file, so this file holds no tags. Every part's label is in schedule.xlsx and report.json; "+
			"print tags from those in batches.", total, len(rep.Nodes), len(rep.Members), len(rep.Panels), report.MaxTags))
		return writePDF(w, pdf)
	}
	if len(rep.Warnings) > 0 {
		// A plain cover sheet: warnings have no place on the labels.
		pdf.AddPage()
		limitPage(pdf, lay.SheetW, rep.Title, "Print this page on plain paper: the job was built with warnings, "+
			"which every output carries:\n"+strings.Join(layout.WarningLines(rep.Warnings), "\n"))
	}
	types := map[string]int{}
	for i, t := range rep.MemberTypes {
		types[t.Name] = i
	}
	top := (lay.SheetH - float64(lay.Rows)*lay.H) / 2
	left := (lay.SheetW - float64(lay.Cols)*lay.W) / 2
	k := 0
	put := func(t tag) {
		for _, part := range splitTag(pdf, t, lay) {
			per := lay.Cols * lay.Rows
			if k%per == 0 {
				pdf.AddPage()
			}
			slot := k % per
			k++
			drawTag(pdf, part, lay, left+float64(slot%lay.Cols)*lay.W, top+float64(slot/lay.Cols)*lay.H)
		}
	}
	for _, i := range layout.SortedBy(len(rep.Nodes), func(i int) string { return rep.Nodes[i].Label }) {
		put(nodeTag(rep.Nodes[i]))
	}
	for _, i := range layout.SortedBy(len(rep.Members), func(i int) string { return rep.Members[i].Label }) {
		m := rep.Members[i]
		t, ok := types[m.Type]
		if !ok {
			return fmt.Errorf("member %s: its type %s is not in the report", m.Label, m.Type)
		}
		put(memberTag(m, rep.MemberTypes[t]))
	}
	for _, i := range layout.SortedBy(len(rep.Panels), func(i int) string { return rep.Panels[i].Label }) {
		put(panelTag(rep.Panels[i]))
	}
	if err := pdf.Error(); err != nil {
		return err
	}
	return writePDF(w, pdf)
}

func textRows(lines ...string) []tagRow {
	out := make([]tagRow, len(lines))
	for i, l := range lines {
		out[i] = tagRow{text: l}
	}
	return out
}

func nodeTag(n report.NodeRow) tag {
	t := tag{label: n.Label, aside: []string{"NODE", n.Type, "bay " + report.BayName(n.Label)}}
	sup := ""
	if n.Support {
		sup = ", support"
	}
	t.rows = textRows(fmt.Sprintf("%s mm, %d members%s", layout.HeightText(n.Pos[2]), len(n.Arms), sup), axisTiltText(n), HubFrameShort)
	head := tagRow{cells: []string{"member", "az °", "el °"}, bold: true}
	t.header = &head
	t.rows = append(t.rows, head)
	for _, a := range n.Arms {
		t.rows = append(t.rows, tagRow{cells: []string{a.Member, fmt.Sprintf("%.1f", r(a.AzimuthDeg, 1)), fmt.Sprintf("%+.1f", r(a.ElevationDeg, 1))}})
	}
	return t
}

// memberEnds returns a member's ends read from its type's end A (its tag
// end): the ends in that order, with the bevels turned when the member is
// read from its end B (as in the types; nodes.MemberType).
func memberEnds(mb report.MemberRow) [2]report.EndRow {
	if mb.TagEnd != "B" {
		return mb.Ends
	}
	a, b := mb.Ends[1], mb.Ends[0]
	a.BevelDeg, b.BevelDeg = -a.BevelDeg, -b.BevelDeg
	return [2]report.EndRow{a, b}
}

func memberTag(mb report.MemberRow, mt report.MemberTypeRow) tag {
	e := memberEnds(mb)
	f1 := func(v float64) string { return fmt.Sprintf("%.1f", r(v, 1)) }
	f2 := func(v float64) string { return fmt.Sprintf("%.2f", r(v, 2)) }
	t := tag{label: mb.Label, aside: []string{"MEMBER", mt.Name, "bay " + report.BayName(mb.Label)}}
	t.rows = []tagRow{
		{text: fmt.Sprintf("TAG END (type end A) to node %s", e[0].Node), bold: true},
		{text: fmt.Sprintf("other end (type end B) to node %s", e[1].Node)},
		{cells: []string{"", "member", "type: cut"}, bold: true},
		{cells: []string{"cut length mm", f1(mb.CutLengthMM), f1(mt.CutLengthMM)}},
		{cells: []string{"tag end mitre °", f1(e[0].MitreDeg), f1(mt.Ends[0].MitreDeg)}},
		{cells: []string{"tag end bevel °", f1(e[0].BevelDeg), f1(mt.Ends[0].BevelDeg)}},
		{cells: []string{"other end mitre °", f1(e[1].MitreDeg), f1(mt.Ends[1].MitreDeg)}},
		{cells: []string{"other end bevel °", f1(e[1].BevelDeg), f1(mt.Ends[1].BevelDeg)}},
		{cells: []string{"twist °", f2(mb.TwistDeg), f2(mt.TwistDeg)}},
	}
	return t
}

func panelTag(p report.PanelRow) tag {
	t := tag{label: p.Label, aside: []string{"PANEL", p.Type, "bay " + report.BayName(p.Label)}}
	t.rows = textRows("corners 1-" + fmt.Sprint(len(p.Corners)) + ": " + strings.Join(p.Corners, " "))
	if p.Sheet != "" {
		t.rows = append(t.rows, textRows("sheet "+p.Sheet)...)
	}
	if ds := diagonalText(p.Cut.Diagonals, p.Corners); ds != "" {
		t.rows = append(t.rows, textRows(TagCutDiagonalsText+ds+" mm")...)
	}
	if ds := diagonalText(p.Diagonals, p.Corners); ds != "" {
		t.rows = append(t.rows, textRows(TagSetOutDiagonalsText+ds)...)
	}
	if len(p.Edges) > 0 {
		bs := make([]string, len(p.Edges))
		for i, e := range p.Edges {
			bs[i] = layout.SignedFixed(e.BevelDeg, 1)
		}
		t.rows = append(t.rows, textRows(fmt.Sprintf("%s1-%d (°): %s", TagBevelsText, len(p.Edges), strings.Join(bs, " ")))...)
	}
	t.rows = append(t.rows, textRows(fmt.Sprintf("%.3f m², %.1f kg", p.AreaM2, p.WeightKg),
		"Corners listed from corner 1, counter-clockwise seen from outside. "+layout.BevelSignShort)...)
	return t
}

// Words that start the lines of a panel tag, so that a reader (and the
// read-back test) finds each number: "pane diagonals 1-3 2528.3, 2-4
// 2160.2 mm" are the cut outline's (what is measured on the pane),
// "set-out diag. (nodes) …" the set-out outline's, node to node.
const (
	TagCutDiagonalsText    = "pane diagonals "
	TagSetOutDiagonalsText = "set-out diag. (nodes) "
	TagBevelsText          = "bevels "
)

// diagonalText lists diagonals by corner numbers: "1-3 2528.3, 2-4
// 2160.2". corners are the panel's corner labels from corner 1.
func diagonalText(ds []report.DiagonalRow, corners []string) string {
	at := make(map[string]int, len(corners))
	for i, c := range corners {
		at[c] = i + 1
	}
	parts := make([]string, 0, len(ds))
	for _, d := range ds {
		i, j := at[d.From], at[d.To]
		parts = append(parts, fmt.Sprintf("%d-%d %.1f", min(i, j), max(i, j), r(d.MM, 1)))
	}
	return strings.Join(parts, ", ")
}

// tagGeom is where things go on a tag of a layout (mm from the tag's
// top-left corner), and the fonts' sizes (pt).
type tagGeom struct {
	in, qr, gap, step float64
	labelPt, dataPt   float64
	labelBase         float64 // baseline of the label
	bodyTop           float64 // top of the QR code and the data column
	dataX, dataW      float64
	rows              int // data rows a tag holds
}

func geomOf(lay TagLayout) tagGeom {
	s := lay.Scale
	g := tagGeom{in: tagInsetMM * s, qr: tagQRMM * s, gap: tagGapMM * s,
		labelPt: TagLabelCapMM * s / capHeight / ptMM, dataPt: TagDataCapMM * s / capHeight / ptMM}
	g.step = tagLeading * g.dataPt * ptMM
	g.labelBase = g.in + TagLabelCapMM*s
	g.bodyTop = g.labelBase + 0.6*g.step
	g.dataX = g.in + g.qr + g.gap
	g.dataW = lay.W - g.in - g.dataX
	g.rows = int((lay.H - g.in - g.bodyTop) / g.step)
	return g
}

// splitTag wraps a tag's long text rows to the data column and returns
// it as one tag or as several, each but the first repeating the table
// header, with "(k/n)" after the label.
func splitTag(pdf *fpdf.Fpdf, t tag, lay TagLayout) []tag {
	g := geomOf(lay)
	pdf.SetFont("Helvetica", "B", g.dataPt)
	var rows []tagRow
	for _, rw := range t.rows {
		if rw.cells != nil {
			rows = append(rows, rw)
			continue
		}
		style := ""
		if rw.bold {
			style = "B"
		}
		pdf.SetFont("Helvetica", style, g.dataPt)
		for _, l := range splitLines(pdf, pdfText(rw.text), g.dataW) {
			rows = append(rows, tagRow{text: l, bold: rw.bold})
		}
	}
	if len(rows) <= g.rows {
		t.rows = rows
		return []tag{t}
	}
	var parts []tag
	for len(rows) > 0 {
		p := t
		room := g.rows
		p.rows = nil
		if len(parts) > 0 && t.header != nil {
			p.rows = append(p.rows, *t.header)
			room--
		}
		n := min(room, len(rows))
		p.rows = append(p.rows, rows[:n]...)
		rows = rows[n:]
		parts = append(parts, p)
	}
	for i := range parts {
		parts[i].label = fmt.Sprintf("%s (%d/%d)", t.label, i+1, len(parts))
	}
	return parts
}

// drawTag draws one tag with its top-left corner at (x, y): the label
// across the top, the QR code (holding the part's label) under it on the
// left with the kind, type and bay below it, and the data on the right.
// Text rows are already translated and wrapped (splitTag).
func drawTag(pdf *fpdf.Fpdf, t tag, lay TagLayout, x, y float64) {
	g := geomOf(lay)
	label, _, _ := strings.Cut(t.label, " (")
	if err := drawQR(pdf, label, x+g.in, y+g.bodyTop, g.qr); err != nil {
		pdf.SetError(err)
		return
	}
	pdf.SetTextColor(0, 0, 0)
	pdf.SetFont("Helvetica", "B", g.labelPt)
	pdf.Text(x+g.in, y+g.labelBase, pdfText(t.label))
	// Under the QR code: kind, type and bay.
	for i, s := range t.aside {
		style := ""
		if i == 0 {
			style = "B"
		}
		pdf.SetFont("Helvetica", style, g.dataPt)
		pdf.Text(x+g.in, y+g.bodyTop+g.qr+float64(i+1)*g.step, fitText(pdf, pdfText(s), g.qr))
	}
	// Right: the data.
	cy := y + g.bodyTop + TagDataCapMM*lay.Scale
	numW := 0.25 * g.dataW
	for _, rw := range t.rows {
		style := ""
		if rw.bold {
			style = "B"
		}
		pdf.SetFont("Helvetica", style, g.dataPt)
		if rw.cells == nil {
			pdf.Text(x+g.dataX, cy, rw.text)
			cy += g.step
			continue
		}
		for c, s := range rw.cells {
			s = pdfText(s)
			if c == 0 {
				pdf.Text(x+g.dataX, cy, fitText(pdf, s, g.dataW-2*numW))
				continue
			}
			right := x + g.dataX + g.dataW - float64(2-c)*numW
			pdf.Text(right-pdf.GetStringWidth(s), cy, s)
		}
		cy += g.step
	}
}

// axisTiltText says how a node's axis leans, for a tag.
func axisTiltText(n report.NodeRow) string {
	s := fmt.Sprintf("axis tilt %.1f°", r(n.AxisTiltDeg, 1))
	if r(n.AxisTiltDeg, 1) > 0 {
		s += fmt.Sprintf(" toward %.0f° ccw from north", math.Mod(r(n.AxisTiltTowardDeg, 0), 360))
	}
	if n.AzimuthZero == nodes.ZeroUp {
		s += "; az 0 = up (+z) on the plane square to the axis"
	}
	return s
}
