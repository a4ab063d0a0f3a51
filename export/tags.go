package export

import (
	"fmt"
	"io"
	"strings"

	"github.com/go-pdf/fpdf"
)

// Tag sheet: A4 portrait (210 × 297 mm, ISO 216) with 3 × 8 labels of
// 70 × 37 mm and no gaps, 0.5 mm clear at top and bottom: a common office
// label sheet (24 labels a sheet; common practice, layout from memory).
const (
	TagSheetW, TagSheetH = 210.0, 297.0
	TagW, TagH           = 70.0, 37.0
	TagCols, TagRows     = 3, 8
	tagTopMM             = (TagSheetH - TagRows*TagH) / 2
	// tagInsetMM keeps everything printed this far inside a label, for
	// printers that do not reach the sheet's edge and sheets fed askew.
	tagInsetMM = 2.0
	tagQRMM    = 23.0 // side of the QR code with its quiet zone
)

// HubFrameShort is the hub angle definition as it fits on a node tag.
const HubFrameShort = "az 0 = first member listed, projected on the plane normal to the node axis; " +
	"az counter-clockwise seen from above along the axis, 0-360°; el + above the hub plane."

// tag is one label's content.
type tag struct {
	label, kind, typ, bay string
	lines                 []string // under the heading, already in order
	table                 [][3]string
	note                  string // small print under the QR code
}

// WriteTagsPDF writes site/tags.pdf: a tag per node, member and panel (in
// that order, each kind in label order) on A4 label sheets of 3 × 8 labels
// 70 × 37 mm. A tag has a QR code holding exactly the part's label, the
// label in large type, the part's kind, type and bay, and what the
// assembler needs: a node its height and its arms (member, azimuth,
// elevation) with azimuth 0 defined on the tag; a member which end goes to
// which node, its cut length and end cuts; a panel its corners, sheet
// and diagonals. Above MaxTags parts it writes one page that says so. Safe
// to call concurrently.
func WriteTagsPDF(w io.Writer, rep *Report) error {
	pdf := newPDF("P", "A4", rep.Title, "part tags, A4 sheets of 3 x 8 labels 70 x 37 mm")
	total := len(rep.Nodes) + len(rep.Members) + len(rep.Panels)
	if total > MaxTags {
		pdf.AddPage()
		limitPage(pdf, TagSheetW, rep.Title, fmt.Sprintf("This job has %d parts (%d nodes, %d members, %d panels), more than the %d tags "+
			"pqfab prints in one file, so this file holds no tags. Every part's label is in schedule.xlsx and report.json; "+
			"print tags from those in batches.", total, len(rep.Nodes), len(rep.Members), len(rep.Panels), MaxTags))
		return writePDF(w, pdf)
	}
	if len(rep.Warnings) > 0 {
		// A plain cover sheet: warnings have no place on the labels.
		pdf.AddPage()
		limitPage(pdf, TagSheetW, rep.Title, "Print this page on plain paper: the job was built with warnings, "+
			"which every output carries:\n"+strings.Join(warningLines(rep.Warnings), "\n"))
	}
	k := 0
	put := func(t tag) error {
		if k%(TagCols*TagRows) == 0 {
			pdf.AddPage()
		}
		slot := k % (TagCols * TagRows)
		x := float64(slot%TagCols) * TagW
		y := tagTopMM + float64(slot/TagCols)*TagH
		k++
		return drawTag(pdf, t, x, y)
	}
	for _, i := range sortedBy(len(rep.Nodes), func(i int) string { return rep.Nodes[i].Label }) {
		if err := put(nodeTag(rep.Nodes[i])); err != nil {
			return err
		}
	}
	for _, i := range sortedBy(len(rep.Members), func(i int) string { return rep.Members[i].Label }) {
		if err := put(memberTag(rep.Members[i])); err != nil {
			return err
		}
	}
	for _, i := range sortedBy(len(rep.Panels), func(i int) string { return rep.Panels[i].Label }) {
		if err := put(panelTag(rep.Panels[i])); err != nil {
			return err
		}
	}
	return writePDF(w, pdf)
}

func nodeTag(n NodeRow) tag {
	t := tag{label: n.Label, kind: "NODE", typ: n.Type, bay: bayName(n.Label), note: HubFrameShort}
	sup := ""
	if n.Support {
		sup = ", support"
	}
	t.lines = []string{fmt.Sprintf("%s mm, %d members%s", heightText(n.Pos[2]), len(n.Arms), sup)}
	t.table = append(t.table, [3]string{"member", "az °", "el °"})
	for _, a := range n.Arms {
		t.table = append(t.table, [3]string{a.Member, fmt.Sprintf("%.1f", r(a.AzimuthDeg, 1)), fmt.Sprintf("%+.1f", r(a.ElevationDeg, 1))})
	}
	return t
}

func memberTag(mb MemberRow) tag {
	e := mb.Ends
	return tag{label: mb.Label, kind: "MEMBER", typ: mb.Type, bay: bayName(mb.Label), note: "Fix this tag at end A.",
		lines: []string{
			"end A to node " + mb.NodeA,
			"end B to node " + mb.NodeB,
			fmt.Sprintf("cut length %.1f mm", mb.CutLengthMM),
			fmt.Sprintf("A: mitre %.1f°, bevel %.1f°", r(e[0].MitreDeg, 1), r(e[0].BevelDeg, 1)),
			fmt.Sprintf("B: mitre %.1f°, bevel %.1f°", r(e[1].MitreDeg, 1), r(e[1].BevelDeg, 1)),
			fmt.Sprintf("twist %.2f°", r(mb.TwistDeg, 2)),
		}}
}

func panelTag(p PanelRow) tag {
	t := tag{label: p.Label, kind: "PANEL", typ: p.Type, bay: bayName(p.Label), note: "Corners from corner 1, counter-clockwise seen from outside. " + BevelSignShort}
	t.lines = append(t.lines, "corners 1-"+fmt.Sprint(len(p.Corners))+": "+strings.Join(p.Corners, " "))
	if p.Sheet != "" {
		t.lines = append(t.lines, "sheet "+p.Sheet)
	}
	if ds := diagonalText(p.Cut.Diagonals, p.Corners); ds != "" {
		t.lines = append(t.lines, TagCutDiagonalsText+ds+" mm")
	}
	if ds := diagonalText(p.Diagonals, p.Corners); ds != "" {
		t.lines = append(t.lines, TagSetOutDiagonalsText+ds)
	}
	if len(p.Edges) > 0 {
		bs := make([]string, len(p.Edges))
		for i, e := range p.Edges {
			bs[i] = signedFixed(e.BevelDeg, 1)
		}
		t.lines = append(t.lines, fmt.Sprintf("%s1-%d (°): %s", TagBevelsText, len(p.Edges), strings.Join(bs, " ")))
	}
	t.lines = append(t.lines, fmt.Sprintf("%.3f m², %.1f kg", p.AreaM2, p.WeightKg))
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
func diagonalText(ds []DiagonalRow, corners []string) string {
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

// drawTag draws one tag with its top-left corner at (x, y).
func drawTag(pdf *fpdf.Fpdf, t tag, x, y float64) error {
	in := tagInsetMM
	if err := drawQR(pdf, t.label, x+in-1, y+in-1, tagQRMM); err != nil {
		return err
	}
	// Left, under the QR code: the small print.
	lx, lw := x+in, tagQRMM-2
	pdf.SetTextColor(0, 0, 0)
	pdf.SetFont("Helvetica", "", 4.2)
	pdf.SetXY(lx, y+in+tagQRMM-2.5)
	lines := splitLines(pdf, pdfText(t.note), lw)
	for i, l := range lines {
		ly := y + in + tagQRMM - 0.5 + float64(i)*1.65
		if ly > y+TagH-in {
			break
		}
		pdf.Text(lx, ly, l)
	}
	// Right: label, kind, type and bay, then the details.
	rx := x + in + tagQRMM
	rw := x + TagW - in - rx
	lab := pdfText(t.label)
	size := fontSizeToFit(pdf, "Helvetica", "B", 17, lab, rw)
	top := y + in + capHeight*size*ptMM
	pdf.Text(rx, top, lab)
	cy := top + 3.6
	pdf.SetFont("Helvetica", "B", 6.5)
	head := pdfText(fmt.Sprintf("%s   %s   bay %s", t.kind, t.typ, t.bay))
	pdf.Text(rx, cy, fitText(pdf, head, rw))
	cy += 3
	bottom := y + TagH - in
	// Shrink the details until they fit.
	rows := len(t.lines) + len(t.table)
	step := 2.55
	pt := 6.0
	if need := float64(rows) * step; cy+need > bottom+step*0.3 && rows > 0 {
		f := (bottom - cy + step*0.3) / need
		step *= f
		pt *= f
	}
	pdf.SetFont("Helvetica", "", pt)
	for _, l := range t.lines {
		pdf.Text(rx, cy, fitText(pdf, pdfText(l), rw))
		cy += step
	}
	cols := [3]float64{0, rw * 0.52, rw * 0.78}
	for i, row := range t.table {
		style := ""
		if i == 0 {
			style = "B"
		}
		pdf.SetFont("Helvetica", style, pt)
		for c, s := range row {
			s = pdfText(s)
			if c == 0 {
				pdf.Text(rx+cols[c], cy, fitText(pdf, s, cols[1]-1))
				continue
			}
			// Numbers right-aligned in their column.
			right := rx + cols[c] + rw*0.2
			pdf.Text(right-pdf.GetStringWidth(s), cy, s)
		}
		cy += step
	}
	return nil
}
