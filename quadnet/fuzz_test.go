package quadnet

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"pqfab/geom"
)

// seedFiles adds the files matching pattern in testdata/bad as seeds.
func seedFiles(f *testing.F, pattern string) {
	files, _ := filepath.Glob(filepath.Join("testdata", "bad", pattern))
	for _, p := range files {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b)
	}
}

// checkRead validates whatever a reader accepted: it must not panic, and
// an accepted net must be usable.
func checkRead(t *testing.T, n *Net, err error) {
	if err != nil {
		msg := err.Error()
		if !strings.Contains(msg, "fuzz") {
			t.Fatalf("error does not name the file: %v", err)
		}
		if strings.ContainsAny(msg, "\n\r") || len(msg) > maxMessageBytes {
			t.Fatalf("error is not one short line (%d bytes): %q", len(msg), short(msg))
		}
		return
	}
	for _, f := range n.Faces {
		if len(f.Corners) < MinCorners || len(f.Corners) > MaxCorners {
			t.Fatalf("accepted a face with %d corners", len(f.Corners))
		}
		for _, c := range f.Corners {
			if c < 0 || c >= len(n.Nodes) {
				t.Fatalf("accepted corner %d of %d nodes", c, len(n.Nodes))
			}
		}
	}
	for _, nd := range n.Nodes {
		if !geom.Finite(nd.Pos) {
			t.Fatalf("accepted a non-finite node %v", nd.Pos)
		}
	}
	topo, fd := Validate(n, DefaultValidateOptions())
	for _, e := range append(fd.Errors, fd.Warnings...) {
		if msg := e.Error(); strings.ContainsAny(msg, "\n\r") || len(msg) > maxMessageBytes {
			t.Fatalf("finding is not one short line (%d bytes): %q", len(msg), short(msg))
		}
	}
	if fd.Err() != nil {
		return
	}
	if len(topo.FaceEdges) != len(n.Faces) {
		t.Fatal("topology lost faces")
	}
	kept, dropped := DropUnused(n)
	if len(kept.Nodes)+len(dropped) != len(n.Nodes) || len(kept.Faces) != len(n.Faces) {
		t.Fatalf("DropUnused: %d + %d nodes of %d", len(kept.Nodes), len(dropped), len(n.Nodes))
	}
	c, nodeFrom, faceFrom := Canonical(n)
	if len(c.Nodes) != len(n.Nodes) || len(nodeFrom) != len(n.Nodes) || len(faceFrom) != len(n.Faces) {
		t.Fatal("Canonical lost nodes or faces")
	}
}

// maxMessageBytes bounds an error message: a few names, numbers and short
// quotes, never a whole line of the input.
const maxMessageBytes = 600

func FuzzReadOBJ(f *testing.F) {
	seedFiles(f, "*.obj")
	f.Add([]byte(gridOBJ(2, 2, 1000)))
	f.Fuzz(func(t *testing.T, data []byte) {
		n, err := ReadOBJ(bytes.NewReader(data), "fuzz.obj", MM)
		checkRead(t, n, err)
	})
}

func FuzzReadOFF(f *testing.F) {
	seedFiles(f, "*.off")
	f.Add([]byte("OFF\n4 1 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"))
	f.Add([]byte("NOFF\n4 1 0\n0 0\n0 0 0 1\n1000 0 0 0 0 1\n1000 1000 0 0 0 1\n0 1000 0 0 0 1\n4 0\n1\n2\n3 255 0 0\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		n, err := ReadOFF(bytes.NewReader(data), "fuzz.off", MM)
		checkRead(t, n, err)
	})
}

func FuzzReadCSV(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("testdata", "bad", "*-nodes.csv"))
	for _, p := range files {
		nb, _ := os.ReadFile(p)
		pb, _ := os.ReadFile(strings.Replace(p, "-nodes", "-panels", 1))
		f.Add(nb, pb)
	}
	f.Add([]byte("id,x,y,z\n1,0,0,0\n2,1000,0,0\n3,1000,1000,0\n4,0,1000,0\n"), []byte("id,a,b,c,d\nP,1,2,3,4\n"))
	f.Fuzz(func(t *testing.T, nodes, panels []byte) {
		n, err := ReadCSV(bytes.NewReader(nodes), "fuzz-nodes.csv", bytes.NewReader(panels), "fuzz-panels.csv", MM)
		checkRead(t, n, err)
	})
}
