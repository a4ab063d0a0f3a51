package quadnet

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"pqfab/geom"
)

// plainDecimal reports whether s is a plain decimal number: an optional
// sign, digits with at most one decimal point (at least one digit), and an
// optional exponent (e or E, optional sign, digits). Hexadecimal floats,
// digit separators ("1_000"), "Inf" and "NaN", which strconv.ParseFloat
// would take, are not plain decimals.
func plainDecimal(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && isDigit(s[i]) {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && isDigit(s[i]) {
			i++
			digits++
		}
	}
	if digits == 0 {
		return false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		i++
		if i < len(s) && (s[i] == '+' || s[i] == '-') {
			i++
		}
		exp := 0
		for i < len(s) && isDigit(s[i]) {
			i++
			exp++
		}
		if exp == 0 {
			return false
		}
	}
	return i == len(s)
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// parsePlain reads a plain decimal number (see plainDecimal) that is
// finite as a float64.
func parsePlain(s string) (float64, bool) {
	if !plainDecimal(s) {
		return 0, false
	}
	v, err := strconv.ParseFloat(s, 64)
	return v, err == nil
}

// notFiniteWord reports whether s spells infinity or not-a-number, as
// strconv.ParseFloat would read it.
func notFiniteWord(s string) bool {
	s = strings.ToLower(strings.TrimLeft(s, "+-"))
	return s == "inf" || s == "infinity" || s == "nan"
}

// parseCoord reads one coordinate, a plain decimal number, and converts it
// to millimetres.
func parseCoord(s string, unit Unit) (float64, error) {
	if notFiniteWord(s) {
		return 0, fmt.Errorf("coordinate %s is not a finite number", quote(s))
	}
	if !plainDecimal(s) {
		return 0, fmt.Errorf("bad number %s (want a plain decimal such as -12.5 or 1.25e3)", quote(s))
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil && !errors.Is(err, strconv.ErrRange) {
		return 0, fmt.Errorf("bad number %s", quote(s))
	}
	v *= float64(unit)
	if math.IsInf(v, 0) || math.Abs(v) > MaxCoordMM {
		return 0, fmt.Errorf("coordinate %s %s is beyond %.0f km (wrong unit?)", short(s), unit, MaxCoordMM/1e6)
	}
	return v, nil
}

// parsePoint reads three coordinates.
func parsePoint(f []string, unit Unit) (geom.Vec, error) {
	var c [3]float64
	for i := range c {
		v, err := parseCoord(f[i], unit)
		if err != nil {
			return geom.Vec{}, err
		}
		c[i] = v
	}
	return geom.Vec{X: c[0], Y: c[1], Z: c[2]}, nil
}
