package quadnet

import (
	"cmp"
	"slices"
	"strings"
)

// Canonical renumbers a valid net in an order fixed by its geometry, so
// that every later stage is independent of the order of nodes and panels
// in the file and of which corner a panel starts at:
//
//   - nodes are sorted by position: x, then y, then z (exact float
//     comparison; positions are distinct in a valid net), then by id;
//   - each panel's corners are rotated, keeping their orientation, to
//     start at the corner with the smallest new node index;
//   - panels are sorted by their rotated corner lists (lexicographic; a
//     list that is a prefix of another comes first), then by id.
//
// Nodes keep ID, Line and Support; panels keep ID and Line. nodeFrom[i]
// and faceFrom[i] give the index in n of node i and panel i of c. n is
// not changed. The work is V log V + F log F.
func Canonical(n *Net) (c *Net, nodeFrom, faceFrom []int) {
	nodeFrom = make([]int, len(n.Nodes))
	for i := range nodeFrom {
		nodeFrom[i] = i
	}
	slices.SortFunc(nodeFrom, func(a, b int) int {
		pa, pb := n.Nodes[a].Pos, n.Nodes[b].Pos
		if c := cmp.Compare(pa.X, pb.X); c != 0 {
			return c
		}
		if c := cmp.Compare(pa.Y, pb.Y); c != 0 {
			return c
		}
		if c := cmp.Compare(pa.Z, pb.Z); c != 0 {
			return c
		}
		return cmp.Or(strings.Compare(n.Nodes[a].ID, n.Nodes[b].ID), cmp.Compare(a, b))
	})
	newIdx := make([]int, len(n.Nodes))
	c = &Net{Source: n.Source, Unit: n.Unit, Nodes: make([]Node, len(n.Nodes)), Faces: make([]Face, len(n.Faces))}
	for i, old := range nodeFrom {
		newIdx[old] = i
		c.Nodes[i] = n.Nodes[old]
	}
	rotated := make([][]int, len(n.Faces))
	for f, face := range n.Faces {
		k := len(face.Corners)
		r := make([]int, k)
		first := 0
		for j, old := range face.Corners {
			if newIdx[old] < newIdx[face.Corners[first]] {
				first = j
			}
		}
		for j := range r {
			r[j] = newIdx[face.Corners[(first+j)%k]]
		}
		rotated[f] = r
	}
	faceFrom = make([]int, len(n.Faces))
	for i := range faceFrom {
		faceFrom[i] = i
	}
	slices.SortFunc(faceFrom, func(a, b int) int {
		if c := slices.Compare(rotated[a], rotated[b]); c != 0 {
			return c
		}
		return cmp.Or(strings.Compare(n.Faces[a].ID, n.Faces[b].ID), cmp.Compare(a, b))
	})
	for i, old := range faceFrom {
		c.Faces[i] = Face{ID: n.Faces[old].ID, Line: n.Faces[old].Line, Corners: rotated[old]}
	}
	return c, nodeFrom, faceFrom
}
