package quadnet

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// bowTie reports whether the outline of a panel's corners, projected on
// their least-squares plane, crosses itself, and which sides cross: sides
// i (corner i to i+1) and j, i < j. A crossing counts only when it is
// proper and clear: each of the four triangles the two sides span has an
// area of at least minAreaMM2, so collinear or nearly collinear corners
// (a degenerate panel, reported by the area test) are not called a
// bow-tie. Triangles cannot cross; the work is constant per panel.
func bowTie(pts []geom.Vec, minAreaMM2 float64) (i, j int, ok bool) {
	k := len(pts)
	if k < 4 {
		return 0, 0, false
	}
	if k > MaxCorners {
		return 0, 0, false
	}
	origin, normal := leastSquaresPlane(pts)
	u, v := planeAxes(normal)
	var q [MaxCorners]geom.Vec2
	for c, p := range pts {
		d := r3.Sub(p, origin)
		q[c] = geom.Vec2{X: r3.Dot(d, u), Y: r3.Dot(d, v)}
	}
	lim := 2 * minAreaMM2 // twice a triangle's area is the cross product
	for i := 0; i < k; i++ {
		for j := i + 2; j < k; j++ {
			if i == 0 && j == k-1 {
				continue
			}
			a, b, c, d := q[i], q[(i+1)%k], q[j], q[(j+1)%k]
			c1, c2 := b.Sub(a).Cross(c.Sub(a)), b.Sub(a).Cross(d.Sub(a))
			c3, c4 := d.Sub(c).Cross(a.Sub(c)), d.Sub(c).Cross(b.Sub(c))
			if c1*c2 < 0 && c3*c4 < 0 &&
				math.Min(math.Min(math.Abs(c1), math.Abs(c2)), math.Min(math.Abs(c3), math.Abs(c4))) >= lim {
				return i, j, true
			}
		}
	}
	return 0, 0, false
}

// jacobiSweeps caps the sweeps of leastSquaresPlane's eigen solver; a
// 3×3 matrix converges in five or six (quadratic convergence), so the cap
// only bounds the work.
const jacobiSweeps = 32

// leastSquaresPlane returns the centroid of pts and the unit normal of
// their least-squares plane: the eigenvector of the scatter matrix
// Σ (p-c)(p-c)ᵀ with the smallest eigenvalue, as FitPlane computes it, but
// by cyclic Jacobi rotations on the 3×3 matrix without allocating (Golub
// and Van Loan, "Matrix Computations", §8.5). The normal's sign is not
// fixed.
func leastSquaresPlane(pts []geom.Vec) (geom.Vec, geom.Vec) {
	c := geom.Centroid(pts)
	var a [3][3]float64
	for _, p := range pts {
		d := [3]float64{p.X - c.X, p.Y - c.Y, p.Z - c.Z}
		for i := range 3 {
			for j := range 3 {
				a[i][j] += d[i] * d[j]
			}
		}
	}
	v := [3][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}} // columns: eigenvectors
	for sweep := 0; sweep < jacobiSweeps; sweep++ {
		off := a[0][1]*a[0][1] + a[0][2]*a[0][2] + a[1][2]*a[1][2]
		if off == 0 {
			break
		}
		for _, pq := range [3][2]int{{0, 1}, {0, 2}, {1, 2}} {
			p, q := pq[0], pq[1]
			if a[p][q] == 0 {
				continue
			}
			// Rotation zeroing a[p][q]: t = tan θ, the smaller root.
			theta := (a[q][q] - a[p][p]) / (2 * a[p][q])
			t := 1 / (math.Abs(theta) + math.Sqrt(theta*theta+1))
			if theta < 0 {
				t = -t
			}
			cs := 1 / math.Sqrt(t*t+1)
			sn := t * cs
			for k := range 3 {
				akp, akq := a[k][p], a[k][q]
				a[k][p], a[k][q] = cs*akp-sn*akq, sn*akp+cs*akq
			}
			for k := range 3 {
				apk, aqk := a[p][k], a[q][k]
				a[p][k], a[q][k] = cs*apk-sn*aqk, sn*apk+cs*aqk
			}
			for k := range 3 {
				vkp, vkq := v[k][p], v[k][q]
				v[k][p], v[k][q] = cs*vkp-sn*vkq, sn*vkp+cs*vkq
			}
		}
	}
	m := 0
	for i := 1; i < 3; i++ {
		if a[i][i] < a[m][m] {
			m = i
		}
	}
	return c, r3.Unit(geom.Vec{X: v[0][m], Y: v[1][m], Z: v[2][m]})
}

// planeAxes returns two unit vectors that with the unit normal n make an
// orthonormal frame.
func planeAxes(n geom.Vec) (u, v geom.Vec) {
	ax := geom.Vec{X: 1}
	if math.Abs(n.Y) < math.Abs(n.X) && math.Abs(n.Y) <= math.Abs(n.Z) {
		ax = geom.Vec{Y: 1}
	} else if math.Abs(n.Z) < math.Abs(n.X) {
		ax = geom.Vec{Z: 1}
	}
	u = r3.Unit(r3.Cross(n, ax))
	return u, r3.Cross(n, u)
}
