package nodes

import (
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/testnets"
	"pqfab/quadnet"
	"pqfab/samples"
)

func topoOf(t testing.TB, n *quadnet.Net) *quadnet.Topology {
	t.Helper()
	topo, fd := quadnet.Validate(n, quadnet.DefaultValidateOptions())
	if fd.Err() != nil {
		t.Fatal(fd.Err())
	}
	return topo
}

// TestDomeTorsionFree: on a surface of revolution meshed by meridians and
// parallels the node axes can meet the rotation axis and every member is
// twist-free (conical/circular nets: Pottmann et al. 2007; Liu et al.
// 2006). Least-twist axes must find that: twist 0 to 1e-6°, and each axis
// line passes through the z axis.
func TestDomeTorsionFree(t *testing.T) {
	n, _ := samples.Make("dome", 3000)
	topo := topoOf(t, n)
	normals, err := NormalAxes(n)
	if err != nil {
		t.Fatal(err)
	}
	axes, err := LeastTwistAxes(n, topo, normals, DefaultAxisStiffness)
	if err != nil {
		t.Fatal(err)
	}
	ms, err := Members(n, topo, axes, MemberOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if got := MaxAbsTwist(ms); got > 1e-6 {
		t.Errorf("largest twist %g°", got)
	}
	for i, a := range axes {
		p := n.Nodes[i].Pos
		// Distance between the axis line p + t a and the z axis:
		// |(p × ... )|: the common normal of a and z is a × z.
		c := r3.Cross(a, geom.Vec{Z: 1})
		d := math.Abs(r3.Dot(p, r3.Unit(c)))
		if d > 1e-6 {
			t.Fatalf("node %d: axis misses the rotation axis by %g mm", i, d)
		}
	}
}

// TestPolyhedraDihedral: with axes through the centre every twist is 0
// (all axes meet at one point), and the dihedral angles are the handbook
// values: rhombic dodecahedron 120°, rhombic triacontahedron 144°.
func TestPolyhedraDihedral(t *testing.T) {
	for _, tc := range []struct {
		name string
		p    testnets.Polyhedron
		want float64
	}{
		{"rhombic dodecahedron", testnets.RhombicDodecahedron(500), 120},
		{"rhombic triacontahedron", testnets.RhombicTriacontahedron(500), 144},
	} {
		n, err := quadnet.ReadOBJ(strings.NewReader(tc.p.OBJ()), tc.name, quadnet.MM)
		if err != nil {
			t.Fatal(err)
		}
		topo := topoOf(t, n)
		axes := make([]geom.Vec, len(n.Nodes))
		for i, nd := range n.Nodes {
			axes[i] = r3.Unit(nd.Pos)
		}
		ms, err := Members(n, topo, axes, MemberOptions{HubRadiusMM: 20})
		if err != nil {
			t.Fatal(err)
		}
		for _, m := range ms {
			if math.Abs(m.TwistDeg) > 1e-9 {
				t.Errorf("%s: twist %g°", tc.name, m.TwistDeg)
			}
			if math.Abs(m.DihedralDeg-tc.want) > 1e-9 {
				t.Errorf("%s: dihedral %.12f° want %g°", tc.name, m.DihedralDeg, tc.want)
			}
		}
	}
}

// TestHyparTwist: a strip of the hyperbolic paraboloid z = xy/c along its
// ruling x = x0, with the surface normals N = (−y/c, −x0/c, 1) as axes.
// Along the ruling e = unit(0, 1, x0/c) and N·e = 0, so u = N/|N|. Write
// N = b − s x̂ with s = y/c, b = (0, −x0/c, 1) ⊥ x̂ and |b| = β =
// √(1 + x0²/c²). Then b × x̂ = (0, 1, x0/c) = β e, so b̂ × x̂ = e and the
// frame (b̂, x̂, e) is right-handed: u(y) makes the angle atan(s/β) with b̂
// turning towards −x̂, which is a turn of −atan(s/β) about e. The twist of
// the member from y0 to y1 (the signed angle from u(y0) to u(y1) about e)
// is therefore exactly atan(y0/(cβ)) − atan(y1/(cβ)). Reading the member
// from its other end changes both the direction of e and the order of
// the axes, so the twist has no sign ambiguity.
func TestHyparTwist(t *testing.T) {
	for _, reversed := range []bool{false, true} {
		for _, c := range []float64{20000, -35000} {
			for _, x0 := range []float64{0, 3000, -4500} {
				y0, y1 := 1000.0, 2500.0
				z := func(x, y float64) float64 { return x * y / c }
				n := &quadnet.Net{Source: "hypar"}
				corners := [][2]float64{{x0, y0}, {x0 + 1500, y0}, {x0 + 1500, y1}, {x0, y1}}
				face := []int{0, 1, 2, 3}
				if reversed {
					// Nodes stored in the opposite order: the member on the
					// ruling then runs from y1 to y0.
					slices.Reverse(corners)
					face = []int{3, 2, 1, 0}
				}
				for _, p := range corners {
					n.Nodes = append(n.Nodes, quadnet.Node{ID: "n", Pos: geom.Vec{X: p[0], Y: p[1], Z: z(p[0], p[1])}})
				}
				n.Faces = []quadnet.Face{{ID: "f", Corners: face}}
				topo := quadnet.BuildTopology(n)
				axes := make([]geom.Vec, 4)
				for i, nd := range n.Nodes {
					axes[i] = r3.Unit(geom.Vec{X: -nd.Pos.Y / c, Y: -nd.Pos.X / c, Z: 1})
				}
				ms, err := Members(n, topo, axes, MemberOptions{})
				if err != nil {
					t.Fatal(err)
				}
				beta := math.Sqrt(1 + x0*x0/(c*c))
				want := deg(math.Atan(y0/(c*beta)) - math.Atan(y1/(c*beta)))
				checked := 0
				for _, m := range ms {
					e := topo.Edges[m.Edge]
					if n.Nodes[e.A].Pos.X != x0 || n.Nodes[e.B].Pos.X != x0 {
						continue // only the ruling at x0
					}
					checked++
					if got := m.TwistDeg; math.Abs(got-want) > 1e-9 {
						t.Errorf("c=%g x0=%g: twist %.12f° want %.12f°", c, x0, got, want)
					}
				}
				if checked != 1 {
					t.Errorf("c=%g x0=%g: %d members on the ruling, want 1", c, x0, checked)
				}
			}
		}
	}
}

// TestHubSetback: a member rising at a known elevation from a node with a
// vertical axis loses s = r / cos(elevation) to a hub of radius r.
func TestHubSetback(t *testing.T) {
	for _, elev := range []float64{0, 10, 25, -30} {
		el := elev * math.Pi / 180
		L := 2000.0
		n := &quadnet.Net{Source: "bar", Nodes: []quadnet.Node{
			{ID: "a", Pos: geom.Vec{}},
			{ID: "b", Pos: geom.Vec{X: L * math.Cos(el), Z: L * math.Sin(el)}},
			{ID: "c", Pos: geom.Vec{X: 0, Y: 1000}},
		}, Faces: []quadnet.Face{{ID: "f", Corners: []int{0, 1, 2}}}}
		topo := quadnet.BuildTopology(n)
		up := geom.Vec{Z: 1}
		ms, err := Members(n, topo, []geom.Vec{up, up, up}, MemberOptions{HubRadiusMM: 60})
		if err != nil {
			t.Fatal(err)
		}
		m := ms[0] // edge a–b
		want := 60 / math.Cos(el)
		if math.Abs(m.A.SetbackMM-want) > 1e-9 || math.Abs(m.B.SetbackMM-want) > 1e-9 {
			t.Errorf("elevation %g°: setbacks %g %g want %g", elev, m.A.SetbackMM, m.B.SetbackMM, want)
		}
		if math.Abs(m.A.ElevationDeg-elev) > 1e-9 || math.Abs(m.B.ElevationDeg+elev) > 1e-9 {
			t.Errorf("elevations %g %g", m.A.ElevationDeg, m.B.ElevationDeg)
		}
		if math.Abs(m.CutLengthMM-(L-2*want)) > 1e-9 {
			t.Errorf("cut length %g", m.CutLengthMM)
		}
		// A vertical cut on a sloping member: bevel equals the elevation at
		// each end (the plane contains the vertical axis), no mitre.
		if math.Abs(m.A.MitreDeg) > 1e-9 || math.Abs(math.Abs(m.A.BevelDeg)-math.Abs(elev)) > 1e-9 {
			t.Errorf("elevation %g°: mitre %g bevel %g", elev, m.A.MitreDeg, m.A.BevelDeg)
		}
	}
}

// TestLabelsStable: labels do not change between runs or when the panels
// of the input come in another order.
func TestLabelsStable(t *testing.T) {
	n, _ := samples.Make("wave", 800)
	bays, _ := quadnet.NewBays(n.Positions(), 6000, 6000)
	s1, err := Build(n, topoOf(t, n), testOptions(AxisNormal, 0, bays))
	if err != nil {
		t.Fatal(err)
	}
	s2, _ := Build(n, topoOf(t, n), testOptions(AxisNormal, 0, bays))
	m := n.Clone()
	rng := rand.New(rand.NewPCG(9, 9))
	rng.Shuffle(len(m.Faces), func(i, j int) { m.Faces[i], m.Faces[j] = m.Faces[j], m.Faces[i] })
	s3, err := Build(m, topoOf(t, m), testOptions(AxisNormal, 0, bays))
	if err != nil {
		t.Fatal(err)
	}
	labels := map[string]bool{}
	for i := range s1.Nodes {
		if s1.Nodes[i].Label != s2.Nodes[i].Label || s1.Nodes[i].Label != s3.Nodes[i].Label {
			t.Fatalf("node %d: %s %s %s", i, s1.Nodes[i].Label, s2.Nodes[i].Label, s3.Nodes[i].Label)
		}
		labels[s1.Nodes[i].Label] = true
	}
	byEnds := func(s *Structure, topo *quadnet.Topology) map[[2]int]string {
		out := map[[2]int]string{}
		for _, mb := range s.Members {
			e := topo.Edges[mb.Edge]
			out[[2]int{e.A, e.B}] = mb.Label
		}
		return out
	}
	l1, l3 := byEnds(s1, quadnet.BuildTopology(n)), byEnds(s3, quadnet.BuildTopology(m))
	for k, v := range l1 {
		if l3[k] != v {
			t.Fatalf("member %v: %s vs %s", k, v, l3[k])
		}
		labels[v] = true
	}
	if len(labels) != len(s1.Nodes)+len(s1.Members) {
		t.Errorf("labels not unique: %d for %d parts", len(labels), len(s1.Nodes)+len(s1.Members))
	}
}

func benchBuild(b *testing.B, axis AxisMethod) {
	n, _ := samples.Make("wave", 100000)
	topo := quadnet.BuildTopology(n)
	bays, _ := quadnet.NewBays(n.Positions(), 6000, 6000)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Build(n, topo, testOptions(axis, 50, bays)); err != nil {
			b.Fatal(err)
		}
	}
}

// Targets: 100k panels, normal axes + members + labels + types ≤ 1 s;
// least-twist ≤ 2 s; ≤ 300 MB.
func BenchmarkStructure100kNormal(b *testing.B)     { benchBuild(b, AxisNormal) }
func BenchmarkStructure100kLeastTwist(b *testing.B) { benchBuild(b, AxisLeastTwist) }

// testOptions returns the default options with the given axes, hub and bays.
func testOptions(axis AxisMethod, hubMM float64, bays quadnet.Bays) Options {
	o := DefaultOptions()
	o.Axis, o.HubRadiusMM, o.Bays = axis, hubMM, bays
	return o
}

// TestSetbackFromEndAngles: the setback computed from an end's mitre and
// bevel alone equals the member's own setback r / cos(elevation) (DESIGN's
// hub cut), on the least-twist wave where every end has both angles.
func TestSetbackFromEndAngles(t *testing.T) {
	n, _ := samples.Make("wave", 300)
	bays, _ := quadnet.NewBays(n.Positions(), 6000, 6000)
	s, err := Build(n, topoOf(t, n), testOptions(AxisLeastTwist, 55, bays))
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range s.Members {
		for _, e := range []End{m.A, m.B} {
			if got := SetbackMM(55, e.MitreDeg, e.BevelDeg); math.Abs(got-e.SetbackMM) > 1e-9 {
				t.Fatalf("%s: setback %.12f from the angles, %.12f from the elevation", m.Label, got, e.SetbackMM)
			}
		}
	}
}
