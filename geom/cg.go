package geom

import "math"

// SolveCG solves A x = b for a symmetric positive definite A given as a
// product mul(v, out) (out = A v), by conjugate gradients with the Jacobi
// preconditioner diag (the diagonal of A, all entries > 0). It stops when
// the residual falls below relTol times that of x = 0, or after maxIter
// steps, and returns x and the number of steps. Memory is a few vectors,
// so it serves sparse systems of any size without storing the matrix.
func SolveCG(mul func(v, out []float64), diag, b []float64, relTol float64, maxIter int) ([]float64, int) {
	return SolvePCG(mul, func(r, z []float64) {
		for i := range z {
			z[i] = r[i] / diag[i]
		}
	}, b, relTol, maxIter)
}

// SolvePCG is SolveCG with any symmetric positive definite preconditioner:
// pre(r, z) writes z = M⁻¹ r for a fixed M close to A.
func SolvePCG(mul, pre func(v, out []float64), b []float64, relTol float64, maxIter int) ([]float64, int) {
	m := len(b)
	x := make([]float64, m)
	r := append([]float64(nil), b...)
	z := make([]float64, m)
	pre(r, z)
	p := append([]float64(nil), z...)
	ap := make([]float64, m)
	rz := dotVec(r, z)
	r0 := math.Sqrt(dotVec(r, r))
	if r0 == 0 {
		return x, 0
	}
	it := 0
	for it < maxIter {
		it++
		mul(p, ap)
		pap := dotVec(p, ap)
		if !(pap > 0) {
			break // not positive definite along p, or converged to round-off
		}
		alpha := rz / pap
		for i := range x {
			x[i] += alpha * p[i]
			r[i] -= alpha * ap[i]
		}
		if math.Sqrt(dotVec(r, r)) <= relTol*r0 {
			break
		}
		pre(r, z)
		rz2 := dotVec(r, z)
		beta := rz2 / rz
		rz = rz2
		for i := range p {
			p[i] = z[i] + beta*p[i]
		}
	}
	return x, it
}

func dotVec(a, b []float64) float64 {
	var s float64
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}
