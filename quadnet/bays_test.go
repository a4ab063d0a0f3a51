package quadnet

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"pqfab/geom"
)

// gridPoints returns a grid of nx × ny points spaced sp mm, rows tilted by
// tiltDeg (a row's y rises along x) and every coordinate moved by up to
// jitter mm; row j, column i is point j*nx+i.
func gridPoints(nx, ny int, sp, tiltDeg, jitter float64, rng *rand.Rand) []geom.Vec {
	var pts []geom.Vec
	slope := math.Tan(tiltDeg * math.Pi / 180)
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			x, y := sp*float64(i)+100, sp*float64(j)+100+slope*sp*float64(i)
			pts = append(pts, geom.Vec{X: x + jitter*(2*rng.Float64()-1), Y: y + jitter*(2*rng.Float64()-1), Z: 3000})
		}
	}
	return pts
}

// TestBaysLabelRowByRow: inside a bay, numbers run row by row from the
// lower-left, by x inside a row. The expected numbers come from the grid's
// own row and column indices (independent of the sort in Label): point
// (row j, column i) of the points inside one bay is number j*nx + i + 1.
func TestBaysLabelRowByRow(t *testing.T) {
	tests := []struct {
		name         string
		nx, ny       int
		sp, tilt, jt float64
	}{
		{"square grid", 4, 4, 1500, 0, 0},
		{"jittered grid", 4, 4, 1500, 0, 40},
		{"rows tilted 8°", 4, 4, 1400, 8, 20},
		{"dense rows", 6, 5, 900, 0, 1e-9},
	}
	for k, tc := range tests {
		rng := rand.New(rand.NewPCG(7, uint64(k)))
		pts := gridPoints(tc.nx, tc.ny, tc.sp, tc.tilt, tc.jt, rng)
		keys := make([]string, len(pts))
		for i := range keys {
			keys[i] = fmt.Sprint("n", i)
		}
		// One bay holds every point.
		b := Bays{Origin: geom.Vec2{}, SizeX: 1e6, SizeY: 1e6}
		got := b.Label(pts, keys, "")
		for j := 0; j < tc.ny; j++ {
			for i := 0; i < tc.nx; i++ {
				want := fmt.Sprintf("A1-%02d", j*tc.nx+i+1)
				if g := got[j*tc.nx+i]; g != want {
					t.Errorf("%s: row %d column %d: got %s, want %s", tc.name, j, i, g, want)
				}
			}
		}
	}
}

// TestBaysLabelConsecutive: on a grid spanning several bays, every bay's
// numbers are 01 … n with no gap, and shuffling the input (fixed seed)
// gives every point the same label.
func TestBaysLabelConsecutive(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	pts := gridPoints(17, 13, 1250, 4, 30, rng)
	keys := make([]string, len(pts))
	for i := range keys {
		keys[i] = fmt.Sprint("k", i)
	}
	b, err := NewBays(pts, 6000, 6000)
	if err != nil {
		t.Fatal(err)
	}
	got := b.Label(pts, keys, "P")
	perBay := map[string][]int{}
	for _, l := range got {
		var bay string
		var n int
		if _, err := fmt.Sscanf(l[:len(l)-2], "%s", &bay); err != nil {
			t.Fatal(err)
		}
		fmt.Sscanf(l[len(l)-2:], "%d", &n)
		perBay[bay] = append(perBay[bay], n)
	}
	for bay, nums := range perBay {
		seen := make([]bool, len(nums)+1)
		for _, n := range nums {
			if n < 1 || n > len(nums) || seen[n] {
				t.Fatalf("bay %s: numbers %v are not 1 … %d", bay, nums, len(nums))
			}
			seen[n] = true
		}
	}
	perm := rng.Perm(len(pts))
	pp, kk := make([]geom.Vec, len(pts)), make([]string, len(pts))
	for i, j := range perm {
		pp[i], kk[i] = pts[j], keys[j]
	}
	got2 := b.Label(pp, kk, "P")
	for i, j := range perm {
		if got2[i] != got[j] {
			t.Fatalf("shuffled input: point %d got %s, want %s", j, got2[i], got[j])
		}
	}
}

// TestBaysLabelNoise: moving every point by far less than the label
// resolution (1e-7 mm) keeps every label.
func TestBaysLabelNoise(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	pts := gridPoints(9, 9, 1500, 3, 0, rng)
	keys := make([]string, len(pts))
	moved := make([]geom.Vec, len(pts))
	for i, p := range pts {
		keys[i] = fmt.Sprint(i)
		moved[i] = geom.Vec{X: p.X + 1e-7*(2*rng.Float64()-1), Y: p.Y + 1e-7*(2*rng.Float64()-1), Z: p.Z}
	}
	b, err := NewBays(pts, 6000, 6000)
	if err != nil {
		t.Fatal(err)
	}
	got, want := b.Label(moved, keys, ""), b.Label(pts, keys, "")
	for i := range got {
		if got[i] != want[i] {
			t.Errorf("point %d: got %s, want %s", i, got[i], want[i])
		}
	}
}

// TestColumnLetters: bay columns run A … H, J … N, P … Z (24 letters: I
// and O are left out, as on structural grid lines, where they are read
// as 1 and 0; common practice), then two letters AA … AZ without AI and
// AO, and so on; ParseBay reads every name back.
func TestColumnLetters(t *testing.T) {
	tests := []struct {
		col  int
		want string
	}{
		{0, "A"}, {7, "H"}, {8, "J"}, {12, "N"}, {13, "P"}, {23, "Z"},
		{24, "AA"}, {31, "AH"}, {32, "AJ"}, {37, "AP"}, {47, "AZ"}, {48, "BA"},
		{24 + 24*24 - 1, "ZZ"}, {24 + 24*24, "AAA"},
	}
	for _, tc := range tests {
		if got := ColumnLetters(tc.col); got != tc.want {
			t.Errorf("ColumnLetters(%d) = %s, want %s", tc.col, got, tc.want)
		}
	}
	// Every name of the first 24 + 24² + 24³ columns: no I, no O, all
	// different, in order of length then alphabet, read back by ParseBay.
	prev := ""
	for c := range 24 + 24*24 + 24*24*24 {
		s := ColumnLetters(c)
		if strings.ContainsAny(s, "IO") {
			t.Fatalf("column %d is %s", c, s)
		}
		if len(s) < len(prev) || (len(s) == len(prev) && s <= prev) {
			t.Fatalf("column %d is %s, after %s", c, s, prev)
		}
		prev = s
		for _, row := range []int{0, 9, 123} {
			col, r, ok := ParseBay(s + strconv.Itoa(row+1) + "-M07")
			if !ok || col != c || r != row {
				t.Fatalf("ParseBay(%s%d-M07) = %d, %d, %v; want %d, %d", s, row+1, col, r, ok, c, row)
			}
		}
	}
	for _, bad := range []string{"I3-01", "O1-01", "AI2-P01", "c3-01", "C0-01", "C-01", "3C-01", "C+3-01", "C03-01", "", "-01", "ZZZZZ1-01"} {
		if _, _, ok := ParseBay(bad); ok {
			t.Errorf("ParseBay(%q) reads a bay", bad)
		}
	}
}
