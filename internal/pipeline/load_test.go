package pipeline

import (
	"fmt"
	"io"
	"slices"
	"strings"
	"testing"

	"pqfab/geom"
	"pqfab/quadnet"
)

// TestFileOrder: LoadNet's Order maps the canonical net back to the file:
// node i and panel j of Order.Apply(loaded) are the file's node i and
// panel j, each panel from its first corner (a turned panel keeps its
// first corner and reverses the rest), the node in no panel where the
// file has it. The file lists a 3 × 2 grid of 1 m panels out of order.
func TestFileOrder(t *testing.T) {
	// Grid node (i, j) at (1000 i, 1000 j); the file lists them in this
	// order, with a node in no panel as its 5th.
	grid := [][2]int{{2, 1}, {0, 0}, {3, 2}, {1, 2}, {-1, -1}, {0, 1}, {3, 0}, {2, 2}, {1, 0}, {3, 1}, {0, 2}, {2, 0}, {1, 1}}
	at := map[[2]int]int{}
	var src strings.Builder
	for k, g := range grid {
		at[g] = k + 1
		if g[0] < 0 {
			src.WriteString("v -5000 -5000 40\n")
			continue
		}
		fmt.Fprintf(&src, "v %d %d 0\n", 1000*g[0], 1000*g[1])
	}
	// Panels out of order, each from another corner; (1, 0) runs clockwise
	// (flipped) and is turned by reorient.
	type panel struct{ i, j, start int }
	panels := []panel{{2, 1, 2}, {0, 0, 1}, {1, 1, 3}, {2, 0, 0}, {0, 1, 2}, {1, 0, 1}}
	var want [][]int
	for _, p := range panels {
		ring := []int{at[[2]int{p.i, p.j}], at[[2]int{p.i + 1, p.j}], at[[2]int{p.i + 1, p.j + 1}], at[[2]int{p.i, p.j + 1}]}
		var c []int
		for k := range ring {
			c = append(c, ring[(p.start+k)%4])
		}
		if p.i == 1 && p.j == 0 {
			c[1], c[3] = c[3], c[1] // written clockwise, from the same first corner
		}
		fmt.Fprintf(&src, "f %d %d %d %d\n", c[0], c[1], c[2], c[3])
		if p.i == 1 && p.j == 0 {
			c[1], c[3] = c[3], c[1] // turned back by reorient, first corner kept
		}
		for k := range c {
			c[k]--
		}
		want = append(want, c)
	}
	open := func(string) (io.ReadCloser, error) { return io.NopCloser(strings.NewReader(src.String())), nil }
	in, err := LoadNet(open, "grid.obj", quadnet.MM, quadnet.DefaultValidateOptions(), true)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(in.Warnings, "\n"), "turned 1 panels") {
		t.Errorf("warnings %q: the flipped panel was not turned", in.Warnings)
	}
	if len(in.Net.Nodes) != len(grid)-1 {
		t.Fatalf("loaded %d nodes, want %d (the node in no panel left out)", len(in.Net.Nodes), len(grid)-1)
	}
	got := in.Order.Apply(in.Net)
	for k, g := range grid {
		w := geom.Vec{X: 1000 * float64(g[0]), Y: 1000 * float64(g[1])}
		if g[0] < 0 {
			w = geom.Vec{X: -5000, Y: -5000, Z: 40}
		}
		if got.Nodes[k].Pos != w || got.Nodes[k].ID != fmt.Sprint(k+1) {
			t.Errorf("node %d: %v (id %s), want %v", k+1, got.Nodes[k].Pos, got.Nodes[k].ID, w)
		}
	}
	for j, w := range want {
		if !slices.Equal(got.Faces[j].Corners, w) || got.Faces[j].ID != fmt.Sprint(j+1) {
			t.Errorf("panel %d: %v (id %s), want %v", j+1, got.Faces[j].Corners, got.Faces[j].ID, w)
		}
	}
	if slices.Equal(in.Order.Nodes, []int{0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12}) {
		t.Error("the canonical order is the file's: the test tells nothing")
	}
}
