package pipeline_test

import (
	"math"
	"pqfab/internal/report"
	"strings"
	"testing"
)

// TestCostChargesEachQuantityOnce builds a two-panel job with priced and
// unpriced stock and checks the cost lines: they add up to the total to
// the cent; every stock used has exactly one material line, charged at
// its price when it has one and else at the job's material rate (never
// both); making lines charge cut length and cut area, and setup lines
// the number of distinct types.
func TestCostChargesEachQuantityOnce(t *testing.T) {
	open := textOpener(map[string]string{
		"net.obj": "v 0 0 0\nv 1500 0 0\nv 1500 1200 30\nv 0 1200 0\nv 3000 0 0\nv 3000 1200 0\nf 1 2 3 4\nf 2 5 6 3\n",
	})
	base := `[net]
file = "net.obj"
[supports]
mode = "none"
[[bar]]
name = "6 m"
length_mm = 6000
price = %BAR%
[[stock]]
name = "board"
width_mm = 3210
height_mm = 2250
price = %SHEET%
[rates]
member_per_m = 10
node_each = 5
panel_per_m2 = 50
member_type_each = 7
node_type_each = 11
panel_type_each = 13
bar_per_m = 3
sheet_per_m2 = 17
`
	for _, tc := range []struct {
		name        string
		bar, sheet  string
		priced      bool
		sheetUnit   string
		barUnit     string
		sheetRate   float64
		barRateWant float64
	}{
		{"priced stock", "96", "100", true, "sheet", "bar", 100, 96},
		{"unpriced stock", "0", "0", false, "m²", "m", 17, 3},
	} {
		text := strings.NewReplacer("%BAR%", tc.bar, "%SHEET%", tc.sheet).Replace(base)
		res, err := runJob(t, text, open)
		if err != nil {
			t.Fatal(err)
		}
		c := report.New(res).Cost
		var cents int64
		material := map[string]int{}
		var cutM, areaM2 float64
		for _, m := range res.Structure.Members {
			cutM += m.CutLengthMM / 1000
		}
		for _, f := range res.Flats {
			areaM2 += f.AreaM2
		}
		sheets := len(res.Nesting.Sheets)
		for _, l := range c.Lines {
			cents += int64(math.Round(l.Amount * 100))
			if want := math.Round(l.Quantity*l.Rate*100) / 100; math.Abs(l.Amount-want) > 0.005 {
				t.Errorf("%s: %s: amount %g, quantity × rate %g", tc.name, l.Item, l.Amount, want)
			}
			switch {
			case l.Kind == report.CostMaterial && strings.Contains(l.Item, "sheets board"):
				material["board"]++
				q := float64(sheets)
				if !tc.priced {
					q = float64(sheets) * 3.210 * 2.250
				}
				if l.Unit != tc.sheetUnit || l.Rate != tc.sheetRate || math.Abs(l.Quantity-q) > 1e-3 {
					t.Errorf("%s: %s: %g %s at %g, want %g %s at %g", tc.name, l.Item, l.Quantity, l.Unit, l.Rate, q, tc.sheetUnit, tc.sheetRate)
				}
			case l.Kind == report.CostMaterial && strings.Contains(l.Item, "bars 6 m"):
				material["6 m"]++
				q := float64(len(res.BarPlan.Bars))
				if !tc.priced {
					q *= 6
				}
				if l.Unit != tc.barUnit || l.Rate != tc.barRateWant || math.Abs(l.Quantity-q) > 1e-3 {
					t.Errorf("%s: %s: %g %s at %g, want %g %s at %g", tc.name, l.Item, l.Quantity, l.Unit, l.Rate, q, tc.barUnit, tc.barRateWant)
				}
			case l.Kind == report.CostMaterial:
				t.Errorf("%s: a material line for no stock: %s", tc.name, l.Item)
			case l.Kind == report.CostMaking && strings.HasPrefix(l.Item, "Member making"):
				if l.Unit != "m" || math.Abs(l.Quantity-cutM) > 1e-3 {
					t.Errorf("%s: %s: %g %s, want %g m", tc.name, l.Item, l.Quantity, l.Unit, cutM)
				}
			case l.Kind == report.CostMaking && strings.HasPrefix(l.Item, "Panel making"):
				if l.Unit != "m²" || math.Abs(l.Quantity-areaM2) > 1e-3 {
					t.Errorf("%s: %s: %g %s, want %g m²", tc.name, l.Item, l.Quantity, l.Unit, areaM2)
				}
			case l.Kind == report.CostSetup:
				want := map[string]int{"Member types": len(res.Structure.MemberTypes), "Node types": len(res.Structure.NodeTypes), "Panel types": len(res.PanelTypes)}
				n, ok := want[strings.SplitN(l.Item, ":", 2)[0]]
				if !ok || l.Unit != "type" || l.Quantity != float64(n) {
					t.Errorf("%s: %s: %g %s, want %d types", tc.name, l.Item, l.Quantity, l.Unit, n)
				}
			}
		}
		if material["board"] != 1 || material["6 m"] != 1 {
			t.Errorf("%s: material lines per stock %v, want one each", tc.name, material)
		}
		if got := float64(cents) / 100; got != c.Total {
			t.Errorf("%s: lines add up to %.2f, total %.2f", tc.name, got, c.Total)
		}
	}
}
