package main

import (
	"encoding/json"
	"io"
	"sort"
)

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
