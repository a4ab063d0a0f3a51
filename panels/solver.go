package panels

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Solver constants.
const (
	initialGapWeight = 100.0 // w at the start, against a closeness weight of 1 (per mm²)
	weightRise       = 10.0  // the weight's factor when a round shrank the gaps too little
	maxGapWeight     = 1e12  // no heavier weight: the round after it ends the run
	violationShrink  = 0.25  // a round that shrinks the largest gap below this share keeps the weight
	shiftGate        = 4.0   // the multipliers move once the largest gap is within this many tolerances
	gnConverged      = 1e-5  // relative energy decrease that ends a round
	roundSteps       = 30    // steps that end a round
	roundGain        = 0.01  // a round gains when it cuts the total excess by this share
	stallRounds      = 4     // rounds in a row without a gain end the run
	initialDamping   = 1e-6  // Levenberg-Marquardt damping (share of the diagonal): start and bounds
	minDamping       = 1e-12
	maxDamping       = 1e6
	cgRelTol         = 1e-6 // conjugate gradients: relative residual
	cgMaxIter        = 2000
)

// gapCon is one planarity constraint: the signed gap between the diagonal
// lines of corners a, b, c, d (lines ac and bd).
type gapCon struct {
	node  [4]int32
	face  int32
	w     float64
	shift float64 // augmented-Lagrangian shift: multiplier / (2w)
	scale float64 // |d1 × d2| of the input (mm²): turns a volume into a gap
	val   float64
	grad  [4]geom.Vec
}

// conCorner is corner j of gap k.
type conCorner struct{ k, j int32 }

// solver holds the state of one planarization.
type solver struct {
	net  *quadnet.Net
	x0   []float64 // initial positions, 3 per node
	free []float64 // 1 for a coordinate that may move, else 0
	cons []gapCon
	w    float64 // the gap weight of the current round
	diag []float64
	// nodeCons lists, per node, the gaps it is a corner of (gap k, its
	// corner j).
	nodeCons [][]conCorner
	band     *bandPre  // made at the first heavy round; nil where too costly
	banded   bool      // band was made (or found too costly)
	clamped  bool      // a step was held back by the allowed move
	nbr      [][]int32 // neighbours of each node over the net's edges
	fair     float64
	ltlDg    []float64 // diagonal of LᵀL per node
	pts      []geom.Vec
}

func newSolver(n *quadnet.Net, topo *quadnet.Topology, opt PlanarizeOptions) *solver {
	s := &solver{net: n, fair: opt.Fairness}
	s.x0 = make([]float64, 3*len(n.Nodes))
	s.free = make([]float64, 3*len(n.Nodes))
	for i, nd := range n.Nodes {
		s.x0[3*i], s.x0[3*i+1], s.x0[3*i+2] = nd.Pos.X, nd.Pos.Y, nd.Pos.Z
		if opt.Fixed != nil && opt.Fixed[i] {
			continue
		}
		if !opt.Vertical {
			s.free[3*i], s.free[3*i+1] = 1, 1
		}
		s.free[3*i+2] = 1
	}
	for f, face := range n.Faces {
		k := len(face.Corners)
		runs := k
		switch {
		case k < 4:
			runs = 0
		case k == 4:
			runs = 1
		}
		for r := 0; r < runs; r++ {
			var c gapCon
			for j := 0; j < 4; j++ {
				c.node[j] = int32(face.Corners[(r+j)%k])
			}
			c.face = int32(f)
			p := func(j int) geom.Vec { return n.Nodes[c.node[j]].Pos }
			c.scale = r3.Norm(r3.Cross(r3.Sub(p(2), p(0)), r3.Sub(p(3), p(1))))
			s.cons = append(s.cons, c)
		}
	}
	s.setWeight(initialGapWeight)
	s.nodeCons = make([][]conCorner, len(n.Nodes))
	for k, c := range s.cons {
		for j, nd := range c.node {
			s.nodeCons[nd] = append(s.nodeCons[nd], conCorner{int32(k), int32(j)})
		}
	}
	s.nbr = make([][]int32, len(n.Nodes))
	for i, es := range topo.NodeEdges {
		for _, e := range es {
			s.nbr[i] = append(s.nbr[i], int32(topo.Other(e, i)))
		}
	}
	// diag(LᵀL)_i = 1 + Σ_{j: i ∈ N(j)} 1/deg_j².
	s.ltlDg = make([]float64, len(n.Nodes))
	for i := range s.ltlDg {
		s.ltlDg[i] = 1
	}
	for _, nb := range s.nbr {
		if len(nb) == 0 {
			continue
		}
		inv := 1 / float64(len(nb))
		for _, i := range nb {
			s.ltlDg[i] += inv * inv
		}
	}
	return s
}

func vecAt(x []float64, i int32) geom.Vec {
	return geom.Vec{X: x[3*i], Y: x[3*i+1], Z: x[3*i+2]}
}

// gapAndGrad returns the planarity measure of the run a, b, c, d and its
// gradient: the volume of the tetrahedron abcd (six times it,
// e·(d1 × d2) with e = b − a, d1 = c − a, d2 = d − b) divided by the
// length scale |d1 × d2| of the input, s0. Where the diagonals' cross
// product keeps its input length this is the signed gap between lines ac
// and bd (Liu et al. 2006); it is zero exactly when the four corners lie
// in one plane. Being a polynomial of the corners, with s0 held, its
// Gauss-Newton steps do not stall where a panel's normal turns, as the
// gap's own normalisation makes them.
func gapAndGrad(a, b, c, d geom.Vec, s0 float64) (float64, [4]geom.Vec) {
	d1, d2, e := r3.Sub(c, a), r3.Sub(d, b), r3.Sub(b, a)
	n := r3.Cross(d1, d2)
	var g [4]geom.Vec
	if s0 == 0 {
		return 0, g
	}
	inv := 1 / s0
	gd1 := r3.Scale(inv, r3.Cross(d2, e)) // ∂/∂d1
	gd2 := r3.Scale(inv, r3.Cross(e, d1)) // ∂/∂d2
	ge := r3.Scale(inv, n)                // ∂/∂e
	g[0] = r3.Scale(-1, r3.Add(gd1, ge))
	g[1] = r3.Sub(ge, gd2)
	g[2] = gd1
	g[3] = gd2
	return r3.Dot(e, n) * inv, g
}

// setWeight sets every gap's weight to w, keeping each multiplier
// 2 w s_c as it is.
func (s *solver) setWeight(w float64) {
	for k := range s.cons {
		c := &s.cons[k]
		if c.w > 0 {
			c.shift *= c.w / w
		}
		c.w = w
	}
	s.w = w
}

// violation returns the largest gap at the last linearization.
func (s *solver) violation() float64 {
	var v float64
	for _, c := range s.cons {
		v = math.Max(v, math.Abs(c.val))
	}
	return v
}

// linearize computes every constraint's value and gradient at x.
func (s *solver) linearize(x []float64) {
	for k := range s.cons {
		c := &s.cons[k]
		c.val, c.grad = gapAndGrad(vecAt(x, c.node[0]), vecAt(x, c.node[1]), vecAt(x, c.node[2]), vecAt(x, c.node[3]), c.scale)
	}
}

// lap writes the umbrella Laplacian of u (3 per node) into out.
func (s *solver) lap(u, out []float64) {
	for i, nb := range s.nbr {
		ox, oy, oz := u[3*i], u[3*i+1], u[3*i+2]
		if len(nb) > 0 {
			inv := 1 / float64(len(nb))
			var mx, my, mz float64
			for _, j := range nb {
				mx += u[3*j]
				my += u[3*j+1]
				mz += u[3*j+2]
			}
			ox -= inv * mx
			oy -= inv * my
			oz -= inv * mz
		}
		out[3*i], out[3*i+1], out[3*i+2] = ox, oy, oz
	}
}

// lapT adds Lᵀ y to out.
func (s *solver) lapTAdd(y, out []float64, scale float64) {
	for i, nb := range s.nbr {
		out[3*i] += scale * y[3*i]
		out[3*i+1] += scale * y[3*i+1]
		out[3*i+2] += scale * y[3*i+2]
		if len(nb) == 0 {
			continue
		}
		inv := scale / float64(len(nb))
		for _, j := range nb {
			out[3*j] -= inv * y[3*i]
			out[3*j+1] -= inv * y[3*i+1]
			out[3*j+2] -= inv * y[3*i+2]
		}
	}
}

// energy returns E(x).
func (s *solver) energy(x []float64) float64 {
	var e float64
	for _, c := range s.cons {
		g, _ := gapAndGrad(vecAt(x, c.node[0]), vecAt(x, c.node[1]), vecAt(x, c.node[2]), vecAt(x, c.node[3]), c.scale)
		e += c.w * (g + c.shift) * (g + c.shift)
	}
	u := make([]float64, len(x))
	for i := range x {
		u[i] = x[i] - s.x0[i]
		e += u[i] * u[i]
	}
	if s.fair > 0 {
		lu := make([]float64, len(x))
		s.lap(u, lu)
		for _, v := range lu {
			e += s.fair * v * v
		}
	}
	return e
}

// gradient returns ∇E/2 at x, zero on fixed coordinates (constraints
// linearized at x).
func (s *solver) gradient(x []float64) []float64 {
	g := make([]float64, len(x))
	u := make([]float64, len(x))
	for i := range x {
		u[i] = x[i] - s.x0[i]
		g[i] = u[i]
	}
	if s.fair > 0 {
		lu := make([]float64, len(x))
		s.lap(u, lu)
		s.lapTAdd(lu, g, s.fair)
	}
	for _, c := range s.cons {
		f := c.w * (c.val + c.shift)
		for j, nd := range c.node {
			g[3*nd] += f * c.grad[j].X
			g[3*nd+1] += f * c.grad[j].Y
			g[3*nd+2] += f * c.grad[j].Z
		}
	}
	for i := range g {
		g[i] *= s.free[i]
	}
	return g
}

// mul writes H v into out for the damped Gauss-Newton matrix
// H = Σ w ∇g∇gᵀ + I + λLᵀL + μD (D the diagonal of the undamped matrix,
// Marquardt 1963), restricted to free coordinates (identity on fixed ones).
func (s *solver) mul(v, out, tmp []float64, mu float64) {
	for i := range v {
		out[i] = (1 + mu*s.diag[i]) * v[i] * s.free[i]
	}
	if s.fair > 0 {
		s.lap(v, tmp)
		s.lapTAdd(tmp, out, s.fair)
	}
	for _, c := range s.cons {
		var dot float64
		for j, nd := range c.node {
			dot += c.grad[j].X*v[3*nd] + c.grad[j].Y*v[3*nd+1] + c.grad[j].Z*v[3*nd+2]
		}
		dot *= c.w
		for j, nd := range c.node {
			out[3*nd] += dot * c.grad[j].X
			out[3*nd+1] += dot * c.grad[j].Y
			out[3*nd+2] += dot * c.grad[j].Z
		}
	}
	for i := range out {
		if s.free[i] == 0 {
			out[i] = v[i]
		}
	}
}

// solve returns the Gauss-Newton step H⁻¹ g by Jacobi-preconditioned
// conjugate gradients (g is zero on fixed coordinates, and so is the step).
func (s *solver) solve(g []float64, mu float64) []float64 {
	m := len(g)
	if len(s.diag) != m {
		s.diag = make([]float64, m)
	}
	diag := s.diag
	for i := range diag {
		diag[i] = 1 + s.fair*s.ltlDg[i/3]
	}
	for _, c := range s.cons {
		for j, nd := range c.node {
			diag[3*nd] += c.w * c.grad[j].X * c.grad[j].X
			diag[3*nd+1] += c.w * c.grad[j].Y * c.grad[j].Y
			diag[3*nd+2] += c.w * c.grad[j].Z * c.grad[j].Z
		}
	}
	pre := make([]float64, m)
	for i := range diag {
		pre[i] = (1 + mu) * diag[i]
		if s.free[i] == 0 {
			pre[i] = 1
		}
	}
	tmp := make([]float64, m)
	mul := func(v, out []float64) { s.mul(v, out, tmp, mu) }
	if s.w > initialGapWeight && !s.banded {
		s.band, s.banded = newBandPre(s), true
	}
	if s.band != nil && s.w > initialGapWeight && s.band.factorize(mu) {
		x, _ := geom.SolvePCG(mul, s.band.apply, g, cgRelTol, cgMaxIter)
		return x
	}
	x, _ := geom.SolveCG(mul, pre, g, cgRelTol, cgMaxIter)
	return x
}

// flatness returns every panel's flatness deviation at x.
func (s *solver) flatness(x []float64) []float64 {
	out := make([]float64, len(s.net.Faces))
	for f, face := range s.net.Faces {
		if len(face.Corners) < 4 {
			continue
		}
		s.pts = s.pts[:0]
		for _, c := range face.Corners {
			s.pts = append(s.pts, vecAt(x, int32(c)))
		}
		fit, err := geom.FitPlane(s.pts)
		if err == nil {
			out[f] = fit.MaxDist
		}
	}
	return out
}

// clamp shortens every node's move from its input position to at most
// limit (mm), so that every iterate keeps within the allowed move.
func (s *solver) clamp(x []float64, limit float64) {
	for i := 0; i < len(x); i += 3 {
		dx, dy, dz := x[i]-s.x0[i], x[i+1]-s.x0[i+1], x[i+2]-s.x0[i+2]
		if m := math.Sqrt(dx*dx + dy*dy + dz*dz); m > limit {
			s.clamped = true
			f := limit / m
			x[i], x[i+1], x[i+2] = s.x0[i]+f*dx, s.x0[i+1]+f*dy, s.x0[i+2]+f*dz
		}
	}
}

// maxMove returns the largest node move at x.
func (s *solver) maxMove(x []float64) float64 {
	var m float64
	for i := 0; i < len(x); i += 3 {
		dx, dy, dz := x[i]-s.x0[i], x[i+1]-s.x0[i+1], x[i+2]-s.x0[i+2]
		m = math.Max(m, dx*dx+dy*dy+dz*dz)
	}
	return math.Sqrt(m)
}
