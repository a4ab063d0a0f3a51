package dxf

import (
	"fmt"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"pqfab/internal/report"
	"strings"

	"github.com/yofu/dxf/color"
)

// Texts of the panel type drawings start with these words, so a reader can
// find each number (the read-back tests do): "edge 2 1548.68", "angle 3
// 89.530°", "diagonal 1-3 2937.68", "bevel 2 +4.24°", "bevel 3 -5.65° to
// +5.66°".
const (
	panelEdgeText     = "edge "
	panelAngleText    = "angle "
	panelDiagonalText = "diagonal "
	panelBevelText    = "bevel "
)

// panelTypeLayers are the layers of a panel type drawing, in dark
// colours that read on white paper (AutoCAD colour index: 14 dark red, 5
// blue, 250 dark grey; no yellow or white text).
var panelTypeLayers = []dxfLayer{{LayerPart, 14, nil}, {LayerSetOut, color.Grey128, nil},
	{LayerDim, color.Blue, nil}, {LayerNote, color.Grey51, nil}, {LayerTitle, color.Grey51, nil}}

// panelDrawing is what a panel type drawing shows: the nominal cut
// outline with its numbers (measured on that outline, as the schedule
// gives them), the set-out outline around it, each edge's bevel (the range
// over the type's parts, and every part's), the specification and the
// parts.
type panelDrawing struct {
	Title, Name, Material string
	ThicknessMM           float64
	Count                 int
	Parts                 []string
	Mirrored              []string // parts cut from this shape turned over
	Cut, SetOut           [][2]float64
	EdgesMM, AnglesDeg    []float64
	Diagonals             []report.DiagonalRow // From and To are corner numbers from 1
	BevelsDeg             [][2]float64         // per edge: least and most over the parts
	PartBevels            []report.PartBevelsRow
	BevelledEdges         bool // the bevels are part of the type
	Spec                  report.PanelSpec
	DevMM, DevDeg         float64
	Warnings              []string
}

// writePanelDXF draws one panel type at 1:1 in mm, seen from outside (the
// face the net's normals point to): the cut outline (corner 1 at the
// origin, edge 1 along x) on the part layer and the set-out outline on its
// own; on the dimension layer every edge length along its edge, every
// corner angle, every diagonal as a line with its length, corner 1 ringed
// and each edge's number, and each edge's bevel, each text moved clear of
// the outlines; notes with the bevel sign, every part's bevels, the
// specification and the parts; a title block with the caution.
func writePanelDXF(w io.Writer, p panelDrawing) error {
	return writeDXF(w, panelTypeLayers, 0, func(d *dxfDoc) error { return drawPanel(d, p) })
}

// bevelRange is an edge's bevel range as a drawing prints it: "+2.12°",
// or "-5.65° to +5.66°".
func bevelRange(bv [2]float64) string {
	s := layout.SignedFixed(bv[0], 2) + "°"
	if layout.Fixed(bv[0], 2) != layout.Fixed(bv[1], 2) {
		s += " to " + layout.SignedFixed(bv[1], 2) + "°"
	}
	return s
}

// drawPanel draws a panel type.
func drawPanel(d *dxfDoc, p panelDrawing) error {
	_, _, size := layout.LabelSpot(p.Cut)
	h := math.Max(12, math.Min(50, size/40))
	k := len(p.Cut)
	lox, loy, hix, _ := bounds(p.SetOut)
	avoid := outlineSegments(p.Cut, p.SetOut)
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	// clear writes a text centred at (x, y), first moved along dir in
	// steps of h/2 until it is clear of both outlines.
	clear := func(s string, x, y, th, ang float64, dir [2]float64) error {
		c := clearSpot(s, x, y, th, ang, dir, h/2, avoid)
		return text(d, s, c[0], c[1], 0, th, ang)
	}
	add(func() error { return useLayer(d, LayerPart) })
	add(func() error { return closedPoly(d, p.Cut) })
	add(func() error { return useLayer(d, LayerSetOut) })
	add(func() error { return closedPoly(d, p.SetOut) })
	add(func() error { return useLayer(d, LayerDim) })
	for j := 0; j < k; j++ {
		add(func() error {
			mid, ang, out := edgeSpot(p.Cut, j, -2.2*h)
			away := unit2(out[0]-mid[0], out[1]-mid[1])
			if err := clear(fmt.Sprintf("%s%d %s", panelEdgeText, j+1, layout.Fixed(p.EdgesMM[j], report.LenDigits)), out[0], out[1], h, ang, away); err != nil {
				return err
			}
			_, _, in := edgeSpot(p.Cut, j, 1.6*h)
			if j < len(p.BevelsDeg) {
				if err := clear(fmt.Sprintf("%s%d %s", panelBevelText, j+1, bevelRange(p.BevelsDeg[j])), in[0], in[1], 0.8*h, ang, [2]float64{-away[0], -away[1]}); err != nil {
					return err
				}
			}
			c := inward(p.Cut, j, 5*h)
			dir := unit2(c[0]-p.Cut[j][0], c[1]-p.Cut[j][1])
			return clear(fmt.Sprintf("%s%d %s°", panelAngleText, j+1, layout.Fixed(p.AnglesDeg[j], report.AngleDigits)), c[0], c[1], 0.8*h, 0, dir)
		})
	}
	for n, dg := range p.Diagonals {
		add(func() error {
			var i, j int
			fmt.Sscanf(dg.From, "%d", &i)
			fmt.Sscanf(dg.To, "%d", &j)
			a, b := p.Cut[i-1], p.Cut[j-1]
			if err := line(d, a[0], a[1], b[0], b[1]); err != nil {
				return err
			}
			// Diagonals cross near their middles: each text sits at its
			// own share of its diagonal, and slides to the middle until
			// clear of the outlines.
			t := 0.3 + 0.4*float64(n%2)
			mx, my := a[0]+t*(b[0]-a[0]), a[1]+t*(b[1]-a[1])
			ang := math.Atan2(b[1]-a[1], b[0]-a[0]) * 180 / math.Pi
			if ang > 90 {
				ang -= 180
			} else if ang < -90 {
				ang += 180
			}
			dir := unit2(b[0]-a[0], b[1]-a[1])
			if t > 0.5 {
				dir = [2]float64{-dir[0], -dir[1]}
			}
			return clear(fmt.Sprintf("%s%d-%d %s", panelDiagonalText, i, j, layout.Fixed(dg.MM, report.LenDigits)), mx, my+0.8*h, 0.8*h, ang, dir)
		})
	}
	add(func() error {
		c := inward(p.Cut, 0, 2.5*h)
		if _, err := d.Circle(c[0], c[1], 0, 0.8*h); err != nil {
			return err
		}
		return text(d, "1", c[0], c[1], 0, 0.8*h, 0)
	})
	add(func() error { return useLayer(d, LayerNote) })
	cx := (lox + hix) / 2
	notes := []string{
		fmt.Sprintf("%s: %d panels, %s %s mm; largest deviation of a panel from this drawing %s mm, %s°", p.Name, p.Count, p.Material, layout.Fixed(p.ThicknessMM, 2), layout.Fixed(p.DevMM, 2), layout.Fixed(p.DevDeg, 3)),
		"seen from outside: the face the net's normals point to (up, or out of a closed net); edge k runs from corner k to k+1, corner 1 ringed",
		"dark red: cut outline (what is cut; its diagonals are the pane's own); grey: set-out outline (member centre lines)",
		layout.BevelSignNote,
	}
	if p.BevelledEdges {
		notes = append(notes, "edges bevelled: each edge's bevel, sign included, is part of this type (every panel's within the type's angle tolerance)")
	}
	for _, s := range []struct{ name, v string }{{"build-up", p.Spec.BuildUp}, {"edge work", p.Spec.EdgeWork}, {"coating", p.Spec.Coating},
		{"heat treatment", p.Spec.HeatTreatment}, {"grade", p.Spec.Grade}} {
		if s.v != "" {
			notes = append(notes, s.name+": "+s.v)
		}
	}
	notes = append(notes, wrapLabels("panels: ", p.Parts, 12)...)
	if len(p.Mirrored) > 0 {
		notes = append(notes, wrapLabels("cut from this shape turned over (inside face up): ", p.Mirrored, 10)...)
	}
	notes = append(notes, partBevelLines(p.PartBevels, p.Mirrored, k)...)
	for i, s := range notes {
		add(func() error { return text(d, s, cx, loy-(5+1.4*float64(i))*h, 0, 0.8*h, 0) })
	}
	yt := loy - (6.5+1.4*float64(len(notes)))*h
	add(func() error { return useLayer(d, LayerTitle) })
	add(func() error { return text(d, p.Title+" - panel type "+p.Name+", mm, 1:1", cx, yt, 0, 1.5*h, 0) })
	add(func() error { return text(d, "CAUTION: "+report.Caution, cx, yt-2.2*h, 0, 0.6*h, 0) })
	for i, wl := range layout.WarningLines(p.Warnings) {
		add(func() error { return text(d, wl, cx, yt-(3.4+1.2*float64(i))*h, 0, 0.6*h, 0) })
	}
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	return nil
}

// PartBevelsText starts the lines of a panel type drawing that list a
// panel's bevels by the type's edges: "bevels of C3-P05 (edges 1-4): +2.12
// -5.65 +3.00 0.00".
const PartBevelsText = "bevels of "

// partBevelLines lists every part's bevels by the type's edges; a part
// cut turned over says so (its own signs are reversed).
func partBevelLines(parts []report.PartBevelsRow, turned []string, k int) []string {
	over := map[string]bool{}
	for _, l := range turned {
		over[l] = true
	}
	out := make([]string, 0, len(parts))
	for _, pb := range parts {
		bs := make([]string, len(pb.BevelsDeg))
		for i, b := range pb.BevelsDeg {
			bs[i] = layout.SignedFixed(b, 2)
		}
		s := fmt.Sprintf("%s%s (edges 1-%d): %s", PartBevelsText, pb.Panel, k, strings.Join(bs, " "))
		if over[pb.Panel] {
			s += " (turned over: signs for this drawing's faces)"
		}
		out = append(out, s)
	}
	return out
}

// outlineSegments lists the edges of closed outlines as segments.
func outlineSegments(outlines ...[][2]float64) [][2][2]float64 {
	var out [][2][2]float64
	for _, o := range outlines {
		for i := range o {
			out = append(out, [2][2]float64{o[i], o[(i+1)%len(o)]})
		}
	}
	return out
}

// clearSteps is how many steps a text is moved, at most, to clear the
// outlines; beyond them it stays at its last place.
const clearSteps = 40

// clearSpot returns where a text of height h, turned by angDeg and
// centred at (x, y), is clear of every segment: (x, y) moved along dir
// by the fewest steps of step.
func clearSpot(s string, x, y, h, angDeg float64, dir [2]float64, step float64, segs [][2][2]float64) [2]float64 {
	c := [2]float64{x, y}
	for n := 0; n < clearSteps; n++ {
		if !textHits(s, c, h, angDeg, segs) {
			break
		}
		c = [2]float64{c[0] + step*dir[0], c[1] + step*dir[1]}
	}
	return c
}

// textHits says whether the box of a centred text (width estimated by
// dxfTextWidth, height h, with a margin of h/4 around it) crosses or
// holds a point of any segment.
func textHits(s string, c [2]float64, h, angDeg float64, segs [][2][2]float64) bool {
	return boxHits(c, dxfTextWidth(dxfText(s), h)/2+h/4, h/2+h/4, angDeg, segs)
}

// boxHits says whether the box of half width hw and half height hh about
// c, turned by angDeg, crosses or holds a point of any segment.
func boxHits(c [2]float64, hw, hh, angDeg float64, segs [][2][2]float64) bool {
	sn, cs := math.Sincos(angDeg * math.Pi / 180)
	// In the text's own frame the box is [-hw, hw] × [-hh, hh].
	local := func(p [2]float64) [2]float64 {
		dx, dy := p[0]-c[0], p[1]-c[1]
		return [2]float64{dx*cs + dy*sn, -dx*sn + dy*cs}
	}
	for _, sg := range segs {
		if segmentHitsBox(local(sg[0]), local(sg[1]), hw, hh) {
			return true
		}
	}
	return false
}

// segmentHitsBox says whether the segment a–b meets the box [-hw, hw] ×
// [-hh, hh] (Liang–Barsky clipping).
func segmentHitsBox(a, b [2]float64, hw, hh float64) bool {
	t0, t1 := 0.0, 1.0
	dx, dy := b[0]-a[0], b[1]-a[1]
	for _, e := range [4][2]float64{{-dx, a[0] + hw}, {dx, hw - a[0]}, {-dy, a[1] + hh}, {dy, hh - a[1]}} {
		p, q := e[0], e[1]
		if p == 0 {
			if q < 0 {
				return false
			}
			continue
		}
		t := q / p
		if p < 0 {
			t0 = max(t0, t)
		} else {
			t1 = min(t1, t)
		}
		if t0 > t1 {
			return false
		}
	}
	return true
}

// bounds returns the lower-left and upper-right corners of points.
func bounds(pts [][2]float64) (lox, loy, hix, hiy float64) {
	lox, loy, hix, hiy = math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, p := range pts {
		lox, loy = math.Min(lox, p[0]), math.Min(loy, p[1])
		hix, hiy = math.Max(hix, p[0]), math.Max(hiy, p[1])
	}
	return lox, loy, hix, hiy
}

// WritePanelTypeDXF writes panel type t of the report as a drawing
// (panel-types/PT-NNN.dxf). Safe to call concurrently: drawings are built
// one at a time.
func WritePanelTypeDXF(w io.Writer, rep *report.Report, t int) error {
	pt := rep.PanelTypes[t]
	thick := rep.PanelMaterial.ThicknessMM
	if pt.Spec.ThicknessMM > 0 {
		thick = pt.Spec.ThicknessMM
	}
	return writePanelDXF(w, panelDrawing{Title: rep.Title, Name: pt.Name, Material: rep.PanelMaterial.Name, ThicknessMM: thick,
		Count: pt.Count, Parts: pt.Parts, Mirrored: pt.Mirrored, Cut: pt.Drawing.CutMM, SetOut: pt.Drawing.SetOutMM,
		EdgesMM: pt.Drawing.EdgesMM, AnglesDeg: pt.Drawing.AnglesDeg, Diagonals: pt.Drawing.Diagonals, BevelsDeg: pt.BevelsDeg,
		PartBevels: pt.PartBevels, BevelledEdges: rep.PanelMaterial.BevelledEdges,
		Spec: pt.Spec, DevMM: pt.MaxDevMM, DevDeg: pt.MaxDevDeg, Warnings: rep.Warnings})
}
