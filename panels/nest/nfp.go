package nest

import (
	"math"

	"pqfab/geom"
)

// minkowski returns the Minkowski sum of two convex counter-clockwise
// polygons by merging their edges in angle order (a standard result in
// computational geometry; de Berg et al., Computational Geometry, ch. 13).
func minkowski(a, b geom.Polygon) geom.Polygon {
	return minkowskiSorted(startLowest(a), startLowest(b), make(geom.Polygon, 0, len(a)+len(b)))
}

// minkowskiSorted is minkowski for polygons that already start at their
// lowest corner, appending the result to dst.
func minkowskiSorted(a, b, dst geom.Polygon) geom.Polygon {
	n, m := len(a), len(b)
	out := dst[len(dst):]
	i, j := 0, 0
	for i < n || j < m {
		out = append(out, a[i%n].Add(b[j%m]))
		ea := a[(i+1)%n].Sub(a[i%n])
		eb := b[(j+1)%m].Sub(b[j%m])
		c := ea.Cross(eb)
		switch {
		case j >= m:
			i++
		case i >= n:
			j++
		case c > 0:
			i++
		case c < 0:
			j++
		default:
			i++
			j++
		}
	}
	return out
}

// startLowest rotates a polygon's corner list to start at its lowest
// (then leftmost) corner.
func startLowest(p geom.Polygon) geom.Polygon {
	k := 0
	for i, v := range p {
		if v.Y < p[k].Y || (v.Y == p[k].Y && v.X < p[k].X) {
			k = i
		}
	}
	return append(append(geom.Polygon{}, p[k:]...), p[:k]...)
}

// nfp returns the no-fit polygon of moving part b around fixed part a (both
// convex, counter-clockwise): b translated by t overlaps a's interior
// exactly when t lies inside a ⊕ (−b).
func nfp(a, b geom.Polygon) geom.Polygon {
	neg := make(geom.Polygon, len(b))
	for i, v := range b {
		neg[i] = v.Scale(-1)
	}
	return minkowski(a, neg)
}

// inflate moves every edge of a convex counter-clockwise polygon outward
// by d, keeping mitred corners where they reach no farther than
// chamferRatio·d from the corner and cutting sharper corners square to
// their bisector at distance d: either way the result contains every point
// within d of the polygon.
func inflate(p geom.Polygon, d float64) geom.Polygon {
	if d == 0 {
		return p
	}
	k := len(p)
	out := make(geom.Polygon, 0, k)
	for i := range p {
		prev, cur, next := p[(i+k-1)%k], p[i], p[(i+1)%k]
		e1 := cur.Sub(prev).Scale(1 / cur.Sub(prev).Norm())
		e2 := next.Sub(cur).Scale(1 / next.Sub(cur).Norm())
		n1, n2 := e1.Perp().Scale(-1), e2.Perp().Scale(-1)
		bis := n1.Add(n2)
		// Offset along the bisector so both edges move by d.
		c := bis.Dot(n1)
		if m := bis.Scale(d / c); m.Norm() <= chamferRatio*d {
			out = append(out, cur.Add(m))
			continue
		}
		u := bis.Scale(1 / bis.Norm())
		s := d * (1 - u.Dot(n1)) / u.Dot(e1)
		r := d * (1 - u.Dot(n2)) / u.Dot(e2)
		out = append(out, cur.Add(n1.Scale(d)).Add(e1.Scale(s)), cur.Add(n2.Scale(d)).Add(e2.Scale(r)))
	}
	return out
}

// chamferRatio: inflate cuts corners whose mitre would reach farther than
// this many offsets from the corner (corners sharper than a right angle).
const chamferRatio = math.Sqrt2

// strictlyInside reports whether v lies inside convex counter-clockwise p
// by more than tol from every edge.
func strictlyInside(p geom.Polygon, lo, hi geom.Vec2, v geom.Vec2, tol float64) bool {
	if v.X <= lo.X+tol || v.X >= hi.X-tol || v.Y <= lo.Y+tol || v.Y >= hi.Y-tol {
		return false
	}
	k := len(p)
	for i := range p {
		a, b := p[i], p[(i+1)%k]
		e := b.Sub(a)
		if e.Cross(v.Sub(a)) <= tol*math.Sqrt(e.X*e.X+e.Y*e.Y) {
			return false
		}
	}
	return true
}

// lineHits appends the intersections of segment pq with segment ab.
func lineHits(dst []geom.Vec2, p, q, a, b geom.Vec2) []geom.Vec2 {
	r, s := q.Sub(p), b.Sub(a)
	den := r.Cross(s)
	if math.Abs(den) < parallelCross {
		return dst
	}
	t := a.Sub(p).Cross(s) / den
	u := a.Sub(p).Cross(r) / den
	if t >= 0 && t <= 1 && u >= 0 && u <= 1 {
		dst = append(dst, p.Add(r.Scale(t)))
	}
	return dst
}

// parallelCross: unit-free cross product of two edges below which lineHits
// treats them as parallel (they meet nowhere or along a stretch, and the
// stretch's ends are candidates already).
const parallelCross = 1e-12
