package export

import (
	"bytes"
	"flag"
	"os"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

var update = flag.Bool("update", false, "rewrite golden files")

func smallNet() *quadnet.Net {
	return &quadnet.Net{Nodes: []quadnet.Node{
		{ID: "1", Pos: geom.Vec{X: 0, Y: 0, Z: 0}},
		{ID: "2", Pos: geom.Vec{X: 1500.25, Y: 0, Z: -0.00004}},
		{ID: "N3", Pos: geom.Vec{X: 1500, Y: 1200.123456, Z: 10}},
		{ID: "4", Pos: geom.Vec{X: 0, Y: 1200, Z: 10}},
	}, Faces: []quadnet.Face{{ID: "1", Corners: []int{0, 1, 2, 3}}, {ID: "P2", Corners: []int{0, 2, 3}}}}
}

func TestWriteOBJGolden(t *testing.T) {
	var buf bytes.Buffer
	if err := WriteOBJ(&buf, smallNet(), "test net"); err != nil {
		t.Fatal(err)
	}
	golden := "testdata/small.obj"
	if *update {
		if err := os.WriteFile(golden, buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(buf.Bytes(), want) {
		t.Errorf("got\n%s\nwant\n%s", buf.Bytes(), want)
	}
	// Reads back with our own reader to the written precision.
	n, err := quadnet.ReadOBJ(bytes.NewReader(buf.Bytes()), golden, quadnet.MM)
	if err != nil {
		t.Fatal(err)
	}
	for i, nd := range n.Nodes {
		d := r3.Sub(nd.Pos, smallNet().Nodes[i].Pos)
		if d.X*d.X+d.Y*d.Y+d.Z*d.Z > 1e-8 {
			t.Errorf("node %d moved by %v", i, d)
		}
	}
}
