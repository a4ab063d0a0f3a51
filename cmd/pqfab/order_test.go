package main

import (
	"context"
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"pqfab/geom"
	"pqfab/internal/job"
	"pqfab/internal/pipeline"
	"pqfab/internal/report"
	"pqfab/quadnet"
	"pqfab/samples"
)

// strictOBJ is an OBJ net as a strict reader sees it.
type strictOBJ struct {
	nodes [][3]float64
	text  []string // each node's v line after "v "
	faces [][]int  // 0-based
}

// readStrictOBJ reads OBJ text as a strict reader does, independently of
// quadnet.ReadOBJ: every line is a comment starting with '#', `v` with
// exactly three numbers (a fourth would be a weight) or `f` with node
// numbers from 1; a '#' after the numbers of a `v` or `f` line is an error.
func readStrictOBJ(t *testing.T, b []byte) strictOBJ {
	t.Helper()
	var o strictOBJ
	for k, line := range strings.Split(strings.TrimSuffix(string(b), "\n"), "\n") {
		f := strings.Split(line, " ")
		switch {
		case strings.HasPrefix(line, "#"):
		case f[0] == "v" && len(f) == 4:
			var p [3]float64
			for i := range p {
				v, err := strconv.ParseFloat(f[i+1], 64)
				if err != nil {
					t.Fatalf("line %d: %q: %v", k+1, line, err)
				}
				p[i] = v
			}
			o.nodes = append(o.nodes, p)
			o.text = append(o.text, line[2:])
		case f[0] == "f" && len(f) >= 4:
			var c []int
			for _, s := range f[1:] {
				i, err := strconv.Atoi(s)
				if err != nil || i < 1 {
					t.Fatalf("line %d: %q: bad node number %q", k+1, line, s)
				}
				c = append(c, i-1)
			}
			o.faces = append(o.faces, c)
		default:
			t.Fatalf("line %d: %q is not a comment, `v x y z` or `f a b c …`", k+1, line)
		}
	}
	for j, c := range o.faces {
		for _, i := range c {
			if i >= len(o.nodes) {
				t.Fatalf("face %d names node %d of %d", j+1, i+1, len(o.nodes))
			}
		}
	}
	return o
}

// readNumpyOBJ reads an OBJ file with readback_obj.py (numpy parsing the
// text, Debian's python3-numpy) and returns the nodes and 0-based faces.
func readNumpyOBJ(t *testing.T, path string) ([][3]float64, [][]int) {
	t.Helper()
	b, err := exec.Command(debianPython, filepath.Join("testdata", "readback_obj.py"), path).Output()
	if err != nil {
		t.Fatalf("readback_obj.py: %v\n%s", err, b)
	}
	var got struct {
		Nodes [][3]float64
		Faces [][]int
	}
	if err := json.Unmarshal(b, &got); err != nil {
		t.Fatalf("readback_obj.py: %v\n%s", err, b)
	}
	for _, f := range got.Faces {
		for k := range f {
			f[k]--
		}
	}
	return got.Nodes, got.Faces
}

// fileOrderNet returns the wave sample shuffled by seed (nodes and panels
// in a random order, every panel starting at a random corner) with a node
// in no panel put in the middle, and writes it as OBJ into dir.
func fileOrderNet(t *testing.T, dir string, seed uint64) *quadnet.Net {
	t.Helper()
	n, err := samples.Make("wave", 60)
	if err != nil {
		t.Fatal(err)
	}
	s, _ := shuffled(n, rand.New(rand.NewPCG(seed, 5)))
	mid := len(s.Nodes) / 2
	lone := quadnet.Node{Pos: geom.Vec{X: -5000, Y: 12345.5, Z: 7}}
	s.Nodes = append(s.Nodes[:mid], append([]quadnet.Node{lone}, s.Nodes[mid:]...)...)
	for _, f := range s.Faces {
		for k, c := range f.Corners {
			if c >= mid {
				f.Corners[k] = c + 1
			}
		}
	}
	for i := range s.Nodes {
		s.Nodes[i].ID = strconv.Itoa(i + 1)
	}
	for j := range s.Faces {
		s.Faces[j].ID = strconv.Itoa(j + 1)
	}
	writeNetOBJ(t, filepath.Join(dir, "net.obj"), s)
	return s
}

// checkFileOrder checks an OBJ net written by pqfab against the net file
// in: node i is at want[i] (to the 1e-4 mm written), panel j is the file's
// panel j with the same corners from the same start corner; strict readers
// (ours above, and numpy's text parser) read it.
func checkFileOrder(t *testing.T, path string, in *quadnet.Net, want []geom.Vec) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	o := readStrictOBJ(t, b)
	npNodes, npFaces := readNumpyOBJ(t, path)
	if len(o.nodes) != len(in.Nodes) || len(npNodes) != len(in.Nodes) || len(o.faces) != len(in.Faces) || len(npFaces) != len(in.Faces) {
		t.Fatalf("%d (numpy %d) nodes and %d (numpy %d) panels; the file has %d and %d",
			len(o.nodes), len(npNodes), len(o.faces), len(npFaces), len(in.Nodes), len(in.Faces))
	}
	const writtenMM = 0.5e-4 // OBJDigits = 4: half the last written digit
	for i, w := range want {
		for _, got := range [][3]float64{o.nodes[i], npNodes[i]} {
			if d := math.Max(math.Abs(got[0]-w.X), math.Max(math.Abs(got[1]-w.Y), math.Abs(got[2]-w.Z))); d > writtenMM*1.01 {
				t.Errorf("node %d at %v, want %v", i+1, got, w)
			}
		}
	}
	for j, f := range in.Faces {
		if !slicesEqual(o.faces[j], f.Corners) || !slicesEqual(npFaces[j], f.Corners) {
			t.Errorf("panel %d: %v (numpy %v), want the file's %v", j+1, o.faces[j], npFaces[j], f.Corners)
		}
	}
}

func slicesEqual(a, b []int) bool { return fmt.Sprint(a) == fmt.Sprint(b) }

// TestPlanarizeKeepsFileOrder: `planarize -o` writes the nodes and panels
// in the net file's order, each panel from the file's start corner, with
// node i at the planarized position of the file's node i (its position in
// the file plus its move in the report, looked up by id), and a node in
// no panel where the file has it.
func TestPlanarizeKeepsFileOrder(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	in := fileOrderNet(t, dir, 3)
	out, report := filepath.Join(dir, "flat.obj"), filepath.Join(dir, "moves.json")
	if _, _, err := runCmd(t, "planarize", "-q", filepath.Join(dir, "net.obj"), "--tol", "0.2", "-o", out, "--report", report); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(report)
	if err != nil {
		t.Fatal(err)
	}
	var rep pipeline.PlanarizeReport
	if err := json.Unmarshal(b, &rep); err != nil {
		t.Fatal(err)
	}
	move := map[string][3]float64{}
	moved := 0
	for _, r := range rep.Nodes {
		move[r.ID] = r.Vector
		if r.MoveMM > 0.01 {
			moved++
		}
	}
	if moved == 0 {
		t.Fatal("no node moved: the test would not tell the orders apart")
	}
	want := make([]geom.Vec, len(in.Nodes))
	for i, nd := range in.Nodes {
		m := move[nd.ID] // zero for the node in no panel, which the report leaves out
		want[i] = geom.Vec{X: nd.Pos.X + m[0], Y: nd.Pos.Y + m[1], Z: nd.Pos.Z + m[2]}
	}
	// The report's moves are rounded to 1e-3 mm: compare to that, then
	// exactly against the build below.
	b, err = os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	o := readStrictOBJ(t, b)
	if len(o.nodes) != len(want) {
		t.Fatalf("%d nodes, want the file's %d", len(o.nodes), len(want))
	}
	for i, w := range want {
		got := o.nodes[i]
		if d := math.Max(math.Abs(got[0]-w.X), math.Max(math.Abs(got[1]-w.Y), math.Abs(got[2]-w.Z))); d > 0.6e-3 {
			t.Errorf("node %d at %v, want %v", i+1, got, w)
		}
	}
	checkFileOrder(t, out, in, nodesOf(o))
}

// nodesOf returns the positions read.
func nodesOf(o strictOBJ) []geom.Vec {
	out := make([]geom.Vec, len(o.nodes))
	for i, p := range o.nodes {
		out[i] = geom.Vec{X: p[0], Y: p[1], Z: p[2]}
	}
	return out
}

// TestBuildNetKeepsFileOrder: net-flat.obj of a build holds node i at the
// planarized position of the file's node i (the build's own result mapped
// through the file order) and panel j as the file's panel j.
func TestBuildNetKeepsFileOrder(t *testing.T) {
	endToEnd(t)
	t.Parallel()
	dir := t.TempDir()
	in := fileOrderNet(t, dir, 4)
	jobText := "[net]\nfile = \"net.obj\"\n" + goodStock
	if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(jobText), 0o644); err != nil {
		t.Fatal(err)
	}
	j, err := job.ReadFile(filepath.Join(dir, "job.toml"))
	if err != nil {
		t.Fatal(err)
	}
	res, err := pipeline.Run(context.Background(), j, pipeline.OpenFile, pipeline.Quiet{}, pipeline.Policy{})
	if err != nil {
		t.Fatal(err)
	}
	// The build's planarized nodes by the file's ids (the 1-based numbers),
	// and the node in no panel where the file has it.
	byID := map[string]geom.Vec{}
	for _, nd := range res.Net.Nodes {
		byID[nd.ID] = nd.Pos
	}
	want := make([]geom.Vec, len(in.Nodes))
	for i, nd := range in.Nodes {
		p, ok := byID[nd.ID]
		if !ok {
			p = nd.Pos
		}
		want[i] = p
	}
	out := filepath.Join(dir, "out")
	if _, _, err := runCmd(t, "build", "-q", filepath.Join(dir, "job.toml"), "-o", out); err != nil {
		t.Fatal(err)
	}
	checkFileOrder(t, filepath.Join(out, report.FileNet), in, want)
}
