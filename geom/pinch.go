package geom

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
	var parent []int
	find := func(x int) int {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	var out []pinch
	for v := range n.Nodes {
		faces := at[start[v]:start[v+1]]
		if len(faces) < 2 {
			continue
		}
		parent = parent[:0]
		for i, f := range faces {
			local[f] = i
			parent = append(parent, i)
		}
		for i, f := range faces {
			c := n.Faces[f].Corners
			k := 0
			for c[k] != v {
				k++
			}
			for _, e := range [2]int{t.FaceEdges[f][k], t.FaceEdges[f][(k+len(c)-1)%len(c)]} {
				for _, g := range t.Edges[e].Faces {
					if a, b := find(i), find(local[g]); a != b {
						parent[max(a, b)] = min(a, b)
					}
				}
			}
		}
		roots := 0
		for i := range faces {
			if find(i) == i {
				roots++
			}
		}
		if roots < 2 {
			continue
		}
		groups := map[int]int{}
		var gs [][]int
		for i, f := range faces {
			r := find(i)
			g, ok := groups[r]
			if !ok {
				g = len(gs)
				groups[r] = g
				gs = append(gs, nil)
			}
			gs[g] = append(gs[g], f)
		}
		out = append(out, pinch{node: v, groups: gs})
	}
	return out
}
