package nest

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"pqfab/geom"
)

// checkResult is the check every nesting in these tests passes: each
// placed part inside its sheet minus the margin, its outline the part's
// outline mirrored, turned and moved as the placement says, no two parts
// on a sheet closer than the spacing and none overlapping another (by
// more than 1e-6 mm deep), each part exactly once on a sheet or unplaced,
// and for edge-to-edge stocks a replay of the cuts (replayCuts). It uses
// its own polygon geometry (closest pair of edges, ear clipping, convex
// clipping), independent of the nester's. Slack: 1e-6 mm of floating
// point.
func checkResult(t testing.TB, parts []Part, stocks []Stock, r *Result) {
	t.Helper()
	const slack = 1e-6
	seen := make([]int, len(parts))
	for si, sh := range r.Sheets {
		s := stocks[sh.Stock]
		var area float64
		for _, pl := range sh.Placements {
			seen[pl.Part]++
			area += parts[pl.Part].Outline.Area()
			for _, v := range pl.Outline {
				if v.X < s.MarginMM-slack || v.Y < s.MarginMM-slack || v.X > s.WidthMM-s.MarginMM+slack || v.Y > s.HeightMM-s.MarginMM+slack {
					t.Fatalf("sheet %d: part %d corner %v outside the margin", si, pl.Part, v)
				}
			}
			// The outline is the part's, mirrored, turned and moved.
			src := parts[pl.Part].Outline
			if len(pl.Outline) != len(src) {
				t.Fatalf("sheet %d: part %d has %d corners, want %d", si, pl.Part, len(pl.Outline), len(src))
			}
			sin, cos := math.Sincos(pl.RotationDeg * math.Pi / 180)
			for k := range src {
				v := src[k]
				if pl.Mirrored {
					v = src[(len(src)-k)%len(src)]
					v.X = -v.X
				}
				w := geom.Vec2{X: cos*v.X - sin*v.Y + pl.X, Y: sin*v.X + cos*v.Y + pl.Y}
				if w.Sub(pl.Outline[k]).Norm() > 1e-6 {
					t.Fatalf("sheet %d: part %d corner %d at %v, want %v from the placement", si, pl.Part, k, pl.Outline[k], w)
				}
			}
			if pl.Mirrored && !s.Mirror {
				t.Fatalf("sheet %d: part %d mirrored on a stock that does not allow it", si, pl.Part)
			}
			if !turnAllowed(s.Rotation, pl.RotationDeg) {
				t.Fatalf("sheet %d: part %d turned %g° on a %s stock", si, pl.Part, pl.RotationDeg, s.Rotation)
			}
		}
		if math.Abs(area-sh.PartAreaMM2) > 1e-6*area || math.Abs(sh.Utilization-area/(s.WidthMM*s.HeightMM)) > 1e-9 {
			t.Fatalf("sheet %d: part area %g, utilization %g; want %g", si, sh.PartAreaMM2, sh.Utilization, area)
		}
		for i := range sh.Placements {
			for j := i + 1; j < len(sh.Placements); j++ {
				a, b := sh.Placements[i].Outline, sh.Placements[j].Outline
				if d := polyDistance(a, b); d < s.SpacingMM-slack {
					t.Fatalf("sheet %d: parts %d and %d are %.6f mm apart, spacing %g", si, sh.Placements[i].Part, sh.Placements[j].Part, d, s.SpacingMM)
				}
				if d := overlapDepth(a, b); d > slack {
					t.Fatalf("sheet %d: parts %d and %d overlap %.3g mm deep", si, sh.Placements[i].Part, sh.Placements[j].Part, d)
				}
				if ar := overlapArea(a, b); ar > slack*math.Min(a.Perimeter(), b.Perimeter()) {
					t.Fatalf("sheet %d: parts %d and %d overlap by %.3g mm²", si, sh.Placements[i].Part, sh.Placements[j].Part, ar)
				}
			}
		}
		if s.Cuts == EdgeToEdge {
			replayCuts(t, si, sh, s)
		} else if len(sh.Cuts) > 0 {
			t.Fatalf("sheet %d: cuts on a stock without the edge-to-edge rule", si)
		}
	}
	for _, u := range r.Unplaced {
		seen[u.Part]++
		if u.Reason == 0 {
			t.Fatalf("part %d unplaced without a reason", u.Part)
		}
	}
	for p, c := range seen {
		if c != 1 {
			t.Fatalf("part %d accounted for %d times", p, c)
		}
	}
}

// turnAllowed reports whether a turn is one a stock's rotation allows.
func turnAllowed(r Rotation, deg float64) bool {
	q := math.Mod(math.Mod(deg, 360)+360, 360)
	near := func(a float64) bool { return math.Abs(q-a) < 1e-9 || math.Abs(q-a-360) < 1e-9 }
	switch r {
	case Grain:
		return near(0) || near(180)
	case Quarter:
		return near(0) || near(90) || near(180) || near(270)
	}
	return q >= 0 && q < 360
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
	return math.Min(math.Min(ptSeg(a, c, d), ptSeg(b, c, d)), math.Min(ptSeg(c, a, b), ptSeg(d, a, b)))
}

func ptSeg(p, s, e geom.Vec2) float64 {
	v, w := e.Sub(s), p.Sub(s)
	t := math.Max(0, math.Min(1, w.Dot(v)/v.Dot(v)))
	return p.Sub(s.Add(v.Scale(t))).Norm()
}

// overlapDepth returns how deep a corner of one polygon lies inside the
// other: its distance from the other's outline, 0 if none lies inside.
func overlapDepth(a, b geom.Polygon) float64 {
	var d float64
	for _, pair := range [2][2]geom.Polygon{{a, b}, {b, a}} {
		p, q := pair[0], pair[1]
		for _, v := range p {
			if !inside(q, v) {
				continue
			}
			m := math.Inf(1)
			for k := range q {
				m = math.Min(m, ptSeg(v, q[k], q[(k+1)%len(q)]))
			}
			d = math.Max(d, m)
		}
	}
	return d
}

// overlapArea returns the area two simple polygons share: the sum over
// pairs of triangles (ear clipping) of the area of their intersection
// (clipping one convex polygon by the edges of the other).
func overlapArea(a, b geom.Polygon) float64 {
	var sum float64
	ta, tb := triangles(a), triangles(b)
	for _, x := range ta {
		for _, y := range tb {
			sum += clipConvex(x, y).Area()
		}
	}
	return sum
}

// triangles splits a simple counter-clockwise polygon into triangles by
// cutting ears (a corner that turns left and whose triangle holds no other
// corner).
func triangles(p geom.Polygon) []geom.Polygon {
	cross := func(o, a, b geom.Vec2) float64 { return (a.X-o.X)*(b.Y-o.Y) - (a.Y-o.Y)*(b.X-o.X) }
	q := append(geom.Polygon(nil), p...)
	var out []geom.Polygon
	for len(q) > 3 {
		n := len(q)
		found := false
		for i := 0; i < n; i++ {
			a, b, c := q[(i+n-1)%n], q[i], q[(i+1)%n]
			if cross(a, b, c) <= 0 {
				continue
			}
			ok := true
			for _, v := range q {
				if v != a && v != b && v != c && cross(a, b, v) >= 0 && cross(b, c, v) >= 0 && cross(c, a, v) >= 0 {
					ok = false
					break
				}
			}
			if ok {
				out = append(out, geom.Polygon{a, b, c})
				q = append(q[:i], q[i+1:]...)
				found = true
				break
			}
		}
		if !found {
			break
		}
	}
	if len(q) == 3 {
		out = append(out, q)
	}
	return out
}

// clipConvex returns the intersection of convex counter-clockwise x and y
// (Sutherland and Hodgman).
func clipConvex(x, y geom.Polygon) geom.Polygon {
	out := x
	for i := range y {
		a, b := y[i], y[(i+1)%len(y)]
		side := func(v geom.Vec2) float64 { return (b.X-a.X)*(v.Y-a.Y) - (b.Y-a.Y)*(v.X-a.X) }
		var next geom.Polygon
		for k := range out {
			p, q := out[k], out[(k+1)%len(out)]
			sp, sq := side(p), side(q)
			if sp >= 0 {
				next = append(next, p)
			}
			if (sp >= 0) != (sq >= 0) {
				next = append(next, p.Add(q.Sub(p).Scale(sp/(sp-sq))))
			}
		}
		if len(next) < 3 {
			return nil
		}
		out = next
	}
	return out
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
	r, err := NestWith(context.Background(), parts, stocks, Options{Steps: 8000})
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
	t.Logf("%d sheets (%s), cost %g, stocks %+v", total, r.Ordering, r.Cost, r.Stocks)
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
	if len(r.Sheets) != 2 || len(r.Unplaced) != 2 || r.Unplaced[0].Reason != ReasonNoStock {
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

// TestNonConvex: L-shaped parts are nested by their true outlines and
// never come closer than the spacing (checked exactly).
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

// lTromino returns three squares of side a in an L: (0,0), (a,0), (0,a).
func lTromino(a float64) geom.Polygon {
	return geom.Polygon{{X: 0, Y: 0}, {X: 2 * a, Y: 0}, {X: 2 * a, Y: a}, {X: a, Y: a}, {X: a, Y: 2 * a}, {X: 0, Y: 2 * a}}
}

// TestTrueOutline: two L-trominoes tile a 2 × 3 rectangle (one turned a
// half turn into the other's notch; a known tiling), so two of them with
// squares of 500 mm go on one 1000 × 1500 mm sheet with no margin or
// spacing. Nested by their hulls (3.5 squares each) they could not.
func TestTrueOutline(t *testing.T) {
	parts := []Part{{Label: "L1", Outline: lTromino(500)}, {Label: "L2", Outline: lTromino(500)}}
	stocks := []Stock{{Name: "board", WidthMM: 1000, HeightMM: 1500, Rotation: Quarter}}
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if len(r.Sheets) != 1 || len(r.Unplaced) != 0 {
		t.Errorf("got %d sheets, %d unplaced; want 1, 0", len(r.Sheets), len(r.Unplaced))
	}
}

// TestExactFit: a part that fits a sheet exactly (within 1e-6 mm) is
// placed: a square as large as the sheet inside its margins, a square
// 5e-7 mm larger, a rectangle that fits only when turned a quarter, and a
// thin strip that fits only along the sheet's diagonal.
func TestExactFit(t *testing.T) {
	diag := math.Hypot(960, 560) // inside the margins
	strip := geom.Polygon{{X: 0, Y: 0}, {X: diag - 20, Y: 0}, {X: diag - 20, Y: 10}, {X: 0, Y: 10}}
	for _, tc := range []struct {
		name string
		part geom.Polygon
		rot  Rotation
	}{
		{"square", rect(960, 560), Grain},
		{"square plus 5e-7 mm", rect(960+5e-7, 560+5e-7), Grain},
		{"quarter turn", rect(560, 960), Quarter},
		{"diagonal strip", strip, Free},
	} {
		parts := []Part{{Label: tc.name, Outline: tc.part}}
		stocks := []Stock{{Name: "sheet", WidthMM: 1000, HeightMM: 600, MarginMM: 20, Rotation: tc.rot}}
		r, err := Nest(parts, stocks)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, parts, stocks, r)
		if len(r.Unplaced) != 0 {
			t.Errorf("%s: unplaced: %s", tc.name, r.Unplaced[0].Reason)
		}
	}
	// A part 1e-3 mm too wide is too large.
	parts := []Part{{Label: "wide", Outline: rect(960.001, 560)}}
	r, err := Nest(parts, []Stock{{Name: "sheet", WidthMM: 1000, HeightMM: 600, MarginMM: 20, Rotation: Grain}})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Unplaced) != 1 || r.Unplaced[0].Reason != ReasonTooLarge {
		t.Errorf("too wide: unplaced %+v", r.Unplaced)
	}
}

// TestCheckerOnOptima: the checker accepts the published optimal layouts
// of a few convex-bins instances (Terashima-Marín et al. 2010, OpT files,
// testdata/README.md), whose pieces tile their bins exactly and so touch
// along whole edges, and finds an overlap wherever a piece is moved 0.1 mm
// into its neighbours.
func TestCheckerOnOptima(t *testing.T) {
	for _, name := range []string{"A001", "E001", "P001"} {
		in := loadBinInstance(t, name)
		stocks := []Stock{{Name: "bin", WidthMM: in.widthMM, HeightMM: in.heightMM, Rotation: Free}}
		var parts []Part
		r := &Result{}
		for _, bin := range loadOptBins(t, name) {
			sh := Sheet{}
			for _, p := range bin {
				lo, _ := p.Bounds()
				parts = append(parts, Part{Label: name, Outline: p.Translate(geom.Vec2{X: -lo.X, Y: -lo.Y})})
				sh.Placements = append(sh.Placements, Placement{Part: len(parts) - 1, X: lo.X, Y: lo.Y, Outline: p})
				sh.PartAreaMM2 += p.Area()
			}
			sh.Utilization = sh.PartAreaMM2 / (in.widthMM * in.heightMM)
			r.Sheets = append(r.Sheets, sh)
		}
		checkResult(t, parts, stocks, r)
		// Moved 0.1 mm left, a piece off the bin's left edge overlaps a
		// neighbour by more than the checker's slack.
		moved := 0
		for _, sh := range r.Sheets {
			for i, pl := range sh.Placements {
				if lo, _ := pl.Outline.Bounds(); lo.X == 0 {
					continue
				}
				b := pl.Outline.Translate(geom.Vec2{X: -0.1})
				for j, q := range sh.Placements {
					if j != i && overlapArea(b, q.Outline) > 1e-6*b.Perimeter() {
						moved++
						break
					}
				}
			}
		}
		if want := countOffLeft(r); moved != want {
			t.Errorf("%s: %d of %d pieces overlap a neighbour when moved 0.1 mm left", name, moved, want)
		}
	}
}

// countOffLeft counts the placed parts that do not touch x = 0.
func countOffLeft(r *Result) int {
	n := 0
	for _, sh := range r.Sheets {
		for _, pl := range sh.Placements {
			if lo, _ := pl.Outline.Bounds(); lo.X != 0 {
				n++
			}
		}
	}
	return n
}

// TestSheetName: at least two digits, as many as the count needs, so
// names sort in order.
func TestSheetName(t *testing.T) {
	for _, tc := range []struct {
		i, n int
		want string
	}{{0, 1, "S-01"}, {8, 12, "S-09"}, {99, 100, "S-100"}, {4, 1000, "S-0005"}} {
		if got := SheetName(tc.i, tc.n); got != tc.want {
			t.Errorf("SheetName(%d, %d) = %q, want %q", tc.i, tc.n, got, tc.want)
		}
	}
}
