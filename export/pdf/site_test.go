package pdf

import (
	"bytes"
	"fmt"
	"pqfab/export/internal/exporttest"
	"pqfab/internal/report"
	"pqfab/quadnet"
	"strings"
	"testing"
)

func TestPDFText(t *testing.T) {
	tests := []struct{ in, want string }{
		{"Vault A", "Vault A"},
		{"a\nb", "a b"},
		{"Café €5 – x°", "Caf\xe9 \x805 \x96 x\xb0"},
		{"日本 🙂", "?? ?"},
	}
	for _, tc := range tests {
		if got := pdfText(tc.in); got != tc.want {
			t.Errorf("pdfText(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// TestSiteLimits: above the limits the PDFs hold one page saying so, and
// the report carries a warning; at the limit they hold everything.
func TestSiteLimits(t *testing.T) {
	// Tags: one node row per part is enough to pass the limit.
	big := &report.Report{Title: "big", Bays: report.BayGrid{SizeMM: [2]float64{6000, 6000}}}
	for i := range report.MaxTags + 1 {
		big.Nodes = append(big.Nodes, report.NodeRow{Label: fmt.Sprintf("A1-%05d", i+1), Type: "NT-001"})
	}
	var buf bytes.Buffer
	if err := WriteTagsPDF(&buf, big); err != nil {
		t.Fatal(err)
	}
	if got := bytes.Count(buf.Bytes(), []byte("/Type /Page\n")); got != 1 {
		t.Errorf("tags above the limit: %d pages, want 1", got)
	}
	if w := report.SiteWarnings(big); len(w) != 1 || !strings.Contains(w[0], "tags.pdf holds no tags") {
		t.Errorf("warnings %q", w)
	}
	big.Nodes = big.Nodes[:report.MaxTags]
	if w := report.SiteWarnings(big); len(w) != 0 {
		t.Errorf("at the limit: warnings %q", w)
	}
	// Plan: one node in each of MaxPlanPages+1 bays.
	wide := &report.Report{Title: "wide", Bays: report.BayGrid{SizeMM: [2]float64{6000, 6000}}}
	for i := range report.MaxPlanPages + 1 {
		wide.Nodes = append(wide.Nodes, report.NodeRow{Label: quadnet.ColumnLetters(i%100) + fmt.Sprint(i/100+1) + "-01",
			Pos: [3]float64{6000*float64(i%100) + 100, 6000*float64(i/100) + 100, 0}, Type: "NT-001"})
	}
	buf.Reset()
	if err := WritePlanPDF(&buf, wide); err != nil {
		t.Fatal(err)
	}
	if got := bytes.Count(buf.Bytes(), []byte("/Type /Page\n")); got != 1 {
		t.Errorf("plan above the limit: %d pages, want 1", got)
	}
	if w := report.SiteWarnings(wide); len(w) != 1 || !strings.Contains(w[0], "plan.pdf holds no bay pages") {
		t.Errorf("warnings %q", w)
	}
}

func BenchmarkTagsPDF1600(b *testing.B) { exporttest.BenchWrite(b, WriteTagsPDF) }

func BenchmarkPlanPDF1600(b *testing.B) { exporttest.BenchWrite(b, WritePlanPDF) }

// TestTagContinues: a node with more arms than a tag holds goes on on a
// second tag: both carry the label with "(k/n)", the second repeats the
// table's header, and every arm is on one of them, in order.
func TestTagContinues(t *testing.T) {
	n := report.NodeRow{Label: "C3-07", Type: "NT-001", Pos: [3]float64{0, 0, 3000}, AxisTiltDeg: 2, AxisTiltTowardDeg: 45}
	for k := range 14 {
		n.Arms = append(n.Arms, report.ArmRow{Member: fmt.Sprintf("C3-M%02d", k+1), AzimuthDeg: float64(25 * k)})
	}
	pdf := newPDF("P", "A4", "t", "t")
	for _, lay := range []TagLayout{TagOffice, TagOutdoor} {
		parts := splitTag(pdf, nodeTag(n), lay)
		if len(parts) != 2 || parts[0].label != "C3-07 (1/2)" || parts[1].label != "C3-07 (2/2)" {
			t.Fatalf("%s: %d tags %v, want C3-07 (1/2) and (2/2)", lay.Name, len(parts), parts)
		}
		g := geomOf(lay)
		var arms []string
		for i, p := range parts {
			if len(p.rows) > g.rows {
				t.Errorf("%s: tag %d has %d rows, room for %d", lay.Name, i+1, len(p.rows), g.rows)
			}
			for j, rw := range p.rows {
				if rw.cells == nil {
					continue
				}
				if rw.bold {
					if i == 1 && j != 0 {
						t.Errorf("%s: the continued tag's header is row %d", lay.Name, j+1)
					}
					continue
				}
				arms = append(arms, rw.cells[0])
			}
		}
		if len(arms) != 14 || arms[0] != "C3-M01" || arms[13] != "C3-M14" {
			t.Errorf("%s: arms on the tags %v", lay.Name, arms)
		}
	}
}

// TestLongTitleLines: a title far too long for the title block, one word
// without spaces and with characters outside code page 1252, is split into
// lines that stay inside the plan's title column.
func TestLongTitleLines(t *testing.T) {
	title := strings.Repeat("Überdachung日本", 40) + " " + strings.Repeat("x", 300)
	pdf := newPDF("L", "A3", "", "")
	pdf.SetFont("Helvetica", "B", 10)
	for _, l := range splitLines(pdf, pdfText(title), 100) {
		if w := pdf.GetStringWidth(fitText(pdf, l, 100)); w > 100 {
			t.Errorf("title line %.1f mm wide, want at most 100", w)
		}
	}
}
