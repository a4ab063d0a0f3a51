package dxf

import "testing"

// TestSegmentHitsBox: segments against the box [-2, 2] × [-1, 1], by
// hand: crossing, inside, outside, along an edge, a corner missed or
// touched.
func TestSegmentHitsBox(t *testing.T) {
	for _, tc := range []struct {
		a, b [2]float64
		want bool
	}{
		{[2]float64{-5, 0}, [2]float64{5, 0}, true},   // across
		{[2]float64{-1, 0}, [2]float64{1, 0.5}, true}, // inside
		{[2]float64{-5, 2}, [2]float64{5, 2}, false},  // above
		{[2]float64{3, -5}, [2]float64{3, 5}, false},  // right of it
		{[2]float64{-5, 1}, [2]float64{5, 1}, true},   // along the top edge
		{[2]float64{2, 3}, [2]float64{4, 1}, false},   // past the corner
		{[2]float64{1, 3}, [2]float64{3, 1}, false},   // x + y = 4 runs above the corner (2, 1)
		{[2]float64{0, 3}, [2]float64{3, 0}, true},    // x + y = 3 touches the corner (2, 1)
	} {
		if got := segmentHitsBox(tc.a, tc.b, 2, 1); got != tc.want {
			t.Errorf("%v–%v: %v, want %v", tc.a, tc.b, got, tc.want)
		}
	}
}

// TestClearSpot: a text centred on an outline's edge moves along its
// direction until its box is clear of the edge.
func TestClearSpot(t *testing.T) {
	segs := outlineSegments([][2]float64{{0, 0}, {1000, 0}, {1000, 1000}, {0, 1000}})
	c := clearSpot("edge 1 1000.00", 500, 0, 10, 0, [2]float64{0, -1}, 5, segs)
	if textHits("edge 1 1000.00", c, 10, 0, segs) || c[1] >= 0 || c[0] != 500 {
		t.Errorf("moved to %v, still on the edge or off its line", c)
	}
	if got := clearSpot("x", 500, 500, 10, 0, [2]float64{1, 0}, 5, segs); got != [2]float64{500, 500} {
		t.Errorf("a clear text moved to %v", got)
	}
}
