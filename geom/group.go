package geom

import (
	"cmp"
	"errors"
	"math"
	"slices"
)

// TypeResolution is the resolution, in each coordinate's own unit (mm or
// degrees), to which values are rounded wherever the grouping orders or
// compares parts for anything but the tolerance: sorting, ties, which
// reading of a part comes first. Parts whose coordinates agree within it
// (and within the tolerance) are treated as one part, so they always share
// a type and their order in the input does not matter.
const TypeResolution = 1e-6

// TypeProblem describes parts to sort into types (congruent-part counting:
// member, node and panel types). Each part is described by coordinates, a
// vector of Dim values, and can be read in several ways: one reading
// (variant) for each element of a finite symmetry group, such as a member
// read from either end or a panel read from any start corner.
//
// A type is a set of parts, each read in a chosen variant, such that every
// coordinate ranges within its tolerance over the type. Then every pair of
// parts in a type agrees within every tolerance, and every part lies within
// half the tolerance of the type's nominal part (the middle of each
// coordinate's range).
type TypeProblem struct {
	Parts int       // number of parts
	Dim   int       // coordinates per variant
	Tol   []float64 // per coordinate, ≥ 0
	// Compose is the symmetry group's table: Compose[a][b] is variant a
	// followed by b, where a part read in variant a is read again in the
	// way b reads a part. Variant 0 is the identity (the part as given).
	// For a panel read from start corner a, then from that reading's
	// corner b, the composition is the reading from corner a+b.
	Compose [][]int
	// Permutes says that every symmetry only permutes the coordinates and
	// changes signs (members, panels), so a type's ranges are the same in
	// every variant of the type; when false (node arms measured from the
	// first arm) every variant of a type is tried when types grow.
	Permutes bool
	// Coords holds the coordinates: variant s of part p at
	// Coords[(p*len(Compose)+s)*Dim:][:Dim].
	Coords []float64
	// Keys are quantities that no symmetry changes and that range within
	// their Tol inside every type (a coordinate every variant keeps, or an
	// order statistic of coordinates the symmetries permute, such as the
	// shortest edge). At least one. The sweep runs along the one with the
	// largest lower bound; every key gives a lower bound.
	Keys []TypeKey
}

// TypeKey is a quantity that no symmetry changes: one value per part, and
// the range it stays within inside every type.
type TypeKey struct {
	Name   string // such as "cut length"
	Tol    float64
	Values []float64
}

// TypeGroup is one type: its parts, the variant each is read in, and the
// range of each coordinate over the parts in those variants.
type TypeGroup struct {
	Parts    []int     // ascending
	Variants []int     // per entry of Parts
	Min, Max []float64 // per coordinate
}

// Nominal returns the type's nominal coordinates: the middle of each
// coordinate's range.
func (g TypeGroup) Nominal() []float64 {
	out := make([]float64, len(g.Min))
	for d := range out {
		out[d] = (g.Min[d] + g.Max[d]) / 2
	}
	return out
}

// TypeBound is a lower bound on the number of types: no grouping that
// keeps the tolerances has fewer. Quantity says what gave it.
type TypeBound struct {
	Count    int
	Quantity string
}

// Add returns the bound for two sets of parts that never share a type
// (such as panels with different corner counts): the counts add.
func (b TypeBound) Add(o TypeBound) TypeBound {
	switch {
	case b.Count == 0:
		return o
	case o.Count == 0 || o.Quantity == b.Quantity:
		return TypeBound{Count: b.Count + o.Count, Quantity: b.Quantity}
	}
	return TypeBound{Count: b.Count + o.Count, Quantity: b.Quantity + "; " + o.Quantity}
}

// MaxTypeRefineRounds caps the rounds of refinement (merging types, then
// emptying small types into others) after the sweep. The last step is
// always a full merge pass, so the cap never leaves two mergeable types.
const MaxTypeRefineRounds = 8

// GroupTypes sorts parts into the fewest types it can find in which every
// coordinate ranges within its tolerance, and returns them with a lower
// bound on the count.
//
// Method:
//  1. Parts that agree within TypeResolution become one item.
//  2. Sweep: items in order of the key with the largest lower bound (the
//     most spread quantity, ties by the rounded coordinates); each joins,
//     in the variant that fits best, the open type whose ranges it grows
//     least (sum of squared ranges over tolerances), or opens a type.
//     Only types whose key lies within the key's tolerance are open, so
//     the work is near linear. With one coordinate this is the classic
//     optimal interval cover: the count equals the bound.
//  3. Refinement, repeated: merge any two types whose union fits, all of
//     one read in a common variant; then empty small types, smallest
//     first, by moving each of their items into another type it fits.
//     The last step is a merge pass that finds nothing to merge.
//
// Guarantees: every type keeps every tolerance; no two types can be
// merged by reading all parts of one in a common variant; parts that
// agree within TypeResolution share a type; the result depends only on
// the coordinates rounded to TypeResolution, not on the order of the
// parts (parts that agree within it are interchangeable). The count is at
// least the returned bound; how far above it is the quality of the
// heuristic (box cover is NP-hard in two or more dimensions).
//
// Types come out in the order of their rounded nominal coordinates, each
// in the variant whose nominal coordinates come first (among those where
// the type keeps its tolerances).
func GroupTypes(p *TypeProblem) ([]TypeGroup, TypeBound, error) {
	if err := p.check(); err != nil {
		return nil, TypeBound{}, err
	}
	if p.Parts == 0 {
		return nil, TypeBound{}, nil
	}
	g := newGrouper(p)
	g.makeItems()
	bound := g.bound()
	g.sweep()
	for range MaxTypeRefineRounds {
		for g.mergePass() {
		}
		if !g.emptyPass() {
			break
		}
	}
	for g.mergePass() {
	}
	return g.result(), bound, nil
}

func (p *TypeProblem) check() error {
	G := len(p.Compose)
	switch {
	case p.Parts < 0 || p.Dim < 1 || G < 1:
		return errors.New("type problem: no parts, coordinates or variants")
	case len(p.Tol) != p.Dim:
		return errors.New("type problem: one tolerance per coordinate")
	case len(p.Coords) != p.Parts*G*p.Dim:
		return errors.New("type problem: coordinates for every part and variant")
	case len(p.Keys) == 0:
		return errors.New("type problem: no key")
	}
	for _, t := range p.Tol {
		if !(t >= 0) || math.IsInf(t, 0) {
			return errors.New("type problem: tolerances must be finite and ≥ 0")
		}
	}
	for _, k := range p.Keys {
		if len(k.Values) != p.Parts || !(k.Tol >= 0) {
			return errors.New("type problem: key " + k.Name + " needs a value per part and a tolerance ≥ 0")
		}
	}
	for a, row := range p.Compose {
		if len(row) != G || row[0] != a || p.Compose[0][a] != a {
			return errors.New("type problem: variant 0 must be the identity")
		}
	}
	for _, v := range p.Coords {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return errors.New("type problem: coordinates must be finite")
		}
	}
	return nil
}

// Items and types keep boxes in every variant v: a block of len(Compose)
// boxes, box v holding the lows (Dim values) then the highs of the
// coordinates of their parts, each read in Compose[its variant][v].

// item is a set of parts that agree within TypeResolution.
type item struct {
	rep      int // first part; its variant in the item is its canonical one
	qlo, qhi float64
	size     int
}

// typ is a type being built: items, each read in Compose[shift][frame].
type typ struct {
	items, shifts []int
	frame         int
	box           []float64
	qlo, qhi      float64 // range of the sweep key
	size          int     // parts
	alive         bool
}

type grouper struct {
	p        *TypeProblem
	G, D     int
	inv      []int // inverse variant
	frames   []int // variants of a type tried when it grows
	key      int   // sweep key
	keyBound int   // largest cover count of a key
	boundKey int   // its key
	keyOrder []int // keys by cover count, largest first
	q        []float64
	qTol     float64 // sweep key tolerance plus slack
	items    []item
	itemBox  []float64 // item i's block at i*G*2*D
	itemOf   []int32   // per part
	itemVar  []int32   // per part: its variant in its item
	types    []typ
	scratch  []float64
	undo     []snapshot
}

// keySlack absorbs the rounding of keys computed from coordinates (such
// as differences of angles): far below any tolerance, far above float
// noise.
const keySlack = 2 * TypeResolution

func newGrouper(p *TypeProblem) *grouper {
	G := len(p.Compose)
	g := &grouper{p: p, G: G, D: p.Dim, inv: make([]int, G)}
	for a := range G {
		for b := range G {
			if p.Compose[a][b] == 0 {
				g.inv[a] = b
			}
		}
	}
	g.frames = []int{0}
	if !p.Permutes {
		g.frames = g.frames[:0]
		for v := range G {
			g.frames = append(g.frames, v)
		}
	}
	return g
}

func (g *grouper) vec(part, variant int) []float64 {
	i := (part*g.G + variant) * g.D
	return g.p.Coords[i : i+g.D]
}

// block returns item i's boxes; at returns box v of a block.
func (g *grouper) block(i int) []float64 {
	n := g.G * 2 * g.D
	return g.itemBox[i*n : (i+1)*n]
}

func (g *grouper) at(block []float64, v int) []float64 { return block[v*2*g.D : (v+1)*2*g.D] }

// rounded compares two vectors on values rounded to TypeResolution.
func rounded(a, b []float64) int {
	for d := range a {
		if c := cmp.Compare(math.Round(a[d]/TypeResolution), math.Round(b[d]/TypeResolution)); c != 0 {
			return c
		}
	}
	return 0
}

// canonical returns the variant of a part whose rounded coordinates come
// first (the lowest such variant on ties).
func (g *grouper) canonical(p int) int {
	best := 0
	for s := 1; s < g.G; s++ {
		if rounded(g.vec(p, s), g.vec(p, best)) < 0 {
			best = s
		}
	}
	return best
}

// makeItems chooses the sweep key, orders the parts by it (ties by the
// other keys in the order of their cover counts, then by the rounded
// canonical coordinates; all rounded) and merges parts that agree within the
// resolution (and the tolerances) into items, in that order.
func (g *grouper) makeItems() {
	p := g.p
	g.key = g.sweepKey()
	k := p.Keys[g.key]
	g.q, g.qTol = k.Values, k.Tol+keySlack
	canon := make([]int, p.Parts)
	order := make([]int, p.Parts)
	nk := len(p.Keys)
	rq := make([]float64, p.Parts*nk) // rounded keys of part i at i*nk, in key order
	for i := range order {
		order[i] = i
		canon[i] = g.canonical(i)
		for j, k := range g.keyOrder {
			rq[i*nk+j] = math.Round(p.Keys[k].Values[i] / TypeResolution)
		}
	}
	slices.SortFunc(order, func(a, b int) int {
		if c := slices.Compare(rq[a*nk:(a+1)*nk], rq[b*nk:(b+1)*nk]); c != 0 {
			return c
		}
		if c := rounded(g.vec(a, canon[a]), g.vec(b, canon[b])); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	})
	atomTol := make([]float64, g.D)
	for d, t := range p.Tol {
		atomTol[d] = min(t, TypeResolution)
	}
	n := g.G * 2 * g.D
	g.items = make([]item, 0, p.Parts)
	g.itemBox = make([]float64, 0, p.Parts*n)
	g.itemOf, g.itemVar = make([]int32, p.Parts), make([]int32, p.Parts)
	lo := 0
	for _, part := range order {
		q := g.q[part]
		for lo < len(g.items) && g.items[lo].qlo < q-3*TypeResolution {
			lo++
		}
		joined := false
		for i := lo; i < len(g.items) && !joined; i++ {
			b := g.block(i)
			for s := range g.G {
				if fitsTol(g.at(b, 0), g.vec(part, s), atomTol) {
					g.addPart(i, part, s)
					joined = true
					break
				}
			}
		}
		if !joined {
			i := len(g.items)
			g.items = append(g.items, item{rep: part, qlo: q, qhi: q, size: 1})
			for v := range g.G {
				x := g.vec(part, p.Compose[canon[part]][v])
				g.itemBox = append(append(g.itemBox, x...), x...)
			}
			g.itemOf[part], g.itemVar[part] = int32(i), int32(canon[part])
		}
	}
}

// fitsTol reports whether the box (lo then hi) grown by point x keeps every
// range within tol.
func fitsTol(box, x, tol []float64) bool {
	D := len(x)
	for d := range x {
		if max(box[D+d], x[d])-min(box[d], x[d]) > tol[d] {
			return false
		}
	}
	return true
}

// addPart adds part, read in variant s, to item i.
func (g *grouper) addPart(i, part, s int) {
	it := &g.items[i]
	it.size++
	q := g.q[part]
	it.qlo, it.qhi = min(it.qlo, q), max(it.qhi, q)
	g.itemOf[part], g.itemVar[part] = int32(i), int32(s)
	blk := g.block(i)
	for v := range g.G {
		b := g.at(blk, v)
		x := g.vec(part, g.p.Compose[s][v])
		for d := range g.D {
			b[d] = min(b[d], x[d])
			b[g.D+d] = max(b[g.D+d], x[d])
		}
	}
}

// fit reports whether boxes a and b together keep every tolerance, and
// the growth of a's sum of squared ranges over tolerances.
func (g *grouper) fit(a, b []float64) (cost float64, ok bool) {
	D := g.D
	for d, t := range g.p.Tol {
		r := max(a[D+d], b[D+d]) - min(a[d], b[d])
		if r > t {
			return 0, false
		}
		if t > 0 {
			r0 := a[D+d] - a[d]
			cost += (r*r - r0*r0) / (t * t)
		}
	}
	return cost, true
}

// best finds where a block src fits type t best: t read in its variant h
// (from g.frames) and src in its variant v.
func (g *grouper) best(t *typ, src []float64) (cost float64, h, v int, ok bool) {
	cost = math.Inf(1)
	for _, hh := range g.frames {
		a := g.at(t.box, hh)
		for vv := range g.G {
			if c, fits := g.fit(a, g.at(src, vv)); fits && c < cost {
				cost, h, v, ok = c, hh, vv, true
			}
		}
	}
	return cost, h, v, ok
}

// turn makes variant h of type t its variant 0.
func (g *grouper) turn(t *typ, h int) {
	if h == 0 {
		return
	}
	t.frame = g.p.Compose[t.frame][h]
	old := append(g.scratch[:0], t.box...)
	g.scratch = old
	for x := range g.G {
		copy(g.at(t.box, x), g.at(old, g.p.Compose[h][x]))
	}
}

// grow widens t's boxes by block src read in its variant v.
func (g *grouper) grow(t *typ, src []float64, v int) {
	for x := range g.G {
		a, b := g.at(t.box, x), g.at(src, g.p.Compose[v][x])
		for d := range g.D {
			a[d] = min(a[d], b[d])
			a[g.D+d] = max(a[g.D+d], b[g.D+d])
		}
	}
}

// addItem puts item i, read in its variant v, into type t.
func (g *grouper) addItem(t *typ, i, v int) {
	t.items = append(t.items, i)
	t.shifts = append(t.shifts, g.p.Compose[v][g.inv[t.frame]])
	it := &g.items[i]
	t.size += it.size
	t.qlo, t.qhi = min(t.qlo, it.qlo), max(t.qhi, it.qhi)
	g.grow(t, g.block(i), v)
}

// addType puts every item of type u, read in u's variant v, into type t.
func (g *grouper) addType(t, u *typ, v int) {
	for k, i := range u.items {
		e := g.p.Compose[u.shifts[k]][u.frame] // item's variant in u
		t.items = append(t.items, i)
		t.shifts = append(t.shifts, g.p.Compose[g.p.Compose[e][v]][g.inv[t.frame]])
	}
	t.size += u.size
	t.qlo, t.qhi = min(t.qlo, u.qlo), max(t.qhi, u.qhi)
	g.grow(t, u.box, v)
}

// sweep places the items in sweep order: each into the open type it grows
// least, or into a new type.
func (g *grouper) sweep() {
	lo := 0
	for i := range g.items {
		it := &g.items[i]
		for lo < len(g.types) && g.types[lo].qlo < it.qlo-g.qTol-keySlack {
			lo++
		}
		src := g.block(i)
		bt, bh, bv, bc := -1, 0, 0, math.Inf(1)
		for t := lo; t < len(g.types); t++ {
			if c, h, v, ok := g.best(&g.types[t], src); ok && c < bc {
				bt, bh, bv, bc = t, h, v, c
			}
		}
		if bt >= 0 {
			g.turn(&g.types[bt], bh)
			g.addItem(&g.types[bt], i, bv)
			continue
		}
		g.types = append(g.types, typ{items: []int{i}, shifts: []int{0}, box: slices.Clone(src),
			qlo: it.qlo, qhi: it.qhi, size: it.size, alive: true})
	}
}

// alive returns the live types sorted by the low end of their key, then
// index.
func (g *grouper) alive() []int {
	var out []int
	for t := range g.types {
		if g.types[t].alive {
			out = append(out, t)
		}
	}
	slices.SortFunc(out, func(a, b int) int {
		if c := cmp.Compare(g.types[a].qlo, g.types[b].qlo); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	})
	return out
}

// mergePass merges every pair of types whose union keeps the tolerances,
// one of them read in a common variant; it reports whether it merged any.
func (g *grouper) mergePass() bool {
	order := g.alive()
	merged := false
	for i, a := range order {
		ta := &g.types[a]
		if !ta.alive {
			continue
		}
		for _, b := range order[i+1:] {
			tb := &g.types[b]
			if tb.qlo > ta.qlo+g.qTol {
				break // sorted: every later type is further still
			}
			if !tb.alive {
				continue
			}
			if _, h, v, ok := g.best(ta, tb.box); ok {
				g.turn(ta, h)
				g.addType(ta, tb, v)
				tb.alive = false
				merged = true
			}
		}
	}
	return merged
}

// MaxTypeEject is the most items an item may push out of a type while a
// type is being emptied.
const MaxTypeEject = 3

// emptyPass tries, smallest type first, to move every item of a type into
// other types: each item into the type it grows least, or, if it fits
// none, into the type it fits after pushing out the fewest of its items
// (at most MaxTypeEject), which must then fit other types. It reports
// whether it emptied any type.
func (g *grouper) emptyPass() bool {
	byKey := g.alive()
	qlo0 := make([]float64, len(byKey))
	for i, t := range byKey {
		qlo0[i] = g.types[t].qlo
	}
	order := slices.Clone(byKey)
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(g.types[a].size, g.types[b].size) })
	emptied := false
	for _, t := range order {
		if !g.types[t].alive {
			continue
		}
		g.undo = g.undo[:0]
		ok := true
		for _, i := range g.types[t].items {
			if !g.place(i, t, -1, byKey, qlo0) && !g.eject(i, t, byKey, qlo0) {
				ok = false
				break
			}
		}
		if !ok {
			for k := len(g.undo) - 1; k >= 0; k-- {
				g.types[g.undo[k].t] = g.undo[k].c
			}
			continue
		}
		g.types[t].alive = false
		emptied = true
	}
	return emptied
}

// snapshot is a type's state before an attempt to empty another type.
type snapshot struct {
	t int
	c typ
}

// save records type u's state before its first change in this attempt,
// and gives the live type its own copies to change.
func (g *grouper) save(u int) {
	for _, s := range g.undo {
		if s.t == u {
			return
		}
	}
	g.undo = append(g.undo, snapshot{u, g.types[u]})
	tu := &g.types[u]
	tu.items, tu.shifts, tu.box = slices.Clone(tu.items), slices.Clone(tu.shifts), slices.Clone(tu.box)
}

// window returns the range of byKey whose types may take an item with key
// range [qlo, qhi]. A type's key range must stay within the tolerance;
// its low end only falls during a pass, so qlo0 (the low ends when the
// pass began) lies within [qhi − tol, qlo + tol].
func (g *grouper) window(qlo, qhi float64, qlo0 []float64) (int, int) {
	from, _ := slices.BinarySearch(qlo0, qhi-g.qTol-keySlack)
	to := from
	for to < len(qlo0) && qlo0[to] <= qlo+g.qTol+keySlack {
		to++
	}
	return from, to
}

// place puts item i into the live type (other than t and also) it grows
// least.
func (g *grouper) place(i, t, also int, byKey []int, qlo0 []float64) bool {
	it, src := &g.items[i], g.block(i)
	from, to := g.window(it.qlo, it.qhi, qlo0)
	bu, bv, bc := -1, 0, math.Inf(1)
	for _, u := range byKey[from:to] {
		if u == t || u == also || !g.types[u].alive {
			continue
		}
		a := g.at(g.types[u].box, 0)
		for v := range g.G {
			if c, fits := g.fit(a, g.at(src, v)); fits && c < bc {
				bu, bv, bc = u, v, c
			}
		}
	}
	if bu < 0 {
		return false
	}
	g.save(bu)
	g.addItem(&g.types[bu], i, bv)
	return true
}

// eject puts item i into the type u (not t) where it fits after pushing
// out the fewest items (at most MaxTypeEject, and not all), then places
// those items elsewhere (not in t or u). An item of u must go if it lies
// further than a tolerance from item i in some coordinate; the rest keep
// every range within its tolerance, since they already did among
// themselves.
func (g *grouper) eject(i, t int, byKey []int, qlo0 []float64) bool {
	it, src := &g.items[i], g.block(i)
	from, to := g.window(it.qlo, it.qhi, qlo0)
	D := g.D
	bu, bv, bn := -1, 0, MaxTypeEject+1
	var out, best []int
	for _, u := range byKey[from:to] {
		tu := &g.types[u]
		if u == t || !tu.alive {
			continue
		}
		for v := range g.G {
			x := g.at(src, v)
			out = out[:0]
			for k, j := range tu.items {
				y := g.at(g.block(j), g.p.Compose[tu.shifts[k]][tu.frame])
				for d, tol := range g.p.Tol {
					if y[d] < x[D+d]-tol || y[D+d] > x[d]+tol {
						out = append(out, k)
						break
					}
				}
				if len(out) >= bn {
					break
				}
			}
			if len(out) < bn && len(out) < len(tu.items) {
				bu, bv, bn, best = u, v, len(out), append(best[:0], out...)
			}
		}
	}
	if bu < 0 {
		return false
	}
	g.save(bu)
	tu := &g.types[bu]
	var pushed []int
	keep := 0
	for k := range tu.items {
		if len(best) > 0 && best[0] == k {
			best = best[1:]
			pushed = append(pushed, tu.items[k])
			continue
		}
		tu.items[keep], tu.shifts[keep] = tu.items[k], tu.shifts[k]
		keep++
	}
	tu.items, tu.shifts = tu.items[:keep], tu.shifts[:keep]
	g.rebox(tu)
	g.addItem(tu, i, bv)
	for _, j := range pushed {
		if !g.place(j, t, bu, byKey, qlo0) {
			return false
		}
	}
	return true
}

// rebox recomputes a type's boxes, key range and size from its items.
func (g *grouper) rebox(t *typ) {
	D := g.D
	for x := range g.G {
		b := g.at(t.box, x)
		for d := range D {
			b[d], b[D+d] = math.Inf(1), math.Inf(-1)
		}
	}
	t.qlo, t.qhi, t.size = math.Inf(1), math.Inf(-1), 0
	for k, i := range t.items {
		it := &g.items[i]
		g.grow(t, g.block(i), g.p.Compose[t.shifts[k]][t.frame])
		t.qlo, t.qhi, t.size = min(t.qlo, it.qlo), max(t.qhi, it.qhi), t.size+it.size
	}
}

// keeps reports whether type t keeps its tolerances read in variant h.
func (g *grouper) keeps(t *typ, h int) bool {
	b := g.at(t.box, h)
	for d, tol := range g.p.Tol {
		if b[g.D+d]-b[d] > tol {
			return false
		}
	}
	return true
}

// result lists the types: parts ascending with their variants, each type
// in its variant whose rounded nominal coordinates come first (among
// those that keep the tolerances), types in the order of those.
func (g *grouper) result() []TypeGroup {
	// Parts by item.
	start := make([]int, len(g.items)+1)
	for _, i := range g.itemOf {
		start[i+1]++
	}
	for i := range g.items {
		start[i+1] += start[i]
	}
	parts := make([]int, len(g.itemOf))
	fill := slices.Clone(start[:len(g.items)])
	for p, i := range g.itemOf {
		parts[fill[i]] = p
		fill[i]++
	}
	nominal := func(b []float64) []float64 {
		out := make([]float64, g.D)
		for d := range out {
			out[d] = (b[d] + b[g.D+d]) / 2
		}
		return out
	}
	var out []TypeGroup
	for ti := range g.types {
		t := &g.types[ti]
		if !t.alive {
			continue
		}
		bestH, bn := 0, nominal(g.at(t.box, 0))
		for h := 1; h < g.G; h++ {
			if !g.p.Permutes && !g.keeps(t, h) {
				continue
			}
			if n := nominal(g.at(t.box, h)); rounded(n, bn) < 0 {
				bestH, bn = h, n
			}
		}
		frame := g.p.Compose[t.frame][bestH]
		type pv struct{ p, v int }
		var pvs []pv
		for k, i := range t.items {
			e := g.p.Compose[t.shifts[k]][frame]
			for _, p := range parts[start[i]:start[i+1]] {
				pvs = append(pvs, pv{p, g.p.Compose[g.itemVar[p]][e]})
			}
		}
		slices.SortFunc(pvs, func(a, b pv) int { return cmp.Compare(a.p, b.p) })
		var tg TypeGroup
		for _, x := range pvs {
			tg.Parts = append(tg.Parts, x.p)
			tg.Variants = append(tg.Variants, x.v)
		}
		b := g.at(t.box, bestH)
		tg.Min, tg.Max = slices.Clone(b[:g.D]), slices.Clone(b[g.D:])
		out = append(out, tg)
	}
	slices.SortFunc(out, func(a, b TypeGroup) int {
		if c := rounded(a.Nominal(), b.Nominal()); c != 0 {
			return c
		}
		if c := rounded(a.Min, b.Min); c != 0 {
			return c
		}
		return cmp.Compare(a.Parts[0], b.Parts[0])
	})
	return out
}
