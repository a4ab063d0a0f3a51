package main

import (
	"archive/zip"
	"bytes"
	"encoding/json"
	"io"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pqfab/export"
	"pqfab/internal/report"
	"pqfab/quadnet"
	"pqfab/samples"
)

// shuffled returns a copy of n with its nodes and panels in a random
// order, every panel starting at a random corner (orientation kept), and
// perm: node k of the copy is node perm[k] of n.
func shuffled(n *quadnet.Net, rng *rand.Rand) (*quadnet.Net, []int) {
	perm := rng.Perm(len(n.Nodes)) // perm[new] = old
	newOf := make([]int, len(n.Nodes))
	s := &quadnet.Net{Source: n.Source}
	for k, old := range perm {
		newOf[old] = k
		nd := n.Nodes[old]
		s.Nodes = append(s.Nodes, quadnet.Node{ID: nd.ID, Pos: nd.Pos, Support: nd.Support})
	}
	for _, f := range rng.Perm(len(n.Faces)) {
		c := n.Faces[f].Corners
		start := rng.IntN(len(c))
		var corners []int
		for i := range c {
			corners = append(corners, newOf[c[(start+i)%len(c)]])
		}
		s.Faces = append(s.Faces, quadnet.Face{ID: n.Faces[f].ID, Corners: corners})
	}
	return s, perm
}

// writeNetOBJ writes a net as OBJ (ids become the 1-based numbers).
func writeNetOBJ(t *testing.T, path string, n *quadnet.Net) {
	t.Helper()
	var buf bytes.Buffer
	if err := export.WriteOBJ(&buf, n, "shuffled"); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// comparable reads an output file in a form that drops what may differ
// between inputs listed in another order: the ids of nodes and panels
// (report.json) and the Id column of the schedule. net-flat.obj, in the
// input's order, is compared by sameFlatNet.
func comparable(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	switch filepath.Ext(path) {
	case ".json":
		var v any
		if err := json.Unmarshal(b, &v); err != nil {
			t.Fatal(err)
		}
		dropIDs(v)
		out, _ := json.Marshal(v)
		return out
	case ".xlsx":
		zr, err := zip.NewReader(bytes.NewReader(b), int64(len(b)))
		if err != nil {
			t.Fatal(err)
		}
		var all []byte
		for _, f := range zr.File {
			if strings.Contains(f.Name, "sharedStrings") || strings.HasPrefix(f.Name, "xl/worksheets/") {
				continue // hold the Id column's text
			}
			r, _ := f.Open()
			c, _ := io.ReadAll(r)
			r.Close()
			all = append(append(all, f.Name...), c...)
		}
		return all
	}
	return b
}

// dropIDs removes every "id" key (an input id) from decoded JSON.
func dropIDs(v any) {
	switch x := v.(type) {
	case map[string]any:
		delete(x, "id")
		for _, c := range x {
			dropIDs(c)
		}
	case []any:
		for _, c := range x {
			dropIDs(c)
		}
	}
}

// TestShuffledInputSameAnswer: the same net with its nodes and panels in
// another order and every panel starting at another corner gives the same
// labels, types, sheets, cost and drawings: every output file is the same
// but for input ids, for every sample and several seeds. Not parallel:
// it changes the working folder.
func TestShuffledInputSameAnswer(t *testing.T) {
	endToEnd(t)
	job := "title = \"shuffle\"\n[net]\nfile = \"net.obj\"\n[nodes]\nhub_radius_mm = 50\n[panel]\nedge_inset_mm = 5\n" + goodStock +
		"price = 400\n[[stock]]\nname = \"split\"\nwidth_mm = 3210\nheight_mm = 2250\nmargin_mm = 15\nspacing_mm = 6\nprice = 190\n" +
		"[rates]\ncurrency = \"EUR\"\nmember_per_m = 90\nnode_each = 150\npanel_per_m2 = 200\n"
	for _, name := range samples.Names() {
		t.Run(name, func(t *testing.T) {
			n, err := samples.Make(name, 150)
			if err != nil {
				t.Fatal(err)
			}
			var ref string
			for seed := uint64(0); seed < 3; seed++ {
				dir := filepath.Join(t.TempDir(), "in")
				if err := os.MkdirAll(dir, 0o755); err != nil {
					t.Fatal(err)
				}
				net, perm := n, []int(nil)
				if seed > 0 {
					net, perm = shuffled(n, rand.New(rand.NewPCG(seed, 77)))
				}
				writeNetOBJ(t, filepath.Join(dir, "net.obj"), net)
				if err := os.WriteFile(filepath.Join(dir, "job.toml"), []byte(job), 0o644); err != nil {
					t.Fatal(err)
				}
				t.Chdir(dir) // relative names, so the reports carry no temporary folder
				if _, _, err := runCmd(t, "build", "-q", "job.toml", "-o", "out"); err != nil {
					t.Fatal(err)
				}
				out := filepath.Join(dir, "out")
				if seed == 0 {
					ref = out
					continue
				}
				problems, n, err := treeDiff(ref, out, func(rel string) bool {
					p, q := filepath.Join(ref, filepath.FromSlash(rel)), filepath.Join(out, filepath.FromSlash(rel))
					if rel == filepath.ToSlash(report.FileNet) {
						sameFlatNet(t, p, q, net, perm) // reports its own differences
						return true
					}
					return bytes.Equal(comparable(t, p), comparable(t, q))
				})
				for _, p := range problems {
					t.Errorf("seed %d against the unshuffled build: %s", seed, p)
				}
				if err != nil || n < 6 {
					t.Fatalf("compared only %d files: %v", n, err)
				}
			}
		})
	}
}

// sameFlatNet checks net-flat.obj of a shuffled input (got) against the
// unshuffled build's (ref): it holds the shuffled file's nodes and panels
// in the shuffled file's order, node k at exactly the position (as
// written) of node perm[k] of ref, panel j as the file's panel j from the
// same start corner, under the same comment lines.
func sameFlatNet(t *testing.T, ref, got string, in *quadnet.Net, perm []int) {
	t.Helper()
	rb, err := os.ReadFile(ref)
	if err != nil {
		t.Fatal(err)
	}
	gb, err := os.ReadFile(got)
	if err != nil {
		t.Fatal(err)
	}
	r, g := readStrictOBJ(t, rb), readStrictOBJ(t, gb)
	if len(g.text) != len(perm) || len(r.text) != len(perm) || len(g.faces) != len(in.Faces) {
		t.Fatalf("%d and %d nodes, %d panels; the input has %d and %d", len(r.text), len(g.text), len(g.faces), len(perm), len(in.Faces))
	}
	for k, old := range perm {
		if g.text[k] != r.text[old] {
			t.Errorf("node %d: %s, want %s (node %d of the unshuffled build)", k+1, g.text[k], r.text[old], old+1)
		}
	}
	for j, f := range in.Faces {
		if !slicesEqual(g.faces[j], f.Corners) {
			t.Errorf("panel %d: %v, want the input's %v", j+1, g.faces[j], f.Corners)
		}
	}
	comments := func(b []byte) (c []string) {
		for _, l := range strings.Split(string(b), "\n") {
			if strings.HasPrefix(l, "#") {
				c = append(c, l)
			}
		}
		return c
	}
	if a, b := comments(rb), comments(gb); strings.Join(a, "\n") != strings.Join(b, "\n") {
		t.Errorf("comment lines differ:\n%s\nwant\n%s", strings.Join(b, "\n"), strings.Join(a, "\n"))
	}
}
