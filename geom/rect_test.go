package geom

import (
	"math"
	"testing"
)

// TestMinAreaRect: closed forms. A rectangle turned by any angle is its own
// smallest rectangle; a right triangle with legs a ≥ b sits in a·b (its
// legs along the rectangle's sides); a regular hexagon of side s needs
// 2s × √3 s (its smallest rectangle has a side along an edge: a standard
// result for regular polygons).
func TestMinAreaRect(t *testing.T) {
	rect := Polygon{{0, 0}, {4000, 0}, {4000, 1500}, {0, 1500}}
	for _, turn := range []float64{0, 0.3, 1.1, 2.5} {
		l, s, dir := rect.Rotate(turn).MinAreaRect()
		if math.Abs(l-4000) > 1e-6 || math.Abs(s-1500) > 1e-6 {
			t.Errorf("turn %g: %g × %g", turn, l, s)
		}
		want := math.Mod(turn+2*math.Pi, math.Pi)
		if d := math.Abs(dir - want); d > 1e-9 && math.Abs(d-math.Pi) > 1e-9 {
			t.Errorf("turn %g: direction %g want %g", turn, dir, want)
		}
	}
	tri := Polygon{{0, 0}, {3000, 0}, {0, 1200}}
	if l, s, _ := tri.MinAreaRect(); math.Abs(l-3000) > 1e-6 || math.Abs(s-1200) > 1e-6 {
		t.Errorf("triangle: %g × %g", l, s)
	}
	var hex Polygon
	for k := 0; k < 6; k++ {
		a := float64(k) * math.Pi / 3
		hex = append(hex, Vec2{1000 * math.Cos(a), 1000 * math.Sin(a)})
	}
	if l, s, _ := hex.MinAreaRect(); math.Abs(l-2000) > 1e-6 || math.Abs(s-1000*math.Sqrt(3)) > 1e-6 {
		t.Errorf("hexagon: %g × %g", l, s)
	}
}
