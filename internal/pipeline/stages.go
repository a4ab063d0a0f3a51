package pipeline

import (
	"fmt"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
)

// Structure cuts the plan of net into bays of bayMM and computes node
// axes, members, hubs, labels and member and node types (nodes.Build).
func Structure(net *geom.Net, topo *geom.Topology, opt nodes.Options, bayMM float64) (*nodes.Structure, geom.Bays, error) {
	bays, err := geom.NewBays(net.Positions(), bayMM, bayMM)
	if err != nil {
		return nil, bays, err
	}
	opt.Bays = bays
	st, err := nodes.Build(net, topo, opt)
	return st, bays, err
}

// NodeLabels returns the labels of a structure's nodes.
func NodeLabels(st *nodes.Structure) []string {
	out := make([]string, len(st.Nodes))
	for i, nd := range st.Nodes {
		out[i] = nd.Label
	}
	return out
}

// Panels lays every panel of net flat with material mat and labels it by
// its bay (panels.Labels, panels.Flatten).
func Panels(net *geom.Net, topo *geom.Topology, mat panels.Material, bays geom.Bays, nodeLabels []string) ([]panels.Flat, error) {
	return panels.Flatten(net, topo, mat, panels.Labels(net, bays, nodeLabels))
}

// Parts returns the cut outlines of flat panels as parts to nest; part i
// is panel i.
func Parts(flats []panels.Flat) []nest.Part {
	parts := make([]nest.Part, len(flats))
	for i, f := range flats {
		parts[i] = nest.Part{Label: f.Label, Outline: f.Cut}
	}
	return parts
}

// Nest places the parts on the stock sheets, reporting to obs as stage
// "nest".
func Nest(parts []nest.Part, stocks []nest.Stock, obs Observer) (*nest.Result, error) {
	obs.Step("nest", 0, 1, fmt.Sprintf("nest: %d panels on %d stock sizes", len(parts), len(stocks)))
	res, err := nest.Nest(parts, stocks)
	obs.Step("nest", 1, 1, "nest: done")
	return res, err
}
