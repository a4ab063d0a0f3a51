package nest

import (
	"cmp"
	"encoding/binary"
	"hash/fnv"
	"math"
	"slices"

	"pqfab/geom"
)

// The free-piece packer builds layouts whose parts are all released by
// edge-to-edge cuts: it puts one part at a time into a convex piece of
// the sheet, flush with the piece's edges, and cuts it free along its own
// edges (cuts.go); each cut runs across the whole piece it splits and
// leaves convex pieces for the next parts. This is the one-stage approach
// of Han, Bennell, Zhao and Song, "Construction heuristics for
// two-dimensional irregular shape bin packing with guillotine
// constraints", European Journal of Operational Research 230(3), 2013,
// with our own move scores and search (sheetsearch.go). Parts that are not
// convex are placed by their hulls.

// gMove puts a part of a shape into a free piece: the shape's hull,
// mirrored if mirror, turned by the angle whose cosine and sine are c and
// s, its origin at t.
type gMove struct {
	shape  int
	mirror bool
	c, s   float64
	t      geom.Vec2
	score  float64
}

// deg returns the move's turn in degrees, in [0, 360).
func (m gMove) deg() float64 {
	return normDeg(math.Atan2(m.s, m.c) * 180 / math.Pi)
}

// turned is a shape's hull turned, with its edges and bounds.
type turned struct {
	poly   geom.Polygon
	e      []edge
	lo, hi geom.Vec2
}

// turnInto sets dst to hull h (with edges he) turned by (c, s), reusing
// dst's memory.
func turnInto(dst *turned, h geom.Polygon, he []edge, c, s float64) {
	rot := func(v geom.Vec2) geom.Vec2 { return geom.Vec2{X: c*v.X - s*v.Y, Y: s*v.X + c*v.Y} }
	dst.poly = dst.poly[:0]
	dst.lo = geom.Vec2{X: math.Inf(1), Y: math.Inf(1)}
	dst.hi = geom.Vec2{X: math.Inf(-1), Y: math.Inf(-1)}
	for _, v := range h {
		w := rot(v)
		dst.poly = append(dst.poly, w)
		dst.lo.X, dst.lo.Y = min(dst.lo.X, w.X), min(dst.lo.Y, w.Y)
		dst.hi.X, dst.hi.Y = max(dst.hi.X, w.X), max(dst.hi.Y, w.Y)
	}
	dst.e = dst.e[:0]
	for _, e := range he {
		d := rot(e.d)
		dst.e = append(dst.e, edge{a: rot(e.a), d: d, n: d.Perp(), l: e.l, h: e.h})
	}
}

// gWeights weigh the terms of a move's score.
type gWeights struct {
	fit  float64 // share of the part's hull perimeter on the piece's edges
	fill float64 // part area / piece area
	size float64 // part area / usable sheet area
	tall float64 // the part's height over the piece edge it lies on / the piece's
}

// gPacker places the parts of the shapes on sheets of one stock.
type gPacker struct {
	stock   Stock
	shapes  []*shape
	left    []int // parts of each shape still to place (shared with other stocks' packers)
	w       gWeights
	usable  float64
	hulls   [][2]geom.Polygon // per shape, the hull plain and mirrored
	hullE   [][2][]edge       // and their edges
	extra   [][]float64       // per shape, extra turns that let it fit the empty sheet
	mirrors []bool
	convex  bool  // only convex shapes may be placed (edge-to-edge cuts)
	window  []int // the shapes looked at
	fit     fitter
	tmp     turned
	cache   map[uint64][]movesEntry
	cbuf    [3]geom.Polygon // scratch for cutOrders
	pairs   []flushPair
	low     []float64
}

func newGPacker(st Stock, shapes []*shape, w gWeights, convexOnly bool) *gPacker {
	g := &gPacker{stock: st, shapes: shapes, w: w, convex: convexOnly, usable: st.usableArea()}
	g.left = make([]int, len(shapes))
	g.cache = map[uint64][]movesEntry{}
	for i := range g.cbuf {
		g.cbuf[i] = make(geom.Polygon, 0, 16)
	}
	g.hulls = make([][2]geom.Polygon, len(shapes))
	g.hullE = make([][2][]edge, len(shapes))
	g.extra = make([][]float64, len(shapes))
	g.mirrors = []bool{false}
	if st.Mirror {
		g.mirrors = append(g.mirrors, true)
	}
	for i, s := range shapes {
		g.left[i] = len(s.parts)
		g.hulls[i][0] = s.hull
		g.hulls[i][1] = orient(s.hull, true, 0, geom.Vec2{})
		for mi := range 2 {
			g.hullE[i][mi] = edgesOf(g.hulls[i][mi])
		}
	}
	return g
}

// placed returns the hull of the part a move places, where it lies.
func (g *gPacker) placed(m gMove) *turned {
	return g.placedInto(&turned{}, m)
}

// placedInto is placed, reusing the memory of tr.
func (g *gPacker) placedInto(tr *turned, m gMove) *turned {
	mi := 0
	if m.mirror {
		mi = 1
	}
	turnInto(tr, g.hulls[m.shape][mi], g.hullE[m.shape][mi], m.c, m.s)
	for i := range tr.poly {
		tr.poly[i] = tr.poly[i].Add(m.t)
	}
	for i := range tr.e {
		tr.e[i].a = tr.e[i].a.Add(m.t)
	}
	tr.lo, tr.hi = tr.lo.Add(m.t), tr.hi.Add(m.t)
	return tr
}

// normDeg brings a turn into [0, 360), whole quarter turns within 1e-9°
// exactly.
func normDeg(a float64) float64 {
	a = math.Mod(a, 360)
	if a < 0 {
		a += 360
	}
	for _, q := range []float64{0, 90, 180, 270, 360} {
		if math.Abs(a-q) < 1e-9 {
			return math.Mod(q, 360)
		}
	}
	return a
}

// fixedTurns are the turns of the stocks that allow only some.
var fixedTurns = map[Rotation][]float64{Grain: {0, 180}, Quarter: {0, 90, 180, 270}}

// movesEntry is the moves into a piece of a given usable area, kept
// because the same piece comes up again in other branches of the search
// and on every new sheet.
type movesEntry struct {
	use   geom.Polygon
	moves []gMove
}

// maxCached bounds the pieces whose moves are kept.
const maxCached = 1 << 15

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
			return e.moves
		}
	}
	m := g.movesInto(pc)
	if len(g.cache) >= maxCached {
		clear(g.cache)
	}
	g.cache[key] = append(g.cache[key], movesEntry{slices.Clone(pc.use), m})
	return m
}

// setWindow picks the shapes the packer looks at: all of them, or for
// more than allShapes the first pieceWindow with parts left. The moves
// kept for pieces are dropped when the window changes; it reports whether
// it did.
func (g *gPacker) setWindow() bool {
	var w []int
	for si := range g.shapes {
		if len(g.shapes) <= allShapes || g.left[si] > 0 {
			w = append(w, si)
		}
		if len(g.shapes) > allShapes && len(w) == pieceWindow {
			break
		}
	}
	if slices.Equal(w, g.window) {
		return false
	}
	clear(g.cache)
	g.window = w
	return true
}

// movesInto returns the best move of every shape in the window into piece
// pc, best first.
func (g *gPacker) movesInto(pc *freePiece) []gMove {
	out := make([]gMove, 0, len(g.window))
	for _, si := range g.window {
		if m, ok := g.bestMove(pc, si); ok {
			out = append(out, m)
		}
	}
	slices.SortStableFunc(out, func(a, b gMove) int {
		switch {
		case a.score > b.score:
			return -1
		case a.score < b.score:
			return 1
		}
		return a.shape - b.shape
	})
	return out
}

// bestMove returns the best move of shape si into piece pc: for free
// rotation each hull edge laid along each edge of the piece's usable area
// that can hold it (no shorter than the edge, and as high over it as the
// part), at both ends of where it can slide along that edge; for the
// fixed turns the corners of the region where the part fits. Moves score
// by the share of the hull's perimeter on the piece's edges and by the
// part's area against the piece's and the sheet's; the lower, then
// further left, wins a tie.
func (g *gPacker) bestMove(pc *freePiece, si int) (gMove, bool) {
	sh := g.shapes[si]
	var best gMove
	var bestLo geom.Vec2
	found := false
	// A convex part fits a convex piece only if it is no wider in any
	// direction, so no wider at its narrowest, and no longer.
	if sh.area > pc.area+2*fitSlackMM*sh.hullPerim || sh.minW > pc.minW+2*fitSlackMM || sh.diam > pc.diam+2*fitSlackMM || (g.convex && !sh.convex) {
		return best, false
	}
	tr := &g.tmp
	base := g.w.fill*sh.area/pc.area + g.w.size*sh.area/g.usable
	consider := func(m bool, c, s float64, t geom.Vec2, tall float64) {
		sc := g.w.fit*contact(tr.e, t, pc.ue, contactTolMM)/sh.hullPerim + base + g.w.tall*tall
		lo := t.Add(tr.lo)
		if !found || sc > best.score || (sc == best.score && lowerLeft(lo, bestLo)) {
			best, bestLo, found = gMove{shape: si, mirror: m, c: c, s: s, t: t, score: sc}, lo, true
		}
	}
	for mi, m := range g.mirrors {
		h, he := g.hulls[si][mi], g.hullE[si][mi]
		if g.stock.Rotation != Free {
			for _, a := range fixedTurns[g.stock.Rotation] {
				s, c := turn(a)
				turnInto(tr, h, he, c, s)
				for _, t := range positions(&g.fit, tr, pc) {
					consider(m, c, s, t, 0)
				}
			}
			continue
		}
		// Pairs of a hull edge and a piece edge that can hold it, grouped
		// by the turn that lays one along the other.
		pairs := g.pairs[:0]
		for i, e := range he {
			for j := range pc.ue {
				f := &pc.ue[j]
				if e.l > f.l+2*fitSlackMM || e.h > f.h+2*fitSlackMM {
					continue
				}
				pairs = append(pairs, flushPair{i: i, j: j, c: e.d.Dot(f.d), s: e.d.Cross(f.d)})
			}
		}
		slices.SortFunc(pairs, func(a, b flushPair) int {
			if c := cmp.Compare(a.c, b.c); c != 0 {
				return c
			}
			if c := cmp.Compare(a.s, b.s); c != 0 {
				return c
			}
			return cmp.Compare(a.i*len(pc.ue)+a.j, b.i*len(pc.ue)+b.j)
		})
		g.pairs = pairs
		for a := 0; a < len(pairs); {
			c, s := pairs[a].c, pairs[a].s
			b := a
			for b < len(pairs) && pairs[b].c == c && pairs[b].s == s {
				b++
			}
			group := pairs[a:b]
			a = b
			turnInto(tr, h, he, c, s)
			// Contact is at most the length of the edges that run along
			// some piece edge: skip the turn if even that cannot win.
			if found {
				var most float64
				for _, e := range tr.e {
					for _, f := range pc.ue {
						if e.d.Dot(f.d) > 0 && math.Abs(e.d.Cross(f.d)) <= parallelSin {
							most += e.l
							break
						}
					}
				}
				if g.w.fit*most/sh.hullPerim+base < best.score {
					continue
				}
			}
			support(tr, pc, &g.low)
			for _, p := range group {
				if t0, t1, ok := flush(tr, p.i, pc, p.j, g.low); ok {
					tall := he[p.i].h / pc.ue[p.j].h
					consider(m, c, s, t0, tall)
					if t1 != t0 {
						consider(m, c, s, t1, tall)
					}
				}
			}
		}
		for _, a := range g.extra[si] {
			s, c := turn(a)
			turnInto(tr, h, he, c, s)
			for _, t := range positions(&g.fit, tr, pc) {
				consider(m, c, s, t, 0)
			}
		}
	}
	return best, found
}

// lowerLeft reports whether a is lower than b, or as low and further left.
func lowerLeft(a, b geom.Vec2) bool {
	return a.Y < b.Y || (a.Y == b.Y && a.X < b.X)
}

// flushPair is a hull edge i laid along piece edge j by the turn (c, s).
type flushPair struct {
	i, j int
	c, s float64
}

// support sets low[k] to the least of n·v over the corners v of tr, n the
// inward normal of the piece's usable edge k.
func support(tr *turned, pc *freePiece, low *[]float64) {
	l := (*low)[:0]
	for k := range pc.ue {
		n := pc.ue[k].n
		lowest := math.Inf(1)
		for _, v := range tr.poly {
			if d := n.X*v.X + n.Y*v.Y; d < lowest {
				lowest = d
			}
		}
		l = append(l, lowest)
	}
	*low = l
}

// flush returns the two ends of the stretch along which edge i of tr can
// slide on edge j of the piece's usable area with tr inside it (low from
// support). When tr fits only within fitSlackMM, both ends are the middle
// of that slack.
func flush(tr *turned, i int, pc *freePiece, j int, low []float64) (geom.Vec2, geom.Vec2, bool) {
	f := &pc.ue[j]
	t0 := f.a.Sub(tr.e[i].a)
	s0, s1, ok := flushSpan(tr, pc, j, t0, low, 0)
	if !ok {
		if s0, s1, ok = flushSpan(tr, pc, j, t0, low, fitSlackMM); !ok {
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

func flushSpan(tr *turned, pc *freePiece, j int, t0 geom.Vec2, low []float64, slack float64) (float64, float64, bool) {
	f := &pc.ue[j]
	lo, hi := math.Inf(-1), math.Inf(1)
	for k := range pc.ue {
		if k == j {
			continue
		}
		u := &pc.ue[k]
		// u.n·(t0 + s f.d) ≥ u.n·u.a − low[k] − slack
		r := u.n.Dot(u.a) - low[k] - slack - u.n.Dot(t0)
		q := u.n.Dot(f.d)
		switch {
		case q > parallelCos:
			lo = max(lo, r/q)
		case q < -parallelCos:
			hi = min(hi, r/q)
		case r > 0:
			return 0, 0, false
		}
		if lo > hi {
			return lo, hi, false
		}
	}
	// The piece's bounding box too: where the piece ends in a sharp corner
	// the slack of its edges would let a part reach farther out than the
	// slack.
	for _, c := range [4]struct{ q, r float64 }{
		{f.d.X, pc.lo.X - slack - t0.X - tr.lo.X},
		{-f.d.X, -(pc.hi.X + slack - t0.X - tr.hi.X)},
		{f.d.Y, pc.lo.Y - slack - t0.Y - tr.lo.Y},
		{-f.d.Y, -(pc.hi.Y + slack - t0.Y - tr.hi.Y)},
	} {
		switch {
		case c.q > parallelCos:
			lo = max(lo, c.r/c.q)
		case c.q < -parallelCos:
			hi = min(hi, c.r/c.q)
		case c.r > 0:
			return 0, 0, false
		}
	}
	if lo > hi || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return lo, hi, false
	}
	return lo, hi, true
}

// positions returns the corners of the region of positions at which tr
// lies in the piece's usable area: where it touches two of its edges.
func positions(fit *fitter, tr *turned, pc *freePiece) []geom.Vec2 {
	lo := pc.lo.Sub(tr.lo)
	hi := pc.hi.Sub(tr.hi)
	if pc.rect {
		x0, x1, okx := span(lo.X, hi.X)
		y0, y1, oky := span(lo.Y, hi.Y)
		if !okx || !oky {
			return nil
		}
		out := append(fit.out[:0], geom.Vec2{X: x0, Y: y0})
		if x1 != x0 {
			out = append(out, geom.Vec2{X: x1, Y: y0})
		}
		if y1 != y0 {
			out = append(out, geom.Vec2{X: x0, Y: y1})
			if x1 != x0 {
				out = append(out, geom.Vec2{X: x1, Y: y1})
			}
		}
		fit.out = out
		return out
	}
	if lo.X > hi.X+2*fitSlackMM || lo.Y > hi.Y+2*fitSlackMM {
		return nil
	}
	return fit.innerFit(tr.poly, tr.lo, tr.hi, pc.ue, pc.lo, pc.hi)
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
