// Package testnets builds reference nets with known closed-form geometry
// for the tests of several packages: the cube, the rhombic dodecahedron
// and the rhombic triacontahedron, as OBJ text. Lengths are millimetres.
package testnets

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"
)

// Polyhedron is a closed net: corner points and faces whose corners run
// counter-clockwise seen from outside.
type Polyhedron struct {
	Points []r3.Vec
	Faces  [][]int
}

// OBJ returns the polyhedron as Wavefront OBJ text.
func (p Polyhedron) OBJ() string {
	var b strings.Builder
	for _, v := range p.Points {
		fmt.Fprintf(&b, "v %.17g %.17g %.17g\n", v.X, v.Y, v.Z)
	}
	for _, f := range p.Faces {
		b.WriteString("f")
		for _, c := range f {
			fmt.Fprintf(&b, " %d", c+1)
		}
		b.WriteString("\n")
	}
	return b.String()
}

// Cube returns the cube with edge length a centred on the origin.
func Cube(a float64) Polyhedron {
	h := a / 2
	var p Polyhedron
	for i := 0; i < 8; i++ {
		p.Points = append(p.Points, r3.Vec{X: sgn(i&1) * h, Y: sgn(i&2) * h, Z: sgn(i&4) * h})
	}
	p.Faces = [][]int{{0, 2, 3, 1}, {4, 5, 7, 6}, {0, 1, 5, 4}, {2, 6, 7, 3}, {0, 4, 6, 2}, {1, 3, 7, 5}}
	return p
}

func sgn(bit int) float64 {
	if bit != 0 {
		return 1
	}
	return -1
}

// RhombicDodecahedron returns the rhombic dodecahedron (the dual of the
// cuboctahedron) whose cube vertices are (±s, ±s, ±s) and octahedron
// vertices (±2s, 0, 0) and so on.
func RhombicDodecahedron(s float64) Polyhedron {
	var oct []r3.Vec
	for _, d := range []r3.Vec{{X: 1}, {Y: 1}, {Z: 1}} {
		oct = append(oct, r3.Scale(2*s, d), r3.Scale(-2*s, d))
	}
	return rhombic(oct, 2*s*math.Sqrt2)
}

// RhombicTriacontahedron returns the rhombic triacontahedron (the dual of
// the icosidodecahedron) built on the icosahedron with vertices
// (0, ±s, ±φs) and their cyclic permutations.
func RhombicTriacontahedron(s float64) Polyhedron {
	phi := (1 + math.Sqrt(5)) / 2
	var ico []r3.Vec
	for _, a := range []float64{-s, s} {
		for _, b := range []float64{-phi * s, phi * s} {
			ico = append(ico, r3.Vec{X: 0, Y: a, Z: b}, r3.Vec{X: a, Y: b, Z: 0}, r3.Vec{X: b, Y: 0, Z: a})
		}
	}
	return rhombic(ico, 2*s)
}

// rhombic builds the rhombic polyhedron on a convex deltahedron given by its
// vertices and edge length: one rhombus per edge (a, b), with the other two
// corners on the directions of the centroids of the two triangles at the
// edge, pushed out to the plane through a and b normal to a+b.
func rhombic(v []r3.Vec, edge float64) Polyhedron {
	adj := func(i, j int) bool { return math.Abs(r3.Norm(r3.Sub(v[i], v[j]))-edge) < 1e-9*edge }
	p := Polyhedron{Points: append([]r3.Vec(nil), v...)}
	extra := map[[3]int]int{}
	for i := range v {
		for j := i + 1; j < len(v); j++ {
			if !adj(i, j) {
				continue
			}
			n := r3.Unit(r3.Add(v[i], v[j]))
			var tips []int
			for k := range v {
				if k == i || k == j || !adj(i, k) || !adj(j, k) {
					continue
				}
				key := [3]int{i, j, k}
				sortTri(&key)
				idx, ok := extra[key]
				if !ok {
					u := r3.Unit(r3.Add(r3.Add(v[i], v[j]), v[k]))
					t := r3.Dot(n, v[i]) / r3.Dot(n, u)
					idx = len(p.Points)
					p.Points = append(p.Points, r3.Scale(t, u))
					extra[key] = idx
				}
				tips = append(tips, idx)
			}
			f := []int{i, tips[0], j, tips[1]}
			// Turn the face counter-clockwise seen from outside.
			a, b, c := p.Points[f[0]], p.Points[f[1]], p.Points[f[2]]
			if r3.Dot(r3.Cross(r3.Sub(b, a), r3.Sub(c, b)), n) < 0 {
				f[1], f[3] = f[3], f[1]
			}
			p.Faces = append(p.Faces, f)
		}
	}
	return p
}

func sortTri(k *[3]int) {
	if k[0] > k[1] {
		k[0], k[1] = k[1], k[0]
	}
	if k[1] > k[2] {
		k[1], k[2] = k[2], k[1]
	}
	if k[0] > k[1] {
		k[0], k[1] = k[1], k[0]
	}
}
