package quadnet

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"pqfab/geom"
)

// offFlavour is what an OFF header keyword adds to the node lines.
type offFlavour struct {
	name    string
	texture bool // ST: s t after the colour
	colour  bool // C: a colour after the coordinates (and normals)
	normal  bool // N: nx ny nz after the coordinates
}

// maxColourValues is the most values a colour takes in OFF (r g b a).
const maxColourValues = 4

// parseOFFKeyword reads a header keyword [ST][C][N][4][n]OFF.
func parseOFFKeyword(w string) (offFlavour, string) {
	fl := offFlavour{name: w}
	s := w
	fl.texture = strings.HasPrefix(s, "ST")
	s = strings.TrimPrefix(s, "ST")
	fl.colour = strings.HasPrefix(s, "C")
	s = strings.TrimPrefix(s, "C")
	fl.normal = strings.HasPrefix(s, "N")
	s = strings.TrimPrefix(s, "N")
	four := strings.HasPrefix(s, "4")
	s = strings.TrimPrefix(s, "4")
	ndim := strings.HasPrefix(s, "n")
	s = strings.TrimPrefix(s, "n")
	switch {
	case s != "OFF":
		return fl, fmt.Sprintf("header is %s, want OFF", quote(w))
	case four || ndim:
		return fl, fmt.Sprintf("header %s: pqfab reads 3D nets only (OFF, COFF, NOFF, CNOFF, STOFF), not 4D or n-dimensional ones", quote(w))
	}
	return fl, ""
}

// ReadOFF reads an Object File Format net as Geomview's description of the
// format gives it: a header keyword (counts may follow on the same line;
// the keyword is optional, and a file without it is plain OFF), the counts
// "nodes faces [edges]", the nodes and the faces.
//
// A node is x y z followed by the values its header keyword adds, in this
// order: normals nx ny nz (N), a colour (C), texture coordinates s t (ST).
// The keywords OFF, COFF, NOFF, CNOFF and STOFF (and the other combinations
// [ST][C][N]OFF) are read; the added values are checked to be numbers and
// ignored. A node's values are a run of numbers: a node starts on a new
// line and, where that line holds fewer values than the node needs, takes
// the rest from the lines that follow. Up to maxColourValues values left
// on the line where a node's values end are a colour (other tools write
// one after the coordinates whatever the keyword says, and COFF colours of
// three values as well as four) and ignored; so two nodes on one line are
// read as one node and its colour, and the counts then disagree.
//
// A face is "k i1 … ik" with 0-based node indices, followed by an optional
// colour of up to maxColourValues numbers that runs to the end of the line
// (ignored). The k indices may span lines: a face starts on a new line and
// its colour is what is left on the line of its last index.
//
// Binary OFF and the 4D and n-dimensional forms (4OFF, nOFF) are refused.
// The edge count is ignored. The file must hold exactly the declared nodes
// and faces: a file that ends early, and values after the last declared
// face, are errors. Errors name the line where the node or face starts.
//
// Lines may end in LF, CRLF or a lone CR; a byte-order mark at the start
// is skipped; '#' starts a comment. Counts beyond MaxNodes or MaxPanels
// are refused before anything is allocated for them. Node and face ids
// are their 1-based numbers.
func ReadOFF(r io.Reader, file string, unit Unit) (*Net, error) {
	n := &Net{Source: file, Unit: unit}
	lr := newLineReader(r, file)
	fail := func() (*Net, error) {
		if lr.err != nil {
			return nil, lr.err
		}
		return nil, nil
	}
	s, ok := lr.next()
	if !ok {
		if _, err := fail(); err != nil {
			return nil, err
		}
		return nil, &InputError{File: file, Msg: "no nodes and no panels (empty net)"}
	}
	f := strings.Fields(s)
	fl := offFlavour{name: "OFF"}
	if !isCount(f[0]) { // the keyword is optional: a file may start with its counts
		var msg string
		if fl, msg = parseOFFKeyword(f[0]); msg != "" {
			return nil, inputErr(file, lr.line, "", "%s", msg)
		}
		f = f[1:]
	}
	if len(f) > 0 && f[0] == "BINARY" {
		return nil, inputErr(file, lr.line, "", "binary OFF is not supported; save the net as text OFF")
	}
	if len(f) == 0 {
		if s, ok = lr.next(); !ok {
			if _, err := fail(); err != nil {
				return nil, err
			}
			return nil, inputErr(file, lr.line, "", "missing the counts line (nodes faces edges)")
		}
		f = strings.Fields(s)
	}
	if len(f) < 2 || len(f) > 3 || !isCount(f[0]) || !isCount(f[1]) || (len(f) == 3 && !isCount(f[2])) {
		return nil, inputErr(file, lr.line, "", "bad counts %s (want nodes faces edges)", quote(strings.Join(f, " ")))
	}
	nv, err1 := strconv.Atoi(f[0])
	nf, err2 := strconv.Atoi(f[1])
	switch {
	case err1 != nil || nv > MaxNodes:
		return nil, &InputError{File: file, Line: lr.line, Err: ErrTooLarge,
			Msg: fmt.Sprintf("the header declares %s nodes; pqfab takes at most %d", short(f[0]), MaxNodes)}
	case err2 != nil || nf > MaxPanels:
		return nil, &InputError{File: file, Line: lr.line, Err: ErrTooLarge,
			Msg: fmt.Sprintf("the header declares %s faces; pqfab takes at most %d", short(f[1]), MaxPanels)}
	}
	vs := &offValues{lr: lr}
	counts := fmt.Sprintf("check the header's counts: %s, %s", plural(nv, "node"), plural(nf, "face"))
	nodeHint := func(face int) string {
		if face > 0 {
			return ""
		}
		return fmt.Sprintf(" (is this a node line? the header declares %s)", plural(nv, "node"))
	}
	// Grow as nodes arrive: a header may promise more than the file holds.
	n.Nodes = make([]Node, 0, min(nv, 1<<16))
	for i := 0; i < nv; i++ {
		id := strconv.Itoa(i + 1)
		p, line, msg := readOFFNode(vs, fl, id, unit)
		if lr.err != nil {
			return nil, lr.err
		}
		if line == 0 {
			return nil, inputErr(file, lr.line, "node "+id, "file ends after %d of %d nodes (%s%s)", i, nv, counts, vs.span)
		}
		if msg != "" {
			return nil, inputErr(file, line, "node "+id, "%s", msg)
		}
		n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Line: line})
	}
	n.Faces = make([]Face, 0, min(nf, 1<<16))
	for i := 0; i < nf; i++ {
		id := strconv.Itoa(i + 1)
		corners, line, msg := readOFFFace(vs, nv, id, nodeHint(i))
		if lr.err != nil {
			return nil, lr.err
		}
		if line == 0 {
			return nil, inputErr(file, lr.line, "panel "+id, "file ends after %d of %d faces (%s%s)", i, nf, counts, vs.span)
		}
		if msg != "" {
			return nil, inputErr(file, line, "panel "+id, "%s", msg)
		}
		n.Faces = append(n.Faces, Face{ID: id, Corners: corners, Line: line})
	}
	if vs.begin() {
		return nil, inputErr(file, vs.line, "", "the header declares %s but more follow (%s%s)", plural(nf, "face"), counts, vs.span)
	}
	if _, err := fail(); err != nil {
		return nil, err
	}
	return finishRead(n, file)
}

// offValues hands out the values of an OFF file's nodes and faces. An
// element (a node or a face) starts on a new line and may take values from
// the lines after it.
type offValues struct {
	lr         *lineReader
	fields     []string // values left on the current line
	lineFields []string // every value of the current line
	line       int      // the current line
	// span says which element first took its values from more than one
	// line, for messages about counts that disagree.
	span string
}

// begin drops what is left of the current line and moves to the next line
// holding values; false at the end of the file.
func (v *offValues) begin() bool {
	v.fields = nil
	return v.fill()
}

// fill reads lines until one holds values; false at the end of the file.
func (v *offValues) fill() bool {
	for len(v.fields) == 0 {
		s, ok := v.lr.next()
		if !ok {
			return false
		}
		v.fields = strings.Fields(s)
		v.lineFields = v.fields
		v.line = v.lr.line
	}
	return true
}

// next returns the next value, reading on to the next line when the
// current one is used up; false at the end of the file.
func (v *offValues) next() (string, bool) {
	if !v.fill() {
		return "", false
	}
	s := v.fields[0]
	v.fields = v.fields[1:]
	return s, true
}

// rest returns the values left on the current line and drops them.
func (v *offValues) rest() []string {
	r := v.fields
	v.fields = nil
	return r
}

// spanned notes an element that took values from the lines from to v.line.
func (v *offValues) spanned(elem string, from int, what string) {
	if v.span == "" && v.line > from {
		v.span = fmt.Sprintf("; %s on line %d takes %s from lines %d to %d", elem, from, what, from, v.line)
	}
}

// looksLikeNode reports whether a line starts with three numbers.
func looksLikeNode(f []string) bool {
	if len(f) < 3 {
		return false
	}
	for _, v := range f[:3] {
		if _, ok := parsePlain(v); !ok {
			return false
		}
	}
	return true
}

// plural returns "1 face", "2 faces".
func plural(k int, noun string) string {
	if k == 1 {
		return "1 " + noun
	}
	return strconv.Itoa(k) + " " + noun + "s"
}

// isCount reports whether s is a non-negative decimal integer.
func isCount(s string) bool { return isInteger(s) && s[0] != '-' }

// values returns how many values a node of the flavour has before its
// colour, and their names: x y z, then nx ny nz (N), then s t (ST). The
// ST values follow the colour in the file, but every value after x y z is
// ignored, so only their number counts.
func (fl offFlavour) values() (int, string) {
	need, want := 3, "x y z"
	if fl.normal {
		need, want = need+3, want+" nx ny nz"
	}
	if fl.texture {
		need, want = need+2, want+" s t"
	}
	return need, want
}

// maxNodeValues is the most values a node has before its colour (x y z,
// nx ny nz, s t).
const maxNodeValues = 8

// readOFFNode reads the node that starts on the next line holding values:
// x y z and the values the flavour adds, from as many lines as they take,
// then up to maxColourValues colour values left on the line where they end
// (ignored). It returns the line the node starts on (0 at the end of the
// file) and a message for a bad node.
func readOFFNode(v *offValues, fl offFlavour, id string, unit Unit) (geom.Vec, int, string) {
	if !v.begin() {
		return geom.Vec{}, 0, ""
	}
	line := v.line
	need, want := fl.values()
	var buf [maxNodeValues]string
	vals := buf[:0]
	for len(vals) < need {
		s, ok := v.next()
		if !ok {
			return geom.Vec{}, line, fmt.Sprintf("file ends after %d of its %d values (%s wants %s)", len(vals), need, fl.name, want)
		}
		vals = append(vals, s)
	}
	p, err := parsePoint(vals, unit)
	if err != nil {
		return geom.Vec{}, line, err.Error()
	}
	extra := v.rest()
	if len(extra) > maxColourValues {
		return geom.Vec{}, line, fmt.Sprintf("has %d values; %s wants %s, then at most %d colour values", need+len(extra), fl.name, want, maxColourValues)
	}
	for k, s := range append(vals[3:], extra...) {
		if _, ok := parsePlain(s); !ok {
			return geom.Vec{}, line, fmt.Sprintf("value %d %s is not a number", k+4, quote(s))
		}
	}
	v.spanned("node "+id, line, fmt.Sprintf("its %d values (%s)", need, want))
	return p, line, ""
}

// readOFFFace reads the face that starts on the next line holding values:
// "k i1 … ik", the indices from as many lines as they take, then up to
// maxColourValues colour values left on the line of the last index
// (ignored). It returns the corners, the line the face starts on (0 at the
// end of the file) and a message for a bad face; nodeHint is added to a
// bad corner count on a line that looks like a node.
func readOFFFace(v *offValues, nv int, id, nodeHint string) ([]int, int, string) {
	if !v.begin() {
		return nil, 0, ""
	}
	line := v.line
	first := v.lineFields
	s, _ := v.next()
	hint := ""
	if looksLikeNode(first) {
		hint = nodeHint
	}
	if !isCount(s) {
		return nil, line, fmt.Sprintf("bad corner count %s%s", quote(s), hint)
	}
	k, err := strconv.Atoi(s)
	if err != nil || k > MaxCorners {
		return nil, line, fmt.Sprintf("says %s corners; pqfab takes panels of %d to %d corners%s", short(s), MinCorners, MaxCorners, hint)
	}
	if msg := checkCornerCount(k); msg != "" {
		return nil, line, msg + hint
	}
	corners := make([]int, k)
	for j := range corners {
		s, ok := v.next()
		if !ok {
			return nil, line, fmt.Sprintf("says %d corners but the file ends after %d", k, j)
		}
		at := ""
		if v.line != line {
			at = fmt.Sprintf(" (on line %d)", v.line)
		}
		idx, err := strconv.Atoi(s)
		if err != nil || !isInteger(s) {
			return nil, line, fmt.Sprintf("corner %d: bad node index %s%s", j+1, quote(s), at)
		}
		if idx < 0 || idx >= nv {
			return nil, line, fmt.Sprintf("corner %d: node index %d out of range 0..%d%s", j+1, idx, nv-1, at)
		}
		corners[j] = idx
	}
	colour := v.rest()
	if len(colour) > maxColourValues {
		return nil, line, fmt.Sprintf("%d values after the corners; at most %d colour values may follow", len(colour), maxColourValues)
	}
	for _, c := range colour {
		if _, ok := parsePlain(c); !ok {
			return nil, line, fmt.Sprintf("colour value %s is not a number", quote(c))
		}
	}
	if msg := checkFaceCorners(corners); msg != "" {
		return nil, line, msg
	}
	v.spanned("panel "+id, line, "its corners")
	return corners, line, ""
}
