package export_test

import (
	"fmt"
	"os"

	"pqfab/export"
	"pqfab/geom"
	"pqfab/quadnet"
)

// ExampleWriteOBJ writes a one-panel net as Wavefront OBJ in millimetres.
func ExampleWriteOBJ() {
	net := &quadnet.Net{Source: "example", Nodes: []quadnet.Node{
		{ID: "1", Pos: geom.Vec{X: 0, Y: 0, Z: 0}},
		{ID: "2", Pos: geom.Vec{X: 1500, Y: 0, Z: 0}},
		{ID: "3", Pos: geom.Vec{X: 1500, Y: 1200, Z: 12.5}},
		{ID: "n4", Pos: geom.Vec{X: 0, Y: 1200, Z: 12.5}},
	}, Faces: []quadnet.Face{{ID: "1", Corners: []int{0, 1, 2, 3}}}}
	if err := export.WriteOBJ(os.Stdout, net, "one panel"); err != nil {
		fmt.Println(err)
	}
	// Output:
	// # one panel
	// # units: mm, z up; written by pqfab
	// # nodes: 4, panels: 1
	// v 0.0000 0.0000 0.0000
	// v 1500.0000 0.0000 0.0000
	// v 1500.0000 1200.0000 12.5000
	// # node n4
	// v 0.0000 1200.0000 12.5000
	// f 1 2 3 4
}
