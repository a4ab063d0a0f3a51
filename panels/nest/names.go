package nest

import "strconv"

// SheetName names sheet i (from 0) of n: S-01, S-02, … with as many digits
// as the count needs (at least two), so names sort in order.
func SheetName(i, n int) string { return "S-" + SheetNumber(i, n) }

// minSheetDigits: sheet numbers have at least this many digits.
const minSheetDigits = 2

// SheetNumber is sheet i's number (from 1) among n, padded with zeros to
// as many digits as the count needs (at least minSheetDigits): 01, 02, …
func SheetNumber(i, n int) string {
	w := max(minSheetDigits, len(strconv.Itoa(n)))
	s := strconv.Itoa(i + 1)
	for len(s) < w {
		s = "0" + s
	}
	return s
}
