package dxf

import (
	"strings"
	"unicode"
)

// A single-stroke font of our own design for engraving: every glyph is a
// few open strokes on a grid 4 units wide and 6 high (the cap height),
// so an engraving tool follows each stroke once. Letters are capitals
// (lower case is engraved as capitals), digits have a slashed zero so it
// is not read as the letter O. A character outside the set is engraved as
// a question mark.
const (
	strokeCellW   = 4.0 // glyph width, grid units
	strokeCellH   = 6.0 // cap height, grid units
	strokeAdvance = 6.0 // from one glyph's left side to the next's
)

type stroke [][2]float64

// strokeGlyphs are the glyphs' strokes in grid units, origin at the
// glyph's lower-left corner.
var strokeGlyphs = map[rune][]stroke{
	' ': nil,
	'0': {{{1, 0}, {3, 0}, {4, 1}, {4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}}, {{0.5, 1}, {3.5, 5}}},
	'1': {{{1, 5}, {2, 6}, {2, 0}}, {{1, 0}, {3, 0}}},
	'2': {{{0, 5}, {1, 6}, {3, 6}, {4, 5}, {4, 4}, {0, 0}, {4, 0}}},
	'3': {{{0, 5}, {1, 6}, {3, 6}, {4, 5}, {4, 4}, {3, 3}, {4, 2}, {4, 1}, {3, 0}, {1, 0}, {0, 1}}, {{1, 3}, {3, 3}}},
	'4': {{{3, 0}, {3, 6}, {0, 2}, {4, 2}}},
	'5': {{{4, 6}, {0, 6}, {0, 3}, {3, 3}, {4, 2}, {4, 1}, {3, 0}, {0, 0}}},
	'6': {{{4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}, {3, 0}, {4, 1}, {4, 2}, {3, 3}, {0, 3}}},
	'7': {{{0, 6}, {4, 6}, {1, 0}}},
	'8': {{{1, 3}, {0, 4}, {0, 5}, {1, 6}, {3, 6}, {4, 5}, {4, 4}, {3, 3}, {1, 3}, {0, 2}, {0, 1}, {1, 0}, {3, 0}, {4, 1}, {4, 2}, {3, 3}}},
	'9': {{{4, 3}, {1, 3}, {0, 4}, {0, 5}, {1, 6}, {3, 6}, {4, 5}, {4, 1}, {3, 0}, {1, 0}, {0, 1}}},
	'A': {{{0, 0}, {0, 4}, {2, 6}, {4, 4}, {4, 0}}, {{0, 3}, {4, 3}}},
	'B': {{{0, 0}, {0, 6}, {3, 6}, {4, 5}, {4, 4}, {3, 3}, {0, 3}}, {{3, 3}, {4, 2}, {4, 1}, {3, 0}, {0, 0}}},
	'C': {{{4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}, {3, 0}, {4, 1}}},
	'D': {{{0, 0}, {0, 6}, {2, 6}, {4, 4}, {4, 2}, {2, 0}, {0, 0}}},
	'E': {{{4, 6}, {0, 6}, {0, 0}, {4, 0}}, {{0, 3}, {3, 3}}},
	'F': {{{4, 6}, {0, 6}, {0, 0}}, {{0, 3}, {3, 3}}},
	'G': {{{4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}, {3, 0}, {4, 1}, {4, 3}, {2, 3}}},
	'H': {{{0, 0}, {0, 6}}, {{4, 0}, {4, 6}}, {{0, 3}, {4, 3}}},
	'I': {{{1, 6}, {3, 6}}, {{2, 6}, {2, 0}}, {{1, 0}, {3, 0}}},
	'J': {{{4, 6}, {4, 1}, {3, 0}, {1, 0}, {0, 1}}},
	'K': {{{0, 0}, {0, 6}}, {{4, 6}, {0, 2}}, {{1, 3}, {4, 0}}},
	'L': {{{0, 6}, {0, 0}, {4, 0}}},
	'M': {{{0, 0}, {0, 6}, {2, 3}, {4, 6}, {4, 0}}},
	'N': {{{0, 0}, {0, 6}, {4, 0}, {4, 6}}},
	'O': {{{1, 0}, {3, 0}, {4, 1}, {4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}}},
	'P': {{{0, 0}, {0, 6}, {3, 6}, {4, 5}, {4, 4}, {3, 3}, {0, 3}}},
	'Q': {{{1, 0}, {3, 0}, {4, 1}, {4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 1}, {1, 0}}, {{2.5, 1.5}, {4, 0}}},
	'R': {{{0, 0}, {0, 6}, {3, 6}, {4, 5}, {4, 4}, {3, 3}, {0, 3}}, {{2, 3}, {4, 0}}},
	'S': {{{4, 5}, {3, 6}, {1, 6}, {0, 5}, {0, 4}, {1, 3}, {3, 3}, {4, 2}, {4, 1}, {3, 0}, {1, 0}, {0, 1}}},
	'T': {{{0, 6}, {4, 6}}, {{2, 6}, {2, 0}}},
	'U': {{{0, 6}, {0, 1}, {1, 0}, {3, 0}, {4, 1}, {4, 6}}},
	'V': {{{0, 6}, {2, 0}, {4, 6}}},
	'W': {{{0, 6}, {1, 0}, {2, 4}, {3, 0}, {4, 6}}},
	'X': {{{0, 0}, {4, 6}}, {{0, 6}, {4, 0}}},
	'Y': {{{0, 6}, {2, 3}, {4, 6}}, {{2, 3}, {2, 0}}},
	'Z': {{{0, 6}, {4, 6}, {0, 0}, {4, 0}}},
	'-': {{{1, 3}, {3, 3}}},
	'+': {{{2, 1}, {2, 5}}, {{0, 3}, {4, 3}}},
	'.': {{{2, 0}, {2, 0.6}}},
	'/': {{{0, 0}, {4, 6}}},
	'?': {{{0, 5}, {1, 6}, {3, 6}, {4, 5}, {4, 4}, {2, 3}, {2, 2}}, {{2, 0}, {2, 0.6}}},
}

// strokeText returns the strokes of s engraved with cap height h,
// centred on (x, y) (mm), each stroke a polyline to follow once.
func strokeText(s string, x, y, h float64) [][][2]float64 {
	s = strings.ToUpper(s)
	u := h / strokeCellH
	x0, y0 := x-strokeTextWidth(s, h)/2, y-h/2
	var out [][][2]float64
	i := 0
	for _, c := range s {
		g, ok := strokeGlyphs[unicode.ToUpper(c)]
		if !ok {
			g = strokeGlyphs['?']
		}
		for _, st := range g {
			pl := make([][2]float64, len(st))
			for j, p := range st {
				pl[j] = [2]float64{x0 + (float64(i)*strokeAdvance+p[0])*u, y0 + p[1]*u}
			}
			out = append(out, pl)
		}
		i++
	}
	return out
}

// strokeTextWidth is the width of s engraved with cap height h (mm).
func strokeTextWidth(s string, h float64) float64 {
	n := len([]rune(s))
	if n == 0 {
		return 0
	}
	return (float64(n)*strokeAdvance - (strokeAdvance - strokeCellW)) * h / strokeCellH
}
