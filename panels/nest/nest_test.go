package nest

import (
	"math"
	"math/rand/v2"
	"testing"

	"pqfab/geom"
)

// checkResult is the exact check every nesting in these tests passes: each
// placed part inside its sheet minus the margin, no two parts on a sheet
// closer than the spacing, each part exactly once on a sheet or unplaced.
// It uses its own polygon distance (closest pair of edges, zero when edges
// cross or one part holds a corner of the other), independent of the
// nester's no-fit polygons. Slack: 1e-6 mm of floating point.
func checkResult(t *testing.T, parts []Part, stocks []Stock, r *Result) {
	t.Helper()
	const slack = 1e-6
	seen := make([]int, len(parts))
	for si, sh := range r.Sheets {
		s := stocks[sh.Stock]
		for _, pl := range sh.Placements {
			seen[pl.Part]++
			for _, v := range pl.Outline {
				if v.X < s.MarginMM-slack || v.Y < s.MarginMM-slack || v.X > s.WidthMM-s.MarginMM+slack || v.Y > s.HeightMM-s.MarginMM+slack {
					t.Fatalf("sheet %d: part %d corner %v outside the margin", si, pl.Part, v)
				}
			}
			if math.Abs(pl.Outline.Area()-parts[pl.Part].Outline.Area()) > 1e-6*parts[pl.Part].Outline.Area() {
				t.Fatalf("sheet %d: part %d changed area", si, pl.Part)
			}
		}
		for i := range sh.Placements {
			for j := i + 1; j < len(sh.Placements); j++ {
				d := polyDistance(sh.Placements[i].Outline, sh.Placements[j].Outline)
				if d < s.SpacingMM-slack {
					t.Fatalf("sheet %d: parts %d and %d are %.6f mm apart, spacing %g", si, sh.Placements[i].Part, sh.Placements[j].Part, d, s.SpacingMM)
				}
			}
		}
	}
	for _, u := range r.Unplaced {
		seen[u.Part]++
	}
	for p, c := range seen {
		if c != 1 {
			t.Fatalf("part %d accounted for %d times", p, c)
		}
	}
}

func polyDistance(a, b geom.Polygon) float64 {
	if inside(a, b[0]) || inside(b, a[0]) {
		return 0
	}
	d := math.Inf(1)
	for i := range a {
		for j := range b {
			d = math.Min(d, segDist(a[i], a[(i+1)%len(a)], b[j], b[(j+1)%len(b)]))
		}
	}
	return d
}

// inside: ray casting, strict.
func inside(p geom.Polygon, v geom.Vec2) bool {
	in := false
	for i := range p {
		a, b := p[i], p[(i+1)%len(p)]
		if (a.Y > v.Y) != (b.Y > v.Y) && v.X < a.X+(v.Y-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}

func segDist(a, b, c, d geom.Vec2) float64 {
	cross := func(o, p, q geom.Vec2) float64 { return (p.X-o.X)*(q.Y-o.Y) - (p.Y-o.Y)*(q.X-o.X) }
	d1, d2, d3, d4 := cross(a, b, c), cross(a, b, d), cross(c, d, a), cross(c, d, b)
	if ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0)) {
		return 0
	}
	pd := func(p, s, e geom.Vec2) float64 {
		v, w := e.Sub(s), p.Sub(s)
		t := math.Max(0, math.Min(1, w.Dot(v)/v.Dot(v)))
		return p.Sub(s.Add(v.Scale(t))).Norm()
	}
	return math.Min(math.Min(pd(a, c, d), pd(b, c, d)), math.Min(pd(c, a, b), pd(d, a, b)))
}

func rect(w, h float64) geom.Polygon {
	return geom.Polygon{{X: 0, Y: 0}, {X: w, Y: 0}, {X: w, Y: h}, {X: 0, Y: h}}
}

// TestSquaresFillSheet: 8 squares of 500 mm fill a 1000 × 2000 mm sheet
// exactly with zero spacing: one sheet, 100 % (known packing).
func TestSquaresFillSheet(t *testing.T) {
	var parts []Part
	for i := 0; i < 8; i++ {
		parts = append(parts, Part{Label: "S", Outline: rect(500, 500)})
	}
	stocks := []Stock{{Name: "board", WidthMM: 1000, HeightMM: 2000, Rotation: Free}}
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if len(r.Sheets) != 1 || math.Abs(r.Sheets[0].Utilization-1) > 1e-12 || len(r.Unplaced) != 0 {
		t.Errorf("got %d sheets, utilization %g", len(r.Sheets), r.Sheets[0].Utilization)
	}
}

// TestGridCount: equal rectangles fill a sheet by the grid count
// floor((W − 2m + s)/(w + s)) × floor((H − 2m + s)/(h + s)) (common
// practice check for guillotine-free layouts of equal parts).
func TestGridCount(t *testing.T) {
	for _, tc := range []struct {
		w, h, m, s float64
		perSheet   int
	}{
		{300, 200, 0, 0, 15},
		{300, 200, 20, 10, 12},
		{450, 310, 15, 4, 6},
	} {
		n := tc.perSheet * 3
		var parts []Part
		for i := 0; i < n; i++ {
			parts = append(parts, Part{Label: "R", Outline: rect(tc.w, tc.h)})
		}
		stocks := []Stock{{Name: "sheet", WidthMM: 1000, HeightMM: 1000, MarginMM: tc.m, SpacingMM: tc.s, Rotation: Grain}}
		r, err := Nest(parts, stocks)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, parts, stocks, r)
		want := int(math.Floor((1000-2*tc.m+tc.s)/(tc.w+tc.s))) * int(math.Floor((1000-2*tc.m+tc.s)/(tc.h+tc.s)))
		if want != tc.perSheet {
			t.Fatalf("test table: grid count %d", want)
		}
		if len(r.Sheets) != 3 {
			t.Errorf("%+v: %d sheets, want 3", tc, len(r.Sheets))
		}
	}
}

// TestRandomConvex nests random convex parts on two stock sizes with
// counts and prices and checks every result exactly.
func TestRandomConvex(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	var parts []Part
	for i := 0; i < 120; i++ {
		var pts []geom.Vec2
		for k := 0; k < 7; k++ {
			pts = append(pts, geom.Vec2{X: rng.Float64() * 900, Y: rng.Float64() * 600})
		}
		parts = append(parts, Part{Label: "P", Outline: geom.ConvexHull(pts)})
	}
	parts = append(parts, Part{Label: "huge", Outline: rect(5000, 5000)})
	stocks := []Stock{
		{Name: "small", WidthMM: 2000, HeightMM: 1500, MarginMM: 15, SpacingMM: 6, Rotation: Free, Price: 40},
		{Name: "large", WidthMM: 3210, HeightMM: 2250, MarginMM: 20, SpacingMM: 6, Rotation: Quarter, Mirror: true, Price: 90, Count: 5},
	}
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if len(r.Unplaced) != 1 || r.Unplaced[0].Part != 120 {
		t.Errorf("unplaced %v", r.Unplaced)
	}
	total := 0
	for _, u := range r.Stocks {
		total += u.Sheets
		if u.Sheets > 0 && stocks[u.Stock].Count > 0 && u.Sheets > stocks[u.Stock].Count {
			t.Errorf("used %d of %d %s sheets", u.Sheets, stocks[u.Stock].Count, stocks[u.Stock].Name)
		}
	}
	t.Logf("%d sheets (%s ordering), cost %g, stocks %+v", total, r.Ordering, r.Cost, r.Stocks)
}

// TestCountLimit: when stock runs out the rest is unplaced, with reason.
func TestCountLimit(t *testing.T) {
	var parts []Part
	for i := 0; i < 10; i++ {
		parts = append(parts, Part{Label: "S", Outline: rect(500, 500)})
	}
	stocks := []Stock{{Name: "board", WidthMM: 1000, HeightMM: 1000, Rotation: Grain, Count: 2}}
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if len(r.Sheets) != 2 || len(r.Unplaced) != 2 || r.Unplaced[0].Reason != "no stock sheet left that it fits" {
		t.Errorf("sheets %d unplaced %+v", len(r.Sheets), r.Unplaced)
	}
	if _, err := Nest(parts, nil); err == nil {
		t.Error("no stock: want an error")
	}
	if _, err := Nest(parts, []Stock{{WidthMM: 100, HeightMM: 0, Rotation: Free}}); err == nil {
		t.Error("zero height: want an error")
	}
}

func TestMinkowski(t *testing.T) {
	// Square ⊕ square = square of the summed sides; NFP of two unit
	// squares is the square [-1, 1]².
	f := nfp(rect(1, 1), rect(1, 1))
	if math.Abs(f.Area()-4) > 1e-12 || len(f) != 4 {
		t.Errorf("nfp %v", f)
	}
	// Right triangle (legs 1) ⊕ unit square: the 2 × 2 square less the
	// half-unit triangle cut off its upper right corner, 4 − 0.5 = 3.5.
	tri := geom.Polygon{{X: 0, Y: 0}, {X: 1, Y: 0}, {X: 0, Y: 1}}
	if got := minkowski(tri, rect(1, 1)).Area(); math.Abs(got-3.5) > 1e-12 {
		t.Errorf("triangle ⊕ square area %g", got)
	}
}

// TestNonConvex: L-shaped parts are nested by their hulls, so they never
// come closer than the spacing (checked exactly).
func TestNonConvex(t *testing.T) {
	l := geom.Polygon{{X: 0, Y: 0}, {X: 800, Y: 0}, {X: 800, Y: 300}, {X: 300, Y: 300}, {X: 300, Y: 700}, {X: 0, Y: 700}}
	var parts []Part
	for i := 0; i < 20; i++ {
		parts = append(parts, Part{Label: "L", Outline: l})
	}
	stocks := []Stock{{Name: "ply", WidthMM: 2440, HeightMM: 1220, MarginMM: 10, SpacingMM: 4, Rotation: Quarter, Mirror: true}}
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if len(r.Unplaced) != 0 {
		t.Errorf("unplaced %v", r.Unplaced)
	}
}
