package num

import (
	"math"
	"testing"
)

// TestRound: d decimals, halves away from zero (math.Round), and never a
// negative zero, whose bytes would differ in the outputs ("-0").
func TestRound(t *testing.T) {
	for _, tc := range []struct {
		x    float64
		d    int
		want float64
	}{
		{1.23456, 2, 1.23}, {1.235, 1, 1.2}, {-1.25, 1, -1.3}, {2.5, 0, 3}, {-0.0004, 3, 0}, {-1e-12, 4, 0},
	} {
		got := Round(tc.x, tc.d)
		if got != tc.want || math.Signbit(got) != math.Signbit(tc.want) {
			t.Errorf("Round(%g, %d) = %g, want %g", tc.x, tc.d, got, tc.want)
		}
	}
}
