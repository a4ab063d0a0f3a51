package export

import (
	"fmt"
	"html"
	"html/template"
	"strconv"
	"strings"
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
func (rep *Report) buildBars(b *Bundle) []string {
	barOf := make([]string, len(b.Blanks))
	rep.BarStocks, rep.Bars = []BarStockRow{}, []BarRow{}
	plan := b.BarPlan
	if plan == nil {
		return barOf
	}
	for _, u := range plan.Stocks {
		s := b.BarStocks[u.Stock]
		rep.BarStocks = append(rep.BarStocks, BarStockRow{Name: s.Name, LengthMM: s.LengthMM, KerfMM: s.KerfMM, TrimMM: s.TrimMM,
			Price: s.Price, Bars: u.Bars, FewestByLength: u.LengthBound, LowerBound: u.Bound, Cost: r(u.Cost, 2)})
	}
	for i, bar := range plan.Bars {
		s := b.BarStocks[bar.Stock]
		row := BarRow{Name: BarName(i, len(plan.Bars), s.LengthMM), Stock: s.Name, LengthMM: s.LengthMM,
			UsedMM: r(bar.UsedMM, lenDigits), OffcutMM: r(bar.OffcutMM, lenDigits), WasteMM: r(bar.WasteMM, lenDigits)}
		for _, p := range bar.Pieces {
			row.Pieces = append(row.Pieces, BarPieceRow{Member: b.Blanks[p].Label, BlankMM: r(b.Blanks[p].LengthMM, lenDigits)})
			barOf[p] = row.Name
		}
		rep.Bars = append(rep.Bars, row)
	}
	return barOf
}

// MaxBarChart caps the bars drawn on the report page; the schedule lists
// them all.
const MaxBarChart = 300

// barChart draws each bar of the cutting plan as a strip: its members in
// cutting order, then the offcut and the waste, to scale (SVG).
func barChart(rep *Report) (template.HTML, int) {
	n := min(len(rep.Bars), MaxBarChart)
	if n == 0 {
		return "", 0
	}
	longest := 0.0
	for _, b := range rep.Bars[:n] {
		longest = max(longest, b.LengthMM)
	}
	const w, rowH, labelW = 900.0, 14.0, 60.0
	scale := (w - labelW) / longest
	var s strings.Builder
	fmt.Fprintf(&s, `<svg xmlns="http://www.w3.org/2000/svg" width="%.0f" height="%.0f" font-size="10">`, w, rowH*float64(n)+4)
	for i, b := range rep.Bars[:n] {
		y := rowH * float64(i)
		fmt.Fprintf(&s, `<text x="0" y="%.1f">%s</text>`, y+10, html.EscapeString(b.Name))
		fmt.Fprintf(&s, `<rect x="%.1f" y="%.1f" width="%.1f" height="11" fill="#c0392b"/>`, labelW, y+1, b.LengthMM*scale)
		x := labelW
		for k, p := range b.Pieces {
			colour := []string{"#5b8db8", "#7fb069"}[k%2]
			fmt.Fprintf(&s, `<rect x="%.1f" y="%.1f" width="%.1f" height="11" fill="%s"><title>%s %.2f mm</title></rect>`,
				x, y+1, p.BlankMM*scale, colour, html.EscapeString(p.Member), p.BlankMM)
			x += p.BlankMM * scale
		}
		if b.OffcutMM > 0 {
			fmt.Fprintf(&s, `<rect x="%.1f" y="%.1f" width="%.1f" height="11" fill="#bbb"><title>offcut %.2f mm</title></rect>`,
				labelW+(b.LengthMM-b.OffcutMM)*scale, y+1, b.OffcutMM*scale, b.OffcutMM)
		}
	}
	s.WriteString("</svg>")
	return template.HTML(s.String()), len(rep.Bars) - n
}
