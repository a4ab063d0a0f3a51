package nodes

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// HubArm is one member arriving at a node, seen in the node's hub frame.
type HubArm struct {
	Member       int     // member index
	AzimuthDeg   float64 // in [0, 360), counter-clockwise about the axis from the first member
	ElevationDeg float64 // above (+) or below (−) the hub's plane
}

// Node is a node of the structure with its hub.
type Node struct {
	Label   string
	Axis    geom.Vec
	Valence int
	// Frame of the hub: Z the axis, X the first member (in label order)
	// projected on the plane normal to the axis, Y = Z × X.
	Frame geom.Frame
	Arms  []HubArm // in label order of the members
	Type  int      // index into the node types
}

// Hubs computes every node's hub frame and arms. Members must carry their
// labels.
func Hubs(n *geom.Net, topo *geom.Topology, axes []geom.Vec, ms []Member, labels []string) ([]Node, error) {
	out := make([]Node, len(n.Nodes))
	for i := range n.Nodes {
		es := append([]int(nil), topo.NodeEdges[i]...)
		sort.Slice(es, func(a, b int) bool { return ms[es[a]].Label < ms[es[b]].Label })
		nd := Node{Label: labels[i], Axis: axes[i], Valence: len(es)}
		if len(es) == 0 {
			return nil, nodeErr(n, i, "belongs to no member")
		}
		dirs := make([]geom.Vec, len(es))
		for k, e := range es {
			dirs[k] = r3.Unit(r3.Sub(n.Nodes[topo.Other(e, i)].Pos, n.Nodes[i].Pos))
		}
		fr, err := geom.PlaneFrame(n.Nodes[i].Pos, axes[i], dirs[0], degenerateUnit)
		if err != nil {
			return nil, nodeErr(n, i, "its first member runs along its axis")
		}
		nd.Frame = fr
		for k, d := range dirs {
			az := deg(math.Atan2(r3.Dot(d, fr.Y), r3.Dot(d, fr.X)))
			if az < 0 {
				az += 360
			}
			if az >= 360 {
				az -= 360
			}
			el := deg(math.Asin(math.Max(-1, math.Min(1, r3.Dot(d, fr.Z)))))
			nd.Arms = append(nd.Arms, HubArm{Member: es[k], AzimuthDeg: az, ElevationDeg: el})
		}
		out[i] = nd
	}
	return out, nil
}
