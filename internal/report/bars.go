package report

import (
	"fmt"
	"strconv"

	"pqfab/internal/pipeline"
)

// BarStockRow sums up one bar stock of the cutting plan.
type BarStockRow struct {
	Name           string  `json:"name"`
	LengthMM       float64 `json:"length_mm"`
	KerfMM         float64 `json:"kerf_mm"`
	TrimMM         float64 `json:"trim_mm"`
	Price          float64 `json:"price"`
	Bars           int     `json:"bars"`
	FewestByLength int     `json:"fewest_bars_by_length"`
	LowerBound     int     `json:"lower_bound"`
	Cost           float64 `json:"cost"`
}

// BarRow is one bar of the cutting plan: the members cut from it in
// cutting order.
type BarRow struct {
	Name     string        `json:"name"`
	Stock    string        `json:"stock"`
	LengthMM float64       `json:"length_mm"`
	Pieces   []BarPieceRow `json:"pieces"`
	UsedMM   float64       `json:"used_mm"`
	OffcutMM float64       `json:"offcut_mm"`
	WasteMM  float64       `json:"waste_mm"`
}

// BarPieceRow is one member blank on a bar.
type BarPieceRow struct {
	Member  string  `json:"member"`
	BlankMM float64 `json:"blank_length_mm"`
}

// BarName names bar i of n, of the given length: its length in metres,
// then its number among all bars (at least three digits), 12m-001,
// 6m-002, … A name starting with a digit cannot be read as a bay (A1,
// C3) or a part label (C3-07).
func BarName(i, n int, lengthMM float64) string {
	return strconv.FormatFloat(lengthMM/1000, 'f', -1, 64) + "m-" + fmt.Sprintf("%0*d", max(3, len(fmt.Sprint(n))), i+1)
}

// buildBars fills the report's cutting plan and returns each member's bar
// name.
func (rep *Report) buildBars(res *pipeline.Result) []string {
	barOf := make([]string, len(res.Blanks))
	rep.BarStocks, rep.Bars = []BarStockRow{}, []BarRow{}
	plan := res.BarPlan
	if plan == nil {
		return barOf
	}
	for _, u := range plan.Stocks {
		s := res.BarStocks[u.Stock]
		rep.BarStocks = append(rep.BarStocks, BarStockRow{Name: s.Name, LengthMM: s.LengthMM, KerfMM: s.KerfMM, TrimMM: s.TrimMM,
			Price: s.Price, Bars: u.Bars, FewestByLength: u.LengthBound, LowerBound: u.Bound, Cost: r(u.Cost, 2)})
	}
	for i, bar := range plan.Bars {
		s := res.BarStocks[bar.Stock]
		row := BarRow{Name: BarName(i, len(plan.Bars), s.LengthMM), Stock: s.Name, LengthMM: s.LengthMM,
			UsedMM: r(bar.UsedMM, LenDigits), OffcutMM: r(bar.OffcutMM, LenDigits), WasteMM: r(bar.WasteMM, LenDigits)}
		for _, p := range bar.Pieces {
			row.Pieces = append(row.Pieces, BarPieceRow{Member: res.Blanks[p].Label, BlankMM: r(res.Blanks[p].LengthMM, LenDigits)})
			barOf[p] = row.Name
		}
		rep.Bars = append(rep.Bars, row)
	}
	return barOf
}
