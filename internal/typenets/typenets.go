// Package typenets gives the type tests of several packages the same nets:
// the samples, and canopies with their nodes moved a little (seeded).
package typenets

import (
	"fmt"
	"math/rand/v2"

	"pqfab/quadnet"
	"pqfab/samples"
)

// Named is a net with a name for test messages.
type Named struct {
	Name string
	Net  *quadnet.Net
}

// Nets returns the nets the type tests group: every sample of about
// panels panels, then k copies of the canopy of about canopyPanels panels
// with every node moved by up to ±2 mm in x, y and z (seeded), which
// splits types near their tolerances.
func Nets(panels, canopyPanels, k int, seed uint64) []Named {
	var nets []Named
	for _, name := range samples.Names() {
		n, _ := samples.Make(name, panels)
		nets = append(nets, Named{name, n})
	}
	rng := rand.New(rand.NewPCG(12, seed))
	for i := range k {
		n, _ := samples.Make("canopy", canopyPanels)
		for j := range n.Nodes {
			p := &n.Nodes[j].Pos
			p.X += 4 * (rng.Float64() - 0.5)
			p.Y += 4 * (rng.Float64() - 0.5)
			p.Z += 4 * (rng.Float64() - 0.5)
		}
		nets = append(nets, Named{fmt.Sprintf("canopy bumped %d", i), n})
	}
	return nets
}
