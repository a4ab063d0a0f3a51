package nest

import (
	"testing"

	"pqfab/geom"
	"pqfab/panels"
	"pqfab/samples"
)

// waveParts returns the cut outlines of the planarized wave sample.
func waveParts(tb testing.TB, size int) []Part {
	n, _ := samples.Make("wave", size)
	topo := geom.BuildTopology(n)
	opt := panels.DefaultPlanarizeOptions()
	opt.TolMM = 0.1
	res, err := panels.Planarize(n, topo, opt)
	if err != nil {
		tb.Fatal(err)
	}
	for i := range n.Nodes {
		n.Nodes[i].Pos = res.Positions[i]
	}
	flats, err := panels.Flatten(n, topo, panels.Material{Name: "glass", ThicknessMM: 10, DensityKgM3: 2500, EdgeInsetMM: 5}, make([]string, len(n.Faces)))
	if err != nil {
		tb.Fatal(err)
	}
	parts := make([]Part, len(flats))
	for i, f := range flats {
		parts[i] = Part{Label: f.Label, Outline: f.Cut}
	}
	return parts
}

// floatGlass is a common jumbo float glass size, 6000 × 3210 mm (common
// practice, from memory), with a 20 mm edge strip and 6 mm between parts.
var floatGlass = Stock{Name: "float", WidthMM: 6000, HeightMM: 3210, MarginMM: 20, SpacingMM: 6, Rotation: Free}

func TestWaveNestQuality(t *testing.T) {
	parts := waveParts(t, 1000)
	r, err := Nest(parts, []Stock{floatGlass})
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, parts, []Stock{floatGlass}, r)
	ratio := float64(len(r.Sheets)) / float64(r.Stocks[0].AreaBound)
	t.Logf("wave 1000: %d sheets, area bound %d, ratio %.3f, ordering %s", len(r.Sheets), r.Stocks[0].AreaBound, ratio, r.Ordering)
	if ratio > 1.5 {
		t.Errorf("sheets/area bound %.3f", ratio)
	}
}

// BenchmarkNestWave10k: target ≤ 4 s; reports sheets/area bound.
func BenchmarkNestWave10k(b *testing.B) {
	parts := waveParts(b, 10000)
	var r *Result
	for b.Loop() {
		var err error
		if r, err = Nest(parts, []Stock{floatGlass}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(r.Sheets))/float64(r.Stocks[0].AreaBound), "sheets/bound")
	b.ReportMetric(float64(len(r.Sheets)), "sheets")
}
