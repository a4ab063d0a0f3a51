package pipeline

import (
	"errors"
	"math"
	"strings"
	"testing"

	"pqfab/geom"
	"pqfab/panels"
)

// TestSetOutlines: a type's set-out outline is its nominal cut outline
// grown back by the edge inset. Checked against the closed form for a
// rectangle (each edge line moved out by d: a rectangle d larger on every
// side, corners at ±d; elementary geometry); an outline that cannot be
// grown (a U whose edge between its reflex corners is swallowed) gives an
// error naming the type and wrapping panels.ErrInsetTooLarge.
func TestSetOutlines(t *testing.T) {
	const tolMM = 1e-9 // float rounding on millimetre values
	rect := geom.Polygon{{X: 0, Y: 0}, {X: 1200, Y: 0}, {X: 1200, Y: 800}, {X: 0, Y: 800}}
	for _, tc := range []struct {
		insetMM float64
		want    geom.Polygon
	}{
		{0, rect},
		{6, geom.Polygon{{X: -6, Y: -6}, {X: 1206, Y: -6}, {X: 1206, Y: 806}, {X: -6, Y: 806}}},
	} {
		got, err := setOutlines([]panels.Type{{Name: "PT-001", Outline: rect}}, tc.insetMM)
		if err != nil {
			t.Fatalf("inset %g: %v", tc.insetMM, err)
		}
		if len(got) != 1 || len(got[0]) != len(tc.want) {
			t.Fatalf("inset %g: got %v, want %v", tc.insetMM, got, tc.want)
		}
		for i, w := range tc.want {
			if p := got[0][i]; math.Abs(p.X-w.X) > tolMM || math.Abs(p.Y-w.Y) > tolMM {
				t.Errorf("inset %g: corner %d at %v, want %v", tc.insetMM, i+1, p, w)
			}
		}
	}
	if got, err := setOutlines(nil, 6); got != nil || err != nil {
		t.Errorf("no types: got %v, %v; want nil, nil", got, err)
	}

	// A dart (a quad with a reflex corner at (30, 40)) grows by any inset:
	// every edge of a quad lengthens (see setOutlines).
	dart := geom.Polygon{{X: 0, Y: 0}, {X: 100, Y: 40}, {X: 0, Y: 80}, {X: 30, Y: 40}}
	if _, err := setOutlines([]panels.Type{{Name: "PT-001", Outline: dart}}, 500); err != nil {
		t.Errorf("dart grown by 500 mm: %v", err)
	}
	// A U (eight corners, counter-clockwise): the 100 mm edge between its
	// two reflex corners shortens by twice the inset and vanishes at 50 mm.
	u := geom.Polygon{{X: 0, Y: 0}, {X: 300, Y: 0}, {X: 300, Y: 200}, {X: 200, Y: 200},
		{X: 200, Y: 100}, {X: 100, Y: 100}, {X: 100, Y: 200}, {X: 0, Y: 200}}
	if _, err := setOutlines([]panels.Type{{Name: "PT-001", Outline: u}}, 49); err != nil {
		t.Errorf("U grown by 49 mm: %v", err)
	}
	_, err := setOutlines([]panels.Type{{Name: "PT-001", Outline: rect}, {Name: "PT-002", Outline: u}}, 51)
	if !errors.Is(err, panels.ErrInsetTooLarge) || !strings.Contains(err.Error(), "panel type PT-002") {
		t.Errorf("U grown by 51 mm: got %v, want an inset error naming panel type PT-002", err)
	}
}
