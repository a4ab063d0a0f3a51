package pipeline

import (
	"fmt"
	"slices"
	"strings"

	"pqfab/internal/job"
	"pqfab/quadnet"
)

// Loaded is a net read from a file and checked.
type Loaded struct {
	Net      *quadnet.Net // in canonical order (quadnet.Canonical)
	Topo     *quadnet.Topology
	Warnings []string   // what the checks found that the job goes on with
	Order    *FileOrder // maps Net back to the file's order
}

// FileOrder maps a loaded net, which is in canonical order, back to the
// order of the file it was read from: the file's nodes and panels in the
// file's order, every panel starting at the file's first corner. The
// nets a design team gets back (net-flat.obj, planarize -o) are written
// in this order, so that node i and panel j of the output are node i and
// panel j of the file.
type FileOrder struct {
	// Nodes[i] is the index in the loaded net of the file's node i, or -1
	// for a node in no panel (left out of the loaded net).
	Nodes []int
	// Faces[j] is the index in the loaded net of the file's panel j, and
	// Start[j] the corner of that panel the file's panel j starts at.
	Faces, Start []int
	left         map[int]quadnet.Node // the file's nodes in no panel, by index in the file
}

// newFileOrder returns the order of file, the net as read (after turning
// flipped panels, which keeps each panel's first corner), given the nodes
// DropUnused left out of it (sorted) and c, the kept net in canonical
// order with nodeFrom and faceFrom from quadnet.Canonical.
func newFileOrder(file *quadnet.Net, dropped []int, c *quadnet.Net, nodeFrom, faceFrom []int) *FileOrder {
	o := &FileOrder{Nodes: make([]int, len(file.Nodes)), Faces: make([]int, len(file.Faces)), Start: make([]int, len(file.Faces)),
		left: make(map[int]quadnet.Node, len(dropped))}
	canonOf := make([]int, len(nodeFrom)) // node k of the kept net is node canonOf[k] of c
	for ci, k := range nodeFrom {
		canonOf[k] = ci
	}
	k := 0 // DropUnused keeps the other nodes in the file's order
	for i := range file.Nodes {
		if len(dropped) > 0 && dropped[0] == i {
			dropped = dropped[1:]
			o.Nodes[i] = -1
			o.left[i] = file.Nodes[i]
			continue
		}
		o.Nodes[i] = canonOf[k]
		k++
	}
	for ci, f := range faceFrom { // DropUnused keeps every panel, in the file's order
		o.Faces[f] = ci
		first := o.Nodes[file.Faces[f].Corners[0]]
		o.Start[f] = slices.Index(c.Faces[ci].Corners, first)
	}
	return o
}

// Apply returns net, the loaded net or one with its nodes moved (Moved),
// in the file's order: node i and panel j are the file's node i and panel
// j, every panel starts at the file's first corner. The file's nodes in no
// panel come back where the file has them.
func (o *FileOrder) Apply(net *quadnet.Net) *quadnet.Net {
	out := &quadnet.Net{Source: net.Source, Unit: net.Unit, Nodes: make([]quadnet.Node, len(o.Nodes)), Faces: make([]quadnet.Face, len(o.Faces))}
	fileOf := make([]int, len(net.Nodes))
	for i, ci := range o.Nodes {
		if ci < 0 {
			out.Nodes[i] = o.left[i]
			continue
		}
		out.Nodes[i] = net.Nodes[ci]
		fileOf[ci] = i
	}
	for j, ci := range o.Faces {
		f := net.Faces[ci]
		k := len(f.Corners)
		corners := make([]int, k)
		for m := range corners {
			corners[m] = fileOf[f.Corners[(o.Start[j]+m)%k]]
		}
		out.Faces[j] = quadnet.Face{ID: f.ID, Line: f.Line, Corners: corners}
	}
	return out
}

// LoadNet reads the net at path (OBJ, OFF or the nodes file of a CSV pair,
// in unit), checks it (quadnet.Validate with opt) and, when reorient is set,
// turns flipped panels to a consistent orientation. Nodes that belong to no
// panel are left out (with a warning), and the net is put in its canonical
// order (quadnet.Canonical): every later stage depends only on the geometry,
// never on the order of nodes and panels in the file or on which corner a
// panel starts at. Order maps the net back to the file's order, which the
// nets written back to the design team keep (Result.FileNet); every other
// output is independent of it. On failure the error is a
// *quadnet.ValidationError listing every problem found, or the reader's
// *quadnet.InputError.
func LoadNet(open Opener, path string, unit quadnet.Unit, opt quadnet.ValidateOptions, reorient bool) (*Loaded, error) {
	net, err := quadnet.ReadFrom(open, path, unit)
	if err != nil {
		return nil, err
	}
	_, fd := quadnet.Validate(net, opt)
	var warnings []string
	if reorient && len(fd.Misoriented) > 0 {
		quadnet.Reorient(net, fd.Misoriented)
		warnings = append(warnings, fmt.Sprintf("%s: turned %d panels to a consistent orientation", net.Source, len(fd.Misoriented)))
		_, fd = quadnet.Validate(net, opt)
	}
	for _, w := range fd.Warnings {
		warnings = append(warnings, w.Error())
	}
	if err := fd.Err(); err != nil {
		return nil, err
	}
	kept, dropped := quadnet.DropUnused(net)
	c, nodeFrom, faceFrom := quadnet.Canonical(kept)
	order := newFileOrder(net, dropped, c, nodeFrom, faceFrom)
	return &Loaded{Net: c, Topo: quadnet.BuildTopology(c), Warnings: warnings, Order: order}, nil
}

// Supports returns a flag per node: true for nodes that never move. mode
// is "boundary" (nodes on the net's boundary), "none", "file" (the support
// column of a CSV net) or "list" with the node ids in ids.
func Supports(mode string, ids []string, net *quadnet.Net, topo *quadnet.Topology) ([]bool, error) {
	fixed := make([]bool, len(net.Nodes))
	switch mode {
	case job.SupportsNone:
	case job.SupportsBoundary:
		copy(fixed, topo.BoundaryNodes(len(net.Nodes)))
	case job.SupportsFile:
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
	case job.SupportsList:
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
