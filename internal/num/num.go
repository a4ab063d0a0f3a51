// Package num rounds the numbers pqfab writes, so that output bytes do not
// depend on the last bits of a float.
package num

import (
	"math"

	"pqfab/panels"
)

// Round rounds x to d decimals without negative zero, so output bytes do
// not depend on the last bits of a float. Every writer and the command's
// printed numbers use it.
func Round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	v := math.Round(x*p) / p
	if v == 0 {
		return 0
	}
	return v
}

// RoundSpread rounds a spread's three numbers to d decimals.
func RoundSpread(s panels.Spread, d int) panels.Spread {
	return panels.Spread{Min: Round(s.Min, d), Median: Round(s.Median, d), Max: Round(s.Max, d)}
}
