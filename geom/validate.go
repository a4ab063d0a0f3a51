package geom

import (
	"fmt"
	"sort"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"
)

// Validation defaults.
const (
	// DefaultCoincidentTolMM: nodes closer than this are one node entered
	// twice (0.01 mm, finer than any cut).
	DefaultCoincidentTolMM = 0.01
	// DefaultMinAreaMM2: a panel smaller than 1 mm² is degenerate.
	DefaultMinAreaMM2 = 1.0
)

// ValidateOptions sets the tolerances of Validate.
type ValidateOptions struct {
	CoincidentTolMM float64
	MinAreaMM2      float64
}

// DefaultValidateOptions returns the default tolerances.
func DefaultValidateOptions() ValidateOptions {
	return ValidateOptions{CoincidentTolMM: DefaultCoincidentTolMM, MinAreaMM2: DefaultMinAreaMM2}
}

// Findings is what Validate found. Errors stop the job; warnings do not.
type Findings struct {
	Errors   []*InputError
	Warnings []*InputError
	// Misoriented lists the faces whose corner order must be reversed to
	// make the net consistently oriented and facing up or out (Reorient
	// does it). Reported as an error when orientation is inconsistent,
	// as a warning when whole parts face down.
	Misoriented []int
}

// Err returns nil when there are no errors, else an error whose first line
// is the first problem, followed by the others (up to ten).
func (f Findings) Err() error {
	if len(f.Errors) == 0 {
		return nil
	}
	return &ValidationError{Problems: f.Errors}
}

// ValidationError lists the errors found in a net.
type ValidationError struct{ Problems []*InputError }

// Error returns one line: the first problem and how many more there are.
func (e *ValidationError) Error() string {
	s := e.Problems[0].Error()
	if len(e.Problems) > 1 {
		s += fmt.Sprintf(" (and %d more problems)", len(e.Problems)-1)
	}
	return s
}

// Validate checks a net read from a file: zero-area panels, coincident
// nodes, duplicate panels, edges shared by more than two panels, and
// inconsistent orientation are errors; unused nodes, disconnected parts
// and parts facing down are warnings. It also returns the topology.
func Validate(n *Net, opt ValidateOptions) (*Topology, Findings) {
	var fd Findings
	file := n.Source
	add := func(warn bool, line int, elem, format string, args ...any) {
		e := inputErr(file, line, elem, format, args...)
		if warn {
			fd.Warnings = append(fd.Warnings, e)
		} else {
			fd.Errors = append(fd.Errors, e)
		}
	}
	faceElem := func(f int) string { return "panel " + n.Faces[f].ID }

	var pts []Vec
	for f := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		if a := r3.Norm(VectorArea(pts)); a < opt.MinAreaMM2 {
			add(false, n.Faces[f].Line, faceElem(f), "area %.3g mm² is below %.3g mm² (degenerate panel)", a, opt.MinAreaMM2)
		}
	}
	for _, pair := range coincidentNodes(n, opt.CoincidentTolMM) {
		a, b := pair[0], pair[1]
		add(false, n.Nodes[b].Line, "node "+n.Nodes[b].ID, "coincides with node %s (line %d): %.4g mm apart, tolerance %.4g mm",
			n.Nodes[a].ID, n.Nodes[a].Line, r3.Norm(r3.Sub(n.Nodes[a].Pos, n.Nodes[b].Pos)), opt.CoincidentTolMM)
	}
	seen := make(map[[MaxCorners]int32]int, len(n.Faces))
	for f, face := range n.Faces {
		var k [MaxCorners]int32
		for i := range k {
			k[i] = -1
		}
		for i, c := range face.Corners {
			k[i] = int32(c)
		}
		sort.Slice(k[:len(face.Corners)], func(i, j int) bool { return k[i] < k[j] })
		if g, dup := seen[k]; dup {
			add(false, face.Line, faceElem(f), "has the same corners as panel %s (line %d)", n.Faces[g].ID, n.Faces[g].Line)
		} else {
			seen[k] = f
		}
	}
	t := BuildTopology(n)
	for _, e := range t.Edges {
		if len(e.Faces) > 2 {
			ids := make([]string, len(e.Faces))
			for i, f := range e.Faces {
				ids[i] = n.Faces[f].ID
			}
			add(false, n.Faces[e.Faces[2]].Line, faceElem(e.Faces[2]), "edge %s–%s is shared by %d panels (%s); an edge may have at most two (non-manifold)",
				n.Nodes[e.A].ID, n.Nodes[e.B].ID, len(e.Faces), strings.Join(ids, ", "))
		}
	}
	if len(fd.Errors) == 0 {
		checkOrientation(n, t, &fd)
	}
	used := make([]bool, len(n.Nodes))
	for _, face := range n.Faces {
		for _, c := range face.Corners {
			used[c] = true
		}
	}
	var unused []string
	firstLine := 0
	for i, u := range used {
		if !u {
			if firstLine == 0 {
				firstLine = n.Nodes[i].Line
			}
			if len(unused) < 8 {
				unused = append(unused, n.Nodes[i].ID)
			} else if len(unused) == 8 {
				unused = append(unused, "…")
			}
		}
	}
	if len(unused) > 0 {
		cnt := 0
		for _, u := range used {
			if !u {
				cnt++
			}
		}
		add(true, firstLine, "node "+unused[0], "%d nodes belong to no panel (%s); they are ignored", cnt, strings.Join(unused, ", "))
	}
	if parts := t.Components(len(n.Faces)); len(parts) > 1 {
		add(true, 0, "", "the net has %d disconnected parts (sizes %s)", len(parts), partSizes(parts))
	}
	return t, fd
}

func partSizes(parts [][]int) string {
	s := make([]string, 0, len(parts))
	for i, p := range parts {
		if i == 6 {
			s = append(s, "…")
			break
		}
		s = append(s, fmt.Sprint(len(p)))
	}
	return strings.Join(s, ", ")
}

// coincidentNodes returns pairs (a, b), a < b, of nodes within tol. It
// sorts the nodes by their projection on a skew direction and compares
// only neighbours whose projections differ by at most tol, so the work is
// n log n for any net that is not a cloud of near-duplicates.
func coincidentNodes(n *Net, tol float64) [][2]int {
	dir := r3.Unit(Vec{X: 0.5377, Y: 0.3112, Z: 0.7833})
	type item struct {
		proj float64
		i    int
	}
	items := make([]item, len(n.Nodes))
	for i, nd := range n.Nodes {
		items[i] = item{r3.Dot(nd.Pos, dir), i}
	}
	sort.Slice(items, func(a, b int) bool {
		if items[a].proj != items[b].proj {
			return items[a].proj < items[b].proj
		}
		return items[a].i < items[b].i
	})
	var out [][2]int
	for x, it := range items {
		for y := x + 1; y < len(items) && items[y].proj-it.proj <= tol; y++ {
			j := items[y].i
			if r3.Norm(r3.Sub(n.Nodes[j].Pos, n.Nodes[it.i].Pos)) <= tol {
				out = append(out, [2]int{min(it.i, j), max(it.i, j)})
			}
		}
	}
	sort.Slice(out, func(a, b int) bool {
		if out[a][1] != out[b][1] {
			return out[a][1] < out[b][1]
		}
		return out[a][0] < out[b][0]
	})
	return out
}

// sameDirection reports whether faces f and g run along edge e the same
// way (which makes them inconsistently oriented).
func sameDirection(n *Net, t *Topology, e, f, g int) bool {
	return edgeDir(n, t, e, f) == edgeDir(n, t, e, g)
}

// edgeDir returns +1 if face f runs along edge e from A to B, else -1.
func edgeDir(n *Net, t *Topology, e, f int) int {
	c := n.Faces[f].Corners
	for k, fe := range t.FaceEdges[f] {
		if fe == e {
			if c[k] == t.Edges[e].A {
				return 1
			}
			return -1
		}
	}
	return 0
}

// checkOrientation finds, per connected part, the corner orders that make
// the part consistent and facing up (open parts) or out (closed parts).
func checkOrientation(n *Net, t *Topology, fd *Findings) {
	flip := make([]int8, len(n.Faces)) // 0 unknown, 1 keep, -1 flip
	var badPair [2]int
	inconsistent, nonOrientable := false, false
	for _, part := range t.Components(len(n.Faces)) {
		start := part[0]
		flip[start] = 1
		queue := []int{start}
		for len(queue) > 0 {
			f := queue[0]
			queue = queue[1:]
			for _, e := range t.FaceEdges[f] {
				if len(t.Edges[e].Faces) != 2 {
					continue
				}
				g := t.Edges[e].Faces[0]
				if g == f {
					g = t.Edges[e].Faces[1]
				}
				want := flip[f]
				if sameDirection(n, t, e, f, g) {
					want = -want
					if !inconsistent {
						badPair = [2]int{f, g}
					}
					inconsistent = true
				}
				if flip[g] == 0 {
					flip[g] = want
					queue = append(queue, g)
				} else if flip[g] != want {
					nonOrientable = true
				}
			}
		}
		// Decide the part's facing with the consistent orientation.
		closed := true
		var area Vec
		var vol float64
		var pts []Vec
		for _, f := range part {
			pts = n.FacePoints(pts[:0], f)
			a := VectorArea(pts)
			if flip[f] < 0 {
				a = r3.Scale(-1, a)
			}
			area = r3.Add(area, a)
			vol += r3.Dot(a, Centroid(pts))
			for _, e := range t.FaceEdges[f] {
				if len(t.Edges[e].Faces) == 1 {
					closed = false
				}
			}
		}
		down := (closed && vol < 0) || (!closed && area.Z < 0)
		if down {
			for _, f := range part {
				flip[f] = -flip[f]
			}
		}
		for _, f := range part {
			if flip[f] < 0 {
				fd.Misoriented = append(fd.Misoriented, f)
			}
		}
	}
	sort.Ints(fd.Misoriented)
	switch {
	case nonOrientable:
		f := badPair[0]
		fd.Errors = append(fd.Errors, inputErr(n.Source, n.Faces[f].Line, "panel "+n.Faces[f].ID, "the net cannot be oriented consistently (a Möbius-like twist)"))
	case inconsistent:
		f, g := badPair[1], badPair[0]
		if flip[badPair[0]] < 0 {
			f, g = g, f
		}
		fd.Errors = append(fd.Errors, inputErr(n.Source, n.Faces[f].Line, "panel "+n.Faces[f].ID,
			"runs the same way as panel %s along their shared edge: a flipped panel (%d to turn in all; reorienting turns them)", n.Faces[g].ID, len(fd.Misoriented)))
	case len(fd.Misoriented) > 0:
		f := fd.Misoriented[0]
		fd.Warnings = append(fd.Warnings, inputErr(n.Source, n.Faces[f].Line, "panel "+n.Faces[f].ID,
			"%d panels run clockwise seen from above or outside; reorient turns them", len(fd.Misoriented)))
	}
}

// Reorient reverses the corner order of the given faces (as listed in
// Findings.Misoriented), keeping each face's first corner first.
func Reorient(n *Net, faces []int) {
	for _, f := range faces {
		c := n.Faces[f].Corners
		for i, j := 1, len(c)-1; i < j; i, j = i+1, j-1 {
			c[i], c[j] = c[j], c[i]
		}
	}
}
