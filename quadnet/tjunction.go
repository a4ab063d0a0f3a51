package quadnet

import (
	"cmp"
	"math"
	"slices"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// tJunction is a node lying on an edge it is not an end of.
type tJunction struct{ node, edge int }

// gridCellsPerAxis caps the grid of the T-junction check at 2²¹ cells an
// axis, so a cell's three indices pack into one uint64.
const gridCellsPerAxis = 1 << 21

// gridShift is the fraction of a cell the T-junction grid is moved off
// the nets' bounding box (any value away from 0, ½ and 1 will do).
const gridShift = 0.37

// tJunctions finds used nodes within tol of an edge's open segment and farther
// than tol from both its ends (nearer, they are coincident with an end).
//
// Nodes go into a uniform grid whose cell is at least the median edge,
// a quarter of the mean edge and twice tol; each edge is walked in steps
// of at most a cell and tests the nodes of the cells its steps (grown by
// tol) overlap, at most 3 × 3 × 3 cells a step. For a net of evenly sized panels that is a few tests per
// edge: linear expected time after a V log V sort. It stops after
// MaxReportedPairs finds (more reports whether another exists) or after
// budget cell visits and distance tests (done is then false).
func tJunctions(n *Net, t *Topology, used []bool, es edgeStats, tol float64, budget int) (found []tJunction, more, done bool) {
	done = true
	if len(t.Edges) == 0 || len(n.Nodes) == 0 {
		return nil, false, true
	}
	lo, hi := n.Bounds()
	ext := math.Max(hi.X-lo.X, math.Max(hi.Y-lo.Y, hi.Z-lo.Z))
	h := math.Max(math.Max(es.median, es.mean/4), math.Max(2*tol, ext/(gridCellsPerAxis-2)))
	if !(h > 0) || math.IsInf(h, 0) {
		return nil, false, true // every node at one point: coincidence covers it
	}
	// Shift the grid off the bounding box so that nets laid out on a
	// regular grid of edge-long steps do not put their nodes on cell
	// walls (which would double the cells each edge visits).
	lo = r3.Sub(lo, r3.Scale(gridShift*h, geom.Vec{X: 1, Y: 1, Z: 1}))
	cellOf := func(x, lo float64) uint64 {
		c := math.Floor((x - lo) / h)
		return uint64(math.Max(0, math.Min(c, gridCellsPerAxis-1)))
	}
	key := func(cx, cy, cz uint64) uint64 { return cx | cy<<21 | cz<<42 }
	keys := make([]uint64, len(n.Nodes))
	order := make([]int32, len(n.Nodes))
	for i, nd := range n.Nodes {
		keys[i] = key(cellOf(nd.Pos.X, lo.X), cellOf(nd.Pos.Y, lo.Y), cellOf(nd.Pos.Z, lo.Z))
		order[i] = int32(i)
	}
	slices.SortFunc(order, func(a, b int32) int { return cmp.Or(cmp.Compare(keys[a], keys[b]), cmp.Compare(a, b)) })
	cells := make(map[uint64][2]int32, len(n.Nodes)/2+1)
	for s := 0; s < len(order); {
		e := s + 1
		for e < len(order) && keys[order[e]] == keys[order[s]] {
			e++
		}
		cells[keys[order[s]]] = [2]int32{int32(s), int32(e)}
		s = e
	}
	stamp := make([]int32, len(n.Nodes))
	work := 0
	tol2 := tol * tol
	for e, ed := range t.Edges {
		a, b := n.Nodes[ed.A].Pos, n.Nodes[ed.B].Pos
		d := r3.Sub(b, a)
		l2 := r3.Dot(d, d)
		if l2 == 0 {
			continue
		}
		steps := max(1, int(math.Ceil(math.Sqrt(l2)/h)))
		for k := 0; k < steps; k++ {
			s0 := r3.Add(a, r3.Scale(float64(k)/float64(steps), d))
			s1 := r3.Add(a, r3.Scale(float64(k+1)/float64(steps), d))
			x0, x1 := cellOf(math.Min(s0.X, s1.X)-tol, lo.X), cellOf(math.Max(s0.X, s1.X)+tol, lo.X)
			y0, y1 := cellOf(math.Min(s0.Y, s1.Y)-tol, lo.Y), cellOf(math.Max(s0.Y, s1.Y)+tol, lo.Y)
			z0, z1 := cellOf(math.Min(s0.Z, s1.Z)-tol, lo.Z), cellOf(math.Max(s0.Z, s1.Z)+tol, lo.Z)
			for cx := x0; cx <= x1; cx++ {
				for cy := y0; cy <= y1; cy++ {
					for cz := z0; cz <= z1; cz++ {
						if work++; work > budget {
							return sortTJ(found), more, false
						}
						r, ok := cells[key(cx, cy, cz)]
						if !ok {
							continue
						}
						for _, p := range order[r[0]:r[1]] {
							if int(p) == ed.A || int(p) == ed.B || stamp[p] == int32(e+1) || !used[p] {
								continue
							}
							stamp[p] = int32(e + 1)
							if work++; work > budget {
								return sortTJ(found), more, false
							}
							if !onOpenSegment(n.Nodes[p].Pos, a, b, d, l2, tol2) || cornerOfEdgeFace(n, ed, int(p)) {
								continue
							}
							if len(found) == MaxReportedPairs {
								return sortTJ(found), true, true
							}
							found = append(found, tJunction{node: int(p), edge: e})
						}
					}
				}
			}
		}
	}
	return sortTJ(found), false, done
}

// onOpenSegment reports whether p lies within √tol2 of the segment ab
// (d = b - a, l2 = |d|²) and farther than that from both ends.
func onOpenSegment(p, a, b, d geom.Vec, l2, tol2 float64) bool {
	w := r3.Sub(p, a)
	s := r3.Dot(w, d) / l2
	if s <= 0 || s >= 1 {
		return false
	}
	off := r3.Sub(w, r3.Scale(s, d))
	if r3.Dot(off, off) > tol2 {
		return false
	}
	pb := r3.Sub(p, b)
	return r3.Dot(w, w) > tol2 && r3.Dot(pb, pb) > tol2
}

// cornerOfEdgeFace reports whether node p is a corner of a panel on the
// edge: then it lies on its own panel's edge (a degenerate panel, which
// the area test reports), not on another panel's.
func cornerOfEdgeFace(n *Net, ed Edge, p int) bool {
	for _, f := range ed.Faces {
		if slices.Contains(n.Faces[f].Corners, p) {
			return true
		}
	}
	return false
}

func sortTJ(tj []tJunction) []tJunction {
	sort.Slice(tj, func(i, j int) bool {
		if tj[i].node != tj[j].node {
			return tj[i].node < tj[j].node
		}
		return tj[i].edge < tj[j].edge
	})
	return tj
}
