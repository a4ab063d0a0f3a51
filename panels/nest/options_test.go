package nest

import (
	"context"
	"reflect"
	"testing"
)

// TestNestZeroOptions: the zero Options lay the parts out as DefaultSteps
// written out does, and Nest as NestWith with no options; on these parts
// a small budget of steps lays them out otherwise, so the budget binds.
func TestNestZeroOptions(t *testing.T) {
	parts := triangleParts(3, 2)
	stocks := []Stock{{Name: "small", WidthMM: 1000, HeightMM: 800, MarginMM: 10, SpacingMM: 4, Rotation: Free}}
	want, err := NestWith(context.Background(), parts, stocks, Options{Steps: DefaultSteps})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, stocks, want)
	got, err := NestWith(context.Background(), parts, stocks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("zero options: %d sheets in %d steps; DefaultSteps: %d sheets in %d steps", len(got.Sheets), got.Steps, len(want.Sheets), want.Steps)
	}
	if got, err = Nest(parts, stocks); err != nil || !reflect.DeepEqual(got, want) {
		t.Errorf("Nest: %v, or a layout other than NestWith's", err)
	}
	if got, err = NestWith(context.Background(), parts, stocks, Options{Steps: 200}); err != nil || reflect.DeepEqual(got.Sheets, want.Sheets) {
		t.Errorf("200 steps: %v, or the layout of DefaultSteps", err)
	}
}
