package job

import (
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/quadnet"
)

// TestJobZeros: a job's 0 (and an empty axis) means what it meant before
// the libraries read a zero field as its default: no fairness, type and
// merge tolerances of zero, normal axes, no hub; left out, every key
// gives the libraries' defaults.
func TestJobZeros(t *testing.T) {
	const base = "[net]\nfile = \"n.obj\"\n[[stock]]\nwidth_mm = 6000\nheight_mm = 3210\n"
	j, err := Parse([]byte(base), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	if got, want := j.PlanarizeOptions(), panels.DefaultPlanarizeOptions(); !reflect.DeepEqual(got, want) {
		t.Errorf("default planarize options %+v, want %+v", got, want)
	}
	if got, want := j.NodeOptions(), nodes.DefaultOptions(); !reflect.DeepEqual(got, want) {
		t.Errorf("default node options %+v, want %+v", got, want)
	}
	if got, want := j.ValidateOptions(), quadnet.DefaultValidateOptions(); got != want {
		t.Errorf("default net checks %+v, want %+v", got, want)
	}
	if got, want := j.PanelTypeOptions(), (panels.TypeOptions{TolMM: panels.DefaultTypeTolMM, AngleTolDeg: panels.DefaultTypeAngleTolDeg}); got != want {
		t.Errorf("default panel types %+v, want %+v", got, want)
	}

	j, err = Parse([]byte("[net]\nfile = \"n.obj\"\nmerge_tol_mm = 0\n[[stock]]\nwidth_mm = 6000\nheight_mm = 3210\n"+
		"[flatness]\nfairness = 0\n[nodes]\naxis = \"\"\nhub_radius_mm = 0\n[types]\nlength_tol_mm = 0\nangle_tol_deg = 0\npanel_tol_mm = 0\n"), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	if got := j.PlanarizeOptions().Fairness; got != panels.NoFairness {
		t.Errorf("fairness = 0: %g, want panels.NoFairness", got)
	}
	no := j.NodeOptions()
	if no.Axis != nodes.AxisNormal || no.HubRadiusMM != 0 || no.Types != (nodes.TypeOptions{LengthTolMM: nodes.NoTypeTol, AngleTolDeg: nodes.NoTypeTol}) {
		t.Errorf("zeros in [nodes] and [types]: %+v", no)
	}
	// A hub radius of 0 reaches nodes as 0, its default: that must stay
	// no hub, or 0 needs a constant of its own.
	if nodes.DefaultHubRadiusMM != 0 {
		t.Errorf("nodes.DefaultHubRadiusMM is %g: hub_radius_mm = 0 no longer means no hub", nodes.DefaultHubRadiusMM)
	}
	if got := j.PanelTypeOptions(); got.TolMM != panels.NoTypeTol || got.AngleTolDeg != panels.NoTypeTol {
		t.Errorf("panel type tolerances of 0: %+v", got)
	}
	if got := j.ValidateOptions().CoincidentTolMM; got != quadnet.NoTol {
		t.Errorf("merge_tol_mm = 0: %g, want quadnet.NoTol", got)
	}
}

// TestExplicit: the Explicit functions leave options without zeros as
// they are, turn zeros into the libraries' constants, and report a zero
// the library has no setting for, naming the Go field.
func TestExplicit(t *testing.T) {
	po := panels.DefaultPlanarizeOptions()
	if got, err := ExplicitPlanarize(po); err != nil || !reflect.DeepEqual(got, po) {
		t.Errorf("defaults: %+v, %v", got, err)
	}
	po.Fairness = 0
	if got, err := ExplicitPlanarize(po); err != nil || got.Fairness != panels.NoFairness {
		t.Errorf("fairness 0: %+v, %v", got, err)
	}
	no := nodes.DefaultOptions()
	if got, err := ExplicitNodes(no); err != nil || !reflect.DeepEqual(got, no) {
		t.Errorf("defaults: %+v, %v", got, err)
	}
	vo := quadnet.DefaultValidateOptions()
	if got, err := ExplicitValidate(vo); err != nil || got != vo {
		t.Errorf("defaults: %+v, %v", got, err)
	}
	if got, err := ExplicitValidate(quadnet.ValidateOptions{}); err != nil || got != (quadnet.ValidateOptions{CoincidentTolMM: quadnet.NoTol, MinAreaMM2: quadnet.NoBound, MinMedianEdgeMM: quadnet.NoBound, MaxMedianEdgeMM: quadnet.NoBound}) {
		t.Errorf("zeros: %+v, %v", got, err)
	}
	if got, err := ExplicitPanelTypes(panels.TypeOptions{Mirror: true}); err != nil || got != (panels.TypeOptions{TolMM: panels.NoTypeTol, AngleTolDeg: panels.NoTypeTol, Mirror: true}) {
		t.Errorf("zeros: %+v, %v", got, err)
	}
	for _, tc := range []struct {
		err   error
		field string
	}{
		{second(ExplicitPlanarize(panels.PlanarizeOptions{MaxMoveMM: 1, MaxIter: 1})), "TolMM"},
		{second(ExplicitPlanarize(panels.PlanarizeOptions{TolMM: 1, MaxIter: 1})), "MaxMoveMM"},
		{second(ExplicitPlanarize(panels.PlanarizeOptions{TolMM: 1, MaxMoveMM: 1})), "MaxIter"},
		{second(ExplicitNodes(nodes.Options{Section: nodes.Section{DepthMM: 100}})), "Section.WidthMM"},
		{second(ExplicitNodes(nodes.Options{Section: nodes.Section{WidthMM: 100}})), "Section.DepthMM"},
		{second(ExplicitNodes(nodes.Options{Axis: "diagonal", Section: nodes.Section{WidthMM: 60, DepthMM: 100}})), "Axis"},
		{second(ExplicitPanelTypes(panels.TypeOptions{TolMM: -3})), "TolMM"},
		{second(ExplicitValidate(quadnet.ValidateOptions{CoincidentTolMM: 500})), "CoincidentTolMM"},
	} {
		var fe *geom.FieldError
		if !errors.As(tc.err, &fe) || fe.Field != tc.field {
			t.Errorf("got %v, want a FieldError on %s", tc.err, tc.field)
		}
	}
}

func second[T any](_ T, err error) error { return err }

// TestExplicitWording: a value the Explicit functions refuse (0 where the
// library has no zero setting, the library's constant for 0 given as a
// number) is worded as the library words a value out of its range.
func TestExplicitWording(t *testing.T) {
	po, no, vo := panels.DefaultPlanarizeOptions(), nodes.DefaultOptions(), quadnet.DefaultValidateOptions()
	pt := panels.TypeOptions{TolMM: 1, AngleTolDeg: 1}
	for _, tc := range []struct {
		name      string
		given     float64 // refused by the Explicit function
		explicit  func(v float64) error
		libraryOf func(v float64) error // the library's Validate of a value out of range
	}{
		{"TolMM", 0, func(v float64) error { o := po; o.TolMM = v; return second(ExplicitPlanarize(o)) },
			func(v float64) error { o := po; o.TolMM = v; return o.Validate() }},
		{"MaxMoveMM", 0, func(v float64) error { o := po; o.MaxMoveMM = v; return second(ExplicitPlanarize(o)) },
			func(v float64) error { o := po; o.MaxMoveMM = v; return o.Validate() }},
		{"Fairness", panels.NoFairness, func(v float64) error { o := po; o.Fairness = v; return second(ExplicitPlanarize(o)) },
			func(v float64) error { o := po; o.Fairness = v; return o.Validate() }},
		{"MaxIter", 0, func(v float64) error { o := po; o.MaxIter = int(v); return second(ExplicitPlanarize(o)) },
			func(float64) error { o := po; o.MaxIter = -7; return o.Validate() }},
		{"Section.WidthMM", 0, func(v float64) error { o := no; o.Section.WidthMM = v; return second(ExplicitNodes(o)) },
			func(v float64) error { o := no; o.Section.WidthMM = v; return o.Validate() }},
		{"Section.DepthMM", 0, func(v float64) error { o := no; o.Section.DepthMM = v; return second(ExplicitNodes(o)) },
			func(v float64) error { o := no; o.Section.DepthMM = v; return o.Validate() }},
		{"Types.LengthTolMM", nodes.NoTypeTol, func(v float64) error { o := no; o.Types.LengthTolMM = v; return second(ExplicitNodes(o)) },
			func(v float64) error { o := no; o.Types.LengthTolMM = v; return o.Validate() }},
		{"Types.AngleTolDeg", nodes.NoTypeTol, func(v float64) error { o := no; o.Types.AngleTolDeg = v; return second(ExplicitNodes(o)) },
			func(v float64) error { o := no; o.Types.AngleTolDeg = v; return o.Validate() }},
		{"TolMM", panels.NoTypeTol, func(v float64) error { o := pt; o.TolMM = v; return second(ExplicitPanelTypes(o)) },
			func(v float64) error { o := pt; o.TolMM = v; return o.Validate() }},
		{"AngleTolDeg", panels.NoTypeTol, func(v float64) error { o := pt; o.AngleTolDeg = v; return second(ExplicitPanelTypes(o)) },
			func(v float64) error { o := pt; o.AngleTolDeg = v; return o.Validate() }},
		{"CoincidentTolMM", quadnet.NoTol, func(v float64) error { o := vo; o.CoincidentTolMM = v; return second(ExplicitValidate(o)) },
			func(v float64) error { o := vo; o.CoincidentTolMM = v; return o.Validate() }},
		{"MinAreaMM2", quadnet.NoBound, func(v float64) error { o := vo; o.MinAreaMM2 = v; return second(ExplicitValidate(o)) },
			func(v float64) error { o := vo; o.MinAreaMM2 = v; return o.Validate() }},
		{"MinMedianEdgeMM", quadnet.NoBound, func(v float64) error { o := vo; o.MinMedianEdgeMM = v; return second(ExplicitValidate(o)) },
			func(v float64) error { o := vo; o.MinMedianEdgeMM = v; return o.Validate() }},
		{"MaxMedianEdgeMM", quadnet.NoBound, func(v float64) error { o := vo; o.MaxMedianEdgeMM = v; return second(ExplicitValidate(o)) },
			func(v float64) error { o := vo; o.MaxMedianEdgeMM = v; return o.Validate() }},
	} {
		var got, lib *geom.FieldError
		if !errors.As(tc.explicit(tc.given), &got) || got.Field != tc.name {
			t.Errorf("%s = %g: got %v, want a FieldError on %s", tc.name, tc.given, tc.explicit(tc.given), tc.name)
			continue
		}
		const bad = -7.0
		if !errors.As(tc.libraryOf(bad), &lib) || lib.Field != tc.name {
			t.Errorf("%s = %g: the library says %v", tc.name, bad, tc.libraryOf(bad))
			continue
		}
		if g, l := strings.TrimPrefix(got.Msg, fmt.Sprint(tc.given)), strings.TrimPrefix(lib.Msg, fmt.Sprint(bad)); g != l {
			t.Errorf("%s = %g: %q, the library words it %q", tc.name, tc.given, got.Msg, lib.Msg)
		}
	}
}
