package bars_test

import (
	"fmt"

	"pqfab/nodes"
	"pqfab/nodes/bars"
)

func ExampleSolve() {
	pieces := []bars.Piece{
		{Label: "A1-M01", LengthMM: 2400}, {Label: "A1-M02", LengthMM: 2400},
		{Label: "A2-M01", LengthMM: 3500}, {Label: "B1-M03", LengthMM: 1800},
		{Label: "B2-M04", LengthMM: 5200}, {Label: "B2-M05", LengthMM: 700},
	}
	stocks := []bars.Stock{
		{Name: "6 m", LengthMM: 6000, KerfMM: 4, TrimMM: 10, Price: 48},
		{Name: "12 m", LengthMM: 12000, KerfMM: 4, TrimMM: 10, Price: 90},
	}
	plan, err := bars.Solve(pieces, stocks, bars.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for n, b := range plan.Bars {
		fmt.Printf("bar %d (%s):", n+1, stocks[b.Stock].Name)
		for _, i := range b.Pieces {
			fmt.Printf(" %s %.0f", pieces[i].Label, pieces[i].LengthMM)
		}
		fmt.Printf(", offcut %.0f mm\n", b.OffcutMM)
	}
	fmt.Printf("cost %.0f (at least %.1f)\n", plan.Cost, plan.CostBound)
	// Output:
	// bar 1 (6 m): A2-M01 3500 A1-M01 2400, offcut 72 mm
	// bar 2 (12 m): B2-M04 5200 A1-M02 2400 B1-M03 1800 B2-M05 700, offcut 1864 mm
	// cost 138 (at least 120.3)
}

func ExampleMemberBlankMM() {
	m := nodes.Member{Label: "C3-M12", CutLengthMM: 1850,
		A: nodes.End{MitreDeg: 45}, B: nodes.End{MitreDeg: -20, BevelDeg: 10}}
	blank, err := bars.MemberBlankMM(m, nodes.Section{WidthMM: 60, DepthMM: 120})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.1f mm\n", blank)
	// Output:
	// 1901.5 mm
}
