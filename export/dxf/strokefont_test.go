package dxf

import (
	"fmt"
	"math"
	"testing"
)

// TestStrokeGlyphs: every glyph lies in its cell, no two characters share
// their strokes (a slashed zero is not the letter O), and every character
// of pqfab's labels and types has a glyph.
func TestStrokeGlyphs(t *testing.T) {
	seen := map[string]rune{}
	for c, g := range strokeGlyphs {
		for _, st := range g {
			if len(st) < 2 {
				t.Errorf("%q: a stroke of %d points", c, len(st))
			}
			for _, p := range st {
				if p[0] < 0 || p[0] > strokeCellW || p[1] < 0 || p[1] > strokeCellH {
					t.Errorf("%q: point %v outside the cell", c, p)
				}
			}
		}
		key := fmt.Sprint(g)
		if d, dup := seen[key]; dup && c != ' ' {
			t.Errorf("%q and %q have the same strokes", c, d)
		}
		seen[key] = c
	}
	for _, c := range "ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789- " {
		if _, ok := strokeGlyphs[c]; !ok {
			t.Errorf("%q has no glyph", c)
		}
	}
}

// TestStrokeText: a label is centred on its point, as wide as
// strokeTextWidth and as high as its cap height; lower case is engraved
// as capitals and an unknown character as a question mark.
func TestStrokeText(t *testing.T) {
	const x, y, h = 100.0, 50.0, 12.0
	for _, s := range []string{"C3-P05", "PT-017 inside face up"} {
		lox, loy, hix, hiy := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
		for _, st := range strokeText(s, x, y, h) {
			for _, p := range st {
				lox, loy, hix, hiy = math.Min(lox, p[0]), math.Min(loy, p[1]), math.Max(hix, p[0]), math.Max(hiy, p[1])
			}
		}
		w := strokeTextWidth(s, h)
		if math.Abs(lox-(x-w/2)) > 1e-9 || math.Abs(hix-(x+w/2)) > 1e-9 || math.Abs(loy-(y-h/2)) > 1e-9 || math.Abs(hiy-(y+h/2)) > 1e-9 {
			t.Errorf("%q: strokes span %g..%g × %g..%g, want %g wide and %g high about (%g, %g)", s, lox, hix, loy, hiy, w, h, x, y)
		}
	}
	if got, want := fmt.Sprint(strokeText("ab", 0, 0, 6)), fmt.Sprint(strokeText("AB", 0, 0, 6)); got != want {
		t.Error("lower case is not engraved as capitals")
	}
	if got, want := fmt.Sprint(strokeText("é", 0, 0, 6)), fmt.Sprint(strokeText("?", 0, 0, 6)); got != want {
		t.Error("an unknown character is not a question mark")
	}
}
