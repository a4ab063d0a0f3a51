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
	opt := nodes.DefaultOptions()
	opt.Axis, opt.HubRadiusMM, opt.Bays = nodes.AxisLeastTwist, 60, bays
	s, err := nodes.Build(net, topo, opt)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d members, largest twist below 1e-6°: %v\n", len(s.Members), nodes.MaxAbsTwist(s.Members) < 1e-6)
	// Output:
	// 646 members, largest twist below 1e-6°: true
}
