package nest

import (
	"fmt"
	"math"

	"pqfab/geom"
)

// Limits beyond which an input is taken as a mistake.
const (
	maxSizeMM = 1e6  // a sheet, margin, spacing or part coordinate
	maxCount  = 1e6  // sheets of a stock, parts, stocks
	maxPrice  = 1e12 // per sheet
)

// Validate reports the first bad field of a stock as a *geom.FieldError
// naming the Go field.
func (s Stock) Validate() error {
	size := func(field string, v float64) error {
		if !(v > 0) || v > maxSizeMM {
			return geom.FieldErrorf(field, "%g mm must be a positive number of at most %g mm", v, maxSizeMM)
		}
		return nil
	}
	if err := size("WidthMM", s.WidthMM); err != nil {
		return err
	}
	if err := size("HeightMM", s.HeightMM); err != nil {
		return err
	}
	if !(s.MarginMM >= 0) || s.MarginMM > maxSizeMM {
		return geom.FieldErrorf("MarginMM", "%g mm must be zero or a positive number", s.MarginMM)
	}
	if 2*s.MarginMM >= math.Min(s.WidthMM, s.HeightMM) {
		return geom.FieldErrorf("MarginMM", "%g mm leaves no room on a %g × %g mm sheet", s.MarginMM, s.WidthMM, s.HeightMM)
	}
	if !(s.SpacingMM >= 0) || s.SpacingMM > maxSizeMM {
		return geom.FieldErrorf("SpacingMM", "%g mm must be zero or a positive number", s.SpacingMM)
	}
	switch s.Rotation {
	case Free, Quarter, Grain:
	default:
		return geom.FieldErrorf("Rotation", "%q must be %q, %q or %q", s.Rotation, Free, Quarter, Grain)
	}
	if s.Count < 0 || s.Count > maxCount {
		return geom.FieldErrorf("Count", "%d must be zero (no limit) or a positive number of at most %g", s.Count, float64(maxCount))
	}
	if !(s.Price >= 0) || s.Price > maxPrice {
		return geom.FieldErrorf("Price", "%g must be zero (unknown) or a positive number of at most %g", s.Price, float64(maxPrice))
	}
	switch s.Cuts {
	case AnyCut, EdgeToEdge:
	default:
		return geom.FieldErrorf("Cuts", "%q must be empty (any cuts) or %q", s.Cuts, EdgeToEdge)
	}
	return nil
}

// withDefaults returns the options with every zero field set to its
// default.
func (o Options) withDefaults() Options {
	if o.Steps == 0 {
		o.Steps = DefaultSteps
	}
	return o
}

// Validate reports a bad option as a *geom.FieldError naming the Go field,
// a zero field standing for its default.
func (o Options) Validate() error {
	if o = o.withDefaults(); o.Steps < 0 || o.Steps > maxSteps {
		return geom.FieldErrorf("Steps", "%d must be zero (the default) or a positive number of at most %g", o.Steps, float64(maxSteps))
	}
	return nil
}

// validate checks the options, every stock (its errors name the field as
// "Stocks[i].Field", i from 0) and every part's outline.
func validate(parts []Part, stocks []Stock, opt Options) error {
	if err := opt.Validate(); err != nil {
		return err
	}
	if len(stocks) == 0 {
		return geom.FieldErrorf("Stocks", "no stock sheets given")
	}
	if len(stocks) > maxCount || len(parts) > maxCount {
		return geom.FieldErrorf("Stocks", "%d stocks and %d parts: at most %g of each", len(stocks), len(parts), float64(maxCount))
	}
	for i, s := range stocks {
		if err := s.Validate(); err != nil {
			fe := err.(*geom.FieldError)
			return &geom.FieldError{Field: fmt.Sprintf("Stocks[%d].%s", i, fe.Field), Msg: fe.Msg}
		}
	}
	for i, p := range parts {
		if err := checkOutline(p.Outline); err != nil {
			return fmt.Errorf("part %d (%s): %v", i+1, p.Label, err)
		}
	}
	return nil
}

// checkOutline reports why an outline cannot be nested: too few corners,
// corners that are not finite numbers or lie absurdly far out, edges that
// cross, or corners that run clockwise.
func checkOutline(p geom.Polygon) error {
	if len(p) < 3 {
		return fmt.Errorf("outline has %d corners, at least 3 needed", len(p))
	}
	for k, v := range p {
		if math.IsNaN(v.X) || math.IsNaN(v.Y) || math.Abs(v.X) > maxSizeMM || math.Abs(v.Y) > maxSizeMM {
			return fmt.Errorf("corner %d (%g, %g) must be finite and within %g mm of the origin", k+1, v.X, v.Y, maxSizeMM)
		}
	}
	if !p.CCW() {
		return fmt.Errorf("outline must run counter-clockwise and enclose an area")
	}
	for k := range p {
		if p[k] == p[(k+1)%len(p)] {
			return fmt.Errorf("corners %d and %d coincide", k+1, (k+1)%len(p)+1)
		}
	}
	if p.SelfIntersects() {
		return fmt.Errorf("outline crosses itself")
	}
	return nil
}
