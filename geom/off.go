package geom

import (
	"fmt"
	"io"
	"strconv"
	"strings"
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

// ReadOFF reads an Object File Format net: a header keyword (counts may
// follow on the same line), a line "nodes faces [edges]", the node lines
// "x y z" and the face lines "k i1 ... ik" with 0-based node indices.
//
// The keywords OFF, COFF, NOFF, CNOFF and STOFF (and their combinations
// [ST][C][N]OFF) are read; the values they add after the coordinates
// (normals nx ny nz, a colour of up to four values, texture coordinates
// s t) are checked to be numbers and ignored, as is a colour of up to four
// values after a face's indices (plain OFF files often carry colours too).
// Binary OFF and the 4D and n-dimensional forms (4OFF, nOFF) are refused.
// The edge count is ignored. The file must hold exactly the declared nodes
// and faces: a file that ends early, and a non-blank, non-comment line
// after the last declared face, are errors naming the line.
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
	fl, msg := parseOFFKeyword(f[0])
	if msg != "" {
		return nil, inputErr(file, lr.line, "", "%s", msg)
	}
	f = f[1:]
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
	// Grow as lines arrive: a header may promise more than the file holds.
	n.Nodes = make([]Node, 0, min(nv, 1<<16))
	for i := 0; i < nv; i++ {
		id := strconv.Itoa(i + 1)
		s, ok := lr.next()
		if !ok {
			if _, err := fail(); err != nil {
				return nil, err
			}
			return nil, inputErr(file, lr.line, "node "+id, "file ends after %d of %d nodes", i, nv)
		}
		p, msg := parseOFFNode(strings.Fields(s), fl, unit)
		if msg != "" {
			return nil, inputErr(file, lr.line, "node "+id, "%s", msg)
		}
		n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Line: lr.line})
	}
	n.Faces = make([]Face, 0, min(nf, 1<<16))
	for i := 0; i < nf; i++ {
		id := strconv.Itoa(i + 1)
		s, ok := lr.next()
		if !ok {
			if _, err := fail(); err != nil {
				return nil, err
			}
			return nil, inputErr(file, lr.line, "panel "+id, "file ends after %d of %d faces (check the header's counts: %s, %s)", i, nf, plural(nv, "node"), plural(nf, "face"))
		}
		f := strings.Fields(s)
		corners, msg := parseOFFFace(f, nv)
		if msg != "" {
			if k, err := strconv.Atoi(f[0]); i == 0 && looksLikeNode(f) && (err != nil || k < MinCorners || k > MaxCorners) {
				msg += fmt.Sprintf(" (is this a node line? the header declares %s)", plural(nv, "node"))
			}
			return nil, inputErr(file, lr.line, "panel "+id, "%s", msg)
		}
		n.Faces = append(n.Faces, Face{ID: id, Corners: corners, Line: lr.line})
	}
	if _, ok := lr.next(); ok {
		return nil, inputErr(file, lr.line, "", "the header declares %s but more follow", plural(nf, "face"))
	}
	if _, err := fail(); err != nil {
		return nil, err
	}
	return finishRead(n, file)
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

// parseOFFNode reads a node line: x y z, then the values the flavour adds
// (ignored), or for plain OFF up to maxColourValues colour values.
func parseOFFNode(f []string, fl offFlavour, unit Unit) (Vec, string) {
	if len(f) < 3 {
		return Vec{}, "needs x y z"
	}
	p, err := parsePoint(f, unit)
	if err != nil {
		return Vec{}, err.Error()
	}
	need, want := 3, "x y z"
	if fl.normal {
		need, want = need+3, want+" nx ny nz"
	}
	if fl.texture {
		need, want = need+2, want+" s t"
	}
	if len(f) < need {
		return Vec{}, fmt.Sprintf("has %d values; %s wants %s", len(f), fl.name, want)
	}
	if len(f) > need+maxColourValues {
		return Vec{}, fmt.Sprintf("has %d values; %s wants %s, then at most %d colour values", len(f), fl.name, want, maxColourValues)
	}
	for k, v := range f[3:] {
		if _, ok := parsePlain(v); !ok {
			return Vec{}, fmt.Sprintf("value %d %s is not a number", k+4, quote(v))
		}
	}
	return p, ""
}

// parseOFFFace reads a face line "k i1 … ik" and up to maxColourValues
// colour values (ignored).
func parseOFFFace(f []string, nv int) ([]int, string) {
	if !isCount(f[0]) {
		return nil, fmt.Sprintf("bad corner count %s", quote(f[0]))
	}
	k, err := strconv.Atoi(f[0])
	if err != nil || k > MaxCorners {
		return nil, fmt.Sprintf("says %s corners; pqfab takes panels of %d to %d corners", short(f[0]), MinCorners, MaxCorners)
	}
	if len(f)-1 < k {
		return nil, fmt.Sprintf("says %d corners but lists %d", k, len(f)-1)
	}
	if extra := len(f) - 1 - k; extra > maxColourValues {
		return nil, fmt.Sprintf("%d values after the corners; at most %d colour values may follow", extra, maxColourValues)
	}
	for _, v := range f[1+k:] {
		if _, ok := parsePlain(v); !ok {
			return nil, fmt.Sprintf("colour value %s is not a number", quote(v))
		}
	}
	corners := make([]int, k)
	for j := range corners {
		idx, err := strconv.Atoi(f[1+j])
		if err != nil || !isInteger(f[1+j]) {
			return nil, fmt.Sprintf("corner %d: bad node index %s", j+1, quote(f[1+j]))
		}
		if idx < 0 || idx >= nv {
			return nil, fmt.Sprintf("corner %d: node index %d out of range 0..%d", j+1, idx, nv-1)
		}
		corners[j] = idx
	}
	if msg := checkFaceCorners(corners); msg != "" {
		return nil, msg
	}
	return corners, ""
}
