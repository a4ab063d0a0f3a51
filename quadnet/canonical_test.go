package quadnet

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"pqfab/internal/testnets"
)

// TestCanonical: shuffling nodes and panels and turning each panel's start
// corner gives the same canonical net (positions and corner lists); the
// canonical order is checked against its definition.
func TestCanonical(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	nets := map[string]string{
		"grid":          gridOBJ(6, 5, 1000),
		"cube":          testnets.Cube(1000).OBJ(),
		"dodecahedron":  testnets.RhombicDodecahedron(500).OBJ(),
		"triacontahed.": testnets.RhombicTriacontahedron(500).OBJ(),
		"mixed":         gridOBJ(2, 1, 1000) + "v 3000 500 0\nf 3 7 6\n",
	}
	names := slices.Sorted(func(yield func(string) bool) {
		for k := range nets {
			if !yield(k) {
				return
			}
		}
	})
	for _, name := range names {
		n := mustRead(t, nets[name])
		if _, fd := Validate(n, DefaultValidateOptions()); fd.Err() != nil {
			t.Fatal(name, fd.Err())
		}
		want, nodeFrom, faceFrom := Canonical(n)
		checkCanonical(t, name, n, want, nodeFrom, faceFrom)
		for trial := 0; trial < 5; trial++ {
			s := shuffled(n, rng)
			got, nf, ff := Canonical(s)
			checkCanonical(t, name, s, got, nf, ff)
			for i := range want.Nodes {
				if got.Nodes[i].Pos != want.Nodes[i].Pos {
					t.Fatalf("%s trial %d: node %d at %v, want %v", name, trial, i, got.Nodes[i].Pos, want.Nodes[i].Pos)
				}
			}
			for i := range want.Faces {
				if !equalInts(got.Faces[i].Corners, want.Faces[i].Corners) {
					t.Fatalf("%s trial %d: face %d %v, want %v", name, trial, i, got.Faces[i].Corners, want.Faces[i].Corners)
				}
			}
		}
	}
}

// shuffled returns n with nodes and faces in random order and each face
// starting at a random corner (orientation kept).
func shuffled(n *Net, rng *rand.Rand) *Net {
	perm := rng.Perm(len(n.Nodes)) // new position of old node i
	s := &Net{Source: n.Source, Unit: n.Unit, Nodes: make([]Node, len(n.Nodes))}
	for i, p := range perm {
		s.Nodes[p] = n.Nodes[i]
	}
	for _, f := range rng.Perm(len(n.Faces)) {
		c := n.Faces[f].Corners
		r := rng.IntN(len(c))
		nc := make([]int, len(c))
		for k := range c {
			nc[k] = perm[c[(k+r)%len(c)]]
		}
		s.Faces = append(s.Faces, Face{ID: n.Faces[f].ID, Line: n.Faces[f].Line, Corners: nc})
	}
	return s
}

// checkCanonical checks c against the definition: nodes in (x, y, z)
// order, each face starting at its smallest index, faces in lexicographic
// order, and every face the input face rotated (same orientation).
func checkCanonical(t *testing.T, name string, in, c *Net, nodeFrom, faceFrom []int) {
	t.Helper()
	for i := 1; i < len(c.Nodes); i++ {
		a, b := c.Nodes[i-1].Pos, c.Nodes[i].Pos
		if !(a.X < b.X || a.X == b.X && (a.Y < b.Y || a.Y == b.Y && a.Z < b.Z)) {
			t.Fatalf("%s: nodes %d and %d out of order: %v %v", name, i-1, i, a, b)
		}
	}
	for i, nd := range c.Nodes {
		if nd != in.Nodes[nodeFrom[i]] {
			t.Fatalf("%s: node %d is %+v, input %+v", name, i, nd, in.Nodes[nodeFrom[i]])
		}
	}
	for i, f := range c.Faces {
		if slices.Min(f.Corners) != f.Corners[0] {
			t.Fatalf("%s: face %d %v does not start at its smallest node", name, i, f.Corners)
		}
		if i > 0 && slices.Compare(c.Faces[i-1].Corners, f.Corners) >= 0 {
			t.Fatalf("%s: faces %d and %d out of order", name, i-1, i)
		}
		g := in.Faces[faceFrom[i]]
		if f.ID != g.ID || f.Line != g.Line {
			t.Fatalf("%s: face %d lost id or line", name, i)
		}
		var a, b []string
		for k := range f.Corners {
			a = append(a, fmt.Sprint(c.Nodes[f.Corners[k]].Pos))
			b = append(b, fmt.Sprint(in.Nodes[g.Corners[k]].Pos))
		}
		if !isRotation(a, b) {
			t.Fatalf("%s: face %d %v is not a rotation of input %v", name, i, a, b)
		}
	}
}

func isRotation(a, b []string) bool {
	for r := range b {
		ok := true
		for k := range a {
			if a[k] != b[(k+r)%len(b)] {
				ok = false
				break
			}
		}
		if ok {
			return true
		}
	}
	return len(a) == 0
}
