package panels

import (
	"math"
	"testing"

	"pqfab/geom"
	"pqfab/quadnet"
)

// squareFlat is a 1000 mm square panel with the given edge bevels.
func squareFlat(bevels ...float64) Flat {
	sq := geom.Polygon{{}, {X: 1000}, {X: 1000, Y: 1000}, {Y: 1000}}
	return Flat{Cut: sq, Outline: sq, AreaM2: 1, BevelDeg: bevels}
}

// TestBevelsInTypePromise: four equal squares whose bevels differ only by
// where they sit (a turn) and by sign. With bevels part of the type, the
// square bevelled +5° on edge 1 and the one bevelled +5° on edge 2 are
// one type (turned by a quarter), the one bevelled −5° another, unless
// panels may be turned over: turned over, a −5° edge is +5° seen from the
// other face, so all three are one type. Without bevels all are one type.
func TestBevelsInTypePromise(t *testing.T) {
	for _, tc := range []struct {
		bevels, mirror bool
		want           int
	}{{false, false, 1}, {true, false, 2}, {true, true, 1}} {
		flats := []Flat{squareFlat(5, 0, 0, 0), squareFlat(0, 5, 0, 0), squareFlat(-5, 0, 0, 0), squareFlat(5, 0, 0, 0)}
		opt := TypeOptions{TolMM: 1, AngleTolDeg: 0.5, Mirror: tc.mirror, Bevels: tc.bevels}
		types, _, err := Group(flats, opt)
		if err != nil {
			t.Fatal(err)
		}
		if len(types) != tc.want {
			t.Errorf("bevels %v mirror %v: %d types, want %d", tc.bevels, tc.mirror, len(types), tc.want)
		}
		for ti := range types {
			ty := &types[ti]
			if tc.bevels && len(ty.BevelDeg) != 4 {
				t.Fatalf("type %s: nominal bevels %v", ty.Name, ty.BevelDeg)
			}
			for n, f := range ty.Panels {
				got := TypeBevels(ty, n, flats[f])
				for e, b := range got {
					if tc.bevels && math.Abs(b-ty.BevelDeg[e]) > opt.AngleTolDeg/2+1e-9 {
						t.Errorf("bevels %v mirror %v: panel %d edge %d bevel %g, type %s says %g", tc.bevels, tc.mirror, f, e, b, ty.Name, ty.BevelDeg[e])
					}
				}
				// Every panel's bevels by the type's edges are its own,
				// the same multiset up to the sign of a turn-over.
				var sumOwn, sumType float64
				for e := range got {
					sumOwn += flats[f].BevelDeg[e]
					sumType += got[e]
				}
				if ty.Mirrored[n] {
					sumType = -sumType
				}
				if math.Abs(sumOwn-sumType) > 1e-12 {
					t.Errorf("panel %d: type bevels %v from own %v", f, got, flats[f].BevelDeg)
				}
			}
		}
	}
}

// TestBevelSignRidge checks what a + bevel means on a real joint, from
// the geometry alone: two 20 mm panels meet at a ridge (each sloping 15°
// down from it, a fold of 30°). The butt joint is the bisector plane of
// the two panels through the ridge line. On each panel, that plane meets
// the inside face (20 mm under the outside face) nearer the panel's
// middle than the outside face's edge: the outside face is the larger,
// which is what BevelSignNote in export calls a + bevel. Flatten gives
// the ridge +15° (fold / 2), and the cut back is 20 mm · tan 15°.
func TestBevelSignRidge(t *testing.T) {
	s, c := math.Sincos(15 * math.Pi / 180)
	// Ridge along y at height 0; panel A on −x, panel B on +x, sloping
	// down at 15°, 1000 mm wide each way.
	n := &quadnet.Net{Source: "ridge"}
	for _, p := range []geom.Vec{{X: -1000 * c, Y: 0, Z: -1000 * s}, {X: 0, Y: 0, Z: 0}, {X: 0, Y: 1000, Z: 0}, {X: -1000 * c, Y: 1000, Z: -1000 * s},
		{X: 1000 * c, Y: 0, Z: -1000 * s}, {X: 1000 * c, Y: 1000, Z: -1000 * s}} {
		n.Nodes = append(n.Nodes, quadnet.Node{Pos: p})
	}
	n.Faces = []quadnet.Face{{ID: "A", Corners: []int{0, 1, 2, 3}}, {ID: "B", Corners: []int{1, 4, 5, 2}}}
	topo := quadnet.BuildTopology(n)
	flats, err := Flatten(n, topo, Material{ThicknessMM: 20, DensityKgM3: 0}, []string{"A", "B"})
	if err != nil {
		t.Fatal(err)
	}
	if got := flats[0].BevelDeg[1]; math.Abs(got-15) > 1e-9 {
		t.Fatalf("ridge edge bevel %g, want +15", got)
	}
	// Independent: panel A's outside normal and the bisector plane.
	nA := geom.Vec{X: -s, Z: c} // up and away from the ridge, on the −x side
	nB := geom.Vec{X: s, Z: c}
	bis := geom.Vec{X: nA.X - nB.X, Y: nA.Y - nB.Y, Z: nA.Z - nB.Z} // normal of the bisector plane through the ridge (origin)
	// The inside face of A: points p with p·nA = −20. Along A's slope
	// direction u (from the ridge into A) at depth 20: p = t·u − 20·nA.
	u := geom.Vec{X: -c, Z: -s}
	// p·bis = 0 → t·(u·bis) = 20·(nA·bis).
	dot := func(a, b geom.Vec) float64 { return a.X*b.X + a.Y*b.Y + a.Z*b.Z }
	tIn := 20 * dot(nA, bis) / dot(u, bis)
	// The outside face's edge is at t = 0; the inside face's edge is tIn
	// into the panel: positive means the outside face is the larger.
	if want := 20 * math.Tan(15*math.Pi/180); math.Abs(tIn-want) > 1e-9 {
		t.Errorf("inside face edge %g mm in from the outside face's, want +%g (outside face larger at a + bevel)", tIn, want)
	}
}

// TestSpecGroupsApart: equal panels in two specification groups make two
// types, one per group.
func TestSpecGroupsApart(t *testing.T) {
	flats := []Flat{squareFlat(0, 0, 0, 0), squareFlat(0, 0, 0, 0), squareFlat(0, 0, 0, 0)}
	flats[1].SpecGroup = 2
	types, bound, err := Group(flats, defaultTypes)
	if err != nil {
		t.Fatal(err)
	}
	if len(types) != 2 || bound.Count != 2 || flats[0].Type == flats[1].Type || flats[0].Type != flats[2].Type {
		t.Errorf("%d types (bound %d), panel types %d %d %d; want 2: groups apart", len(types), bound.Count, flats[0].Type, flats[1].Type, flats[2].Type)
	}
}
