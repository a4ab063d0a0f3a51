package bars

import "sort"

// firstFitDecreasing puts each item, largest first, into the first bar it
// fits (Johnson 1973; at most 11/9·OPT + 6/9 bars, Dósa 2007). Sizes are
// non-increasing. A max-tree over the bars' free lengths finds the first
// fit in O(log n).
func firstFitDecreasing(size []int64, capacity int64) [][]int32 {
	n := len(size)
	if n == 0 {
		return nil
	}
	leaves := 1
	for leaves < n {
		leaves *= 2
	}
	free := make([]int64, 2*leaves) // free[leaves+b]: free length of bar b
	for i := range free {
		free[i] = capacity
	}
	var bins [][]int32
	for i, s := range size {
		k := 1
		for k < leaves {
			if free[2*k] >= s {
				k = 2 * k
			} else {
				k = 2*k + 1
			}
		}
		b := k - leaves
		if b == len(bins) {
			bins = append(bins, nil)
		}
		bins[b] = append(bins[b], int32(i))
		free[k] -= s
		for k /= 2; k >= 1; k /= 2 {
			free[k] = max(free[2*k], free[2*k+1])
		}
	}
	return bins
}

// bestFitDecreasing puts each item, largest first, into the fullest bar it
// fits, ties to the earlier bar.
func bestFitDecreasing(size []int64, capacity int64) [][]int32 {
	type open struct {
		free int64
		bin  int32
	}
	var bins [][]int32
	var byFree []open // sorted by free, then bin
	for i, s := range size {
		k := sort.Search(len(byFree), func(j int) bool { return byFree[j].free >= s })
		var o open
		if k == len(byFree) {
			o = open{free: capacity, bin: int32(len(bins))}
			bins = append(bins, nil)
		} else {
			o = byFree[k]
			byFree = append(byFree[:k], byFree[k+1:]...)
		}
		bins[o.bin] = append(bins[o.bin], int32(i))
		o.free -= s
		k = sort.Search(len(byFree), func(j int) bool {
			return byFree[j].free > o.free || byFree[j].free == o.free && byFree[j].bin > o.bin
		})
		byFree = append(byFree, open{})
		copy(byFree[k+1:], byFree[k:])
		byFree[k] = o
	}
	return bins
}
