package bars

import (
	"fmt"
	"math/rand/v2"
	"testing"
)

// BenchmarkPlan10k: 20,000 member-like blanks of 0.5 to 3 m (a net of
// about 10,000 nodes has some 20,000 members), to the millimetre, on 6 m
// and 12 m bars with a 4 mm kerf and 10 mm trims, 12 m a little cheaper
// per metre (invented prices). Reports bars, the fewest 12 m bars by
// length and the cost over its lower bound.
func BenchmarkPlan10k(b *testing.B) {
	rng := rand.New(rand.NewPCG(10, 20000))
	pieces := make([]Piece, 20000)
	for i := range pieces {
		pieces[i] = Piece{Label: fmt.Sprintf("M%05d", i), LengthMM: float64(500 + rng.IntN(2501))}
	}
	stocks := []Stock{
		{Name: "6 m", LengthMM: 6000, KerfMM: 4, TrimMM: 10, Price: 48},
		{Name: "12 m", LengthMM: 12000, KerfMM: 4, TrimMM: 10, Price: 90},
	}
	var plan *Plan
	for b.Loop() {
		var err error
		plan, err = Solve(pieces, stocks, Options{})
		if err != nil {
			b.Fatal(err)
		}
	}
	replay(b, pieces, stocks, plan)
	b.ReportMetric(float64(len(plan.Bars)), "bars")
	b.ReportMetric(float64(plan.Stocks[1].LengthBound), "12m-length-bound")
	b.ReportMetric(plan.Cost/plan.CostBound, "cost/bound")
}
