package pipeline

import (
	"fmt"
	"strings"

	"pqfab/geom"
)

// Loaded is a net read from a file and checked.
type Loaded struct {
	Net      *geom.Net
	Topo     *geom.Topology
	Warnings []string // what the checks found that the job goes on with
}

// LoadNet reads the net at path (OBJ, OFF or the nodes file of a CSV pair,
// in unit), checks it (geom.Validate with opt) and, when reorient is set,
// turns flipped panels to a consistent orientation. Nodes that belong to no
// panel are left out (with a warning), and the net is put in its canonical
// order (geom.Canonical): every later stage, and so every output, depends
// only on the geometry, never on the order of nodes and panels in the file
// or on which corner a panel starts at. On failure the error is a
// *geom.ValidationError listing every problem found, or the reader's
// *geom.InputError.
func LoadNet(open Opener, path string, unit geom.Unit, opt geom.ValidateOptions, reorient bool) (*Loaded, error) {
	net, err := geom.ReadFrom(open, path, unit)
	if err != nil {
		return nil, err
	}
	_, fd := geom.Validate(net, opt)
	var warnings []string
	if reorient && len(fd.Misoriented) > 0 {
		geom.Reorient(net, fd.Misoriented)
		warnings = append(warnings, fmt.Sprintf("%s: turned %d panels to a consistent orientation", net.Source, len(fd.Misoriented)))
		_, fd = geom.Validate(net, opt)
	}
	for _, w := range fd.Warnings {
		warnings = append(warnings, w.Error())
	}
	if err := fd.Err(); err != nil {
		return nil, err
	}
	if kept, dropped := geom.DropUnused(net); len(dropped) > 0 {
		net = kept
	}
	net, _, _ = geom.Canonical(net)
	return &Loaded{Net: net, Topo: geom.BuildTopology(net), Warnings: warnings}, nil
}

// Supports returns a flag per node: true for nodes that never move. mode
// is "boundary" (nodes on the net's boundary), "none", "file" (the support
// column of a CSV net) or "list" with the node ids in ids.
func Supports(mode string, ids []string, net *geom.Net, topo *geom.Topology) ([]bool, error) {
	fixed := make([]bool, len(net.Nodes))
	switch mode {
	case "none":
	case "boundary":
		copy(fixed, topo.BoundaryNodes(len(net.Nodes)))
	case "file":
		n := 0
		for i, nd := range net.Nodes {
			fixed[i] = nd.Support
			if nd.Support {
				n++
			}
		}
		if n == 0 {
			return nil, fmt.Errorf("\"file\" takes the supports from the net, but %s marks no node as a support (a support column of 1, true or yes in the nodes CSV)", net.Source)
		}
	case "list":
		byID := make(map[string]int, len(net.Nodes))
		for i, nd := range net.Nodes {
			byID[nd.ID] = i
		}
		for _, id := range ids {
			id = strings.TrimSpace(id)
			i, ok := byID[id]
			if !ok {
				return nil, fmt.Errorf("node %q is not in %s", short(id), net.Source)
			}
			fixed[i] = true
		}
	default:
		return nil, fmt.Errorf("%q: want boundary, none, file or list", short(mode))
	}
	return fixed, nil
}

// short cuts a value for a message to at most 32 characters.
func short(s string) string {
	if r := []rune(s); len(r) > 32 {
		return string(r[:32]) + "…"
	}
	return s
}
