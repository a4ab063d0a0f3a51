package bars

import (
	"slices"
	"sort"
)

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

// mbsNodesPerBar caps the search for one bar's contents in minBinSlack.
const mbsNodesPerBar = 2000

// minBinSlack packs one bar at a time, each with the largest item left
// and the subset of the others that leaves the least free length: the
// minimum bin slack heuristic of Gupta and Ho (1999), with the largest
// item fixed as in MBS' of Fleszar and Hindi, "New heuristics for
// one-dimensional bin-packing", Computers & Operations Research 29 (2002)
// 821–839. The subset comes from a depth-first search over the items in
// decreasing order, trying each size once a level, stopped after
// mbsNodesPerBar nodes or at a bar filled exactly. Sizes are
// non-increasing.
func minBinSlack(size []int64, capacity int64) [][]int32 {
	n := len(size)
	left := newSkip(n)
	find := left.find
	// first[v]: the first index whose size is at most v.
	first := func(v int64) int { return sort.Search(n, func(i int) bool { return size[i] <= v }) }
	var bins [][]int32
	var cur, best []int32
	for {
		top := find(0)
		if top == n {
			return bins
		}
		left.remove(top)
		cur = append(cur[:0], int32(top))
		best = append(best[:0], int32(top))
		bestFree := capacity - size[top]
		nodes := 0
		var dfs func(from int, free int64) bool
		dfs = func(from int, free int64) bool {
			// Each size once: after j, jump to the first smaller size.
			for j := find(max(from, first(free))); j < n; j = find(max(j+1, first(size[j]-1))) {
				nodes++
				cur = append(cur, int32(j))
				f := free - size[j]
				if f < bestFree {
					bestFree = f
					best = append(best[:0], cur...)
				}
				if f == 0 || nodes >= mbsNodesPerBar || dfs(j+1, f) {
					return true
				}
				cur = cur[:len(cur)-1]
			}
			return false
		}
		dfs(top+1, bestFree)
		for _, i := range best[1:] {
			left.remove(int(i))
		}
		bins = append(bins, slices.Clone(best))
	}
}

// mostPieces packs one bar at a time for the most pieces a bar: the
// largest piece left, then the smallest pieces left while they fit, then
// each of those small pieces, smallest first, is traded for the largest
// piece left that fits in its place. Where bars are limited by how many
// pieces they hold rather than by length (members of nearly one length),
// the decreasing-order heuristics group the long pieces and lose bars;
// this one pairs long with short. Sizes are non-increasing.
func mostPieces(size []int64, capacity int64) [][]int32 {
	n := len(size)
	// fwd finds the first piece left at or after an index; bwd, on the
	// mirrored indices, the last piece left at or before one.
	fwd, bwd := newSkip(n), newSkip(n)
	findF := fwd.find
	findB := func(i int) int { return n - 1 - bwd.find(n-1-i) } // −1: none
	remove := func(i int) {
		fwd.remove(i)
		bwd.remove(n - 1 - i)
	}
	first := func(v int64) int { return sort.Search(n, func(i int) bool { return size[i] <= v }) }
	taken := make([]bool, n)
	var bins [][]int32
	for {
		top := findF(0)
		if top == n {
			return bins
		}
		remove(top)
		bar := []int32{int32(top)}
		free := capacity - size[top]
		for j := findB(n - 1); j >= 0 && size[j] <= free; j = findB(j - 1) {
			bar = append(bar, int32(j))
			taken[j] = true
			free -= size[j]
		}
		for x := 1; x < len(bar); x++ {
			c := int(bar[x])
			j := findF(first(free + size[c]))
			for j < n && taken[j] {
				j = findF(j + 1)
			}
			if j >= n || size[j] <= size[c] {
				continue
			}
			taken[c], taken[j] = false, true
			free += size[c] - size[j]
			bar[x] = int32(j)
		}
		for _, i := range bar[1:] {
			taken[i] = false
			remove(int(i))
		}
		bins = append(bins, bar)
	}
}

// skip finds the first index at or after i that is not removed, n when
// none: a union-find over "removed, look right" with path halving.
type skip []int32

func newSkip(n int) skip {
	s := make(skip, n+1)
	for i := range s {
		s[i] = int32(i)
	}
	return s
}

func (s skip) find(i int) int {
	for int(s[i]) != i {
		s[i] = s[s[i]]
		i = int(s[i])
	}
	return i
}

func (s skip) remove(i int) { s[i] = int32(i + 1) }
