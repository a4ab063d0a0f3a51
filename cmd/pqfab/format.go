package main

import (
	"math"

	"pqfab/panels"
)

// round rounds x to d decimals for printing and JSON, so that output bytes
// do not depend on the last bits of a float.
func round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	r := math.Round(x*p) / p
	if r == 0 {
		return 0 // no negative zero
	}
	return r
}

func roundSpread(s panels.Spread, d int) panels.Spread {
	return panels.Spread{Min: round(s.Min, d), Median: round(s.Median, d), Max: round(s.Max, d)}
}
