package nest

import (
	"cmp"
	"math"
	"slices"

	"pqfab/geom"
)

// The no-fit-polygon placer puts one part at a time on a sheet at the best
// position (see score) among the corners of the inner-fit rectangle, the
// corners of the no-fit polygons of the parts already placed and the
// crossings of their edges. Parts are nested by their true outlines: each
// outline is split into convex pieces (decompose.go), and a position is
// free when it lies strictly inside no no-fit polygon of a pair of pieces;
// the union of those no-fit polygons is the no-fit polygon of the two
// outlines, so a part may lie in the notch of another.

// touchTol is how far (mm) a candidate position may sit inside a no-fit
// polygon's edge and still count as touching, not overlapping: rounding
// noise of the Minkowski sums, far below any kerf.
const touchTol = 1e-7

// topBin: positions whose top edges lie in the same band of this fraction
// of the sheet height count as equally low; the leftmost wins.
const topBin = 0.05

// sameTurnDeg: free turns closer than this are tried once (nearly parallel
// edges of a panel give nearly the same turn).
const sameTurnDeg = 2.0

// nOrient is a part shape turned (and maybe mirrored) for the no-fit
// polygon placer, its origin at the shape's origin.
type nOrient struct {
	rot      float64
	mirrored bool
	grown    []geom.Polygon // convex pieces grown by half the spacing, each from its lowest corner
	negGrown []geom.Polygon // −grown, each from its lowest corner
	lo, hi   geom.Vec2      // bounds of the outline
	glo, ghi geom.Vec2      // bounds of the grown pieces
	garea    float64        // area of the grown pieces
}

// nTurns returns the turns (and mirror images) of a shape that stock s
// allows, with extra turns that let it fit the sheet.
func nTurns(sh *shape, s Stock, extra []float64) (angles []float64, mirrors []bool) {
	add := func(a float64) {
		a = normDeg(a)
		for _, b := range angles {
			if d := math.Abs(a - b); d < sameTurnDeg || d > 360-sameTurnDeg {
				return
			}
		}
		angles = append(angles, a)
	}
	if s.Rotation == Free {
		for _, e := range edgesOf(sh.hull) {
			for _, q := range []float64{0, 90, 180, 270} {
				add(q - e.deg)
			}
		}
		angles = append(angles, extra...)
	} else {
		angles = fixedTurns[s.Rotation]
	}
	mirrors = []bool{false}
	if s.Mirror {
		mirrors = append(mirrors, true)
	}
	return angles, mirrors
}

// nOrientations returns the turns (and mirror images) of a shape that
// stock s allows (nTurns), with the grown pieces the placer needs.
func nOrientations(sh *shape, s Stock, extra []float64) []nOrient {
	angles, mirrors := nTurns(sh, s, extra)
	out := make([]nOrient, 0, len(mirrors)*len(angles))
	for _, m := range mirrors {
		for _, a := range angles {
			o := nOrient{rot: a, mirrored: m}
			o.lo, o.hi = orient(sh.poly, m, a, geom.Vec2{}).Bounds()
			o.grown = make([]geom.Polygon, 0, len(sh.pieces))
			o.negGrown = make([]geom.Polygon, 0, len(sh.pieces))
			for _, piece := range sh.pieces {
				g := startLowest(inflate(orient(piece, m, a, geom.Vec2{}), s.SpacingMM/2))
				neg := make(geom.Polygon, len(g))
				for i, v := range g {
					neg[i] = v.Scale(-1)
				}
				o.grown = append(o.grown, g)
				o.negGrown = append(o.negGrown, startLowest(neg))
			}
			o.glo, o.ghi = o.lo, o.hi
			for _, g := range o.grown {
				o.garea += g.Area()
				lo, hi := g.Bounds()
				o.glo = geom.Vec2{X: min(o.glo.X, lo.X), Y: min(o.glo.Y, lo.Y)}
				o.ghi = geom.Vec2{X: max(o.ghi.X, hi.X), Y: max(o.ghi.Y, hi.Y)}
			}
			out = append(out, o)
		}
	}
	return out
}

// sheetState is a sheet being filled by the no-fit polygon placer.
//
// The placer's work for one part does not grow with the parts on the
// sheet: the best position lies in the lowest band (see score) that has
// room, so the placer looks at one band at a time, from the lowest that
// may still have room for the orientation, and works out the no-fit
// polygons of the parts near that band only, found through an index of
// the placed parts by rows of the sheet. Placed parts only take room, so
// where an orientation found no room it will find none later: each band
// keeps where orientations found none (noRoomRecord) and the placer skips
// that part of the band.
type sheetState struct {
	stock    Stock
	grown    []geom.Polygon // grown convex pieces of the parts placed
	glo, ghi []geom.Vec2
	rows     [][]int32 // per row of the sheet (bandHeight high): the grown pieces that reach into it
	placed   []nPlaced
	area     float64
	// scratch space reused between calls of place
	nfps     []geom.Polygon
	nlo, nhi []geom.Vec2
	cands    []geom.Vec2
	bufBase  geom.Polygon // backing store for the no-fit polygons of one call
	buf      geom.Polygon // its unused tail
	seen     []int        // per grown piece: the last call of place that worked out its no-fit polygons
	call     int
	cnfps    []geom.Polygon // the no-fit polygons of this call of place
	clo, chi []geom.Vec2
	records  [][]noRoomRecord // per band: where orientations found no room
	near     []int            // grown pieces near the band searched
	byX      []int            // no-fit polygons by their least x
	pairs    []nfpPair
	froms    []float64 // per band searched: the least right edge with room
	edges    []int     // edges of one no-fit polygon
	cellOf   []int32   // the no-fit polygons of each cell of the band, cell by cell
	cellAt   []int32   // where each cell's run starts in cellOf
	cellLo   float64
	cellW    float64
}

// nPlaced is a part shape placed by the no-fit polygon placer.
type nPlaced struct {
	shape int
	o     *nOrient
	t     geom.Vec2
}

// stripPadMM: the placer takes the parts whose no-fit polygons come
// within this of a band (mm); more than enough for rounding, and taking
// too many changes nothing but the work.
const stripPadMM = 1.0

// newSheetState returns an empty sheet of stock s.
func newSheetState(s Stock) *sheetState {
	st := &sheetState{stock: s}
	st.rows = make([][]int32, int(math.Ceil(1/topBin))+1)
	return st
}

// bandHeight returns the height of a band (and of a row of the index).
func (st *sheetState) bandHeight() float64 { return st.stock.HeightMM * topBin }

// row returns the row of the index that height y lies in.
func (st *sheetState) row(y float64) int {
	return min(max(int(math.Floor(y/st.bandHeight())), 0), len(st.rows)-1)
}

// place finds the best position (see score) for orientation o on the
// sheet over the corners of the inner-fit rectangle, the no-fit polygons'
// corners and their crossings with each other and with the rectangle.
// Positions that do not beat bound (when given) are not considered.
func (st *sheetState) place(o *nOrient, bound *score) (geom.Vec2, score, bool) {
	s := st.stock
	// Inner-fit rectangle of the reference point; a part that fits only
	// within the slack lies in its middle.
	x0, x1, okx := span(s.MarginMM-o.lo.X, s.WidthMM-s.MarginMM-o.hi.X)
	y0, y1, oky := span(s.MarginMM-o.lo.Y, s.HeightMM-s.MarginMM-o.hi.Y)
	if !okx || !oky {
		return geom.Vec2{}, score{}, false
	}
	ilo, ihi := geom.Vec2{X: x0, Y: y0}, geom.Vec2{X: x1, Y: y1}
	if bound != nil && bound.less(st.score(o, ilo)) && st.band(o, ilo.Y) > bound.band {
		return geom.Vec2{}, score{}, false // nothing here can beat the bound
	}
	first, last := st.band(o, ilo.Y), st.band(o, ihi.Y)
	// The no-fit polygons of this call, worked out band by band as the
	// bands reach their parts.
	st.call++
	if len(st.seen) < len(st.grown) {
		st.seen = append(st.seen, make([]int, len(st.grown)-len(st.seen))...)
	}
	st.cnfps, st.clo, st.chi = st.cnfps[:0], st.clo[:0], st.chi[:0]
	st.buf = st.bufBase[:0]
	defer func() {
		if used := st.bufUsed(); used > cap(st.bufBase) {
			st.bufBase = make(geom.Polygon, 0, 2*used)
		}
	}()
	sz := sizeOf(o)
	// With few parts on the sheet all bands are searched at once.
	step := 1.0
	if len(st.grown) <= wholeSheetPieces {
		step = last - first + 1
	}
	for k0 := first; k0 <= last; k0 += step {
		if bound != nil && k0 > bound.band {
			break
		}
		k1 := min(k0+step-1, last)
		if bound != nil {
			k1 = min(k1, bound.band)
		}
		froms, open := st.froms[:0], false
		for k := k0; k <= k1; k++ {
			f := st.roomFrom(sz, k)
			froms = append(froms, f)
			open = open || !math.IsInf(f, 1)
		}
		st.froms = froms
		if !open {
			continue
		}
		c, sc, ok := st.placeIn(o, k0, k1, ilo, ihi, bound, froms)
		top := k1
		if ok {
			top = sc.band
		}
		for k := k0; k <= top; k++ {
			switch {
			case math.IsInf(froms[int(k-k0)], 1):
			case ok && k == sc.band:
				st.noRoom(sz, k, sc.right)
			case bound == nil || k < bound.band:
				// Below the bound's band the bound cut nothing: the band
				// is full.
				st.noRoom(sz, k, math.Inf(1))
			case k == bound.band:
				st.noRoom(sz, k, bound.right)
			}
		}
		if ok {
			return c, sc, true
		}
	}
	return geom.Vec2{}, score{}, false
}

// wholeSheetPieces: up to this many grown pieces on a sheet, the placer
// searches all bands at once (their no-fit polygons are few).
const wholeSheetPieces = 64

// bufUsed returns how many corners the no-fit polygons of the last call
// took.
func (st *sheetState) bufUsed() int {
	n := 0
	for _, f := range st.cnfps {
		n += len(f)
	}
	return n
}

// orientSize is the size of an orientation (its grown box and area) with
// its turn and mirror.
type orientSize struct {
	w, h, area float64
	deg        float64
	mirrored   bool
}

// sizeOf returns the size of orientation o.
func sizeOf(o *nOrient) orientSize {
	return orientSize{o.ghi.X - o.glo.X, o.ghi.Y - o.glo.Y, o.garea, o.rot, o.mirrored}
}

// atLeast reports whether size a is at least size b, less sameSizeShare
// of each, in nearly the same turn (closer than sameTurnDeg) and mirror.
func (a orientSize) atLeast(b orientSize) bool {
	const f = 1 - sameSizeShare
	d := math.Abs(a.deg - b.deg)
	return a.mirrored == b.mirrored && (d < sameTurnDeg || d > 360-sameTurnDeg) &&
		a.w >= f*b.w && a.h >= f*b.h && a.area >= f*b.area
}

// noRoomRecord says that an orientation of the given size found no room
// in a band with its right edge left of right (+Inf: none in the band).
type noRoomRecord struct {
	size  orientSize
	right float64
}

// sameSizeShare: an orientation is taken to find no room in a band where
// one at least as wide, as high and as large, less this share of each,
// found none. For an orientation itself this is exact (placed parts only
// take room); across shapes it is a heuristic, like dominated, that
// spares searching the full part of the sheet again for every new shape
// when the parts are many, alike but not quite the same (the triangles
// of a shallow dome differ by a few per cent). Measured on the
// convex-bins, glass, wave and triangle benchmarks: no sheet more than
// with no sharing at all, and 20 times faster on the triangles.
const sameSizeShare = 0.03

// maxRecords bounds the no-room records a band keeps (the newest).
const maxRecords = 32

// roomFrom returns the least right edge a part of size sz may have in
// band k by the no-room records (+Inf when the band is full for it).
func (st *sheetState) roomFrom(sz orientSize, k float64) float64 {
	b := int(k)
	from := math.Inf(-1)
	if b < 0 || b >= len(st.records) {
		return from
	}
	for _, r := range st.records[b] {
		if sz.atLeast(r.size) {
			from = max(from, r.right)
		}
	}
	return from
}

// noRoom records that an orientation of size sz found no room in band k
// with its right edge left of right; it drops the records the new one
// makes needless (no smaller and no farther right).
func (st *sheetState) noRoom(sz orientSize, k, right float64) {
	b := int(k)
	if b < 0 {
		return
	}
	for len(st.records) <= b {
		st.records = append(st.records, nil)
	}
	rs := slices.DeleteFunc(st.records[b], func(r noRoomRecord) bool {
		return r.size.deg == sz.deg && r.size.mirrored == sz.mirrored &&
			r.size.w >= sz.w && r.size.h >= sz.h && r.size.area >= sz.area && r.right <= right
	})
	if len(rs) == maxRecords {
		rs = slices.Delete(rs, 0, 1)
	}
	st.records[b] = append(rs, noRoomRecord{sz, right})
}

// placeIn is place within bands k0 to k1, for positions whose right
// edge is at least froms[k-k0] in band k.
func (st *sheetState) placeIn(o *nOrient, k0, k1 float64, ilo, ihi geom.Vec2, bound *score, froms []float64) (geom.Vec2, score, bool) {
	cx := slices.Min(froms) - o.hi.X // least x of the reference point
	hb := st.bandHeight()
	ya := max(ilo.Y, (k0-1)*hb-o.hi.Y) - stripPadMM
	yb := min(ihi.Y, k1*hb-o.hi.Y) + stripPadMM
	// The no-fit polygons of the placed pieces that can reach the band
	// and were not worked out in an earlier band of this call.
	near := st.near[:0]
	for r := st.row(ya + o.glo.Y); r <= st.row(yb+o.ghi.Y); r++ {
		for _, g := range st.rows[r] {
			if st.seen[g] == st.call {
				continue
			}
			if st.ghi[g].Y >= ya+o.glo.Y && st.glo[g].Y <= yb+o.ghi.Y {
				st.seen[g] = st.call
				near = append(near, int(g))
			}
		}
	}
	slices.Sort(near)
	st.near = near
	for _, gi := range near {
		g := st.grown[gi]
		for _, n := range o.negGrown {
			f := minkowskiSorted(g, n, st.buf)
			st.buf = f[len(f):]
			lo, hi := f.Bounds()
			if lo.X > ihi.X || hi.X < ilo.X || lo.Y > ihi.Y || hi.Y < ilo.Y {
				continue // wholly off the inner-fit rectangle
			}
			st.cnfps, st.clo, st.chi = append(st.cnfps, f), append(st.clo, lo), append(st.chi, hi)
		}
	}
	nfps, nlo, nhi := st.nfps[:0], st.nlo[:0], st.nhi[:0]
	for i, f := range st.cnfps {
		if lo, hi := st.clo[i], st.chi[i]; lo.Y <= yb && hi.Y >= ya && hi.X >= cx {
			nfps, nlo, nhi = append(nfps, f), append(nlo, lo), append(nhi, hi)
		}
	}
	st.nfps, st.nlo, st.nhi = nfps, nlo, nhi
	st.index(ilo, ihi)
	// First the corners of the rectangle and of the no-fit polygons, and
	// where the no-fit polygons cross the rectangle.
	cands := append(st.cands[:0], ilo, geom.Vec2{X: ihi.X, Y: ilo.Y}, geom.Vec2{X: ilo.X, Y: ihi.Y}, ihi)
	rect := geom.Polygon{ilo, {X: ihi.X, Y: ilo.Y}, ihi, {X: ilo.X, Y: ihi.Y}}
	for _, f := range nfps {
		cands = append(cands, f...)
		for i := range f {
			for j := range rect {
				cands = lineHits(cands, f[i], f[(i+1)%len(f)], rect[j], rect[(j+1)%4])
			}
		}
	}
	best, bestScore, found := st.firstFree(o, k0, froms, cands, ilo, ihi, bound)
	if found {
		bound = &bestScore
	}
	// Then the crossings of pairs of no-fit polygons, best first: a sweep
	// along x finds the pairs whose boxes overlap, and they are taken in
	// the order of the best score their overlap allows, until that can no
	// longer beat the best so far.
	byX := st.byX[:0]
	for i := range nfps {
		byX = append(byX, i)
	}
	slices.SortStableFunc(byX, func(a, b int) int { return cmp.Compare(nlo[a].X, nlo[b].X) })
	st.byX = byX
	pairs := st.pairs[:0]
	for ai, a := range byX {
		for _, b := range byX[ai+1:] {
			if nlo[b].X > nhi[a].X {
				break
			}
			kk, l := min(a, b), max(a, b)
			lox, loy := max(nlo[kk].X, nlo[l].X), max(nlo[kk].Y, nlo[l].Y)
			hix, hiy := min(nhi[kk].X, nhi[l].X), min(nhi[kk].Y, nhi[l].Y)
			if lox > hix || loy > hiy || lox > ihi.X || hix < ilo.X || loy > ihi.Y || hiy < ilo.Y || loy > yb || hiy < ya || hix < cx {
				continue
			}
			y, x := max(loy, ilo.Y), max(lox, ilo.X)
			lb := score{band: st.band(o, y), right: x + o.hi.X, top: y + o.hi.Y}
			if bound != nil && !lb.less(*bound) {
				continue
			}
			pairs = append(pairs, nfpPair{kk, l, lb})
		}
	}
	// A heap of the pairs: only those taken are put in order.
	for i := len(pairs)/2 - 1; i >= 0; i-- {
		siftDown(pairs, i)
	}
	st.pairs = pairs
	for len(pairs) > 0 {
		pr := pairs[0]
		last := len(pairs) - 1
		pairs[0] = pairs[last]
		pairs = pairs[:last]
		siftDown(pairs, 0)
		if found && !pr.lb.less(bestScore) {
			break
		}
		kk, l := pr.k, pr.l
		lox, loy := max(nlo[kk].X, nlo[l].X), max(nlo[kk].Y, nlo[l].Y)
		hix, hiy := min(nhi[kk].X, nhi[l].X), min(nhi[kk].Y, nhi[l].Y)
		// Only edges that reach into the overlap of the two boxes can
		// cross there.
		cands = cands[:0]
		f, g := nfps[kk], nfps[l]
		ge := st.edges[:0]
		for m := range g {
			a, b := g[m], g[(m+1)%len(g)]
			if max(a.X, b.X) >= lox && min(a.X, b.X) <= hix && max(a.Y, b.Y) >= loy && min(a.Y, b.Y) <= hiy {
				ge = append(ge, m)
			}
		}
		st.edges = ge
		for i := range f {
			p, q := f[i], f[(i+1)%len(f)]
			if max(p.X, q.X) < lox || min(p.X, q.X) > hix || max(p.Y, q.Y) < loy || min(p.Y, q.Y) > hiy {
				continue
			}
			for _, m := range ge {
				cands = lineHits(cands, p, q, g[m], g[(m+1)%len(g)])
			}
		}
		if found {
			bound = &bestScore
		}
		if c, sc, ok := st.firstFree(o, k0, froms, cands, ilo, ihi, bound); ok {
			best, bestScore, found = c, sc, true
		}
	}
	st.cands = cands
	return best, bestScore, found
}

// before orders pairs by their best score, then by their polygons.
func (a nfpPair) before(b nfpPair) bool {
	if a.lb.less(b.lb) || b.lb.less(a.lb) {
		return a.lb.less(b.lb)
	}
	return a.k < b.k || (a.k == b.k && a.l < b.l)
}

// siftDown moves h[i] down the heap h (ordered by before) to its place.
func siftDown(h []nfpPair, i int) {
	for {
		m := i
		if l := 2*i + 1; l < len(h) && h[l].before(h[m]) {
			m = l
		}
		if r := 2*i + 2; r < len(h) && h[r].before(h[m]) {
			m = r
		}
		if m == i {
			return
		}
		h[i], h[m] = h[m], h[i]
		i = m
	}
}

// nfpPair is a pair of no-fit polygons (k < l) whose boxes overlap, with
// the best score a position in the overlap could have.
type nfpPair struct {
	k, l int
	lb   score
}

// index sorts the no-fit polygons of a band into cells along x of the
// inner-fit rectangle from ilo to ihi, each polygon into every cell its
// box reaches, so that a position is checked against those of its cell
// only.
func (st *sheetState) index(ilo, ihi geom.Vec2) {
	n := max(1, min(len(st.nfps), maxCells))
	st.cellLo = ilo.X
	st.cellW = (ihi.X - ilo.X) / float64(n)
	at := slices.Grow(st.cellAt[:0], n+1)[:n+1]
	clear(at)
	st.cellAt = at
	for k := range st.nfps {
		for c := st.cell(st.nlo[k].X); c <= st.cell(st.nhi[k].X); c++ {
			at[c+1]++
		}
	}
	for c := 1; c <= n; c++ {
		at[c] += at[c-1]
	}
	of := slices.Grow(st.cellOf[:0], int(at[n]))[:at[n]]
	fill := slices.Clone(at[:n]) // next free slot of each cell
	for k := range st.nfps {
		for c := st.cell(st.nlo[k].X); c <= st.cell(st.nhi[k].X); c++ {
			of[fill[c]] = int32(k)
			fill[c]++
		}
	}
	st.cellOf = of
}

// maxCells bounds the cells of the index of a band's no-fit polygons.
const maxCells = 1024

// cell returns the cell of the band's index that x lies in.
func (st *sheetState) cell(x float64) int {
	n := len(st.cellAt) - 1
	if st.cellW <= 0 {
		return 0
	}
	return min(max(int(math.Floor((x-st.cellLo)/st.cellW)), 0), n-1)
}

// firstFree returns the best candidate position in bands k0 to
// k0+len(froms)-1, its right edge at least froms[k-k0] in band k, that
// lies in
// the inner-fit rectangle, overlaps no part and beats bound. Each
// candidate is checked against the parts only when it would beat the
// best so far.
func (st *sheetState) firstFree(o *nOrient, k0 float64, froms []float64, cands []geom.Vec2, ilo, ihi geom.Vec2, bound *score) (geom.Vec2, score, bool) {
	var best geom.Vec2
	var bestScore score
	found := false
	if bound != nil {
		bestScore = *bound
	}
	for _, c := range cands {
		if c.X < ilo.X-touchTol || c.X > ihi.X+touchTol || c.Y < ilo.Y-touchTol || c.Y > ihi.Y+touchTol {
			continue
		}
		c = geom.Vec2{X: min(max(c.X, ilo.X), ihi.X), Y: min(max(c.Y, ilo.Y), ihi.Y)}
		sc := st.score(o, c)
		if b := int(sc.band - k0); b < 0 || b >= len(froms) || sc.right < froms[b] || ((found || bound != nil) && !sc.less(bestScore)) {
			continue
		}
		ok := true
		cl := st.cell(c.X)
		for _, f := range st.cellOf[st.cellAt[cl]:st.cellAt[cl+1]] {
			if strictlyInside(st.nfps[f], st.nlo[f], st.nhi[f], c, touchTol) {
				ok = false
				break
			}
		}
		if ok {
			best, bestScore, found = c, sc, true
		}
	}
	return best, bestScore, found
}

// score ranks positions bottom-left: the lowest band of the top edge
// (bands of topBin of the sheet height), then the leftmost right edge,
// then the lowest top edge. Banding lets a part sit beside its neighbour
// in a row rather than a few millimetres lower in a worse turn.
type score struct{ band, right, top float64 }

func (a score) less(b score) bool {
	if a.band != b.band {
		return a.band < b.band
	}
	if a.right != b.right {
		return a.right < b.right
	}
	return a.top < b.top
}

func (st *sheetState) score(o *nOrient, c geom.Vec2) score {
	top, right := c.Y+o.hi.Y, c.X+o.hi.X
	return score{band: st.band(o, c.Y), right: right, top: top}
}

// band returns the band of the top edge of part o placed at height y.
func (st *sheetState) band(o *nOrient, y float64) float64 {
	return math.Ceil((y + o.hi.Y) / (st.stock.HeightMM * topBin))
}

// add puts shape si in orientation o at t on the sheet.
func (st *sheetState) add(si int, o *nOrient, t geom.Vec2, area float64) {
	for _, g := range o.grown {
		g = g.Translate(t) // still starts at its lowest corner
		lo, hi := g.Bounds()
		for r := st.row(lo.Y); r <= st.row(hi.Y); r++ {
			st.rows[r] = append(st.rows[r], int32(len(st.grown)))
		}
		st.grown = append(st.grown, g)
		st.glo, st.ghi = append(st.glo, lo), append(st.ghi, hi)
	}
	st.placed = append(st.placed, nPlaced{shape: si, o: o, t: t})
	st.area += area
}
