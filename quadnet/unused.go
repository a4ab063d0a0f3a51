package quadnet

// DropUnused returns a copy of n without the nodes that are a corner of no
// panel, and the indices (in n) of the nodes it left out, ascending. The
// kept nodes keep their order, ids, lines and supports; panel corners are
// renumbered to match. n is not changed.
func DropUnused(n *Net) (kept *Net, dropped []int) {
	used := usedNodes(n)
	newIdx := make([]int, len(n.Nodes))
	kept = &Net{Source: n.Source, Unit: n.Unit, Nodes: make([]Node, 0, len(n.Nodes)), Faces: make([]Face, len(n.Faces))}
	for i, nd := range n.Nodes {
		if !used[i] {
			dropped = append(dropped, i)
			newIdx[i] = -1
			continue
		}
		newIdx[i] = len(kept.Nodes)
		kept.Nodes = append(kept.Nodes, nd)
	}
	for f, face := range n.Faces {
		c := make([]int, len(face.Corners))
		for k, old := range face.Corners {
			c[k] = newIdx[old]
		}
		kept.Faces[f] = Face{ID: face.ID, Line: face.Line, Corners: c}
	}
	return kept, dropped
}
