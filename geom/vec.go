package geom

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Vec is a 3D vector or point in millimetres (gonum's r3.Vec).
type Vec = r3.Vec

// Vec2 is a 2D vector or point in millimetres, used for plan views and flat
// panel outlines.
type Vec2 struct{ X, Y float64 }

// Add returns a+b.
func (a Vec2) Add(b Vec2) Vec2 { return Vec2{a.X + b.X, a.Y + b.Y} }

// Sub returns a-b.
func (a Vec2) Sub(b Vec2) Vec2 { return Vec2{a.X - b.X, a.Y - b.Y} }

// Scale returns f·a.
func (a Vec2) Scale(f float64) Vec2 { return Vec2{f * a.X, f * a.Y} }

// Dot returns the dot product a·b.
func (a Vec2) Dot(b Vec2) float64 { return a.X*b.X + a.Y*b.Y }

// Cross returns the z component of the 3D cross product a×b.
func (a Vec2) Cross(b Vec2) float64 { return a.X*b.Y - a.Y*b.X }

// Norm returns the length of a.
func (a Vec2) Norm() float64 { return math.Hypot(a.X, a.Y) }

// Perp returns a turned a quarter turn counter-clockwise.
func (a Vec2) Perp() Vec2 { return Vec2{-a.Y, a.X} }

// Rotate returns a turned by angle t (radians) counter-clockwise.
func (a Vec2) Rotate(t float64) Vec2 {
	s, c := math.Sincos(t)
	return Vec2{c*a.X - s*a.Y, s*a.X + c*a.Y}
}

// Finite reports whether every component of v is a finite number.
func Finite(v Vec) bool {
	return !math.IsNaN(v.X+v.Y+v.Z) && !math.IsInf(v.X+v.Y+v.Z, 0)
}

// Centroid returns the mean of pts (the zero vector for no points).
func Centroid(pts []Vec) Vec {
	var c Vec
	if len(pts) == 0 {
		return c
	}
	for _, p := range pts {
		c = r3.Add(c, p)
	}
	return r3.Scale(1/float64(len(pts)), c)
}

// VectorArea returns half the sum of the cross products of consecutive
// corners (Newell's method): its direction is the polygon's right-hand
// normal and its length the area of a planar polygon.
func VectorArea(pts []Vec) Vec {
	var n Vec
	for i, p := range pts {
		q := pts[(i+1)%len(pts)]
		n.X += (p.Y - q.Y) * (p.Z + q.Z)
		n.Y += (p.Z - q.Z) * (p.X + q.X)
		n.Z += (p.X - q.X) * (p.Y + q.Y)
	}
	return r3.Scale(0.5, n)
}

// SignedAngle returns the angle (radians, in (-π, π]) that turns u into v
// about axis; u and v need not be unit vectors or perpendicular to axis.
func SignedAngle(u, v, axis Vec) float64 {
	return math.Atan2(r3.Dot(r3.Cross(u, v), r3.Unit(axis)), r3.Dot(u, v))
}
