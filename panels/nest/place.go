package nest

import (
	"fmt"
	"math"

	"pqfab/geom"
)

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

// orientations returns the turns (and mirror images) of an outline that
// stock s allows.
func orientations(p geom.Polygon, s Stock) []orientation {
	var angles []float64
	switch s.Rotation {
	case Grain:
		angles = []float64{0, 180}
	case Quarter:
		angles = []float64{0, 90, 180, 270}
	case Free:
		hull := geom.ConvexHull(p)
		for i := range hull {
			e := hull[(i+1)%len(hull)].Sub(hull[i])
			base := -math.Atan2(e.Y, e.X) * 180 / math.Pi
			for _, a := range []float64{base, base + 90, base + 180, base + 270} {
				a = math.Mod(a+720, 360)
				dup := false
				for _, b := range angles {
					if d := math.Abs(a - b); d < sameTurnDeg || d > 360-sameTurnDeg {
						dup = true
						break
					}
				}
				if !dup {
					angles = append(angles, a)
				}
			}
		}
	}
	mirrors := []bool{false}
	if s.Mirror {
		mirrors = append(mirrors, true)
	}
	var out []orientation
	for _, m := range mirrors {
		for _, a := range angles {
			shape := transform(p, m, a, geom.Vec2{})
			hull := geom.ConvexHull(shape)
			lo, hi := hull.Bounds()
			grown := startLowest(inflate(hull, s.SpacingMM/2))
			neg := make(geom.Polygon, len(grown))
			for i, v := range grown {
				neg[i] = v.Scale(-1)
			}
			out = append(out, orientation{rot: a, mirrored: m,
				grown: grown, negGrown: startLowest(neg), lo: lo, hi: hi})
		}
	}
	return out
}

// transform mirrors (x → −x, keeping counter-clockwise order), turns by a
// degrees and moves by t.
func transform(p geom.Polygon, mirror bool, a float64, t geom.Vec2) geom.Polygon {
	q := make(geom.Polygon, len(p))
	copy(q, p)
	if mirror {
		for i := range q {
			q[i].X = -q[i].X
		}
		q = q.Reversed()
	}
	r := a * math.Pi / 180
	for i := range q {
		q[i] = q[i].Rotate(r).Add(t)
	}
	return q
}

// sheetState is a sheet being filled.
type sheetState struct {
	stock  Stock
	grown  []geom.Polygon // grown hulls of the parts placed
	glo    []geom.Vec2
	ghi    []geom.Vec2
	placed []Placement
	area   float64
	// scratch space reused between calls of place
	nfps     []geom.Polygon
	nlo, nhi []geom.Vec2
	cands    []geom.Vec2
	bufBase  geom.Polygon // backing store for the no-fit polygons of one call
	buf      geom.Polygon // its unused tail
}

// place finds the best position (see score) for part o on the sheet over
// the corners of the inner-fit rectangle, the no-fit polygons' corners and
// their crossings with each other and with the rectangle. Positions that
// do not beat bound (when given) are not considered.
func (st *sheetState) place(o *orientation, bound *score) (geom.Vec2, score, bool) {
	s := st.stock
	// Inner-fit rectangle of the reference point.
	ilo := geom.Vec2{X: s.MarginMM - o.lo.X, Y: s.MarginMM - o.lo.Y}
	ihi := geom.Vec2{X: s.WidthMM - s.MarginMM - o.hi.X, Y: s.HeightMM - s.MarginMM - o.hi.Y}
	if ilo.X > ihi.X || ilo.Y > ihi.Y {
		return geom.Vec2{}, score{}, false
	}
	if bound != nil && bound.less(st.score(o, ilo)) && st.band(o, ilo.Y) > bound.band {
		return geom.Vec2{}, score{}, false // nothing here can beat the bound
	}
	nfps, nlo, nhi := st.nfps[:0], st.nlo[:0], st.nhi[:0]
	need := 0
	for _, g := range st.grown {
		need += len(g) + len(o.negGrown)
	}
	if cap(st.bufBase) < need {
		st.bufBase = make(geom.Polygon, 0, 2*need)
	}
	st.buf = st.bufBase[:0]
	for _, g := range st.grown {
		f := minkowskiSorted(g, o.negGrown, st.buf)
		st.buf = f[len(f):]
		lo, hi := f.Bounds()
		nfps, nlo, nhi = append(nfps, f), append(nlo, lo), append(nhi, hi)
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
			lox, loy := math.Max(nlo[k].X, nlo[l].X), math.Max(nlo[k].Y, nlo[l].Y)
			hix, hiy := math.Min(nhi[k].X, nhi[l].X), math.Min(nhi[k].Y, nhi[l].Y)
			if lox > hix || loy > hiy || lox > ihi.X || hix < ilo.X || loy > ihi.Y || hiy < ilo.Y {
				continue
			}
			if bound != nil {
				y, x := math.Max(loy, ilo.Y), math.Max(lox, ilo.X)
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
				if math.Max(p.X, q.X) < lox || math.Min(p.X, q.X) > hix || math.Max(p.Y, q.Y) < loy || math.Min(p.Y, q.Y) > hiy {
					continue
				}
				for m := range g {
					a, b := g[m], g[(m+1)%len(g)]
					if math.Max(a.X, b.X) < lox || math.Min(a.X, b.X) > hix || math.Max(a.Y, b.Y) < loy || math.Min(a.Y, b.Y) > hiy {
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
func (st *sheetState) firstFree(o *orientation, cands []geom.Vec2, ilo, ihi geom.Vec2, bound *score) (geom.Vec2, score, bool) {
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
		c = geom.Vec2{X: math.Min(math.Max(c.X, ilo.X), ihi.X), Y: math.Min(math.Max(c.Y, ilo.Y), ihi.Y)}
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

func (st *sheetState) score(o *orientation, c geom.Vec2) score {
	top, right := c.Y+o.hi.Y, c.X+o.hi.X
	return score{band: st.band(o, c.Y), right: right, top: top}
}

// band returns the band of the top edge of part o placed at height y.
func (st *sheetState) band(o *orientation, y float64) float64 {
	return math.Ceil((y + o.hi.Y) / (st.stock.HeightMM * topBin))
}

// fill places parts from order on one sheet of stock s, returning the
// placements and the parts used.
func fill(parts []Part, info []partInfo, s Stock, si int, order []int, done []bool, start int) (*sheetState, []int) {
	st := &sheetState{stock: s}
	var used []int // positions in order of the parts placed
	free := (s.WidthMM - 2*s.MarginMM) * (s.HeightMM - 2*s.MarginMM)
	misses, skips := 0, 0
	var failed []partInfo // parts that found no place on this sheet
	for k := start; k < len(order); k++ {
		if done[k] {
			continue
		}
		p := order[k]
		if info[p].area > free-st.area || dominated(info[p], failed) {
			if skips++; skips >= maxSkips {
				break
			}
			continue
		}
		var bestScore score
		var bestPos geom.Vec2
		var bestO *orientation
		for oi := range info[p].orients[si] {
			o := &info[p].orients[si][oi]
			var bound *score
			if bestO != nil {
				bound = &bestScore
			}
			pos, sc, ok := st.place(o, bound)
			if !ok {
				continue
			}
			if bestO == nil || sc.less(bestScore) {
				bestScore, bestPos, bestO = sc, pos, o
			}
		}
		if bestO == nil {
			failed = append(failed, info[p])
			misses++
			if misses >= maxMisses {
				break
			}
			continue
		}
		misses = 0
		placed := transform(parts[p].Outline, bestO.mirrored, bestO.rot, bestPos)
		g := bestO.grown.Translate(bestPos) // still starts at its lowest corner
		glo, ghi := g.Bounds()
		st.grown = append(st.grown, g)
		st.glo, st.ghi = append(st.glo, glo), append(st.ghi, ghi)
		st.placed = append(st.placed, Placement{Part: p, X: bestPos.X, Y: bestPos.Y, RotationDeg: bestO.rot, Mirrored: bestO.mirrored, Outline: placed})
		st.area += info[p].area
		used = append(used, k)
	}
	return st, used
}

// dominated reports whether part a is at least as large as a part that
// already failed on this sheet: at least its area (less 1 %) and at least
// its short and long side. Such a part is not tried: a heuristic that
// spares most of the work of filling a sheet's last gaps.
func dominated(a partInfo, failed []partInfo) bool {
	for _, f := range failed {
		if a.area >= 0.99*f.area && a.height >= f.height && a.length >= f.length {
			return true
		}
	}
	return false
}

// fits reports whether a part fits an empty sheet of stock si.
func fits(info partInfo, s Stock, si int) bool {
	st := &sheetState{stock: s}
	for oi := range info.orients[si] {
		if _, _, ok := st.place(&info.orients[si][oi], nil); ok {
			return true
		}
	}
	return false
}

// run nests all parts in the given order: sheet after sheet, each time on
// the stock size that carries the most part area per unit of price (or of
// sheet area when prices are not given).
func run(parts []Part, stocks []Stock, info []partInfo, order []int) *Result {
	res := &Result{}
	priced := true
	for _, s := range stocks {
		res.stockPrice = append(res.stockPrice, s.Price)
		res.stockArea = append(res.stockArea, s.WidthMM*s.HeightMM)
		if s.Price == 0 {
			priced = false
		}
	}
	left := make([]int, len(stocks))
	for i, s := range stocks {
		left[i] = s.Count
		if s.Count == 0 {
			left[i] = -1 // no limit
		}
	}
	var todo []int // parts that fit some stock, in order
	for _, p := range order {
		ok := false
		for si, s := range stocks {
			if fits(info[p], s, si) {
				ok = true
				break
			}
		}
		if !ok {
			res.Unplaced = append(res.Unplaced, Unplaced{Part: p, Reason: "larger than every stock sheet (inside its margins) in every allowed rotation"})
			continue
		}
		todo = append(todo, p)
	}
	done := make([]bool, len(todo))
	start, remaining := 0, len(todo)
	for remaining > 0 {
		for done[start] {
			start++
		}
		var best *sheetState
		var bestUsed []int
		bestStock, bestScore := -1, math.Inf(-1)
		for si, s := range stocks {
			if left[si] == 0 {
				continue
			}
			st, used := fill(parts, info, s, si, todo, done, start)
			if len(st.placed) == 0 {
				continue
			}
			score := st.area / (s.WidthMM * s.HeightMM)
			if priced {
				score = st.area / s.Price
			}
			if score > bestScore {
				best, bestUsed, bestStock, bestScore = st, used, si, score
			}
		}
		if best == nil {
			for k, p := range todo {
				if !done[k] {
					res.Unplaced = append(res.Unplaced, Unplaced{Part: p, Reason: "no stock sheet left that it fits"})
				}
			}
			break
		}
		if left[bestStock] > 0 {
			left[bestStock]--
		}
		s := stocks[bestStock]
		res.Sheets = append(res.Sheets, Sheet{Stock: bestStock, Placements: best.placed, PartAreaMM2: best.area,
			Utilization: best.area / (s.WidthMM * s.HeightMM)})
		for _, k := range bestUsed {
			done[k] = true
		}
		remaining -= len(bestUsed)
	}
	return res
}

// Describe returns a one-line summary of a stock size.
func (s Stock) Describe() string {
	return fmt.Sprintf("%s %g × %g mm", s.Name, s.WidthMM, s.HeightMM)
}
