package panels

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Planarity holds the planarity measures of one panel.
type Planarity struct {
	// DiagonalGap is the distance between the diagonal lines p0p2 and p1p3
	// of a quad (mm); for larger panels the largest over runs of four
	// consecutive corners; 0 for triangles.
	DiagonalGap float64
	// Ratio is DiagonalGap over the mean diagonal length (Liu, Pottmann,
	// Wallner, Yang, Wang, "Geometric modeling with conical meshes and
	// developable surfaces", SIGGRAPH 2006).
	Ratio float64
	// Flatness is the largest distance of a corner from the corners'
	// least-squares plane (mm): the fabrication number.
	Flatness float64
}

// Measure returns the planarity measures of a panel with corners pts.
func Measure(pts []geom.Vec) (Planarity, error) {
	fit, err := geom.FitPlane(pts)
	if err != nil {
		return Planarity{}, err
	}
	p := Planarity{Flatness: fit.MaxDist}
	k := len(pts)
	if k < 4 {
		return p, nil
	}
	runs := k
	if k == 4 {
		runs = 1
	}
	for i := 0; i < runs; i++ {
		a, b, c, d := pts[i], pts[(i+1)%k], pts[(i+2)%k], pts[(i+3)%k]
		gap := LineDistance(a, c, b, d)
		mean := (r3.Norm(r3.Sub(c, a)) + r3.Norm(r3.Sub(d, b))) / 2
		if gap > p.DiagonalGap {
			p.DiagonalGap = gap
			p.Ratio = gap / mean
		}
	}
	return p, nil
}

// LineDistance returns the distance between the infinite lines through
// a, b and through c, d. For parallel lines it is the distance of c from
// the first line.
func LineDistance(a, b, c, d geom.Vec) float64 {
	u, v := r3.Sub(b, a), r3.Sub(d, c)
	n := r3.Cross(u, v)
	w := r3.Sub(c, a)
	if nn := r3.Norm(n); nn > parallelSin*r3.Norm(u)*r3.Norm(v) {
		return math.Abs(r3.Dot(w, n)) / nn
	}
	return r3.Norm(r3.Cross(w, r3.Unit(u)))
}

// MeasureNet returns the planarity of every face of n.
func MeasureNet(n *quadnet.Net) ([]Planarity, error) {
	out := make([]Planarity, len(n.Faces))
	var pts []geom.Vec
	for f := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		p, err := Measure(pts)
		if err != nil {
			return nil, err
		}
		out[f] = p
	}
	return out, nil
}

// parallelSin is the sine of the angle below which LineDistance treats
// two lines as parallel.
const parallelSin = 1e-12
