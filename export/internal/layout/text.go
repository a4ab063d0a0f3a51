package layout

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"
)

// maxWarningLines is the most warnings a drawing's title block lists;
// report.json and the schedule list them all.
const maxWarningLines = 5

// WarningLines returns the lines a title block shows for the warnings.
func WarningLines(ws []string) []string {
	var out []string
	for i, w := range ws {
		if i == maxWarningLines {
			out = append(out, fmt.Sprintf("WARNING: … and %d more (see report.json)", len(ws)-i))
			break
		}
		out = append(out, "WARNING: "+w)
	}
	return out
}

// Fixed formats x with d decimals, never as a negative zero.
func Fixed(x float64, d int) string { return string(AppendFixed(nil, x, d)) }

// AppendFixed appends x with d decimals, writing values that round to zero
// as an unsigned zero so that the sign of a tiny residue never changes the
// output bytes.
func AppendFixed(buf []byte, x float64, d int) []byte {
	n := len(buf)
	buf = strconv.AppendFloat(buf, x, 'f', d, 64)
	if buf[n] == '-' {
		zero := true
		for _, c := range buf[n+1:] {
			if c != '0' && c != '.' {
				zero = false
				break
			}
		}
		if zero {
			buf = append(buf[:n], buf[n+1:]...)
		}
	}
	return buf
}

// SortedBy returns 0 … n-1 ordered by key.
func SortedBy(n int, key func(int) string) []int {
	idx := make([]int, n)
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(a, b int) int { return strings.Compare(key(a), key(b)) })
	return idx
}

// NoControls is s with control characters and invalid bytes replaced by
// spaces, for the document information (which fpdf writes as UTF-16).
func NoControls(s string) string {
	return strings.Map(func(c rune) rune {
		if c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0) || c == utf8.RuneError {
			return ' '
		}
		return c
	}, s)
}

// WrapWords splits s into lines of at most width characters at spaces (a
// longer word stands alone on its line).
func WrapWords(s string, width int) []string {
	return WrapFields(s, func(line string) bool { return utf8.RuneCountInString(line) <= width })
}

// WrapFields joins the space-separated words of s into lines, starting a
// new line where adding the next word would make fits false (a word
// that does not fit alone still stands on its own line).
func WrapFields(s string, fits func(line string) bool) []string {
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
