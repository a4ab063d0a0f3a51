package web

import (
	_ "embed"
	"encoding/json"
	"errors"
	"fmt"
	"html"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"strings"
)

// The vendored WebGL library (three.js, npm three@0.170.0, MIT licence
// in assets/three/LICENSE) and our page script.
var (
	//go:embed assets/three/three.module.min.js
	threeJS string
	//go:embed assets/three/OrbitControls.js
	orbitJS string
	//go:embed assets/three/LICENSE
	threeLicense string
	//go:embed assets/view.js
	viewJS string
	//go:embed assets/view.css
	viewCSS string
)

// viewData is what view.html draws, as compact parallel arrays: positions
// in whole mm relative to Centre, types as indices into Types.
type viewData struct {
	Title     string      `json:"title"`
	Caution   string      `json:"caution"`
	Warnings  []string    `json:"warnings"`
	Hub       string      `json:"hub"`
	Numbering string      `json:"numbering"`
	Centre    [3]float64  `json:"centre"`
	Types     []string    `json:"types"`
	Sheets    []string    `json:"sheets"`
	Nodes     viewNodes   `json:"nodes"`
	Members   viewMembers `json:"members"`
	Panels    viewPanels  `json:"panels"`
}

type viewNodes struct {
	Label    []string  `json:"label"`
	XYZ      []int64   `json:"xyz"`
	Type     []int     `json:"type"`
	MoveMM   []float64 `json:"move"`
	Support  []int     `json:"support"`   // indices of the support nodes
	ArmStart []int     `json:"arm_start"` // node i's arms are ArmStart[i] … ArmStart[i+1]-1
	ArmOf    []int     `json:"arm_member"`
	ArmAz    []float64 `json:"arm_az"`
	ArmEl    []float64 `json:"arm_el"`
	TiltDeg  []float64 `json:"tilt"`    // axis from vertical
	TiltTo   []float64 `json:"tilt_to"` // plan direction of the tilt, ccw from north
}

type viewMembers struct {
	Label []string  `json:"label"`
	A     []int     `json:"a"`
	B     []int     `json:"b"`
	Type  []int     `json:"type"`
	Cut   []float64 `json:"cut"`
	TagB  []int     `json:"tag_b"` // members whose tag end is their end B
}

type viewPanels struct {
	Label  []string  `json:"label"`
	Start  []int     `json:"start"` // panel i's corners are Corner[Start[i]] … Corner[Start[i+1]-1]
	Corner []int     `json:"corner"`
	Type   []int     `json:"type"`
	Sheet  []int     `json:"sheet"` // index into Sheets, -1 for none
	AreaM2 []float64 `json:"area"`
}

func newViewData(rep *report.Report) (*viewData, error) {
	d := &viewData{Members: viewMembers{TagB: []int{}}, Nodes: viewNodes{Support: []int{}}, Title: rep.Title, Caution: report.Caution, Warnings: layout.WarningLines(rep.Warnings), Hub: layout.HubFrameNote, Numbering: layout.NumberingNote}
	nodeIdx := make(map[string]int, len(rep.Nodes))
	lo, hi := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for i, n := range rep.Nodes {
		nodeIdx[n.Label] = i
		for k := range 3 {
			lo[k], hi[k] = math.Min(lo[k], n.Pos[k]), math.Max(hi[k], n.Pos[k])
		}
	}
	if len(rep.Nodes) > 0 {
		for k := range 3 {
			d.Centre[k] = math.Round((lo[k] + hi[k]) / 2)
		}
	}
	typeIdx := map[string]int{}
	typ := func(name string) int {
		k, ok := typeIdx[name]
		if !ok {
			k = len(d.Types)
			typeIdx[name] = k
			d.Types = append(d.Types, name)
		}
		return k
	}
	sheetIdx := map[string]int{}
	for i, s := range rep.Sheets {
		sheetIdx[s.Name] = i
		d.Sheets = append(d.Sheets, s.Name)
	}
	nd := &d.Nodes
	memberIdx := make(map[string]int, len(rep.Members))
	for i, m := range rep.Members {
		memberIdx[m.Label] = i
	}
	for i, n := range rep.Nodes {
		nd.Label = append(nd.Label, n.Label)
		for k := range 3 {
			nd.XYZ = append(nd.XYZ, int64(math.Round(n.Pos[k]-d.Centre[k])))
		}
		nd.Type = append(nd.Type, typ(n.Type))
		nd.MoveMM = append(nd.MoveMM, r(n.MoveMM, 2))
		nd.TiltDeg, nd.TiltTo = append(nd.TiltDeg, r(n.AxisTiltDeg, 1)), append(nd.TiltTo, r(n.AxisTiltTowardDeg, 0))
		if n.Support {
			nd.Support = append(nd.Support, i)
		}
		nd.ArmStart = append(nd.ArmStart, len(nd.ArmOf))
		for _, a := range n.Arms {
			k, ok := memberIdx[a.Member]
			if !ok {
				return nil, fmt.Errorf("node %s: arm %s is not a member of the report", n.Label, a.Member)
			}
			nd.ArmOf = append(nd.ArmOf, k)
			nd.ArmAz = append(nd.ArmAz, r(a.AzimuthDeg, 1))
			nd.ArmEl = append(nd.ArmEl, r(a.ElevationDeg, 1))
		}
	}
	nd.ArmStart = append(nd.ArmStart, len(nd.ArmOf))
	md := &d.Members
	for _, m := range rep.Members {
		a, oka := nodeIdx[m.NodeA]
		b, okb := nodeIdx[m.NodeB]
		if !oka || !okb {
			return nil, fmt.Errorf("member %s: end node %s or %s is not in the report", m.Label, m.NodeA, m.NodeB)
		}
		md.Label = append(md.Label, m.Label)
		md.A, md.B = append(md.A, a), append(md.B, b)
		md.Type = append(md.Type, typ(m.Type))
		md.Cut = append(md.Cut, r(m.CutLengthMM, 1))
		if m.TagEnd == "B" {
			md.TagB = append(md.TagB, len(md.Label)-1)
		}
	}
	pd := &d.Panels
	for _, p := range rep.Panels {
		pd.Label = append(pd.Label, p.Label)
		pd.Start = append(pd.Start, len(pd.Corner))
		for _, c := range p.Corners {
			k, ok := nodeIdx[c]
			if !ok {
				return nil, fmt.Errorf("panel %s: corner %s is not in the report", p.Label, c)
			}
			pd.Corner = append(pd.Corner, k)
		}
		pd.Type = append(pd.Type, typ(p.Type))
		s, ok := sheetIdx[p.Sheet]
		if !ok {
			s = -1
		}
		pd.Sheet = append(pd.Sheet, s)
		pd.AreaM2 = append(pd.AreaM2, r(p.AreaM2, 3))
	}
	pd.Start = append(pd.Start, len(pd.Corner))
	return d, nil
}

// rawTextSafe reports whether s can stand as the raw text of a script
// element: no "</script" and no "<!--" (HTML's script-data rules).
func rawTextSafe(s string) bool {
	l := strings.ToLower(s)
	return !strings.Contains(l, "</script") && !strings.Contains(l, "<!--")
}

// WriteView writes view.html: one self-contained page (scripts, styles and
// data inline; a content security policy forbids every network load) that
// shows the planarized net in 3D with orbit, zoom and pan, a search box (a
// label typed, or given after # in the address, is highlighted and its
// data shown; clicking a node or panel does the same) and colours by part
// type or by node move. The WebGL library is three.js, vendored; without
// WebGL the page says so and the search and the data still work. Data is
// JSON in parallel arrays, so the page grows linearly with the net. Safe
// to call concurrently.
func WriteView(w io.Writer, rep *report.Report) error {
	d, err := newViewData(rep)
	if err != nil {
		return err
	}
	data, err := json.Marshal(d) // escapes <, > and & as \u003c …: safe inside a script element
	if err != nil {
		return err
	}
	for name, s := range map[string]string{"three.module.min.js": threeJS, "OrbitControls.js": orbitJS, "view.js": viewJS} {
		if !rawTextSafe(s) {
			return errors.New("view.html: " + name + " holds text that would end its script element")
		}
	}
	title := html.EscapeString(layout.NoControls(rep.Title))
	parts := []string{
		"<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n",
		"<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; script-src 'unsafe-inline' blob:; style-src 'unsafe-inline'; img-src data: blob:\">\n",
		"<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n<link rel=\"icon\" href=\"data:,\">\n",
		"<title>", title, " - 3D view</title>\n<style>\n", viewCSS, "</style>\n</head>\n<body>\n",
		"<div id=\"panel\">\n<h1>", title, "</h1>\n",
		"<form id=\"find\" autocomplete=\"off\"><input id=\"q\" type=\"search\" placeholder=\"label, e.g. C3-07\" aria-label=\"find a part by its label\"> <button>Find</button></form>\n",
		"<label>Colour by <select id=\"colour\"><option value=\"type\">type</option><option value=\"move\">node move</option></select></label>\n",
		"<div id=\"legend\"></div>\n<div id=\"status\">loading…</div>\n<div id=\"info\"></div>\n",
		"<p class=\"small\">Drag to orbit, wheel to zoom, right-drag to pan. Click a node or panel to select it. z is up; lengths mm.</p>\n",
		"<p class=\"small\" id=\"caution\"></p>\n</div>\n<div id=\"view\"></div>\n",
		"<script type=\"application/json\" id=\"data\">", string(data), "</script>\n",
		"<script type=\"text/x-vendored\" id=\"three-src\">", threeJS, "</script>\n",
		"<script type=\"text/x-vendored\" id=\"orbit-src\">", orbitJS, "</script>\n",
		"<script>\n", viewJS, "</script>\n",
		"<!-- three.js (npm three@0.170.0) is vendored under its MIT licence:\n", html.EscapeString(strings.ReplaceAll(threeLicense, "--", "- -")), "-->\n",
		"</body>\n</html>\n",
	}
	for _, p := range parts {
		if _, err := io.WriteString(w, p); err != nil {
			return err
		}
	}
	return nil
}
