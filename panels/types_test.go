package panels

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"pqfab/geom"
	"pqfab/internal/typenets"
	"pqfab/parttype"
	"pqfab/quadnet"
	"pqfab/samples"
)

var defaultTypes = TypeOptions{TolMM: DefaultTypeTolMM, AngleTolDeg: DefaultTypeAngleTolDeg}

// panelVec reads a cut outline from its corner start, forward or (when
// mirrored) backward: the k edges (corner i to i+1), the distances
// between the non-adjacent corners (0,2), (0,3), …, (1,3), … (i < j, j ≥
// i+2, not (0, k−1)), and the k inside angles, in degrees, from the
// corners' own coordinates.
func panelVec(cut geom.Polygon, start int, mirrored bool) []float64 {
	k := len(cut)
	c := func(i int) geom.Vec2 {
		if mirrored {
			return cut[((start-i)%k+k)%k]
		}
		return cut[(start+i)%k]
	}
	var v []float64
	for i := range k {
		v = append(v, c(i+1).Sub(c(i)).Norm())
	}
	for i := range k {
		for j := i + 2; j < k; j++ {
			if i == 0 && j == k-1 {
				continue
			}
			v = append(v, c(j).Sub(c(i)).Norm())
		}
	}
	for i := range k {
		a, b := c(i-1+k), c(i+1)
		u, w := a.Sub(c(i)), b.Sub(c(i))
		// Inside angle of a counter-clockwise outline; read backwards the
		// outline runs clockwise, and the inside is on the other side.
		ang := math.Atan2(w.Cross(u), w.Dot(u)) * 180 / math.Pi
		if mirrored {
			ang = -ang
		}
		if ang < 0 {
			ang += 360
		}
		v = append(v, ang)
	}
	return v
}

// TestDomePanelTypes: on a dome of revolution meshed by meridians and
// parallels, a turn about the axis maps every panel of a band between two
// rings onto every other (isosceles trapezoids with the ring chords
// 2ρ cos(lat) sin(π/S) as parallel edges). Neighbouring bands differ in
// their lower edges by more than twice the tolerance (checked: 7 mm at
// the base, where cos(lat) changes least), so no two bands can share a
// type and there is
// exactly one type per band; mirror images change nothing (the
// trapezoids are symmetric).
func TestDomePanelTypes(t *testing.T) {
	for _, panels := range []int{300, 1000, 4000} {
		n, _ := samples.Make("dome", panels)
		segs := len(n.Nodes) - len(n.Faces)
		rings := len(n.Faces) / segs
		flats := flatsOf(t, n, glass)
		for j := 1; j < rings; j++ {
			a, b := flats[(j-1)*segs].EdgeMM[0], flats[j*segs].EdgeMM[0]
			if math.Abs(a-b) < 2*DefaultTypeTolMM {
				t.Fatalf("bands %d and %d: lower edges %g and %g too close for the derivation", j-1, j, a, b)
			}
		}
		for _, mirror := range []bool{false, true} {
			opt := defaultTypes
			opt.Mirror = mirror
			types, bound, err := Group(flats, opt)
			if err != nil {
				t.Fatal(err)
			}
			if len(types) != rings || bound.Count != rings {
				t.Errorf("dome %d panels, mirror %v: %d types (bound %d), want %d", len(flats), mirror, len(types), bound.Count, rings)
			}
			for _, ty := range types {
				band := ty.Panels[0] / segs
				for _, f := range ty.Panels {
					if f/segs != band {
						t.Fatalf("%s holds bands %d and %d", ty.Name, band, f/segs)
					}
				}
			}
			checkPanelTypes(t, fmt.Sprintf("dome %d", panels), flats, types, opt)
		}
	}
}

// TestPanelTypePromise: on every sample and on the canopy with every node
// moved by up to ±2 mm (seeded; its panels are then no longer congruent
// in pairs and split near the tolerance), with and without mirrored
// panels, the types keep their promise and no two can be merged, checked
// by brute force from the cut outlines.
func TestPanelTypePromise(t *testing.T) {
	nets := typenets.Nets(500, 500, 2, 3)
	mat := glass
	mat.EdgeInsetMM = 6
	for _, nt := range nets {
		flats := flatsOf(t, nt.Net, mat)
		for _, opt := range []TypeOptions{defaultTypes, {TolMM: 3, AngleTolDeg: 0.2, Mirror: true}, {TolMM: 0.5, AngleTolDeg: 2}} {
			types, bound, err := Group(flats, opt)
			if err != nil {
				t.Fatal(err)
			}
			name := fmt.Sprintf("%s %+v", nt.Name, opt)
			if bound.Count > len(types) {
				t.Errorf("%s: bound %d above %d types", name, bound.Count, len(types))
			}
			checkPanelTypes(t, name, flats, types, opt)
			t.Logf("%s: %d panels in %d types (bound %d: %s)", name, len(flats), len(types), bound.Count, bound.Quantity)
		}
	}
}

// checkPanelTypes checks panel types from the cut outlines: every panel in
// exactly one type; mirrored only where allowed; each panel read as the
// type says within half the tolerances of the nominal, the deviations the
// largest; every pair within the tolerances; the nominal outline honours
// every edge and the diagonals from corner 1, and its misfits are as
// stated; no two types could be merged with all panels of one read from
// a common corner of the type (and turned over, where allowed).
func checkPanelTypes(t *testing.T, name string, flats []Flat, types []Type, opt TypeOptions) {
	t.Helper()
	count := make([]int, len(flats))
	type box struct{ lo, hi []float64 }
	boxes := make([][]box, len(types)) // per type, per reading of the type's corners
	tolOf := func(k int) []float64 {
		nd := k * (k - 3) / 2
		tol := make([]float64, 2*k+nd)
		for d := range tol {
			tol[d] = opt.TolMM
			if d >= k+nd {
				tol[d] = opt.AngleTolDeg
			}
		}
		return tol
	}
	for ti, ty := range types {
		k := len(ty.EdgeMM)
		nd := k * (k - 3) / 2
		tol := tolOf(k)
		if !slices.IsSorted(ty.Panels) || len(ty.Start) != len(ty.Panels) || len(ty.Mirrored) != len(ty.Panels) || len(ty.Diagonals) != nd {
			t.Fatalf("%s %s: malformed type", name, ty.Name)
		}
		if want := fmt.Sprintf("PT-%03d", ti+1); len(types) < 1000 && ty.Name != want {
			t.Errorf("%s: type %d named %s", name, ti, ty.Name)
		}
		nominal := slices.Concat(ty.EdgeMM, nil, ty.AngleDeg)
		nominal = slices.Insert(nominal, k, make([]float64, nd)...)
		for j, d := range ty.Diagonals {
			nominal[k+j] = d.MM
		}
		readings := k
		if opt.Mirror {
			readings = 2 * k
		}
		boxes[ti] = make([]box, readings)
		for r := range boxes[ti] {
			boxes[ti][r] = box{slices.Repeat([]float64{math.Inf(1)}, len(tol)), slices.Repeat([]float64{math.Inf(-1)}, len(tol))}
		}
		var vecs [][]float64
		var devMM, devDeg, area, weight float64
		// The drawn outline's own numbers, against which OutlineDev is
		// measured.
		drawn := panelVec(ty.Outline, 0, false)
		var odevMM, odevDeg float64
		for e, f := range ty.Panels {
			count[f]++
			if flats[f].Type != ti {
				t.Fatalf("%s: panel %d has type %d, listed in %s", name, f, flats[f].Type, ty.Name)
			}
			if ty.Mirrored[e] && !opt.Mirror {
				t.Fatalf("%s %s: panel %d mirrored", name, ty.Name, f)
			}
			if ty.Corner(e, 1) != (ty.Start[e]+1)%k && !ty.Mirrored[e] {
				t.Fatalf("%s %s: Corner does not follow Start", name, ty.Name)
			}
			cut := flats[f].Cut
			v := panelVec(cut, ty.Start[e], ty.Mirrored[e])
			vecs = append(vecs, v)
			for d, x := range v {
				if d < k+nd {
					odevMM = max(odevMM, math.Abs(x-drawn[d]))
				} else {
					odevDeg = max(odevDeg, math.Abs(x-drawn[d]))
				}
			}
			area += flats[f].AreaM2
			weight += flats[f].WeightKg
			for d, x := range v {
				dev := math.Abs(x - nominal[d])
				if dev > tol[d]/2+1e-9 {
					t.Fatalf("%s %s: panel %d coordinate %d is %.6f from the nominal (tolerance %g)", name, ty.Name, f, d, dev, tol[d])
				}
				if d < k+nd {
					devMM = max(devMM, dev)
				} else {
					devDeg = max(devDeg, dev)
				}
			}
			// Every reading of the type's corners: start s, turned over or not.
			for r := range readings {
				s, mir := r%k, r >= k
				var w []float64
				if ty.Mirrored[e] {
					w = panelVec(cut, ty.Corner(e, s), !mir)
				} else {
					w = panelVec(cut, ty.Corner(e, s), mir)
				}
				for d, x := range w {
					boxes[ti][r].lo[d] = min(boxes[ti][r].lo[d], x)
					boxes[ti][r].hi[d] = max(boxes[ti][r].hi[d], x)
				}
			}
		}
		if math.Abs(devMM-ty.MaxDevMM) > 1e-9 || math.Abs(devDeg-ty.MaxDevDeg) > 1e-9 {
			t.Errorf("%s %s: deviations %g mm %g°, type says %g %g", name, ty.Name, devMM, devDeg, ty.MaxDevMM, ty.MaxDevDeg)
		}
		if math.Abs(odevMM-ty.OutlineDevMM) > 1e-9 || math.Abs(odevDeg-ty.OutlineDevDeg) > 1e-9 {
			t.Errorf("%s %s: deviations from the outline %g mm %g°, type says %g %g", name, ty.Name, odevMM, odevDeg, ty.OutlineDevMM, ty.OutlineDevDeg)
		}
		if ty.OutlineDevMM > ty.MaxDevMM+ty.OutlineMisfitMM+1e-9 || ty.OutlineDevDeg > ty.MaxDevDeg+ty.OutlineMisfitDeg+1e-9 {
			t.Errorf("%s %s: deviations from the outline %g mm %g° beyond the nominal's plus the misfit", name, ty.Name, ty.OutlineDevMM, ty.OutlineDevDeg)
		}
		if math.Abs(area-ty.TotalAreaM2) > 1e-9 || math.Abs(weight-ty.TotalWeightKg) > 1e-6 {
			t.Errorf("%s %s: totals %g m² %g kg, type says %g %g", name, ty.Name, area, weight, ty.TotalAreaM2, ty.TotalWeightKg)
		}
		idx := sample(len(vecs))
		for a, i := range idx {
			for _, j := range idx[a+1:] {
				for d := range vecs[i] {
					if diff := math.Abs(vecs[i][d] - vecs[j][d]); diff > tol[d] {
						t.Fatalf("%s %s: panels %d and %d differ by %g in coordinate %d", name, ty.Name, ty.Panels[i], ty.Panels[j], diff, d)
					}
				}
			}
		}
		// The nominal outline: a least-squares fit of its edges and
		// diagonals to the nominal ones, so the gradient of the sum of
		// squared differences vanishes at every free corner coordinate
		// (first-order condition of a minimum); corner 1 at the origin,
		// corner 2 on the x axis.
		o := ty.Outline
		misMM, misDeg := 0.0, 0.0
		grad := make([]geom.Vec2, k)
		fit := func(i, j int, want float64) {
			d := o[j].Sub(o[i])
			r := d.Norm() - want
			misMM = max(misMM, math.Abs(r))
			g := d.Scale(r / d.Norm())
			grad[j], grad[i] = grad[j].Add(g), grad[i].Sub(g)
		}
		for i := range k {
			fit(i, (i+1)%k, ty.EdgeMM[i])
		}
		ov := panelVec(o, 0, false)
		for _, dg := range ty.Diagonals {
			fit(dg.I, dg.J, dg.MM)
		}
		if o[0] != (geom.Vec2{}) || o[1].Y != 0 {
			t.Errorf("%s %s: outline starts %v %v", name, ty.Name, o[0], o[1])
		}
		for c := 1; c < k; c++ {
			if math.Abs(grad[c].X) > 1e-6 || (c > 1 && math.Abs(grad[c].Y) > 1e-6) {
				t.Errorf("%s %s: outline corner %d not at a least-squares fit (gradient %v)", name, ty.Name, c, grad[c])
			}
		}
		for i := range k {
			misDeg = max(misDeg, math.Abs(ov[k+nd+i]-ty.AngleDeg[i]))
		}
		if math.Abs(misMM-ty.OutlineMisfitMM) > 1e-9 || math.Abs(misDeg-ty.OutlineMisfitDeg) > 1e-9 {
			t.Errorf("%s %s: outline misfits %g mm %g°, type says %g %g", name, ty.Name, misMM, misDeg, ty.OutlineMisfitMM, ty.OutlineMisfitDeg)
		}
		if math.Abs(o.Area()/1e6-ty.AreaM2) > 1e-12 || !o.CCW() {
			t.Errorf("%s %s: outline area %g, type says %g", name, ty.Name, o.Area()/1e6, ty.AreaM2)
		}
	}
	for f, c := range count {
		if c != 1 {
			t.Fatalf("%s: panel %d in %d types", name, f, c)
		}
	}
	for a := range types {
		for b := a + 1; b < len(types); b++ {
			if len(types[a].EdgeMM) != len(types[b].EdgeMM) {
				continue
			}
			tol := tolOf(len(types[a].EdgeMM))
			for r := range boxes[b] {
				fits := true
				for d := range tol {
					lo := min(boxes[a][0].lo[d], boxes[b][r].lo[d])
					hi := max(boxes[a][0].hi[d], boxes[b][r].hi[d])
					fits = fits && hi-lo <= tol[d]
				}
				if fits {
					t.Fatalf("%s: %s and %s could be one type", name, types[a].Name, types[b].Name)
				}
			}
		}
	}
}

// maxPairPanels caps the panels of one type whose every pair is checked.
const maxPairPanels = 300

// sample returns up to maxPairPanels of n, evenly spread.
func sample(n int) []int {
	step := max(1, (n+maxPairPanels-1)/maxPairPanels)
	var out []int
	for i := 0; i < n; i += step {
		out = append(out, i)
	}
	return out
}

// TestPanelTypesOrderIndependent: the same net with its panels in another
// order, each starting at another corner, gives the same types: the same
// names for the same panels and the same nominal panels (to 1e-9 mm and
// degrees: the outlines are laid out from other corners).
func TestPanelTypesOrderIndependent(t *testing.T) {
	n, _ := samples.Make("wave", 600)
	rng := rand.New(rand.NewPCG(3, 4))
	m := n.Clone()
	perm := rng.Perm(len(n.Faces))
	shift := make([]int, len(n.Faces))
	for i, p := range perm {
		c := n.Faces[p].Corners
		shift[i] = rng.IntN(len(c))
		m.Faces[i].Corners = append(slices.Clone(c[shift[i]:]), c[:shift[i]]...)
	}
	for _, opt := range []TypeOptions{defaultTypes, {TolMM: 2, AngleTolDeg: 0.5, Mirror: true}} {
		a, _, err := Group(flatsOf(t, n, glass), opt)
		if err != nil {
			t.Fatal(err)
		}
		fm := flatsOf(t, m, glass)
		b, _, err := Group(fm, opt)
		if err != nil {
			t.Fatal(err)
		}
		if len(a) != len(b) {
			t.Fatalf("%d types in order, %d shuffled", len(a), len(b))
		}
		typeOf := make([]int, len(n.Faces))
		for ti, ty := range a {
			for _, f := range ty.Panels {
				typeOf[f] = ti
			}
		}
		for i, p := range perm {
			ta, tb := a[typeOf[p]], b[fm[i].Type]
			if ta.Name != tb.Name {
				t.Fatalf("panel %d: %s in order, %s shuffled", p, ta.Name, tb.Name)
			}
			for j := range ta.EdgeMM {
				if math.Abs(ta.EdgeMM[j]-tb.EdgeMM[j]) > 1e-9 || math.Abs(ta.AngleDeg[j]-tb.AngleDeg[j]) > 1e-9 {
					t.Fatalf("%s: nominal differs: %v %v", ta.Name, ta.EdgeMM, tb.EdgeMM)
				}
			}
		}
	}
}

func benchPanelTypes(b *testing.B, panels int) {
	n, _ := samples.Make("wave", panels)
	topo := quadnet.BuildTopology(n)
	flats, err := Flatten(n, topo, glass, make([]string, len(n.Faces)))
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	var types []Type
	var bound parttype.Bound
	for b.Loop() {
		if types, bound, err = Group(flats, defaultTypes); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(types)), "types")
	b.ReportMetric(float64(bound.Count), "bound")
}

// Panel types of the wave (quads 0.3–2 % off flat, laid on their planes):
// near-linear in the panel count.
func BenchmarkPanelTypes10k(b *testing.B)  { benchPanelTypes(b, 10000) }
func BenchmarkPanelTypes100k(b *testing.B) { benchPanelTypes(b, 100000) }
