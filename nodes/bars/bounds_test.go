package bars

import (
	"math/rand/v2"
	"slices"
	"testing"
)

func TestBoundL2Small(t *testing.T) {
	tests := []struct {
		size     []int64
		capacity int64
		l1, l2   int
	}{
		{[]int64{60, 60, 60}, 100, 2, 3},                 // no two share a bin
		{[]int64{70, 70, 30, 30, 30, 30}, 100, 3, 3},     // 70+30, 70+30, 30+30
		{[]int64{99, 98, 97, 3, 2, 1}, 100, 3, 3},        // pairs fill exactly
		{[]int64{51, 51, 51, 51, 20, 20, 20}, 100, 3, 4}, // four over half; the 20s fit beside them
		{[]int64{50, 50, 50, 50}, 100, 2, 2},
		{nil, 100, 0, 0},
	}
	for _, tt := range tests {
		if got := lengthBound(tt.size, tt.capacity); got != tt.l1 {
			t.Errorf("lengthBound(%v, %d) = %d, want %d", tt.size, tt.capacity, got, tt.l1)
		}
		if got := boundL2(tt.size, tt.capacity); got != tt.l2 {
			t.Errorf("boundL2(%v, %d) = %d, want %d", tt.size, tt.capacity, got, tt.l2)
		}
	}
}

// optimumBins is the fewest bins, by dynamic programming over subsets (the
// state is the set packed so far; each state keeps the fewest bins and the
// most free room in the last one): an oracle for a few items.
func optimumBins(size []int64, capacity int64) int {
	n := len(size)
	type state struct {
		bins int
		free int64
	}
	dp := make([]state, 1<<n)
	for m := 1; m < 1<<n; m++ {
		dp[m] = state{bins: n + 1}
		for i := range n {
			if m&(1<<i) == 0 {
				continue
			}
			p := dp[m&^(1<<i)]
			var s state
			if p.free >= size[i] && p.bins > 0 {
				s = state{p.bins, p.free - size[i]}
			} else {
				s = state{p.bins + 1, capacity - size[i]}
			}
			if s.bins < dp[m].bins || s.bins == dp[m].bins && s.free > dp[m].free {
				dp[m] = s
			}
		}
	}
	return dp[1<<n-1].bins
}

// TestBoundsBelowOptimum: L1 ≤ L2 ≤ the optimum (computed exhaustively),
// and the greedy starts and the search never go below it, on random small
// instances with a fixed seed.
func TestBoundsBelowOptimum(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for range 400 {
		n := 1 + rng.IntN(10)
		capacity := int64(50 + rng.IntN(100))
		size := make([]int64, n)
		for i := range size {
			size[i] = 1 + rng.Int64N(capacity)
		}
		slices.Sort(size)
		slices.Reverse(size)
		opt := optimumBins(size, capacity)
		l1, l2 := lengthBound(size, capacity), boundL2(size, capacity)
		if l1 > l2 || l2 > opt {
			t.Fatalf("%v in %d: L1 %d, L2 %d, optimum %d", size, capacity, l1, l2, opt)
		}
		ffd := firstFitDecreasing(size, capacity)
		bfd := bestFitDecreasing(size, capacity)
		best, _ := reduceBars(size, capacity, ffd, l2, 200_000)
		mbs := minBinSlack(size, capacity)
		mp := mostPieces(size, capacity)
		if c := cardinalityBound(size, capacity); c > opt {
			t.Fatalf("%v in %d: cardinality bound %d, optimum %d", size, capacity, c, opt)
		}
		for _, r := range []struct {
			name string
			bins [][]int32
		}{{"ffd", ffd}, {"bfd", bfd}, {"mbs", mbs}, {"most pieces", mp}, {"search", best}} {
			checkBins(t, r.name, size, capacity, r.bins)
			if len(r.bins) < opt {
				t.Fatalf("%s: %d bins below the optimum %d", r.name, len(r.bins), opt)
			}
		}
		if len(best) != opt {
			t.Errorf("%v in %d: search %d bins, optimum %d", size, capacity, len(best), opt)
		}
	}
}

// checkBins checks that bins hold every item once, within capacity.
func checkBins(t *testing.T, name string, size []int64, capacity int64, bins [][]int32) {
	t.Helper()
	seen := make([]int, len(size))
	for _, b := range bins {
		var l int64
		for _, i := range b {
			seen[i]++
			l += size[i]
		}
		if l > capacity || len(b) == 0 {
			t.Fatalf("%s: bin %v load %d, capacity %d", name, b, l, capacity)
		}
	}
	for i, n := range seen {
		if n != 1 {
			t.Fatalf("%s: item %d packed %d times", name, i, n)
		}
	}
}

// TestGreedyEqualSizes: many equal items must not make the greedy
// packings slow (minimum bin slack tries each size once a level), and each
// must fill every bar exactly.
func TestGreedyEqualSizes(t *testing.T) {
	size := make([]int64, 100000)
	for i := range size {
		size[i] = 7
	}
	for _, g := range []struct {
		name string
		pack func([]int64, int64) [][]int32
	}{{"mbs", minBinSlack}, {"most pieces", mostPieces}, {"ffd", firstFitDecreasing}} {
		bins := g.pack(size, 70)
		checkBins(t, g.name, size, 70, bins)
		if len(bins) != 10000 {
			t.Errorf("%s: %d bins, want 10000", g.name, len(bins))
		}
	}
	if got := cardinalityBound(size, 70); got != 10000 {
		t.Errorf("cardinality bound %d, want 10000", got)
	}
}

// TestMostPiecesPairs: four pieces of 27 and four of 23 in bars of 100.
// Two bars of 27 + 27 + 23 + 23 = 100 hold them all. First fit decreasing
// puts 27, 27, 27 together (the fourth 27 and any 23 overfill), then 27,
// 23, 23, 23, and the last 23 needs a third bar; most pieces pairs long
// with short and needs two.
func TestMostPiecesPairs(t *testing.T) {
	size := []int64{27, 27, 27, 27, 23, 23, 23, 23}
	if got := len(firstFitDecreasing(size, 100)); got != 3 {
		t.Errorf("first fit decreasing: %d bars, want 3", got)
	}
	bins := mostPieces(size, 100)
	checkBins(t, "most pieces", size, 100, bins)
	if len(bins) != 2 {
		t.Errorf("most pieces: %d bars, want 2", len(bins))
	}
}
