package web

import (
	"fmt"
	"html/template"
	"image/color"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"strings"
)

// MaxSheetPreviews caps the sheet previews on the page; every sheet is in
// the sheets folder regardless.
const MaxSheetPreviews = 400

type legendItem struct {
	Colour, Text string
}

type planView struct {
	Title  string
	SVG    template.HTML
	Legend []legendItem
}

type htmlPage struct {
	R          *report.Report
	BarChart   template.HTML
	MoreBars   int
	Plans      []planView
	Plots      []template.HTML
	Previews   []template.HTML
	MoreSheets int
	MeanUtil   float64
	CostNote   string
}

// WriteHTML writes report.html: one self-contained page (no scripts, no
// external files) with the summary and cautions, plan views coloured by
// node move, member twist and panel type, histograms, the type tables and
// a preview of every stock sheet.
func WriteHTML(w io.Writer, rep *report.Report) error {
	pg := &htmlPage{R: rep, CostNote: report.CostNote}
	pg.Plans = planViews(rep)
	var flatB, flatA, twist, cut []float64
	for _, p := range rep.Panels {
		flatB = append(flatB, p.FlatnessBeforeMM)
		flatA = append(flatA, p.FlatnessMM)
	}
	for _, m := range rep.Members {
		twist = append(twist, m.TwistDeg)
		cut = append(cut, m.CutLengthMM)
	}
	for _, h := range []struct {
		title, x string
		v        []float64
		c        color.RGBA
	}{
		{"Flatness before the panels were made flat", "flatness deviation (mm)", flatB, color.RGBA{R: 200, G: 150, B: 90, A: 255}},
		{"Flatness after the panels were made flat", "flatness deviation (mm)", flatA, color.RGBA{R: 90, G: 150, B: 120, A: 255}},
		{"Member twist", "twist (°)", twist, color.RGBA{R: 120, G: 110, B: 180, A: 255}},
		{"Member cut length", "cut length (mm)", cut, color.RGBA{R: 100, G: 140, B: 190, A: 255}},
	} {
		s, err := histogramSVG(h.title, h.x, h.v, h.c)
		if err != nil {
			return err
		}
		pg.Plots = append(pg.Plots, template.HTML(s))
	}
	for i, s := range rep.Sheets {
		if i == MaxSheetPreviews {
			pg.MoreSheets = len(rep.Sheets) - i
			break
		}
		pg.Previews = append(pg.Previews, template.HTML(sheetSVG(rep, s)))
		pg.MeanUtil += s.Utilization
	}
	if len(pg.Previews) > 0 {
		pg.MeanUtil = 100 * pg.MeanUtil / float64(len(pg.Previews))
	}
	pg.BarChart, pg.MoreBars = barChart(rep)
	return pageTemplate.Execute(w, pg)
}

// planViews draws the plan three times: panels coloured by the largest
// move of their corners, members coloured by twist, panels coloured by
// type.
func planViews(rep *report.Report) []planView {
	pos := make(map[string][3]float64, len(rep.Nodes))
	moveOf := make(map[string]float64, len(rep.Nodes))
	lox, loy, hix, hiy := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	var maxMove float64
	for _, n := range rep.Nodes {
		pos[n.Label] = n.Pos
		moveOf[n.Label] = n.MoveMM
		maxMove = math.Max(maxMove, n.MoveMM)
		lox, loy = math.Min(lox, n.Pos[0]), math.Min(loy, n.Pos[1])
		hix, hiy = math.Max(hix, n.Pos[0]), math.Max(hiy, n.Pos[1])
	}
	const width = 900.0
	scale := width / math.Max(hix-lox, 1)
	height := math.Max((hiy-loy)*scale, 50)
	px := func(p [3]float64) (float64, float64) { return (p[0] - lox) * scale, height - (p[1]-loy)*scale }
	open := func(b *strings.Builder) {
		fmt.Fprintf(b, `<svg xmlns="http://www.w3.org/2000/svg" viewBox="-10 -10 %.0f %.0f" width="%.0f" height="%.0f" class="plan">`, width+20, height+20, width+20, height+20)
	}
	poly := func(b *strings.Builder, corners []string, fill string) {
		b.WriteString(`<polygon points="`)
		for i, c := range corners {
			x, y := px(pos[c])
			if i > 0 {
				b.WriteByte(' ')
			}
			fmt.Fprintf(b, "%.1f,%.1f", x, y)
		}
		fmt.Fprintf(b, `" fill="%s" stroke="#555" stroke-width="0.4"/>`, fill)
	}
	var views []planView

	var mv strings.Builder
	open(&mv)
	for _, p := range rep.Panels {
		var m float64
		for _, c := range p.Corners {
			m = math.Max(m, moveOf[c])
		}
		poly(&mv, p.Corners, mix(moveLow, moveHigh, m/math.Max(maxMove, minScale)))
	}
	mv.WriteString(`</svg>`)
	views = append(views, planView{Title: "Node moves that made the panels flat (largest corner move per panel)", SVG: template.HTML(mv.String()),
		Legend: []legendItem{{mix(moveLow, moveHigh, 0), "0 mm"}, {mix(moveLow, moveHigh, 0.5), fmt.Sprintf("%.1f mm", maxMove/2)}, {mix(moveLow, moveHigh, 1), fmt.Sprintf("%.1f mm", maxMove)}}})

	var tw strings.Builder
	open(&tw)
	maxTwist := minScale
	for _, m := range rep.Members {
		maxTwist = math.Max(maxTwist, math.Abs(m.TwistDeg))
	}
	for _, p := range rep.Panels {
		poly(&tw, p.Corners, "#fbfbf8")
	}
	for _, m := range rep.Members {
		x1, y1 := px(pos[m.NodeA])
		x2, y2 := px(pos[m.NodeB])
		t := m.TwistDeg / maxTwist
		c := mix(twistZero, twistPos, t)
		if t < 0 {
			c = mix(twistZero, twistNeg, -t)
		}
		fmt.Fprintf(&tw, `<line x1="%.1f" y1="%.1f" x2="%.1f" y2="%.1f" stroke="%s" stroke-width="2.2"/>`, x1, y1, x2, y2, c)
	}
	tw.WriteString(`</svg>`)
	views = append(views, planView{Title: "Member twist", SVG: template.HTML(tw.String()),
		Legend: []legendItem{{mix(twistZero, twistNeg, 1), fmt.Sprintf("%.2f°", -maxTwist)}, {mix(twistZero, twistPos, 0), "0°"}, {mix(twistZero, twistPos, 1), fmt.Sprintf("+%.2f°", maxTwist)}}})

	var ty strings.Builder
	open(&ty)
	index := map[string]int{}
	for i, t := range rep.PanelTypes {
		index[t.Name] = i
	}
	for _, p := range rep.Panels {
		poly(&ty, p.Corners, typeColour(index[p.Type]))
	}
	ty.WriteString(`</svg>`)
	var leg []legendItem
	for i, t := range rep.PanelTypes {
		if i == 12 {
			leg = append(leg, legendItem{"#ffffff", fmt.Sprintf("… %d more types", len(rep.PanelTypes)-12)})
			break
		}
		leg = append(leg, legendItem{typeColour(i), fmt.Sprintf("%s (%d)", t.Name, t.Count)})
	}
	views = append(views, planView{Title: "Panel types", SVG: template.HTML(ty.String()), Legend: leg})
	return views
}

// sheetSVG draws one stock sheet with its parts and labels.
func sheetSVG(rep *report.Report, s report.SheetRow) string {
	const w = 420.0
	scale := w / s.WidthMM
	h := s.HeightMM * scale
	var b strings.Builder
	fmt.Fprintf(&b, `<figure class="sheet"><svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 %.0f %.0f" width="%.0f" height="%.0f">`, w, h, w, h)
	fmt.Fprintf(&b, `<rect x="0" y="0" width="%.1f" height="%.1f" fill="#eef3f5" stroke="#333" stroke-width="1"/>`, w, h)
	index := map[string]int{}
	for i, t := range rep.PanelTypes {
		index[t.Name] = i
	}
	for _, p := range s.Placements {
		b.WriteString(`<polygon points="`)
		for i, v := range p.Outline {
			if i > 0 {
				b.WriteByte(' ')
			}
			fmt.Fprintf(&b, "%.1f,%.1f", v[0]*scale, h-v[1]*scale)
		}
		fmt.Fprintf(&b, `" fill="%s" stroke="#222" stroke-width="0.6"/>`, typeColour(index[rep.Panel(p.Panel).Type]))
		cx, cy, _ := layout.LabelSpot(p.Outline)
		fmt.Fprintf(&b, `<text x="%.1f" y="%.1f" font-size="9" text-anchor="middle">%s</text>`, cx*scale, h-cy*scale, template.HTMLEscapeString(p.Panel))
	}
	fmt.Fprintf(&b, `</svg><figcaption>%s · %s %g × %g mm · %d parts · %.1f %%</figcaption></figure>`,
		template.HTMLEscapeString(s.Name), template.HTMLEscapeString(s.Stock), s.WidthMM, s.HeightMM, len(s.Placements), 100*s.Utilization)
	return b.String()
}

var pageTemplate = template.Must(template.New("page").Funcs(template.FuncMap{
	"pct": func(x float64) string { return fmt.Sprintf("%.1f", 100*x) },
}).Parse(`<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<title>{{.R.Title}} - pqfab report</title>
<style>
body{font-family:sans-serif;margin:24px;color:#222;max-width:1400px}
h1{font-size:1.5em}h2{margin-top:1.6em;border-bottom:1px solid #ccc}
.caution{background:#fff3cd;border:2px solid #c99400;padding:10px 14px;font-weight:bold}
table{border-collapse:collapse;margin:8px 0}td,th{border:1px solid #bbb;padding:3px 8px;text-align:left}
th{background:#eee}.num{text-align:right}
.legend span{display:inline-block;margin-right:14px}.legend i{display:inline-block;width:14px;height:14px;border:1px solid #555;vertical-align:middle;margin-right:4px}
.plots svg{margin:6px}.sheets{display:flex;flex-wrap:wrap}.sheet{margin:6px}figcaption{font-size:0.85em}
.plan{border:1px solid #ddd;background:#fff}
summary{cursor:pointer;margin:6px 0;font-weight:bold}
</style></head><body>
<h1>{{.R.Title}}</h1>
<p class="caution">Caution: {{.R.Caution}}</p>
<h2>Summary</h2>
<table>
<tr><th>Job file</th><td>{{.R.Job}}</td></tr><tr><th>Geometry file</th><td>{{.R.Net}}</td></tr>
{{range .R.Settings}}<tr><th>{{.Name}}</th><td>{{.Value}}</td></tr>{{end}}
<tr><th>Nodes</th><td class="num">{{.R.Counts.Nodes}} in {{.R.Counts.NodeTypes}} types ({{.R.Counts.NodeTypesBound.Reason}})</td></tr>
<tr><th>Members</th><td class="num">{{.R.Counts.Members}} in {{.R.Counts.MemberTypes}} types ({{.R.Counts.MemberTypesBound.Reason}})</td></tr>
<tr><th>Panels</th><td class="num">{{.R.Counts.Panels}} in {{.R.Counts.PanelTypes}} types ({{.R.Counts.PanelTypesBound.Reason}})</td></tr>
<tr><th>Stock sheets</th><td class="num">{{.R.Counts.Sheets}} ({{.R.Counts.Unplaced}} panels unplaced)</td></tr>
<tr><th>Flatness before / after (max, mm)</th><td class="num">{{.R.Planarity.FlatBeforeMM.Max}} / {{.R.Planarity.FlatAfterMM.Max}} (tolerance {{.R.Planarity.ToleranceMM}})</td></tr>
<tr><th>Largest / RMS node move (mm)</th><td class="num">{{.R.Planarity.MaxMoveMM}} / {{.R.Planarity.RMSMoveMM}}</td></tr>
<tr><th>Largest member twist (°)</th><td class="num">{{.R.Planarity.MaxTwistDeg}} (with axes square to the panels: {{.R.Planarity.MaxTwistNormalDeg}})</td></tr>
<tr><th>Weight: panels / members / total (kg)</th><td class="num">{{.R.Weights.PanelsKg}} / {{.R.Weights.MembersKg}} / {{.R.Weights.TotalKg}}</td></tr>
<tr><th>Member material</th><td>{{.R.MemberMaterial.Name}}, {{.R.MemberMaterial.Section}} section, {{.R.MemberMaterial.KgPerM}} kg/m ({{.R.MemberMaterial.DensityKgM3}} kg/m³)</td></tr>
{{with .R.PanelSpec}}{{if .BuildUp}}<tr><th>Panel build-up</th><td>{{.BuildUp}}</td></tr>{{end}}{{if .EdgeWork}}<tr><th>Edge work</th><td>{{.EdgeWork}}</td></tr>{{end}}{{if .Coating}}<tr><th>Coating</th><td>{{.Coating}}</td></tr>{{end}}{{if .HeatTreatment}}<tr><th>Heat treatment</th><td>{{.HeatTreatment}}</td></tr>{{end}}{{if .Grade}}<tr><th>Grade</th><td>{{.Grade}}</td></tr>{{end}}{{end}}
</table>
{{with .R.Warnings}}<h2>Warnings</h2><ul>{{range .}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{with .R.Cost}}<h2>Cost estimate ({{.Currency}})</h2><p>{{$.CostNote}}</p><table><tr><th>Item</th><th>Quantity</th><th>Unit</th><th>Rate</th><th>Amount</th><th>Kind</th></tr>
{{range .Lines}}<tr><td>{{.Item}}</td><td class="num">{{.Quantity}}</td><td>{{.Unit}}</td><td class="num">{{.Rate}}</td><td class="num">{{.Amount}}</td><td>{{.Kind}}</td></tr>{{end}}
<tr><th colspan="4">Total</th><th class="num">{{.Total}}</th><th></th></tr></table>{{end}}
<h2>Plan views</h2>
{{range .Plans}}<h3>{{.Title}}</h3><div class="legend">{{range .Legend}}<span><i style="background:{{.Colour}}"></i>{{.Text}}</span>{{end}}</div>{{.SVG}}{{end}}
<h2>Distributions</h2>
<div class="plots">{{range .Plots}}{{.}}{{end}}</div>
<h2>Types</h2>
<details><summary>Member types: {{len .R.MemberTypes}} for {{.R.Counts.Members}} members</summary>
<p>Every two parts of a type agree within the type tolerances; the values are the middle of the parts' values: what is cut. The largest difference is the most any part of the type differs from it.</p>
<table><tr><th>Type</th><th>Count</th><th>Cut length (mm)</th><th>Blank (mm)</th><th>A mitre / bevel (°)</th><th>B mitre / bevel (°)</th><th>Twist (°)</th><th>Largest difference (mm / °)</th><th>Total (m)</th></tr>{{range .R.MemberTypes}}<tr><td>{{.Name}}</td><td class="num">{{.Count}}</td><td class="num">{{.CutLengthMM}}</td><td class="num">{{.BlankMM}}</td><td class="num">{{(index .Ends 0).MitreDeg}} / {{(index .Ends 0).BevelDeg}}</td><td class="num">{{(index .Ends 1).MitreDeg}} / {{(index .Ends 1).BevelDeg}}</td><td class="num">{{.TwistDeg}}</td><td class="num">{{.MaxDevMM}} / {{.MaxDevDeg}}</td><td class="num">{{.TotalM}}</td></tr>{{end}}</table></details>
<details><summary>Node types: {{len .R.NodeTypes}} for {{.R.Counts.Nodes}} nodes</summary>
<table><tr><th>Type</th><th>Count</th><th>Members at node</th><th>Arms (azimuth from arm 1 / elevation, °)</th><th>Largest difference (°)</th></tr>{{range .R.NodeTypes}}<tr><td>{{.Name}}</td><td class="num">{{.Count}}</td><td class="num">{{.MembersAtNode}}</td><td>{{range .Arms}}{{.AzimuthDeg}} / {{.ElevationDeg}}; {{end}}</td><td class="num">{{.MaxDevDeg}}</td></tr>{{end}}</table></details>
<details><summary>Panel types: {{len .R.PanelTypes}} for {{.R.Counts.Panels}} panels</summary>
<table><tr><th>Type</th><th>Count</th><th>Cut edges (mm)</th><th>Corner angles (°)</th><th>Area (m²)</th><th>Largest difference (mm / °)</th><th>Total area (m²)</th></tr>{{range .R.PanelTypes}}<tr><td>{{.Name}}</td><td class="num">{{.Count}}</td><td class="num">{{range .EdgesMM}}{{.}} {{end}}</td><td class="num">{{range .AnglesDeg}}{{.}} {{end}}</td><td class="num">{{.AreaM2}}</td><td class="num">{{.MaxDevMM}} / {{.MaxDevDeg}}</td><td class="num">{{.TotalAreaM2}}</td></tr>{{end}}</table></details>
<h2>Stock sheets</h2>
<table><tr><th>Stock</th><th>Sheets</th><th>Fewest sheets by area</th><th>Sheets × price</th></tr>{{range .R.Stocks}}<tr><td>{{.Name}}</td><td class="num">{{.Sheets}}</td><td class="num">{{.AreaBound}}</td><td class="num">{{.Cost}}</td></tr>{{end}}</table>
{{with .R.Unplaced}}<h3>Unplaced panels</h3><ul>{{range .}}<li>{{.Panel}}: {{.Reason}}</li>{{end}}</ul>{{end}}
<p>Mean utilization of the sheets shown: {{printf "%.1f" .MeanUtil}} %.{{if .MoreSheets}} {{.MoreSheets}} more sheets are not previewed here; every sheet is in the sheets folder.{{end}}</p>
<div class="sheets">{{range .Previews}}{{.}}{{end}}</div>
<h2>Bars</h2>
{{if .R.BarStocks}}<table><tr><th>Bar stock</th><th>Length (mm)</th><th>Bars</th><th>Fewest bars by length</th><th>Bars × price</th></tr>{{range .R.BarStocks}}<tr><td>{{.Name}}</td><td class="num">{{.LengthMM}}</td><td class="num">{{.Bars}}</td><td class="num">{{.FewestByLength}}</td><td class="num">{{.Cost}}</td></tr>{{end}}</table>
<p>Each bar as cut, members in cutting order (grey: offcut, red: kerfs, trims and slivers).{{if .MoreBars}} {{.MoreBars}} more bars are in the schedule's Bars sheet.{{end}}</p>
{{.BarChart}}{{else}}<p>The job gives no bar stock, so there is no cutting plan.</p>{{end}}
<p class="caution">Caution: {{.R.Caution}}</p>
</body></html>
`))

// minScale keeps colour scales finite when every value is zero.
const minScale = 1e-9
