package export

import (
	"bufio"
	"io"
	"strconv"
	"strings"

	"pqfab/export/internal/layout"
	"pqfab/quadnet"
)

// OBJDigits is the number of decimals written for OBJ coordinates (mm):
// 1e-4 mm, far below any fabrication tolerance.
const OBJDigits = 4

// WriteOBJ writes the net as Wavefront OBJ in millimetres, one `v` line per
// node and one `f` line per panel, in the net's order and with each
// panel's corners in the net's order: `v x y z` and `f a b c …` and
// nothing else, so that strict readers (which take a fourth number after
// `v` as a weight, and may not stop at `#`) read it. Node and panel ids go
// into comment lines of their own (`# node N12`, before the node's `v`
// line) only where they differ from the 1-based numbers; each warning
// becomes a comment line after the title. Text from the job and the net
// is kept to one line (oneLine), so it cannot add statements.
func WriteOBJ(w io.Writer, n *quadnet.Net, title string, warnings ...string) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	buf := make([]byte, 0, 128)
	buf = append(buf, "# "...)
	buf = append(buf, oneLine(title)...)
	buf = append(buf, '\n')
	for _, wn := range warnings {
		buf = append(append(append(buf, "# WARNING: "...), oneLine(wn)...), '\n')
	}
	buf = append(buf, "# units: mm, z up; written by pqfab\n"...)
	buf = strconv.AppendInt(append(buf, "# nodes: "...), int64(len(n.Nodes)), 10)
	buf = strconv.AppendInt(append(buf, ", panels: "...), int64(len(n.Faces)), 10)
	buf = append(buf, '\n')
	if _, err := bw.Write(buf); err != nil {
		return err
	}
	for i, nd := range n.Nodes {
		buf = buf[:0]
		if nd.ID != strconv.Itoa(i+1) {
			buf = append(buf, "# node "...)
			buf = append(buf, oneLine(nd.ID)...)
			buf = append(buf, '\n')
		}
		buf = append(buf, "v "...)
		buf = layout.AppendFixed(buf, nd.Pos.X, OBJDigits)
		buf = append(buf, ' ')
		buf = layout.AppendFixed(buf, nd.Pos.Y, OBJDigits)
		buf = append(buf, ' ')
		buf = layout.AppendFixed(buf, nd.Pos.Z, OBJDigits)
		buf = append(buf, '\n')
		if _, err := bw.Write(buf); err != nil {
			return err
		}
	}
	for i, f := range n.Faces {
		buf = buf[:0]
		if f.ID != strconv.Itoa(i+1) {
			buf = append(buf, "# panel "...)
			buf = append(buf, oneLine(f.ID)...)
			buf = append(buf, '\n')
		}
		buf = append(buf, 'f')
		for _, c := range f.Corners {
			buf = strconv.AppendInt(append(buf, ' '), int64(c+1), 10)
		}
		buf = append(buf, '\n')
		if _, err := bw.Write(buf); err != nil {
			return err
		}
	}
	return bw.Flush()
}

// oneLine makes s safe for one line of a text format (an OBJ comment, a
// progress message): control characters become spaces, so text from the
// job can never start a new line and add nodes or panels to a net file.
func oneLine(s string) string {
	return strings.Map(func(r rune) rune {
		if r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0) || r == '\u2028' || r == '\u2029' {
			return ' '
		}
		return r
	}, s)
}
