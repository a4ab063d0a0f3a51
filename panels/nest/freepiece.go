package nest

import (
	"math"

	"pqfab/geom"
)

// edge is one edge of a convex polygon with its unit direction, unit
// inward (left) normal, length, direction in degrees and the polygon's
// height over the edge's line.
type edge struct {
	a, d, n geom.Vec2
	l       float64
	deg     float64
	h       float64
}

func edgesOf(p geom.Polygon) []edge {
	out := make([]edge, 0, len(p))
	for i, a := range p {
		v := p[(i+1)%len(p)].Sub(a)
		l := math.Sqrt(v.X*v.X + v.Y*v.Y)
		if l == 0 {
			continue
		}
		d := v.Scale(1 / l)
		e := edge{a: a, d: d, n: d.Perp(), l: l, deg: math.Atan2(d.Y, d.X) * 180 / math.Pi}
		for _, w := range p {
			e.h = math.Max(e.h, e.n.Dot(w.Sub(a)))
		}
		out = append(out, e)
	}
	return out
}

// freePiece is a piece of a sheet that the cuts so far have left and no
// part uses yet: the piece itself (shape) and the part of it where parts
// may lie (use: inside the edge margin and at least the spacing from the
// parts already cut free). Both are convex and counter-clockwise.
type freePiece struct {
	id     int // the piece's number in the sheet's cut record (see Sheet.Cuts)
	shape  geom.Polygon
	use    geom.Polygon
	se, ue []edge // edges of shape and of use
	area   float64
	lo, hi geom.Vec2 // bounds of use
	rect   bool      // use is a rectangle with edges along the axes
	minW   float64   // least width of use over all directions
	diam   float64   // greatest distance between two corners of use
	moves  []gMove   // the best move of each part shape into this piece, best first
}

func newFreePiece(id int, shape, use geom.Polygon) freePiece {
	lo, hi := use.Bounds()
	pc := freePiece{id: id, shape: shape, use: use, se: edgesOf(shape), ue: edgesOf(use), area: use.Area(), lo: lo, hi: hi}
	pc.minW, pc.diam = math.Inf(1), 0
	for _, e := range pc.ue {
		pc.minW = min(pc.minW, e.h)
	}
	for i, a := range use {
		for _, b := range use[i+1:] {
			pc.diam = max(pc.diam, b.Sub(a).Norm())
		}
	}
	pc.rect = len(pc.ue) == 4
	for _, e := range pc.ue {
		if e.d.X != 0 && e.d.Y != 0 {
			pc.rect = false
		}
	}
	return pc
}

// onBoundary reports whether segment ab lies on the boundary of the
// piece (on one of its edges, within tol mm).
func onBoundary(es []edge, a, b geom.Vec2, tol float64) bool {
	v := b.Sub(a)
	l := math.Sqrt(v.X*v.X + v.Y*v.Y)
	if l == 0 {
		return true
	}
	for _, e := range es {
		if math.Abs(e.n.Dot(a.Sub(e.a))) > tol || math.Abs(e.n.Dot(b.Sub(e.a))) > tol {
			continue
		}
		sa, sb := e.d.Dot(a.Sub(e.a)), e.d.Dot(b.Sub(e.a))
		if math.Min(sa, sb) >= -tol && math.Max(sa, sb) <= e.l+tol {
			return true
		}
	}
	return false
}

// contact returns the length along which the edges of p (at offset t)
// run on edges es in the same direction, within tol mm.
func contact(pe []edge, t geom.Vec2, es []edge, tol float64) float64 {
	var sum float64
	for i := range pe {
		e := &pe[i]
		ax, ay := e.a.X+t.X, e.a.Y+t.Y
		for j := range es {
			f := &es[j]
			dot := e.d.X*f.d.X + e.d.Y*f.d.Y
			if dot <= 0 {
				continue
			}
			if c := e.d.X*f.d.Y - e.d.Y*f.d.X; c > parallelSin || c < -parallelSin {
				continue
			}
			wx, wy := f.a.X-ax, f.a.Y-ay
			if h := f.n.X*wx + f.n.Y*wy; h > tol || h < -tol {
				continue
			}
			s0 := e.d.X*wx + e.d.Y*wy
			s1 := s0 + dot*f.l
			// Overlap of [0, e.l] and [s0, s1] (s0 < s1 as the edges run the same way).
			lo, hi := s0, s1
			if lo < 0 {
				lo = 0
			}
			if hi > e.l {
				hi = e.l
			}
			if hi > lo {
				sum += hi - lo
			}
		}
	}
	return sum
}

// parallelSin: edges whose directions differ by less than this sine
// (about 0.06°) count as parallel for contact.
const parallelSin = 1e-3

// contactTolMM: parallel edges closer than this (mm) count as in contact
// when a position is scored.
const contactTolMM = 1e-3

// chord returns where the line through a in unit direction d crosses
// convex polygon p, as the two ends in the order of d.
func chord(p geom.Polygon, a, d geom.Vec2) (from, to geom.Vec2, ok bool) {
	n := d.Perp()
	tmin, tmax := math.Inf(1), math.Inf(-1)
	k := len(p)
	for i := 0; i < k; i++ {
		u, v := p[i], p[(i+1)%k]
		su, sv := n.Dot(u.Sub(a)), n.Dot(v.Sub(a))
		if su == 0 {
			t := d.Dot(u.Sub(a))
			tmin, tmax = math.Min(tmin, t), math.Max(tmax, t)
		}
		if (su > 0 && sv < 0) || (su < 0 && sv > 0) {
			x := u.Add(v.Sub(u).Scale(su / (su - sv)))
			t := d.Dot(x.Sub(a))
			tmin, tmax = math.Min(tmin, t), math.Max(tmax, t)
		}
	}
	if !(tmax > tmin) {
		return from, to, false
	}
	return a.Add(d.Scale(tmin)), a.Add(d.Scale(tmax)), true
}
