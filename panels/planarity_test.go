package panels

import (
	"math"
	"testing"

	"pqfab/geom"
)

// TestMeasureSkewQuad checks the measures of the skew quad
// (0,0,+h), (a,0,-h), (a,a,+h), (0,a,-h) against closed forms: the
// diagonals p0p2 (at z = +h) and p1p3 (at z = -h) are horizontal and cross
// in plan, so their gap is 2h; each diagonal is √(a² + a²) = a√2 long; the
// least-squares plane is z = 0 by symmetry, so the flatness deviation is h.
func TestMeasureSkewQuad(t *testing.T) {
	for _, tc := range []struct{ a, h float64 }{{1000, 5}, {1500, 12.5}, {3, 0.01}} {
		pts := []geom.Vec{{X: 0, Y: 0, Z: tc.h}, {X: tc.a, Y: 0, Z: -tc.h}, {X: tc.a, Y: tc.a, Z: tc.h}, {X: 0, Y: tc.a, Z: -tc.h}}
		p, err := Measure(pts)
		if err != nil {
			t.Fatal(err)
		}
		want := Planarity{DiagonalGap: 2 * tc.h, Ratio: 2 * tc.h / (tc.a * math.Sqrt2), Flatness: tc.h}
		if !close(p.DiagonalGap, want.DiagonalGap) || !close(p.Ratio, want.Ratio) || !close(p.Flatness, want.Flatness) {
			t.Errorf("a=%g h=%g: got %+v want %+v", tc.a, tc.h, p, want)
		}
	}
}

func close(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b)) }

func TestMeasureShapes(t *testing.T) {
	tri := []geom.Vec{{X: 0}, {X: 1000}, {Y: 1000, Z: 30}}
	p, err := Measure(tri)
	if err != nil || p.Flatness > 1e-12 || p.Ratio != 0 {
		t.Errorf("triangle %+v %v", p, err)
	}
	// A planar regular hexagon: all measures zero.
	var hex []geom.Vec
	for k := 0; k < 6; k++ {
		a := float64(k) * math.Pi / 3
		hex = append(hex, geom.Vec{X: 1000 * math.Cos(a), Y: 1000 * math.Sin(a), Z: 200})
	}
	p, err = Measure(hex)
	if err != nil || p.Flatness > 1e-9 || p.DiagonalGap > 1e-9 {
		t.Errorf("hexagon %+v %v", p, err)
	}
	if got := LineDistance(geom.Vec{}, geom.Vec{X: 1}, geom.Vec{Y: 3}, geom.Vec{X: 5, Y: 3}); !close(got, 3) {
		t.Errorf("parallel lines %g", got)
	}
}

func TestSpread(t *testing.T) {
	if got := SpreadOf([]float64{3, 1, 2, 10}); got != (Spread{1, 2.5, 10}) {
		t.Errorf("got %+v", got)
	}
	w := Worst([]Planarity{{Flatness: 1}, {Flatness: 5}, {Flatness: 3}}, 2)
	if len(w) != 2 || w[0] != 1 || w[1] != 2 {
		t.Errorf("worst %v", w)
	}
}
