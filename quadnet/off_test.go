package quadnet

import (
	"strings"
	"testing"

	"pqfab/geom"
)

// offFace is a face's corners and the line it starts on.
type offFace struct {
	corners []int
	line    int
}

// TestOFFWrapped reads OFF files laid out as Geomview's description of the
// format allows (geomview manual, "OFF Files" and "Vertices"): a node's
// values may run over lines, a face's indices may span lines and its
// colour runs to the end of the line of its last index. Every file holds
// the two-panel net below; each face starts, for errors and reports, on
// the line where its corner count stands.
func TestOFFWrapped(t *testing.T) {
	nodes := []geom.Vec{{X: 0}, {X: 1000}, {X: 1000, Y: 1000}, {Y: 1000}, {X: 2000}, {X: 2000, Y: 1000}}
	tests := []struct {
		name      string
		src       string
		nodeLines []int
		faces     []offFace
	}{
		{"one line each",
			"OFF\n6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4 0 1 2 3\n4 1 4 5 2\n",
			[]int{3, 4, 5, 6, 7, 8}, []offFace{{[]int{0, 1, 2, 3}, 9}, {[]int{1, 4, 5, 2}, 10}}},
		{"face wrapped after its first index (as other tools write it)",
			"OFF\n6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4 0\n1\n2\n3\n4 1 4\n5 2\n",
			[]int{3, 4, 5, 6, 7, 8}, []offFace{{[]int{0, 1, 2, 3}, 9}, {[]int{1, 4, 5, 2}, 13}}},
		{"count alone on its line, comments and blank lines between indices",
			"OFF\n6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4\n0 1 # half\n\n2 3\n4 1 4 5 2\n",
			[]int{3, 4, 5, 6, 7, 8}, []offFace{{[]int{0, 1, 2, 3}, 9}, {[]int{1, 4, 5, 2}, 13}}},
		{"colour after the indices, on the line of the last index",
			"OFF\n6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4 0 1 2 3 255 0 0\n4 1 4\n5 2 0.5 0.5 0.5 1\n",
			[]int{3, 4, 5, 6, 7, 8}, []offFace{{[]int{0, 1, 2, 3}, 9}, {[]int{1, 4, 5, 2}, 10}}},
		{"colour index (one value)",
			"OFF\n6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4 0 1 2 3 7\n4 1 4 5 2 7\n",
			[]int{3, 4, 5, 6, 7, 8}, []offFace{{[]int{0, 1, 2, 3}, 9}, {[]int{1, 4, 5, 2}, 10}}},
		{"node values wrapped",
			"OFF\n6 2 0\n0 0\n0\n1000\n0\n0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4 0 1 2 3\n4 1 4 5 2\n",
			[]int{3, 5, 8, 9, 10, 11}, []offFace{{[]int{0, 1, 2, 3}, 12}, {[]int{1, 4, 5, 2}, 13}}},
		{"NOFF normals on the next line",
			"NOFF\n6 2 0\n0 0 0\n0 0 1\n1000 0 0\n0 0 1\n1000 1000 0\n0 0 1\n0 1000 0\n0 0 1\n2000 0 0\n0 0 1\n2000 1000 0\n0 0 1\n4 0 1 2 3\n4 1 4 5 2\n",
			[]int{3, 5, 7, 9, 11, 13}, []offFace{{[]int{0, 1, 2, 3}, 15}, {[]int{1, 4, 5, 2}, 16}}},
		{"CNOFF colour after the wrapped normal",
			"CNOFF\n6 2 0\n0 0 0 0\n0 1 1 0 0 1\n1000 0 0 0 0 1 1 0 0 1\n1000 1000 0 0 0 1 1 0 0 1\n0 1000 0 0 0 1 1 0 0 1\n2000 0 0 0 0 1 1 0 0 1\n2000 1000 0 0 0 1 1 0 0 1\n4 0 1 2 3\n4 1 4 5 2\n",
			[]int{3, 5, 6, 7, 8, 9}, []offFace{{[]int{0, 1, 2, 3}, 10}, {[]int{1, 4, 5, 2}, 11}}},
		{"STOFF texture on the next line",
			"STOFF\n6 2 0\n0 0 0\n0 0\n1000 0 0\n1 0\n1000 1000 0\n1 1\n0 1000 0\n0 1\n2000 0 0\n2 0\n2000 1000 0\n2 1\n4 0 1 2 3\n4 1 4 5 2\n",
			[]int{3, 5, 7, 9, 11, 13}, []offFace{{[]int{0, 1, 2, 3}, 15}, {[]int{1, 4, 5, 2}, 16}}},
		{"counts on the header line, a face's indices one a line",
			"OFF 6 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n2000 0 0\n2000 1000 0\n4\n0\n1\n2\n3\n4\n1\n4\n5\n2\n",
			[]int{2, 3, 4, 5, 6, 7}, []offFace{{[]int{0, 1, 2, 3}, 8}, {[]int{1, 4, 5, 2}, 13}}},
	}
	for _, tc := range tests {
		for _, nl := range []struct{ name, s string }{{"LF", "\n"}, {"CRLF", "\r\n"}, {"CR", "\r"}} {
			src := strings.ReplaceAll(tc.src, "\n", nl.s)
			got, err := ReadOFF(strings.NewReader(src), "w.off", MM)
			if err != nil {
				t.Errorf("%s, %s: %v", tc.name, nl.name, err)
				continue
			}
			if len(got.Nodes) != len(nodes) || len(got.Faces) != len(tc.faces) {
				t.Errorf("%s, %s: %d nodes, %d faces", tc.name, nl.name, len(got.Nodes), len(got.Faces))
				continue
			}
			for i, want := range nodes {
				if g := got.Nodes[i]; g.Pos != want || g.Line != tc.nodeLines[i] {
					t.Errorf("%s, %s: node %d at %v line %d, want %v line %d", tc.name, nl.name, i+1, g.Pos, g.Line, want, tc.nodeLines[i])
				}
			}
			for j, want := range tc.faces {
				if g := got.Faces[j]; !equalInts(g.Corners, want.corners) || g.Line != want.line {
					t.Errorf("%s, %s: face %d %v line %d, want %v line %d", tc.name, nl.name, j+1, g.Corners, g.Line, want.corners, want.line)
				}
			}
		}
	}
}

// TestOFFWrappedErrors: errors in wrapped files name the line where the
// node or face starts, and say on which line a bad index stands.
func TestOFFWrappedErrors(t *testing.T) {
	head := "OFF\n4 1 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n"
	tests := []struct{ src, want string }{
		{head + "4 0\n1\n9\n3\n", "w.off:7: panel 1: corner 3: node index 9 out of range 0..3 (on line 9)"},
		{head + "4 0 1\n2 x\n", `w.off:7: panel 1: corner 4: bad node index "x" (on line 8)`},
		{head + "4 0\n1 2\n", "w.off:7: panel 1: says 4 corners but the file ends after 3"},
		{head + "4 0\n1\n2 3 1 2 3 4 5\n", "w.off:7: panel 1: 5 values after the corners; at most 4 colour values may follow"},
		{head + "4 0\n1 2 3 red\n", `w.off:7: panel 1: colour value "red" is not a number`},
		{head + "4 0 1\n2 0\n", "w.off:7: panel 1: corners 1 and 4 are the same node"},
		{head + "2 0\n1\n", "w.off:7: panel 1: has 2 corners; a panel needs at least 3"},
		// A face short of one index takes the next face's count as its
		// last index: the counts then disagree, and the message says which
		// face ran over lines.
		{"OFF\n4 2 0\n0 0 0\n1000 0 0\n1000 1000 0\n0 1000 0\n3 0 1\n3 1 2 3\n",
			"w.off:8: panel 2: file ends after 1 of 2 faces (check the header's counts: 4 nodes, 2 faces; panel 1 on line 7 takes its corners from lines 7 to 8)"},
		{"OFF\n4 1 0\n0 0 0\n1000 0\n0\n1000 1000 0\n0 1000 0\n4 0 1 2 3\n5\n",
			"w.off:9: the header declares 1 face but more follow (check the header's counts: 4 nodes, 1 face; node 2 on line 4 takes its 3 values (x y z) from lines 4 to 5)"},
		{"OFF\n2 1 0\n0 0 0\n1000 0\n", "w.off:4: node 2: file ends after 2 of its 3 values (OFF wants x y z)"},
		{"OFF\n3 1 0\n0 0 0\n1000 0\nnan\n", `w.off:4: node 2: coordinate "nan" is not a finite number`},
	}
	for _, tc := range tests {
		_, err := ReadOFF(strings.NewReader(tc.src), "w.off", MM)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%q:\ngot  %v\nwant %s", tc.src, err, tc.want)
		}
	}
}
