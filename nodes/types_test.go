package nodes

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/typenets"
	"pqfab/parttype"
	"pqfab/quadnet"
	"pqfab/samples"
)

var defaultTol = TypeOptions{LengthTolMM: DefaultTypeLengthTolMM, AngleTolDeg: DefaultTypeAngleTolDeg}

// swapEnds is the test's own statement of reading a member from its other
// end: ends swap, bevels change sign, mitres and twist stay.
func swapEnds(c [6]float64) [6]float64 { return [6]float64{c[0], c[3], -c[4], c[1], -c[2], c[5]} }

// memberVec reads a member's cut length, mitre A, bevel A, mitre B,
// bevel B and twist from its fields, from end A or from end B.
func memberVec(m Member, reversed bool) [6]float64 {
	c := [6]float64{m.CutLengthMM, m.A.MitreDeg, m.A.BevelDeg, m.B.MitreDeg, m.B.BevelDeg, m.TwistDeg}
	if reversed {
		return swapEnds(c)
	}
	return c
}

// TestMemberReadFromOtherEnd: renumbering the nodes of a net backwards
// turns every member round (edges run from the lower node index), so the
// same member is computed from its other end. Its values must be the
// member's values read from the other end as memberCoords states it: the
// ends swap, the bevels change sign, the mitres and the twist do not (the
// twist, from u_A to u_B about e, becomes the angle from u_B to u_A about
// −e: the same angle). The wave has twisted members and mitred ends, so
// every part of the statement is exercised.
func TestMemberReadFromOtherEnd(t *testing.T) {
	n, _ := samples.Make("wave", 200)
	N := len(n.Nodes)
	m := n.Clone()
	for k := range m.Nodes {
		m.Nodes[k] = n.Nodes[N-1-k]
	}
	for f := range m.Faces {
		for c, i := range n.Faces[f].Corners {
			m.Faces[f].Corners[c] = N - 1 - i
		}
	}
	compute := func(n *quadnet.Net) ([]Member, *quadnet.Topology) {
		topo := topoOf(t, n)
		axes, err := NormalAxes(n)
		if err != nil {
			t.Fatal(err)
		}
		ms, err := Members(n, topo, axes, MemberOptions{HubRadiusMM: 60})
		if err != nil {
			t.Fatal(err)
		}
		return ms, topo
	}
	ms, topo := compute(n)
	mr, topoR := compute(m)
	byEnds := map[[2]int]Member{}
	for _, x := range mr {
		e := topoR.Edges[x.Edge]
		byEnds[[2]int{N - 1 - e.B, N - 1 - e.A}] = x // its end B is the original's end A
	}
	twisted, mitred := 0, 0
	for _, x := range ms {
		e := topo.Edges[x.Edge]
		y, ok := byEnds[[2]int{e.A, e.B}]
		if !ok {
			t.Fatalf("member %d–%d not found read backwards", e.A, e.B)
		}
		got, want := memberVec(y, false), swapEnds(memberVec(x, false))
		for d := range got {
			if math.Abs(got[d]-want[d]) > 1e-9 {
				t.Fatalf("member %d–%d read backwards: %v, want %v", e.A, e.B, got, want)
			}
		}
		if c := memberCoords(x, true); c != want {
			t.Fatalf("memberCoords reversed %v, want %v", c, want)
		}
		if math.Abs(x.TwistDeg) > 0.01 {
			twisted++
		}
		if math.Abs(x.A.MitreDeg) > 0.01 {
			mitred++
		}
	}
	if twisted == 0 || mitred == 0 {
		t.Errorf("%d twisted and %d mitred members: the check needs both", twisted, mitred)
	}
}

// domeGeometry recovers a dome of revolution's rings, segments, radius
// and latitudes from its net (nodes on rings + 1 parallels, segments
// nodes each; the sphere's centre at the origin).
func domeGeometry(n *quadnet.Net) (rings, segs int, radius float64, lat []float64) {
	segs = len(n.Nodes) - len(n.Faces)
	rings = len(n.Faces) / segs
	radius = r3.Norm(n.Nodes[0].Pos)
	for j := 0; j <= rings; j++ {
		lat = append(lat, math.Asin(n.Nodes[j*segs].Pos.Z/radius))
	}
	return rings, segs, radius, lat
}

// chainCount covers points along a curve, in order, by the fewest runs
// whose every coordinate ranges within tol[d]: greedy maximal runs, which
// is optimal when every coordinate is monotone along the curve (a box
// holding two points holds every point between them, so an optimal cover
// may use runs, and the greedy run reaches furthest).
func chainCount(pts [][]float64, tol []float64) int {
	n := 0
	for i := 0; i < len(pts); {
		n++
		j := i + 1
		for ; j < len(pts); j++ {
			ok := true
			for d := range tol {
				lo, hi := math.Inf(1), math.Inf(-1)
				for _, p := range pts[i : j+1] {
					lo, hi = min(lo, p[d]), max(hi, p[d])
				}
				ok = ok && hi-lo <= tol[d]
			}
			if !ok {
				break
			}
		}
		i = j
	}
	return n
}

// TestDomeTypes: a dome of revolution on meridians and parallels, with
// every node axis through the sphere's centre (radial). Any chord of the
// sphere with radial axes at its ends is the same member as any other
// chord of its length: the axes and the chord lie in one plane through
// the centre, so twist and mitres are 0, and both ends are cut at the
// half central angle θ/2 = asin(L/2ρ) with setback r/cos(θ/2). So the
// member kinds are the meridian chord 2ρ sin(Δ/2) (Δ the latitude step)
// and one parallel chord 2ρ cos(lat_j) sin(π/S) per ring, and every
// coordinate grows with L: the fewest types is the greedy run count of
// the kinds sorted by L.
//
// Panels: one isosceles trapezoid per band between rings (a turn about
// the axis maps one onto the next in its band); bands differ in their
// parallel edges by far more than the tolerance, so rings types.
//
// Nodes: in the tangent frame at latitude lat (east, north, radial axis)
// the arms point north and south (elevation −θm/2, θm the meridian's
// central angle) and east and west at azimuths δ and 180° − δ with
// tan δ = tan(π/S) sin(lat) (the horizontal chord seen in the tangent
// plane) and elevation −θp/2 = −asin(cos(lat) sin(π/S)). Read from the
// north arm a node is (90° − δ, 180°, 270° + δ) with elevations; read
// from an east or west arm it carries 2δ, so types read their nodes from
// a meridian arm, and δ and θp/2 each change monotonically from ring to
// ring: inner rings take the greedy run count over (δ, θp/2). The base
// and top rings have three arms each and differ in δ and θp by more than
// the tolerance: one type each.
func TestDomeTypes(t *testing.T) {
	for _, tc := range []struct {
		panels int
		tol    TypeOptions
	}{
		{1000, defaultTol},
		{1000, TypeOptions{LengthTolMM: 0.01, AngleTolDeg: 0.01}},
		{3000, TypeOptions{LengthTolMM: 5, AngleTolDeg: 0.2}},
		{2000, TypeOptions{LengthTolMM: 2, AngleTolDeg: 0.3}},
		{5000, TypeOptions{LengthTolMM: 0.5, AngleTolDeg: 0.1}},
		{600, TypeOptions{LengthTolMM: 20, AngleTolDeg: 1}},
	} {
		n, _ := samples.Make("dome", tc.panels)
		topo := topoOf(t, n)
		rings, segs, rho, lat := domeGeometry(n)
		axes := make([]geom.Vec, len(n.Nodes))
		for i, nd := range n.Nodes {
			axes[i] = r3.Unit(nd.Pos)
		}
		const hub = 60.0
		ms, err := Members(n, topo, axes, MemberOptions{HubRadiusMM: hub})
		if err != nil {
			t.Fatal(err)
		}
		nodeLabels, memberLabels := Labels(n, topo, quadnet.Bays{})
		for k := range ms {
			ms[k].Label = memberLabels[k]
		}
		nds, err := Hubs(n, topo, axes, ms, nodeLabels)
		if err != nil {
			t.Fatal(err)
		}
		mt, mb, err := GroupMembers(ms, tc.tol)
		if err != nil {
			t.Fatal(err)
		}
		nt, nb, err := GroupNodes(nds, tc.tol)
		if err != nil {
			t.Fatal(err)
		}

		// Members: kinds by chord length, greedy runs in L.
		chord := func(L float64) []float64 {
			half := math.Asin(L / (2 * rho))
			return []float64{L - 2*hub/math.Cos(half), half * 180 / math.Pi}
		}
		Ls := []float64{2 * rho * math.Sin((lat[1]-lat[0])/2)}
		for j := 0; j <= rings; j++ {
			Ls = append(Ls, 2*rho*math.Cos(lat[j])*math.Sin(math.Pi/float64(segs)))
		}
		slices.Sort(Ls)
		var kinds [][]float64
		for _, L := range Ls {
			kinds = append(kinds, chord(L))
		}
		if got, want := len(mt), chainCount(kinds, []float64{tc.tol.LengthTolMM, tc.tol.AngleTolDeg}); got != want {
			t.Errorf("%d panels, %v: %d member types, want %d", tc.panels, tc.tol, got, want)
		}

		// Nodes: two end rings, greedy runs over the inner rings.
		var inner [][]float64
		for j := 1; j < rings; j++ {
			delta := math.Atan(math.Tan(math.Pi/float64(segs))*math.Sin(lat[j])) * 180 / math.Pi
			halfP := math.Asin(math.Cos(lat[j])*math.Sin(math.Pi/float64(segs))) * 180 / math.Pi
			inner = append(inner, []float64{delta, halfP})
		}
		if got, want := len(nt), 2+chainCount(inner, []float64{tc.tol.AngleTolDeg, tc.tol.AngleTolDeg}); got != want {
			t.Errorf("%d panels, %v: %d node types, want %d", tc.panels, tc.tol, got, want)
		}
		if mb.Count > len(mt) || nb.Count > len(nt) {
			t.Errorf("bounds %d %d above counts %d %d", mb.Count, nb.Count, len(mt), len(nt))
		}
		t.Logf("dome %d panels (%d rings × %d), tol %v: %d member types (bound %d), %d node types (bound %d)",
			len(n.Faces), rings, segs, tc.tol, len(mt), mb.Count, len(nt), nb.Count)
		checkMemberTypes(t, fmt.Sprintf("dome %d", tc.panels), ms, mt, tc.tol)
		checkNodeTypes(t, fmt.Sprintf("dome %d", tc.panels), nds, nt, tc.tol)
	}
}

// TestTypes: the canopy, a translational surface z = f(x) + g(y) with f
// and g symmetric about the mid-lines, is unchanged by the half turn about
// the vertical line through its centre, a rotation: every member and node
// is congruent to its image, so the two are one type (and agree within
// the resolution, so always share one). Types are numbered by nominal cut
// length, every member is in exactly one type, and the count is at least
// its bound.
func TestTypes(t *testing.T) {
	n, _ := samples.Make("canopy", 96) // 12 × 8 panels
	bays, _ := quadnet.NewBays(n.Positions(), 6000, 6000)
	topo := topoOf(t, n)
	s, err := Build(n, topo, testOptions(AxisLeastTwist, 50, bays))
	if err != nil {
		t.Fatal(err)
	}
	// The image of node i under the half turn.
	lo, hi := n.Nodes[0].Pos, n.Nodes[0].Pos
	for _, nd := range n.Nodes {
		lo = geom.Vec{X: min(lo.X, nd.Pos.X), Y: min(lo.Y, nd.Pos.Y)}
		hi = geom.Vec{X: max(hi.X, nd.Pos.X), Y: max(hi.Y, nd.Pos.Y)}
	}
	image := map[[2]int64]int{}
	key := func(x, y float64) [2]int64 { return [2]int64{int64(math.Round(x)), int64(math.Round(y))} }
	for i, nd := range n.Nodes {
		image[key(nd.Pos.X, nd.Pos.Y)] = i
	}
	turn := func(i int) int {
		p := n.Nodes[i].Pos
		j, ok := image[key(lo.X+hi.X-p.X, lo.Y+hi.Y-p.Y)]
		if !ok {
			t.Fatalf("node %d has no image", i)
		}
		return j
	}
	edgeOf := map[[2]int]int{}
	for k, e := range topo.Edges {
		edgeOf[[2]int{e.A, e.B}] = k
	}
	for k, e := range topo.Edges {
		a, b := turn(e.A), turn(e.B)
		j, ok := edgeOf[[2]int{min(a, b), max(a, b)}]
		if !ok {
			t.Fatalf("member %d has no image", k)
		}
		if s.Members[k].Type != s.Members[j].Type {
			t.Errorf("member %d (%s) and its half-turn image %d (%s) are apart", k,
				s.MemberTypes[s.Members[k].Type].Name, j, s.MemberTypes[s.Members[j].Type].Name)
		}
	}
	for i := range n.Nodes {
		if j := turn(i); s.Nodes[i].Type != s.Nodes[j].Type {
			t.Errorf("node %d and its half-turn image %d are apart", i, j)
		}
	}
	seen := make([]int, len(s.Members))
	prev := 0.0
	for ti, ty := range s.MemberTypes {
		for _, i := range ty.Parts {
			seen[i]++
			if s.Members[i].Type != ti {
				t.Fatalf("member %d type %d, listed in %d", i, s.Members[i].Type, ti)
			}
		}
		if ty.CutLengthMM < prev-TypeResolutionMM {
			t.Errorf("%s: nominal cut length %.6f after %.6f", ty.Name, ty.CutLengthMM, prev)
		}
		prev = ty.CutLengthMM
	}
	for i, c := range seen {
		if c != 1 {
			t.Fatalf("member %d in %d types", i, c)
		}
	}
	if s.MemberTypeBound.Count > len(s.MemberTypes) || s.NodeTypeBound.Count > len(s.NodeTypes) {
		t.Errorf("bounds above counts")
	}
	checkMemberTypes(t, "canopy", s.Members, s.MemberTypes, defaultTol)
	checkNodeTypes(t, "canopy", s.Nodes, s.NodeTypes, defaultTol)
	t.Logf("%d members in %d types (bound %d), %d nodes in %d types (bound %d)", len(s.Members), len(s.MemberTypes),
		s.MemberTypeBound.Count, len(s.Nodes), len(s.NodeTypes), s.NodeTypeBound.Count)
}

// TypeResolutionMM is the rounding the type order is decided on.
const TypeResolutionMM = parttype.Resolution

// TestTypePromise: on every sample, and on the canopy with every node
// moved by up to ±2 mm (seeded), which splits types near the tolerance,
// the types keep their promise and no two can be merged, checked by brute
// force from the members' and nodes' own fields.
func TestTypePromise(t *testing.T) {
	nets := typenets.Nets(400, 300, 3, 2)
	for _, nt := range nets {
		for _, tol := range []TypeOptions{defaultTol, {LengthTolMM: 3, AngleTolDeg: 1.5}} {
			o := testOptions(AxisLeastTwist, 50, quadnet.Bays{})
			o.Types = tol
			s, err := Build(nt.Net, topoOf(t, nt.Net), o)
			if err != nil {
				t.Fatal(err)
			}
			name := fmt.Sprintf("%s %v", nt.Name, tol)
			checkMemberTypes(t, name, s.Members, s.MemberTypes, tol)
			checkNodeTypes(t, name, s.Nodes, s.NodeTypes, tol)
			if s.MemberTypeBound.Count > len(s.MemberTypes) || s.NodeTypeBound.Count > len(s.NodeTypes) {
				t.Errorf("%s: bounds above counts", name)
			}
			t.Logf("%s: %d members in %d types (bound %d), %d nodes in %d types (bound %d)", name,
				len(s.Members), len(s.MemberTypes), s.MemberTypeBound.Count, len(s.Nodes), len(s.NodeTypes), s.NodeTypeBound.Count)
		}
	}
}

// maxPairParts caps the parts of one type whose every pair is checked.
const maxPairParts = 300

// sample returns up to maxPairParts of the parts, evenly spread.
func sample(n int) []int {
	step := max(1, (n+maxPairParts-1)/maxPairParts)
	var out []int
	for i := 0; i < n; i += step {
		out = append(out, i)
	}
	return out
}

// checkMemberTypes checks member types from the members' own fields:
// every member is in exactly one type; every pair in a type agrees within
// the tolerances read as the type says; every member lies within half the
// tolerance of the nominal and the deviations are the largest; no two
// types could be merged with all members of one read from the other end
// or not; totals add up.
func checkMemberTypes(t *testing.T, name string, ms []Member, types []MemberType, tol TypeOptions) {
	t.Helper()
	tols := [6]float64{tol.LengthTolMM, tol.AngleTolDeg, tol.AngleTolDeg, tol.AngleTolDeg, tol.AngleTolDeg, tol.AngleTolDeg}
	count := make([]int, len(ms))
	type box struct{ lo, hi [6]float64 }
	boxes := make([][2]box, len(types)) // as read, and every member read from the other end
	for ti, ty := range types {
		if want := fmt.Sprintf("MT-%03d", ti+1); len(types) < 1000 && ty.Name != want {
			t.Errorf("%s: type %d named %s, want %s", name, ti, ty.Name, want)
		}
		if !slices.IsSorted(ty.Parts) || len(ty.Reversed) != len(ty.Parts) {
			t.Fatalf("%s %s: parts not ascending or readings missing", name, ty.Name)
		}
		nominal := [6]float64{ty.CutLengthMM, ty.A.MitreDeg, ty.A.BevelDeg, ty.B.MitreDeg, ty.B.BevelDeg, ty.TwistDeg}
		var devMM, devDeg, total float64
		for f := range 2 {
			for d := range 6 {
				boxes[ti][f].lo[d], boxes[ti][f].hi[d] = math.Inf(1), math.Inf(-1)
			}
		}
		vecs := make([][6]float64, len(ty.Parts))
		for k, i := range ty.Parts {
			count[i]++
			if ms[i].Type != ti {
				t.Fatalf("%s: member %d has type %d, listed in %d", name, i, ms[i].Type, ti)
			}
			total += ms[i].CutLengthMM
			vecs[k] = memberVec(ms[i], ty.Reversed[k])
			for f, v := range [2][6]float64{vecs[k], swapEnds(vecs[k])} {
				for d := range 6 {
					boxes[ti][f].lo[d] = min(boxes[ti][f].lo[d], v[d])
					boxes[ti][f].hi[d] = max(boxes[ti][f].hi[d], v[d])
				}
			}
			for d, x := range vecs[k] {
				dev := math.Abs(x - nominal[d])
				if dev > tols[d]/2+1e-9 {
					t.Fatalf("%s %s: member %d coordinate %d is %.6f from the nominal (tolerance %g)", name, ty.Name, i, d, dev, tols[d])
				}
				if d == 0 {
					devMM = max(devMM, dev)
				} else {
					devDeg = max(devDeg, dev)
				}
			}
		}
		if math.Abs(devMM-ty.MaxDevMM) > 1e-9 || math.Abs(devDeg-ty.MaxDevDeg) > 1e-9 {
			t.Errorf("%s %s: deviations %g mm %g°, type says %g %g", name, ty.Name, devMM, devDeg, ty.MaxDevMM, ty.MaxDevDeg)
		}
		if math.Abs(total-ty.TotalCutLengthMM) > 1e-6 {
			t.Errorf("%s %s: total cut length %g, type says %g", name, ty.Name, total, ty.TotalCutLengthMM)
		}
		rows := make([][]float64, len(vecs))
		for k := range vecs {
			rows[k] = vecs[k][:]
		}
		pairsWithin(t, name+" "+ty.Name, "members", ty.Parts, rows, func(d int) float64 { return tols[d] })
	}
	eachOnce(t, name, "member", count)
	for a := range types {
		for b := a + 1; b < len(types); b++ {
			for f := range 2 {
				fits := true
				for d := range 6 {
					lo := min(boxes[a][0].lo[d], boxes[b][f].lo[d])
					hi := max(boxes[a][0].hi[d], boxes[b][f].hi[d])
					fits = fits && hi-lo <= tols[d]
				}
				if fits {
					t.Fatalf("%s: %s and %s could be one type", name, types[a].Name, types[b].Name)
				}
			}
		}
	}
}

// pairsWithin fails unless every pair of a sample of a type's parts
// (their coordinates vecs) differs by at most tol(d) in each coordinate d.
func pairsWithin(t *testing.T, name, what string, parts []int, vecs [][]float64, tol func(d int) float64) {
	t.Helper()
	idx := sample(len(vecs))
	for a, i := range idx {
		for _, j := range idx[a+1:] {
			for d := range vecs[i] {
				if diff := math.Abs(vecs[i][d] - vecs[j][d]); diff > tol(d) {
					t.Fatalf("%s: %s %d and %d differ by %g in coordinate %d", name, what, parts[i], parts[j], diff, d)
				}
			}
		}
	}
}

// eachOnce fails unless every part is in exactly one type (count[i]
// types).
func eachOnce(t *testing.T, name, what string, count []int) {
	t.Helper()
	for i, c := range count {
		if c != 1 {
			t.Fatalf("%s: %s %d in %d types", name, what, i, c)
		}
	}
}

// nodeVec reads a node's arms in the given order: azimuths from the first
// arm (0 to 360°), then elevations.
func nodeVec(nd Node, order []int) []float64 {
	k := len(order)
	v := make([]float64, 2*k-1)
	for i := 1; i < k; i++ {
		a := nd.Arms[order[i]].AzimuthDeg - nd.Arms[order[0]].AzimuthDeg
		if a < 0 {
			a += 360
		}
		v[i-1] = a
	}
	for i := range k {
		v[k-1+i] = nd.Arms[order[i]].ElevationDeg
	}
	return v
}

// rotated returns order started at its h-th entry.
func rotated(order []int, h int) []int {
	return append(slices.Clone(order[h:]), order[:h]...)
}

// checkNodeTypes checks node types from the nodes' own fields: every node
// in exactly one type; each type's arm order a turn of the node's arms
// sorted by azimuth; every pair in a type agrees within the angle
// tolerance read as the type says; every node within half the tolerance
// of the nominal; no two types with the same members at node could be
// merged with each read from a common arm.
func checkNodeTypes(t *testing.T, name string, nds []Node, types []NodeType, tol TypeOptions) {
	t.Helper()
	A := tol.AngleTolDeg
	count := make([]int, len(nds))
	boxes := make([][][2][]float64, len(types)) // per type, per first arm: lo, hi
	for ti, ty := range types {
		k := ty.MembersAtNode
		if !slices.IsSorted(ty.Parts) || len(ty.ArmOrder) != len(ty.Parts) || len(ty.Arms) != k {
			t.Fatalf("%s %s: parts not ascending or arms missing", name, ty.Name)
		}
		nominal := make([]float64, 0, 2*k-1)
		for _, a := range ty.Arms[1:] {
			nominal = append(nominal, a.AzimuthDeg)
		}
		for _, a := range ty.Arms {
			nominal = append(nominal, a.ElevationDeg)
		}
		boxes[ti] = make([][2][]float64, k)
		for h := range k {
			boxes[ti][h] = [2][]float64{make([]float64, 2*k-1), make([]float64, 2*k-1)}
			for d := range 2*k - 1 {
				boxes[ti][h][0][d], boxes[ti][h][1][d] = math.Inf(1), math.Inf(-1)
			}
		}
		var vecs [][]float64
		dev := 0.0
		for e, i := range ty.Parts {
			count[i]++
			nd := nds[i]
			if nd.Type != ti || len(nd.Arms) != k {
				t.Fatalf("%s: node %d has type %d and %d arms, listed in %s", name, i, nd.Type, len(nd.Arms), ty.Name)
			}
			order := ty.ArmOrder[e]
			// A turn of the arms by azimuth: azimuths from the first arm rise.
			v := nodeVec(nd, order)
			if !slices.IsSorted(v[:k-1]) {
				t.Fatalf("%s %s: node %d arms not in turn order", name, ty.Name, i)
			}
			vecs = append(vecs, v)
			for d, x := range v {
				dd := math.Abs(x - nominal[d])
				if dd > A/2+1e-9 {
					t.Fatalf("%s %s: node %d coordinate %d is %.6f° from the nominal", name, ty.Name, i, d, dd)
				}
				dev = max(dev, dd)
			}
			for h := range k {
				w := nodeVec(nd, rotated(order, h))
				for d, x := range w {
					boxes[ti][h][0][d] = min(boxes[ti][h][0][d], x)
					boxes[ti][h][1][d] = max(boxes[ti][h][1][d], x)
				}
			}
		}
		if math.Abs(dev-ty.MaxDevDeg) > 1e-9 {
			t.Errorf("%s %s: deviation %g°, type says %g", name, ty.Name, dev, ty.MaxDevDeg)
		}
		pairsWithin(t, name+" "+ty.Name, "nodes", ty.Parts, vecs, func(int) float64 { return A })
	}
	eachOnce(t, name, "node", count)
	for a := range types {
		for b := a + 1; b < len(types); b++ {
			k := types[a].MembersAtNode
			if types[b].MembersAtNode != k {
				continue
			}
			for h := range k {
				for g := range k {
					fits := true
					for d := range 2*k - 1 {
						lo := min(boxes[a][h][0][d], boxes[b][g][0][d])
						hi := max(boxes[a][h][1][d], boxes[b][g][1][d])
						fits = fits && hi-lo <= A
					}
					if fits {
						t.Fatalf("%s: %s and %s could be one type", name, types[a].Name, types[b].Name)
					}
				}
			}
		}
	}
}

// TestTypesOrderIndependent: the members and nodes in another order give
// the same types: the same names for the same parts, the same nominal
// values.
func TestTypesOrderIndependent(t *testing.T) {
	n, _ := samples.Make("wave", 600)
	s, err := Build(n, topoOf(t, n), testOptions(AxisLeastTwist, 50, quadnet.Bays{}))
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(5, 6))
	perm := rng.Perm(len(s.Members))
	shuffled := make([]Member, len(perm))
	for i, p := range perm {
		shuffled[i] = s.Members[p]
	}
	mt, _, err := GroupMembers(shuffled, defaultTol)
	if err != nil {
		t.Fatal(err)
	}
	if len(mt) != len(s.MemberTypes) {
		t.Fatalf("%d member types shuffled, %d in order", len(mt), len(s.MemberTypes))
	}
	for i, p := range perm {
		a, b := s.MemberTypes[s.Members[p].Type], mt[shuffled[i].Type]
		if a.Name != b.Name || a.CutLengthMM != b.CutLengthMM || a.A != b.A || a.B != b.B || a.TwistDeg != b.TwistDeg {
			t.Fatalf("member %d: %s %+v in order, %s %+v shuffled", p, a.Name, a, b.Name, b)
		}
	}
	nperm := rng.Perm(len(s.Nodes))
	nds := make([]Node, len(nperm))
	for i, p := range nperm {
		nds[i] = s.Nodes[p]
	}
	nt, _, err := GroupNodes(nds, defaultTol)
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range nperm {
		a, b := s.NodeTypes[s.Nodes[p].Type], nt[nds[i].Type]
		if a.Name != b.Name || !slices.Equal(a.Arms, b.Arms) {
			t.Fatalf("node %d: %s in order, %s shuffled", p, a.Name, b.Name)
		}
	}
}

// BenchmarkMemberTypes100k groups the 100,741 members of a 50,000-panel
// wave (normal axes, hub 50 mm). Target ≤ 1 s.
func BenchmarkMemberTypes100k(b *testing.B) {
	n, _ := samples.Make("wave", 50000)
	topo := quadnet.BuildTopology(n)
	axes, _ := NormalAxes(n)
	ms, err := Members(n, topo, axes, MemberOptions{HubRadiusMM: 50})
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	var types []MemberType
	var bound parttype.Bound
	for b.Loop() {
		if types, bound, err = GroupMembers(ms, defaultTol); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(types)), "types")
	b.ReportMetric(float64(bound.Count), "bound")
}

// BenchmarkNodeTypes50k groups the 50,826 nodes of the same wave.
func BenchmarkNodeTypes50k(b *testing.B) {
	n, _ := samples.Make("wave", 50000)
	topo := quadnet.BuildTopology(n)
	axes, _ := NormalAxes(n)
	ms, err := Members(n, topo, axes, MemberOptions{HubRadiusMM: 50})
	if err != nil {
		b.Fatal(err)
	}
	nl, ml := Labels(n, topo, quadnet.Bays{})
	for k := range ms {
		ms[k].Label = ml[k]
	}
	nds, err := Hubs(n, topo, axes, ms, nl)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	var types []NodeType
	var bound parttype.Bound
	for b.Loop() {
		if types, bound, err = GroupNodes(nds, defaultTol); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(types)), "types")
	b.ReportMetric(float64(bound.Count), "bound")
}
