package panels

import (
	"pqfab/geom"
	"pqfab/quadnet"
)

// Labels names every panel by the bay of its centroid (C3-P05), using the
// same bays as nodes and members.
func Labels(n *quadnet.Net, bays quadnet.Bays, nodeLabels []string) []string {
	cents := make([]geom.Vec, len(n.Faces))
	keys := make([]string, len(n.Faces))
	var pts []geom.Vec
	for f, face := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		cents[f] = geom.Centroid(pts)
		key := ""
		for _, c := range face.Corners {
			key += nodeLabels[c] + "/"
		}
		keys[f] = key
	}
	return bays.Label(cents, keys, "P")
}
