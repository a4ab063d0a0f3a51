package geom

import (
	"io"
	"strconv"
	"strings"
)

// ReadOFF reads an Object File Format net: a header line "OFF" (counts may
// follow on the same line), a line "nodes faces edges", the node lines
// "x y z" and the face lines "k i1 ... ik" with 0-based node indices.
// Extra values after a node or face (colours) are ignored. Node and face
// ids are their 1-based numbers.
func ReadOFF(r io.Reader, file string, unit Unit) (*Net, error) {
	n := &Net{Source: file}
	lr := newLineReader(r, file)
	s, ok := lr.next()
	if !ok {
		if lr.err != nil {
			return nil, lr.err
		}
		return nil, &InputError{File: file, Msg: "no nodes and no panels (empty net)"}
	}
	f := strings.Fields(s)
	if f[0] != "OFF" {
		return nil, inputErr(file, lr.line, "", "header is %q, want OFF", f[0])
	}
	f = f[1:]
	if len(f) == 0 {
		if s, ok = lr.next(); !ok {
			if lr.err != nil {
				return nil, lr.err
			}
			return nil, inputErr(file, lr.line, "", "missing the counts line (nodes faces edges)")
		}
		f = strings.Fields(s)
	}
	if len(f) < 2 {
		return nil, inputErr(file, lr.line, "", "counts line needs nodes and faces")
	}
	nv, err1 := strconv.Atoi(f[0])
	nf, err2 := strconv.Atoi(f[1])
	if err1 != nil || err2 != nil || nv < 0 || nf < 0 {
		return nil, inputErr(file, lr.line, "", "bad counts %q", strings.Join(f, " "))
	}
	const maxCount = 1 << 26
	if nv > maxCount || nf > maxCount {
		return nil, inputErr(file, lr.line, "", "counts %d nodes, %d faces are beyond %d", nv, nf, maxCount)
	}
	n.Nodes = make([]Node, 0, min(nv, 1<<16))
	for i := 0; i < nv; i++ {
		id := strconv.Itoa(i + 1)
		s, ok := lr.next()
		if !ok {
			if lr.err != nil {
				return nil, lr.err
			}
			return nil, inputErr(file, lr.line, "node "+id, "file ends after %d of %d nodes", i, nv)
		}
		f := strings.Fields(s)
		if len(f) < 3 {
			return nil, inputErr(file, lr.line, "node "+id, "needs x y z")
		}
		p, err := parsePoint(f, unit)
		if err != nil {
			return nil, inputErr(file, lr.line, "node "+id, "%v", err)
		}
		n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Line: lr.line})
	}
	n.Faces = make([]Face, 0, min(nf, 1<<16))
	for i := 0; i < nf; i++ {
		id := strconv.Itoa(i + 1)
		s, ok := lr.next()
		if !ok {
			if lr.err != nil {
				return nil, lr.err
			}
			return nil, inputErr(file, lr.line, "panel "+id, "file ends after %d of %d faces", i, nf)
		}
		f := strings.Fields(s)
		k, err := strconv.Atoi(f[0])
		if err != nil || k < 0 {
			return nil, inputErr(file, lr.line, "panel "+id, "bad corner count %q", f[0])
		}
		if len(f)-1 < k {
			return nil, inputErr(file, lr.line, "panel "+id, "says %d corners but lists %d", k, len(f)-1)
		}
		corners := make([]int, k)
		for j := 0; j < k; j++ {
			idx, err := strconv.Atoi(f[1+j])
			if err != nil {
				return nil, inputErr(file, lr.line, "panel "+id, "corner %d: bad node index %q", j+1, f[1+j])
			}
			if idx < 0 || idx >= nv {
				return nil, inputErr(file, lr.line, "panel "+id, "corner %d: node index %d out of range 0..%d", j+1, idx, nv-1)
			}
			corners[j] = idx
		}
		if msg := checkFaceCorners(corners); msg != "" {
			return nil, inputErr(file, lr.line, "panel "+id, "%s", msg)
		}
		n.Faces = append(n.Faces, Face{ID: id, Corners: corners, Line: lr.line})
	}
	if lr.err != nil {
		return nil, lr.err
	}
	return finishRead(n, file)
}
