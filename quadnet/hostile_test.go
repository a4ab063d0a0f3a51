package quadnet

import (
	"errors"
	"io"
	"runtime"
	"strconv"
	"strings"
	"testing"

	"pqfab/geom"
)

// TestPlainNumbers checks the number syntax the readers take: plain
// decimals only (sign, digits, point, exponent).
func TestPlainNumbers(t *testing.T) {
	tests := []struct {
		in   string
		want float64
		ok   bool
	}{
		{"0", 0, true},
		{"-12", -12, true},
		{"+12", 12, true},
		{"1.5", 1.5, true},
		{".5", 0.5, true},
		{"5.", 5, true},
		{"-.5e3", -500, true},
		{"1E-2", 0.01, true},
		{"1e+2", 100, true},
		{"0x1p3", 0, false},
		{"0X10", 0, false},
		{"1_000", 0, false},
		{"1e", 0, false},
		{"e5", 0, false},
		{".", 0, false},
		{"-", 0, false},
		{"1.2.3", 0, false},
		{"--1", 0, false},
		{"1e5.0", 0, false},
		{"Inf", 0, false},
		{"NaN", 0, false},
		{"infinity", 0, false},
		{"١٢", 0, false}, // Arabic-Indic digits
		{"", 0, false},
	}
	for _, tc := range tests {
		got, ok := parsePlain(tc.in)
		if ok != tc.ok || (ok && got != tc.want) {
			t.Errorf("parsePlain(%q) = %g, %v; want %g, %v", tc.in, got, ok, tc.want, tc.ok)
		}
	}
}

// TestCoordMessages checks the message for each kind of bad coordinate.
func TestCoordMessages(t *testing.T) {
	tests := []struct{ in, want string }{
		{"Inf", `coordinate "Inf" is not a finite number`},
		{"-infinity", `coordinate "-infinity" is not a finite number`},
		{"nan", `coordinate "nan" is not a finite number`},
		{"0x1p3", `bad number "0x1p3" (want a plain decimal such as -12.5 or 1.25e3)`},
		{"1_000", `bad number "1_000" (want a plain decimal such as -12.5 or 1.25e3)`},
		{"1e400", `coordinate 1e400 mm is beyond 100 km (wrong unit?)`},
		{strings.Repeat("9", 100) + "x", `bad number "99999999999999999999999999999999…" (want a plain decimal such as -12.5 or 1.25e3)`},
		{strings.Repeat("9", 100), `coordinate 99999999999999999999999999999999… mm is beyond 100 km (wrong unit?)`},
	}
	for _, tc := range tests {
		_, err := parseCoord(tc.in, MM)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%q: got %v, want %s", tc.in, err, tc.want)
		}
	}
}

func TestOBJVertexForms(t *testing.T) {
	src := "v 0 0 0 1\nv 1 0 0 0.5 0.5 0.5\nv 1 1 0\nf 1 2 3\n"
	n, err := ReadOBJ(strings.NewReader(src), "w.obj", M)
	if err != nil {
		t.Fatal(err)
	}
	if len(n.Nodes) != 3 || n.Nodes[1].Pos.X != 1000 || n.Nodes[0].Pos != (geom.Vec{}) {
		t.Errorf("got %+v", n.Nodes)
	}
	for _, bad := range []struct{ src, want string }{
		{"v 0 0 0 f\n", "w.obj:1: node 1: value 4 \"f\" is not a number; want x y z, x y z w or x y z r g b (a lost line break?)"},
		{"v 0 0 0 1 2\n", "w.obj:1: node 1: has 5 values; want x y z, x y z w or x y z r g b (a lost line break?)"},
		{"v 0 0 0 f 1 2 3\n", "w.obj:1: node 1: has 7 values; want x y z, x y z w or x y z r g b (a lost line break?)"},
	} {
		_, err := ReadOBJ(strings.NewReader(bad.src), "w.obj", MM)
		if err == nil || err.Error() != bad.want {
			t.Errorf("%q: got %v\nwant %s", bad.src, err, bad.want)
		}
	}
}

// TestLineEnds reads one net written with LF, CRLF and CR-only line ends,
// with and without a byte-order mark: every reading gives the same nodes,
// panels and line numbers.
func TestLineEnds(t *testing.T) {
	formats := []struct {
		name, src          string
		nodeLine, faceLine int // of node 3 and panel 1
		read               func(string) (*Net, error)
	}{
		{"obj", "# net\nv 0 0 0\nv 1000 0 0\n\nv 1000 1000 0\nv 0 1000 0\nf 1 2 3 4\n", 5, 7,
			func(s string) (*Net, error) { return ReadOBJ(strings.NewReader(s), "n.obj", MM) }},
		{"off", "OFF\n# net\n4 1 0\n0 0 0\n1000 0 0\n\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n", 7, 9,
			func(s string) (*Net, error) { return ReadOFF(strings.NewReader(s), "n.off", MM) }},
		{"csv", "id,x,y,z\n# net\nA,0,0,0\nB,1000,0,0\n\nC,1000,1000,0\nD,0,1000,0\n", 6, 3,
			func(s string) (*Net, error) {
				return ReadCSV(strings.NewReader(s), "n-nodes.csv", strings.NewReader("id,a,b,c,d\r\n\r\nP,A,B,C,D"), "n-panels.csv", MM)
			}},
	}
	for _, f := range formats {
		want, err := f.read(f.src)
		if err != nil {
			t.Fatal(f.name, err)
		}
		if want.Nodes[2].Line != f.nodeLine || want.Faces[0].Line != f.faceLine {
			t.Errorf("%s: lines node %d face %d", f.name, want.Nodes[2].Line, want.Faces[0].Line)
		}
		for _, v := range []struct{ name, bom, nl string }{{"CRLF", "", "\r\n"}, {"CR", "", "\r"}, {"BOM", "\ufeff", "\n"}, {"BOM CR", "\ufeff", "\r"}} {
			got, err := f.read(v.bom + strings.ReplaceAll(f.src, "\n", v.nl))
			if err != nil {
				t.Errorf("%s %s: %v", f.name, v.name, err)
				continue
			}
			if !sameNet(got, want) {
				t.Errorf("%s %s: got %+v\nwant %+v", f.name, v.name, got, want)
			}
		}
	}
	// A CRLF pair split across two reads still counts as one line end.
	src := "v 0 0 0\r\nv 1000 0 0\r\nv 0 1000 0\r\nf 1 2 3\r\nx\r\n"
	_, err := ReadOBJ(&oneByte{strings.NewReader(src)}, "b.obj", MM)
	if err == nil || !strings.HasPrefix(err.Error(), "b.obj:5: ") {
		t.Errorf("byte by byte: got %v, want an error on line 5", err)
	}
}

// oneByte returns one byte per Read.
type oneByte struct{ r io.Reader }

func (o *oneByte) Read(p []byte) (int, error) {
	if len(p) == 0 {
		return 0, nil
	}
	return o.r.Read(p[:1])
}

func sameNet(a, b *Net) bool {
	if len(a.Nodes) != len(b.Nodes) || len(a.Faces) != len(b.Faces) {
		return false
	}
	for i := range a.Nodes {
		if a.Nodes[i] != b.Nodes[i] {
			return false
		}
	}
	for i := range a.Faces {
		if a.Faces[i].ID != b.Faces[i].ID || a.Faces[i].Line != b.Faces[i].Line || !equalInts(a.Faces[i].Corners, b.Faces[i].Corners) {
			return false
		}
	}
	return true
}

// TestOFFVariants reads the OFF flavours that add values to the lines:
// each gives the plain OFF net.
func TestOFFVariants(t *testing.T) {
	plain := "OFF\n4 1 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"
	want, err := ReadOFF(strings.NewReader(plain), "v.off", MM)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct{ name, src string }{
		{"COFF rgba", "COFF\n4 1 0\n0 0 0 255 0 0 255\n1000 0 0 0 255 0 255\n1000 1000 0 0 0 255 255\n0 1000 0 1 1 1 1\n4 0 1 2 3 0.5 0.5 0.5 1\n"},
		{"COFF rgb", "COFF\n4 1 0\n0 0 0 1 0 0\n1000 0 0 0 1 0\n1000 1000 0 0 0 1\n0 1000 0 1 1 1\n4 0 1 2 3 1 0 0\n"},
		{"NOFF", "NOFF\n4 1 0\n0 0 0 0 0 1\n1000 0 0 0 0 1\n1000 1000 0 0 0 1\n0 1000 0 0 0 1\n4 0 1 2 3\n"},
		{"CNOFF", "CNOFF\n4 1 0\n0 0 0 0 0 1 1 0 0 1\n1000 0 0 0 0 1 1 0 0 1\n1000 1000 0 0 0 1 1 0 0 1\n0 1000 0 0 0 1 1 0 0 1\n4 0 1 2 3\n"},
		{"STOFF", "STOFF\n4 1 0\n0 0 0 0 0\n1000 0 0 1 0\n1000 1000 0 1 1\n0 1000 0 0 1\n4 0 1 2 3\n"},
		{"counts on header line", "OFF 4 1 0\n\n\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"},
		{"no edge count", "OFF\n4 1\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"},
		// The keyword is optional (geomview manual, "OFF Files").
		{"no keyword", "# square\n4 1 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n"},
	}
	for _, tc := range tests {
		got, err := ReadOFF(strings.NewReader(tc.src), "v.off", MM)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		for i := range want.Nodes {
			if got.Nodes[i].Pos != want.Nodes[i].Pos {
				t.Errorf("%s: node %d at %v want %v", tc.name, i, got.Nodes[i].Pos, want.Nodes[i].Pos)
			}
		}
		if len(got.Faces) != 1 || !equalInts(got.Faces[0].Corners, want.Faces[0].Corners) {
			t.Errorf("%s: faces %+v", tc.name, got.Faces)
		}
	}
	for _, bad := range []struct{ src, want string }{
		// A node's values run on over lines, so lines of x y z under NOFF
		// are read as halves of nodes, and the counts then disagree.
		{"NOFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 2\n", "v.off:6: node 3: file ends after 2 of 3 nodes (check the header's counts: 3 nodes, 1 face; node 1 on line 3 takes its 6 values (x y z nx ny nz) from lines 3 to 4)"},
		{"STOFF\n3 1 0\n0 0 0 0 0\n1 0 0\n0 1 0 1 1\n3 0 1 2\n", "v.off:6: node 3: file ends after 4 of its 5 values (STOFF wants x y z s t)"},
		{"OFF\n3 1 0 9\n", `v.off:2: bad counts "3 1 0 9" (want nodes faces edges)`},
		{"OFF\n3 1 0\n0 0 0 1 2 3 4 5\n", "v.off:3: node 1: has 8 values; OFF wants x y z, then at most 4 colour values"},
		{"OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 2 9 9 9 9 9\n", "v.off:6: panel 1: 5 values after the corners; at most 4 colour values may follow"},
		{"OFF\n3 1 0\n0 0 0\n1 0 0\n0 1 0\n3 0 1 2 red\n", `v.off:6: panel 1: colour value "red" is not a number`},
	} {
		_, err := ReadOFF(strings.NewReader(bad.src), "v.off", MM)
		if err == nil || err.Error() != bad.want {
			t.Errorf("%q: got %v\nwant %s", bad.src, err, bad.want)
		}
	}
}

// endless yields head, then rows row(1), row(2), … without end.
type endless struct {
	head string
	row  func(i int) string
	i    int
	buf  []byte
}

func (e *endless) Read(p []byte) (int, error) {
	if len(e.buf) == 0 {
		if e.i == 0 {
			e.buf = []byte(e.head)
		} else {
			e.buf = []byte(e.row(e.i))
		}
		e.i++
	}
	n := copy(p, e.buf)
	e.buf = e.buf[n:]
	return n, nil
}

// TestLimits feeds endless streams and a huge line: each reader stops at
// its limit with a message naming the line and the limit.
func TestLimits(t *testing.T) {
	t.Run("long line", func(t *testing.T) {
		long := "# " + strings.Repeat("x", MaxLineBytes) + "\n"
		for _, tc := range []struct {
			head string
			read func(io.Reader) error
		}{
			{"v 0 0 0\nv 1 0 0\n", func(r io.Reader) error { _, err := ReadOBJ(r, "l.obj", MM); return err }},
			{"OFF\n3 1 0\n", func(r io.Reader) error { _, err := ReadOFF(r, "l.obj", MM); return err }},
			{"id,x,y,z\n1,0,0,0\n", func(r io.Reader) error {
				_, err := ReadCSV(r, "l.obj", strings.NewReader("id\n"), "p.csv", MM)
				return err
			}},
		} {
			err := tc.read(strings.NewReader(tc.head + long + "f 1 2 3\n"))
			want := "l.obj:3: line is longer than 1048576 bytes (1 MiB); is this a net file?"
			if err == nil || err.Error() != want {
				t.Errorf("got %v\nwant %s", err, want)
			}
			if !errors.Is(err, ErrTooLarge) {
				t.Errorf("%v does not wrap ErrTooLarge", err)
			}
		}
	})
	t.Run("long line, CR line ends", func(t *testing.T) {
		src := "v 0 0 0\rv 1 0 0\r\n" + strings.Repeat("x", MaxLineBytes+1) + "\rf 1 2 3\r"
		_, err := ReadOBJ(strings.NewReader(src), "l.obj", MM)
		if want := "l.obj:3: line is longer than 1048576 bytes (1 MiB); is this a net file?"; err == nil || err.Error() != want {
			t.Errorf("got %v\nwant %s", err, want)
		}
	})
	t.Run("file size", func(t *testing.T) {
		// The mechanism, with a small limit: MaxFileBytes itself is 1 GiB.
		tr := newTextReader(&endless{row: func(int) string { return "# 0123456789\n" }}, "big.obj")
		tr.maxBytes = 1000
		_, err := io.ReadAll(tr)
		if want := "big.obj:77: the file is larger than 1000 bytes, the most pqfab reads"; err == nil || err.Error() != want || !errors.Is(err, ErrTooLarge) {
			t.Errorf("got %v\nwant %s", err, want)
		}
		if got := byteSize(MaxFileBytes); got != "1 GiB" {
			t.Errorf("MaxFileBytes is %s", got)
		}
	})
	t.Run("endless CSV nodes", func(t *testing.T) {
		nodes := &endless{head: "id,x,y,z\n", row: func(i int) string { return strconv.Itoa(i) + "," + strconv.Itoa(i) + ",0,0\n" }}
		_, err := ReadCSV(nodes, "s-nodes.csv", strings.NewReader("id,a,b,c\n"), "s-panels.csv", MM)
		want := "s-nodes.csv:1000002: node 1000001: more than 1000000 nodes, the most pqfab takes"
		if err == nil || err.Error() != want {
			t.Errorf("got %v\nwant %s", err, want)
		}
	})
	t.Run("endless OBJ panels", func(t *testing.T) {
		src := &endless{head: "v 0 0 0\nv 1 0 0\nv 0 1 0\n", row: func(int) string { return "f 1 2 3\n" }}
		_, err := ReadOBJ(src, "s.obj", MM)
		want := "s.obj:500004: panel 500001: more than 500000 panels, the most pqfab takes"
		if err == nil || err.Error() != want {
			t.Errorf("got %v\nwant %s", err, want)
		}
	})
	t.Run("endless comments", func(t *testing.T) {
		src := &endless{head: "", row: func(int) string { return "#\n\n\n\n\n\n\n\n\n\n\n\n\n\n\n\n" }}
		_, err := ReadOBJ(src, "c.obj", MM)
		want := "c.obj:10000001: more than 10000000 lines, the most pqfab reads"
		if err == nil || err.Error() != want {
			t.Errorf("got %v\nwant %s", err, want)
		}
	})
	t.Run("OFF header counts", func(t *testing.T) {
		// Counts within the limits allocate nothing up front: a file that
		// ends early costs little memory whatever its header says.
		var m0, m1 runtime.MemStats
		runtime.ReadMemStats(&m0)
		_, err := ReadOFF(strings.NewReader("OFF\n1000000 500000 0\n0 0 0\n"), "h.off", MM)
		runtime.ReadMemStats(&m1)
		if err == nil || !strings.Contains(err.Error(), "h.off:3: node 2: file ends after 1 of 1000000 nodes") {
			t.Errorf("got %v", err)
		}
		if got := m1.TotalAlloc - m0.TotalAlloc; got > 16<<20 {
			t.Errorf("allocated %d bytes for a three-line file", got)
		}
	})
}

// TestShortQuotes: error messages quote at most a short prefix of a value.
func TestShortQuotes(t *testing.T) {
	long := strings.Repeat("é", 40)
	cut := strings.Repeat("é", 32) + "…"
	tests := []struct{ src, want string }{
		{"v 0 0 0\n" + long + " 1 2\n", `q.obj:2: unknown OBJ statement "` + cut + `"`},
		{"v 0 0 0\nf 1 2 " + long + "\n", `q.obj:2: panel 1: corner 3: bad node reference "` + cut + `"`},
	}
	for _, tc := range tests {
		_, err := ReadOBJ(strings.NewReader(tc.src), "q.obj", MM)
		if err == nil || err.Error() != tc.want {
			t.Errorf("got %v\nwant %s", err, tc.want)
		}
	}
	_, err := ReadCSV(strings.NewReader(long+",x,y,z\n"), "q-nodes.csv", strings.NewReader(""), "q-panels.csv", MM)
	if want := `q-nodes.csv:1: first row must be a header starting with id, got "` + cut + `"`; err == nil || err.Error() != want {
		t.Errorf("got %v\nwant %s", err, want)
	}
}

func TestNoPackagePrefix(t *testing.T) {
	_, err := ParseUnit("ft")
	if err == nil || err.Error() != `unknown unit "ft" (want mm, cm or m)` {
		t.Errorf("got %v", err)
	}
}

func TestOBJRefs(t *testing.T) {
	tests := []struct {
		in   string
		want int
		ok   bool
	}{
		{"3", 3, true}, {"-2", -2, true}, {"3/1", 3, true}, {"3//7", 3, true}, {"3/1/7", 3, true},
		{"3/", 0, false}, {"3//", 0, false}, {"/3", 0, false}, {"3/x", 0, false}, {"3/1/", 0, false},
		{"3/1/7/8", 0, false}, {"3//7/", 0, false}, {"0x3", 0, false}, {"3.0", 0, false}, {"", 0, false},
		{"99999999999999999999", 0, false},
	}
	for _, tc := range tests {
		got, ok := parseOBJRef(tc.in)
		if ok != tc.ok || got != tc.want {
			t.Errorf("parseOBJRef(%q) = %d, %v; want %d, %v", tc.in, got, ok, tc.want, tc.ok)
		}
	}
}
