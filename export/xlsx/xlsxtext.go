package xlsx

import (
	"fmt"
	"strings"
	"unicode/utf8"
)

// MaxCellChars is the most characters a spreadsheet cell holds (the
// limit of the XLSX format's applications).
const MaxCellChars = 32767

// cellText makes s safe for an XLSX cell: characters XML cannot carry
// (control characters other than tab, newline and carriage return) become
// spaces. Text longer than MaxCellChars is refused, never cut.
func cellText(s string) (string, error) {
	if n := utf8.RuneCountInString(s); n > MaxCellChars {
		return "", fmt.Errorf("a cell would hold %d characters, more than the %d a spreadsheet cell takes: %q…", n, MaxCellChars, short(s))
	}
	return strings.Map(func(r rune) rune {
		if (r < 0x20 && r != '\t' && r != '\n' && r != '\r') || r == 0xfffe || r == 0xffff {
			return ' '
		}
		return r
	}, s), nil
}

// short cuts text for a message to at most 32 characters.
func short(s string) string {
	if r := []rune(s); len(r) > 32 {
		return string(r[:32]) + "…"
	}
	return s
}
