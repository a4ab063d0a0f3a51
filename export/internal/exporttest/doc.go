// Package exporttest holds what the tests of the format packages share: a
// labelled grid report (GridReport), the overlap of two boxes (ClipArea)
// and a writer benchmark (BenchWrite).
package exporttest
