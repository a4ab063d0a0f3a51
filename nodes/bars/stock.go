package bars

import (
	"math"

	"pqfab/geom"
)

// MaxLengthMM is the largest bar length, kerf or trim a stock may have:
// 1 km, far beyond any bar, so that a typing slip is caught.
const MaxLengthMM = 1e6

// MaxCount is the largest number of bars a stock may list.
const MaxCount = 10_000_000

// Bar stock defaults (mm), for a stock that leaves them out: a saw kerf
// of 4 mm and 15 mm trimmed off each bar end (common practice for timber
// and steel sections cut to length; check the saw and the supplier).
const (
	DefaultKerfMM = 4.0
	DefaultTrimMM = 15.0
)

// Stock is a bar length members are cut from.
type Stock struct {
	Name     string
	LengthMM float64 // bar length as delivered
	KerfMM   float64 // width of one saw cut
	TrimMM   float64 // removed at each bar end, including the cut that removes it
	Price    float64 // per bar; 0 counts as free (offcuts in the yard): where other stocks have prices it is used first
	Count    int     // bars in stock; 0 for no limit
}

// UsableMM is the length between the two end trims: LengthMM − 2·TrimMM.
func (s Stock) UsableMM() float64 { return s.LengthMM - 2*s.TrimMM }

// Validate reports the first bad value as a *geom.FieldError naming the Go
// field: lengths must be finite, not negative and at most MaxLengthMM, the
// bar longer than zero and than its two trims, the price finite and not
// negative, the count from 0 to MaxCount.
func (s Stock) Validate() error {
	lengths := []struct {
		field string
		v     float64
		what  string
	}{
		{"LengthMM", s.LengthMM, "bar length"},
		{"KerfMM", s.KerfMM, "kerf"},
		{"TrimMM", s.TrimMM, "end trim"},
	}
	for _, l := range lengths {
		if math.IsNaN(l.v) || math.IsInf(l.v, 0) || l.v < 0 || l.v > MaxLengthMM {
			return geom.FieldErrorf(l.field, "%s %g mm must be a number from 0 to %g mm", l.what, l.v, float64(MaxLengthMM))
		}
	}
	switch {
	case s.LengthMM == 0:
		return geom.FieldErrorf("LengthMM", "bar length must be more than zero")
	case !(s.UsableMM() > 0):
		return geom.FieldErrorf("TrimMM", "end trim %g mm at each end leaves nothing of a %g mm bar", s.TrimMM, s.LengthMM)
	case math.IsNaN(s.Price) || math.IsInf(s.Price, 0) || s.Price < 0:
		return geom.FieldErrorf("Price", "price %g must be a number, zero or more", s.Price)
	case s.Count < 0 || s.Count > MaxCount:
		return geom.FieldErrorf("Count", "count %d must be from 0 (no limit) to %d", s.Count, MaxCount)
	}
	return nil
}

// Piece is a member blank to cut from a bar: the member's cut length plus
// the allowances its end cuts need (see MemberBlankMM).
type Piece struct {
	Label    string // the member's label, such as C3-M12
	LengthMM float64
}
