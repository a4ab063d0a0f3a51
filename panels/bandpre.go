package panels

import (
	"sort"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// Limits of the constraint-space preconditioner: above them a step falls
// back to the Jacobi preconditioner.
const (
	maxBandFlops = 2e9 // m·b², the work of one band factorization
	maxBandCells = 4e7 // m·(b+1), its memory in float64s (320 MB)
)

// bandPre is a preconditioner for the damped Gauss-Newton matrix
// H = A + w JᵀJ (A: closeness, fairness and damping; J: the gaps'
// gradients over free coordinates) built from P = D + w JᵀJ, D the
// diagonal of A, and applied exactly by the Sherman-Morrison-Woodbury
// identity
//
//	P⁻¹ = D⁻¹ − D⁻¹Jᵀ (I/w + J D⁻¹ Jᵀ)⁻¹ J D⁻¹,
//
// the inner matrix factorized by a band Cholesky after a reverse
// Cuthill-McKee ordering of the gaps (Cuthill and McKee 1969; George
// 1971). With no fairness P is H itself; with fairness the conjugate
// gradients still need a number of steps that does not grow with w,
// where the Jacobi preconditioner needs thousands once the weight is
// heavy.
type bandPre struct {
	s    *solver
	perm []int32 // gap -> row of the band matrix
	bw   int     // half bandwidth
	// band holds the upper band of I/w + J D⁻¹ Jᵀ, row r's entries
	// (r, r) … (r, r+bw) at band[r(bw+1):], then its Cholesky factor
	// (LAPACK's dpbtrf through gonum).
	band   []float64
	factor blas64.TriangularBand
	dinv   []float64 // 1/D per coordinate, 0 on fixed ones
	y      []float64
}

// newBandPre orders the gaps and returns the preconditioner, or nil when
// its factorization would cost more than the limits allow.
func newBandPre(s *solver) *bandPre {
	m := len(s.cons)
	if m == 0 {
		return nil
	}
	// Gaps sharing a node are neighbours.
	adj := make([][]int32, m)
	for _, cs := range s.nodeCons {
		for _, a := range cs {
			for _, b := range cs {
				if a.k != b.k {
					adj[a.k] = append(adj[a.k], b.k)
				}
			}
		}
	}
	for k := range adj {
		adj[k] = sortedUnique(adj[k])
	}
	order := reverseCuthillMcKee(adj)
	perm := make([]int32, m)
	for row, k := range order {
		perm[k] = int32(row)
	}
	bw := 0
	for k, nb := range adj {
		for _, j := range nb {
			bw = max(bw, int(abs32(perm[k]-perm[j])))
		}
	}
	if float64(m)*float64(bw)*float64(bw) > maxBandFlops || float64(m)*float64(bw+1) > maxBandCells {
		return nil
	}
	return &bandPre{s: s, perm: perm, bw: bw, band: make([]float64, m*(bw+1)),
		dinv: make([]float64, len(s.x0)), y: make([]float64, m)}
}

// factor builds and factorizes I/w + J D⁻¹ Jᵀ for the damping mu at the
// last linearization (s.diag holds the undamped diagonal). It reports
// false when the factorization fails.
func (b *bandPre) factorize(mu float64) bool {
	s := b.s
	for i := range b.dinv {
		b.dinv[i] = 0
		if s.free[i] != 0 {
			b.dinv[i] = 1 / (1 + s.fair*s.ltlDg[i/3] + mu*s.diag[i])
		}
	}
	for i := range b.band {
		b.band[i] = 0
	}
	m, stride := len(s.cons), b.bw+1
	for k := 0; k < m; k++ {
		b.band[int(b.perm[k])*stride] = 1 / s.w
	}
	// (J D⁻¹ Jᵀ)_{kl} = Σ over shared coordinates of ∂g_k ∂g_l / D.
	for k := range s.cons {
		ck := &s.cons[k]
		for j, nd := range ck.node {
			gk := ck.grad[j]
			for l := range s.nodeCons[nd] {
				e := s.nodeCons[nd][l]
				if e.k < int32(k) {
					continue
				}
				gl := s.cons[e.k].grad[e.j]
				d := b.dinv[3*nd]*gk.X*gl.X + b.dinv[3*nd+1]*gk.Y*gl.Y + b.dinv[3*nd+2]*gk.Z*gl.Z
				r, c := int(b.perm[k]), int(b.perm[e.k])
				if r > c {
					r, c = c, r
				}
				b.band[r*stride+c-r] += d
			}
		}
	}
	var ok bool
	b.factor, ok = lapack64.Pbtrf(blas64.SymmetricBand{Uplo: blas.Upper, N: m, K: b.bw, Data: b.band, Stride: stride})
	return ok
}

// apply writes z = P⁻¹ r.
func (b *bandPre) apply(r, z []float64) {
	s := b.s
	for i := range z {
		z[i] = r[i] * b.dinv[i]
	}
	for k := range s.cons {
		c := &s.cons[k]
		var v float64
		for j, nd := range c.node {
			v += c.grad[j].X*z[3*nd] + c.grad[j].Y*z[3*nd+1] + c.grad[j].Z*z[3*nd+2]
		}
		b.y[b.perm[k]] = v
	}
	lapack64.Pbtrs(b.factor, blas64.General{Rows: len(b.y), Cols: 1, Data: b.y, Stride: 1})
	for k := range s.cons {
		c := &s.cons[k]
		v := b.y[b.perm[k]]
		for j, nd := range c.node {
			z[3*nd] -= b.dinv[3*nd] * c.grad[j].X * v
			z[3*nd+1] -= b.dinv[3*nd+1] * c.grad[j].Y * v
			z[3*nd+2] -= b.dinv[3*nd+2] * c.grad[j].Z * v
		}
	}
}

// reverseCuthillMcKee returns an ordering of the graph's vertices that
// keeps neighbours close: breadth-first from a vertex of least degree in
// each connected part, neighbours by rising degree (ties by index), the
// whole order reversed.
func reverseCuthillMcKee(adj [][]int32) []int32 {
	n := len(adj)
	seen := make([]bool, n)
	order := make([]int32, 0, n)
	starts := make([]int32, n)
	for i := range starts {
		starts[i] = int32(i)
	}
	sort.SliceStable(starts, func(a, b int) bool { return len(adj[starts[a]]) < len(adj[starts[b]]) })
	var nb []int32
	for _, st := range starts {
		if seen[st] {
			continue
		}
		seen[st] = true
		head := len(order)
		order = append(order, st)
		for head < len(order) {
			v := order[head]
			head++
			nb = nb[:0]
			for _, u := range adj[v] {
				if !seen[u] {
					seen[u] = true
					nb = append(nb, u)
				}
			}
			sort.SliceStable(nb, func(a, b int) bool {
				if da, db := len(adj[nb[a]]), len(adj[nb[b]]); da != db {
					return da < db
				}
				return nb[a] < nb[b]
			})
			order = append(order, nb...)
		}
	}
	for i, j := 0, len(order)-1; i < j; i, j = i+1, j-1 {
		order[i], order[j] = order[j], order[i]
	}
	return order
}

func sortedUnique(xs []int32) []int32 {
	sort.Slice(xs, func(a, b int) bool { return xs[a] < xs[b] })
	out := xs[:0]
	for i, x := range xs {
		if i == 0 || x != xs[i-1] {
			out = append(out, x)
		}
	}
	return out
}

func abs32(x int32) int32 {
	if x < 0 {
		return -x
	}
	return x
}
