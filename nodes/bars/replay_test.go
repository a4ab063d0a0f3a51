package bars

import (
	"maps"
	"math/big"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// This file checks plans independently of the solver: it shares no code
// with it and does its sums exactly, in rationals read from the decimal
// form of each length when it has at most three decimals (the value meant),
// and from the exact binary value otherwise.

// exact is a length as a rational, and whether it was a decimal with at
// most three decimals.
func exact(t testing.TB, mm float64) (*big.Rat, bool) {
	t.Helper()
	s := strconv.FormatFloat(mm, 'f', -1, 64)
	if i := strings.IndexByte(s, '.'); i >= 0 && len(s)-i-1 > 3 {
		return new(big.Rat).SetFloat64(mm), false
	}
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("length %s", s)
	}
	return r, true
}

// exactDecimal is exact for a value that must have at most three decimals.
func exactDecimal(t testing.TB, mm float64) *big.Rat {
	t.Helper()
	r, ok := exact(t, mm)
	if !ok {
		t.Fatalf("length %v has more than three decimals", mm)
	}
	return r
}

func ratSum(rs ...*big.Rat) *big.Rat {
	s := new(big.Rat)
	for _, r := range rs {
		s.Add(s, r)
	}
	return s
}

func ratMul(n int, r *big.Rat) *big.Rat {
	return new(big.Rat).Mul(big.NewRat(int64(n), 1), r)
}

// replay checks a plan against the rules: every piece in exactly one bar or
// in the unplaced list; per bar, 2·trim + Σ blanks + (k−1)·kerf ≤ bar
// length, exactly; the bar's used length, offcut (length − used − kerf when
// that is more than zero) and waste as defined, exactly where every length
// has at most three decimals, and otherwise used rounded up by less than a
// micrometre a piece; cutting order longest first; stock counts kept; the
// totals; each unplaced piece either longer than every usable length or
// out of every stock it fits. Stock lengths must have at most three
// decimals.
func replay(t testing.TB, pieces []Piece, stocks []Stock, plan *Plan) {
	t.Helper()
	seen := make([]int, len(pieces))
	perStock := make([]int, len(stocks))
	totalStock, totalBlank := new(big.Rat), new(big.Rat)
	cost := 0.0
	allDecimal := true
	for b, bar := range plan.Bars {
		if bar.Stock < 0 || bar.Stock >= len(stocks) {
			t.Fatalf("bar %d: stock %d", b+1, bar.Stock)
		}
		st := stocks[bar.Stock]
		perStock[bar.Stock]++
		if len(bar.Pieces) == 0 {
			t.Fatalf("bar %d is empty", b+1)
		}
		blanks := new(big.Rat)
		decimal := true
		for x, i := range bar.Pieces {
			seen[i]++
			r, ok := exact(t, pieces[i].LengthMM)
			blanks.Add(blanks, r)
			decimal = decimal && ok
			// Longest first, at the solver's resolution of 1 µm.
			if x > 0 && pieces[i].LengthMM >= pieces[bar.Pieces[x-1]].LengthMM+0.001 {
				t.Errorf("bar %d: piece %s after a shorter one", b+1, pieces[i].Label)
			}
		}
		kerf, trim, length := exactDecimal(t, st.KerfMM), exactDecimal(t, st.TrimMM), exactDecimal(t, st.LengthMM)
		used := ratSum(ratMul(2, trim), blanks, ratMul(len(bar.Pieces)-1, kerf))
		if used.Cmp(length) > 0 {
			t.Errorf("bar %d (%s): 2·trim + blanks + kerfs = %s mm > bar length %s mm", b+1, st.Name, used.FloatString(3), length.FloatString(3))
		}
		offcut := new(big.Rat).Sub(length, ratSum(used, kerf))
		if offcut.Sign() < 0 {
			offcut.SetInt64(0)
		}
		gotUsed := exactDecimal(t, bar.UsedMM)
		gotOffcut := exactDecimal(t, bar.OffcutMM)
		gotBlank := exactDecimal(t, bar.BlankMM)
		gotWaste := exactDecimal(t, bar.WasteMM)
		if decimal {
			if gotUsed.Cmp(used) != 0 || gotOffcut.Cmp(offcut) != 0 || gotBlank.Cmp(blanks) != 0 {
				t.Errorf("bar %d: used %s, offcut %s, blanks %s mm; want %s, %s, %s", b+1,
					gotUsed.FloatString(3), gotOffcut.FloatString(3), gotBlank.FloatString(3),
					used.FloatString(3), offcut.FloatString(3), blanks.FloatString(3))
			}
		} else {
			// Each blank rounds up by less than 1 µm = 1/1000 mm.
			slack := big.NewRat(int64(len(bar.Pieces)), 1000)
			if d := new(big.Rat).Sub(gotUsed, used); d.Sign() < 0 || d.Cmp(slack) >= 0 {
				t.Errorf("bar %d: used %s mm, exact %s", b+1, gotUsed.FloatString(6), used.FloatString(6))
			}
			if gotOffcut.Cmp(offcut) > 0 {
				t.Errorf("bar %d: offcut %s mm, more than the exact %s", b+1, gotOffcut.FloatString(6), offcut.FloatString(6))
			}
			gotBlank = blanks // the sum of the blanks as given, for the waste below
		}
		if w := new(big.Rat).Sub(length, ratSum(gotBlank, gotOffcut)); decimal && w.Cmp(gotWaste) != 0 {
			t.Errorf("bar %d: waste %s mm, want %s", b+1, gotWaste.FloatString(3), w.FloatString(3))
		}
		allDecimal = allDecimal && decimal
		totalStock.Add(totalStock, length)
		totalBlank.Add(totalBlank, gotBlank)
		cost += st.Price
	}
	if got := exactDecimal(t, plan.StockMM); got.Cmp(totalStock) != 0 {
		t.Errorf("total bar length %v mm, want %s", plan.StockMM, totalStock.FloatString(3))
	}
	if got, _ := exact(t, plan.BlankMM); allDecimal && got.Cmp(totalBlank) != 0 {
		t.Errorf("total blank length %v mm, want %s", plan.BlankMM, totalBlank.FloatString(3))
	}
	if cost != plan.Cost {
		t.Errorf("cost %v, bars add up to %v", plan.Cost, cost)
	}
	for k, st := range stocks {
		if st.Count > 0 && perStock[k] > st.Count {
			t.Errorf("stock %s: %d bars, only %d in stock", st.Name, perStock[k], st.Count)
		}
		if plan.Stocks[k].Bars != perStock[k] {
			t.Errorf("stock %s: summary says %d bars, plan has %d", st.Name, plan.Stocks[k].Bars, perStock[k])
		}
	}
	for _, u := range plan.Unplaced {
		seen[u.Piece]++
		blank, _ := exact(t, pieces[u.Piece].LengthMM)
		for k, st := range stocks {
			usable := new(big.Rat).Sub(exactDecimal(t, st.LengthMM), ratMul(2, exactDecimal(t, st.TrimMM)))
			if blank.Cmp(usable) <= 0 && (st.Count == 0 || perStock[k] < st.Count) {
				t.Errorf("piece %s unplaced (%s), but stock %s holds it and has bars left", pieces[u.Piece].Label, u.Detail, st.Name)
			}
		}
		if u.Detail == "" || u.Reason == 0 {
			t.Errorf("piece %s unplaced without a reason", pieces[u.Piece].Label)
		}
	}
	for i, n := range seen {
		if n != 1 {
			t.Errorf("piece %d (%s) appears %d times", i, pieces[i].Label, n)
		}
	}
}

// recorder is a testing.TB that notes failures instead of failing.
type recorder struct {
	*testing.T
	failed bool
}

func (r *recorder) Helper()               {}
func (r *recorder) Errorf(string, ...any) { r.failed = true }
func (r *recorder) Fatalf(string, ...any) { r.failed = true; runtime.Goexit() }
func (r *recorder) Logf(string, ...any)   {}
func (r *recorder) Error(...any)          { r.failed = true }
func (r *recorder) Fatal(...any)          { r.failed = true; runtime.Goexit() }

// TestReplayCatches: the checker fails broken plans.
func TestReplayCatches(t *testing.T) {
	pieces := lengths(3000, 2990, 1000, 1000.5)
	stocks := []Stock{{Name: "6 m", LengthMM: 6000, KerfMM: 4, TrimMM: 5, Count: 2}}
	plan, err := Solve(pieces, stocks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	replay(t, pieces, stocks, plan)
	breaks := map[string]func(p *Plan){
		"overfull": func(p *Plan) { p.Bars[0].Pieces = append(p.Bars[0].Pieces, p.Bars[1].Pieces...); p.Bars = p.Bars[:1] },
		"twice":    func(p *Plan) { p.Bars[1].Pieces = append(p.Bars[1].Pieces, p.Bars[0].Pieces[0]) },
		"dropped":  func(p *Plan) { p.Bars[1].Pieces = p.Bars[1].Pieces[1:] },
		"offcut":   func(p *Plan) { p.Bars[0].OffcutMM += 0.001 },
		"order":    func(p *Plan) { slices.Reverse(p.Bars[0].Pieces) },
		"count":    func(p *Plan) { p.Bars = append(p.Bars, Bar{Stock: 0, Pieces: nil}) },
		"unplaced": func(p *Plan) {
			p.Unplaced = append(p.Unplaced, Unplaced{p.Bars[1].Pieces[0], ReasonNoBarLeft, "x"})
			p.Bars[1].Pieces = p.Bars[1].Pieces[1:]
		},
		"cost": func(p *Plan) { p.Cost++ },
	}
	names := slices.Sorted(maps.Keys(breaks))
	for _, name := range names {
		p := clonePlan(plan)
		breaks[name](p)
		r := &recorder{T: t}
		done := make(chan struct{})
		go func() {
			defer close(done)
			replay(r, pieces, stocks, p)
		}()
		<-done
		if !r.failed {
			t.Errorf("%s: the replay passed a broken plan", name)
		}
	}
}

func clonePlan(p *Plan) *Plan {
	c := *p
	c.Bars = slices.Clone(p.Bars)
	for b := range c.Bars {
		c.Bars[b].Pieces = slices.Clone(p.Bars[b].Pieces)
	}
	c.Unplaced = slices.Clone(p.Unplaced)
	c.Stocks = slices.Clone(p.Stocks)
	return &c
}
