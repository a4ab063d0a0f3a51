package quadnet

import (
	"errors"
	"math"
	"pqfab/geom"
	"reflect"
	"strings"
	"testing"
)

// TestValidateZeroOptions: the zero ValidateOptions, and one with a single
// field set, check a net as the defaults written out do; NoTol and NoBound
// ask for zero settings, which find less. The nets: a good grid; two
// quads whose shared corners were entered twice, 0.005 mm apart (within
// the default merge tolerance, apart at 0); grids with edges of 1.5 mm
// (metres read as millimetres), of 0.8 mm (panels under 1 mm²) and of
// 50 m (beyond the median edge's upper bound).
func TestValidateZeroOptions(t *testing.T) {
	twice := "v 0 0 0\nv 1000 0 0\nv 1000 1000 0\nv 0 1000 0\n" +
		"v 1000.005 0 0\nv 2000 0 0\nv 2000 1000 0\nv 1000 1000.005 0\nf 1 2 3 4\nf 5 6 7 8\n"
	nets := map[string]string{"good": gridOBJ(3, 2, 1500), "entered twice": twice,
		"metres": gridOBJ(3, 3, 1.5), "tiny": gridOBJ(2, 2, 0.8), "huge": gridOBJ(2, 2, 50000)}
	count := func(fd Findings, what string) int {
		k := 0
		for _, e := range fd.Errors {
			if strings.Contains(e.Msg, what) {
				k++
			}
		}
		return k
	}
	for name, src := range nets {
		n := mustRead(t, src)
		defTopo, def := Validate(n, DefaultValidateOptions())
		for _, o := range []ValidateOptions{{}, {CoincidentTolMM: DefaultCoincidentTolMM}, {MaxMedianEdgeMM: DefaultMaxMedianEdgeMM}} {
			if topo, got := Validate(n, o); !reflect.DeepEqual(got, def) || !reflect.DeepEqual(topo, defTopo) {
				t.Errorf("%s, %+v: %v; the defaults: %v", name, o, got.Err(), def.Err())
			}
		}
		for _, tc := range []struct {
			opt      ValidateOptions
			what     string
			def, got map[string]int // per net, the errors with what in their message, with the defaults and with opt
		}{
			{ValidateOptions{CoincidentTolMM: NoTol}, "coincides with", map[string]int{"entered twice": 2}, nil},
			{ValidateOptions{MinMedianEdgeMM: NoBound}, "median edge", map[string]int{"metres": 1, "tiny": 1, "huge": 1}, map[string]int{"huge": 1}},
			{ValidateOptions{MaxMedianEdgeMM: NoBound}, "median edge", map[string]int{"metres": 1, "tiny": 1, "huge": 1}, map[string]int{"metres": 1, "tiny": 1}},
			{ValidateOptions{MinMedianEdgeMM: NoBound}, "degenerate panel", nil, map[string]int{"tiny": 4}},
			{ValidateOptions{MinMedianEdgeMM: NoBound, MinAreaMM2: NoBound}, "degenerate panel", nil, nil},
		} {
			_, got := Validate(n, tc.opt)
			if d, g := count(def, tc.what), count(got, tc.what); d != tc.def[name] || g != tc.got[name] {
				t.Errorf("%s, %+v: %d errors %q, want %d; with the defaults %d, want %d", name, tc.opt, g, tc.what, tc.got[name], d, tc.def[name])
			}
		}
	}
}

func TestValidateOptionsZeroAndBad(t *testing.T) {
	for _, o := range []ValidateOptions{{}, DefaultValidateOptions(), {CoincidentTolMM: NoTol, MinAreaMM2: NoBound, MinMedianEdgeMM: NoBound, MaxMedianEdgeMM: NoBound},
		{MinMedianEdgeMM: 40_000, MaxMedianEdgeMM: NoBound}} {
		if err := o.Validate(); err != nil {
			t.Errorf("%+v: %v", o, err)
		}
	}
	for _, tc := range []struct {
		opt  ValidateOptions
		want string
	}{
		{ValidateOptions{CoincidentTolMM: -0.5}, "CoincidentTolMM: -0.5 must be a finite number, zero or more"},
		{ValidateOptions{CoincidentTolMM: 200}, "CoincidentTolMM: 200 must be between 0 and 100 mm"},
		{ValidateOptions{MinAreaMM2: math.Inf(1)}, "MinAreaMM2: +Inf must be a finite number, zero or more"},
		{ValidateOptions{MinMedianEdgeMM: -3}, "MinMedianEdgeMM: -3 must be a finite number, zero or more"},
		{ValidateOptions{MinMedianEdgeMM: 40_000}, "MaxMedianEdgeMM: 30000 is below MinMedianEdgeMM 40000"},
		{ValidateOptions{MaxMedianEdgeMM: 10}, "MaxMedianEdgeMM: 10 is below MinMedianEdgeMM 30"},
	} {
		var fe *geom.FieldError
		if err := tc.opt.Validate(); !errors.As(err, &fe) || err.Error() != tc.want {
			t.Errorf("%+v: got %v, want %s", tc.opt, err, tc.want)
		}
	}
}
