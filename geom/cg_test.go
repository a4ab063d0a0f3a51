package geom

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestSolveCG compares with gonum's dense Cholesky solve on a random
// sparse-ish SPD matrix (fixed seed).
func TestSolveCG(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	const n = 60
	a := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		a.SetSym(i, i, 4+rng.Float64())
		if i+1 < n {
			a.SetSym(i, i+1, -1)
		}
		if i+7 < n {
			a.SetSym(i, i+7, -0.5)
		}
	}
	b := make([]float64, n)
	for i := range b {
		b[i] = rng.NormFloat64()
	}
	diag := make([]float64, n)
	for i := range diag {
		diag[i] = a.At(i, i)
	}
	x, it := SolveCG(func(v, out []float64) {
		vv := mat.NewVecDense(n, append([]float64(nil), v...))
		var r mat.VecDense
		r.MulVec(a, vv)
		copy(out, r.RawVector().Data)
	}, diag, b, 1e-12, 500)
	var chol mat.Cholesky
	if !chol.Factorize(a) {
		t.Fatal("not SPD")
	}
	var want mat.VecDense
	if err := chol.SolveVecTo(&want, mat.NewVecDense(n, b)); err != nil {
		t.Fatal(err)
	}
	for i := range x {
		if math.Abs(x[i]-want.AtVec(i)) > 1e-9 {
			t.Fatalf("x[%d] = %g, want %g (after %d steps)", i, x[i], want.AtVec(i), it)
		}
	}
}

// TestFoldAngle: a roof ridge of two panels sloping at 30° each way folds
// by +60°, the same panels as a valley by -60°.
func TestFoldAngle(t *testing.T) {
	s, c := math.Sincos(30 * math.Pi / 180)
	e := Vec{Y: 1} // ridge along y; panel 1 on the -x side
	n1 := Vec{X: -s, Z: c}
	n2 := Vec{X: s, Z: c}
	if got := FoldAngle(n1, n2, e) * 180 / math.Pi; math.Abs(got-60) > 1e-12 {
		t.Errorf("ridge %g", got)
	}
	if got := FoldAngle(n2, n1, e) * 180 / math.Pi; math.Abs(got+60) > 1e-12 {
		t.Errorf("valley %g", got)
	}
}
