package nest

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"pqfab/geom"
)

// shapeKey names a part's outline up to translation and the corner it
// starts at: the corners from the lowest (then leftmost), relative to it,
// rounded to 1e-6 mm.
func shapeKey(p geom.Polygon) string {
	k := 0
	for i, v := range p {
		if v.Y < p[k].Y || (v.Y == p[k].Y && v.X < p[k].X) {
			k = i
		}
	}
	var b strings.Builder
	for i := range p {
		v := p[(k+i)%len(p)].Sub(p[k])
		fmt.Fprintf(&b, "%.0f,%.0f;", math.Round(v.X*1e6), math.Round(v.Y*1e6))
	}
	return b.String()
}

// sheetShapes returns, per sheet, the sorted keys of the parts on it.
func sheetShapes(parts []Part, r *Result) [][]string {
	var out [][]string
	for _, sh := range r.Sheets {
		var keys []string
		for _, pl := range sh.Placements {
			keys = append(keys, fmt.Sprintf("%d:%s", sh.Stock, shapeKey(parts[pl.Part].Outline)))
		}
		slices.Sort(keys)
		out = append(out, keys)
	}
	return out
}

// TestSameStructureSameAnswer: the same parts given in another order
// (shuffled with fixed seeds) give the same sheets holding the same part
// shapes, sheet by sheet: the layout depends on the parts' geometry, not
// on their order.
func TestSameStructureSameAnswer(t *testing.T) {
	var dup []Part
	rng := rand.New(rand.NewPCG(7, 7))
	for i := 0; i < 12; i++ {
		var pts []geom.Vec2
		for k := 0; k < 5; k++ {
			pts = append(pts, geom.Vec2{X: rng.Float64() * 700, Y: rng.Float64() * 500})
		}
		h := geom.ConvexHull(pts)
		for c := 0; c < 1+i%4; c++ {
			dup = append(dup, Part{Label: "D", Outline: h.Translate(geom.Vec2{X: float64(c) * 13, Y: -float64(c) * 7})})
		}
	}
	glass := glassSheets[1]
	glass.Cuts = EdgeToEdge
	cases := []struct {
		name   string
		parts  []Part
		stocks []Stock
	}{
		{"convex-bins A001", loadBinInstance(t, "A001").parts, []Stock{{Name: "bin", WidthMM: 1000, HeightMM: 1000, Rotation: Free}}},
		{"jotika40, edge-to-edge", loadGlass(t, "jotika40"), []Stock{glass}},
		{"repeated random parts, two stocks", dup, []Stock{
			{Name: "small", WidthMM: 1500, HeightMM: 1200, MarginMM: 10, SpacingMM: 5, Rotation: Quarter, Price: 30},
			{Name: "large", WidthMM: 2500, HeightMM: 1250, MarginMM: 10, SpacingMM: 5, Rotation: Free, Price: 55},
		}},
	}
	for _, tc := range cases {
		base, err := NestWith(context.Background(), tc.parts, tc.stocks, Options{Steps: 10000})
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, tc.parts, tc.stocks, base)
		want := sheetShapes(tc.parts, base)
		for seed := uint64(1); seed <= 2; seed++ {
			shuffled := slices.Clone(tc.parts)
			rand.New(rand.NewPCG(seed, 99)).Shuffle(len(shuffled), func(i, j int) { shuffled[i], shuffled[j] = shuffled[j], shuffled[i] })
			r, err := NestWith(context.Background(), shuffled, tc.stocks, Options{Steps: 10000})
			if err != nil {
				t.Fatal(err)
			}
			checkResult(t, shuffled, tc.stocks, r)
			got := sheetShapes(shuffled, r)
			if len(got) != len(want) {
				t.Errorf("%s, seed %d: %d sheets, want %d", tc.name, seed, len(got), len(want))
				continue
			}
			for k := range got {
				if !slices.Equal(got[k], want[k]) {
					t.Errorf("%s, seed %d: sheet %d holds other shapes", tc.name, seed, k)
					break
				}
			}
		}
	}
}
