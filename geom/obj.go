package geom

import (
	"io"
	"strconv"
	"strings"
)

// ReadOBJ reads a Wavefront OBJ net: `v x y z` nodes and `f` faces with
// corner references in the forms a, a/b, a//c and a/b/c, positive (1-based)
// or negative (relative to the nodes read so far). Comments, groups,
// objects, materials, smoothing, texture and normal lines are ignored.
// Node and face ids are their 1-based numbers in the file.
func ReadOBJ(r io.Reader, file string, unit Unit) (*Net, error) {
	n := &Net{Source: file}
	lr := newLineReader(r, file)
	for {
		s, ok := lr.next()
		if !ok {
			break
		}
		f := strings.Fields(s)
		switch f[0] {
		case "v":
			id := strconv.Itoa(len(n.Nodes) + 1)
			if len(f) < 4 {
				return nil, inputErr(file, lr.line, "node "+id, "needs x y z")
			}
			p, err := parsePoint(f[1:4], unit)
			if err != nil {
				return nil, inputErr(file, lr.line, "node "+id, "%v", err)
			}
			n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Line: lr.line})
		case "f":
			id := strconv.Itoa(len(n.Faces) + 1)
			corners := make([]int, 0, len(f)-1)
			for k, ref := range f[1:] {
				if j := strings.IndexByte(ref, '/'); j >= 0 {
					ref = ref[:j]
				}
				idx, err := strconv.Atoi(ref)
				if err != nil {
					return nil, inputErr(file, lr.line, "panel "+id, "corner %d: bad node reference %q", k+1, f[k+1])
				}
				switch {
				case idx > 0:
					idx--
				case idx < 0:
					idx += len(n.Nodes)
					if idx < 0 {
						return nil, inputErr(file, lr.line, "panel "+id, "corner %d: relative node %s reaches before the first node", k+1, ref)
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
			return nil, inputErr(file, lr.line, "", "unknown OBJ statement %q", f[0])
		}
	}
	if lr.err != nil {
		return nil, lr.err
	}
	return finishRead(n, file)
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
