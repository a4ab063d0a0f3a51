package parttype

import (
	"math"
	"testing"
)

func TestTolOf(t *testing.T) {
	for _, tc := range []struct{ tol, def, want float64 }{
		{0, 0.5, 0.5}, {NoTol, 0.5, 0}, {2, 0.5, 2}, {-2, 0.5, -2}, {math.Inf(1), 0.5, math.Inf(1)},
	} {
		if got := TolOf(tc.tol, tc.def); got != tc.want {
			t.Errorf("TolOf(%g, %g) = %g, want %g", tc.tol, tc.def, got, tc.want)
		}
	}
}
