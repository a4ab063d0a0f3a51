package nest

import (
	"math"
	"slices"

	"pqfab/geom"
)

// Cutting a placed part free in the free-piece packer: which of its edges
// need a cut, in which order, and the pieces the cuts leave.

// gState is a sheet being filled: its free pieces, the parts placed and
// the cuts made so far. States are values: a child shares nothing that
// it changes with its parent.
type gState struct {
	pieces []freePiece
	placed []gMove
	cuts   []Cut
	area   float64

	// Filled in by the search when it expands the state.
	expanded bool
	room     float64 // area of the free pieces some part fits
	pick     int     // the free piece its branches fill
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

// needCuts returns the edges of the placed hull tr that do not lie on the
// piece's edge: each needs a cut.
func needCuts(pc *freePiece, tr *turned) []int {
	var need []int
	for i, e := range tr.e {
		if !onBoundary(pc.se, e.a, e.a.Add(e.d.Scale(e.l)), 2*fitSlackMM) {
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

// maxPermuted: up to this many needed cuts, cutOrders tries every order;
// beyond it, it builds one order cut by cut.
const maxPermuted = 3

// flatRes: cuts whose directions' y components (sines of their slopes)
// agree to this are equally flat.
const flatRes = 1e-6

// cutOrders returns up to max orders of the needed cuts: least waste
// first, then those that begin with the flattest cut (along the sheet's
// x axis, as glass is first cut into strips across the sheet), then
// those that leave the largest free pieces.
func (g *gPacker) cutOrders(pc *freePiece, tr *turned, need []int, minArea float64, max int) []cutPlan {
	// far returns the usable area beyond cut i of what is left (use), and
	// what is left on the part's side, in scratch memory: in g.cbuf[1] or
	// g.cbuf[2], whichever use is not.
	far := func(use geom.Polygon, i int) (float64, geom.Polygon) {
		e := tr.e[i]
		var ar float64
		if f := clipInto(g.cbuf[0], use, e.n.Scale(-1), -e.n.Dot(e.a)+g.stock.SpacingMM); f != nil {
			ar = f.Area()
			if ar >= minArea && !g.canHold(f, ar) {
				ar = -ar // no part fits it: waste
			}
		}
		dst := g.cbuf[1]
		if len(use) > 0 && len(dst) > 0 && &use[0] == &dst[0] {
			dst = g.cbuf[2]
		}
		return ar, clipInto(dst, use, e.n, e.n.Dot(e.a))
	}
	tally := func(p *cutPlan, ar float64) {
		switch {
		case ar < 0:
			p.waste -= ar
		case ar >= minArea:
			p.score += ar * ar
		default:
			p.waste += ar
		}
	}
	if len(need) > maxPermuted {
		// Greedily: each time the cut that leaves the largest piece.
		var p cutPlan
		use := pc.use
		rest := slices.Clone(need)
		for len(rest) > 0 && use != nil {
			bi, ba := 0, math.Inf(-1)
			for k, i := range rest {
				// The flattest cut first, then the one that leaves the
				// largest piece.
				ar, _ := far(use, i)
				ar = math.Abs(ar)
				if key := ar/(ar+1) - 2*math.Round(math.Abs(tr.e[i].d.Y)/flatRes); key > ba {
					bi, ba = k, key
				}
			}
			i := rest[bi]
			rest = append(rest[:bi], rest[bi+1:]...)
			p.order = append(p.order, i)
			ar, next := far(use, i)
			tally(&p, ar)
			use = next
		}
		p.order = append(p.order, rest...)
		return []cutPlan{p}
	}
	var plans []cutPlan
	permute(need, func(order []int) {
		use := pc.use
		var p cutPlan
		for _, i := range order {
			ar, next := far(use, i)
			tally(&p, ar)
			if use = next; use == nil {
				break
			}
		}
		p.order = slices.Clone(order)
		plans = append(plans, p)
	})
	slices.SortStableFunc(plans, func(a, b cutPlan) int {
		ha, hb := math.Abs(tr.e[a.order[0]].d.Y), math.Abs(tr.e[b.order[0]].d.Y)
		switch {
		case a.waste < b.waste:
			return -1
		case a.waste > b.waste:
			return 1
		case math.Round(ha/flatRes) < math.Round(hb/flatRes):
			return -1
		case math.Round(ha/flatRes) > math.Round(hb/flatRes):
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

// minCutDepthMM: a cut that would take off nothing thicker than this (mm)
// runs along an edge an earlier cut made, within the precision of any
// cutter and of the drawings (which give outlines to 0.01 mm); it splits
// nothing worth a cut and is not made. A released part's piece is then its
// outline to within this, however long the sliver.
const minCutDepthMM = 0.01

// child returns the state after move m into piece k with the cuts in the
// given order. Free pieces smaller than minArea are dropped as waste.
func (g *gPacker) child(st *gState, k int, m gMove, tr *turned, order []int, minArea float64) *gState {
	pc := &st.pieces[k]
	c := &gState{area: st.area + g.shapes[m.shape].area}
	c.placed = append(st.placed[:len(st.placed):len(st.placed)], m)
	c.cuts = st.cuts[:len(st.cuts):len(st.cuts)]
	c.pieces = make([]freePiece, 0, len(st.pieces)+len(order))
	c.pieces = append(c.pieces, st.pieces[:k]...)
	c.pieces = append(c.pieces, st.pieces[k+1:]...)
	shapeP, useP := pc.shape, pc.use
	cur := pc.id
	first := len(c.pieces)
	for _, i := range order {
		e := tr.e[i]
		a := e.a
		from, to, ok := chord(shapeP, a, e.d)
		if !ok {
			continue
		}
		farShape := clipHalf(shapeP, e.n.Scale(-1), -e.n.Dot(a))
		if farShape == nil || depth(farShape, e.n, e.n.Dot(a)) <= minCutDepthMM {
			// The edge already lies on what is left of the piece (an
			// earlier cut made it): a cut there would split nothing.
			continue
		}
		id := len(c.cuts)
		c.cuts = append(c.cuts, Cut{Piece: cur, From: from, To: to})
		cur = 2*id + 1
		farUse := clipHalf(useP, e.n.Scale(-1), -e.n.Dot(a)+g.stock.SpacingMM)
		if farUse != nil && farUse.Area() >= minArea {
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

// canHold reports whether some shape in the window with parts left may
// fit convex polygon p of the given area: it is no larger, no wider at its
// narrowest and no longer (necessary, not sufficient).
func (g *gPacker) canHold(p geom.Polygon, area float64) bool {
	tol := 2 * fitSlackMM
	// Cheapest first: some shape no larger.
	some := false
	for _, si := range g.window {
		if sh := g.shapes[si]; g.left[si] > 0 && sh.area <= area+tol*sh.hullPerim && (!g.convex || sh.convex) {
			some = true
			break
		}
	}
	if !some {
		return false
	}
	minW, diam2 := math.Inf(1), 0.0
	for i, a := range p {
		b := p[(i+1)%len(p)]
		dx, dy := b.X-a.X, b.Y-a.Y
		l := math.Sqrt(dx*dx + dy*dy)
		if l == 0 {
			continue
		}
		nx, ny := -dy/l, dx/l
		h := 0.0
		for _, v := range p {
			wx, wy := v.X-a.X, v.Y-a.Y
			h = max(h, nx*wx+ny*wy)
			diam2 = max(diam2, wx*wx+wy*wy)
		}
		minW = min(minW, h)
	}
	diam := math.Sqrt(diam2)
	for _, si := range g.window {
		sh := g.shapes[si]
		if g.left[si] == 0 || (g.convex && !sh.convex) {
			continue
		}
		if sh.area <= area+tol*sh.hullPerim && sh.minW <= minW+tol && sh.diam <= diam+tol {
			return true
		}
	}
	return false
}

// depth returns how far polygon p reaches below the line n·v = c (n a
// unit normal): the largest c − n·v over its corners.
func depth(p geom.Polygon, n geom.Vec2, c float64) float64 {
	d := 0.0
	for _, v := range p {
		d = max(d, c-n.Dot(v))
	}
	return d
}
