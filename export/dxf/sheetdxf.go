package dxf

import (
	"cmp"
	"fmt"
	"io"
	"math"
	"slices"

	"github.com/yofu/dxf/color"

	"pqfab/export/internal/layout"
	"pqfab/geom"
	"pqfab/internal/report"
)

// Layers of the cut sheets: one concept each, colour by layer.
const (
	LayerSheetEdge   = "PQ-SHEET-EDGE"   // outline of the stock sheet
	LayerSheetMargin = "PQ-SHEET-MARGIN" // edge of the usable area
	LayerCut         = "PQ-CUT"          // panel cut outlines
	LayerEngrave     = "PQ-ENGRAVE"      // what is engraved on a part, its label and type, in single strokes (open polylines)
	LayerPartText    = "PQ-PART-TEXT"    // the same label and type as text, for reading on screen (not engraved)
	LayerPartMark    = "PQ-PART-MARK"    // corner 1 (a ring) and the edge numbers of every part
	LayerBevel       = "PQ-BEVEL"        // the bevel of each edge, as text along the edge
	LayerGrain       = "PQ-GRAIN"        // grain direction arrows (stock with rotation "grain")
	LayerCutOrder    = "PQ-CUT-ORDER"    // glass: the straight cuts, where they do not run along a part's cut outline
	LayerCutNumber   = "PQ-CUT-NUMBER"   // glass: each cut's number in cutting order, circled
)

// Colours of the cut-order layers (AutoCAD colour index 30, orange): apart
// from the part marks' and the cut outlines'.
const cutOrderColor = 30

// WriteSheetDXF writes one stock sheet as a cut sheet in mm: the sheet
// outline, the usable area inside the margin, every part's cut outline
// where it lies; on the engraving layer each part's label and type in a
// single-stroke font of our own (open polylines an engraver follows once),
// and the same as text on a layer of their own for the screen; on the
// mark layer a ring at corner 1 and the number of each edge (edge k runs
// from corner k to k+1, as in the schedule); on the bevel layer each
// edge's bevel; for grain stock an arrow along the grain on the sheet and
// on every part; for glass the cuts in cutting order, drawn only where they
// leave the parts' cut outlines, each numbered in a circle on a layer and
// colour of its own; and a title block with the bevel sign, the caution
// and any warnings. A part cut inside face up (a mirrored placement) says
// so.
//
// It is safe to call from several goroutines: drawings are built one at a
// time (the DXF library keeps package-level state).
func WriteSheetDXF(w io.Writer, rep *report.Report, sheet int) error {
	layers := []dxfLayer{{LayerSheetEdge, color.Grey128, nil}, {LayerSheetMargin, color.Cyan, nil},
		{LayerCut, color.Red, nil}, {LayerEngrave, color.Green, nil}, {LayerPartText, color.Grey128, nil}, {LayerPartMark, color.Magenta, nil},
		{LayerBevel, color.Yellow, nil}, {LayerGrain, color.Blue, nil}, {LayerCutOrder, cutOrderColor, nil}, {LayerCutNumber, cutOrderColor, nil},
		{LayerTitle, color.White, nil}}
	return writeDXF(w, layers, 0, func(d *dxfDoc) error { return drawSheet(d, rep, sheet) })
}

// drawSheet draws cut sheet number sheet.
func drawSheet(d *dxfDoc, rep *report.Report, sheet int) error {
	s := rep.Sheets[sheet]
	grain := s.Rotation == "grain"
	m := s.MarginMM
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	add(func() error { return useLayer(d, LayerSheetEdge) })
	add(func() error { return closedPoly(d, rectPts(0, 0, s.WidthMM, s.HeightMM)) })
	add(func() error { return useLayer(d, LayerSheetMargin) })
	add(func() error { return closedPoly(d, rectPts(m, m, s.WidthMM-m, s.HeightMM-m)) })
	add(func() error { return useLayer(d, LayerCut) })
	for _, p := range s.Placements {
		add(func() error { return closedPoly(d, p.Outline) })
	}
	// The label and type: engraved in single strokes, and as text on
	// their own layer for reading on screen. put writes one line of
	// height h centred on (x, y) in one of the two ways.
	labels := func(layer string, put func(s string, x, y, h float64) error) {
		add(func() error { return useLayer(d, layer) })
		for _, p := range s.Placements {
			add(func() error {
				cx, cy, size := layout.LabelSpot(p.Outline)
				h := partTextHeight(size)
				second := rep.Panel(p.Panel).Type
				if p.Mirrored {
					second += " inside face up"
				}
				if err := put(p.Panel, cx, cy+0.7*h, h); err != nil {
					return err
				}
				return put(second, cx, cy-0.7*h, 0.6*h)
			})
		}
	}
	labels(LayerEngrave, func(s string, x, y, h float64) error {
		for _, st := range strokeText(s, x, y, h) {
			if err := d.openPoly(st); err != nil {
				return err
			}
		}
		return nil
	})
	labels(LayerPartText, func(s string, x, y, h float64) error { return text(d, s, x, y, 0, h, 0) })
	add(func() error { return useLayer(d, LayerPartMark) })
	for _, p := range s.Placements {
		add(func() error { return partMarks(d, p) })
	}
	add(func() error { return useLayer(d, LayerBevel) })
	for _, p := range s.Placements {
		add(func() error { return bevelTexts(d, p, *rep.Panel(p.Panel)) })
	}
	if grain {
		add(func() error { return useLayer(d, LayerGrain) })
		add(func() error {
			y := s.HeightMM + 60
			if err := arrow(d, s.WidthMM/2-400, y, s.WidthMM/2+400, y, 40); err != nil {
				return err
			}
			return text(d, "GRAIN", s.WidthMM/2, y+50, 0, 30, 0)
		})
		for _, p := range s.Placements {
			add(func() error {
				cx, cy, size := layout.LabelSpot(p.Outline)
				h := partTextHeight(size)
				// The panel's grain direction where the part lies: its
				// own direction, mirrored if the part is, then turned.
				g := rep.Panel(p.Panel).GrainDeg
				if p.Mirrored {
					g = 180 - g
				}
				s, c := math.Sincos((g + p.RotationDeg) * math.Pi / 180)
				x, y := cx, cy-2.2*h
				return arrow(d, x-3*h*c, y-3*h*s, x+3*h*c, y+3*h*s, 0.8*h)
			})
		}
	}
	if len(s.Cuts) > 0 {
		parts := make([][][2]float64, len(s.Placements))
		nh := 0.0 // the cut numbers' height: well above the edge numbers'
		for i, p := range s.Placements {
			parts[i] = p.Outline
			_, _, size := layout.LabelSpot(p.Outline)
			nh = max(nh, cutNumberScale*0.5*partTextHeight(size))
		}
		segs := outlineSegments(parts...)
		spans := make([][][2][2]float64, len(s.Cuts))
		for i, c := range s.Cuts {
			spans[i] = offOutlines(c.From, c.To, segs)
		}
		add(func() error { return useLayer(d, LayerCutOrder) })
		for i := range s.Cuts {
			add(func() error {
				for _, sp := range spans[i] {
					if _, err := d.Line(sp[0][0], sp[0][1], 0, sp[1][0], sp[1][1], 0); err != nil {
						return err
					}
				}
				return nil
			})
		}
		polys := make([]geom.Polygon, len(parts))
		for i, p := range parts {
			polys[i] = make(geom.Polygon, len(p))
			for j, v := range p {
				polys[i][j] = geom.Vec2{X: v[0], Y: v[1]}
			}
		}
		add(func() error { return useLayer(d, LayerCutNumber) })
		for i, c := range s.Cuts {
			add(func() error {
				num := fmt.Sprint(i + 1)
				rad := max(0.9*nh, dxfTextWidth(num, nh)/2+0.3*nh)
				at := cutNumberSpot(c, spans[i], rad, segs, polys)
				if _, err := d.Circle(at[0], at[1], 0, rad); err != nil {
					return err
				}
				return text(d, num, at[0], at[1], 0, nh, 0)
			})
		}
	}
	add(func() error { return useLayer(d, LayerTitle) })
	if len(s.Cuts) > 0 {
		add(func() error {
			return text(d, fmt.Sprintf("%d straight cuts edge to edge, %s m, in the circled order (layer %s; drawn only where they leave the parts' cut outlines)",
				len(s.Cuts), layout.Fixed(s.CutLengthMM/1000, 3), LayerCutOrder),
				s.WidthMM/2, -240, 0, 20, 0)
		})
	}
	add(func() error {
		return text(d, fmt.Sprintf("%s  %s  %s %g x %g mm  %d parts  %.1f %%", rep.Title, s.Name, s.Stock, s.WidthMM, s.HeightMM, len(s.Placements), 100*s.Utilization),
			s.WidthMM/2, -60, 0, 30, 0)
	})
	add(func() error {
		return text(d, "Parts seen from outside (the face the net's normals point to) unless marked inside face up; corner 1 ringed, edge k from corner k to k+1",
			s.WidthMM/2, -100, 0, 14, 0)
	})
	add(func() error { return text(d, layout.BevelSignNote, s.WidthMM/2, -130, 0, 14, 0) })
	add(func() error { return text(d, "CAUTION: "+report.Caution, s.WidthMM/2, -150, 0, 14, 0) })
	for i, wl := range layout.WarningLines(rep.Warnings) {
		add(func() error { return text(d, wl, s.WidthMM/2, -190-30*float64(i), 0, 14, 0) })
	}
	for _, st := range steps {
		if err := st(); err != nil {
			return err
		}
	}
	return nil
}

// cutNumberScale: a cut's number is this many times the height of the
// largest edge number on its sheet.
const cutNumberScale = 2.0

// onOutlineTolMM: a stretch of a cut that lies this close to a part's cut
// outline edge (both ends, the edge along the cut) runs along that edge
// and is not drawn again.
const onOutlineTolMM = 0.01

// offOutlines returns the spans of the segment from a to b that do not
// run along any of segs (within onOutlineTolMM), in order from a.
func offOutlines(a, b [2]float64, segs [][2][2]float64) [][2][2]float64 {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l := math.Hypot(dx, dy)
	if l == 0 {
		return nil
	}
	ux, uy := dx/l, dy/l
	along := func(p [2]float64) (t, off float64) {
		px, py := p[0]-a[0], p[1]-a[1]
		return px*ux + py*uy, math.Abs(-px*uy + py*ux)
	}
	var covered [][2]float64
	for _, sg := range segs {
		t0, o0 := along(sg[0])
		t1, o1 := along(sg[1])
		if o0 > onOutlineTolMM || o1 > onOutlineTolMM {
			continue
		}
		lo, hi := max(0, min(t0, t1)), min(l, max(t0, t1))
		if hi > lo {
			covered = append(covered, [2]float64{lo, hi})
		}
	}
	slices.SortFunc(covered, func(p, q [2]float64) int { return cmp.Compare(p[0], q[0]) })
	var out [][2][2]float64
	at := func(t float64) [2]float64 { return [2]float64{a[0] + t*ux, a[1] + t*uy} }
	t := 0.0
	for _, c := range covered {
		if c[0] > t+onOutlineTolMM {
			out = append(out, [2][2]float64{at(t), at(c[0])})
		}
		t = max(t, c[1])
	}
	if l > t+onOutlineTolMM {
		out = append(out, [2][2]float64{at(t), b})
	}
	return out
}

// cutNumberSpot returns where a cut's circled number (radius rad) goes:
// the middle of its longest drawn span, else of the cut, where the circle
// is clear of the parts; else at a quarter or three quarters along; each
// on the cut or beside it on either side; the middle when none is clear.
func cutNumberSpot(c report.SheetCutRow, spans [][2][2]float64, rad float64, segs [][2][2]float64, parts []geom.Polygon) [2]float64 {
	a, b := c.From, c.To
	best := -1.0
	for _, sp := range spans {
		if l := math.Hypot(sp[1][0]-sp[0][0], sp[1][1]-sp[0][1]); l > best {
			best, a, b = l, sp[0], sp[1]
		}
	}
	u := unit2(b[0]-a[0], b[1]-a[1])
	off := rad * 1.3
	for _, t := range []float64{0.5, 0.25, 0.75} {
		m := [2]float64{a[0] + t*(b[0]-a[0]), a[1] + t*(b[1]-a[1])}
		for _, side := range []float64{0, 1, -1} {
			p := [2]float64{m[0] - side*off*u[1], m[1] + side*off*u[0]}
			if boxHits(p, rad, rad, 0, segs) {
				continue
			}
			inside := false
			for _, q := range parts {
				if q.Contains(geom.Vec2{X: p[0], Y: p[1]}) {
					inside = true
					break
				}
			}
			if !inside {
				return p
			}
		}
	}
	return [2]float64{(a[0] + b[0]) / 2, (a[1] + b[1]) / 2}
}

// partTextHeight is the label height on a part of the given size (mm).
func partTextHeight(size float64) float64 { return math.Max(10, math.Min(80, size/12)) }

// partMarks draws a ring inside corner 1 and the number of each edge
// inside its midpoint. Corner 1 of a panel is corner 1 of its type, and a
// part cut turned over (mirrored) runs corner 1, k, k−1, … of the panel,
// which is its type's order; so the placed outline's order numbers the
// edges as the type drawing does, for every part.
func partMarks(d *dxfDoc, p report.PlacementRow) error {
	_, _, size := layout.LabelSpot(p.Outline)
	h := 0.5 * partTextHeight(size)
	k := len(p.Outline)
	c := inward(p.Outline, 0, 1.6*h)
	if _, err := d.Circle(c[0], c[1], 0, 0.6*h); err != nil {
		return err
	}
	for j := 0; j < k; j++ {
		_, ang, in := edgeSpot(p.Outline, j, 1.2*h)
		if err := text(d, fmt.Sprint(j+1), in[0], in[1], 0, h, ang); err != nil {
			return err
		}
	}
	return nil
}

// bevelTexts writes each edge's bevel along it, inside the edge number.
func bevelTexts(d *dxfDoc, p report.PlacementRow, panel report.PanelRow) error {
	_, _, size := layout.LabelSpot(p.Outline)
	h := 0.4 * partTextHeight(size)
	k := len(p.Outline)
	for j := 0; j < k; j++ {
		e := panelEdge(j, k, p.Mirrored)
		if e >= len(panel.Edges) {
			continue
		}
		_, ang, at := edgeSpot(p.Outline, j, 3.2*h)
		if err := text(d, "bevel "+layout.SignedFixed(panel.Edges[e].BevelDeg, 2)+"°", at[0], at[1], 0, h, ang); err != nil {
			return err
		}
	}
	return nil
}

// panelEdge returns the panel's own number (0-based) of edge j of a
// placed outline of k corners.
func panelEdge(j, k int, mirrored bool) int {
	if mirrored {
		return (2*k - j - 1) % k
	}
	return j
}

// edgeSpot returns the midpoint of edge j of a counter-clockwise outline,
// the edge's direction for text (degrees, turned to read left to right)
// and the point off its midpoint by in millimetres into the part.
func edgeSpot(pts [][2]float64, j int, in float64) (mid [2]float64, angDeg float64, at [2]float64) {
	a, b := pts[j], pts[(j+1)%len(pts)]
	mid = [2]float64{(a[0] + b[0]) / 2, (a[1] + b[1]) / 2}
	dx, dy := b[0]-a[0], b[1]-a[1]
	l := math.Hypot(dx, dy)
	if l == 0 {
		return mid, 0, mid
	}
	nx, ny := -dy/l, dx/l // left of a→b: inside a counter-clockwise outline
	at = [2]float64{mid[0] + in*nx, mid[1] + in*ny}
	angDeg = math.Atan2(dy, dx) * 180 / math.Pi
	if angDeg > 90 {
		angDeg -= 180
	} else if angDeg < -90 {
		angDeg += 180
	}
	return mid, angDeg, at
}

// inward returns the point at distance in from corner i along the bisector
// of its two edges, into the outline.
func inward(pts [][2]float64, i int, in float64) [2]float64 {
	k := len(pts)
	p, a, b := pts[i], pts[(i+k-1)%k], pts[(i+1)%k]
	u := unit2(b[0]-p[0], b[1]-p[1])
	v := unit2(a[0]-p[0], a[1]-p[1])
	bx, by := u[0]+v[0], u[1]+v[1]
	if l := math.Hypot(bx, by); l > 1e-12 {
		return [2]float64{p[0] + in*bx/l, p[1] + in*by/l}
	}
	return [2]float64{p[0] - in*u[1], p[1] + in*u[0]} // a straight corner: off the edge
}

func unit2(x, y float64) [2]float64 {
	l := math.Hypot(x, y)
	if l == 0 {
		return [2]float64{}
	}
	return [2]float64{x / l, y / l}
}

// arrow draws a line from (x0, y0) to (x1, y1) with a head of size h at
// its end.
func arrow(d *dxfDoc, x0, y0, x1, y1, h float64) error {
	if _, err := d.Line(x0, y0, 0, x1, y1, 0); err != nil {
		return err
	}
	u := unit2(x1-x0, y1-y0)
	for _, side := range []float64{1, -1} {
		hx := x1 - h*u[0] - side*0.5*h*u[1]
		hy := y1 - h*u[1] + side*0.5*h*u[0]
		if _, err := d.Line(x1, y1, 0, hx, hy, 0); err != nil {
			return err
		}
	}
	return nil
}
