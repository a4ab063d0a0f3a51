package bars

import (
	"bufio"
	"fmt"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"
)

// falkenauer is one instance of the OR-Library bin-packing files
// (Falkenauer 1996, "A hybrid grouping genetic algorithm for bin packing",
// Journal of Heuristics 2, 5–30): capacity, sizes and the best-known bin
// count as given in the file.
type falkenauer struct {
	name      string
	capacity  string // as written, such as "100.0"
	sizes     []string
	bestKnown int
}

// readFalkenauer reads an OR-Library file: the number of problems; then
// for each the identifier, a line "capacity count best-known", and one
// size a line.
func readFalkenauer(t testing.TB, path string) []falkenauer {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var words []string
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		words = append(words, strings.Fields(sc.Text())...)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	next := func() string {
		if len(words) == 0 {
			t.Fatalf("%s: ends early", path)
		}
		w := words[0]
		words = words[1:]
		return w
	}
	atoi := func(s string) int {
		n, err := strconv.Atoi(s)
		if err != nil {
			t.Fatalf("%s: %v", path, err)
		}
		return n
	}
	probs := make([]falkenauer, atoi(next()))
	for p := range probs {
		pr := &probs[p]
		pr.name = next()
		pr.capacity = next()
		n := atoi(next())
		pr.bestKnown = atoi(next())
		for range n {
			pr.sizes = append(pr.sizes, next())
		}
	}
	if len(words) != 0 {
		t.Fatalf("%s: %d words left over", path, len(words))
	}
	return probs
}

// pieces turns an instance into pieces on one stock with no kerf and no
// trim, so that a bar holds exactly the instance's capacity.
func (pr falkenauer) pieces(t testing.TB) ([]Piece, []Stock) {
	t.Helper()
	capacity, err := strconv.ParseFloat(pr.capacity, 64)
	if err != nil {
		t.Fatal(err)
	}
	ps := make([]Piece, len(pr.sizes))
	for i, s := range pr.sizes {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil {
			t.Fatal(err)
		}
		ps[i] = Piece{Label: fmt.Sprintf("%s-%03d", pr.name, i+1), LengthMM: v}
	}
	return ps, []Stock{{Name: pr.name, LengthMM: capacity}}
}

// solveFalkenauer solves every instance of a file, replays each plan and
// returns the bars per instance.
func solveFalkenauer(t testing.TB, file string) (probs []falkenauer, bars []int) {
	probs = readFalkenauer(t, file)
	for _, pr := range probs {
		ps, st := pr.pieces(t)
		plan, err := Solve(ps, st, Options{})
		if err != nil {
			t.Fatal(err)
		}
		replay(t, ps, st, plan)
		if len(plan.Unplaced) > 0 {
			t.Fatalf("%s: %d pieces unplaced", pr.name, len(plan.Unplaced))
		}
		if len(plan.Bars) < plan.Stocks[0].Bound || plan.Proven != (len(plan.Bars) == plan.Stocks[0].Bound) {
			t.Fatalf("%s: %d bars, lower bound %d, proven %v", pr.name, len(plan.Bars), plan.Stocks[0].Bound, plan.Proven)
		}
		bars = append(bars, len(plan.Bars))
	}
	return probs, bars
}

// TestFalkenauerTriplets: the triplet class t60 of Falkenauer (1996), file
// binpack5 of the OR-Library: three items fill each bin exactly, so the
// optimum is n/3 = 20 bins by construction. Every instance must reach it.
func TestFalkenauerTriplets(t *testing.T) {
	probs, bars := solveFalkenauer(t, "testdata/binpack5.txt")
	for i, pr := range probs {
		if want := len(pr.sizes) / 3; bars[i] != want || pr.bestKnown != want {
			t.Errorf("%s: %d bars, want %d (file says %d)", pr.name, bars[i], want, pr.bestKnown)
		}
	}
}

// TestFalkenauerUniform: the uniform class u250 of Falkenauer (1996), file
// binpack2 of the OR-Library, best-known counts as given in the file
// (proven optimal except u250_07, u250_12, u250_13). Every instance must
// come within one bar of the best known. Fewer bars than the best known
// are possible only on the three unproven instances (the replay has
// checked the plan exactly).
func TestFalkenauerUniform(t *testing.T) {
	probs, bars := solveFalkenauer(t, "testdata/binpack2.txt")
	hit := 0
	for i, pr := range probs {
		if bars[i] > pr.bestKnown+1 {
			t.Errorf("%s: %d bars, best known %d", pr.name, bars[i], pr.bestKnown)
		}
		if bars[i] < pr.bestKnown {
			switch pr.name {
			case "u250_07", "u250_12", "u250_13":
				t.Logf("%s: %d bars, below the file's best known %d", pr.name, bars[i], pr.bestKnown)
			default:
				t.Errorf("%s: %d bars, below the proven optimum %d", pr.name, bars[i], pr.bestKnown)
			}
		}
		if bars[i] <= pr.bestKnown {
			hit++
		}
	}
	t.Logf("best known reached on %d of %d instances", hit, len(probs))
}

// TestTripletsLarge: a triplet instance of 501 items made as Falkenauer
// (1996) made his class t501 (from memory: a first item drawn from 380 to
// 490, a second from 250 to half of what is left, the third filling the
// bin of 1000 exactly; here to 0.1 of a bin of 100), shuffled. Its optimum
// is n/3 = 167 bars by construction. At the default effort the plan ends
// at 169 (a 1.2 % gap, said in BudgetHit); with 100 million work units,
// about a second, it must reach 167.
func TestTripletsLarge(t *testing.T) {
	if testing.Short() {
		t.Skip("about a second")
	}
	rng := rand.New(rand.NewPCG(167, 9))
	var ps []Piece
	for range 167 {
		x1 := 380 + rng.IntN(111)
		x2 := 250 + rng.IntN((1000-x1)/2-250+1)
		for _, v := range []int{x1, x2, 1000 - x1 - x2} {
			ps = append(ps, Piece{Label: fmt.Sprintf("t%03d", len(ps)+1), LengthMM: float64(v) / 10})
		}
	}
	rng.Shuffle(len(ps), func(i, j int) { ps[i], ps[j] = ps[j], ps[i] })
	st := []Stock{{Name: "t501", LengthMM: 100}}
	quick, err := Solve(ps, st, Options{})
	if err != nil {
		t.Fatal(err)
	}
	replay(t, ps, st, quick)
	if len(quick.Bars) > 169 || (len(quick.Bars) > 167 && !quick.BudgetHit) {
		t.Errorf("default effort: %d bars (budget hit %v), want at most 169 and the budget said when short of 167", len(quick.Bars), quick.BudgetHit)
	}
	plan, err := Solve(ps, st, Options{Effort: 100_000_000})
	if err != nil {
		t.Fatal(err)
	}
	replay(t, ps, st, plan)
	if len(plan.Bars) != 167 || len(plan.Unplaced) != 0 {
		t.Errorf("%d bars (%d unplaced), want the optimum 167", len(plan.Bars), len(plan.Unplaced))
	}
}

func benchmarkFalkenauer(b *testing.B, file string) {
	var probs []falkenauer
	var bars []int
	for b.Loop() {
		probs, bars = solveFalkenauer(b, file)
	}
	total, best, hit := 0, 0, 0
	for i, pr := range probs {
		total += bars[i]
		best += pr.bestKnown
		if bars[i] <= pr.bestKnown {
			hit++
		}
	}
	b.ReportMetric(float64(total), "bins")
	b.ReportMetric(float64(best), "best-known-bins")
	b.ReportMetric(float64(hit), "instances-at-best")
	b.ReportMetric(float64(len(probs)), "instances")
}

// BenchmarkFalkenauerUniform solves the whole u250 file (20 instances of
// 250 items); target: ≤ 5 s a file.
func BenchmarkFalkenauerUniform(b *testing.B) { benchmarkFalkenauer(b, "testdata/binpack2.txt") }

// BenchmarkFalkenauerTriplets solves the whole t60 file (20 instances of
// 60 items); target: ≤ 5 s a file.
func BenchmarkFalkenauerTriplets(b *testing.B) { benchmarkFalkenauer(b, "testdata/binpack5.txt") }
