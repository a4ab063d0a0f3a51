package bars

import (
	"math/big"
	"strconv"
	"strings"
	"testing"
)

// This file checks plans independently of the solver: it shares no code
// with it and does its sums exactly, in rationals read from the decimal
// form of each length (the tests only use lengths with at most three
// decimals, so the decimal form is the value meant).

// exact is a length given with at most three decimals, as a rational.
func exact(t testing.TB, mm float64) *big.Rat {
	t.Helper()
	s := strconv.FormatFloat(mm, 'f', -1, 64)
	if i := strings.IndexByte(s, '.'); i >= 0 && len(s)-i-1 > 3 {
		t.Fatalf("length %s has more than three decimals: not exact in this test", s)
	}
	r, ok := new(big.Rat).SetString(s)
	if !ok {
		t.Fatalf("length %s", s)
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
// length, exactly; the bar's used length and offcut as defined (offcut =
// length − used − kerf when that is more than zero); cutting order longest
// first; stock counts kept; each unplaced piece either longer than every
// usable length or out of every stock it fits.
func replay(t testing.TB, pieces []Piece, stocks []Stock, plan *Plan) {
	t.Helper()
	seen := make([]int, len(pieces))
	perStock := make([]int, len(stocks))
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
		for x, i := range bar.Pieces {
			seen[i]++
			blanks.Add(blanks, exact(t, pieces[i].LengthMM))
			if x > 0 && pieces[i].LengthMM > pieces[bar.Pieces[x-1]].LengthMM {
				t.Errorf("bar %d: piece %s after a shorter one", b+1, pieces[i].Label)
			}
		}
		kerf, trim, length := exact(t, st.KerfMM), exact(t, st.TrimMM), exact(t, st.LengthMM)
		used := ratSum(ratMul(2, trim), blanks, ratMul(len(bar.Pieces)-1, kerf))
		if used.Cmp(length) > 0 {
			t.Errorf("bar %d (%s): 2·trim + blanks + kerfs = %s mm > bar length %s mm", b+1, st.Name, used.FloatString(3), length.FloatString(3))
		}
		offcut := new(big.Rat).Sub(length, ratSum(used, kerf))
		if offcut.Sign() < 0 {
			offcut.SetInt64(0)
		}
		if got := exact(t, bar.UsedMM); got.Cmp(used) != 0 {
			t.Errorf("bar %d: used %s mm, want %s", b+1, got.FloatString(3), used.FloatString(3))
		}
		if got := exact(t, bar.OffcutMM); got.Cmp(offcut) != 0 {
			t.Errorf("bar %d: offcut %s mm, want %s", b+1, got.FloatString(3), offcut.FloatString(3))
		}
		if got := exact(t, bar.BlankMM); got.Cmp(blanks) != 0 {
			t.Errorf("bar %d: blanks %s mm, want %s", b+1, got.FloatString(3), blanks.FloatString(3))
		}
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
		blank := exact(t, pieces[u.Piece].LengthMM)
		for k, st := range stocks {
			usable := new(big.Rat).Sub(exact(t, st.LengthMM), ratMul(2, exact(t, st.TrimMM)))
			if blank.Cmp(usable) <= 0 && (st.Count == 0 || perStock[k] < st.Count) {
				t.Errorf("piece %s unplaced (%s), but stock %s holds it and has bars left", pieces[u.Piece].Label, u.Reason, st.Name)
			}
		}
		if u.Reason == "" {
			t.Errorf("piece %s unplaced without a reason", pieces[u.Piece].Label)
		}
	}
	for i, n := range seen {
		if n != 1 {
			t.Errorf("piece %d (%s) appears %d times", i, pieces[i].Label, n)
		}
	}
}
