package nest

import (
	"encoding/binary"
	"hash/fnv"
	"math"
	"slices"

	"pqfab/geom"
)

// The free-piece packer builds layouts whose parts are all released by
// edge-to-edge cuts: it puts one part at a time into a convex piece of
// the sheet, flush with the piece's edges, and cuts it free along its own
// edges; each cut runs across the whole piece it splits and leaves convex
// pieces for the next parts. This is the one-stage approach of Han,
// Bennell, Zhao and Song, "Construction heuristics for two-dimensional
// irregular shape bin packing with guillotine constraints", European
// Journal of Operational Research 230(3), 2013, with our own scores and
// search (see sheetsearch.go).

// gOrient is a part shape's hull turned (and maybe mirrored), with the
// shape's origin at the origin.
type gOrient struct {
	deg    float64
	mirror bool
	poly   geom.Polygon
	e      []edge
	lo, hi geom.Vec2
}

type orientKey struct {
	deg    float64
	mirror bool
}

// gMove puts a part of a shape into a free piece: the shape's hull turned
// by o, its origin at t.
type gMove struct {
	shape int
	o     *gOrient
	t     geom.Vec2
	score float64
}

// gWeights weigh the terms of a move's score.
type gWeights struct {
	fit  float64 // share of the part's perimeter on the piece's edges
	fill float64 // part area / piece area
	size float64 // part area / usable sheet area
}

// gPacker places the parts of the shapes on sheets of one stock.
type gPacker struct {
	stock        Stock
	shapes       []*shape
	left         []int // parts of each shape still to place
	w            gWeights
	usable       float64
	orients      []map[orientKey]*gOrient
	hullE        [][2][]edge       // per shape, edges of the hull (plain, mirrored)
	edgeTurns    [][2][][]*gOrient // per shape, mirror and hull edge: the orientations used
	extra        [][]float64       // per shape, extra turns that let it fit the empty sheet
	mirrors      []bool
	convex       bool // only convex shapes may be placed (edge-to-edge cuts)
	fit          fitter
	cache        map[uint64][]movesEntry
	hits, misses int
}

// movesEntry is the moves into a piece of a given usable area, kept
// because the same piece comes up again in other branches of the search
// and on every new sheet.
type movesEntry struct {
	use   geom.Polygon
	moves []gMove
}

// maxCached bounds the pieces whose moves are kept.
const maxCached = 1 << 16

// cachedMoves is movesInto, looked up first among pieces of the same
// usable area met before. A move's score does not depend on the parts
// left, so the moves stay valid; moves of shapes used up are skipped
// where they are read.
func (g *gPacker) cachedMoves(pc *freePiece) []gMove {
	h := fnv.New64a()
	var b [8]byte
	for _, v := range pc.use {
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v.X))
		h.Write(b[:])
		binary.LittleEndian.PutUint64(b[:], math.Float64bits(v.Y))
		h.Write(b[:])
	}
	key := h.Sum64()
	for _, e := range g.cache[key] {
		if slices.Equal(e.use, pc.use) {
			g.hits++
			return e.moves
		}
	}
	g.misses++
	m := g.movesInto(pc)
	if len(g.cache) >= maxCached {
		clear(g.cache)
	}
	g.cache[key] = append(g.cache[key], movesEntry{slices.Clone(pc.use), m})
	return m
}

func newGPacker(st Stock, shapes []*shape, w gWeights, convexOnly bool) *gPacker {
	g := &gPacker{stock: st, shapes: shapes, w: w, convex: convexOnly,
		usable: (st.WidthMM - 2*st.MarginMM) * (st.HeightMM - 2*st.MarginMM)}
	g.left = make([]int, len(shapes))
	g.cache = map[uint64][]movesEntry{}
	g.orients = make([]map[orientKey]*gOrient, len(shapes))
	g.hullE = make([][2][]edge, len(shapes))
	g.edgeTurns = make([][2][][]*gOrient, len(shapes))
	g.extra = make([][]float64, len(shapes))
	g.mirrors = []bool{false}
	if st.Mirror {
		g.mirrors = append(g.mirrors, true)
	}
	for i, s := range shapes {
		g.left[i] = len(s.parts)
		g.orients[i] = map[orientKey]*gOrient{}
		for mi, m := range []bool{false, true} {
			h := s.hull
			if m {
				h = orient(h, true, 0, geom.Vec2{})
			}
			g.hullE[i][mi] = edgesOf(h)
			g.edgeTurns[i][mi] = make([][]*gOrient, len(g.hullE[i][mi]))
		}
	}
	return g
}

// orientation returns shape si's hull turned by deg (cached).
func (g *gPacker) orientation(si int, deg float64, mirror bool) *gOrient {
	k := orientKey{deg, mirror}
	if o, ok := g.orients[si][k]; ok {
		return o
	}
	p := orient(g.shapes[si].hull, mirror, deg, geom.Vec2{})
	lo, hi := p.Bounds()
	o := &gOrient{deg: deg, mirror: mirror, poly: p, e: edgesOf(p), lo: lo, hi: hi}
	g.orients[si][k] = o
	return o
}

// edgeOrientation is orientation for a turn that lays hull edge i of
// shape si along a piece's edge, looked up first among the few turns
// that edge has taken before.
func (g *gPacker) edgeOrientation(si, mi, i int, deg float64) *gOrient {
	c := &g.edgeTurns[si][mi][i]
	for _, o := range *c {
		if o.deg == deg {
			return o
		}
	}
	o := g.orientation(si, deg, mi == 1)
	*c = append(*c, o)
	return o
}

// angleRes: free turns are rounded to this many degrees, so that equal
// turns found from different edges are one turn.
const angleRes = 1e-10

// normDeg rounds a turn to angleRes and brings it into [0, 360).
func normDeg(a float64) float64 {
	a = math.Mod(a, 360)
	if a < 0 {
		a += 360
	}
	a = math.Round(a/angleRes) * angleRes
	if a >= 360 {
		a -= 360
	}
	return a
}

// movesInto returns the best move of every shape with parts left into
// piece pc, best first.
func (g *gPacker) movesInto(pc *freePiece) []gMove {
	var out []gMove
	for si := range g.shapes {
		if g.left[si] == 0 {
			continue
		}
		if m, ok := g.bestMove(pc, si); ok {
			out = append(out, m)
		}
	}
	slices.SortStableFunc(out, func(a, b gMove) int {
		if a.score != b.score {
			if a.score > b.score {
				return -1
			}
			return 1
		}
		return a.shape - b.shape
	})
	return out
}

func (g *gPacker) bestMove(pc *freePiece, si int) (gMove, bool) {
	sh := g.shapes[si]
	var best gMove
	found := false
	if sh.area > pc.area*(1+1e-9) || (g.convex && !sh.convex) {
		return best, false
	}
	consider := func(o *gOrient, t geom.Vec2) {
		fit := contact(o.e, t, pc.ue, contactTolMM) / sh.hullPerim
		sc := g.w.fit*fit + g.w.fill*sh.area/pc.area + g.w.size*sh.area/g.usable
		if !found || sc > best.score || (sc == best.score && lowerLeft(t.Add(o.lo), best.t.Add(best.o.lo))) {
			best, found = gMove{shape: si, o: o, t: t, score: sc}, true
		}
	}
	for mi, m := range g.mirrors {
		if g.stock.Rotation != Free {
			for _, a := range fixedTurns[g.stock.Rotation] {
				o := g.orientation(si, a, m)
				for _, t := range positions(&g.fit, o, pc) {
					consider(o, t)
				}
			}
			continue
		}
		// Each hull edge laid along each edge of the piece that can hold
		// it (no shorter than the edge, and as high over it as the part),
		// at both ends of where it can slide along that edge.
		for i, e := range g.hullE[si][mi] {
			for j := range pc.ue {
				f := &pc.ue[j]
				if e.l > f.l+2*fitSlackMM || e.h > f.h+2*fitSlackMM {
					continue
				}
				o := g.edgeOrientation(si, mi, i, normDeg(f.deg-e.deg))
				if t0, t1, ok := flush(o, i, pc, j); ok {
					consider(o, t0)
					if t1 != t0 {
						consider(o, t1)
					}
				}
			}
		}
		for _, a := range g.extra[si] {
			o := g.orientation(si, a, m)
			for _, t := range positions(&g.fit, o, pc) {
				consider(o, t)
			}
		}
	}
	return best, found
}

// fixedTurns are the turns of the stocks that allow only some.
var fixedTurns = map[Rotation][]float64{Grain: {0, 180}, Quarter: {0, 90, 180, 270}}

// flush returns the two ends of the stretch along which edge i of o can
// slide on edge j of the piece's usable area with o inside it. When o
// fits only within fitSlackMM, both ends are the middle of that slack.
func flush(o *gOrient, i int, pc *freePiece, j int) (geom.Vec2, geom.Vec2, bool) {
	f := &pc.ue[j]
	t0 := f.a.Sub(o.e[i].a)
	s0, s1, ok := flushSpan(o, pc, j, t0, 0)
	if !ok {
		if s0, s1, ok = flushSpan(o, pc, j, t0, fitSlackMM); !ok {
			return t0, t0, false
		}
		s0 = (s0 + s1) / 2
		s1 = s0
	}
	return t0.Add(f.d.Scale(s0)), t0.Add(f.d.Scale(s1)), true
}

// parallelCos: edges whose normals' dot product with the sliding
// direction is below this are taken as parallel to it.
const parallelCos = 1e-12

func flushSpan(o *gOrient, pc *freePiece, j int, t0 geom.Vec2, slack float64) (float64, float64, bool) {
	f := &pc.ue[j]
	lo, hi := math.Inf(-1), math.Inf(1)
	for k := range pc.ue {
		if k == j {
			continue
		}
		u := &pc.ue[k]
		lowest := math.Inf(1)
		for _, v := range o.poly {
			if d := u.n.X*v.X + u.n.Y*v.Y; d < lowest {
				lowest = d
			}
		}
		// u.n·(t0 + s f.d) ≥ u.n·u.a − lowest − slack
		r := u.n.Dot(u.a) - lowest - slack - u.n.Dot(t0)
		q := u.n.Dot(f.d)
		switch {
		case q > parallelCos:
			if r/q > lo {
				lo = r / q
			}
		case q < -parallelCos:
			if r/q < hi {
				hi = r / q
			}
		case r > 0:
			return 0, 0, false
		}
		if lo > hi {
			return lo, hi, false
		}
	}
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return lo, hi, false
	}
	return lo, hi, true
}

// lowerLeft reports whether a is lower than b, or as low and further left.
func lowerLeft(a, b geom.Vec2) bool {
	return a.Y < b.Y || (a.Y == b.Y && a.X < b.X)
}

// positions returns the corners of the region of positions at which o
// lies in the piece's usable area: where it touches two of its edges.
func positions(fit *fitter, o *gOrient, pc *freePiece) []geom.Vec2 {
	lo := pc.lo.Sub(o.lo)
	hi := pc.hi.Sub(o.hi)
	if pc.rect {
		x0, x1, okx := span(lo.X, hi.X)
		y0, y1, oky := span(lo.Y, hi.Y)
		if !okx || !oky {
			return nil
		}
		out := []geom.Vec2{{X: x0, Y: y0}}
		if x1 != x0 {
			out = append(out, geom.Vec2{X: x1, Y: y0})
		}
		if y1 != y0 {
			out = append(out, geom.Vec2{X: x0, Y: y1})
			if x1 != x0 {
				out = append(out, geom.Vec2{X: x1, Y: y1})
			}
		}
		return out
	}
	if lo.X > hi.X+2*fitSlackMM || lo.Y > hi.Y+2*fitSlackMM {
		return nil
	}
	return fit.innerFit(o.poly, o.lo, o.hi, pc.ue, pc.lo, pc.hi)
}

// span returns the interval [lo, hi], or its middle when it is empty by
// no more than twice fitSlackMM.
func span(lo, hi float64) (float64, float64, bool) {
	switch {
	case lo <= hi:
		return lo, hi, true
	case lo-hi <= 2*fitSlackMM:
		m := (lo + hi) / 2
		return m, m, true
	}
	return 0, 0, false
}

// gPlaced is a part shape placed by the free-piece packer.
type gPlaced struct {
	shape int
	o     *gOrient
	t     geom.Vec2
}

// gState is a sheet being filled: its free pieces, the parts placed and
// the cuts made so far. States are values: a child shares nothing that
// it changes with its parent.
type gState struct {
	pieces []freePiece
	placed []gPlaced
	cuts   []Cut
	area   float64

	// Filled in by the search when it expands the state.
	expanded bool
	room     float64 // area of the free pieces some part fits
	kids     []gKid
}

func (g *gPacker) emptySheet() *gState {
	s := g.stock
	sheet := geom.Polygon{{X: 0, Y: 0}, {X: s.WidthMM, Y: 0}, {X: s.WidthMM, Y: s.HeightMM}, {X: 0, Y: s.HeightMM}}
	m := s.MarginMM
	use := geom.Polygon{{X: m, Y: m}, {X: s.WidthMM - m, Y: m}, {X: s.WidthMM - m, Y: s.HeightMM - m}, {X: m, Y: s.HeightMM - m}}
	pc := newFreePiece(0, sheet, use)
	pc.moves = g.cachedMoves(&pc)
	return &gState{pieces: []freePiece{pc}}
}

// needCuts returns the edges of the part placed by m that are not on the
// piece's edge: each needs a cut.
func needCuts(pc *freePiece, m gMove) []int {
	var need []int
	for i, e := range m.o.e {
		a := e.a.Add(m.t)
		if !onBoundary(pc.se, a, a.Add(e.d.Scale(e.l)), 2*fitSlackMM) {
			need = append(need, i)
		}
	}
	return need
}

// cutPlan is an order of the cuts that free a placed part, with the
// area it leaves in pieces too small for any part (waste) and a score
// that prefers large free pieces (the sum of the squares of their usable
// areas).
type cutPlan struct {
	order []int
	waste float64
	score float64
}

// cutOrders returns up to max orders of the needed cuts, least waste
// first, then largest free pieces.
func (g *gPacker) cutOrders(pc *freePiece, m gMove, need []int, minArea float64, max int) []cutPlan {
	var plans []cutPlan
	permute(need, func(order []int) {
		use := pc.use
		var p cutPlan
		for _, i := range order {
			e := m.o.e[i]
			a := e.a.Add(m.t)
			far := clipHalf(use, e.n.Scale(-1), -e.n.Dot(a)+g.stock.SpacingMM)
			if far != nil {
				if ar := far.Area(); ar >= minArea {
					p.score += ar * ar
				} else {
					p.waste += ar
				}
			}
			if use = clipHalf(use, e.n, e.n.Dot(a)); use == nil {
				break
			}
		}
		p.order = slices.Clone(order)
		plans = append(plans, p)
	})
	slices.SortStableFunc(plans, func(a, b cutPlan) int {
		switch {
		case a.waste < b.waste:
			return -1
		case a.waste > b.waste:
			return 1
		case a.score > b.score:
			return -1
		case a.score < b.score:
			return 1
		}
		return 0
	})
	if len(plans) > max {
		plans = plans[:max]
	}
	return plans
}

// permute calls f with every order of a (Heap's algorithm); f must not
// keep its argument.
func permute(a []int, f func([]int)) {
	b := slices.Clone(a)
	var gen func(k int)
	gen = func(k int) {
		if k <= 1 {
			f(b)
			return
		}
		for i := 0; i < k; i++ {
			gen(k - 1)
			if k%2 == 0 {
				b[i], b[k-1] = b[k-1], b[i]
			} else {
				b[0], b[k-1] = b[k-1], b[0]
			}
		}
	}
	gen(len(b))
}

// child returns the state after move m into piece k with the cuts in the
// given order. Free pieces smaller than minArea are dropped as waste.
func (g *gPacker) child(st *gState, k int, m gMove, order []int, minArea float64) *gState {
	pc := &st.pieces[k]
	c := &gState{area: st.area + g.shapes[m.shape].area}
	c.placed = append(st.placed[:len(st.placed):len(st.placed)], gPlaced{shape: m.shape, o: m.o, t: m.t})
	c.cuts = st.cuts[:len(st.cuts):len(st.cuts)]
	c.pieces = make([]freePiece, 0, len(st.pieces)+len(order))
	c.pieces = append(c.pieces, st.pieces[:k]...)
	c.pieces = append(c.pieces, st.pieces[k+1:]...)
	shapeP, useP := pc.shape, pc.use
	cur := pc.id
	first := len(c.pieces)
	for _, i := range order {
		e := m.o.e[i]
		a := e.a.Add(m.t)
		from, to, ok := chord(shapeP, a, e.d)
		if !ok {
			continue
		}
		id := len(c.cuts)
		c.cuts = append(c.cuts, Cut{Piece: cur, From: from, To: to})
		cur = 2*id + 1
		farShape := clipHalf(shapeP, e.n.Scale(-1), -e.n.Dot(a))
		farUse := clipHalf(useP, e.n.Scale(-1), -e.n.Dot(a)+g.stock.SpacingMM)
		if farShape != nil && farUse != nil && farUse.Area() >= minArea {
			c.pieces = append(c.pieces, newFreePiece(2*id+2, farShape, farUse))
		}
		shapeP = clipHalf(shapeP, e.n, e.n.Dot(a))
		useP = clipHalf(useP, e.n, e.n.Dot(a))
		if shapeP == nil {
			break
		}
	}
	for i := first; i < len(c.pieces); i++ {
		c.pieces[i].moves = g.cachedMoves(&c.pieces[i])
	}
	return c
}

// Cut is one straight cut across a whole piece of a sheet, from edge to
// edge of that piece, in sheet coordinates (mm).
type Cut struct {
	Piece    int // the piece it splits (see Sheet.Cuts for the numbering)
	From, To geom.Vec2
}
