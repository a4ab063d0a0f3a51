package geom

import (
	"cmp"
	"slices"
)

// GroupNear groups items greedily in the order of their keys: each item
// joins the first group whose first item (its representative) has a key
// within keyTol and which same(rep, item) accepts, else it starts a group.
// Only groups whose representative lies within keyTol are tried, so the
// work stays near linear when few parts look alike. Groups come out in
// key order of their representatives; each group lists the representative
// first, then the others in ascending index. Equal keys keep index order,
// so the result does not depend on anything but the inputs.
//
// Congruent-part counting (member, node and panel types) uses it with a
// key that congruent parts share within keyTol, such as a length.
func GroupNear(keys []float64, keyTol float64, same func(rep, item int) bool) [][]int {
	order := make([]int, len(keys))
	for i := range order {
		order[i] = i
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(keys[a], keys[b]) })
	var groups [][]int
	lo := 0 // first group whose representative may still be within keyTol
	for _, i := range order {
		for lo < len(groups) && keys[groups[lo][0]] < keys[i]-keyTol {
			lo++
		}
		joined := false
		for g := lo; g < len(groups); g++ {
			if same(groups[g][0], i) {
				groups[g] = append(groups[g], i)
				joined = true
				break
			}
		}
		if !joined {
			groups = append(groups, []int{i})
		}
	}
	for _, g := range groups {
		slices.Sort(g[1:])
	}
	return groups
}
