package nest

import (
	"context"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// triangleParts returns the flat panels of a gently curved triangle net:
// nu × nv squares of 200 mm in plan, each split by a diagonal into two
// triangles, lifted onto a shallow dome (rise 600 mm over the whole
// plan), so that no two triangles are quite alike. 52 × 32 gives 3,328
// triangles, the size of net that made nesting slow (issue 21).
func triangleParts(nu, nv int) []Part {
	const edge = 200.0
	w, h := edge*float64(nu), edge*float64(nv)
	pt := func(i, j int) geom.Vec {
		x, y := edge*float64(i), edge*float64(j)
		u, v := 2*x/w-1, 2*y/h-1
		return geom.Vec{X: x, Y: y, Z: 600 * (1 - (u*u+v*v)/2)}
	}
	var parts []Part
	flat := func(a, b, c geom.Vec) {
		ab, ac := r3.Sub(b, a), r3.Sub(c, a)
		l := r3.Norm(ab)
		x := r3.Dot(ab, ac) / l
		y := math.Sqrt(max(r3.Dot(ac, ac)-x*x, 0))
		parts = append(parts, Part{Label: "T", Outline: geom.Polygon{{}, {X: l}, {X: x, Y: y}}})
	}
	for j := 0; j < nv; j++ {
		for i := 0; i < nu; i++ {
			flat(pt(i, j), pt(i+1, j), pt(i+1, j+1))
			flat(pt(i, j), pt(i+1, j+1), pt(i, j+1))
		}
	}
	return parts
}

// BenchmarkNestTriangles nests the panels of a triangle net with 200 mm
// edges (triangleParts) on jumbo float glass with the default options:
// many small parts on a sheet, with any cuts and with edge-to-edge cuts.
// It reports the sheets used and their ratio to the area bound (goal: at
// most 1.5 × the bound for 3,328 triangles, either way; measured 5 and 6
// sheets against a bound of 4, where edge-to-edge once took 52).
func BenchmarkNestTriangles(b *testing.B) {
	for _, size := range []struct {
		name   string
		nu, nv int
	}{{"0.8k", 26, 16}, {"3.3k", 52, 32}} {
		for _, cuts := range []CutRule{AnyCut, EdgeToEdge} {
			st := floatGlass
			st.Cuts = cuts
			rule := "any-cut"
			if cuts == EdgeToEdge {
				rule = "edge-to-edge"
			}
			b.Run(size.name+"/"+rule, func(b *testing.B) {
				_ = benchNest(b, triangleParts(size.nu, size.nv), []Stock{st})
			})
		}
	}
}

// TestEdgeToEdgeManySmallParts nests 832 small triangles, each a shape of
// its own, on jumbo float glass under the edge-to-edge rule: the packer
// looks at a window of the shapes at a time and must move the window on
// within a sheet, or each sheet holds only the window's few parts (13
// sheets where the area bound is 1). Every cut is replayed (checkResult).
func TestEdgeToEdgeManySmallParts(t *testing.T) {
	if testing.Short() {
		t.Skip("a few seconds")
	}
	parts := triangleParts(26, 16)
	st := floatGlass
	st.Cuts = EdgeToEdge
	r, err := Nest(parts, []Stock{st})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, []Stock{st}, r)
	if len(r.Unplaced) != 0 || len(r.Sheets) > 2*r.Stocks[0].AreaBound {
		t.Errorf("%d sheets (area bound %d), %d unplaced", len(r.Sheets), r.Stocks[0].AreaBound, len(r.Unplaced))
	}
}

// TestProgress: the progress callback hears of every sheet a method fills
// (parts placed never more than the parts, never going back within a
// method's layout) and changes nothing in the result.
func TestProgress(t *testing.T) {
	parts := triangleParts(6, 4)
	stocks := []Stock{{Name: "board", WidthMM: 1200, HeightMM: 800, SpacingMM: 4, Rotation: Free}}
	plain, err := NestWith(context.Background(), parts, stocks, Options{Steps: 2000})
	if err != nil {
		t.Fatal(err)
	}
	var calls []Progress
	r, err := NestWith(context.Background(), parts, stocks, Options{Steps: 2000, Progress: func(p Progress) { calls = append(calls, p) }})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(plain, r) {
		t.Error("the result changes with a progress callback")
	}
	if len(calls) < len(r.Sheets) {
		t.Fatalf("%d progress calls for %d sheets", len(calls), len(r.Sheets))
	}
	last := map[string]Progress{}
	for _, p := range calls {
		if p.Parts != len(parts) || p.Placed > p.Parts || p.Sheets < 1 {
			t.Fatalf("progress %+v for %d parts", p, len(parts))
		}
		if p.Phase == PhaseLayout {
			if q, ok := last[p.Method]; ok && (p.Sheets < q.Sheets || p.Placed < q.Placed) {
				t.Fatalf("progress went back: %+v after %+v", p, q)
			}
			last[p.Method] = p
		}
	}
	if q, ok := last[r.Ordering]; !ok || q.Placed != len(parts)-len(r.Unplaced) {
		t.Errorf("last progress of %q: %+v; result %d parts placed", r.Ordering, q, len(parts)-len(r.Unplaced))
	}
}
