package panels

import (
	"pqfab/internal/num"
	"sort"
)

// Spread is the minimum, median and maximum of a set of numbers.
type Spread struct {
	Min    float64 `json:"min"`
	Median float64 `json:"median"`
	Max    float64 `json:"max"`
}

// Rounded returns the spread with its three numbers rounded to d decimals
// (num.Round: no negative zero), as every output writes them.
func (s Spread) Rounded(d int) Spread {
	return Spread{Min: num.Round(s.Min, d), Median: num.Round(s.Median, d), Max: num.Round(s.Max, d)}
}

// SpreadOf returns the spread of xs (zero for none).
func SpreadOf(xs []float64) Spread {
	if len(xs) == 0 {
		return Spread{}
	}
	s := append([]float64(nil), xs...)
	sort.Float64s(s)
	m := s[len(s)/2]
	if len(s)%2 == 0 {
		m = (s[len(s)/2-1] + s[len(s)/2]) / 2
	}
	return Spread{Min: s[0], Median: m, Max: s[len(s)-1]}
}

// Worst returns the indices of the k panels with the largest flatness
// deviation, largest first (ties by index).
func Worst(p []Planarity, k int) []int {
	idx := make([]int, len(p))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return p[idx[a]].Flatness > p[idx[b]].Flatness })
	if len(idx) > k {
		idx = idx[:k]
	}
	return idx
}
