package xlsx

import (
	"fmt"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"strings"
)

// panelsTable returns the Panels sheet: cut values first (what a glazier
// or a board workshop orders: every edge, diagonal and corner angle of the
// cut outline, its smallest enclosing rectangle, area, weight, the bevel
// of each edge and the panel specification), then the set-out
// (centre-line) values under headers that say so. Edge k runs from corner
// k to corner k+1; corner 1 is the one marked on every drawing. Columns
// run to the largest corner count in the net, so 5- and 6-corner panels
// keep every edge. A column says which panels are cut from their type's
// shape turned over (inside face up).
func panelsTable(rep *report.Report) ([]string, func(add func(row ...any) error) error) {
	k := 3
	for _, p := range rep.Panels {
		k = max(k, len(p.Corners))
	}
	diags := diagonalPairs(k)
	// outline heads an outline's edges, diagonals and corner angles.
	outline := func(head []string, what string) []string {
		for i := 1; i <= k; i++ {
			head = append(head, fmt.Sprintf("%s edge %d (mm)", what, i))
		}
		for _, d := range diags {
			head = append(head, fmt.Sprintf("%s diagonal %d-%d (mm)", what, d[0]+1, d[1]+1))
		}
		for i := 1; i <= k; i++ {
			head = append(head, fmt.Sprintf("%s angle %d (°)", what, i))
		}
		return head
	}
	head := outline([]string{"Label", "Type", "Sheet", PanelsTurnedOverHead}, "Cut")
	head = append(head, "Cut rectangle long (mm)", "Cut rectangle short (mm)", "Cut area (m²)", "Cut perimeter (mm)", "Weight (kg)")
	for i := 1; i <= k; i++ {
		head = append(head, fmt.Sprintf("Bevel %d (%s)", i, layout.BevelSignHead))
	}
	head = outline(append(head, "Build-up", "Edge work", "Coating", "Heat treatment", "Grade"), "Set-out")
	head = append(head, "Corner nodes", "Id", "Grain direction (°)", "Flatness before (mm)", "Flatness after (mm)")
	spec := map[string]*report.PanelSpec{}
	turned := map[string]bool{}
	for i := range rep.PanelTypes {
		spec[rep.PanelTypes[i].Name] = &rep.PanelTypes[i].Spec
		for _, l := range rep.PanelTypes[i].Mirrored {
			turned[l] = true
		}
	}
	rows := func(add func(row ...any) error) error {
		for _, p := range rep.Panels {
			over := "no"
			if turned[p.Label] {
				over = "yes"
			}
			row := []any{p.Label, p.Type, p.Sheet, over}
			row = appendN(row, p.Cut.EdgesMM, k)
			row = appendDiagonals(row, p.Cut.Diagonals, p.Corners, diags)
			row = appendN(row, p.Cut.AnglesDeg, k)
			row = append(row, p.Cut.BoxMM[0], p.Cut.BoxMM[1], p.AreaM2, p.PerimeterMM, p.WeightKg)
			bevels := make([]float64, len(p.Edges))
			setout := make([]float64, len(p.Edges))
			for i, e := range p.Edges {
				bevels[i], setout[i] = e.BevelDeg, e.LengthMM
			}
			row = appendN(row, bevels, k)
			s := spec[p.Type]
			if s == nil {
				s = &report.PanelSpec{}
			}
			row = append(row, s.BuildUp, s.EdgeWork, s.Coating, s.HeatTreatment, s.Grade)
			row = appendN(row, setout, k)
			row = appendDiagonals(row, p.Diagonals, p.Corners, diags)
			row = appendN(row, p.AnglesDeg, k)
			row = append(row, strings.Join(p.Corners, " "), p.ID, p.GrainDeg, p.FlatnessBeforeMM, p.FlatnessMM)
			if err := add(row...); err != nil {
				return err
			}
		}
		return nil
	}
	return head, rows
}

// PanelsTurnedOverHead heads the Panels sheet's column that says "yes"
// for a panel cut from its type's shape turned over (inside face up on the
// cutting table), else "no".
const PanelsTurnedOverHead = "Cut turned over (inside face up)"

// diagonalPairs lists the diagonals of a k-corner panel as corner index
// pairs (i < j, not neighbours): those of a panel with fewer corners are
// among them.
func diagonalPairs(k int) [][2]int {
	var out [][2]int
	for i := 0; i < k; i++ {
		for j := i + 2; j < k; j++ {
			if i == 0 && j == k-1 {
				continue
			}
			out = append(out, [2]int{i, j})
		}
	}
	return out
}

// appendN appends vs and blank cells up to n values.
func appendN(row []any, vs []float64, n int) []any {
	for i := 0; i < n; i++ {
		if i < len(vs) {
			row = append(row, vs[i])
		} else {
			row = append(row, nil)
		}
	}
	return row
}

// appendDiagonals appends a panel's diagonals in the columns of pairs,
// finding each diagonal's corners by their node labels.
func appendDiagonals(row []any, ds []report.DiagonalRow, corners []string, pairs [][2]int) []any {
	at := map[string]int{}
	for i, c := range corners {
		at[c] = i
	}
	length := map[[2]int]float64{}
	for _, d := range ds {
		i, j := at[d.From], at[d.To]
		length[[2]int{min(i, j), max(i, j)}] = d.MM
	}
	for _, p := range pairs {
		if v, ok := length[p]; ok {
			row = append(row, v)
		} else {
			row = append(row, nil)
		}
	}
	return row
}
