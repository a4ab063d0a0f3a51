package geom

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r3"
)

// Plane is an oriented plane through Origin with unit Normal.
type Plane struct {
	Origin Vec
	Normal Vec
}

// Dist returns the signed distance of p from the plane (positive on the
// normal's side).
func (pl Plane) Dist(p Vec) float64 { return r3.Dot(r3.Sub(p, pl.Origin), pl.Normal) }

// Project returns the foot of p on the plane.
func (pl Plane) Project(p Vec) Vec { return r3.Sub(p, r3.Scale(pl.Dist(p), pl.Normal)) }

// PlaneFit is a least-squares plane with the numbers behind it.
type PlaneFit struct {
	Plane
	// SumSq is the sum of squared distances of the points from the plane,
	// which equals the smallest eigenvalue of the scatter matrix.
	SumSq float64
	// MaxDist is the largest distance of a point from the plane (mm).
	MaxDist float64
}

// ErrTooFewPoints is returned by FitPlane for fewer than three points.
var ErrTooFewPoints = errors.New("a plane needs at least three points")

// FitPlane returns the least-squares plane of pts: it passes through the
// centroid and its normal is the eigenvector of the scatter matrix
// Σ (p-c)(p-c)ᵀ with the smallest eigenvalue (principal component
// analysis). The normal is oriented along the polygon's vector area so that
// a counter-clockwise polygon gets its right-hand normal.
func FitPlane(pts []Vec) (PlaneFit, error) {
	if len(pts) < 3 {
		return PlaneFit{}, ErrTooFewPoints
	}
	c := Centroid(pts)
	var s [6]float64 // xx, xy, xz, yy, yz, zz
	for _, p := range pts {
		d := r3.Sub(p, c)
		s[0] += d.X * d.X
		s[1] += d.X * d.Y
		s[2] += d.X * d.Z
		s[3] += d.Y * d.Y
		s[4] += d.Y * d.Z
		s[5] += d.Z * d.Z
	}
	sym := mat.NewSymDense(3, []float64{s[0], s[1], s[2], s[1], s[3], s[4], s[2], s[4], s[5]})
	var eig mat.EigenSym
	if !eig.Factorize(sym, true) {
		return PlaneFit{}, errors.New("plane fit: eigen decomposition failed")
	}
	vals := eig.Values(nil)
	var vecs mat.Dense
	eig.VectorsTo(&vecs)
	// gonum returns eigenvalues in ascending order.
	n := Vec{X: vecs.At(0, 0), Y: vecs.At(1, 0), Z: vecs.At(2, 0)}
	if r3.Dot(n, VectorArea(pts)) < 0 {
		n = r3.Scale(-1, n)
	}
	n = r3.Unit(n)
	fit := PlaneFit{Plane: Plane{Origin: c, Normal: n}, SumSq: math.Max(vals[0], 0)}
	for _, p := range pts {
		fit.MaxDist = math.Max(fit.MaxDist, math.Abs(fit.Dist(p)))
	}
	return fit, nil
}

// Frame is a right-handed orthonormal frame: a point and three unit axes.
type Frame struct {
	Origin  Vec
	X, Y, Z Vec
}

// ToLocal returns the coordinates of p in the frame.
func (f Frame) ToLocal(p Vec) Vec {
	d := r3.Sub(p, f.Origin)
	return Vec{X: r3.Dot(d, f.X), Y: r3.Dot(d, f.Y), Z: r3.Dot(d, f.Z)}
}

// ToWorld returns the world point of local coordinates q.
func (f Frame) ToWorld(q Vec) Vec {
	p := r3.Add(f.Origin, r3.Scale(q.X, f.X))
	p = r3.Add(p, r3.Scale(q.Y, f.Y))
	return r3.Add(p, r3.Scale(q.Z, f.Z))
}

// PlaneFrame returns the frame with origin o, z along normal n and x along
// the projection of dir on the plane. It fails when dir is parallel to n
// within tol (a length ratio).
func PlaneFrame(o, n, dir Vec, tol float64) (Frame, error) {
	z := r3.Unit(n)
	x := r3.Sub(dir, r3.Scale(r3.Dot(dir, z), z))
	if r3.Norm(x) <= tol*r3.Norm(dir) || r3.Norm(dir) == 0 {
		return Frame{}, errors.New("frame direction is parallel to the normal")
	}
	x = r3.Unit(x)
	return Frame{Origin: o, X: x, Y: r3.Cross(z, x), Z: z}, nil
}
