package export_test

import (
	"bytes"
	"pqfab/export/dxf"
	"pqfab/export/internal/exporttest"
	"pqfab/export/pdf"
	"pqfab/export/web"
	"strings"
	"testing"
)

// TestSitePDFsDeterministic: two runs give the same bytes; the plan has
// a page per bay and the tags a sheet per 24 parts (counted in the PDF's
// page tree).
func TestSitePDFsDeterministic(t *testing.T) {
	rep := exporttest.GridReport(t, 9, 7, 1500, 6000)
	rep.Title = "Test \"vault\" <b>\n 日本 — café"
	for _, tc := range []struct {
		name  string
		write func(*bytes.Buffer) error
		pages int
	}{
		{"plan", func(b *bytes.Buffer) error { return pdf.WritePlanPDF(b, rep) }, 7}, // the index and 6 bays
		{"tags", func(b *bytes.Buffer) error { return pdf.WriteTagsPDF(b, rep) }, (len(rep.Nodes) + len(rep.Members) + len(rep.Panels) + 7) / 8},
		{"view", func(b *bytes.Buffer) error { return web.WriteView(b, rep) }, 0},
	} {
		var a, b bytes.Buffer
		if err := tc.write(&a); err != nil {
			t.Fatal(err)
		}
		if err := tc.write(&b); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(a.Bytes(), b.Bytes()) {
			t.Errorf("%s: two runs differ", tc.name)
		}
		if tc.pages > 0 {
			if got := bytes.Count(a.Bytes(), []byte("/Type /Page\n")); got != tc.pages {
				t.Errorf("%s: %d pages, want %d", tc.name, got, tc.pages)
			}
		}
	}
}

// TestLongTitle: a title far too long for the title block, one word
// without spaces and with characters outside code page 1252, still gives
// the plan, the tags, the assembly plan and the 3D view.
func TestLongTitle(t *testing.T) {
	rep := exporttest.GridReport(t, 4, 4, 1500, 6000)
	rep.Title = strings.Repeat("Überdachung日本", 40) + " " + strings.Repeat("x", 300)
	var buf bytes.Buffer
	for _, write := range []func() error{
		func() error { return pdf.WritePlanPDF(&buf, rep) },
		func() error { return pdf.WriteTagsPDF(&buf, rep) },
		func() error { return dxf.WriteAssemblyDXF(&buf, rep) },
		func() error { return web.WriteView(&buf, rep) },
	} {
		buf.Reset()
		if err := write(); err != nil {
			t.Fatal(err)
		}
	}
}
