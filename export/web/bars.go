package web

import (
	"fmt"
	"html"
	"html/template"
	"pqfab/internal/report"
	"strings"
)

// MaxBarChart caps the bars drawn on the report page; the schedule lists
// them all.
const MaxBarChart = 300

// barChart draws each bar of the cutting plan as a strip: its members in
// cutting order, then the offcut and the waste, to scale (SVG).
func barChart(rep *report.Report) (template.HTML, int) {
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
