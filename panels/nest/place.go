package nest

import (
	"math"

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
			out = append(out, o)
		}
	}
	return out
}

// sheetState is a sheet being filled by the no-fit polygon placer.
type sheetState struct {
	stock    Stock
	grown    []geom.Polygon // grown convex pieces of the parts placed
	glo, ghi []geom.Vec2
	placed   []nPlaced
	area     float64
	// scratch space reused between calls of place
	nfps     []geom.Polygon
	nlo, nhi []geom.Vec2
	cands    []geom.Vec2
	bufBase  geom.Polygon // backing store for the no-fit polygons of one call
	buf      geom.Polygon // its unused tail
}

// nPlaced is a part shape placed by the no-fit polygon placer.
type nPlaced struct {
	shape int
	o     *nOrient
	t     geom.Vec2
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
	nfps, nlo, nhi := st.nfps[:0], st.nlo[:0], st.nhi[:0]
	need := 0
	for _, g := range st.grown {
		for _, n := range o.negGrown {
			need += len(g) + len(n)
		}
	}
	if cap(st.bufBase) < need {
		st.bufBase = make(geom.Polygon, 0, 2*need)
	}
	st.buf = st.bufBase[:0]
	for _, g := range st.grown {
		for _, n := range o.negGrown {
			f := minkowskiSorted(g, n, st.buf)
			st.buf = f[len(f):]
			lo, hi := f.Bounds()
			if lo.X > ihi.X || hi.X < ilo.X || lo.Y > ihi.Y || hi.Y < ilo.Y {
				continue // wholly off the inner-fit rectangle
			}
			nfps, nlo, nhi = append(nfps, f), append(nlo, lo), append(nhi, hi)
		}
	}
	st.nfps, st.nlo, st.nhi = nfps, nlo, nhi
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
	best, bestScore, found := st.firstFree(o, cands, ilo, ihi, bound)
	if found {
		bound = &bestScore
	}
	// Then the crossings of pairs of no-fit polygons, only where they can
	// still beat the best so far.
	cands = cands[:0]
	for k := range nfps {
		for l := k + 1; l < len(nfps); l++ {
			lox, loy := max(nlo[k].X, nlo[l].X), max(nlo[k].Y, nlo[l].Y)
			hix, hiy := min(nhi[k].X, nhi[l].X), min(nhi[k].Y, nhi[l].Y)
			if lox > hix || loy > hiy || lox > ihi.X || hix < ilo.X || loy > ihi.Y || hiy < ilo.Y {
				continue
			}
			if bound != nil {
				y, x := max(loy, ilo.Y), max(lox, ilo.X)
				lb := score{band: st.band(o, y), right: x + o.hi.X, top: y + o.hi.Y}
				if !lb.less(*bound) {
					continue
				}
			}
			// Only edges that reach into the overlap of the two boxes can
			// cross there.
			f, g := nfps[k], nfps[l]
			for i := range f {
				p, q := f[i], f[(i+1)%len(f)]
				if max(p.X, q.X) < lox || min(p.X, q.X) > hix || max(p.Y, q.Y) < loy || min(p.Y, q.Y) > hiy {
					continue
				}
				for m := range g {
					a, b := g[m], g[(m+1)%len(g)]
					if max(a.X, b.X) < lox || min(a.X, b.X) > hix || max(a.Y, b.Y) < loy || min(a.Y, b.Y) > hiy {
						continue
					}
					cands = lineHits(cands, p, q, a, b)
				}
			}
		}
	}
	st.cands = cands
	if c, sc, ok := st.firstFree(o, cands, ilo, ihi, bound); ok {
		return c, sc, true
	}
	return best, bestScore, found
}

// firstFree returns the best candidate position that lies in the
// inner-fit rectangle, overlaps no part and beats bound. Each candidate is
// checked against the parts only when it would beat the best so far.
func (st *sheetState) firstFree(o *nOrient, cands []geom.Vec2, ilo, ihi geom.Vec2, bound *score) (geom.Vec2, score, bool) {
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
		if (found || bound != nil) && !sc.less(bestScore) {
			continue
		}
		ok := true
		for k, f := range st.nfps {
			if strictlyInside(f, st.nlo[k], st.nhi[k], c, touchTol) {
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
		st.grown = append(st.grown, g)
		st.glo, st.ghi = append(st.glo, lo), append(st.ghi, hi)
	}
	st.placed = append(st.placed, nPlaced{shape: si, o: o, t: t})
	st.area += area
}
