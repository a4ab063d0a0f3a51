package nodes

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"pqfab/geom"
	"pqfab/internal/typenets"
	"pqfab/samples"
)

// TestBuildZeroOptions: the zero Options, and one with only a hub, build
// the same structure as the defaults written out (least-twist axes, the
// default section and type tolerances); NoTypeTol asks for type
// tolerances of zero, so every type's parts are equal and there are more
// types.
func TestBuildZeroOptions(t *testing.T) {
	n, _ := samples.Make("wave", 300)
	topo := topoOf(t, n)
	build := func(opt Options) *Structure {
		t.Helper()
		s, err := Build(n, topo, opt)
		if err != nil {
			t.Fatalf("%+v: %v", opt, err)
		}
		return s
	}
	def := build(DefaultOptions())
	if got := build(Options{}); !reflect.DeepEqual(got, def) {
		t.Errorf("zero options: %d member types, %d node types, twist %g°; defaults: %d, %d, %g°",
			len(got.MemberTypes), len(got.NodeTypes), MaxAbsTwist(got.Members), len(def.MemberTypes), len(def.NodeTypes), MaxAbsTwist(def.Members))
	}
	hub := DefaultOptions()
	hub.HubRadiusMM = 60
	if got, want := build(Options{HubRadiusMM: 60}), build(hub); !reflect.DeepEqual(got, want) {
		t.Errorf("hub alone: %d member types; with the other defaults: %d", len(got.MemberTypes), len(want.MemberTypes))
	}
	normal := DefaultOptions()
	normal.Axis = AxisNormal
	if got := build(normal); reflect.DeepEqual(got.Members, def.Members) {
		t.Error("normal axes give the members of the default least-twist axes")
	}
	exact := build(Options{Types: TypeOptions{LengthTolMM: NoTypeTol, AngleTolDeg: NoTypeTol}})
	if len(exact.MemberTypes) <= len(def.MemberTypes) || len(exact.NodeTypes) < len(def.NodeTypes) {
		t.Errorf("tolerances of zero: %d member types, %d node types; defaults: %d, %d",
			len(exact.MemberTypes), len(exact.NodeTypes), len(def.MemberTypes), len(def.NodeTypes))
	}
	for _, mt := range exact.MemberTypes {
		if mt.MaxDevMM != 0 || mt.MaxDevDeg != 0 {
			t.Errorf("%s deviates %g mm, %g° with tolerances of zero", mt.Name, mt.MaxDevMM, mt.MaxDevDeg)
		}
	}
	for _, nt := range exact.NodeTypes {
		if nt.MaxDevDeg != 0 {
			t.Errorf("%s deviates %g° with tolerances of zero", nt.Name, nt.MaxDevDeg)
		}
	}
}

// TestGroupZeroTolerances: GroupMembers and GroupNodes read zero
// tolerances as the defaults.
func TestGroupZeroTolerances(t *testing.T) {
	for _, nt := range typenets.Nets(200, 200, 1, 9) {
		s, err := Build(nt.Net, topoOf(t, nt.Net), DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		for _, tol := range []TypeOptions{{}, {LengthTolMM: DefaultTypeLengthTolMM}, {AngleTolDeg: DefaultTypeAngleTolDeg}} {
			mt, mb, err := GroupMembers(s.Members, tol)
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(mt, s.MemberTypes) || !reflect.DeepEqual(mb, s.MemberTypeBound) {
				t.Errorf("%s %+v: %d member types, the defaults %d", nt.Name, tol, len(mt), len(s.MemberTypes))
			}
			ndt, nb, err := GroupNodes(s.Nodes, tol)
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(ndt, s.NodeTypes) || !reflect.DeepEqual(nb, s.NodeTypeBound) {
				t.Errorf("%s %+v: %d node types, the defaults %d", nt.Name, tol, len(ndt), len(s.NodeTypes))
			}
		}
	}
}

func TestOptionsValidate(t *testing.T) {
	for _, o := range []Options{{}, DefaultOptions(), {Types: TypeOptions{LengthTolMM: NoTypeTol, AngleTolDeg: NoTypeTol}}, {Section: Section{WallMM: 4}}} {
		if err := o.Validate(); err != nil {
			t.Errorf("%+v: %v", o, err)
		}
	}
	for _, tc := range []struct {
		opt  Options
		want string
	}{
		{Options{Axis: "diagonal"}, `Axis: "diagonal": want normal or least-twist`},
		{Options{AxisStiffness: -1}, "AxisStiffness: -1 must be zero or more"},
		{Options{HubRadiusMM: -1}, "HubRadiusMM: -1 must be between 0 and 10000 mm"},
		{Options{Section: Section{WidthMM: -60}}, "Section.WidthMM: -60 must be more than 0 and at most 10000 mm"},
		{Options{Section: Section{DepthMM: math.NaN()}}, "Section.DepthMM: NaN must be more than 0 and at most 10000 mm"},
		{Options{Section: Section{WallMM: 30}}, "Section.WallMM: 30 must be more than 0 and less than half the section's width and depth (60 x 120 mm)"},
		{Options{Types: TypeOptions{LengthTolMM: -2}}, "Types.LengthTolMM: -2 must be between 0 and 1000 mm"},
		{Options{Types: TypeOptions{AngleTolDeg: 50}}, "Types.AngleTolDeg: 50 must be between 0 and 45°"},
	} {
		var fe *geom.FieldError
		if err := tc.opt.Validate(); !errors.As(err, &fe) || err.Error() != tc.want {
			t.Errorf("%+v: got %v, want %s", tc.opt, err, tc.want)
		}
	}
	if err := (MemberOptions{HubRadiusMM: 2e4}).Validate(); err == nil || err.Error() != "HubRadiusMM: 20000 must be between 0 and 10000 mm" {
		t.Errorf("member options: got %v", err)
	}
	if _, _, err := GroupMembers(nil, TypeOptions{LengthTolMM: -0.5}); err == nil || err.Error() != "Types.LengthTolMM: -0.5 must be between 0 and 1000 mm" {
		t.Errorf("GroupMembers: got %v", err)
	}
}
