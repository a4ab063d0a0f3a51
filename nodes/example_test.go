package nodes_test

import (
	"fmt"

	"pqfab/nodes"
	"pqfab/quadnet"
	"pqfab/samples"
)

func ExampleBuild() {
	net, _ := samples.Make("dome", 300)
	topo := quadnet.BuildTopology(net)
	bays, _ := quadnet.NewBays(net.Positions(), 6000, 6000)
	// Least-twist axes (the default), a hub, bays; the default section
	// and type tolerances.
	s, err := nodes.Build(net, topo, nodes.Options{HubRadiusMM: 60, Bays: bays})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d members, largest twist below 1e-6°: %v\n", len(s.Members), nodes.MaxAbsTwist(s.Members) < 1e-6)
	// Output:
	// 646 members, largest twist below 1e-6°: true
}
