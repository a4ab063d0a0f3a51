package export

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"pqfab/geom"
	"pqfab/internal/report"
	"pqfab/quadnet"
)

// gridReport is a report for an nx × ny grid of nodes spaced sp mm (a
// gentle vault, z rising to the middle), members along both grid
// directions and a quad panel in every cell, labelled with bays of bay mm.
func gridReport(t testing.TB, nx, ny int, sp, bay float64) *report.Report {
	t.Helper()
	var pts []geom.Vec
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			x, y := sp*float64(i)+0.3*sp*float64(j), sp*float64(j)
			z := 3000 + 800*math.Sin(math.Pi*float64(i)/float64(max(nx-1, 1)))
			pts = append(pts, geom.Vec{X: x, Y: y, Z: z})
		}
	}
	b, err := quadnet.NewBays(pts, bay, bay)
	if err != nil {
		t.Fatal(err)
	}
	keys := make([]string, len(pts))
	for i := range keys {
		keys[i] = fmt.Sprint(i)
	}
	nl := b.Label(pts, keys, "")
	id := func(i, j int) int { return j*nx + i }
	type edge struct{ a, b int }
	var edges []edge
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			if i+1 < nx {
				edges = append(edges, edge{id(i, j), id(i+1, j)})
			}
			if j+1 < ny {
				edges = append(edges, edge{id(i, j), id(i, j+1)})
			}
		}
	}
	mid := make([]geom.Vec, len(edges))
	mkeys := make([]string, len(edges))
	for k, e := range edges {
		pa, pb := pts[e.a], pts[e.b]
		mid[k] = geom.Vec{X: (pa.X + pb.X) / 2, Y: (pa.Y + pb.Y) / 2, Z: (pa.Z + pb.Z) / 2}
		mkeys[k] = nl[e.a] + "/" + nl[e.b]
	}
	ml := b.Label(mid, mkeys, "M")
	var cents []geom.Vec
	var corners [][]int
	for j := 0; j+1 < ny; j++ {
		for i := 0; i+1 < nx; i++ {
			c := []int{id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1)}
			var s geom.Vec
			for _, k := range c {
				s = geom.Vec{X: s.X + pts[k].X/4, Y: s.Y + pts[k].Y/4, Z: s.Z + pts[k].Z/4}
			}
			cents = append(cents, s)
			corners = append(corners, c)
		}
	}
	pkeys := make([]string, len(cents))
	for k := range pkeys {
		pkeys[k] = fmt.Sprint(k)
	}
	pl := b.Label(cents, pkeys, "P")
	rep := &report.Report{Title: "grid", Bays: report.BayGridOf(b), Section: report.Section{WidthMM: 60, DepthMM: 120}}
	arms := map[int][]report.ArmRow{}
	for k, e := range edges {
		pa, pb := pts[e.a], pts[e.b]
		l := math.Sqrt((pb.X-pa.X)*(pb.X-pa.X) + (pb.Y-pa.Y)*(pb.Y-pa.Y) + (pb.Z-pa.Z)*(pb.Z-pa.Z))
		rep.Members = append(rep.Members, report.MemberRow{Label: ml[k], NodeA: nl[e.a], NodeB: nl[e.b], LengthMM: l, CutLengthMM: l - 80,
			Type: fmt.Sprintf("MT-%03d", k%7+1), Ends: [2]report.EndRow{{Node: nl[e.a], SetbackMM: 40}, {Node: nl[e.b], SetbackMM: 40}}})
		arms[e.a] = append(arms[e.a], report.ArmRow{Member: ml[k], AzimuthDeg: float64(90 * len(arms[e.a]))})
		arms[e.b] = append(arms[e.b], report.ArmRow{Member: ml[k], AzimuthDeg: float64(90 * len(arms[e.b]))})
	}
	for k := range 7 {
		rep.MemberTypes = append(rep.MemberTypes, report.MemberTypeRow{Name: fmt.Sprintf("MT-%03d", k+1), CutLengthMM: sp - 80})
	}
	for i, p := range pts {
		rep.Nodes = append(rep.Nodes, report.NodeRow{Label: nl[i], ID: fmt.Sprint(i + 1), Pos: [3]float64{p.X, p.Y, p.Z},
			Type: fmt.Sprintf("NT-%03d", i%5+1), MembersAtNode: len(arms[i]), Arms: arms[i], MoveMM: float64(i%9) / 3})
	}
	for k, c := range corners {
		row := report.PanelRow{Label: pl[k], ID: fmt.Sprint(k + 1), Type: fmt.Sprintf("PT-%03d", k%3+1), AreaM2: sp * sp / 1e6}
		for _, i := range c {
			row.Corners = append(row.Corners, nl[i])
		}
		rep.Panels = append(rep.Panels, row)
	}
	return rep
}

func TestDXFText(t *testing.T) {
	tests := []struct{ in, want string }{
		{"Vault A", "Vault A"},
		{"line\nbreak\r\tx", "line break  x"},
		{"Café 90°", "Caf\xe9 90\xb0"}, // code page 1252 bytes, which readers take AC1015 files to be in
		{"日本", `\U+65E5\U+672C`},
		{"a\\b^c", `a\U+005Cb\U+005Ec`},
		{"50% off", "50% off"},
		{"%%u under", "%%%%%%u under"},
		{"emoji 🙂", "emoji ?"},
		{"bad \xff byte", "bad ? byte"},
	}
	for _, tc := range tests {
		if got := dxfText(tc.in); got != tc.want {
			t.Errorf("dxfText(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

func TestWrapWords(t *testing.T) {
	tests := []struct {
		in    string
		width int
		want  []string
	}{
		{"a bb ccc dddd", 6, []string{"a bb", "ccc", "dddd"}},
		{"  one   two  ", 20, []string{"one two"}},
		{"averyveryverylongword x", 5, []string{"averyveryverylongword", "x"}},
		{"é é é", 3, []string{"é é", "é"}},
		{"", 5, nil},
	}
	for _, tc := range tests {
		got := WrapWords(tc.in, tc.width)
		if strings.Join(got, "|") != strings.Join(tc.want, "|") || len(got) != len(tc.want) {
			t.Errorf("wrapWords(%q, %d) = %q, want %q", tc.in, tc.width, got, tc.want)
		}
	}
}

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

// clipArea is the area shared by two convex counter-clockwise polygons
// (Sutherland–Hodgman clipping): an overlap test independent of the
// separating-axis test in obox.overlaps.
func clipArea(a, b [4][2]float64) float64 {
	poly := a[:]
	for i := range b {
		p, q := b[i], b[(i+1)%4]
		side := func(v [2]float64) float64 { return (q[0]-p[0])*(v[1]-p[1]) - (q[1]-p[1])*(v[0]-p[0]) }
		var out [][2]float64
		for k := range poly {
			c, d := poly[k], poly[(k+1)%len(poly)]
			sc, sd := side(c), side(d)
			if sc >= 0 {
				out = append(out, c)
			}
			if (sc >= 0) != (sd >= 0) {
				t := sc / (sc - sd)
				out = append(out, [2]float64{c[0] + t*(d[0]-c[0]), c[1] + t*(d[1]-c[1])})
			}
		}
		poly = out
		if len(poly) == 0 {
			return 0
		}
	}
	var s float64
	for k := range poly {
		c, d := poly[k], poly[(k+1)%len(poly)]
		s += c[0]*d[1] - d[0]*c[1]
	}
	return s / 2
}

func randomBox(rng *rand.Rand, span float64) Box {
	a := rng.Float64() * 2 * math.Pi
	return Box{CX: rng.Float64() * span, CY: rng.Float64() * span, UX: math.Cos(a), UY: math.Sin(a),
		HW: 0.5 + rng.Float64()*4, HH: 0.2 + rng.Float64()*1.5}
}

// TestOboxOverlaps checks the separating-axis test against polygon
// clipping on random rectangles (fixed seed); pairs within a hair of
// touching are left out, where the two methods may round either way.
func TestOboxOverlaps(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 14))
	checked := 0
	for n := 0; n < 20000; n++ {
		a, b := randomBox(rng, 12), randomBox(rng, 12)
		area := clipArea(a.corners(), b.corners())
		if area > 0 && area < 1e-9 {
			continue
		}
		if got, want := a.overlaps(b), area > 0; got != want {
			t.Fatalf("boxes %+v and %+v: overlaps %v, clipped area %g", a, b, got, area)
		}
		checked++
	}
	if checked < 19000 {
		t.Errorf("only %d pairs checked", checked)
	}
}

// TestPlacerNoOverlap places many labels among random obstacles (fixed
// seed) and checks every pair of boxes by brute force, without the index.
func TestPlacerNoOverlap(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 2))
	ix := NewBoxIndex(3, [2]float64{-10, -10}, [2]float64{110, 110})
	var obstacles []Box
	for range 300 {
		a := [2]float64{rng.Float64() * 100, rng.Float64() * 100}
		b := [2]float64{a[0] + rng.Float64()*20 - 10, a[1] + rng.Float64()*20 - 10}
		o := SegmentBox(a, b, 0.3)
		obstacles = append(obstacles, o)
		ix.Add(o)
	}
	// One very long line, filed along its axis.
	long := SegmentBox([2]float64{-50, 3}, [2]float64{5000, 40}, 0.3)
	obstacles = append(obstacles, long)
	ix.Add(long)
	p := &Placer{Index: ix, Ring: 2, Rings: 4, OverflowX: 6000, OverflowY: 100}
	var placed []Placement
	for range 600 {
		x, y := rng.Float64()*100, rng.Float64()*100
		w, h := 4+rng.Float64()*4, 1.5
		placed = append(placed, p.Place([2]float64{x, y}, w, h, func(s float64) []Box { return NodeCandidates(x, y, w, h, 0.5, s) }))
	}
	leaders := 0
	for i, a := range placed {
		if a.Leader {
			leaders++
		}
		for _, o := range obstacles {
			if clipArea(a.Box.corners(), o.corners()) > 1e-9 {
				t.Fatalf("label %d at %+v overlaps an obstacle %+v", i, a.Box, o)
			}
		}
		for j := i + 1; j < len(placed); j++ {
			if clipArea(a.Box.corners(), placed[j].Box.corners()) > 1e-9 {
				t.Fatalf("labels %d and %d overlap", i, j)
			}
		}
	}
	t.Logf("%d labels, %d on leaders", len(placed), leaders)
}

// TestSitePDFsDeterministic: two runs give the same bytes; the plan has
// a page per bay and the tags a sheet per 24 parts (counted in the PDF's
// page tree).
func TestSitePDFsDeterministic(t *testing.T) {
	rep := gridReport(t, 9, 7, 1500, 6000)
	rep.Title = "Test \"vault\" <b>\n 日本 — café"
	for _, tc := range []struct {
		name  string
		write func(*bytes.Buffer) error
		pages int
	}{
		{"plan", func(b *bytes.Buffer) error { return WritePlanPDF(b, rep) }, 7}, // the index and 6 bays
		{"tags", func(b *bytes.Buffer) error { return WriteTagsPDF(b, rep) }, (len(rep.Nodes) + len(rep.Members) + len(rep.Panels) + 7) / 8},
		{"view", func(b *bytes.Buffer) error { return WriteView(b, rep) }, 0},
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
// the plan and the tags; the plan's title lines stay inside the column.
func TestLongTitle(t *testing.T) {
	rep := gridReport(t, 4, 4, 1500, 6000)
	rep.Title = strings.Repeat("Überdachung日本", 40) + " " + strings.Repeat("x", 300)
	var buf bytes.Buffer
	for _, write := range []func() error{
		func() error { return WritePlanPDF(&buf, rep) },
		func() error { return WriteTagsPDF(&buf, rep) },
		func() error { return WriteAssemblyDXF(&buf, rep) },
		func() error { return WriteView(&buf, rep) },
	} {
		buf.Reset()
		if err := write(); err != nil {
			t.Fatal(err)
		}
	}
	pdf := newPDF("L", "A3", "", "")
	pdf.SetFont("Helvetica", "B", 10)
	for _, l := range splitLines(pdf, pdfText(rep.Title), 100) {
		if w := pdf.GetStringWidth(fitText(pdf, l, 100)); w > 100 {
			t.Errorf("title line %.1f mm wide, want at most 100", w)
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

// TestAssemblyLayoutNoOverlap lays out the plan of a grid and checks
// every pair of label boxes by brute force, and that no label is on a
// member line.
func TestAssemblyLayoutNoOverlap(t *testing.T) {
	rep := gridReport(t, 8, 6, 1500, 6000)
	m, err := NewSite(rep)
	if err != nil {
		t.Fatal(err)
	}
	ps := newPlanScale(m.SpanMM, rep.Section.WidthMM)
	pl := newAssemblyLayout(m, ps)
	want := len(m.Bays) + len(rep.Nodes) + len(rep.Members) + len(rep.Panels)
	if len(pl.labels) != want {
		t.Fatalf("%d labels, want %d", len(pl.labels), want)
	}
	for i, a := range pl.labels {
		for j := i + 1; j < len(pl.labels); j++ {
			if clipArea(a.at.Box.corners(), pl.labels[j].at.Box.corners()) > 1e-6 {
				t.Fatalf("labels %v and %v overlap", a.lines, pl.labels[j].lines)
			}
		}
		for _, mb := range rep.Members {
			pa, pb := m.Pos(mb.NodeA), m.Pos(mb.NodeB)
			line := SegmentBox([2]float64{pa[0], pa[1]}, [2]float64{pb[0], pb[1]}, 1e-3)
			if clipArea(a.at.Box.corners(), line.corners()) > 1e-6 {
				t.Fatalf("label %v lies on member %s", a.lines, mb.Label)
			}
		}
	}
}

func BenchmarkAssemblyLayout(b *testing.B) {
	rep := gridReport(b, 100, 100, 1500, 6000)
	m, err := NewSite(rep)
	if err != nil {
		b.Fatal(err)
	}
	ps := newPlanScale(m.SpanMM, rep.Section.WidthMM)
	for b.Loop() {
		newAssemblyLayout(m, ps)
	}
}

// Benchmarks of the site PDFs and the 3D view on a 40 × 40 grid (1600
// nodes, 3120 members, 1521 panels: 6241 tags, 100 bay pages).
func benchSite(b *testing.B, write func(io.Writer, *report.Report) error) {
	rep := gridReport(b, 40, 40, 1500, 6000)
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := write(&buf, rep); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(buf.Len())/1e6, "MB")
}

func BenchmarkTagsPDF1600(b *testing.B) { benchSite(b, WriteTagsPDF) }
func BenchmarkPlanPDF1600(b *testing.B) { benchSite(b, WritePlanPDF) }
func BenchmarkView1600(b *testing.B)    { benchSite(b, WriteView) }

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
