package nodes

import (
	"errors"
	"fmt"

	"pqfab/quadnet"
)

// ErrHubTooLarge is wrapped by errors for members the hubs use up.
var ErrHubTooLarge = errors.New("the hubs use up the member")

// nodeErr names node i of n: its file, line and id.
func nodeErr(n *quadnet.Net, i int, format string, args ...any) *quadnet.InputError {
	return &quadnet.InputError{File: n.Source, Line: n.Nodes[i].Line, Elem: "node " + n.Nodes[i].ID, Msg: fmt.Sprintf(format, args...)}
}

// memberErr names the member on edge e of n by its nodes, at the line of
// the first panel that has the edge (where the member is defined), and
// wraps cause (may be nil).
func memberErr(n *quadnet.Net, topo *quadnet.Topology, e int, cause error, format string, args ...any) *quadnet.InputError {
	ed := topo.Edges[e]
	line := 0
	if len(ed.Faces) > 0 {
		line = n.Faces[ed.Faces[0]].Line
	}
	elem := "member " + n.Nodes[ed.A].ID + "–" + n.Nodes[ed.B].ID
	if len(ed.Faces) > 0 {
		elem += " (edge of panel " + n.Faces[ed.Faces[0]].ID + ")"
	}
	return &quadnet.InputError{File: n.Source, Line: line, Elem: elem, Msg: fmt.Sprintf(format, args...), Err: cause}
}

// faceErr names face f of n.
func faceErr(n *quadnet.Net, f int, format string, args ...any) *quadnet.InputError {
	return &quadnet.InputError{File: n.Source, Line: n.Faces[f].Line, Elem: "panel " + n.Faces[f].ID, Msg: fmt.Sprintf(format, args...)}
}
