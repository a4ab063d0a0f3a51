package bars

import "sort"

// lengthBound is the fewest bars by length: ceil(Σ size / capacity).
// Sizes and capacity are in the solver's units (a blank plus one kerf; the
// usable length plus one kerf).
func lengthBound(size []int64, capacity int64) int {
	var sum int64
	for _, s := range size {
		sum += s
	}
	return int((sum + capacity - 1) / capacity)
}

// boundL2 is the lower bound L2 of Martello and Toth (Knapsack Problems,
// Wiley 1990, section 8.3.1) for sizes sorted from largest to smallest,
// each at most capacity. For 0 ≤ α ≤ C/2 let J1 = {s > C − α}, J2 = {C/2 <
// s ≤ C − α}, J3 = {α ≤ s ≤ C/2}; no two items of J1 ∪ J2 share a bin, no
// item of J3 fits with one of J1, so
//
//	L(α) = |J1| + |J2| + max(0, ceil((Σ J3 − (|J2|·C − Σ J2)) / C))
//
// and L2 = max over α of L(α); it suffices to try α = 0 and the sizes
// that are at most C/2. L2 ≥ ceil(Σ s / C), the fewest bars by length.
func boundL2(size []int64, capacity int64) int {
	n := len(size)
	prefix := make([]int64, n+1) // prefix[k] = sum of the k largest
	for i, s := range size {
		prefix[i+1] = prefix[i] + s
	}
	// count of sizes > v (sizes are non-increasing).
	above := func(v int64) int { return sort.Search(n, func(i int) bool { return size[i] <= v }) }
	// count of sizes ≥ v.
	atLeast := func(v int64) int { return sort.Search(n, func(i int) bool { return size[i] < v }) }
	// The first `half` sizes are more than C/2.
	half := sort.Search(n, func(i int) bool { return 2*size[i] <= capacity })
	best := lengthBound(size, capacity)
	try := func(alpha int64) {
		j1 := above(capacity - alpha)
		j12 := half // J1 ∪ J2 = {s > C/2} when α ≤ C/2
		j123 := atLeast(alpha)
		if alpha == 0 {
			j123 = n
		}
		sumJ2 := prefix[j12] - prefix[j1]
		sumJ3 := prefix[j123] - prefix[j12]
		free := int64(j12-j1)*capacity - sumJ2
		l := j12
		if rest := sumJ3 - free; rest > 0 {
			l += int((rest + capacity - 1) / capacity)
		}
		if l > best {
			best = l
		}
	}
	try(0)
	for i := half; i < n; i++ {
		if i > half && size[i] == size[i-1] {
			continue
		}
		try(size[i])
	}
	return best
}

// cardinalityBound: if the k+1 smallest sizes overfill a bar, no bar holds
// more than k items, so at least ceil(n / k) bars are needed (a standard
// counting bound). Sizes are non-increasing, each at most capacity.
func cardinalityBound(size []int64, capacity int64) int {
	n := len(size)
	var sum int64
	k := 0
	for i := n - 1; i >= 0 && sum+size[i] <= capacity; i-- {
		sum += size[i]
		k++
	}
	if k == 0 {
		return 0
	}
	return (n + k - 1) / k
}

// lowerBound is the larger of L2 and the cardinality bound.
func lowerBound(size []int64, capacity int64) int {
	return max(boundL2(size, capacity), cardinalityBound(size, capacity))
}
