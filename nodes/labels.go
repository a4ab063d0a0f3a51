package nodes

import (
	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Labels names every node (C3-07) and member (C3-M12) by its plan bay
// (see quadnet.Bays); members take the bay of their midpoint.
func Labels(n *quadnet.Net, topo *quadnet.Topology, bays quadnet.Bays) (nodeLabels, memberLabels []string) {
	pts := n.Positions()
	keys := make([]string, len(n.Nodes))
	for i, nd := range n.Nodes {
		keys[i] = nd.ID
	}
	nodeLabels = bays.Label(pts, keys, "")
	mid := make([]geom.Vec, len(topo.Edges))
	mkeys := make([]string, len(topo.Edges))
	for k, e := range topo.Edges {
		mid[k] = r3.Scale(0.5, r3.Add(pts[e.A], pts[e.B]))
		a, b := nodeLabels[e.A], nodeLabels[e.B]
		if b < a {
			a, b = b, a
		}
		mkeys[k] = a + "/" + b
	}
	memberLabels = bays.Label(mid, mkeys, "M")
	return nodeLabels, memberLabels
}
