package nest

import (
	"pqfab/geom"
)

// convexParts splits a simple counter-clockwise polygon into convex
// polygons that tile it: ear-clipping triangulation, then Hertel and
// Mehlhorn's merging ("Fast triangulation of simple polygons", 1983):
// each diagonal is dropped when the two pieces it separates stay convex
// without it. The pieces are at most four times as many as the fewest
// possible. A convex polygon is returned as it is.
func convexParts(p geom.Polygon) []geom.Polygon {
	if p.Convex() {
		return []geom.Polygon{p}
	}
	tris := earClip(p)
	// Pieces as lists of corner indices into p; merge greedily across
	// shared edges while the union stays convex.
	pieces := make([][]int, len(tris))
	for i, t := range tris {
		pieces[i] = []int{t[0], t[1], t[2]}
	}
	for merged := true; merged; {
		merged = false
		for a := 0; a < len(pieces) && !merged; a++ {
			for b := a + 1; b < len(pieces) && !merged; b++ {
				if u, ok := joinConvex(p, pieces[a], pieces[b]); ok {
					pieces[a] = u
					pieces = append(pieces[:b], pieces[b+1:]...)
					merged = true
				}
			}
		}
	}
	out := make([]geom.Polygon, len(pieces))
	for i, idx := range pieces {
		q := make(geom.Polygon, len(idx))
		for j, k := range idx {
			q[j] = p[k]
		}
		out[i] = q
	}
	return out
}

// joinConvex joins two counter-clockwise index polygons that share an edge
// (a→b in x, b→a in y) when the union is convex.
func joinConvex(p geom.Polygon, x, y []int) ([]int, bool) {
	for i := range x {
		a, b := x[i], x[(i+1)%len(x)]
		for j := range y {
			if y[j] != b || y[(j+1)%len(y)] != a {
				continue
			}
			// Union: x from b round to a, then y from a round to b
			// (exclusive of the shared ends).
			var u []int
			for k := 0; k < len(x); k++ {
				u = append(u, x[(i+1+k)%len(x)])
			}
			for k := 2; k < len(y); k++ {
				u = append(u, y[(j+k)%len(y)])
			}
			for k := range u {
				if geom.Orient(p[u[k]], p[u[(k+1)%len(u)]], p[u[(k+2)%len(u)]]) < 0 {
					return nil, false
				}
			}
			return u, true
		}
	}
	return nil, false
}

// earClip triangulates a simple counter-clockwise polygon by cutting
// ears: corners whose triangle turns left and holds no other corner
// (exact orientation tests).
func earClip(p geom.Polygon) [][3]int {
	idx := make([]int, len(p))
	for i := range idx {
		idx[i] = i
	}
	var out [][3]int
	for len(idx) > 3 {
		cut := false
		for k := range idx {
			n := len(idx)
			a, b, c := idx[(k+n-1)%n], idx[k], idx[(k+1)%n]
			if geom.Orient(p[a], p[b], p[c]) <= 0 {
				continue
			}
			ear := true
			for _, m := range idx {
				if m == a || m == b || m == c {
					continue
				}
				if geom.Orient(p[a], p[b], p[m]) >= 0 && geom.Orient(p[b], p[c], p[m]) >= 0 && geom.Orient(p[c], p[a], p[m]) >= 0 {
					ear = false
					break
				}
			}
			if ear {
				out = append(out, [3]int{a, b, c})
				idx = append(idx[:k], idx[k+1:]...)
				cut = true
				break
			}
		}
		if !cut {
			// Only collinear corners are left to cut: drop one.
			for k := range idx {
				n := len(idx)
				if geom.Orient(p[idx[(k+n-1)%n]], p[idx[k]], p[idx[(k+1)%n]]) == 0 {
					idx = append(idx[:k], idx[k+1:]...)
					cut = true
					break
				}
			}
			if !cut {
				break
			}
		}
	}
	if len(idx) == 3 && geom.Orient(p[idx[0]], p[idx[1]], p[idx[2]]) > 0 {
		out = append(out, [3]int{idx[0], idx[1], idx[2]})
	}
	return out
}
