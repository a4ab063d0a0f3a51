package nodes

import (
	"fmt"
	"math"

	"pqfab/geom"
)

// Options sets up the whole node and member computation.
type Options struct {
	Axis          AxisMethod
	AxisStiffness float64 // least-twist only; DefaultAxisStiffness if 0
	HubRadiusMM   float64
	Section       Section
	Bays          geom.Bays
	Types         TypeOptions
}

// Structure is the result: nodes, members and their types.
type Structure struct {
	Nodes       []Node
	Members     []Member
	MemberTypes []Type
	NodeTypes   []Type
	// TwistNormalDeg is the largest |twist| with normal axes, for the
	// report; equal to the members' largest twist for AxisNormal.
	TwistNormalDeg float64
	Section        Section
}

// Build computes axes, members, hubs, labels and types for a net.
func Build(n *geom.Net, topo *geom.Topology, opt Options) (*Structure, error) {
	normals, err := NormalAxes(n)
	if err != nil {
		return nil, err
	}
	axes := normals
	switch opt.Axis {
	case AxisNormal, "":
	case AxisLeastTwist:
		k := opt.AxisStiffness
		if k == 0 {
			k = DefaultAxisStiffness
		}
		if axes, err = LeastTwistAxes(n, topo, normals, k); err != nil {
			return nil, err
		}
	default:
		return nil, fmt.Errorf("nodes: unknown axis method %q (want normal or least-twist)", opt.Axis)
	}
	mopt := MemberOptions{HubRadiusMM: opt.HubRadiusMM}
	ms, err := Members(n, topo, axes, mopt)
	if err != nil {
		return nil, err
	}
	s := &Structure{Members: ms, Section: opt.Section}
	if opt.Axis == AxisLeastTwist {
		before, err := Members(n, topo, normals, mopt)
		if err != nil {
			return nil, err
		}
		s.TwistNormalDeg = MaxAbsTwist(before)
	} else {
		s.TwistNormalDeg = MaxAbsTwist(ms)
	}
	nodeLabels, memberLabels := Labels(n, topo, opt.Bays)
	for k := range ms {
		ms[k].Label = memberLabels[k]
	}
	if s.Nodes, err = Hubs(n, topo, axes, ms, nodeLabels); err != nil {
		return nil, err
	}
	if s.MemberTypes, err = MemberTypes(ms, opt.Types); err != nil {
		return nil, err
	}
	s.NodeTypes = NodeTypes(s.Nodes, opt.Types)
	return s, nil
}

// MaxAbsTwist returns the largest |twist| of the members (degrees).
func MaxAbsTwist(ms []Member) float64 {
	var m float64
	for _, x := range ms {
		m = math.Max(m, math.Abs(x.TwistDeg))
	}
	return m
}
