package geom

import (
	"math"
	"math/big"
	"sort"
)

// Polygon is a closed 2D polygon; the last corner joins the first.
type Polygon []Vec2

// SignedArea returns the area, positive for counter-clockwise corners
// (shoelace formula).
func (p Polygon) SignedArea() float64 {
	var a float64
	for i, u := range p {
		v := p[(i+1)%len(p)]
		a += u.X*v.Y - v.X*u.Y
	}
	return a / 2
}

// Area returns the unsigned area.
func (p Polygon) Area() float64 { return math.Abs(p.SignedArea()) }

// CCW reports whether the corners run counter-clockwise.
func (p Polygon) CCW() bool { return p.SignedArea() > 0 }

// Perimeter returns the sum of the edge lengths.
func (p Polygon) Perimeter() float64 {
	var s float64
	for i, u := range p {
		s += p[(i+1)%len(p)].Sub(u).Norm()
	}
	return s
}

// Reversed returns the polygon with its corners in the opposite order,
// keeping the first corner first.
func (p Polygon) Reversed() Polygon {
	q := make(Polygon, len(p))
	for i := range p {
		q[i] = p[(len(p)-i)%len(p)]
	}
	return q
}

// Convex reports whether the polygon is convex: every turn has the same
// sign (collinear corners are allowed) and the boundary winds once.
func (p Polygon) Convex() bool {
	n := len(p)
	if n < 3 {
		return false
	}
	sign := 0
	var turn float64
	for i := range p {
		a, b, c := p[i], p[(i+1)%n], p[(i+2)%n]
		o := Orient(a, b, c)
		if o != 0 {
			if sign == 0 {
				sign = o
			} else if o != sign {
				return false
			}
		}
		turn += math.Atan2(b.Sub(a).Cross(c.Sub(b)), b.Sub(a).Dot(c.Sub(b)))
	}
	return sign != 0 && math.Abs(math.Abs(turn)-2*math.Pi) < windingTol
}

// Bounds returns the lower-left and upper-right corners of the bounding box.
func (p Polygon) Bounds() (lo, hi Vec2) {
	lo = Vec2{math.Inf(1), math.Inf(1)}
	hi = Vec2{math.Inf(-1), math.Inf(-1)}
	for _, v := range p {
		lo = Vec2{math.Min(lo.X, v.X), math.Min(lo.Y, v.Y)}
		hi = Vec2{math.Max(hi.X, v.X), math.Max(hi.Y, v.Y)}
	}
	return lo, hi
}

// Translate returns p moved by d.
func (p Polygon) Translate(d Vec2) Polygon {
	q := make(Polygon, len(p))
	for i, v := range p {
		q[i] = v.Add(d)
	}
	return q
}

// Rotate returns p turned by t radians about the origin.
func (p Polygon) Rotate(t float64) Polygon {
	q := make(Polygon, len(p))
	for i, v := range p {
		q[i] = v.Rotate(t)
	}
	return q
}

// Contains reports whether v lies inside p or on its boundary (exact
// orientation tests for the boundary, crossing number inside).
func (p Polygon) Contains(v Vec2) bool {
	in := false
	for i, a := range p {
		b := p[(i+1)%len(p)]
		if OnSegment(a, b, v) {
			return true
		}
		if (a.Y > v.Y) != (b.Y > v.Y) {
			o := Orient(a, b, v)
			if (b.Y > a.Y && o > 0) || (b.Y < a.Y && o < 0) {
				in = !in
			}
		}
	}
	return in
}

// orientErr bounds the rounding error of the float orientation test
// relative to its magnitude (Shewchuk's ccwerrboundA, rounded up).
const orientErr = 3.4e-16

// Orient returns +1 if c lies left of the directed line a→b, -1 if right
// and 0 if the three points are collinear. The sign is exact: a float
// filter answers most calls and exact rational arithmetic the rest.
func Orient(a, b, c Vec2) int {
	l := (b.X - a.X) * (c.Y - a.Y)
	r := (b.Y - a.Y) * (c.X - a.X)
	d := l - r
	if bound := orientErr * (math.Abs(l) + math.Abs(r)); d > bound {
		return 1
	} else if d < -bound {
		return -1
	}
	return orientExact(a, b, c)
}

func orientExact(a, b, c Vec2) int {
	r := func(f float64) *big.Rat { return new(big.Rat).SetFloat64(f) }
	bx := new(big.Rat).Sub(r(b.X), r(a.X))
	by := new(big.Rat).Sub(r(b.Y), r(a.Y))
	cx := new(big.Rat).Sub(r(c.X), r(a.X))
	cy := new(big.Rat).Sub(r(c.Y), r(a.Y))
	l := new(big.Rat).Mul(bx, cy)
	return l.Sub(l, new(big.Rat).Mul(by, cx)).Sign()
}

// OnSegment reports whether c lies on the closed segment ab (exact).
func OnSegment(a, b, c Vec2) bool {
	return Orient(a, b, c) == 0 &&
		math.Min(a.X, b.X) <= c.X && c.X <= math.Max(a.X, b.X) &&
		math.Min(a.Y, b.Y) <= c.Y && c.Y <= math.Max(a.Y, b.Y)
}

// SegmentsIntersect reports whether the closed segments ab and cd share a
// point, touching included. The answer is exact for the float inputs.
func SegmentsIntersect(a, b, c, d Vec2) bool {
	o1, o2 := Orient(a, b, c), Orient(a, b, d)
	o3, o4 := Orient(c, d, a), Orient(c, d, b)
	if o1 != o2 && o3 != o4 && o1*o2 <= 0 && o3*o4 <= 0 {
		if o1 != 0 || o2 != 0 {
			return true
		}
	}
	return OnSegment(a, b, c) || OnSegment(a, b, d) || OnSegment(c, d, a) || OnSegment(c, d, b)
}

// SegmentDistance returns the shortest distance between segments ab and cd.
func SegmentDistance(a, b, c, d Vec2) float64 {
	if SegmentsIntersect(a, b, c, d) {
		return 0
	}
	return math.Min(math.Min(pointSegDist(a, c, d), pointSegDist(b, c, d)),
		math.Min(pointSegDist(c, a, b), pointSegDist(d, a, b)))
}

func pointSegDist(p, a, b Vec2) float64 {
	ab := b.Sub(a)
	l2 := ab.Dot(ab)
	if l2 == 0 {
		return p.Sub(a).Norm()
	}
	t := math.Max(0, math.Min(1, p.Sub(a).Dot(ab)/l2))
	return p.Sub(a.Add(ab.Scale(t))).Norm()
}

// SelfIntersects reports whether two non-adjacent edges of p share a point.
func (p Polygon) SelfIntersects() bool {
	n := len(p)
	for i := 0; i < n; i++ {
		for j := i + 2; j < n; j++ {
			if i == 0 && j == n-1 {
				continue
			}
			if SegmentsIntersect(p[i], p[(i+1)%n], p[j], p[(j+1)%n]) {
				return true
			}
		}
	}
	return false
}

// ConvexHull returns the convex hull of pts, counter-clockwise, without
// collinear corners (Andrew's monotone chain).
func ConvexHull(pts []Vec2) Polygon {
	s := append([]Vec2(nil), pts...)
	sort.Slice(s, func(i, j int) bool {
		if s[i].X != s[j].X {
			return s[i].X < s[j].X
		}
		return s[i].Y < s[j].Y
	})
	if len(s) < 3 {
		return Polygon(s)
	}
	h := make([]Vec2, 0, 2*len(s))
	for _, p := range s {
		for len(h) >= 2 && Orient(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	lower := len(h) + 1
	for i := len(s) - 2; i >= 0; i-- {
		p := s[i]
		for len(h) >= lower && Orient(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	return Polygon(h[:len(h)-1])
}

// windingTol: total turning (radians) within this of ±2π winds once.
const windingTol = 1e-6
