package geom

import (
	"math"
	"testing"
)

func TestPolygonMeasures(t *testing.T) {
	sq := Polygon{{0, 0}, {2, 0}, {2, 2}, {0, 2}}
	lshape := Polygon{{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}}
	tests := []struct {
		name      string
		p         Polygon
		area      float64
		convex    bool
		ccw       bool
		perimeter float64
	}{
		{"square", sq, 4, true, true, 8},
		{"square cw", sq.Reversed(), 4, true, false, 8},
		{"L", lshape, 3, false, true, 8},
		{"triangle", Polygon{{0, 0}, {4, 0}, {0, 3}}, 6, true, true, 12},
		{"bow tie", Polygon{{0, 0}, {2, 2}, {2, 0}, {0, 2}}, 0, false, false, 4 + 4*math.Sqrt2},
	}
	for _, tc := range tests {
		if got := tc.p.Area(); math.Abs(got-tc.area) > 1e-12 {
			t.Errorf("%s: area got %g want %g", tc.name, got, tc.area)
		}
		if got := tc.p.Convex(); got != tc.convex {
			t.Errorf("%s: convex got %v want %v", tc.name, got, tc.convex)
		}
		if got := tc.p.CCW(); got != tc.ccw {
			t.Errorf("%s: ccw got %v want %v", tc.name, got, tc.ccw)
		}
		if got := tc.p.Perimeter(); math.Abs(got-tc.perimeter) > 1e-12 {
			t.Errorf("%s: perimeter got %g want %g", tc.name, got, tc.perimeter)
		}
	}
	if !(Polygon{{0, 0}, {2, 2}, {2, 0}, {0, 2}}).SelfIntersects() || sq.SelfIntersects() {
		t.Error("self intersection test wrong")
	}
	if !lshape.Contains(Vec2{0.5, 1.5}) || lshape.Contains(Vec2{1.5, 1.5}) || !lshape.Contains(Vec2{1, 1.5}) {
		t.Error("Contains wrong on the L shape")
	}
}

// TestOrientExact checks the orientation predicate where naive floating
// point arithmetic fails: points on a line with non-representable slopes.
func TestOrientExact(t *testing.T) {
	a, b := Vec2{0.1, 0.1}, Vec2{0.3, 0.3}
	// c lies exactly on the line y = x.
	if got := Orient(a, b, Vec2{0.7, 0.7}); got != 0 {
		t.Errorf("collinear got %d", got)
	}
	// The next float above 0.7 in y is strictly left of the line.
	if got := Orient(a, b, Vec2{0.7, math.Nextafter(0.7, 1)}); got != 1 {
		t.Errorf("just left got %d", got)
	}
	if got := Orient(a, b, Vec2{0.7, math.Nextafter(0.7, 0)}); got != -1 {
		t.Errorf("just right got %d", got)
	}
}

func TestSegmentsIntersect(t *testing.T) {
	tests := []struct {
		name       string
		a, b, c, d Vec2
		want       bool
		dist       float64
	}{
		{"cross", Vec2{0, 0}, Vec2{2, 2}, Vec2{0, 2}, Vec2{2, 0}, true, 0},
		{"touch at end", Vec2{0, 0}, Vec2{1, 0}, Vec2{1, 0}, Vec2{1, 5}, true, 0},
		{"T touch", Vec2{0, 0}, Vec2{2, 0}, Vec2{1, 0}, Vec2{1, 5}, true, 0},
		{"collinear overlap", Vec2{0, 0}, Vec2{2, 0}, Vec2{1, 0}, Vec2{3, 0}, true, 0},
		{"collinear apart", Vec2{0, 0}, Vec2{1, 0}, Vec2{2, 0}, Vec2{3, 0}, false, 1},
		{"parallel", Vec2{0, 0}, Vec2{1, 0}, Vec2{0, 1}, Vec2{1, 1}, false, 1},
		{"near miss", Vec2{0, 0}, Vec2{1, 0}, Vec2{0.5, 1e-300}, Vec2{0.5, 1}, false, 1e-300},
	}
	for _, tc := range tests {
		if got := SegmentsIntersect(tc.a, tc.b, tc.c, tc.d); got != tc.want {
			t.Errorf("%s: got %v want %v", tc.name, got, tc.want)
		}
		if got := SegmentDistance(tc.a, tc.b, tc.c, tc.d); math.Abs(got-tc.dist) > 1e-12 {
			t.Errorf("%s: distance got %g want %g", tc.name, got, tc.dist)
		}
	}
}

func TestConvexHull(t *testing.T) {
	pts := []Vec2{{0, 0}, {1, 0}, {2, 0}, {2, 2}, {1, 1}, {0, 2}, {1, 2}}
	h := ConvexHull(pts)
	if len(h) != 4 || !h.CCW() || math.Abs(h.Area()-4) > 1e-12 {
		t.Errorf("hull %v", h)
	}
}
