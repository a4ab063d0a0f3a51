package quadnet_test

import (
	"fmt"
	"strings"

	"pqfab/quadnet"
)

func ExampleReadOBJ() {
	src := "v 0 0 0\nv 1.5 0 0\nv 1.5 1.2 0.01\nv 0 1.2 0\nf 1 2 3 4\n"
	n, err := quadnet.ReadOBJ(strings.NewReader(src), "canopy.obj", quadnet.M)
	if err != nil {
		fmt.Println(err)
		return
	}
	topo, findings := quadnet.Validate(n, quadnet.DefaultValidateOptions())
	fmt.Println(len(n.Nodes), "nodes,", len(n.Faces), "panel,", len(topo.Edges), "edges, errors:", findings.Err())
	fmt.Printf("node 3 at %.0f mm\n", n.Nodes[2].Pos.Z)
	// Output:
	// 4 nodes, 1 panel, 4 edges, errors: <nil>
	// node 3 at 10 mm
}
