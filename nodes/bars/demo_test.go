package bars

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/quadnet"
	"pqfab/samples"
)

// TestDemoNetBlanks: the members of a sample net with hubs. Each blank is
// its cut length plus, at each end, the farthest reach of the hub cut past
// the axis point, found from the cut plane itself: the plane holds the
// node axis a and is normal to the member direction projected across the
// axis (the design notes' hub end detail), and the reach is the largest
// −(n·c)/(n·x) over the section corners c in the member frame. Then the
// blanks are cut from 6 m bars and the plan replayed.
func TestDemoNetBlanks(t *testing.T) {
	n, err := samples.Make("wave", 300)
	if err != nil {
		t.Fatal(err)
	}
	topo, fd := quadnet.Validate(n, quadnet.DefaultValidateOptions())
	if fd.Err() != nil {
		t.Fatal(fd.Err())
	}
	axes, err := nodes.NormalAxes(n)
	if err != nil {
		t.Fatal(err)
	}
	ms, err := nodes.Members(n, topo, axes, nodes.MemberOptions{HubRadiusMM: 80})
	if err != nil {
		t.Fatal(err)
	}
	sec := nodes.Section{WidthMM: 60, DepthMM: 120}
	for k := range ms {
		ms[k].Label = fmt.Sprintf("M%04d", k)
	}
	pieces, err := MemberPieces(ms, sec)
	if err != nil {
		t.Fatal(err)
	}
	reach := func(a, out geom.Vec, fr geom.Frame) float64 {
		nrm := r3.Unit(r3.Sub(out, r3.Scale(r3.Dot(out, a), a)))
		nx, ny, nz := r3.Dot(nrm, fr.X), r3.Dot(nrm, fr.Y), r3.Dot(nrm, fr.Z)
		best := math.Inf(-1)
		for _, y := range []float64{-sec.WidthMM / 2, sec.WidthMM / 2} {
			for _, z := range []float64{-sec.DepthMM / 2, sec.DepthMM / 2} {
				best = math.Max(best, -(ny*y+nz*z)/nx)
			}
		}
		return best
	}
	angled := 0
	for k, m := range ms {
		ed := topo.Edges[m.Edge]
		e := m.Frame.X
		want := m.CutLengthMM + reach(axes[ed.A], e, m.Frame) + reach(axes[ed.B], r3.Scale(-1, e), m.Frame)
		if got := pieces[k].LengthMM; math.Abs(got-want) > 1e-9*want {
			t.Fatalf("%s: blank %.9f mm, from the cut planes %.9f", m.Label, got, want)
		}
		if pieces[k].LengthMM > m.CutLengthMM+1 {
			angled++
		}
	}
	if angled == 0 {
		t.Fatal("no member has an angled end: the test checks nothing")
	}
	stocks := []Stock{{Name: "6 m", LengthMM: 6000, KerfMM: 4, TrimMM: 10, Price: 48}}
	plan, err := Solve(pieces, stocks, Options{})
	if err != nil {
		t.Fatal(err)
	}
	replay(t, pieces, stocks, plan)
	// No 6 m bar holds five of these blanks (1351 to 1776 mm), so at
	// least ceil(652 / 4) = 163 bars; pairing long with short reaches it.
	if !plan.Proven || len(plan.Bars) != 163 {
		t.Errorf("%d bars, proven %v; want 163, proven", len(plan.Bars), plan.Proven)
	}
	t.Logf("%d members, %d with angled ends, %d bars (fewest by length %d, bound %d)", len(ms), angled, len(plan.Bars), plan.Stocks[0].LengthBound, plan.Stocks[0].Bound)
}
