package quadnet

import (
	"fmt"
	"strings"
	"testing"

	"pqfab/geom"
)

// gridOBJ returns an nx × ny grid of unit quads in the z = 0 plane (mm),
// counter-clockwise from above.
func gridOBJ(nx, ny int, size float64) string {
	var b strings.Builder
	for j := 0; j <= ny; j++ {
		for i := 0; i <= nx; i++ {
			fmt.Fprintf(&b, "v %g %g 0\n", float64(i)*size, float64(j)*size)
		}
	}
	id := func(i, j int) int { return j*(nx+1) + i + 1 }
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			fmt.Fprintf(&b, "f %d %d %d %d\n", id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1))
		}
	}
	return b.String()
}

func mustRead(t testing.TB, src string) *Net {
	t.Helper()
	n, err := ReadOBJ(strings.NewReader(src), "t.obj", MM)
	if err != nil {
		t.Fatal(err)
	}
	return n
}

func TestTopologyGrid(t *testing.T) {
	n := mustRead(t, gridOBJ(4, 3, 1000))
	topo, fd := Validate(n, DefaultValidateOptions())
	if fd.Err() != nil || len(fd.Warnings) != 0 {
		t.Fatal(fd.Err(), fd.Warnings)
	}
	// A 4 × 3 grid: 4·4 + 5·3 = 31 edges, 2·(4+3) = 14 on the boundary.
	if len(topo.Edges) != 31 {
		t.Errorf("edges %d", len(topo.Edges))
	}
	if len(topo.Loops) != 1 || len(topo.Loops[0]) != 14 {
		t.Fatalf("loops %v", topo.Loops)
	}
	if got := topo.BoundaryLength(n); got != 14000 {
		t.Errorf("boundary length %g", got)
	}
	h := topo.ValenceHistogram()
	// 4 corners of valence 2, 10 edge nodes of 3, 6 inner nodes of 4.
	if h[2] != 4 || h[3] != 10 || h[4] != 6 {
		t.Errorf("valence histogram %v", h)
	}
}

func TestReorient(t *testing.T) {
	src := gridOBJ(3, 3, 1000)
	// Flip two panels by reversing their corner lists.
	lines := strings.Split(src, "\n")
	for i, l := range lines {
		if l == "f 6 7 11 10" || l == "f 11 12 16 15" {
			f := strings.Fields(l)
			lines[i] = "f " + f[4] + " " + f[3] + " " + f[2] + " " + f[1]
		}
	}
	n := mustRead(t, strings.Join(lines, "\n"))
	_, fd := Validate(n, DefaultValidateOptions())
	if fd.Err() == nil || len(fd.Misoriented) != 2 {
		t.Fatalf("want an orientation error with 2 panels, got %v %v", fd.Err(), fd.Misoriented)
	}
	Reorient(n, fd.Misoriented)
	_, fd = Validate(n, DefaultValidateOptions())
	if fd.Err() != nil || len(fd.Misoriented) != 0 {
		t.Fatalf("after reorient: %v %v", fd.Err(), fd.Misoriented)
	}
	// A whole net facing down is a warning, and reorient turns all of it.
	down := mustRead(t, strings.ReplaceAll(gridOBJ(2, 1, 1000), "v ", "v -"))
	_, fd = Validate(down, DefaultValidateOptions())
	if fd.Err() != nil || len(fd.Warnings) != 1 || len(fd.Misoriented) != 2 {
		t.Fatalf("facing down: %v %v %v", fd.Err(), fd.Warnings, fd.Misoriented)
	}
}

func TestWarnings(t *testing.T) {
	src := gridOBJ(1, 1, 1000) + "v 5000 0 0\nv 6000 0 0\nv 6000 1000 0\nv 9000 9000 0\nf 5 6 7\n"
	n := mustRead(t, src)
	_, fd := Validate(n, DefaultValidateOptions())
	if fd.Err() != nil {
		t.Fatal(fd.Err())
	}
	var msgs []string
	for _, w := range fd.Warnings {
		msgs = append(msgs, w.Error())
	}
	got := strings.Join(msgs, "\n")
	want := "t.obj:9: node 8: 1 node belongs to no panel (id 8); it is left out\nt.obj: the net has 2 disconnected parts (sizes 1, 1)"
	if got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
}

func TestBaysLabels(t *testing.T) {
	pts := []geom.Vec{{X: 100, Y: 100}, {X: 7000, Y: 100}, {X: 50, Y: 200}, {X: 50, Y: 100}, {X: 13000, Y: 6500}}
	b, err := NewBays(pts, 6000, 6000)
	if err != nil {
		t.Fatal(err)
	}
	keys := []string{"a", "b", "c", "d", "e"}
	got := b.Label(pts, keys, "")
	want := []string{"A1-03", "B1-01", "A1-02", "A1-01", "C2-01"}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("label %d: got %s want %s", i, got[i], want[i])
		}
	}
	// Reordering the input gives each point the same label.
	perm := []int{4, 2, 0, 3, 1}
	pp, kk := make([]geom.Vec, 5), make([]string, 5)
	for i, j := range perm {
		pp[i], kk[i] = pts[j], keys[j]
	}
	got2 := b.Label(pp, kk, "M")
	for i, j := range perm {
		if strings.Replace(got2[i], "-M", "-", 1) != got[j] {
			t.Errorf("reordered: %s vs %s", got2[i], got[j])
		}
	}
	if _, err := NewBays(pts, 0, 6000); err == nil {
		t.Error("zero bay size: want an error")
	}
}
