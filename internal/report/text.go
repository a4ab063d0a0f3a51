package report

import (
	"fmt"
	"io"
)

// WriteText writes the headline numbers of a build into dir for a
// terminal, with the caution.
func WriteText(w io.Writer, dir string, rep *Report) {
	c := rep.Counts
	if rep.Title == "" {
		fmt.Fprintf(w, "built into %s\n", dir)
	} else {
		fmt.Fprintf(w, "built %s into %s\n", rep.Title, dir)
	}
	fmt.Fprintf(w, "  nodes    %6d in %d types (no grouping can have fewer than %d)\n", c.Nodes, c.NodeTypes, c.NodeTypesBound.Count)
	fmt.Fprintf(w, "  members  %6d in %d types (no grouping can have fewer than %d)\n", c.Members, c.MemberTypes, c.MemberTypesBound.Count)
	fmt.Fprintf(w, "  panels   %6d in %d types (no grouping can have fewer than %d)\n", c.Panels, c.PanelTypes, c.PanelTypesBound.Count)
	fmt.Fprintf(w, "  flatness before max %.3f mm, after max %.4f mm (tolerance %g mm); largest node move %.2f mm\n",
		rep.Planarity.FlatBeforeMM.Max, rep.Planarity.FlatAfterMM.Max, rep.Planarity.ToleranceMM, rep.Planarity.MaxMoveMM)
	fmt.Fprintf(w, "  largest member twist %.3f° (with axes square to the panels: %.3f°)\n", rep.Planarity.MaxTwistDeg, rep.Planarity.MaxTwistNormalDeg)
	for _, s := range rep.Stocks {
		if s.Sheets > 0 {
			fmt.Fprintf(w, "  stock %-10s %4d sheets (fewest sheets by area %d)\n", s.Name, s.Sheets, s.AreaBound)
		}
	}
	var util float64
	for _, s := range rep.Sheets {
		util += s.Utilization
	}
	if len(rep.Sheets) > 0 {
		fmt.Fprintf(w, "  mean sheet utilization %.1f %%, %d panels unplaced\n", 100*util/float64(len(rep.Sheets)), c.Unplaced)
	}
	for _, b := range rep.BarStocks {
		if b.Bars > 0 {
			fmt.Fprintf(w, "  bars  %-10s %4d bars (fewest bars by length %d)\n", b.Name, b.Bars, b.FewestByLength)
		}
	}
	fmt.Fprintf(w, "  weight: panels %.0f kg, members %.0f kg, total %.0f kg\n", rep.Weights.PanelsKg, rep.Weights.MembersKg, rep.Weights.TotalKg)
	if rep.Cost != nil {
		fmt.Fprintf(w, "  cost estimate %.2f %s\n", rep.Cost.Total, rep.Cost.Currency)
	}
	fmt.Fprintln(w, "\nCaution: "+Caution)
}
