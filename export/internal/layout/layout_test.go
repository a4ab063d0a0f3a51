package layout

import (
	"math"
	"math/rand/v2"
	"pqfab/export/internal/exporttest"
	"strings"
	"testing"
)

func TestWrapWords(t *testing.T) {
	tests := []struct {
		in    string
		width int
		want  []string
	}{
		{"a bb ccc dddd", 6, []string{"a bb", "ccc", "dddd"}},
		{"  one   two  ", 20, []string{"one two"}},
		{"averyveryverylongword x", 5, []string{"averyveryverylongword", "x"}},
		{"é é é", 3, []string{"é é", "é"}},
		{"", 5, nil},
	}
	for _, tc := range tests {
		got := WrapWords(tc.in, tc.width)
		if strings.Join(got, "|") != strings.Join(tc.want, "|") || len(got) != len(tc.want) {
			t.Errorf("wrapWords(%q, %d) = %q, want %q", tc.in, tc.width, got, tc.want)
		}
	}
}

func randomBox(rng *rand.Rand, span float64) Box {
	a := rng.Float64() * 2 * math.Pi
	return Box{CX: rng.Float64() * span, CY: rng.Float64() * span, UX: math.Cos(a), UY: math.Sin(a),
		HW: 0.5 + rng.Float64()*4, HH: 0.2 + rng.Float64()*1.5}
}

// TestBoxOverlaps checks the separating-axis test against polygon
// clipping on random rectangles (fixed seed); pairs within a hair of
// touching are left out, where the two methods may round either way.
func TestBoxOverlaps(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 14))
	checked := 0
	for n := 0; n < 20000; n++ {
		a, b := randomBox(rng, 12), randomBox(rng, 12)
		area := exporttest.ClipArea(a.Corners(), b.Corners())
		if area > 0 && area < 1e-9 {
			continue
		}
		if got, want := a.overlaps(b), area > 0; got != want {
			t.Fatalf("boxes %+v and %+v: overlaps %v, clipped area %g", a, b, got, area)
		}
		checked++
	}
	if checked < 19000 {
		t.Errorf("only %d pairs checked", checked)
	}
}

// TestPlacerNoOverlap places many labels among random obstacles (fixed
// seed) and checks every pair of boxes by brute force, without the index.
func TestPlacerNoOverlap(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 2))
	ix := NewBoxIndex(3, [2]float64{-10, -10}, [2]float64{110, 110})
	var obstacles []Box
	for range 300 {
		a := [2]float64{rng.Float64() * 100, rng.Float64() * 100}
		b := [2]float64{a[0] + rng.Float64()*20 - 10, a[1] + rng.Float64()*20 - 10}
		o := SegmentBox(a, b, 0.3)
		obstacles = append(obstacles, o)
		ix.Add(o)
	}
	// One very long line, filed along its axis.
	long := SegmentBox([2]float64{-50, 3}, [2]float64{5000, 40}, 0.3)
	obstacles = append(obstacles, long)
	ix.Add(long)
	p := &Placer{Index: ix, Ring: 2, Rings: 4, OverflowX: 6000, OverflowY: 100}
	var placed []Placement
	for range 600 {
		x, y := rng.Float64()*100, rng.Float64()*100
		w, h := 4+rng.Float64()*4, 1.5
		placed = append(placed, p.Place([2]float64{x, y}, w, h, func(s float64) []Box { return NodeCandidates(x, y, w, h, 0.5, s) }))
	}
	leaders := 0
	for i, a := range placed {
		if a.Leader {
			leaders++
		}
		for _, o := range obstacles {
			if exporttest.ClipArea(a.Box.Corners(), o.Corners()) > 1e-9 {
				t.Fatalf("label %d at %+v overlaps an obstacle %+v", i, a.Box, o)
			}
		}
		for j := i + 1; j < len(placed); j++ {
			if exporttest.ClipArea(a.Box.Corners(), placed[j].Box.Corners()) > 1e-9 {
				t.Fatalf("labels %d and %d overlap", i, j)
			}
		}
	}
	t.Logf("%d labels, %d on leaders", len(placed), leaders)
}
