package quadnet

// unionFind joins the items 0…n−1 into sets; a set's root is its least
// item.
type unionFind []int

// reset makes n sets of one item each, reusing u's storage.
func (u *unionFind) reset(n int) {
	*u = (*u)[:0]
	for i := range n {
		*u = append(*u, i)
	}
}

// find returns the root of x's set.
func (u unionFind) find(x int) int {
	for u[x] != x {
		u[x] = u[u[x]]
		x = u[x]
	}
	return x
}

// union joins the sets of a and b.
func (u unionFind) union(a, b int) {
	if a, b = u.find(a), u.find(b); a != b {
		u[max(a, b)] = min(a, b)
	}
}

// sets returns the sets, in the order of their least items, each as the
// list item(i) of its items i in increasing order.
func (u unionFind) sets(item func(i int) int) [][]int {
	index := make(map[int]int)
	var out [][]int
	for i := range u {
		r := u.find(i)
		g, ok := index[r]
		if !ok {
			g = len(out)
			index[r] = g
			out = append(out, nil)
		}
		out[g] = append(out[g], item(i))
	}
	return out
}
