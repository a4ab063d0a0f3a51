package quadnet

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/testnets"
)

// firstError validates src (OBJ, mm) and returns all error texts.
func errorsOf(t *testing.T, src string, opt ValidateOptions) []string {
	t.Helper()
	n := mustRead(t, src)
	_, fd := Validate(n, opt)
	var s []string
	for _, e := range fd.Errors {
		s = append(s, e.Error())
	}
	return s
}

func TestTJunction(t *testing.T) {
	// Panel 1 spans nodes 1–2; panels 2 and 3 below it meet at node 5 in
	// the middle of that edge.
	src := "v 0 0 0\nv 2000 0 0\nv 2000 1000 0\nv 0 1000 0\nv 1000 0 0\nv 0 -1000 0\nv 1000 -1000 0\nv 2000 -1000 0\nf 1 2 3 4\nf 6 7 5 1\nf 7 8 2 5\n"
	got := errorsOf(t, src, DefaultValidateOptions())
	want := []string{"t.obj:5: node 5: lies on edge 1–2 of panel 1 (line 9) (a T-junction); split that panel's edge at the node"}
	if !slices.Equal(got, want) {
		t.Errorf("got  %q\nwant %q", got, want)
	}
	// Slightly off the edge: within the tolerance it is a T-junction,
	// beyond it not (and then the panels are just apart).
	for _, tc := range []struct {
		dy   string
		want int
	}{{"0.009", 1}, {"-0.009", 1}, {"0.02", 0}} {
		s := strings.Replace(src, "v 1000 0 0", "v 1000 "+tc.dy+" 0", 1)
		got := errorsOf(t, s, DefaultValidateOptions())
		n := 0
		for _, e := range got {
			if strings.Contains(e, "T-junction") {
				n++
			}
		}
		if n != tc.want {
			t.Errorf("dy %s: %d T-junctions in %q, want %d", tc.dy, n, got, tc.want)
		}
	}
	// Good nets have none: a tilted grid and closed polyhedra.
	for _, src := range []string{gridOBJ(30, 20, 1500), testnets.RhombicTriacontahedron(500).OBJ(), testnets.Cube(1000).OBJ()} {
		if got := errorsOf(t, src, DefaultValidateOptions()); len(got) > 0 {
			t.Errorf("good net: %q", got)
		}
	}
}

func TestPinch(t *testing.T) {
	tests := []struct{ name, src, want string }{
		{"two quads at a node", "v 0 0 0\nv 1000 0 0\nv 1000 1000 0\nv 0 1000 0\nv 2000 1000 0\nv 2000 2000 0\nv 1000 2000 0\nf 1 2 3 4\nf 3 5 6 7\n",
			"t.obj:3: node 3: panels around node 3 meet only at this node (a pinch): 2 groups (panels 1 | 2); give each group its own node or join them through an edge"},
		// Two fans of two triangles each touching at their apex node 1.
		{"two fans", "v 0 0 0\nv 1000 0 0\nv 1000 1000 0\nv 0 1000 0\nv -1000 0 0\nv -1000 -1000 0\nv 0 -1000 0\nf 1 2 3\nf 1 3 4\nf 1 5 6\nf 1 6 7\n",
			"t.obj:1: node 1: panels around node 1 meet only at this node (a pinch): 2 groups (panels 1, 2 | 3, 4); give each group its own node or join them through an edge"},
	}
	for _, tc := range tests {
		got := errorsOf(t, tc.src, DefaultValidateOptions())
		if len(got) == 0 || got[0] != tc.want {
			t.Errorf("%s: got %q\nwant %q", tc.name, got, tc.want)
		}
	}
	// A closed fan (a pyramid without its base) and an open one are fine.
	fan := "v 0 0 500\nv 1000 0 0\nv 0 1000 0\nv -1000 0 0\nv 0 -1000 0\nf 1 2 3\nf 1 3 4\nf 1 4 5\n"
	if got := errorsOf(t, fan, DefaultValidateOptions()); len(got) > 0 {
		t.Errorf("open fan: %q", got)
	}
	if got := errorsOf(t, fan+"f 1 5 2\n", DefaultValidateOptions()); len(got) > 0 {
		t.Errorf("closed fan: %q", got)
	}
}

func TestBowTie(t *testing.T) {
	tests := []struct{ name, src, want string }{
		{"symmetric", "v 0 0 0\nv 1000 1000 0\nv 1000 0 0\nv 0 1000 0\nf 1 2 3 4\n",
			"t.obj:5: panel 1: corners out of order: the outline crosses itself (a bow-tie: edges 1–2 and 3–4 cross)"},
		{"lopsided", "v 0 0 0\nv 1000 1200 0\nv 1000 0 0\nv 0 800 0\nf 1 2 3 4\n",
			"t.obj:5: panel 1: corners out of order: the outline crosses itself (a bow-tie: edges 1–2 and 3–4 cross)"},
		{"not flat", "v 0 0 0\nv 1000 1000 30\nv 1000 0 -30\nv 0 1000 0\nf 1 2 3 4\n",
			"t.obj:5: panel 1: corners out of order: the outline crosses itself (a bow-tie: edges 1–2 and 3–4 cross)"},
		{"hexagon", "v 0 0 0\nv 1000 0 0\nv 1500 800 0\nv 0 1600 0\nv 1000 1600 0\nv -500 800 0\nf 1 2 3 4 5 6\n",
			"t.obj:7: panel 1: corners out of order: the outline crosses itself (a bow-tie: edges 3–4 and 5–6 cross)"},
		// Collinear corners are a degenerate panel, not a bow-tie.
		{"collinear", "v 0 0 0\nv 2000 0 0\nv 1000 0 0\nv 3000 0 0\nf 1 2 3 4\n",
			"t.obj:5: panel 1: area 0 mm² is below 1 mm² (degenerate panel)"},
	}
	for _, tc := range tests {
		got := errorsOf(t, tc.src, DefaultValidateOptions())
		if len(got) == 0 || got[0] != tc.want {
			t.Errorf("%s: got %q\nwant %q", tc.name, got, tc.want)
		}
	}
}

func TestWrongUnit(t *testing.T) {
	grid := gridOBJ(4, 3, 1.5) // a net in metres
	tests := []struct {
		name string
		src  string
		unit Unit
		want string
	}{
		{"metres read as mm", grid, MM, "u.obj: the net measures 6 × 4.5 × 0 mm with a median edge of 1.5 mm; members of a building net are 30 mm to 30 m long: it looks like metres: set the unit to m"},
		{"metres read as cm", grid, CM, "u.obj: the net measures 6 × 4.5 × 0 cm with a median edge of 1.5 cm; members of a building net are 30 mm to 30 m long: it looks like metres: set the unit to m"},
		{"mm read as m", gridOBJ(4, 3, 1500), M, "u.obj: the net measures 6000 × 4500 × 0 m with a median edge of 1500 m; members of a building net are 30 mm to 30 m long: it looks like millimetres: set the unit to mm"},
		{"no unit fits", gridOBJ(2, 2, 0.001), MM, "u.obj: the net measures 0.002 × 0.002 × 0 mm with a median edge of 0.001 mm; members of a building net are 30 mm to 30 m long, and no unit pqfab reads (mm, cm, m) makes it so: check the scale of the file"},
	}
	for _, tc := range tests {
		n, err := ReadOBJ(strings.NewReader(tc.src), "u.obj", tc.unit)
		if err != nil {
			t.Fatal(err)
		}
		_, fd := Validate(n, DefaultValidateOptions())
		if len(fd.Errors) != 1 || fd.Errors[0].Error() != tc.want {
			t.Errorf("%s: got %v\nwant %s", tc.name, fd.Errors, tc.want)
			continue
		}
		if !errors.Is(fd.Errors[0], ErrWrongUnit) || len(fd.Warnings) > 0 {
			t.Errorf("%s: %v does not wrap ErrWrongUnit, or warnings %v", tc.name, fd.Errors[0], fd.Warnings)
		}
	}
	// The right unit passes.
	for _, u := range []Unit{MM, CM, M} {
		n, err := ReadOBJ(strings.NewReader(gridOBJ(4, 3, 1500/float64(u))), "u.obj", u)
		if err != nil {
			t.Fatal(err)
		}
		if _, fd := Validate(n, DefaultValidateOptions()); fd.Err() != nil {
			t.Errorf("%s: %v", u, fd.Err())
		}
	}
}

// TestHugeMergeTolerance: a tolerance that makes every node coincide with
// every other lists a bounded number of pairs, quickly.
func TestHugeMergeTolerance(t *testing.T) {
	n := mustRead(t, gridOBJ(100, 100, 1500))
	opt := DefaultValidateOptions()
	opt.CoincidentTolMM = 1e9
	_, fd := Validate(n, opt)
	pairs := 0
	for _, e := range fd.Errors {
		if strings.Contains(e.Msg, "coincides with") {
			pairs++
		}
	}
	if pairs != MaxReportedPairs {
		t.Errorf("%d pairs listed, want %d", pairs, MaxReportedPairs)
	}
	last := fd.Errors[len(fd.Errors)-1].Error()
	if want := "t.obj: … and more coincident nodes (only the first 100 pairs are listed; is the merge tolerance 1e+09 mm too large?)"; last != want {
		t.Errorf("last error %q, want %q", last, want)
	}
}

func TestUnusedNodes(t *testing.T) {
	src := gridOBJ(1, 1, 1000) + "v 5000 0 0\nv 6000 0 0\nv 6000 1000 0\nv 9000 9000 0\nf 6 7 5\n"
	n := mustRead(t, src)
	n.Nodes[1].Support = true
	kept, dropped := DropUnused(n)
	if !slices.Equal(dropped, []int{7}) {
		t.Fatalf("dropped %v", dropped)
	}
	if len(kept.Nodes) != 7 || len(kept.Faces) != 2 {
		t.Fatalf("kept %d nodes %d faces", len(kept.Nodes), len(kept.Faces))
	}
	for i, f := range n.Faces {
		for k, c := range f.Corners {
			if kept.Nodes[kept.Faces[i].Corners[k]] != n.Nodes[c] {
				t.Errorf("face %d corner %d: %+v want %+v", i, k, kept.Nodes[kept.Faces[i].Corners[k]], n.Nodes[c])
			}
		}
	}
	if kept.Source != n.Source || kept.Unit != n.Unit || !kept.Nodes[1].Support {
		t.Errorf("kept lost fields: %+v", kept)
	}
	// Nothing to drop: an equal copy.
	k2, d2 := DropUnused(kept)
	if len(d2) != 0 || !sameNet(k2, kept) {
		t.Errorf("second drop: %v", d2)
	}
	_, fd := Validate(kept, DefaultValidateOptions())
	if len(fd.Warnings) != 1 || !strings.Contains(fd.Warnings[0].Msg, "disconnected") {
		t.Errorf("after drop: %v", fd.Warnings)
	}
}

// TestLeastSquaresPlane checks the allocation-free plane of the bow-tie
// test against FitPlane (gonum's symmetric eigen solver) on random
// panels: the normals agree up to sign.
func TestLeastSquaresPlane(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for trial := 0; trial < 500; trial++ {
		k := 4 + rng.IntN(3)
		pts := make([]geom.Vec, k)
		for i := range pts {
			pts[i] = geom.Vec{X: rng.Float64() * 2000, Y: rng.Float64() * 1500, Z: rng.NormFloat64() * 50 * float64(trial%3)}
		}
		fit, err := geom.FitPlane(pts)
		if err != nil {
			t.Fatal(err)
		}
		c, n := leastSquaresPlane(pts)
		if d := math.Abs(math.Abs(r3.Dot(n, fit.Normal)) - 1); d > 1e-9 || r3.Norm(r3.Sub(c, fit.Origin)) > 1e-9 {
			t.Fatalf("trial %d: normal %v vs %v (1-|cos| = %g)", trial, n, fit.Normal, d)
		}
	}
}

// TestLongLists: messages list at most a few panels or groups, however
// many there are.
func TestLongLists(t *testing.T) {
	var b strings.Builder
	b.WriteString("v 0 0 0\nv 1000 0 0\n")
	for i := 0; i < 20; i++ { // 20 triangles on edge 1–2: non-manifold
		fmt.Fprintf(&b, "v 500 %d %d\nf 1 2 %d\n", 300+50*i, 100*i, i+3)
	}
	got := errorsOf(t, b.String(), DefaultValidateOptions())
	want := "t.obj:8: panel 3: edge 1–2 is shared by 20 panels (1, 2, 3, 4, 5, 6, …); an edge may have at most two (non-manifold)"
	if len(got) == 0 || got[0] != want {
		t.Errorf("got %q\nwant %q", got, want)
	}
	b.Reset()
	b.WriteString("v 0 0 0\n")
	for i := 0; i < 10; i++ { // 10 triangles meeting only at node 1
		a := float64(i) * 2 * math.Pi / 10
		fmt.Fprintf(&b, "v %.3f %.3f 0\nv %.3f %.3f 0\nf 1 %d %d\n", 1000*math.Cos(a), 1000*math.Sin(a), 1000*math.Cos(a+0.3), 1000*math.Sin(a+0.3), 2*i+2, 2*i+3)
	}
	got = errorsOf(t, b.String(), DefaultValidateOptions())
	want = "t.obj:1: node 1: panels around node 1 meet only at this node (a pinch): 10 groups (panels 1 | 2 | 3 | 4 | 5 | 6 | …); give each group its own node or join them through an edge"
	if len(got) == 0 || got[0] != want {
		t.Errorf("got %q\nwant %q", got, want)
	}
}

func TestValidateOptions(t *testing.T) {
	if err := DefaultValidateOptions().Validate(); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		mod  func(*ValidateOptions)
		want string
	}{
		{func(o *ValidateOptions) { o.CoincidentTolMM = -2 }, "CoincidentTolMM: -2 must be a finite number, zero or more"},
		{func(o *ValidateOptions) { o.MinAreaMM2 = math.NaN() }, "MinAreaMM2: NaN must be a finite number, zero or more"},
		{func(o *ValidateOptions) { o.MaxMedianEdgeMM = 10 }, "MaxMedianEdgeMM: 10 is below MinMedianEdgeMM 30"},
	} {
		o := DefaultValidateOptions()
		tc.mod(&o)
		var fe *geom.FieldError
		if err := o.Validate(); !errors.As(err, &fe) || err.Error() != tc.want {
			t.Errorf("got %v, want %s", err, tc.want)
		}
	}
}

// TestUnusedNotChecked: nodes in no panel are left out, so a stray node on
// top of another or on an edge is only the unused-node warning.
func TestUnusedNotChecked(t *testing.T) {
	src := gridOBJ(2, 1, 1000) + "v 1000 0 0\nv 500 0 0\n"
	n := mustRead(t, src)
	_, fd := Validate(n, DefaultValidateOptions())
	if fd.Err() != nil || len(fd.Warnings) != 1 || !strings.Contains(fd.Warnings[0].Msg, "2 nodes belong to no panel (ids 7, 8)") {
		t.Errorf("got %v %v", fd.Err(), fd.Warnings)
	}
}

// TestPinchInOnePart: a ring of panels whose two panels touch diagonally
// at one node is one connected part, and the node is still a pinch.
func TestPinchInOnePart(t *testing.T) {
	lines := strings.Split(gridOBJ(3, 3, 1000), "\n")
	var kept []string
	for _, l := range lines {
		// Drop the middle panel (nodes 6 7 11 10) and the top-right one.
		if l != "f 6 7 11 10" && l != "f 11 12 16 15" {
			kept = append(kept, l)
		}
	}
	n := mustRead(t, strings.Join(kept, "\n"))
	topo, fd := Validate(n, DefaultValidateOptions())
	if parts := topo.Components(len(n.Faces)); len(parts) != 1 {
		t.Fatalf("%d parts", len(parts))
	}
	want := "t.obj:11: node 11: panels around node 11 meet only at this node (a pinch): 2 groups (panels 5 | 7); give each group its own node or join them through an edge"
	if len(fd.Errors) != 1 || fd.Errors[0].Error() != want {
		t.Errorf("got %v\nwant %s", fd.Errors, want)
	}
}
