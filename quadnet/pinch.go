package quadnet

// pinch is a node whose panels form two or more groups joined through no
// edge at the node.
type pinch struct {
	node   int
	groups [][]int // faces of each group, ascending; groups by first face
}

// pinches finds the nodes where the panels around a node form more than
// one fan: panels around a node are joined when they share an edge at
// the node. The work is linear in the corners of the net.
func pinches(n *Net, t *Topology) []pinch {
	// Faces at each node, in face order (compressed rows).
	start := make([]int, len(n.Nodes)+1)
	for _, f := range n.Faces {
		for _, c := range f.Corners {
			start[c+1]++
		}
	}
	for i := range n.Nodes {
		start[i+1] += start[i]
	}
	at := make([]int, start[len(n.Nodes)])
	fill := append([]int(nil), start[:len(n.Nodes)]...)
	for f, face := range n.Faces {
		for _, c := range face.Corners {
			at[fill[c]] = f
			fill[c]++
		}
	}
	local := make([]int, len(n.Faces)) // index of a face in the current node's list
	var u unionFind
	var out []pinch
	for v := range n.Nodes {
		faces := at[start[v]:start[v+1]]
		if len(faces) < 2 {
			continue
		}
		u.reset(len(faces))
		for i, f := range faces {
			local[f] = i
		}
		for i, f := range faces {
			c := n.Faces[f].Corners
			k := 0
			for c[k] != v {
				k++
			}
			for _, e := range [2]int{t.FaceEdges[f][k], t.FaceEdges[f][(k+len(c)-1)%len(c)]} {
				for _, g := range t.Edges[e].Faces {
					u.union(i, local[g])
				}
			}
		}
		roots := 0
		for i := range faces {
			if u.find(i) == i {
				roots++
			}
		}
		if roots < 2 {
			continue
		}
		out = append(out, pinch{node: v, groups: u.sets(func(i int) int { return faces[i] })})
	}
	return out
}
