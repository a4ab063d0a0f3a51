package export

import (
	"fmt"
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

// dxfText makes a string safe for a DXF TEXT value (AC1015): control
// characters become spaces (a newline would break the file's structure),
// characters outside ASCII, the backslash and the caret are written as
// \U+XXXX escapes (characters beyond U+FFFF, which the escape cannot
// hold, become '?'), and where the string holds "%%" (a DXF control code)
// every '%' is written as "%%%", the code for a literal percent sign.
func dxfText(s string) string {
	var b strings.Builder
	for _, c := range s {
		switch {
		case c == utf8.RuneError:
			b.WriteByte('?')
		case c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0):
			b.WriteByte(' ')
		case c == '\\' || c == '^':
			fmt.Fprintf(&b, `\U+%04X`, c)
		case c < 0x7f:
			b.WriteRune(c)
		case c <= 0xffff:
			fmt.Fprintf(&b, `\U+%04X`, c)
		default:
			b.WriteByte('?')
		}
	}
	out := b.String()
	if strings.Contains(out, "%%") {
		out = strings.ReplaceAll(out, "%", "%%%")
	}
	return out
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
