package parttype

import (
	"cmp"
	"math"
	"slices"
)

// apartQuantity is the Quantity of a bound from parts pairwise apart.
const apartQuantity = "parts pairwise out of tolerance"

// MaxRefineRounds caps the rounds of refinement (merging types, then
// emptying small types into others) after the sweep. The last step is
// always a full merge pass, so the cap never leaves two mergeable types.
const MaxRefineRounds = 8

// Items and types keep boxes in every variant v: a block of len(Compose)
// boxes, box v holding the lows (Dim values) then the highs of the
// coordinates of their parts, each read in Compose[its variant][v].

// item is a set of parts that agree within Resolution. An item of one
// part keeps no boxes: they are the part's coordinates.
type item struct {
	rep      int // first part
	canon    int // rep's variant in the item (its canonical one)
	box      int // offset of the item's boxes in itemBox; −1 for one part
	qlo, qhi float64
	keys     keyRanges
	size     int
}

// filterKeys is the number of keys besides the sweep key whose ranges
// items and types keep, to tell quickly that two cannot share a type.
const filterKeys = 5

// keyRanges holds the ranges of the filter keys.
type keyRanges [filterKeys][2]float64

// apart reports whether two sets of parts cannot share a type because a
// filter key would range over more than its tolerance.
func (g *grouper) apart(a, b *keyRanges) bool {
	for f, k := range g.filter {
		if max(a[f][1], b[f][1])-min(a[f][0], b[f][0]) > g.p.Keys[k].Tol+keySlack {
			return true
		}
	}
	return false
}

// widen widens key ranges a by b.
func (g *grouper) widen(a, b *keyRanges) {
	for f := range g.filter {
		a[f][0], a[f][1] = min(a[f][0], b[f][0]), max(a[f][1], b[f][1])
	}
}

// partKeys returns the filter keys of one part.
func (g *grouper) partKeys(p int) keyRanges {
	var r keyRanges
	for f, k := range g.filter {
		v := g.p.Keys[k].Values[p]
		r[f] = [2]float64{v, v}
	}
	return r
}

// typ is a type being built: items, each read in Compose[shift][frame].
type typ struct {
	items, shifts []int
	frame         int
	box           []float64
	qlo, qhi      float64 // range of the sweep key
	keys          keyRanges
	size          int // parts
	alive         bool
}

type grouper struct {
	p        *Problem
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
	itemBox  []float64 // boxes of items of more than one part
	itemOf   []int32   // per part
	itemVar  []int32   // per part: its variant in its item
	types    []typ
	scratch  []float64
	undo     []snapshot
	// coordOrder lists the coordinates by their spread over their
	// tolerance, largest first: the order fit tries them in, so a box
	// that does not fit is told early.
	coordOrder []int
	filter     []int // filter keys
}

// keySlack absorbs the rounding of keys computed from coordinates (such
// as differences of angles): far below any tolerance, far above float
// noise.
const keySlack = 2 * Resolution

func newGrouper(p *Problem) *grouper {
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

// at returns box v (lows, then highs) of a block of boxes.
func (g *grouper) at(block []float64, v int) []float64 { return block[v*2*g.D : (v+1)*2*g.D] }

// ibox returns item i's box in its variant v: lows and highs.
func (g *grouper) ibox(i, v int) (lo, hi []float64) {
	it := &g.items[i]
	if it.box < 0 {
		x := g.vec(it.rep, g.p.Compose[it.canon][v])
		return x, x
	}
	b := g.itemBox[it.box+v*2*g.D:]
	return b[:g.D], b[g.D : 2*g.D]
}

// rounded compares two vectors on values rounded to Resolution.
func rounded(a, b []float64) int {
	for d := range a {
		if c := cmp.Compare(math.Round(a[d]/Resolution), math.Round(b[d]/Resolution)); c != 0 {
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
	g.filter = g.keyOrder[1:min(len(g.keyOrder), 1+filterKeys)]
	canon := make([]int, p.Parts)
	order := make([]int, p.Parts)
	// The first two keys rounded once; the others, rarely needed, when
	// compared.
	rq := make([][2]float64, p.Parts)
	round := func(k, i int) float64 { return math.Round(p.Keys[g.keyOrder[k]].Values[i] / Resolution) }
	for i := range order {
		order[i] = i
		canon[i] = g.canonical(i)
		rq[i][0] = round(0, i)
		if len(g.keyOrder) > 1 {
			rq[i][1] = round(1, i)
		}
	}
	slices.SortFunc(order, func(a, b int) int {
		if c := cmp.Compare(rq[a][0], rq[b][0]); c != 0 {
			return c
		}
		if c := cmp.Compare(rq[a][1], rq[b][1]); c != 0 {
			return c
		}
		for k := 2; k < len(g.keyOrder); k++ {
			if c := cmp.Compare(round(k, a), round(k, b)); c != 0 {
				return c
			}
		}
		if c := rounded(g.vec(a, canon[a]), g.vec(b, canon[b])); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	})
	atomTol := make([]float64, g.D)
	for d, t := range p.Tol {
		atomTol[d] = min(t, Resolution)
	}
	spread := make([]float64, g.D)
	for d := range g.D {
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := range p.Parts {
			x := g.vec(i, canon[i])[d]
			lo, hi = min(lo, x), max(hi, x)
		}
		spread[d] = (hi - lo) / (p.Tol[d] + keySlack)
		g.coordOrder = append(g.coordOrder, d)
	}
	slices.SortStableFunc(g.coordOrder, func(a, b int) int { return cmp.Compare(spread[b], spread[a]) })
	g.items = make([]item, 0, p.Parts)
	g.itemOf, g.itemVar = make([]int32, p.Parts), make([]int32, p.Parts)
	lo := 0
	for _, part := range order {
		q := g.q[part]
		for lo < len(g.items) && g.items[lo].qlo < q-3*Resolution {
			lo++
		}
		joined := false
		for i := lo; i < len(g.items) && !joined; i++ {
			blo, bhi := g.ibox(i, 0)
			for s := range g.G {
				if fitsTol(blo, bhi, g.vec(part, s), atomTol) {
					g.addPart(i, part, s)
					joined = true
					break
				}
			}
		}
		if !joined {
			i := len(g.items)
			g.items = append(g.items, item{rep: part, canon: canon[part], box: -1, qlo: q, qhi: q, keys: g.partKeys(part), size: 1})
			g.itemOf[part], g.itemVar[part] = int32(i), int32(canon[part])
		}
	}
}

// fitsTol reports whether the box grown by point x keeps every range
// within tol.
func fitsTol(lo, hi, x, tol []float64) bool {
	for d := range x {
		if max(hi[d], x[d])-min(lo[d], x[d]) > tol[d] {
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
	pk := g.partKeys(part)
	g.widen(&it.keys, &pk)
	g.itemOf[part], g.itemVar[part] = int32(i), int32(s)
	if it.box < 0 { // give the item boxes, from its first part
		it.box = len(g.itemBox)
		for v := range g.G {
			x := g.vec(it.rep, g.p.Compose[it.canon][v])
			g.itemBox = append(append(g.itemBox, x...), x...)
		}
	}
	for v := range g.G {
		b := g.itemBox[it.box+v*2*g.D:]
		x := g.vec(part, g.p.Compose[s][v])
		for d := range g.D {
			b[d] = min(b[d], x[d])
			b[g.D+d] = max(b[g.D+d], x[d])
		}
	}
}

// fit reports whether box a (lows then highs) and the box from blo to bhi
// together keep every tolerance, and the growth of a's sum of squared
// ranges over tolerances.
func (g *grouper) fit(a, blo, bhi []float64) (cost float64, ok bool) {
	D := g.D
	for _, d := range g.coordOrder {
		t := g.p.Tol[d]
		r := max(a[D+d], bhi[d]) - min(a[d], blo[d])
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

// best finds where item i (u < 0) or type u fits type t best: t read in
// its variant h (from g.frames) and the other in its variant v.
func (g *grouper) best(t *typ, i, u int) (cost float64, h, v int, ok bool) {
	cost = math.Inf(1)
	for _, hh := range g.frames {
		a := g.at(t.box, hh)
		for vv := range g.G {
			lo, hi := g.box(i, u, vv)
			if c, fits := g.fit(a, lo, hi); fits && c < cost {
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

// box returns the box of item i (u < 0) or of type u, in its variant v.
func (g *grouper) box(i, u, v int) (lo, hi []float64) {
	if u >= 0 {
		b := g.at(g.types[u].box, v)
		return b[:g.D], b[g.D:]
	}
	return g.ibox(i, v)
}

// grow widens t's boxes by item i (u < 0) or type u read in its variant v.
func (g *grouper) grow(t *typ, i, u, v int) {
	for x := range g.G {
		a := g.at(t.box, x)
		lo, hi := g.box(i, u, g.p.Compose[v][x])
		for d := range g.D {
			a[d] = min(a[d], lo[d])
			a[g.D+d] = max(a[g.D+d], hi[d])
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
	g.widen(&t.keys, &it.keys)
	g.grow(t, i, -1, v)
}

// addType puts every item of type ui, read in its variant v, into type t.
func (g *grouper) addType(t *typ, ui, v int) {
	u := &g.types[ui]
	for k, i := range u.items {
		e := g.p.Compose[u.shifts[k]][u.frame] // item's variant in u
		t.items = append(t.items, i)
		t.shifts = append(t.shifts, g.p.Compose[g.p.Compose[e][v]][g.inv[t.frame]])
	}
	t.size += u.size
	t.qlo, t.qhi = min(t.qlo, u.qlo), max(t.qhi, u.qhi)
	g.widen(&t.keys, &u.keys)
	g.grow(t, -1, ui, v)
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
		bt, bh, bv, bc := -1, 0, 0, math.Inf(1)
		for t := lo; t < len(g.types); t++ {
			if g.apart(&g.types[t].keys, &it.keys) {
				continue
			}
			if c, h, v, ok := g.best(&g.types[t], i, -1); ok && c < bc {
				bt, bh, bv, bc = t, h, v, c
			}
		}
		if bt >= 0 {
			g.turn(&g.types[bt], bh)
			g.addItem(&g.types[bt], i, bv)
			continue
		}
		box := make([]float64, 0, g.G*2*g.D)
		for v := range g.G {
			lo, hi := g.ibox(i, v)
			box = append(append(box, lo...), hi...)
		}
		g.types = append(g.types, typ{items: []int{i}, shifts: []int{0}, box: box,
			qlo: it.qlo, qhi: it.qhi, keys: it.keys, size: it.size, alive: true})
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
			if !tb.alive || g.apart(&ta.keys, &tb.keys) {
				continue
			}
			if _, h, v, ok := g.best(ta, -1, b); ok {
				g.turn(ta, h)
				g.addType(ta, b, v)
				tb.alive = false
				merged = true
			}
		}
	}
	return merged
}

// MaxEject is the most items an item may push out of a type while a
// type is being emptied.
const MaxEject = 3

// emptyPass tries, smallest type first, to move every item of a type into
// other types: each item into the type it grows least, or, if it fits
// none, into the type it fits after pushing out the fewest of its items
// (at most MaxEject), which must then fit other types. It reports
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
// its low end only falls as items join, so qlo0 (the low ends when the
// pass began) lies within [qhi − tol, qlo + tol]. (A type that pushed
// items out may have narrowed and be missed: a chance lost, no more.)
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
	it := &g.items[i]
	from, to := g.window(it.qlo, it.qhi, qlo0)
	bu, bv, bc := -1, 0, math.Inf(1)
	for _, u := range byKey[from:to] {
		if u == t || u == also || !g.types[u].alive || g.apart(&g.types[u].keys, &it.keys) {
			continue
		}
		a := g.at(g.types[u].box, 0)
		for v := range g.G {
			lo, hi := g.ibox(i, v)
			if c, fits := g.fit(a, lo, hi); fits && c < bc {
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

// eject puts item i into a type u (not t) where it fits after pushing out
// the fewest items (at most MaxEject, and not all), then places those
// items elsewhere (not in t or u). An item of u must go if it lies further
// than a tolerance from item i in some coordinate; the rest keep every
// range within its tolerance, since they already did among themselves.
// Only the ejectCandidates types (and variants) that item i overflows
// least, summed over the coordinates in tolerances, are searched.
func (g *grouper) eject(i, t int, byKey []int, qlo0 []float64) bool {
	it := &g.items[i]
	from, to := g.window(it.qlo, it.qhi, qlo0)
	// The ejectCandidates least overflowed (type, variant) pairs, in
	// order of overflow, ties in the order met.
	var top [ejectCandidates]cand
	n := 0
	for _, u := range byKey[from:to] {
		tu := &g.types[u]
		if u == t || !tu.alive || len(tu.items) < 2 {
			continue
		}
		// Pushing items out can narrow u's key ranges, so the filter keys
		// tell nothing here.
		a := g.at(tu.box, 0)
		for v := range g.G {
			lo, hi := g.ibox(i, v)
			over := 0.0
			for d, tol := range g.p.Tol {
				if r := max(a[g.D+d], hi[d]) - min(a[d], lo[d]); r > tol {
					over += (r - tol) / (tol + keySlack)
				}
			}
			k := n
			for k > 0 && over < top[k-1].over {
				k--
			}
			if k == ejectCandidates {
				continue
			}
			if n < ejectCandidates {
				n++
			}
			copy(top[k+1:n], top[k:n-1])
			top[k] = cand{u, v, over}
		}
	}
	bu, bv, bn := -1, 0, MaxEject+1
	var out, best []int
	for _, c := range top[:n] {
		tu := &g.types[c.u]
		xlo, xhi := g.ibox(i, c.v)
		out = out[:0]
		for k, j := range tu.items {
			ylo, yhi := g.ibox(j, g.p.Compose[tu.shifts[k]][tu.frame])
			for d, tol := range g.p.Tol {
				if ylo[d] < xhi[d]-tol || yhi[d] > xlo[d]+tol {
					out = append(out, k)
					break
				}
			}
			if len(out) >= bn {
				break
			}
		}
		if len(out) < bn && len(out) < len(tu.items) {
			bu, bv, bn, best = c.u, c.v, len(out), append(best[:0], out...)
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

// cand is a type u, read in variant v, that an item overflows by over.
type cand struct {
	u, v int
	over float64
}

// ejectCandidates is the number of types an item that fits none is tried
// in, pushing items out.
const ejectCandidates = 4

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
	for f := range t.keys {
		t.keys[f] = [2]float64{math.Inf(1), math.Inf(-1)}
	}
	for k, i := range t.items {
		it := &g.items[i]
		g.widen(&t.keys, &it.keys)
		g.grow(t, i, -1, g.p.Compose[t.shifts[k]][t.frame])
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
func (g *grouper) result() []Group {
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
	var out []Group
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
		pvs := make([]pv, 0, t.size)
		for k, i := range t.items {
			e := g.p.Compose[t.shifts[k]][frame]
			for _, p := range parts[start[i]:start[i+1]] {
				pvs = append(pvs, pv{p, g.p.Compose[g.itemVar[p]][e]})
			}
		}
		slices.SortFunc(pvs, func(a, b pv) int { return cmp.Compare(a.p, b.p) })
		tg := Group{Parts: make([]int, len(pvs)), Variants: make([]int, len(pvs))}
		for k, x := range pvs {
			tg.Parts[k], tg.Variants[k] = x.p, x.v
		}
		b := g.at(t.box, bestH)
		tg.Min, tg.Max = slices.Clone(b[:g.D]), slices.Clone(b[g.D:])
		out = append(out, tg)
	}
	slices.SortFunc(out, func(a, b Group) int {
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
