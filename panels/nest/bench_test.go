package nest

import (
	"fmt"
	"runtime"
	"strings"
	"sync"
	"testing"

	"pqfab/panels"
	"pqfab/quadnet"
	"pqfab/samples"
)

// waveParts returns the cut outlines of the planarized wave sample.
func waveParts(tb testing.TB, size int) []Part {
	n, _ := samples.Make("wave", size)
	topo := quadnet.BuildTopology(n)
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
	t.Logf("wave 1000: %d sheets, area bound %d, ratio %.3f, %s", len(r.Sheets), r.Stocks[0].AreaBound, ratio, r.Ordering)
	if ratio > 1.4 {
		t.Errorf("sheets/area bound %.3f", ratio)
	}
}

// BenchmarkNestWave nests the flat panels of the wave sample of about 1k
// and 10k panels on jumbo float glass with the default options (target:
// 10k in at most 4 s on a 2-core machine); it reports sheets and sheets
// per area bound.
func BenchmarkNestWave(b *testing.B) {
	for _, n := range []int{1000, 10000} {
		b.Run(fmt.Sprintf("%dk", n/1000), func(b *testing.B) {
			_ = benchNest(b, waveParts(b, n), []Stock{floatGlass})
		})
	}
}

// benchNest times Nest on parts and stocks, checks the last result and
// reports its sheets and their ratio to the first stock's area bound; it
// returns the result.
func benchNest(b *testing.B, parts []Part, stocks []Stock) *Result {
	var r *Result
	for b.Loop() {
		var err error
		if r, err = Nest(parts, stocks); err != nil {
			b.Fatal(err)
		}
	}
	checkResult(b, parts, stocks, r)
	b.ReportMetric(float64(len(r.Sheets))/float64(r.Stocks[0].AreaBound), "sheets/bound")
	b.ReportMetric(float64(len(r.Sheets)), "sheets")
	return r
}

// BenchmarkConvexBins nests the 170 convex-bins instances with a known
// optimum (Terashima-Marín, Ross, Farías-Zárate, López-Camacho,
// Valenzuela-Rendón 2010; optima in the OpT files; testdata/README.md)
// with the instance's bin, free rotation, margin and spacing 0, and
// reports the bins used against the optimum, in all and per class (goals:
// at most 1.10 × the optimum in all, the optimum in at least 30 % of the
// instances, the whole set in at most 60 s on a 2-core machine, one
// instance per core at a time). A part left unplaced counts as a bin of
// its own.
func BenchmarkConvexBins(b *testing.B) {
	names := binInstanceNames(b)
	var ins []binInstance
	for _, n := range names {
		ins = append(ins, loadBinInstance(b, n))
	}
	var bins, opt, hits int
	class := map[string][2]int{}
	stocks := make([][]Stock, len(ins))
	for i, in := range ins {
		stocks[i] = []Stock{{Name: "bin", WidthMM: in.widthMM, HeightMM: in.heightMM, Rotation: Free}}
	}
	for b.Loop() {
		bins, opt, hits = 0, 0, 0
		clear(class)
		// The instances go to as many workers as there are cores; each
		// answer depends on its instance alone.
		res := make([]*Result, len(ins))
		errs := make([]error, len(ins))
		next := make(chan int)
		var wg sync.WaitGroup
		for range runtime.GOMAXPROCS(0) {
			wg.Add(1)
			go func() {
				defer wg.Done()
				for i := range next {
					res[i], errs[i] = Nest(ins[i].parts, stocks[i])
				}
			}()
		}
		for i := range ins {
			next <- i
		}
		close(next)
		wg.Wait()
		for i, in := range ins {
			if errs[i] != nil {
				b.Fatal(errs[i])
			}
			r := res[i]
			checkResult(b, in.parts, stocks[i], r)
			n := len(r.Sheets) + len(r.Unplaced)
			bins += n
			opt += in.optimum
			if n == in.optimum {
				hits++
			}
			c := class[in.class]
			class[in.class] = [2]int{c[0] + n, c[1] + in.optimum}
		}
	}
	var s strings.Builder
	for _, c := range "ABCDEFHIJKLMNOPQR" {
		fmt.Fprintf(&s, " %c %d/%d", c, class[string(c)][0], class[string(c)][1])
	}
	b.Logf("bins/optimum per class:%s", s.String())
	b.ReportMetric(float64(bins), "bins")
	b.ReportMetric(float64(opt), "optimum")
	b.ReportMetric(float64(bins)/float64(opt), "bins/optimum")
	b.ReportMetric(float64(hits)/float64(len(ins)), "optimum-hits")
}

// BenchmarkGlass nests the glass-guillotine instances (Han, Bennell, Zhao,
// Song 2013, testdata/README.md) on 6000 × 3210 and 3210 × 2250 mm sheets
// (common float-glass sizes, from memory) with free rotation, margin and
// spacing 0, with and without the edge-to-edge cut rule, and reports the
// sheets against the area bound (goals: at most 1.25 × the bound with the
// rule, 1.15 × without, on every instance).
func BenchmarkGlass(b *testing.B) {
	for _, name := range glassNames {
		parts := loadGlass(b, name)
		for _, st := range glassSheets {
			for _, cuts := range []CutRule{EdgeToEdge, AnyCut} {
				rule := "edge-to-edge"
				if cuts == AnyCut {
					rule = "any-cut"
				}
				b.Run(fmt.Sprintf("%s/%gx%g/%s", name, st.WidthMM, st.HeightMM, rule), func(b *testing.B) {
					stocks := []Stock{st}
					stocks[0].Cuts = cuts
					r := benchNest(b, parts, stocks)
					b.ReportMetric(float64(r.Stocks[0].AreaBound), "bound")
				})
			}
		}
	}
}
