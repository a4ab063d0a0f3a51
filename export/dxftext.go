package export

import (
	"strings"
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

// wrapWords splits s into lines of at most width characters at spaces (a
// longer word stands alone on its line).
func wrapWords(s string, width int) []string {
	return wrapFields(s, func(line string) bool { return utf8.RuneCountInString(line) <= width })
}

// wrapFields joins the space-separated words of s into lines, starting a
// new line where adding the next word would make fits false (a word
// that does not fit alone still stands on its own line).
func wrapFields(s string, fits func(line string) bool) []string {
	var lines []string
	line := ""
	for _, w := range strings.Fields(s) {
		if line != "" && !fits(line+" "+w) {
			lines = append(lines, line)
			line = ""
		}
		if line != "" {
			line += " "
		}
		line += w
	}
	if line != "" {
		lines = append(lines, line)
	}
	return lines
}
