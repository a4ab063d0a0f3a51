package nest

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"

	"pqfab/geom"
)

func TestStockValidate(t *testing.T) {
	good := Stock{Name: "float", WidthMM: 6000, HeightMM: 3210, MarginMM: 20, SpacingMM: 6, Rotation: Free, Count: 10, Price: 480}
	if err := good.Validate(); err != nil {
		t.Fatalf("good stock: %v", err)
	}
	glass := good
	glass.Cuts = EdgeToEdge
	if err := glass.Validate(); err != nil {
		t.Fatalf("edge-to-edge stock: %v", err)
	}
	for _, tc := range []struct {
		name  string
		edit  func(*Stock)
		field string
	}{
		{"zero width", func(s *Stock) { s.WidthMM = 0 }, "WidthMM"},
		{"NaN height", func(s *Stock) { s.HeightMM = math.NaN() }, "HeightMM"},
		{"infinite width", func(s *Stock) { s.WidthMM = math.Inf(1) }, "WidthMM"},
		{"absurd width", func(s *Stock) { s.WidthMM = 2e6 }, "WidthMM"},
		{"negative margin", func(s *Stock) { s.MarginMM = -1 }, "MarginMM"},
		{"margin leaves no room", func(s *Stock) { s.MarginMM = 1605 }, "MarginMM"},
		{"NaN spacing", func(s *Stock) { s.SpacingMM = math.NaN() }, "SpacingMM"},
		{"empty rotation", func(s *Stock) { s.Rotation = "" }, "Rotation"},
		{"unknown rotation", func(s *Stock) { s.Rotation = "any" }, "Rotation"},
		{"negative count", func(s *Stock) { s.Count = -1 }, "Count"},
		{"absurd count", func(s *Stock) { s.Count = 2e6 }, "Count"},
		{"infinite price", func(s *Stock) { s.Price = math.Inf(1) }, "Price"},
		{"NaN price", func(s *Stock) { s.Price = math.NaN() }, "Price"},
		{"unknown cut rule", func(s *Stock) { s.Cuts = "guillotine" }, "Cuts"},
	} {
		s := good
		tc.edit(&s)
		err := s.Validate()
		var fe *geom.FieldError
		if !errors.As(err, &fe) {
			t.Errorf("%s: got %v, want a *geom.FieldError", tc.name, err)
			continue
		}
		if got, want := fe.Field, tc.field; got != want {
			t.Errorf("%s: field %q, want %q", tc.name, got, want)
		}
		if fe.Msg == "" || strings.Contains(fe.Error(), "nest") {
			t.Errorf("%s: message %q", tc.name, fe.Error())
		}
	}
}

func TestOptionsValidate(t *testing.T) {
	for _, tc := range []struct {
		steps int
		ok    bool
	}{{0, true}, {1, true}, {DefaultSteps, true}, {-1, false}, {2e9, false}} {
		err := Options{Steps: tc.steps}.Validate()
		var fe *geom.FieldError
		if got := err == nil; got != tc.ok {
			t.Errorf("Steps %d: got %v", tc.steps, err)
		} else if err != nil && (!errors.As(err, &fe) || fe.Field != "Steps") {
			t.Errorf("Steps %d: got %v, want a FieldError on Steps", tc.steps, err)
		}
	}
}

// TestNestErrors: Nest reports bad stocks by field ("Stocks[i].Field") and
// bad parts by number and label, never with a package name.
func TestNestErrors(t *testing.T) {
	sq := rect(100, 100)
	ok := Stock{Name: "s", WidthMM: 1000, HeightMM: 1000, Rotation: Free}
	for _, tc := range []struct {
		name   string
		parts  []Part
		stocks []Stock
		opt    Options
		want   string
	}{
		{"no stock", []Part{{"A", sq}}, nil, Options{}, "Stocks"},
		{"bad second stock", []Part{{"A", sq}}, []Stock{ok, {WidthMM: 100, HeightMM: 0, Rotation: Free}}, Options{}, "Stocks[1].HeightMM"},
		{"bad steps", []Part{{"A", sq}}, []Stock{ok}, Options{Steps: -5}, "Steps"},
		{"two corners", []Part{{"A", sq}, {"B", geom.Polygon{{X: 0, Y: 0}, {X: 1, Y: 1}}}}, []Stock{ok}, Options{}, "part 2 (B)"},
		{"clockwise", []Part{{"C", sq.Reversed()}}, []Stock{ok}, Options{}, "part 1 (C)"},
		{"NaN corner", []Part{{"D", geom.Polygon{{X: 0, Y: 0}, {X: math.NaN(), Y: 0}, {X: 1, Y: 1}}}}, []Stock{ok}, Options{}, "part 1 (D)"},
		{"absurd corner", []Part{{"E", geom.Polygon{{X: 0, Y: 0}, {X: 5e6, Y: 0}, {X: 1, Y: 1}}}}, []Stock{ok}, Options{}, "part 1 (E)"},
		{"bow tie", []Part{{"F", geom.Polygon{{X: 0, Y: 0}, {X: 10, Y: 10}, {X: 10, Y: 0}, {X: 0, Y: 10}, {X: -5, Y: 5}}}}, []Stock{ok}, Options{}, "part 1 (F)"},
	} {
		_, err := NestWith(context.Background(), tc.parts, tc.stocks, tc.opt)
		if err == nil {
			t.Errorf("%s: no error", tc.name)
			continue
		}
		if !strings.HasPrefix(err.Error(), tc.want) || strings.Contains(err.Error(), "nest:") {
			t.Errorf("%s: got %q, want it to start with %q", tc.name, err, tc.want)
		}
	}
}

// TestStopped: a context that has ended stops the search at once; the
// layout is still whole and says so.
func TestStopped(t *testing.T) {
	in := loadBinInstance(t, "A001")
	stocks := []Stock{{Name: "bin", WidthMM: in.widthMM, HeightMM: in.heightMM, Rotation: Free}}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	r, err := NestWith(ctx, in.parts, stocks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, in.parts, stocks, r)
	if !r.Stopped {
		t.Error("Stopped is false after the context ended")
	}
	r, err = Nest(in.parts, stocks)
	if err != nil {
		t.Fatal(err)
	}
	if r.Stopped || r.Steps == 0 {
		t.Errorf("without a deadline: Stopped %v, %d steps", r.Stopped, r.Steps)
	}
}
