package nest

import (
	"math"

	"pqfab/geom"
)

// mergeTolMM: corners of a clipped polygon closer than this (mm) are one
// corner. Rounding noise of the clipping, far below any kerf.
const mergeTolMM = 1e-9

// fitSlackMM is how far (mm) a part may reach past the area it is placed
// in when nothing else fits: a part that fits exactly, within twice this,
// is placed (centred in the slack). Half of the 1e-6 mm a part may be off
// at most, rounding noise far below any kerf.
const fitSlackMM = 5e-7

// clipHalf returns the part of convex polygon p where n·x ≥ d.
func clipHalf(p geom.Polygon, n geom.Vec2, d float64) geom.Polygon {
	return clipInto(make(geom.Polygon, 0, len(p)+1), p, n, d)
}

// clipInto is clipHalf writing into dst[:0], which must not share memory
// with p.
func clipInto(dst, p geom.Polygon, n geom.Vec2, d float64) geom.Polygon {
	k := len(p)
	out := dst[:0]
	for i := 0; i < k; i++ {
		a, b := p[i], p[(i+1)%k]
		da, db := n.Dot(a)-d, n.Dot(b)-d
		if da >= 0 {
			out = append(out, a)
		}
		if (da >= 0) != (db >= 0) {
			out = append(out, a.Add(b.Sub(a).Scale(da/(da-db))))
		}
	}
	return dedupe(out)
}

// dedupe drops corners within mergeTolMM of the previous one (and the last
// if it repeats the first); fewer than three corners give nil.
func dedupe(p geom.Polygon) geom.Polygon {
	out := p[:0]
	for _, v := range p {
		if len(out) > 0 && near(out[len(out)-1], v) {
			continue
		}
		out = append(out, v)
	}
	for len(out) > 1 && near(out[len(out)-1], out[0]) {
		out = out[:len(out)-1]
	}
	if len(out) < 3 {
		return nil
	}
	return out
}

func near(a, b geom.Vec2) bool {
	return math.Abs(a.X-b.X) <= mergeTolMM && math.Abs(a.Y-b.Y) <= mergeTolMM
}

// fitter computes inner-fit regions with buffers it reuses.
type fitter struct {
	a, b geom.Polygon
	out  []geom.Vec2
	cnt  []int
}

// innerFit returns the corners of the region of positions t at which
// convex p+t (bounds plo, phi) lies in the convex area with edges ue
// (bounds ulo, uhi): the positions where p touches two of its edges. When
// p fits only within fitSlackMM, the positions returned lie in the middle
// of that slack. The result is valid until the next call.
func (f *fitter) innerFit(p geom.Polygon, plo, phi geom.Vec2, ue []edge, ulo, uhi geom.Vec2) []geom.Vec2 {
	if r := f.region(p, plo, phi, ue, ulo, uhi, 0); r != nil {
		f.out = append(f.out[:0], r...)
		return f.out
	}
	r := f.region(p, plo, phi, ue, ulo, uhi, fitSlackMM)
	if r == nil {
		return nil
	}
	// A sliver or a speck: merge corners closer than the slack allows.
	f.out, f.cnt = f.out[:0], f.cnt[:0]
	for _, v := range r {
		merged := false
		for i, c := range f.out {
			if v.Sub(c.Scale(1/float64(f.cnt[i]))).Norm() <= 4*fitSlackMM {
				f.out[i], f.cnt[i], merged = c.Add(v), f.cnt[i]+1, true
				break
			}
		}
		if !merged {
			f.out, f.cnt = append(f.out, v), append(f.cnt, 1)
		}
	}
	for i := range f.out {
		f.out[i] = f.out[i].Scale(1 / float64(f.cnt[i]))
	}
	return f.out
}

func (f *fitter) region(p geom.Polygon, plo, phi geom.Vec2, ue []edge, ulo, uhi geom.Vec2, slack float64) geom.Polygon {
	lo := geom.Vec2{X: ulo.X - plo.X - slack, Y: ulo.Y - plo.Y - slack}
	hi := geom.Vec2{X: uhi.X - phi.X + slack, Y: uhi.Y - phi.Y + slack}
	if lo.X > hi.X || lo.Y > hi.Y {
		return nil
	}
	if lo.X == hi.X {
		hi.X += mergeTolMM
	}
	if lo.Y == hi.Y {
		hi.Y += mergeTolMM
	}
	r := append(f.a[:0], lo, geom.Vec2{X: hi.X, Y: lo.Y}, hi, geom.Vec2{X: lo.X, Y: hi.Y})
	other := f.b
	for _, e := range ue {
		lowest := math.Inf(1)
		for _, v := range p {
			lowest = math.Min(lowest, e.n.Dot(v))
		}
		next := clipInto(other, r, e.n, e.n.Dot(e.a)-lowest-slack)
		if next == nil {
			f.a, f.b = r[:0], other[:0]
			return nil
		}
		other, r = r, next
	}
	f.a, f.b = r, other
	return r
}

// leftNormal returns the unit normal pointing left of a→b (inward for a
// counter-clockwise polygon).
func leftNormal(a, b geom.Vec2) geom.Vec2 {
	e := b.Sub(a)
	return e.Perp().Scale(1 / e.Norm())
}
