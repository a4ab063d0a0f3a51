package panels

import (
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/internal/testnets"
	"pqfab/quadnet"
	"pqfab/samples"
)

func flatsOf(t *testing.T, n *quadnet.Net, mat Material) []Flat {
	t.Helper()
	topo, fd := quadnet.Validate(n, quadnet.DefaultValidateOptions())
	if fd.Err() != nil {
		t.Fatal(fd.Err())
	}
	labels := make([]string, len(n.Faces))
	flats, err := Flatten(n, topo, mat, labels)
	if err != nil {
		t.Fatal(err)
	}
	return flats
}

var glass = Material{Name: "glass", ThicknessMM: 10, DensityKgM3: 2500}

// TestFlattenIsometry: laying a planar panel flat keeps every edge and
// diagonal length to 1e-9 mm.
func TestFlattenIsometry(t *testing.T) {
	for _, name := range []string{"canopy", "dome"} {
		n, _ := samples.Make(name, 500)
		for f, fl := range flatsOf(t, n, glass) {
			c := n.Faces[f].Corners
			k := len(c)
			for i := 0; i < k; i++ {
				for j := i + 1; j < k; j++ {
					d3 := r3.Norm(r3.Sub(n.Nodes[c[j]].Pos, n.Nodes[c[i]].Pos))
					d2 := fl.Outline[j].Sub(fl.Outline[i]).Norm()
					if math.Abs(d3-d2) > 1e-9 {
						t.Fatalf("%s panel %d corners %d-%d: 3D %.12f, flat %.12f", name, f, i, j, d3, d2)
					}
				}
			}
			// Back to 3D through the frame lands on the corners.
			for i, p := range fl.Outline {
				q := fl.Frame.ToWorld(geom.Vec{X: p.X, Y: p.Y})
				if r3.Norm(r3.Sub(q, n.Nodes[c[i]].Pos)) > 1e-9 {
					t.Fatalf("%s panel %d corner %d: frame round trip off", name, f, i)
				}
			}
		}
	}
}

// TestRhombicDodecahedronFaces: corner angles 109.47° and 70.53°
// (arccos(∓1/3)), diagonal ratio √2, dihedral 120° so fold 60° and bevel
// 30° (handbook values for the rhombic dodecahedron).
func TestRhombicDodecahedronFaces(t *testing.T) {
	n, err := quadnet.ReadOBJ(strings.NewReader(testnets.RhombicDodecahedron(500).OBJ()), "rd.obj", quadnet.MM)
	if err != nil {
		t.Fatal(err)
	}
	flats := flatsOf(t, n, glass)
	obtuse, acute := math.Acos(-1.0/3)*180/math.Pi, math.Acos(1.0/3)*180/math.Pi
	for f, fl := range flats {
		for _, a := range fl.AngleDeg {
			if math.Abs(a-obtuse) > 1e-9 && math.Abs(a-acute) > 1e-9 {
				t.Errorf("panel %d: corner angle %.10f°", f, a)
			}
		}
		d0, d1 := fl.Diagonals[0].MM, fl.Diagonals[1].MM
		if r := math.Max(d0, d1) / math.Min(d0, d1); math.Abs(r-math.Sqrt2) > 1e-12 {
			t.Errorf("panel %d: diagonal ratio %.15f", f, r)
		}
		for i := range fl.FoldDeg {
			if math.Abs(fl.FoldDeg[i]-60) > 1e-9 || math.Abs(fl.BevelDeg[i]-30) > 1e-9 {
				t.Errorf("panel %d edge %d: fold %g bevel %g", f, i, fl.FoldDeg[i], fl.BevelDeg[i])
			}
		}
	}
	types, _, err := Group(flats, TypeOptions{TolMM: 0.01, AngleTolDeg: 0.01})
	if err != nil || len(types) != 1 || len(types[0].Panels) != 12 {
		t.Errorf("all 12 faces are one type: %v %v", types, err)
	}
}

func TestInset(t *testing.T) {
	sq := geom.Polygon{{X: 0, Y: 0}, {X: 1000, Y: 0}, {X: 1000, Y: 800}, {X: 0, Y: 800}}
	in, err := Inset(sq, 10)
	if err != nil {
		t.Fatal(err)
	}
	want := geom.Polygon{{X: 10, Y: 10}, {X: 990, Y: 10}, {X: 990, Y: 790}, {X: 10, Y: 790}}
	for i := range want {
		if in[i].Sub(want[i]).Norm() > 1e-9 {
			t.Errorf("corner %d: %v want %v", i, in[i], want[i])
		}
	}
	// A right triangle with legs a, b: the inset triangle is similar, with
	// inradius r − d (r = (a + b − c) / 2 for a right triangle).
	tri := geom.Polygon{{X: 0, Y: 0}, {X: 3000, Y: 0}, {X: 0, Y: 4000}}
	in, err = Inset(tri, 100)
	if err != nil {
		t.Fatal(err)
	}
	r := (3000.0 + 4000 - 5000) / 2
	if got, want := in.Area(), tri.Area()*math.Pow((r-100)/r, 2); math.Abs(got-want) > 1e-6 {
		t.Errorf("triangle inset area %g want %g", got, want)
	}
	if _, err := Inset(sq, 500); err == nil {
		t.Error("inset past the middle: want an error")
	}
}

// TestPanelTypesMirror: the 12 × 8 canopy is the translational surface
// z = f(x) + g(y) with parabolic arches, so panel (i, j) is the
// parallelogram on a = (dx, 0, Δf_i) and b = (0, dy, Δg_j). With the
// canopy's rises (1800 mm over 18 m, 1500 mm over 12 m) Δf_i = 600 −
// 50(2i+1): six magnitudes 550 … 50 mm, each with both signs; Δg_j = 750 −
// 93.75(2j+1): four magnitudes, both signs. Two such parallelograms are
// congruent by a turn exactly when |Δf| and |Δg| agree and the sign of
// Δf·Δg (the corner angle a→b is acute or obtuse) agrees; with mirror
// images allowed the sign no longer matters. The nearest distinct shapes
// differ by more than 4 mm in an edge or a diagonal (far above the 0.5 mm
// tolerance), so there are exactly 6 × 4 × 2 = 48 types, and 24 with
// mirroring.
func TestPanelTypesMirror(t *testing.T) {
	n, _ := samples.Make("canopy", 96)
	flats := flatsOf(t, n, glass)
	plain, _, _ := Group(slices.Clone(flats), TypeOptions{TolMM: 0.5, AngleTolDeg: 0.5})
	mirrored, _, _ := Group(flats, TypeOptions{TolMM: 0.5, AngleTolDeg: 0.5, Mirror: true})
	if got, want := len(plain), 6*4*2; got != want {
		t.Errorf("plain: %d types, want %d", got, want)
	}
	if got, want := len(mirrored), 6*4; got != want {
		t.Errorf("mirrored: %d types, want %d", got, want)
	}
	count := 0
	for _, ty := range mirrored {
		count += len(ty.Panels)
	}
	if count != len(flats) {
		t.Errorf("types hold %d of %d panels", count, len(flats))
	}
	t.Logf("canopy 96 panels: %d types, %d with mirroring", len(plain), len(mirrored))
}
