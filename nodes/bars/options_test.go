package bars

import (
	"errors"
	"reflect"
	"testing"

	"pqfab/geom"
)

// TestSolveZeroOptions: the zero Options plan as DefaultEffort written out
// does.
func TestSolveZeroOptions(t *testing.T) {
	pieces := lengths(1234.5, 2210, 987.25, 3333, 1500.75, 2750.5, 640.125, 1999, 3010.5, 455.5, 2222.25, 1717, 2893.75, 808.5, 1313.25)
	stocks := []Stock{{Name: "6m", LengthMM: 6000, KerfMM: 4, TrimMM: 10, Price: 30}, {Name: "4.5m", LengthMM: 4500, KerfMM: 4, TrimMM: 10, Price: 24}}
	want, err := Solve(pieces, stocks, Options{Effort: DefaultEffort})
	if err != nil {
		t.Fatal(err)
	}
	got, err := Solve(pieces, stocks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("zero options: %d bars, cost %g; DefaultEffort: %d bars, cost %g", len(got.Bars), got.Cost, len(want.Bars), want.Cost)
	}
}

func TestOptionsValidate(t *testing.T) {
	for _, o := range []Options{{}, {Effort: 1}, {Effort: DefaultEffort}} {
		if err := o.Validate(); err != nil {
			t.Errorf("%+v: %v", o, err)
		}
	}
	want := "Effort: -1 must be zero (the default) or a positive number"
	var fe *geom.FieldError
	if err := (Options{Effort: -1}).Validate(); !errors.As(err, &fe) || err.Error() != want {
		t.Errorf("got %v, want %s", err, want)
	}
	if _, err := Solve(lengths(100), []Stock{{Name: "S", LengthMM: 1000}}, Options{Effort: -1}); err == nil || err.Error() != want {
		t.Errorf("Solve: got %v, want %s", err, want)
	}
}
