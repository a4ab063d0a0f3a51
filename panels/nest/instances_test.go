package nest

import (
	"bufio"
	"fmt"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"

	"pqfab/geom"
)

// binInstance is one instance of the convex-bins set with its optimum
// (testdata/README.md names the source: Terashima-Marín et al. 2010).
type binInstance struct {
	name          string
	class         string
	parts         []Part
	widthMM       float64
	heightMM      float64
	optimum       int
	optimumCounts []int
}

// numberRows reads a file of numbers separated by white space, a row a
// line, leaving out empty lines.
func numberRows(tb testing.TB, path string) [][]float64 {
	tb.Helper()
	f, err := os.Open(path)
	if err != nil {
		tb.Fatal(err)
	}
	defer f.Close()
	var rows [][]float64
	sc := bufio.NewScanner(f)
	sc.Buffer(make([]byte, 1<<20), 1<<20)
	for sc.Scan() {
		var row []float64
		for _, w := range strings.Fields(sc.Text()) {
			v, err := strconv.ParseFloat(w, 64)
			if err != nil {
				tb.Fatalf("%s: %v", path, err)
			}
			row = append(row, v)
		}
		if len(row) > 0 {
			rows = append(rows, row)
		}
	}
	if err := sc.Err(); err != nil {
		tb.Fatal(err)
	}
	return rows
}

// loadBinInstance reads T<name>.txt and OpT<name>.txt.
func loadBinInstance(tb testing.TB, name string) binInstance {
	tb.Helper()
	dir := filepath.Join("testdata", "convex-bins")
	rows := numberRows(tb, filepath.Join(dir, "T"+name+".txt"))
	in := binInstance{name: name, class: name[:1], widthMM: rows[1][0], heightMM: rows[1][1]}
	n := int(rows[0][0])
	for i := 0; i < n; i++ {
		r := rows[2+i]
		k := int(r[0])
		var p geom.Polygon
		for j := 0; j < k; j++ {
			p = append(p, geom.Vec2{X: r[1+2*j], Y: r[2+2*j]})
		}
		if !p.CCW() {
			p = p.Reversed()
		}
		in.parts = append(in.parts, Part{Label: fmt.Sprintf("%s-%d", name, i+1), Outline: p})
	}
	opt := numberRows(tb, filepath.Join(dir, "OpT"+name+".txt"))
	in.optimum = int(opt[0][0])
	for _, c := range opt[0][1 : 1+in.optimum] {
		in.optimumCounts = append(in.optimumCounts, int(c))
	}
	return in
}

// binInstanceNames lists the instances with an optimum in testdata.
func binInstanceNames(tb testing.TB) []string {
	tb.Helper()
	files, err := filepath.Glob(filepath.Join("testdata", "convex-bins", "OpT*.txt"))
	if err != nil || len(files) == 0 {
		tb.Fatalf("no convex-bins instances: %v", err)
	}
	var names []string
	for _, f := range files {
		names = append(names, strings.TrimSuffix(strings.TrimPrefix(filepath.Base(f), "OpT"), ".txt"))
	}
	sort.Strings(names)
	return names
}

// loadGlass reads a glass-guillotine instance (testdata/README.md names the
// source: Han, Bennell, Zhao, Song 2013). Polygons of fewer than three
// corners are not pieces and are dropped.
func loadGlass(tb testing.TB, name string) []Part {
	tb.Helper()
	path := filepath.Join("testdata", "glass-guillotine", name+".csv")
	f, err := os.Open(path)
	if err != nil {
		tb.Fatal(err)
	}
	defer f.Close()
	var ids []string
	polys := map[string]geom.Polygon{}
	sc := bufio.NewScanner(f)
	for line := 1; sc.Scan(); line++ {
		if line == 1 || strings.TrimSpace(sc.Text()) == "" {
			continue
		}
		w := strings.Split(strings.TrimSpace(sc.Text()), ";")
		if len(w) != 4 {
			tb.Fatalf("%s:%d: want 4 fields", path, line)
		}
		x, err1 := strconv.ParseFloat(w[2], 64)
		y, err2 := strconv.ParseFloat(w[3], 64)
		if err1 != nil || err2 != nil {
			tb.Fatalf("%s:%d: bad number", path, line)
		}
		if _, ok := polys[w[0]]; !ok {
			ids = append(ids, w[0])
		}
		polys[w[0]] = append(polys[w[0]], geom.Vec2{X: x, Y: y})
	}
	if err := sc.Err(); err != nil {
		tb.Fatal(err)
	}
	var parts []Part
	for _, id := range ids {
		p := polys[id]
		if len(p) < 3 {
			continue
		}
		if !p.CCW() {
			p = p.Reversed()
		}
		parts = append(parts, Part{Label: name + "-" + id, Outline: p})
	}
	return parts
}

// glassNames are the glass-guillotine instances in testdata.
var glassNames = []string{"han80", "han100", "jotika40", "jotika50"}

// glassSheets are the float-glass sheet sizes the glass benchmarks use
// (common trade sizes, from memory), with margin and spacing 0 as in the
// published instances.
var glassSheets = []Stock{
	{Name: "jumbo", WidthMM: 6000, HeightMM: 3210, Rotation: Free},
	{Name: "split", WidthMM: 3210, HeightMM: 2250, Rotation: Free},
}

// loadOptBins returns the pieces of each bin of the published optimum
// where they lie in the bin.
func loadOptBins(tb testing.TB, name string) [][]geom.Polygon {
	tb.Helper()
	rows := numberRows(tb, filepath.Join("testdata", "convex-bins", "OpT"+name+".txt"))
	nb := int(rows[0][0])
	var out [][]geom.Polygon
	k := 2
	for b := 0; b < nb; b++ {
		var bin []geom.Polygon
		for i := 0; i < int(rows[0][1+b]); i++ {
			r := rows[k]
			k++
			var p geom.Polygon
			for j := 0; j < int(r[0]); j++ {
				p = append(p, geom.Vec2{X: r[1+2*j], Y: r[2+2*j]})
			}
			if !p.CCW() {
				p = p.Reversed()
			}
			bin = append(bin, p)
		}
		out = append(out, bin)
	}
	return out
}
