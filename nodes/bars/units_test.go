package bars

import "testing"

func TestToUM(t *testing.T) {
	tests := []struct {
		mm   float64
		up   bool
		want int64
	}{
		{36.6, true, 36600}, // not exact in binary, exact as a decimal
		{36.6, false, 36600},
		{0.1, true, 100},
		{6000, false, 6_000_000},
		{1.0 / 3, true, 334}, // more than three decimals: rounded against the plan
		{1.0 / 3, false, 333},
		{2.0 / 3, false, 666},
		{0.0005, true, 1}, // 0.5 µm
		{0.0005, false, 0},
		{MaxLengthMM, false, 1_000_000_000},
	}
	for _, tt := range tests {
		if got := toUM(tt.mm, tt.up); got != tt.want {
			t.Errorf("toUM(%v, up=%v) = %d, want %d", tt.mm, tt.up, got, tt.want)
		}
	}
	if got := toMM(36600); got != 36.6 {
		t.Errorf("toMM(36600) = %v", got)
	}
}
