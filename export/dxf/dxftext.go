package dxf

import (
	"unicode/utf8"
)

// DXFCharWidth is the width of one character of DXF TEXT as a fraction of
// its height, an upper estimate for the common CAD fonts (capital letters
// and digits of sans-serif fonts run 0.6 to 0.85 of the cap height); the
// plan's label spacing and its read-back test both use it.
const DXFCharWidth = 0.9

// dxfTextWidth estimates the width of DXF TEXT of height h.
func dxfTextWidth(s string, h float64) float64 {
	return DXFCharWidth * h * float64(utf8.RuneCountInString(s))
}
