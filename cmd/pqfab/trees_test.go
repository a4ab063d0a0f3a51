package main

import (
	"bytes"
	"io/fs"
	"maps"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

// sameTrees checks that two output folders hold the same files with the
// same bytes: a file of either build missing from the other is an error.
func sameTrees(t *testing.T, a, b string) {
	t.Helper()
	problems, n, err := treeDiff(a, b, func(rel string) bool {
		x, errX := os.ReadFile(filepath.Join(a, filepath.FromSlash(rel)))
		y, errY := os.ReadFile(filepath.Join(b, filepath.FromSlash(rel)))
		return errX == nil && errY == nil && bytes.Equal(x, y)
	})
	for _, p := range problems {
		t.Error(p)
	}
	if err != nil || n < 6 {
		t.Fatalf("compared %d files: %v", n, err)
	}
}

// treeEntries lists what a folder holds below it, by names relative to it
// with '/' separators, folders ending in '/', sorted.
func treeEntries(root string) ([]string, error) {
	var out []string
	err := filepath.WalkDir(root, func(p string, d fs.DirEntry, err error) error {
		if err != nil || p == root {
			return err
		}
		rel, err := filepath.Rel(root, p)
		if err != nil {
			return err
		}
		rel = filepath.ToSlash(rel)
		if d.IsDir() {
			rel += "/"
		}
		out = append(out, rel)
		return nil
	})
	slices.Sort(out) // WalkDir's order is by folder, not by whole name
	return out, err
}

// treeDiff compares two output folders, a from the first build and b from
// the second: every file or folder that only one of them holds is a
// problem, in either direction, and so is every file both hold that same
// (given the relative name) finds different. It returns the problems in
// name order and how many files both hold.
func treeDiff(a, b string, same func(rel string) bool) (problems []string, compared int, err error) {
	inA, err := treeEntries(a)
	if err != nil {
		return nil, 0, err
	}
	inB, err := treeEntries(b)
	if err != nil {
		return nil, 0, err
	}
	i, j := 0, 0
	for i < len(inA) || j < len(inB) {
		switch {
		case j == len(inB) || i < len(inA) && inA[i] < inB[j]:
			problems = append(problems, inA[i]+" only in the first build")
			i++
		case i == len(inA) || inB[j] < inA[i]:
			problems = append(problems, inB[j]+" only in the second build")
			j++
		default:
			if rel := inA[i]; !strings.HasSuffix(rel, "/") {
				compared++
				if !same(rel) {
					problems = append(problems, rel+" differs between builds")
				}
			}
			i++
			j++
		}
	}
	return problems, compared, nil
}

// TestTreeDiff: the comparison of two builds' folders reports a file or
// folder only the second build wrote, one only the first wrote, and a
// file whose bytes differ; two equal folders give no problem.
func TestTreeDiff(t *testing.T) {
	t.Parallel()
	write := func(root string, files map[string]string) {
		for name, body := range files {
			p := filepath.Join(root, filepath.FromSlash(name))
			if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
	base := map[string]string{"report.json": "{}", "sheets/sheet-01.dxf": "0\nEOF", "site/plan.pdf": "%PDF", "site-x": "x"}
	with := func(extra map[string]string) map[string]string {
		m := maps.Clone(base)
		maps.Copy(m, extra)
		return m
	}
	tests := []struct {
		name    string
		a, b    map[string]string
		want    []string
		compare int
	}{
		{"same", base, base, nil, 4},
		{"extra file in the second", base, with(map[string]string{"sheets/sheet-02.dxf": "0"}), []string{"sheets/sheet-02.dxf only in the second build"}, 4},
		{"extra folder in the second", base, with(map[string]string{"tags/t.pdf": "%PDF"}), []string{"tags/ only in the second build", "tags/t.pdf only in the second build"}, 4},
		{"extra file in the first", with(map[string]string{"z.txt": "z"}), base, []string{"z.txt only in the first build"}, 4},
		{"different bytes", base, with(map[string]string{"site/plan.pdf": "%PDF-2"}), []string{"site/plan.pdf differs between builds"}, 4},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			a, b := filepath.Join(t.TempDir(), "a"), filepath.Join(t.TempDir(), "b")
			write(a, tc.a)
			write(b, tc.b)
			got, n, err := treeDiff(a, b, func(rel string) bool {
				x, _ := os.ReadFile(filepath.Join(a, filepath.FromSlash(rel)))
				y, _ := os.ReadFile(filepath.Join(b, filepath.FromSlash(rel)))
				return string(x) == string(y)
			})
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(got, tc.want) || n != tc.compare {
				t.Errorf("got %q comparing %d files, want %q comparing %d", got, n, tc.want, tc.compare)
			}
		})
	}
}
