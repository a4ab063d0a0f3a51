package quadnet

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// Validation defaults.
const (
	// DefaultCoincidentTolMM: nodes closer than this are one node entered
	// twice (0.01 mm, finer than any cut).
	DefaultCoincidentTolMM = 0.01
	// DefaultMinAreaMM2: a panel smaller than 1 mm² is degenerate.
	DefaultMinAreaMM2 = 1.0
	// DefaultMinMedianEdgeMM and DefaultMaxMedianEdgeMM bound the median
	// edge of a building net (30 mm and 30 m). Members of real gridshells
	// are roughly 0.3–5 m long (common practice, from memory). A net read
	// in a unit a thousand times too small (metres read as millimetres)
	// has median edges of 0.3–5 mm, one read a thousand times too large
	// (millimetres read as metres) 300 m–5 km; the bounds sit a factor of
	// ten below and six above the real range, so dense lattices and long
	// spans pass and the thousand-fold mistakes fail. A factor of ten
	// (centimetres read as millimetres: 30–500 mm) cannot be told from
	// geometry and is not flagged.
	DefaultMinMedianEdgeMM = 30.0
	DefaultMaxMedianEdgeMM = 30_000.0
)

// MaxCoincidentTolMM is the largest coincidence tolerance accepted (100
// mm): nodes that far apart are not one node entered twice.
const MaxCoincidentTolMM = 100.0

// MaxReportedPairs caps the coincident-node pairs and the T-junctions
// Validate collects; past it, it reports that more exist and stops looking.
const MaxReportedPairs = 100

// NoTol and NoBound, given as fields of ValidateOptions, ask for a zero
// setting (a field's zero value means its default): NoTol a coincidence
// tolerance of 0 (only nodes at the very same point coincide), NoBound no
// least panel area or no bound on the median edge.
const (
	NoTol   = -1.0
	NoBound = -1.0
)

// ValidateOptions sets the tolerances of Validate. A zero field means its
// default; NoTol and NoBound ask for zero.
type ValidateOptions struct {
	// CoincidentTolMM: nodes closer than this are coincident, and a node
	// closer than this to another panel's edge lies on it (a T-junction).
	// 0: DefaultCoincidentTolMM; NoTol: 0 mm.
	CoincidentTolMM float64
	// MinAreaMM2: a panel of smaller area is degenerate. 0:
	// DefaultMinAreaMM2; NoBound: no least area.
	MinAreaMM2 float64
	// MinMedianEdgeMM and MaxMedianEdgeMM: a net whose median edge lies
	// outside is in the wrong unit. 0: DefaultMinMedianEdgeMM and
	// DefaultMaxMedianEdgeMM; NoBound turns a bound off.
	MinMedianEdgeMM float64
	MaxMedianEdgeMM float64
}

// withDefaults returns the options to compute with: every zero field set
// to its default, and NoTol and NoBound to 0. Its zeros mean zero, so its
// result goes only to unexported code, never back to Validate.
func (o ValidateOptions) withDefaults() ValidateOptions {
	set := func(v *float64, def, zero float64) {
		switch *v {
		case 0:
			*v = def
		case zero:
			*v = 0
		}
	}
	set(&o.CoincidentTolMM, DefaultCoincidentTolMM, NoTol)
	set(&o.MinAreaMM2, DefaultMinAreaMM2, NoBound)
	set(&o.MinMedianEdgeMM, DefaultMinMedianEdgeMM, NoBound)
	set(&o.MaxMedianEdgeMM, DefaultMaxMedianEdgeMM, NoBound)
	return o
}

// Validate reports the first bad value as a *FieldError: every value, a
// zero standing for its default, must be a finite number, zero or more,
// and MaxMedianEdgeMM, when set, at least MinMedianEdgeMM.
func (o ValidateOptions) Validate() error { return o.withDefaults().check() }

// ValidateExact checks the options as given: a zero field means zero (an
// error where the option has no zero setting) and the negative constants
// are refused, as a job file or a flag means them. The errors are
// Validate's.
func (o ValidateOptions) ValidateExact() error { return o.check() }

// check checks the values as they stand.
func (o ValidateOptions) check() error {
	for _, f := range []struct {
		name string
		v    float64
	}{{"CoincidentTolMM", o.CoincidentTolMM}, {"MinAreaMM2", o.MinAreaMM2}, {"MinMedianEdgeMM", o.MinMedianEdgeMM}, {"MaxMedianEdgeMM", o.MaxMedianEdgeMM}} {
		if !(f.v >= 0) || math.IsInf(f.v, 0) {
			return geom.FieldErrorf(f.name, "%g must be a finite number, zero or more", f.v)
		}
	}
	if o.CoincidentTolMM > MaxCoincidentTolMM {
		return geom.FieldErrorf("CoincidentTolMM", "%g must be between 0 and %g mm", o.CoincidentTolMM, MaxCoincidentTolMM)
	}
	if o.MaxMedianEdgeMM > 0 && o.MaxMedianEdgeMM < o.MinMedianEdgeMM {
		return geom.FieldErrorf("MaxMedianEdgeMM", "%g is below MinMedianEdgeMM %g", o.MaxMedianEdgeMM, o.MinMedianEdgeMM)
	}
	return nil
}

// DefaultValidateOptions returns the default tolerances, every field set:
// the zero ValidateOptions does the same checks.
func DefaultValidateOptions() ValidateOptions {
	return ValidateOptions{CoincidentTolMM: DefaultCoincidentTolMM, MinAreaMM2: DefaultMinAreaMM2,
		MinMedianEdgeMM: DefaultMinMedianEdgeMM, MaxMedianEdgeMM: DefaultMaxMedianEdgeMM}
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
	switch n := len(e.Problems) - 1; {
	case n == 1:
		s += " (and 1 more problem)"
	case n > 1:
		s += fmt.Sprintf(" (and %d more problems)", n)
	}
	return s
}

// Validate checks a net read from a file and returns its topology with
// what it found. The checks, in order, with the work each may take for V
// nodes, E edges and F panels:
//
//   - unit: a median edge outside [MinMedianEdgeMM, MaxMedianEdgeMM] is
//     the one error reported, naming the unit that fits (E log E);
//   - panel shape: corners whose outline, projected on their
//     least-squares plane, crosses itself (a bow-tie), then an area below
//     MinAreaMM2 (F);
//   - coincident nodes (V log V sort, then at most nearTestBudget
//     distance tests; at most MaxReportedPairs pairs are listed);
//     nodes in no panel are left out of this check and the T-junction
//     check, as DropUnused leaves them out of the net;
//   - panels with the same corners (F), edges shared by more than two
//     panels (E);
//   - T-junctions: a node within CoincidentTolMM of another panel's edge,
//     away from its ends (a spatial grid: V log V, then at most
//     nearTestBudget tests; skipped when nodes coincide);
//   - pinches: a node where the panels around it form groups that share
//     no edge there (V + F);
//   - orientation, when nothing above failed (F + E);
//   - warnings: nodes in no panel, disconnected parts, parts facing down
//     (V + F + E).
//
// A check that runs out of its budget says so in a warning. A zero field
// of opt means its default; opt should pass ValidateOptions.Validate;
// other values give no useful findings but never hang or panic.
func Validate(n *Net, opt ValidateOptions) (*Topology, Findings) {
	opt = opt.withDefaults()
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

	t := BuildTopology(n)
	es := edgeLengths(n, t)
	if e := checkUnit(n, es, opt); e != nil {
		fd.Errors = append(fd.Errors, e)
		return t, fd
	}
	var pts []geom.Vec
	for f := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		if i, j, ok := bowTie(pts, opt.MinAreaMM2); ok {
			c, k := n.Faces[f].Corners, len(pts)
			add(false, n.Faces[f].Line, faceElem(f), "corners out of order: the outline crosses itself (a bow-tie: edges %s–%s and %s–%s cross)",
				n.Nodes[c[i]].ID, n.Nodes[c[(i+1)%k]].ID, n.Nodes[c[j]].ID, n.Nodes[c[(j+1)%k]].ID)
			continue
		}
		if a := r3.Norm(geom.VectorArea(pts)); a < opt.MinAreaMM2 {
			add(false, n.Faces[f].Line, faceElem(f), "area %.3g mm² is below %.3g mm² (degenerate panel)", a, opt.MinAreaMM2)
		}
	}
	used := usedNodes(n) // nodes in no panel are left out: not checked below
	budget := nearTestBudget(len(n.Nodes) + len(t.Edges))
	pairs, more, done := coincidentNodes(n, used, opt.CoincidentTolMM, budget)
	for _, pair := range pairs {
		a, b := pair[0], pair[1]
		add(false, n.Nodes[b].Line, "node "+n.Nodes[b].ID, "coincides with node %s (line %d): %.4g mm apart, tolerance %.4g mm",
			n.Nodes[a].ID, n.Nodes[a].Line, r3.Norm(r3.Sub(n.Nodes[a].Pos, n.Nodes[b].Pos)), opt.CoincidentTolMM)
	}
	if more {
		add(false, 0, "", "… and more coincident nodes (only the first %d pairs are listed; is the merge tolerance %g mm too large?)", MaxReportedPairs, opt.CoincidentTolMM)
	}
	if !done {
		add(true, 0, "", "the coincident-node check stopped after %d distance tests; some coincident nodes may be unreported", budget)
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
	for _, e := range t.Edges {
		if len(e.Faces) > 2 {
			add(false, n.Faces[e.Faces[2]].Line, faceElem(e.Faces[2]), "edge %s–%s is shared by %d panels (%s); an edge may have at most two (non-manifold)",
				n.Nodes[e.A].ID, n.Nodes[e.B].ID, len(e.Faces), faceList(n, e.Faces))
		}
	}
	var onEdge []bool // ends of edges with a T-junction: their pinch follows from it
	if len(pairs) == 0 {
		tj, more, done := tJunctions(n, t, used, es, opt.CoincidentTolMM, budget)
		onEdge = make([]bool, len(n.Nodes))
		for _, j := range tj {
			e := t.Edges[j.edge]
			f := e.Faces[0]
			onEdge[e.A], onEdge[e.B] = true, true
			add(false, n.Nodes[j.node].Line, "node "+n.Nodes[j.node].ID, "lies on edge %s–%s of panel %s (line %d) (a T-junction); split that panel's edge at the node",
				n.Nodes[e.A].ID, n.Nodes[e.B].ID, n.Faces[f].ID, n.Faces[f].Line)
		}
		if more {
			add(false, 0, "", "… and more T-junctions (only the first %d are listed)", MaxReportedPairs)
		}
		if !done {
			add(true, 0, "", "the T-junction check stopped after %d distance tests; some T-junctions may be unreported", budget)
		}
	}
	for _, p := range pinches(n, t) {
		if onEdge != nil && onEdge[p.node] {
			continue
		}
		add(false, n.Nodes[p.node].Line, "node "+n.Nodes[p.node].ID, "panels around node %s meet only at this node (a pinch): %d groups (panels %s); give each group its own node or join them through an edge",
			n.Nodes[p.node].ID, len(p.groups), groupList(n, p.groups))
	}
	if len(fd.Errors) == 0 {
		checkOrientation(n, t, &fd)
	}
	var unused []string
	firstLine, cnt := 0, 0
	for i, u := range used {
		if !u {
			if cnt == 0 {
				firstLine = n.Nodes[i].Line
			}
			cnt++
			if len(unused) < maxListed {
				unused = append(unused, n.Nodes[i].ID)
			} else if len(unused) == maxListed {
				unused = append(unused, "…")
			}
		}
	}
	switch {
	case cnt == 1:
		add(true, firstLine, "node "+unused[0], "1 node belongs to no panel (id %s); it is left out", unused[0])
	case cnt > 1:
		add(true, firstLine, "node "+unused[0], "%d nodes belong to no panel (ids %s); they are left out", cnt, strings.Join(unused, ", "))
	}
	if parts := t.Components(len(n.Faces)); len(parts) > 1 {
		add(true, 0, "", "the net has %d disconnected parts (sizes %s)", len(parts), partSizes(parts))
	}
	return t, fd
}

// usedNodes flags the nodes that are a corner of some panel.
func usedNodes(n *Net) []bool {
	used := make([]bool, len(n.Nodes))
	for _, face := range n.Faces {
		for _, c := range face.Corners {
			used[c] = true
		}
	}
	return used
}

// maxListed is the most items a message lists before "…".
const maxListed = 6

// faceList names faces: "1, 2, 3", at most maxListed, then "…".
func faceList(n *Net, faces []int) string {
	ids := make([]string, 0, min(len(faces), maxListed+1))
	for k, f := range faces {
		if k == maxListed {
			ids = append(ids, "…")
			break
		}
		ids = append(ids, n.Faces[f].ID)
	}
	return strings.Join(ids, ", ")
}

// groupList names the panels of each group: "1, 2 | 3, 4", at most
// maxListed groups of at most maxListed panels.
func groupList(n *Net, groups [][]int) string {
	s := make([]string, 0, min(len(groups), maxListed+1))
	for i, g := range groups {
		if i == maxListed {
			s = append(s, "…")
			break
		}
		s = append(s, faceList(n, g))
	}
	return strings.Join(s, " | ")
}

func partSizes(parts [][]int) string {
	s := make([]string, 0, min(len(parts), maxListed+1))
	for i, p := range parts {
		if i == maxListed {
			s = append(s, "…")
			break
		}
		s = append(s, fmt.Sprint(len(p)))
	}
	return strings.Join(s, ", ")
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
		var area geom.Vec
		var vol float64
		var pts []geom.Vec
		for _, f := range part {
			pts = n.FacePoints(pts[:0], f)
			a := geom.VectorArea(pts)
			if flip[f] < 0 {
				a = r3.Scale(-1, a)
			}
			area = r3.Add(area, a)
			vol += r3.Dot(a, geom.Centroid(pts))
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
