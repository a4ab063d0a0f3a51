package nest

import (
	"cmp"
	"math"
	"slices"

	"pqfab/geom"
)

// sameShapeMM: parts whose outlines agree corner by corner within this
// (mm, after moving each to start at its lowest corner) are one shape and
// share their orientations and no-fit polygons.
const sameShapeMM = 1e-8

// orderResMM: lengths (mm) and areas (mm², per mm of this resolution) are
// rounded to this before they order shapes, so that shapes equal within
// rounding noise tie and are ordered by the next key.
const orderResMM = 1e-6

// shape is a set of parts with the same outline up to translation and
// the corner it starts at.
type shape struct {
	poly      geom.Polygon   // outline from its lowest (then leftmost) corner, that corner at the origin
	hull      geom.Polygon   // convex hull of poly
	pieces    []geom.Polygon // convex pieces that tile poly
	convex    bool
	area      float64
	perim     float64
	hullPerim float64
	minW      float64 // least width over all directions (of the hull)
	diam      float64 // greatest distance between two corners
	parts     []int   // the parts of this shape, in index order
	starts    []geom.Vec2
	key       []float64 // ordering key: rounded area, perimeter, sorted edge lengths
}

// shapesOf groups the parts by shape and orders the shapes by a geometric
// key alone: rounded area (largest first), rounded perimeter, the sorted
// rounded edge lengths, then the exact corners. The order of the parts in
// the input decides only which of two equal parts is which.
func shapesOf(parts []Part) []*shape {
	type entry struct {
		rel   geom.Polygon
		start geom.Vec2
		key   []int64
	}
	es := make([]entry, len(parts))
	for i, p := range parts {
		k := 0
		for j, v := range p.Outline {
			if v.Y < p.Outline[k].Y || (v.Y == p.Outline[k].Y && v.X < p.Outline[k].X) {
				k = j
			}
		}
		n := len(p.Outline)
		rel := make(geom.Polygon, n)
		key := make([]int64, 0, 2*n+1)
		key = append(key, int64(n))
		for j := range rel {
			rel[j] = p.Outline[(k+j)%n].Sub(p.Outline[k])
			key = append(key, int64(math.Round(rel[j].X/sameShapeMM)), int64(math.Round(rel[j].Y/sameShapeMM)))
		}
		es[i] = entry{rel: rel, start: p.Outline[k], key: key}
	}
	idx := make([]int, len(parts))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return slices.Compare(es[a].key, es[b].key) })
	var shapes []*shape
	for i := 0; i < len(idx); {
		j := i
		for j < len(idx) && slices.Equal(es[idx[j]].key, es[idx[i]].key) {
			j++
		}
		group := slices.Clone(idx[i:j])
		slices.Sort(group)
		// The representative is the exactly smallest outline of the group,
		// so that it does not depend on the order of the input.
		rep := group[0]
		for _, g := range group[1:] {
			if comparePoly(es[g].rel, es[rep].rel) < 0 {
				rep = g
			}
		}
		s := newShape(es[rep].rel)
		for _, g := range group {
			s.parts = append(s.parts, g)
			s.starts = append(s.starts, es[g].start)
		}
		shapes = append(shapes, s)
		i = j
	}
	slices.SortStableFunc(shapes, func(a, b *shape) int {
		if c := compareKey(a.key, b.key); c != 0 {
			return c
		}
		return comparePoly(a.poly, b.poly)
	})
	return shapes
}

// newShape measures an outline given from its lowest corner.
func newShape(poly geom.Polygon) *shape {
	s := &shape{poly: poly, hull: geom.ConvexHull(poly), area: poly.Area(), perim: poly.Perimeter()}
	s.hullPerim = s.hull.Perimeter()
	s.pieces = convexParts(poly)
	s.convex = poly.Convex()
	s.minW = minWidth(s.hull)
	for i, a := range s.hull {
		for _, b := range s.hull[i+1:] {
			s.diam = max(s.diam, b.Sub(a).Norm())
		}
	}
	r := func(v float64) float64 { return math.Round(v / orderResMM) }
	var edges []float64
	for i := range poly {
		edges = append(edges, r(poly[(i+1)%len(poly)].Sub(poly[i]).Norm()))
	}
	slices.SortFunc(edges, func(a, b float64) int { return cmp.Compare(b, a) })
	s.key = append([]float64{r(s.area / orderResMM), r(s.perim)}, edges...)
	return s
}

// compareKey orders shape keys largest first, a longer key (more corners)
// first on a tie of the common part.
func compareKey(a, b []float64) int {
	for i := 0; i < len(a) && i < len(b); i++ {
		if c := cmp.Compare(b[i], a[i]); c != 0 {
			return c
		}
	}
	return cmp.Compare(len(b), len(a))
}

func comparePoly(a, b geom.Polygon) int {
	if c := cmp.Compare(len(a), len(b)); c != 0 {
		return c
	}
	for i := range a {
		if c := cmp.Compare(a[i].X, b[i].X); c != 0 {
			return c
		}
		if c := cmp.Compare(a[i].Y, b[i].Y); c != 0 {
			return c
		}
	}
	return 0
}

// minWidth returns the least width of a convex polygon over all
// directions: the least over its edges of the farthest corner from the
// edge's line (rotating calipers, by brute force).
func minWidth(hull geom.Polygon) float64 {
	best := math.Inf(1)
	for i := range hull {
		a, b := hull[i], hull[(i+1)%len(hull)]
		n := leftNormal(a, b)
		far := 0.0
		for _, v := range hull {
			far = math.Max(far, n.Dot(v.Sub(a)))
		}
		best = math.Min(best, far)
	}
	return best
}

// turn returns the exact sine and cosine of a turn by deg degrees when deg
// is a whole number of quarter turns, and math.Sincos otherwise.
func turn(deg float64) (s, c float64) {
	switch math.Mod(math.Mod(deg, 360)+360, 360) {
	case 0:
		return 0, 1
	case 90:
		return 1, 0
	case 180:
		return 0, -1
	case 270:
		return -1, 0
	}
	return math.Sincos(deg * math.Pi / 180)
}

// orient returns p mirrored (x → −x, then reversed to stay
// counter-clockwise) if mirror, then turned by deg degrees about the
// origin, then moved by t.
func orient(p geom.Polygon, mirror bool, deg float64, t geom.Vec2) geom.Polygon {
	s, c := turn(deg)
	q := make(geom.Polygon, len(p))
	n := len(p)
	for i, v := range p {
		j := i
		if mirror {
			v.X = -v.X
			j = (n - i) % n
		}
		q[j] = geom.Vec2{X: c*v.X - s*v.Y + t.X, Y: s*v.X + c*v.Y + t.Y}
	}
	return q
}

// turnVec turns v by deg degrees after mirroring it if mirror.
func turnVec(v geom.Vec2, mirror bool, deg float64) geom.Vec2 {
	if mirror {
		v.X = -v.X
	}
	s, c := turn(deg)
	return geom.Vec2{X: c*v.X - s*v.Y, Y: s*v.X + c*v.Y}
}
