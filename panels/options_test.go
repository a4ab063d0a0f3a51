package panels

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"pqfab/geom"
	"pqfab/internal/typenets"
	"pqfab/quadnet"
	"pqfab/samples"
)

// TestPlanarizeZeroOptions: the zero PlanarizeOptions, and one with only
// a tolerance, plan the same moves as the defaults written out; NoFairness
// turns fairness off (TestSingleQuadTLS checks it against the unfaired
// least-squares plane) and moves the nodes otherwise.
func TestPlanarizeZeroOptions(t *testing.T) {
	n, _ := samples.Make("wave", 300)
	topo := quadnet.BuildTopology(n)
	run := func(opt PlanarizeOptions) *PlanarizeResult {
		t.Helper()
		res, err := Planarize(n, topo, opt)
		if err != nil {
			t.Fatalf("%+v: %v", opt, err)
		}
		return res
	}
	def := run(DefaultPlanarizeOptions())
	if got := run(PlanarizeOptions{}); !reflect.DeepEqual(got, def) {
		t.Errorf("zero options: %d steps, move %g mm; defaults: %d steps, move %g mm", got.Iterations, got.MaxMoveMM, def.Iterations, def.MaxMoveMM)
	}
	fine := DefaultPlanarizeOptions()
	fine.TolMM = 0.3
	if got, want := run(PlanarizeOptions{TolMM: 0.3}), run(fine); !reflect.DeepEqual(got, want) {
		t.Errorf("TolMM 0.3 alone: %d steps, move %g mm; with the other defaults: %d steps, move %g mm", got.Iterations, got.MaxMoveMM, want.Iterations, want.MaxMoveMM)
	}
	off := run(PlanarizeOptions{Fairness: NoFairness})
	if reflect.DeepEqual(off.Positions, def.Positions) {
		t.Error("NoFairness moved the nodes as the default fairness does")
	}
}

func TestPlanarizeOptionsValidate(t *testing.T) {
	for _, o := range []PlanarizeOptions{{}, DefaultPlanarizeOptions(), {Fairness: NoFairness}, {TolMM: 0.3, MaxIter: 5}} {
		if err := o.Validate(); err != nil {
			t.Errorf("%+v: %v", o, err)
		}
	}
	for _, tc := range []struct {
		opt  PlanarizeOptions
		want string
	}{
		{PlanarizeOptions{TolMM: -1}, "TolMM: -1 must be more than 0 and at most 1000 mm"},
		{PlanarizeOptions{TolMM: math.NaN()}, "TolMM: NaN must be more than 0 and at most 1000 mm"},
		{PlanarizeOptions{MaxMoveMM: 2e5}, "MaxMoveMM: 200000 must be more than 0 and at most 100000 mm"},
		{PlanarizeOptions{Fairness: -2}, "Fairness: -2 must be between 0 and 1e+06"},
		{PlanarizeOptions{Fairness: -0.5}, "Fairness: -0.5 must be between 0 and 1e+06"},
		{PlanarizeOptions{MaxIter: -1}, "MaxIter: -1 must be between 1 and 100000"},
	} {
		var fe *geom.FieldError
		if err := tc.opt.Validate(); !errors.As(err, &fe) || err.Error() != tc.want {
			t.Errorf("%+v: got %v, want %s", tc.opt, err, tc.want)
		}
		n := quadNet(geom.Vec{}, geom.Vec{X: 1000}, geom.Vec{X: 1000, Y: 1000}, geom.Vec{Y: 1000, Z: 10})
		if _, err := Planarize(n, quadnet.BuildTopology(n), tc.opt); err == nil || err.Error() != tc.want {
			t.Errorf("Planarize %+v: got %v, want %s", tc.opt, err, tc.want)
		}
	}
}

// TestGroupZeroOptions: zero tolerances type panels as the defaults
// written out do; NoTypeTol asks for tolerances of zero, so every type's
// panels are equal in every value and there are more types.
func TestGroupZeroOptions(t *testing.T) {
	mat := glass
	mat.EdgeInsetMM = 6
	split := 0
	for _, nt := range typenets.Nets(300, 300, 1, 5) {
		group := func(opt TypeOptions) ([]Type, []Flat) {
			t.Helper()
			flats := flatsOf(t, nt.Net, mat)
			types, _, err := Group(flats, opt)
			if err != nil {
				t.Fatalf("%s %+v: %v", nt.Name, opt, err)
			}
			return types, flats
		}
		def, defFlats := group(defaultTypes)
		got, gotFlats := group(TypeOptions{})
		if !reflect.DeepEqual(got, def) || !reflect.DeepEqual(gotFlats, defFlats) {
			t.Errorf("%s: zero options give %d types, the defaults %d", nt.Name, len(got), len(def))
		}
		mirror := defaultTypes
		mirror.Mirror = true
		want, _ := group(mirror)
		if got, _ := group(TypeOptions{Mirror: true}); !reflect.DeepEqual(got, want) {
			t.Errorf("%s: Mirror alone gives %d types, with the default tolerances %d", nt.Name, len(got), len(want))
		}
		exact, _ := group(TypeOptions{TolMM: NoTypeTol, AngleTolDeg: NoTypeTol})
		if len(exact) < len(def) {
			t.Errorf("%s: tolerances of zero give %d types, fewer than the defaults' %d", nt.Name, len(exact), len(def))
		}
		if len(exact) > len(def) {
			split++
		}
		for _, ty := range exact {
			if ty.MaxDevMM != 0 || ty.MaxDevDeg != 0 {
				t.Errorf("%s: %s deviates %g mm, %g° with tolerances of zero", nt.Name, ty.Name, ty.MaxDevMM, ty.MaxDevDeg)
			}
		}
	}
	if split == 0 {
		t.Error("tolerances of zero split no net's types further than the defaults")
	}
}

func TestTypeOptionsValidate(t *testing.T) {
	for _, o := range []TypeOptions{{}, defaultTypes, {TolMM: NoTypeTol, AngleTolDeg: NoTypeTol}} {
		if err := o.Validate(); err != nil {
			t.Errorf("%+v: %v", o, err)
		}
	}
	for _, tc := range []struct {
		opt  TypeOptions
		want string
	}{
		{TypeOptions{TolMM: -2}, "TolMM: -2 must be between 0 and 1000 mm"},
		{TypeOptions{TolMM: 2000}, "TolMM: 2000 must be between 0 and 1000 mm"},
		{TypeOptions{AngleTolDeg: -0.1}, "AngleTolDeg: -0.1 must be between 0 and 45°"},
		{TypeOptions{AngleTolDeg: math.Inf(1)}, "AngleTolDeg: +Inf must be between 0 and 45°"},
	} {
		var fe *geom.FieldError
		if err := tc.opt.Validate(); !errors.As(err, &fe) || err.Error() != tc.want {
			t.Errorf("%+v: got %v, want %s", tc.opt, err, tc.want)
		}
		if _, _, err := Group(nil, tc.opt); err == nil || err.Error() != tc.want {
			t.Errorf("Group %+v: got %v, want %s", tc.opt, err, tc.want)
		}
	}
}
