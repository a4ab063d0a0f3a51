package export

import (
	"fmt"
	"strings"
	"unicode/utf8"

	"golang.org/x/text/encoding/charmap"
)

// Text from the job or the net (titles, names, ids, warnings) reaches
// several file formats; each has its own rules, applied here once.

// dxfText makes s safe for a DXF TEXT value in an AC1015 file, which
// declares no code page and which readers therefore take as code page 1252
// (ANSI_1252): control characters (a newline would end the group value
// and break the file's structure) become spaces; a character of code page
// 1252 outside ASCII (such as ° or é) is written as its one byte there;
// every other character, and the backslash, is written as a \U+XXXX escape
// (the DXF notation for Unicode in files before AC1021; characters outside
// the Basic Multilingual Plane, which it cannot hold, and bytes that are
// not UTF-8 become "?"); and a percent sign next to another (a TEXT
// control code) is written as "%%%", which readers show as one percent
// sign. The result is meant for the DXF writer, not for Go: it need not be
// UTF-8.
func dxfText(s string) string {
	var b strings.Builder
	for i, r := range s {
		switch {
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0):
			b.WriteByte(' ')
		case r == utf8.RuneError || r > 0xffff:
			b.WriteByte('?')
		case r >= 0x80:
			if c, ok := charmap.Windows1252.EncodeRune(r); ok {
				b.WriteByte(c)
			} else {
				fmt.Fprintf(&b, `\U+%04X`, r)
			}
		case r == '\\' || r == '^': // the escape's own sign, and the caret of TEXT control codes
			fmt.Fprintf(&b, `\U+%04X`, r)
		case r == '%' && (strings.HasPrefix(s[i:], "%%") || (i > 0 && s[i-1] == '%')):
			b.WriteString("%%%")
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

// oneLine makes s safe for one line of a text format (an OBJ comment, a
// progress message): control characters become spaces, so text from the
// job can never start a new line and add nodes or panels to a net file.
func oneLine(s string) string {
	return strings.Map(func(r rune) rune {
		if r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || r == '\u2028' || r == '\u2029' {
			return ' '
		}
		return r
	}, s)
}

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
