package export

import (
	"fmt"
	"io"
	"math"
)

// Texts of the panel type drawings start with these words, so a reader can
// find each number (the read-back tests do): "edge 2 1548.68", "angle 3
// 89.53°", "diagonal 1-3 2937.68", "bevel 2 4.24°".
const (
	panelEdgeText     = "edge "
	panelAngleText    = "angle "
	panelDiagonalText = "diagonal "
	panelBevelText    = "bevel "
)

// panelDrawing is what a panel type drawing shows: the nominal cut
// outline with its numbers (measured on that outline), the set-out
// outline around it, each edge's bevel (the range over the type's parts),
// the specification and the parts.
type panelDrawing struct {
	Title, Name, Material string
	ThicknessMM           float64
	Count                 int
	Parts                 []string
	Mirrored              []string // parts cut from this shape turned over
	Cut, SetOut           [][2]float64
	EdgesMM, AnglesDeg    []float64
	Diagonals             []DiagonalRow // From and To are corner numbers from 1
	BevelsDeg             [][2]float64  // per edge: least and most over the parts
	Spec                  PanelSpec
	DevMM, DevDeg         float64
	Warnings              []string
}

// writePanelDXF draws one panel type at 1:1 in mm, seen from outside (the
// face the net's normals point to): the cut outline (corner 1 at the
// origin, edge 1 along x) on the part layer and the set-out outline on its
// own; on the dimension layer every edge length along its edge, every
// corner angle, every diagonal as a line with its length, corner 1 ringed
// and each edge's number, and each edge's bevel; notes with the
// specification and the parts; a title block with the caution.
func writePanelDXF(w io.Writer, p panelDrawing) error {
	return writeDXF(w, typeLayers, 0, func(d *dxfDoc) error { return drawPanel(d, p) })
}

// drawPanel draws a panel type.
func drawPanel(d *dxfDoc, p panelDrawing) error {
	_, _, size := labelSpot(p.Cut)
	h := math.Max(12, math.Min(50, size/40))
	k := len(p.Cut)
	lox, loy, hix, _ := bounds(p.SetOut)
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	add(func() error { return useLayer(d, LayerPart) })
	add(func() error { return closedPoly(d, p.Cut) })
	add(func() error { return useLayer(d, LayerSetOut) })
	add(func() error { return closedPoly(d, p.SetOut) })
	add(func() error { return useLayer(d, LayerDim) })
	for j := 0; j < k; j++ {
		add(func() error {
			_, ang, out := edgeSpot(p.Cut, j, -2.2*h)
			if err := text(d, fmt.Sprintf("%s%d %s", panelEdgeText, j+1, fixed(p.EdgesMM[j], 2)), out[0], out[1], 0, h, ang); err != nil {
				return err
			}
			_, _, in := edgeSpot(p.Cut, j, 1.6*h)
			if j < len(p.BevelsDeg) {
				bv := p.BevelsDeg[j]
				s := fixed(bv[0], 2) + "°"
				if fixed(bv[0], 2) != fixed(bv[1], 2) {
					s += " to " + fixed(bv[1], 2) + "°"
				}
				if err := text(d, fmt.Sprintf("%s%d %s", panelBevelText, j+1, s), in[0], in[1], 0, 0.8*h, ang); err != nil {
					return err
				}
			}
			c := inward(p.Cut, j, 5*h)
			return text(d, fmt.Sprintf("%s%d %s°", panelAngleText, j+1, fixed(p.AnglesDeg[j], 2)), c[0], c[1], 0, 0.8*h, 0)
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
			// own share of its diagonal.
			t := 0.3 + 0.4*float64(n%2)
			mx, my := a[0]+t*(b[0]-a[0]), a[1]+t*(b[1]-a[1])
			ang := math.Atan2(b[1]-a[1], b[0]-a[0]) * 180 / math.Pi
			if ang > 90 {
				ang -= 180
			} else if ang < -90 {
				ang += 180
			}
			return text(d, fmt.Sprintf("%s%d-%d %s", panelDiagonalText, i, j, fixed(dg.MM, 2)), mx, my+0.8*h, 0, 0.8*h, ang)
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
		fmt.Sprintf("%s: %d panels, %s %s mm; largest deviation of a panel from this shape %s mm, %s°", p.Name, p.Count, p.Material, fixed(p.ThicknessMM, 2), fixed(p.DevMM, 2), fixed(p.DevDeg, 3)),
		"seen from outside: the face the net's normals point to (up, or out of a closed net); edge k runs from corner k to k+1, corner 1 ringed",
		"red: cut outline (what is cut); grey: set-out outline (member centre lines)",
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
	for i, s := range notes {
		add(func() error { return text(d, s, cx, loy-(5+1.4*float64(i))*h, 0, 0.8*h, 0) })
	}
	yt := loy - (6.5+1.4*float64(len(notes)))*h
	add(func() error { return useLayer(d, LayerTitle) })
	add(func() error { return text(d, p.Title+" - panel type "+p.Name+", mm, 1:1", cx, yt, 0, 1.5*h, 0) })
	add(func() error { return text(d, "CAUTION: "+Caution, cx, yt-2.2*h, 0, 0.6*h, 0) })
	for i, wl := range warningLines(p.Warnings) {
		add(func() error { return text(d, wl, cx, yt-(3.4+1.2*float64(i))*h, 0, 0.6*h, 0) })
	}
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	return nil
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
func WritePanelTypeDXF(w io.Writer, rep *Report, t int) error {
	pt := rep.PanelTypes[t]
	return writePanelDXF(w, panelDrawing{Title: rep.Title, Name: pt.Name, Material: rep.PanelMaterial.Name, ThicknessMM: rep.PanelMaterial.ThicknessMM,
		Count: pt.Count, Parts: pt.Parts, Mirrored: pt.Mirrored, Cut: pt.Drawing.CutMM, SetOut: pt.Drawing.SetOutMM,
		EdgesMM: pt.Drawing.EdgesMM, AnglesDeg: pt.Drawing.AnglesDeg, Diagonals: pt.Drawing.Diagonals, BevelsDeg: pt.BevelsDeg,
		Spec: pt.Spec, DevMM: pt.MaxDevMM, DevDeg: pt.MaxDevDeg, Warnings: rep.Warnings})
}
