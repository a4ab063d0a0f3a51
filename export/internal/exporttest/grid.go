package exporttest

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"pqfab/geom"
	"pqfab/internal/report"
	"pqfab/quadnet"
	"testing"
)

// GridReport is a report for an nx × ny grid of nodes spaced sp mm (a
// gentle vault, z rising to the middle), members along both grid
// directions and a quad panel in every cell, labelled with bays of bay mm.
func GridReport(t testing.TB, nx, ny int, sp, bay float64) *report.Report {
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

// BenchWrite times a site file writer on a 40 × 40 grid (1600
// nodes, 3120 members, 1521 panels: 6241 tags, 100 bay pages).
func BenchWrite(b *testing.B, write func(io.Writer, *report.Report) error) {
	rep := GridReport(b, 40, 40, 1500, 6000)
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := write(&buf, rep); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(buf.Len())/1e6, "MB")
}

// ClipArea is the area shared by two convex counter-clockwise polygons
// (Sutherland–Hodgman clipping): an overlap test independent of the
// separating-axis test of layout.Box.
func ClipArea(a, b [4][2]float64) float64 {
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
