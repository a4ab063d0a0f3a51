package parttype

import (
	"math"
	"slices"
	"strings"
)

// CoverCount returns the fewest intervals of length tol that cover the
// values: sorted, each interval starts at the lowest value not yet
// covered. This greedy cover is optimal (the interval starts are pairwise
// more than tol apart, and no interval holds two of them), so when every
// type keeps a quantity within tol, CoverCount of its values is a lower
// bound on the number of types.
func CoverCount(values []float64, tol float64) int {
	v := slices.Clone(values)
	slices.Sort(v)
	return coverSorted(v, tol)
}

// coverSorted is CoverCount of sorted values.
func coverSorted(v []float64, tol float64) int {
	n := 0
	for i := 0; i < len(v); {
		start := v[i]
		n++
		for i < len(v) && v[i]-start <= tol {
			i++
		}
	}
	return n
}

// Work caps for the pairwise-apart bound, in comparisons of two parts.
const (
	apartScanCap  = 64  // per part, for the sweep-order set
	apartPairsCap = 400 // per part on average, for the graph of agreeing parts
)

// sweepKey orders the keys for the sweep and returns the first. A key
// spreads the parts the more, the more values its cover count separates
// at SweepSpreadFraction of its tolerance (a key constant over half of
// the parts orders them badly even if it separates the rest well); ties
// go by index. It also records the largest cover count at the full
// tolerance, a lower bound.
func (g *grouper) sweepKey() int {
	spread := make([]int, len(g.p.Keys))
	g.keyOrder = make([]int, len(g.p.Keys))
	g.keyBound = 0
	sorted := make([]float64, g.p.Parts)
	for k, key := range g.p.Keys {
		copy(sorted, key.Values)
		slices.Sort(sorted)
		spread[k] = coverSorted(sorted, key.Tol*SweepSpreadFraction+keySlack)
		g.keyOrder[k] = k
		if c := coverSorted(sorted, key.Tol+keySlack); c > g.keyBound {
			g.keyBound, g.boundKey = c, k
		}
	}
	slices.SortStableFunc(g.keyOrder, func(a, b int) int { return spread[b] - spread[a] })
	return g.keyOrder[0]
}

// SweepSpreadFraction is the fraction of a key's tolerance at which keys
// are compared for the sweep order.
const SweepSpreadFraction = 0.125

// bound returns the larger of two lower bounds on the number of types:
// the largest cover count of a key, and the size of a set of parts no two
// of which agree within the tolerances in any pair of variants (each
// needs its own type). The set is found by the smallest-degree-first
// greedy on the graph of parts that agree (a standard heuristic for an
// independent set), or, when that graph would take more than
// apartPairsCap comparisons a part, by taking parts in sweep order.
func (g *grouper) bound() Bound {
	t := BoundTerm{Count: g.keyBound, Key: g.p.Keys[g.boundKey].Name}
	n, ok := g.apartGraph()
	if !ok {
		n = g.apartSweep()
	}
	if n > t.Count {
		t = BoundTerm{Count: n}
	}
	return Bound{Count: t.Count, Quantity: t.quantity(), Terms: []BoundTerm{t}}
}

// apartSweep adds, in sweep order, each item whose representative part
// agrees with none already taken.
func (g *grouper) apartSweep() int {
	var set []int // representative parts, in sweep order
	for i := range g.items {
		x := g.items[i].rep
		apart := true
		for j, n := len(set)-1, 0; j >= 0; j-- {
			y := set[j]
			if g.q[y] < g.q[x]-g.qTol-keySlack {
				break
			}
			if n++; n > apartScanCap || g.agree(x, y) {
				apart = false
				break
			}
		}
		if apart {
			set = append(set, x)
		}
	}
	return len(set)
}

// apartGraph builds the graph of items whose representatives agree (found
// through a grid on the two most spread coordinates, holding every variant
// of every item), then repeatedly takes the item with the fewest
// neighbours left (ties by sweep order) and drops its neighbours.
func (g *grouper) apartGraph() (int, bool) {
	n := len(g.items)
	// The two coordinates that spread most over their tolerances.
	d1, d2, r1, r2 := 0, -1, -1.0, -1.0
	for d, tol := range g.p.Tol {
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := range g.items {
			blo, bhi := g.ibox(i, 0)
			lo, hi = min(lo, blo[d]), max(hi, bhi[d])
		}
		r := (hi - lo) / (tol + keySlack)
		switch {
		case r > r1:
			d2, r2 = d1, r1
			d1, r1 = d, r
		case r > r2:
			d2, r2 = d, r
		}
	}
	if d2 < 0 {
		d2 = d1
	}
	w1, w2 := g.p.Tol[d1]+keySlack, g.p.Tol[d2]+keySlack
	cellOf := func(v []float64) [2]int64 {
		return [2]int64{int64(math.Floor(v[d1] / w1)), int64(math.Floor(v[d2] / w2))}
	}
	cells := map[[2]int64][]int32{}
	for i := range n {
		x := g.items[i].rep
		for t := range g.G {
			c := cellOf(g.vec(x, t))
			if l := cells[c]; len(l) == 0 || l[len(l)-1] != int32(i) {
				cells[c] = append(l, int32(i))
			}
		}
	}
	neighbours := func(i int, visit func(j int)) {
		x := g.items[i].rep
		for _, s := range g.frames {
			c := cellOf(g.vec(x, s))
			for a := c[0] - 1; a <= c[0]+1; a++ {
				for b := c[1] - 1; b <= c[1]+1; b++ {
					for _, j := range cells[[2]int64{a, b}] {
						visit(int(j))
					}
				}
			}
		}
	}
	work := 0
	for i := range n {
		neighbours(i, func(int) { work++ })
		if work > apartPairsCap*n {
			return 0, false
		}
	}
	adj := make([][]int32, n)
	seen := make([]int, n)
	for i := range n {
		x := g.items[i].rep
		neighbours(i, func(j int) {
			if j <= i || seen[j] == i+1 {
				return
			}
			seen[j] = i + 1
			if g.agree(x, g.items[j].rep) {
				adj[i] = append(adj[i], int32(j))
				adj[j] = append(adj[j], int32(i))
			}
		})
	}
	// Smallest degree first, with buckets by degree; within a bucket the
	// lowest item (sweep order) goes first.
	deg := make([]int, n)
	maxDeg := 0
	for i := range n {
		deg[i] = len(adj[i])
		maxDeg = max(maxDeg, deg[i])
	}
	buckets := make([][]int, maxDeg+1)
	for i := n - 1; i >= 0; i-- {
		buckets[deg[i]] = append(buckets[deg[i]], i)
	}
	gone := make([]bool, n)
	taken := 0
	for d := 0; d <= maxDeg; {
		bk := buckets[d]
		if len(bk) == 0 {
			d++
			continue
		}
		i := bk[len(bk)-1]
		buckets[d] = bk[:len(bk)-1]
		if gone[i] || deg[i] != d {
			continue // stale entry
		}
		taken++
		gone[i] = true
		for _, j := range adj[i] {
			if gone[j] {
				continue
			}
			gone[j] = true
			for _, k := range adj[j] {
				if !gone[k] {
					deg[k]--
					buckets[deg[k]] = append(buckets[deg[k]], int(k))
					d = min(d, deg[k])
				}
			}
		}
	}
	return taken, true
}

// agree reports whether parts x and y agree within every tolerance in
// some pair of variants.
func (g *grouper) agree(x, y int) bool {
	for _, s := range g.frames { // with Permutes, x's variant 0 stands for all
		a := g.vec(x, s)
		for t := range g.G {
			b := g.vec(y, t)
			ok := true
			for d, tol := range g.p.Tol {
				if math.Abs(a[d]-b[d]) > tol {
					ok = false
					break
				}
			}
			if ok {
				return true
			}
		}
	}
	return false
}

// Bound is a lower bound on the number of types: no grouping that
// keeps the tolerances has fewer. Quantity says what gave it; Terms say
// it term by term, one per set of parts that never share a type.
type Bound struct {
	Count    int
	Quantity string
	Terms    []BoundTerm
}

// BoundTerm is one set of parts' share of a Bound: either one
// quantity alone spreads the parts over Count types (Key names it), or
// Count parts differ pairwise by more than the tolerances (Key is empty),
// so that each needs a type of its own.
type BoundTerm struct {
	Parts string // which parts, such as "nodes with 3 members"; empty for all
	Count int
	Key   string
}

// quantity names what gave the term.
func (t BoundTerm) quantity() string {
	switch {
	case t.Key == "" && t.Parts == "":
		return apartQuantity
	case t.Key == "":
		return t.Parts + " pairwise out of tolerance"
	case t.Parts == "":
		return t.Key
	}
	return t.Key + " of " + t.Parts
}

// Of returns the bound with its terms' parts named (where they are not
// yet), for a set of parts that is grouped apart from others.
func (b Bound) Of(parts string) Bound {
	out := Bound{Count: b.Count}
	for _, t := range b.Terms {
		if t.Parts == "" {
			t.Parts = parts
		}
		out.Terms = append(out.Terms, t)
	}
	out.Quantity = quantities(out.Terms)
	return out
}

// quantities joins the terms' quantities, each once.
func quantities(terms []BoundTerm) string {
	var qs []string
	for _, t := range terms {
		if q := t.quantity(); !slices.Contains(qs, q) {
			qs = append(qs, q)
		}
	}
	return strings.Join(qs, "; ")
}

// Add returns the bound for two sets of parts that never share a type
// (such as panels with different corner counts): the counts add, the
// terms follow each other and the quantities are listed once each.
func (b Bound) Add(o Bound) Bound {
	switch {
	case o.Count == 0:
		return b
	case b.Count == 0:
		return o
	}
	terms := append(slices.Clone(b.Terms), o.Terms...)
	return Bound{Count: b.Count + o.Count, Quantity: quantities(terms), Terms: terms}
}
