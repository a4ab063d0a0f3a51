package parttype

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

func TestCoverCount(t *testing.T) {
	for _, tc := range []struct {
		values []float64
		tol    float64
		want   int
	}{
		{nil, 1, 0},
		{[]float64{5}, 0, 1},
		{[]float64{0, 1, 2, 3}, 1, 2},        // [0,1] [2,3]
		{[]float64{0, 1, 2, 3}, 0.99, 4},     // each alone
		{[]float64{3, 0, 0.5, 2, 2.4}, 1, 2}, // [0,1] [2,3]
		{[]float64{1, 1, 1}, 0, 1},
		{[]float64{0, 0.6, 1.2, 1.8, 2.4}, 1, 3},
	} {
		if got := CoverCount(tc.values, tc.tol); got != tc.want {
			t.Errorf("CoverCount(%v, %g) = %d, want %d", tc.values, tc.tol, got, tc.want)
		}
	}
}

// testProblem is a random problem of one of three kinds, built by the
// test's own rules:
//   - "ends": (x, a, b) read from either end becomes (x, −b, −a), like a
//     member's length and end bevels;
//   - "ring": k values around a ring, read from any start (a cyclic
//     permutation, like a panel's edges);
//   - "hub": k directions about an axis, (azimuths from the first, then
//     elevations), read from any first direction: not a permutation, like
//     a node's arms.
type testProblem struct {
	kind string
	k    int
	tol  []float64
	// parts' own values: ends: x, a, b; ring: k values; hub: k azimuths
	// (sorted, in [0, 360)) then k elevations.
	raw [][]float64
}

func (tp *testProblem) variants() int {
	if tp.kind == "ends" {
		return 2
	}
	return tp.k
}

// coords returns part p read in variant s.
func (tp *testProblem) coords(p, s int) []float64 {
	r := tp.raw[p]
	switch tp.kind {
	case "ends":
		if s == 1 {
			return []float64{r[0], -r[2], -r[1]}
		}
		return slices.Clone(r)
	case "ring":
		return append(slices.Clone(r[s:]), r[:s]...)
	}
	k := tp.k
	var v []float64
	for i := 1; i < k; i++ {
		a := r[(s+i)%k] - r[s]
		if a < 0 {
			a += 360
		}
		v = append(v, a)
	}
	for i := range k {
		v = append(v, r[k+(s+i)%k])
	}
	return v
}

// problem turns the test problem into a Problem, with keys: "ends"
// the length; "ring" the values sorted; "hub" the elevations sorted.
func (tp *testProblem) problem() *Problem {
	G := tp.variants()
	p := &Problem{Parts: len(tp.raw), Dim: len(tp.tol), Tol: tp.tol, Compose: make([][]int, G), Permutes: tp.kind != "hub"}
	for a := range G {
		p.Compose[a] = make([]int, G)
		for b := range G {
			if tp.kind == "ends" {
				p.Compose[a][b] = a ^ b
			} else {
				p.Compose[a][b] = (a + b) % G
			}
		}
	}
	for i := range tp.raw {
		for s := range G {
			p.Coords = append(p.Coords, tp.coords(i, s)...)
		}
	}
	switch tp.kind {
	case "ends":
		k := Key{Name: "x", Tol: tp.tol[0]}
		for _, r := range tp.raw {
			k.Values = append(k.Values, r[0])
		}
		p.Keys = []Key{k}
	default:
		off := 0
		if tp.kind == "hub" {
			off = tp.k
		}
		for j := range tp.k {
			k := Key{Name: fmt.Sprint("value ", j), Tol: tp.tol[len(tp.tol)-1]}
			for _, r := range tp.raw {
				s := slices.Sorted(slices.Values(r[off : off+tp.k]))
				k.Values = append(k.Values, s[j])
			}
			p.Keys = append(p.Keys, k)
		}
	}
	return p
}

// randomProblem draws n parts around a few centres, each jittered and
// read from a random variant.
func randomProblem(rng *rand.Rand, kind string, n int) *testProblem {
	tp := &testProblem{kind: kind, k: 4}
	centres := 1 + rng.IntN(4)
	base := make([][]float64, centres)
	switch kind {
	case "ends":
		tp.tol = []float64{1, 0.5, 0.5}
		for c := range base {
			base[c] = []float64{1000 + 3*rng.Float64(), 2 * rng.Float64(), 2 * rng.Float64()}
		}
	case "ring":
		tp.tol = []float64{1, 1, 1, 1}
		for c := range base {
			base[c] = []float64{1500 + 3*rng.Float64(), 1500 + 3*rng.Float64(), 1500 + 3*rng.Float64(), 1500 + 3*rng.Float64()}
		}
	case "hub":
		tp.tol = []float64{0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5}
		for c := range base {
			base[c] = []float64{0, 90 + rng.Float64(), 180 + rng.Float64(), 270 + rng.Float64(),
				-1 + rng.Float64(), -1 + rng.Float64(), -1 + rng.Float64(), -1 + rng.Float64()}
		}
	}
	for range n {
		b := base[rng.IntN(centres)]
		r := slices.Clone(b)
		for d := range r {
			r[d] += 0.6 * (rng.Float64() - 0.5)
		}
		switch kind {
		case "ends":
			if rng.IntN(2) == 1 {
				r = []float64{r[0], -r[2], -r[1]}
			}
		case "ring":
			s := rng.IntN(4)
			r = append(r[s:], r[:s]...)
		case "hub":
			// Turn the hub: every azimuth by the same angle, then sort.
			turn := 360 * rng.Float64()
			type arm struct{ az, el float64 }
			var arms []arm
			for i := range 4 {
				arms = append(arms, arm{math.Mod(r[i]+turn, 360), r[4+i]})
			}
			slices.SortFunc(arms, func(a, b arm) int { return cmp.Compare(a.az, b.az) })
			for i, a := range arms {
				r[i], r[4+i] = a.az, a.el
			}
		}
		tp.raw = append(tp.raw, r)
	}
	return tp
}

// fitsAll reports whether the vectors keep every range within tol.
func fitsAll(vs [][]float64, tol []float64) bool {
	for d := range tol {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range vs {
			lo, hi = min(lo, v[d]), max(hi, v[d])
		}
		if hi-lo > tol[d] {
			return false
		}
	}
	return true
}

// feasible reports whether the parts in mask can be one type: some choice
// of variants keeps every range within tol (brute force).
func (tp *testProblem) feasible(mask uint) bool {
	var parts []int
	for p := range len(tp.raw) {
		if mask&(1<<p) != 0 {
			parts = append(parts, p)
		}
	}
	G := tp.variants()
	choice := make([]int, len(parts))
	for {
		vs := make([][]float64, len(parts))
		for i, p := range parts {
			vs[i] = tp.coords(p, choice[i])
		}
		if fitsAll(vs, tp.tol) {
			return true
		}
		i := 0
		for ; i < len(choice); i++ {
			if choice[i]++; choice[i] < G {
				break
			}
			choice[i] = 0
		}
		if i == len(choice) {
			return false
		}
	}
}

// optimum returns the fewest types for a small problem: the smallest
// cover of all parts by feasible sets (subsets of feasible sets are
// feasible, so a cover gives a partition).
func (tp *testProblem) optimum() int {
	n := len(tp.raw)
	full := uint(1)<<n - 1
	ok := make([]bool, full+1)
	for m := uint(1); m <= full; m++ {
		ok[m] = tp.feasible(m)
	}
	best := make([]int, full+1)
	for m := uint(1); m <= full; m++ {
		low := m & -m
		best[m] = n + 1
		rest := m &^ low
		for sub := rest; ; sub = (sub - 1) & rest {
			if s := sub | low; ok[s] {
				best[m] = min(best[m], 1+best[m&^s])
			}
			if sub == 0 {
				break
			}
		}
	}
	return best[full]
}

// checkGroups checks groups against the test problem, by brute force:
// every part in exactly one group; each group's variants keep every range
// within the tolerance, and Min and Max are those ranges; no two groups
// can be merged with one read in a common variant (and, where the
// variants are not permutations, the other too).
func checkGroups(t *testing.T, name string, tp *testProblem, groups []Group) {
	t.Helper()
	seen := make([]int, len(tp.raw))
	G := tp.variants()
	compose := tp.problem().Compose
	// boxes[g][h]: the group's parts each read in Compose[variant][h].
	boxes := make([][][2][]float64, len(groups))
	for gi, g := range groups {
		if !slices.IsSorted(g.Parts) {
			t.Fatalf("%s: group %d parts not ascending", name, gi)
		}
		var vs [][]float64
		for i, p := range g.Parts {
			seen[p]++
			vs = append(vs, tp.coords(p, g.Variants[i]))
		}
		if !fitsAll(vs, tp.tol) {
			t.Fatalf("%s: group %d breaks a tolerance", name, gi)
		}
		for d := range tp.tol {
			lo, hi := math.Inf(1), math.Inf(-1)
			for _, v := range vs {
				lo, hi = min(lo, v[d]), max(hi, v[d])
			}
			if lo != g.Min[d] || hi != g.Max[d] {
				t.Fatalf("%s: group %d coordinate %d ranges %g..%g, says %g..%g", name, gi, d, lo, hi, g.Min[d], g.Max[d])
			}
		}
		boxes[gi] = make([][2][]float64, G)
		for h := range G {
			lo, hi := slices.Repeat([]float64{math.Inf(1)}, len(tp.tol)), slices.Repeat([]float64{math.Inf(-1)}, len(tp.tol))
			for i, p := range g.Parts {
				v := tp.coords(p, compose[g.Variants[i]][h])
				for d := range v {
					lo[d], hi[d] = min(lo[d], v[d]), max(hi[d], v[d])
				}
			}
			boxes[gi][h] = [2][]float64{lo, hi}
		}
	}
	for p, c := range seen {
		if c != 1 {
			t.Fatalf("%s: part %d in %d groups", name, p, c)
		}
	}
	frames := 1
	if tp.kind == "hub" {
		frames = G
	}
	for a := range groups {
		for b := a + 1; b < len(groups); b++ {
			for h := range frames {
				for v := range G {
					fits := true
					for d := range tp.tol {
						lo := min(boxes[a][h][0][d], boxes[b][v][0][d])
						hi := max(boxes[a][h][1][d], boxes[b][v][1][d])
						fits = fits && hi-lo <= tp.tol[d]
					}
					if fits {
						t.Fatalf("%s: groups %d and %d could be one", name, a, b)
					}
				}
			}
		}
	}
}

// TestSolveSmall: on small random problems of every kind, the types
// keep the tolerances, none can be merged, and the bound and the count
// bracket the true fewest types, found by brute force over every cover.
func TestSolveSmall(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 12))
	for _, kind := range []string{"ends", "ring", "hub"} {
		optimal, runs := 0, 0
		for trial := range 60 {
			tp := randomProblem(rng, kind, 2+rng.IntN(6))
			groups, bound, err := Solve(tp.problem())
			if err != nil {
				t.Fatal(err)
			}
			name := fmt.Sprintf("%s %d", kind, trial)
			checkGroups(t, name, tp, groups)
			opt := tp.optimum()
			if bound.Count > opt || opt > len(groups) {
				t.Fatalf("%s: bound %d, optimum %d, count %d", name, bound.Count, opt, len(groups))
			}
			runs++
			if len(groups) == opt {
				optimal++
			}
		}
		t.Logf("%s: optimal count in %d of %d problems", kind, optimal, runs)
		if optimal < runs*9/10 {
			t.Errorf("%s: optimal in only %d of %d small problems", kind, optimal, runs)
		}
	}
}

// TestSolveLarge: larger random problems keep the tolerances, cannot
// be merged, and stay at or above their bound.
func TestSolveLarge(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 12))
	for _, kind := range []string{"ends", "ring", "hub"} {
		for trial := range 5 {
			tp := randomProblem(rng, kind, 300)
			groups, bound, err := Solve(tp.problem())
			if err != nil {
				t.Fatal(err)
			}
			checkGroups(t, fmt.Sprintf("%s %d", kind, trial), tp, groups)
			if bound.Count > len(groups) {
				t.Fatalf("%s %d: bound %d above %d", kind, trial, bound.Count, len(groups))
			}
		}
	}
}

// TestSolveOneDimension: with one coordinate and no symmetry the
// sweep is the greedy interval cover, which is optimal (CoverCount), and
// the bound equals it.
func TestSolveOneDimension(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 12))
	for trial := range 20 {
		n := 1 + rng.IntN(500)
		tol := []float64{0, 0.1, 1, 7}[trial%4]
		p := &Problem{Parts: n, Dim: 1, Tol: []float64{tol}, Compose: [][]int{{0}}, Permutes: true}
		for range n {
			x := math.Round(100*rng.Float64()*10) / 10 // repeated values too
			p.Coords = append(p.Coords, x)
		}
		p.Keys = []Key{{Name: "x", Tol: tol, Values: p.Coords}}
		groups, bound, err := Solve(p)
		if err != nil {
			t.Fatal(err)
		}
		want := CoverCount(p.Coords, tol)
		if len(groups) != want || bound.Count != want {
			t.Errorf("trial %d: %d types, bound %d, want %d", trial, len(groups), bound.Count, want)
		}
	}
}

// TestSolveOrderIndependent: the parts in another order give the
// same types: the same sets of parts with the same ranges, in the same
// order.
func TestSolveOrderIndependent(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 12))
	for _, kind := range []string{"ends", "ring", "hub"} {
		tp := randomProblem(rng, kind, 400)
		a, _, err := Solve(tp.problem())
		if err != nil {
			t.Fatal(err)
		}
		perm := rng.Perm(len(tp.raw))
		sh := &testProblem{kind: tp.kind, k: tp.k, tol: tp.tol}
		for _, p := range perm {
			sh.raw = append(sh.raw, tp.raw[p])
		}
		b, _, err := Solve(sh.problem())
		if err != nil {
			t.Fatal(err)
		}
		if len(a) != len(b) {
			t.Fatalf("%s: %d types in order, %d shuffled", kind, len(a), len(b))
		}
		for g := range a {
			var parts []int
			for _, q := range b[g].Parts {
				parts = append(parts, perm[q])
			}
			slices.Sort(parts)
			if !slices.Equal(parts, a[g].Parts) || !slices.Equal(a[g].Min, b[g].Min) || !slices.Equal(a[g].Max, b[g].Max) {
				t.Fatalf("%s: type %d differs shuffled", kind, g)
			}
		}
	}
}

// TestSolveIdentical: parts that agree within the resolution share a
// type, even where the tolerance would let the sweep split them.
func TestSolveIdentical(t *testing.T) {
	p := &Problem{Parts: 6, Dim: 1, Tol: []float64{1}, Compose: [][]int{{0}}, Permutes: true,
		Coords: []float64{0, 0.9, 0.9 + 1e-9, 1.8, 0.9 - 1e-9, 2.7}}
	p.Keys = []Key{{Name: "x", Tol: 1, Values: p.Coords}}
	groups, _, err := Solve(p)
	if err != nil {
		t.Fatal(err)
	}
	for _, g := range groups {
		if slices.Contains(g.Parts, 1) != slices.Contains(g.Parts, 2) || slices.Contains(g.Parts, 1) != slices.Contains(g.Parts, 4) {
			t.Errorf("parts 1, 2 and 4 apart: %v", groups)
		}
	}
}

func TestSolveBadProblem(t *testing.T) {
	good := func() *Problem {
		return &Problem{Parts: 2, Dim: 1, Tol: []float64{1}, Compose: [][]int{{0, 1}, {1, 0}}, Permutes: true,
			Coords: []float64{1, 1, 2, 2}, Keys: []Key{{Name: "x", Tol: 1, Values: []float64{1, 2}}}}
	}
	for _, tc := range []struct {
		name  string
		spoil func(p *Problem)
	}{
		{"tolerances", func(p *Problem) { p.Tol = nil }},
		{"negative tolerance", func(p *Problem) { p.Tol[0] = -1 }},
		{"NaN tolerance", func(p *Problem) { p.Tol[0] = math.NaN() }},
		{"coordinates", func(p *Problem) { p.Coords = p.Coords[:3] }},
		{"NaN coordinate", func(p *Problem) { p.Coords[2] = math.NaN() }},
		{"no key", func(p *Problem) { p.Keys = nil }},
		{"short key", func(p *Problem) { p.Keys[0].Values = p.Keys[0].Values[:1] }},
		{"identity", func(p *Problem) { p.Compose = [][]int{{1, 0}, {0, 1}} }},
	} {
		p := good()
		tc.spoil(p)
		if _, _, err := Solve(p); err == nil {
			t.Errorf("%s: want an error", tc.name)
		}
	}
	if g, b, err := Solve(good()); err != nil || len(g) != 1 || b.Count != 1 {
		t.Errorf("good problem: %v %v %v", g, b, err)
	}
}

func TestBoundAdd(t *testing.T) {
	tb := func(n int, keys ...string) Bound {
		var b Bound
		for _, k := range keys {
			b = b.Add(Bound{Count: n, Quantity: k, Terms: []BoundTerm{{Count: n, Key: k}}})
		}
		return b
	}
	for _, tc := range []struct {
		a, b  Bound
		count int
		q     string
	}{
		{Bound{}, tb(3, "x"), 3, "x"},
		{tb(3, "x"), Bound{}, 3, "x"},
		{tb(3, "x"), tb(2, "x"), 5, "x"},
		{tb(3, "x"), tb(2, "y"), 5, "x; y"},
		{tb(3, "x").Add(tb(2, "y")), tb(1, "x"), 6, "x; y"},
		{tb(3, "x").Of("4-corner panels"), tb(2, "").Of("3-corner panels"), 5, "x of 4-corner panels; 3-corner panels pairwise out of tolerance"},
	} {
		got := tc.a.Add(tc.b)
		sum := 0
		for _, term := range got.Terms {
			sum += term.Count
		}
		if got.Count != tc.count || got.Quantity != tc.q || sum != tc.count {
			t.Errorf("%v.Add(%v) = %v, want %d by %q", tc.a, tc.b, got, tc.count, tc.q)
		}
	}
}

// Ordinal follows English ordinal suffixes (11th–13th, 21st, 22nd, …).
func TestOrdinal(t *testing.T) {
	for _, c := range []struct {
		j, n int
		want string
	}{{0, 5, "lowest"}, {4, 5, "highest"}, {1, 5, "2nd lowest"}, {2, 5, "3rd lowest"}, {3, 30, "4th lowest"},
		{10, 30, "11th lowest"}, {11, 30, "12th lowest"}, {12, 30, "13th lowest"}, {20, 30, "21st lowest"}, {21, 30, "22nd lowest"}, {22, 30, "23rd lowest"}} {
		if got := Ordinal(c.j, c.n, "lowest", "highest"); got != c.want {
			t.Errorf("Ordinal(%d, %d) = %q, want %q", c.j, c.n, got, c.want)
		}
	}
}
