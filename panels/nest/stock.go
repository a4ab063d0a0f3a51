package nest

import (
	"math"

	"pqfab/geom"
)

// Largest stock values accepted: beyond them a value is a mistake.
const (
	MaxSheetMM    = 1e6 // 1 km
	MaxStockCount = 1e6
	MaxPrice      = 1e9
)

// Validate checks a stock size's ranges and returns a *geom.FieldError
// naming the first bad field.
func (s Stock) Validate() error {
	switch {
	case !(s.WidthMM > 0) || s.WidthMM > MaxSheetMM:
		return geom.FieldErrorf("WidthMM", "%g must be more than 0 and at most %g mm", s.WidthMM, MaxSheetMM)
	case !(s.HeightMM > 0) || s.HeightMM > MaxSheetMM:
		return geom.FieldErrorf("HeightMM", "%g must be more than 0 and at most %g mm", s.HeightMM, MaxSheetMM)
	case !(s.MarginMM >= 0) || 2*s.MarginMM >= math.Min(s.WidthMM, s.HeightMM):
		return geom.FieldErrorf("MarginMM", "%g mm leaves no room on a %g × %g mm sheet", s.MarginMM, s.WidthMM, s.HeightMM)
	case !(s.SpacingMM >= 0) || s.SpacingMM > MaxSheetMM:
		return geom.FieldErrorf("SpacingMM", "%g must be between 0 and %g mm", s.SpacingMM, MaxSheetMM)
	case s.Count < 0 || s.Count > MaxStockCount:
		return geom.FieldErrorf("Count", "%d must be between 0 (no limit) and %d", s.Count, int(MaxStockCount))
	case !(s.Price >= 0) || s.Price > MaxPrice:
		return geom.FieldErrorf("Price", "%g must be between 0 and %g", s.Price, MaxPrice)
	}
	switch s.Rotation {
	case Free, Quarter, Grain:
	default:
		return geom.FieldErrorf("Rotation", "%q: want free, quarter or grain", s.Rotation)
	}
	return nil
}
