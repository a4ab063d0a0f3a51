package nest

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"pqfab/geom"
)

// replayCuts replays a sheet's edge-to-edge cuts, written independently of
// the nester: starting from the whole sheet (piece 0), cut i must split a
// piece that exists and was not split before (nothing is cut twice), its
// ends must lie on that piece's outline and the piece must lie on both
// sides of it (it runs edge to edge), no part may lie on both sides of it,
// and the two halves become pieces 2i+1 (left of From→To) and 2i+2. At the
// end every part must be a piece of its own, of its own area: released
// whole. Slack: 1e-6 mm.
func replayCuts(t testing.TB, si int, sh Sheet, s Stock) {
	t.Helper()
	const tol = 1e-6
	type piece struct {
		poly  geom.Polygon
		split bool
		parts []int // placements inside it
	}
	all := make([]int, len(sh.Placements))
	for i := range all {
		all[i] = i
	}
	pieces := map[int]*piece{0: {poly: geom.Polygon{{X: 0, Y: 0}, {X: s.WidthMM, Y: 0}, {X: s.WidthMM, Y: s.HeightMM}, {X: 0, Y: s.HeightMM}}, parts: all}}
	var length float64
	for i, c := range sh.Cuts {
		p := pieces[c.Piece]
		switch {
		case p == nil:
			t.Fatalf("sheet %d: cut %d splits piece %d, which is not there", si, i, c.Piece)
		case p.split:
			t.Fatalf("sheet %d: cut %d splits piece %d a second time", si, i, c.Piece)
		}
		d := c.To.Sub(c.From)
		if d.Norm() == 0 {
			t.Fatalf("sheet %d: cut %d has no length", si, i)
		}
		length += d.Norm()
		for _, v := range []geom.Vec2{c.From, c.To} {
			if boundaryDist(p.poly, v) > tol {
				t.Fatalf("sheet %d: cut %d ends at %v, %.3g mm off piece %d's outline", si, i, v, boundaryDist(p.poly, v), c.Piece)
			}
		}
		// Signed distance left of the cut line.
		u := d.Scale(1 / d.Norm())
		side := func(v geom.Vec2) float64 { return u.X*(v.Y-c.From.Y) - u.Y*(v.X-c.From.X) }
		left, right := halve(p.poly, side, 1), halve(p.poly, side, -1)
		if left.Area() <= tol || right.Area() <= tol {
			t.Fatalf("sheet %d: cut %d does not run across piece %d", si, i, c.Piece)
		}
		l := &piece{poly: left}
		r := &piece{poly: right}
		for _, k := range p.parts {
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, v := range sh.Placements[k].Outline {
				lo, hi = math.Min(lo, side(v)), math.Max(hi, side(v))
			}
			switch {
			case lo >= -tol:
				l.parts = append(l.parts, k)
			case hi <= tol:
				r.parts = append(r.parts, k)
			default:
				t.Fatalf("sheet %d: cut %d crosses part %d (%.3g mm on one side, %.3g on the other)", si, i, sh.Placements[k].Part, hi, -lo)
			}
		}
		p.split = true
		pieces[2*i+1], pieces[2*i+2] = l, r
	}
	if math.Abs(length-sh.CutLengthMM) > 1e-6*math.Max(1, length) {
		t.Fatalf("sheet %d: cut length %g, cuts add up to %g", si, sh.CutLengthMM, length)
	}
	for id, p := range pieces {
		if p.split || len(p.parts) == 0 {
			continue
		}
		if len(p.parts) > 1 {
			t.Fatalf("sheet %d: piece %d holds %d parts after the last cut", si, id, len(p.parts))
		}
		pl := sh.Placements[p.parts[0]]
		const sliver = 0.02
		for _, v := range p.poly {
			if !pl.Outline.Contains(v) {
				if d := boundaryDist(pl.Outline, v); d > sliver {
					t.Fatalf("sheet %d: part %d is not released whole: its piece reaches %.3g mm past it", si, pl.Part, d)
				}
			}
		}
		if d := p.poly.Area() - pl.Outline.Area(); d < -tol*pl.Outline.Perimeter() {
			t.Fatalf("sheet %d: part %d's piece is %.3g mm² smaller than the part", si, pl.Part, -d)
		}
	}
}

// halve returns the part of convex polygon p where sign·side(v) ≥ 0.
func halve(p geom.Polygon, side func(geom.Vec2) float64, sign float64) geom.Polygon {
	var out geom.Polygon
	for k := range p {
		a, b := p[k], p[(k+1)%len(p)]
		sa, sb := sign*side(a), sign*side(b)
		if sa >= 0 {
			out = append(out, a)
		}
		if (sa >= 0) != (sb >= 0) {
			out = append(out, a.Add(b.Sub(a).Scale(sa/(sa-sb))))
		}
	}
	return out
}

// boundaryDist returns the distance from v to the outline of p.
func boundaryDist(p geom.Polygon, v geom.Vec2) float64 {
	d := math.Inf(1)
	for k := range p {
		d = math.Min(d, ptSeg(v, p[k], p[(k+1)%len(p)]))
	}
	return d
}

// TestEdgeToEdgeRandom nests random convex parts on a glass stock with
// margin and spacing under the edge-to-edge rule, and replays every cut.
func TestEdgeToEdgeRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 14))
	var parts []Part
	for i := 0; i < 60; i++ {
		var pts []geom.Vec2
		for k := 0; k < 3+rng.IntN(5); k++ {
			pts = append(pts, geom.Vec2{X: rng.Float64() * 1400, Y: rng.Float64() * 900})
		}
		parts = append(parts, Part{Label: "G", Outline: geom.ConvexHull(pts)})
	}
	for _, rot := range []Rotation{Free, Quarter, Grain} {
		stocks := []Stock{{Name: "float", WidthMM: 3210, HeightMM: 2250, MarginMM: 15, SpacingMM: 4, Rotation: rot, Cuts: EdgeToEdge}}
		r, err := NestWith(context.Background(), parts, stocks, Options{Steps: 8000})
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, parts, stocks, r)
		if len(r.Unplaced) != 0 {
			t.Errorf("%s: unplaced %v", rot, r.Unplaced)
		}
		cuts := 0
		for _, sh := range r.Sheets {
			cuts += len(sh.Cuts)
			if len(sh.Cuts) == 0 {
				t.Errorf("%s: a sheet without cuts", rot)
			}
		}
		t.Logf("%s: %d sheets, %d cuts (area bound %d)", rot, len(r.Sheets), cuts, r.Stocks[0].AreaBound)
	}
}

// TestEdgeToEdgeGlass nests a published glass instance (han80 of Han,
// Bennell, Zhao and Song 2013, testdata/README.md) on 3210 × 2250 mm
// sheets (a common float-glass size, from memory) with margin and spacing
// 0, and replays every cut.
func TestEdgeToEdgeGlass(t *testing.T) {
	parts := loadGlass(t, "han80")
	stocks := []Stock{glassSheets[1]}
	stocks[0].Cuts = EdgeToEdge
	r, err := Nest(parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, r)
	if got, bound := len(r.Sheets), r.Stocks[0].AreaBound; float64(got) > 1.25*float64(bound) {
		t.Errorf("han80 with edge-to-edge cuts: %d sheets, area bound %d", got, bound)
	}
}

// TestEdgeToEdgeNonConvex: a part that is not convex cannot come free by
// edge-to-edge cuts; it is unplaced with the reason, and goes on another
// stock without the rule.
func TestEdgeToEdgeNonConvex(t *testing.T) {
	parts := []Part{{Label: "L", Outline: lTromino(400)}, {Label: "R", Outline: rect(300, 200)}}
	glass := Stock{Name: "float", WidthMM: 3210, HeightMM: 2250, Rotation: Free, Cuts: EdgeToEdge}
	r, err := Nest(parts, []Stock{glass})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, []Stock{glass}, r)
	if len(r.Unplaced) != 1 || r.Unplaced[0].Part != 0 || r.Unplaced[0].Reason != ReasonNonConvex {
		t.Errorf("unplaced %+v, want part 0: %s", r.Unplaced, ReasonNonConvex)
	}
	board := Stock{Name: "board", WidthMM: 2500, HeightMM: 1250, Rotation: Free}
	r, err = Nest(parts, []Stock{glass, board})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, []Stock{glass, board}, r)
	if len(r.Unplaced) != 0 {
		t.Errorf("unplaced %+v with a board stock", r.Unplaced)
	}
}
