package quadnet

import (
	"io"
	"strconv"
	"strings"

	"pqfab/geom"
)

// ReadOBJ reads a Wavefront OBJ net: `v` nodes and `f` faces with corner
// references in the forms a, a/b, a//c and a/b/c, positive (1-based) or
// negative (relative to the nodes read so far). Comments, groups, objects,
// materials, smoothing, texture, normal, point and line statements are
// ignored; any other statement is an error.
//
// A `v` line holds exactly x y z, or x y z w (w, a weight for rational
// curves, is ignored), or x y z r g b (vertex colours, ignored); every
// value is a plain decimal number. Anything else, such as the words of a
// next statement after a lost line break ("v 1 2 3 f 1 2 3"), is an error
// naming the line and the node.
//
// Lines may end in LF, CRLF or a lone CR; a byte-order mark at the start
// is skipped. Input beyond MaxLineBytes, MaxLines, MaxNodes or MaxPanels
// stops the reader with an error. Node and face ids are their 1-based
// numbers in the file.
func ReadOBJ(r io.Reader, file string, unit Unit) (*Net, error) {
	n := &Net{Source: file, Unit: unit}
	lr := newLineReader(r, file)
	for {
		s, ok := lr.next()
		if !ok {
			break
		}
		f := strings.Fields(s)
		if f[len(f)-1] == `\` {
			return nil, inputErr(file, lr.line, "", `the line ends in \ (continued on the next line), which pqfab does not read: join the lines`)
		}
		switch f[0] {
		case "v":
			id := strconv.Itoa(len(n.Nodes) + 1)
			if len(n.Nodes) == MaxNodes {
				return nil, tooMany(file, lr.line, "node "+id, "nodes", MaxNodes)
			}
			p, msg := parseOBJVertex(f[1:], unit)
			if msg != "" {
				return nil, inputErr(file, lr.line, "node "+id, "%s", msg)
			}
			n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Line: lr.line})
		case "f":
			id := strconv.Itoa(len(n.Faces) + 1)
			if len(n.Faces) == MaxPanels {
				return nil, tooMany(file, lr.line, "panel "+id, "panels", MaxPanels)
			}
			if msg := checkCornerCount(len(f) - 1); msg != "" {
				return nil, inputErr(file, lr.line, "panel "+id, "%s", msg)
			}
			corners := make([]int, 0, len(f)-1)
			for k, ref := range f[1:] {
				idx, ok := parseOBJRef(ref)
				if !ok {
					return nil, inputErr(file, lr.line, "panel "+id, "corner %d: bad node reference %s", k+1, quote(ref))
				}
				switch {
				case idx > 0:
					idx--
				case idx < 0:
					idx += len(n.Nodes)
					if idx < 0 {
						return nil, inputErr(file, lr.line, "panel "+id, "corner %d: relative node %s reaches before the first node", k+1, short(ref))
					}
				default:
					return nil, inputErr(file, lr.line, "panel "+id, "corner %d: node 0 does not exist (OBJ counts from 1)", k+1)
				}
				corners = append(corners, idx)
			}
			if msg := checkFaceCorners(corners); msg != "" {
				return nil, inputErr(file, lr.line, "panel "+id, "%s", msg)
			}
			n.Faces = append(n.Faces, Face{ID: id, Corners: corners, Line: lr.line})
		case "vt", "vn", "vp", "g", "o", "s", "usemtl", "mtllib", "l", "p":
		default:
			return nil, inputErr(file, lr.line, "", "unknown OBJ statement %s", quote(f[0]))
		}
	}
	if lr.err != nil {
		return nil, lr.err
	}
	return finishRead(n, file)
}

const objVertexForms = "want x y z, x y z w or x y z r g b (a lost line break?)"

// parseOBJVertex reads the values after `v`: x y z, x y z w or x y z r g b.
func parseOBJVertex(vals []string, unit Unit) (geom.Vec, string) {
	if len(vals) < 3 {
		return geom.Vec{}, "needs x y z"
	}
	p, err := parsePoint(vals, unit)
	if err != nil {
		return geom.Vec{}, err.Error()
	}
	switch len(vals) {
	case 3, 4, 6:
	default:
		return geom.Vec{}, "has " + strconv.Itoa(len(vals)) + " values; " + objVertexForms
	}
	for k, v := range vals[3:] {
		if _, ok := parsePlain(v); !ok {
			return geom.Vec{}, "value " + strconv.Itoa(k+4) + " " + quote(v) + " is not a number; " + objVertexForms
		}
	}
	return p, ""
}

// parseOBJRef reads a corner reference a, a/b, a//c or a/b/c (decimal
// integers, a not empty) and returns a.
func parseOBJRef(ref string) (int, bool) {
	a, rest, slash := strings.Cut(ref, "/")
	if !isInteger(a) {
		return 0, false
	}
	if slash {
		b, c, slash2 := strings.Cut(rest, "/")
		switch {
		case slash2 && (!isInteger(c) || (b != "" && !isInteger(b))):
			return 0, false // a/b/c or a//c
		case !slash2 && !isInteger(b):
			return 0, false // a/b
		}
	}
	idx, err := strconv.Atoi(a)
	if err != nil {
		return 0, false
	}
	return idx, true
}

// isInteger reports whether s is a decimal integer with an optional sign.
func isInteger(s string) bool {
	if s != "" && (s[0] == '+' || s[0] == '-') {
		s = s[1:]
	}
	if s == "" {
		return false
	}
	for i := 0; i < len(s); i++ {
		if !isDigit(s[i]) {
			return false
		}
	}
	return true
}

// finishRead checks what every reader needs: something read, and every
// corner naming an existing node.
func finishRead(n *Net, file string) (*Net, error) {
	if len(n.Nodes) == 0 && len(n.Faces) == 0 {
		return nil, &InputError{File: file, Msg: "no nodes and no panels (empty net)"}
	}
	if len(n.Faces) == 0 {
		return nil, &InputError{File: file, Msg: "no panels (the file has nodes only)"}
	}
	for fi, face := range n.Faces {
		for k, c := range face.Corners {
			if c < 0 || c >= len(n.Nodes) {
				return nil, inputErr(file, face.Line, "panel "+n.Faces[fi].ID, "corner %d: node %d does not exist (the file has %d nodes)", k+1, c+1, len(n.Nodes))
			}
		}
	}
	return n, nil
}
