package nodes

import (
	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// AxisMethod chooses how node axes are found.
type AxisMethod string

// Axis methods.
const (
	AxisNormal     AxisMethod = "normal"
	AxisLeastTwist AxisMethod = "least-twist"
)

// DefaultAxisStiffness weighs staying close to the normals against twist
// in least-twist axes (radians² of axis tilt against radians² of twist).
const DefaultAxisStiffness = 0.05

// Least-twist solver settings: how often the linearization is renewed,
// and the relative residual of each conjugate-gradient solve.
const (
	leastTwistRounds = 3
	leastTwistCGTol  = 1e-6
)

// NormalAxes returns for every node the normalised sum of the unit normals
// (Newell) of the panels around it. A node on no panel, or whose panel
// normals cancel, is an error naming it.
func NormalAxes(n *quadnet.Net) ([]geom.Vec, error) {
	normals := faceNormals(n)
	sum := make([]geom.Vec, len(n.Nodes))
	for f, face := range n.Faces {
		if !geom.Finite(normals[f]) {
			return nil, faceErr(n, f, "has no area, so no normal")
		}
		for _, c := range face.Corners {
			sum[c] = r3.Add(sum[c], normals[f])
		}
	}
	for i, s := range sum {
		if r3.Norm(s) < degenerateUnit {
			return nil, nodeErr(n, i, "its panels' normals cancel or it has no panel, so it has no axis")
		}
		sum[i] = r3.Unit(s)
	}
	return sum, nil
}

// LeastTwistAxes returns unit axes that minimise
//
//	Σ_members ((a_i − a_j)·m_ij)² + k Σ_nodes |a_i − n_i|²
//
// where n_i are the normal axes, k the stiffness and m_ij the unit vector
// across member ij (e × the mean axis): (a_i − a_j)·m_ij is, to first order,
// the member's twist. Axes with zero twist at every member make the nodes
// torsion-free (Pottmann, Liu, Wallner, Bobenko, Wang, "Geometry of
// multi-layer freeform structures for architecture", SIGGRAPH 2007). The
// quadratic is solved by conjugate gradients, then the axes are normalised
// and the linearization renewed a few times.
func LeastTwistAxes(n *quadnet.Net, topo *quadnet.Topology, normals []geom.Vec, stiffness float64) ([]geom.Vec, error) {
	if !(stiffness > 0) {
		return nil, geom.FieldErrorf("AxisStiffness", "%g must be more than 0", stiffness)
	}
	axes := append([]geom.Vec(nil), normals...)
	m := make([]geom.Vec, len(topo.Edges))
	nv := len(n.Nodes)
	b := make([]float64, 3*nv)
	for i, nn := range normals {
		b[3*i], b[3*i+1], b[3*i+2] = stiffness*nn.X, stiffness*nn.Y, stiffness*nn.Z
	}
	for round := 0; round < leastTwistRounds; round++ {
		for k, e := range topo.Edges {
			dir := r3.Sub(n.Nodes[e.B].Pos, n.Nodes[e.A].Pos)
			m[k] = r3.Unit(r3.Cross(dir, r3.Add(axes[e.A], axes[e.B])))
		}
		diag := make([]float64, 3*nv)
		for i := range diag {
			diag[i] = stiffness
		}
		for k, e := range topo.Edges {
			for _, i := range []int{e.A, e.B} {
				diag[3*i] += m[k].X * m[k].X
				diag[3*i+1] += m[k].Y * m[k].Y
				diag[3*i+2] += m[k].Z * m[k].Z
			}
		}
		mul := func(v, out []float64) {
			for i := range out {
				out[i] = stiffness * v[i]
			}
			for k, e := range topo.Edges {
				mk := m[k]
				d := mk.X*(v[3*e.A]-v[3*e.B]) + mk.Y*(v[3*e.A+1]-v[3*e.B+1]) + mk.Z*(v[3*e.A+2]-v[3*e.B+2])
				out[3*e.A] += d * mk.X
				out[3*e.A+1] += d * mk.Y
				out[3*e.A+2] += d * mk.Z
				out[3*e.B] -= d * mk.X
				out[3*e.B+1] -= d * mk.Y
				out[3*e.B+2] -= d * mk.Z
			}
		}
		// Warm start: solve for the correction to the current axes.
		cur := make([]float64, 3*nv)
		for i, a := range axes {
			cur[3*i], cur[3*i+1], cur[3*i+2] = a.X, a.Y, a.Z
		}
		r := make([]float64, 3*nv)
		mul(cur, r)
		for i := range r {
			r[i] = b[i] - r[i]
		}
		dx, _ := geom.SolveCG(mul, diag, r, leastTwistCGTol, 5000)
		for i := range axes {
			a := geom.Vec{X: cur[3*i] + dx[3*i], Y: cur[3*i+1] + dx[3*i+1], Z: cur[3*i+2] + dx[3*i+2]}
			if r3.Norm(a) == 0 {
				return nil, nodeErr(n, i, "its least-twist axis vanished")
			}
			axes[i] = r3.Unit(a)
		}
	}
	return axes, nil
}
