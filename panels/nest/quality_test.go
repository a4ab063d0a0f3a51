package nest

import (
	"testing"
)

// TestConvexBinsQuality nests a handful of the convex-bins instances
// (Terashima-Marín et al. 2010; optima in the OpT files;
// testdata/README.md) with the instance's bin, free rotation, margin and
// spacing 0, and holds the bins used to the published optimum: at most
// 5 % over it in all, and the optimum itself on most. The full set is
// BenchmarkConvexBins.
func TestConvexBinsQuality(t *testing.T) {
	names := []string{"A001", "B001", "C001", "H001", "K001", "L001", "M001", "O001", "Q001"}
	bins, opt, hits := 0, 0, 0
	for _, name := range names {
		in := loadBinInstance(t, name)
		stocks := []Stock{{Name: "bin", WidthMM: in.widthMM, HeightMM: in.heightMM, Rotation: Free}}
		r, err := Nest(in.parts, stocks)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, in.parts, stocks, r)
		n := len(r.Sheets) + len(r.Unplaced)
		bins += n
		opt += in.optimum
		if n == in.optimum {
			hits++
		}
		t.Logf("%s: %d bins, optimum %d", name, n, in.optimum)
	}
	if float64(bins) > 1.05*float64(opt) || hits < 6 {
		t.Errorf("%d bins against an optimum of %d, the optimum on %d of %d instances", bins, opt, hits, len(names))
	}
}
