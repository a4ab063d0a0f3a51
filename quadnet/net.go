package quadnet

import (
	"math"
	"strconv"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// Node is a point of the net.
type Node struct {
	ID      string   // as given in the file (1-based index for OBJ and OFF)
	Pos     geom.Vec // millimetres
	Support bool     // fixed: never moved by planarization
	Line    int      // line in the source file, 0 if generated
}

// Face is a panel of the net: three to six node indices, counter-clockwise
// seen from above or outside.
type Face struct {
	ID      string
	Corners []int // indices into Net.Nodes
	Line    int   // line in the source file, 0 if generated
}

// Net is a panel net as read from a file: nodes and faces.
type Net struct {
	Source string // file the net came from, for messages
	// Unit is the unit the file was written in (positions are converted
	// to millimetres on reading); 0 for a net not read from a file, which
	// messages treat as mm.
	Unit  Unit
	Nodes []Node
	Faces []Face
}

// FaceNodes returns the node indices of face f.
func (n *Net) FaceNodes(f int) []int { return n.Faces[f].Corners }

// FacePoints appends the corner positions of face f to dst.
func (n *Net) FacePoints(dst []geom.Vec, f int) []geom.Vec {
	for _, c := range n.Faces[f].Corners {
		dst = append(dst, n.Nodes[c].Pos)
	}
	return dst
}

// Positions returns a copy of every node position.
func (n *Net) Positions() []geom.Vec {
	p := make([]geom.Vec, len(n.Nodes))
	for i, nd := range n.Nodes {
		p[i] = nd.Pos
	}
	return p
}

// Clone returns a deep copy of the net.
func (n *Net) Clone() *Net {
	c := &Net{Source: n.Source, Unit: n.Unit, Nodes: append([]Node(nil), n.Nodes...), Faces: make([]Face, len(n.Faces))}
	for i, f := range n.Faces {
		c.Faces[i] = Face{ID: f.ID, Line: f.Line, Corners: append([]int(nil), f.Corners...)}
	}
	return c
}

// Bounds returns the lower and upper corners of the bounding box of the
// nodes.
func (n *Net) Bounds() (lo, hi geom.Vec) {
	lo = geom.Vec{X: math.Inf(1), Y: math.Inf(1), Z: math.Inf(1)}
	hi = r3.Scale(-1, lo)
	for _, nd := range n.Nodes {
		p := nd.Pos
		lo = geom.Vec{X: math.Min(lo.X, p.X), Y: math.Min(lo.Y, p.Y), Z: math.Min(lo.Z, p.Z)}
		hi = geom.Vec{X: math.Max(hi.X, p.X), Y: math.Max(hi.Y, p.Y), Z: math.Max(hi.Z, p.Z)}
	}
	return lo, hi
}

// NodeName describes node i for messages: its id and source line.
func (n *Net) NodeName(i int) string { return elemName("node", n.Nodes[i].ID, n.Nodes[i].Line) }

// FaceName describes face f for messages: its id and source line.
func (n *Net) FaceName(f int) string { return elemName("panel", n.Faces[f].ID, n.Faces[f].Line) }

func elemName(kind, id string, line int) string {
	if line > 0 {
		return kind + " " + id + " (line " + strconv.Itoa(line) + ")"
	}
	return kind + " " + id
}
