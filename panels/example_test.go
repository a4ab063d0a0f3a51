package panels_test

import (
	"fmt"

	"pqfab/panels"
	"pqfab/quadnet"
	"pqfab/samples"
)

func ExamplePlanarize() {
	net, _ := samples.Make("wave", 200)
	topo := quadnet.BuildTopology(net)
	// A finer tolerance; every other setting at its default.
	res, err := panels.Planarize(net, topo, panels.PlanarizeOptions{TolMM: 0.1})
	if err != nil {
		fmt.Println(err)
		return
	}
	before, after := panels.SpreadOf(res.Before), panels.SpreadOf(res.After)
	fmt.Println("flat before:", before.Max > 5, "after:", after.Max <= 0.1, "converged:", res.Converged)
	// Output:
	// flat before: true after: true converged: true
}
