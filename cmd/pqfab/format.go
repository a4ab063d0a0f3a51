package main

import (
	"encoding/json"
	"io"
	"math"
	"sort"

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

// sortByCount orders indices by count, largest first, ties by index.
func sortByCount(idx []int, count func(int) int) {
	sort.SliceStable(idx, func(a, b int) bool { return count(idx[a]) > count(idx[b]) })
}

// writeJSON writes v as indented JSON.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(v)
}
