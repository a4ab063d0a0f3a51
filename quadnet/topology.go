package quadnet

import (
	"sort"

	"gonum.org/v1/gonum/spatial/r3"
)

// Edge is an edge of the net between nodes A < B with up to two faces.
type Edge struct {
	A, B int
	// Faces holds the faces on the edge; for a manifold edge one (boundary)
	// or two (inner). Non-manifold edges have more.
	Faces []int
}

// Boundary reports whether the edge has exactly one face.
func (e Edge) Boundary() bool { return len(e.Faces) == 1 }

// Topology is what the faces of a net imply: edges with their faces,
// node adjacency, valence and boundary loops.
type Topology struct {
	Edges     []Edge
	FaceEdges [][]int // edge index of face side k (corner k to k+1)
	NodeEdges [][]int // edges at each node, ascending
	Loops     [][]int // boundary loops as node index cycles
}

// Valence returns the number of edges at node i.
func (t *Topology) Valence(i int) int { return len(t.NodeEdges[i]) }

// Other returns the node of edge e that is not i.
func (t *Topology) Other(e, i int) int {
	if t.Edges[e].A == i {
		return t.Edges[e].B
	}
	return t.Edges[e].A
}

func edgeKey(a, b int) uint64 {
	if a > b {
		a, b = b, a
	}
	return uint64(a)<<32 | uint64(uint32(b))
}

// BuildTopology derives the edges, adjacency and boundary loops of net.
// Edges are numbered in order of first appearance over the faces, so the
// numbering follows the file. It assumes corner indices are in range. The
// work is linear in the corners of the net (one hash lookup a side), plus
// sorting the boundary loops' start nodes.
func BuildTopology(n *Net) *Topology {
	total := 0
	for _, f := range n.Faces {
		total += len(f.Corners)
	}
	t := &Topology{FaceEdges: make([][]int, len(n.Faces)), NodeEdges: make([][]int, len(n.Nodes))}
	t.Edges = make([]Edge, 0, total/2+len(n.Nodes)/8+4)
	sides := make([]int, total)   // backing store of FaceEdges
	slots := make([]int, 2*total) // two face slots per edge; a third face reallocates
	index := make(map[uint64]int, total/2+8)
	degree := make([]int, len(n.Nodes))
	for f, face := range n.Faces {
		k := len(face.Corners)
		fe := sides[:k:k]
		sides = sides[k:]
		for i := 0; i < k; i++ {
			a, b := face.Corners[i], face.Corners[(i+1)%k]
			key := edgeKey(a, b)
			e, ok := index[key]
			if !ok {
				e = len(t.Edges)
				index[key] = e
				lo, hi := min(a, b), max(a, b)
				j := 2 * e
				t.Edges = append(t.Edges, Edge{A: lo, B: hi, Faces: slots[j : j : j+2]})
				if a != b {
					degree[a]++
					degree[b]++
				}
			}
			t.Edges[e].Faces = append(t.Edges[e].Faces, f)
			fe[i] = e
		}
		t.FaceEdges[f] = fe
	}
	adj := make([]int, 0, 2*len(t.Edges))
	for i, d := range degree {
		t.NodeEdges[i] = adj[len(adj) : len(adj) : len(adj)+d]
		adj = adj[:len(adj)+d]
	}
	for e, ed := range t.Edges {
		if ed.A != ed.B {
			t.NodeEdges[ed.A] = append(t.NodeEdges[ed.A], e)
			t.NodeEdges[ed.B] = append(t.NodeEdges[ed.B], e)
		}
	}
	t.Loops = boundaryLoops(n, t)
	return t
}

// boundaryLoops chains boundary edges, each taken in the direction its face
// runs, into closed loops. Loops start at their lowest node index and are
// listed by that node.
func boundaryLoops(n *Net, t *Topology) [][]int {
	next := map[int][]int{}
	for f, face := range n.Faces {
		k := len(face.Corners)
		for i, e := range t.FaceEdges[f] {
			if t.Edges[e].Boundary() {
				a, b := face.Corners[i], face.Corners[(i+1)%k]
				next[a] = append(next[a], b)
			}
		}
	}
	starts := make([]int, 0, len(next))
	for a := range next {
		starts = append(starts, a)
	}
	sort.Ints(starts)
	var loops [][]int
	for _, s := range starts {
		for len(next[s]) > 0 {
			loop := []int{s}
			cur := s
			for {
				outs := next[cur]
				if len(outs) == 0 {
					break // open chain: inconsistent orientation, reported by validation
				}
				nx := outs[0]
				next[cur] = outs[1:]
				if nx == s {
					break
				}
				loop = append(loop, nx)
				cur = nx
				if len(loop) > len(n.Nodes) {
					break
				}
			}
			loops = append(loops, loop)
		}
	}
	return loops
}

// BoundaryNodes returns a flag per node: true for nodes on a boundary edge.
func (t *Topology) BoundaryNodes(nodes int) []bool {
	b := make([]bool, nodes)
	for _, e := range t.Edges {
		if e.Boundary() {
			b[e.A], b[e.B] = true, true
		}
	}
	return b
}

// Components returns the connected parts of the net as lists of faces
// (faces joined through shared edges), ordered by their first face.
func (t *Topology) Components(faces int) [][]int {
	var u unionFind
	u.reset(faces)
	for _, e := range t.Edges {
		for _, f := range e.Faces[1:] {
			u.union(e.Faces[0], f)
		}
	}
	return u.sets(func(f int) int { return f })
}

// BoundaryLength returns the total length of the boundary edges (mm).
func (t *Topology) BoundaryLength(n *Net) float64 {
	var s float64
	for _, e := range t.Edges {
		if e.Boundary() {
			s += r3.Norm(r3.Sub(n.Nodes[e.A].Pos, n.Nodes[e.B].Pos))
		}
	}
	return s
}

// ValenceHistogram returns how many nodes have each valence (index =
// valence); nodes on no edge count at 0.
func (t *Topology) ValenceHistogram() []int {
	var h []int
	for _, es := range t.NodeEdges {
		v := len(es)
		for len(h) <= v {
			h = append(h, 0)
		}
		h[v]++
	}
	return h
}
