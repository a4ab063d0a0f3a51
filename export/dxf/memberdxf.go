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

// Layers of the type drawings (member and panel types).
const (
	LayerPart   = "PQ-PART"    // the part as cut: outline, section, end cuts
	LayerSetOut = "PQ-SET-OUT" // the set-out (centre-line) outline of a panel, the member's system line
	LayerBlank  = "PQ-BLANK"   // the blank a member is cut from
	LayerDim    = "PQ-DIM"     // dimension lines and their texts
	LayerNote   = "PQ-NOTE"    // notes: parts of the type, faces, specification
)

// typeLayers are the layers of a member type drawing, in dark colours
// that read on white paper, as the panel type drawings' (AutoCAD colour
// index: 14 dark red, 30 orange, 5 blue, 250 dark grey; no yellow or white
// text).
var typeLayers = []dxfLayer{{LayerPart, 14, nil}, {LayerSetOut, color.Grey128, nil}, {LayerBlank, 30, nil},
	{LayerDim, color.Blue, nil}, {LayerNote, color.Grey51, nil}, {LayerTitle, color.Grey51, nil}}

// Texts of the member type drawings start with these words, so a reader
// can find each number (the read-back tests do).
const (
	memberCutText    = "cut length "
	memberBlankText  = "blank length "
	memberTwistText  = "twist "
	memberTopText    = "top face "
	memberBottomText = "bottom face "
	memberSideText   = "side "
	memberSetOutText = "system length "
)

// memberDrawing is what a member type drawing shows: the nominal part.
type memberDrawing struct {
	Title, Name, Material string
	Count                 int
	Parts, ReadFromB      []string
	WidthMM, DepthMM      float64
	WallMM                float64 // hollow section's wall; 0 solid
	CutLengthMM, BlankMM  float64
	SetOutMM              float64 // node to node
	Faces                 report.FaceLengthsRow
	Ends                  [2]report.TypeEndRow // nominal mitre, bevel and setback at A and B
	TwistDeg              float64
	DevMM, DevDeg         float64 // largest deviation of a part from the nominal
	Warnings              []string
}

// samePointMM: opposite faces whose lengths differ by less than this
// are cut square for the saw, so neither is marked long or short point.
const samePointMM = 0.5

// pointNames names two opposite face lengths: the longer the long point,
// the shorter the short point (neither within samePointMM).
func pointNames(a, b float64) (string, string) {
	switch {
	case a-b >= samePointMM:
		return " (long point)", " (short point)"
	case b-a >= samePointMM:
		return " (short point)", " (long point)"
	}
	return "", ""
}

// Vertical layout of a member drawing, in text heights h from the views'
// edges: dimension lines and text rows 2.5 h apart, so that no two texts
// (a row of height h and its dimension ticks of ±0.6 h) meet.
const memberRowH = 2.5

// writeMemberDXF draws one member type at 1:1 in mm: the elevation (x along
// the member, z up to the top of the section) and the plan (y across) of
// the nominal member between its two end cuts, with the blank it is cut
// from dashed around it, the set-out line from node to node, the section
// beside them, the lengths of the top and bottom faces (long and short
// point) and of the sides, the end cuts' mitre, bevel and setback, cut,
// blank and set-out lengths, the twist, every member of the type, which
// end carries the tag, and a title block with the caution.
func writeMemberDXF(w io.Writer, m memberDrawing) error {
	return writeDXF(w, typeLayers, 0, func(d *dxfDoc) error { return drawMember(d, m) })
}

// drawMember draws a member type.
func drawMember(d *dxfDoc, m memberDrawing) error {
	L, wd, dp := m.CutLengthMM, m.WidthMM, m.DepthMM
	a, b := m.Ends[0], m.Ends[1]
	h := math.Max(12, math.Min(60, L/60)) // text height
	row := memberRowH * h
	// The elevation's texts reach 3 rows below it, the plan's 2 above it.
	gap := dp/2 + wd/2 + 6*row
	// A view: the member between its cuts, seen across the coordinate c
	// (z in the elevation, y in the plan), drawn with c upwards at y0.
	view := func(y0, half float64, onZ bool) [][2]float64 {
		off := func(e report.TypeEndRow, c float64) float64 {
			if onZ {
				return e.Offset(0, c)
			}
			return e.Offset(c, 0)
		}
		return [][2]float64{{off(a, -half), y0 - half}, {L + off(b, -half), y0 - half}, {L + off(b, half), y0 + half}, {off(a, half), y0 + half}}
	}
	elevY, planY := 0.0, -gap
	lo := -endAllowance(a, wd, dp)
	hi := L + endAllowance(b, wd, dp)
	// The set-out line runs node to node: from −setback A to L + setback B.
	nodeA, nodeB := -a.SetbackMM, L+b.SetbackMM
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	add(func() error { return useLayer(d, LayerPart) })
	add(func() error { return closedPoly(d, view(elevY, dp/2, true)) })
	add(func() error { return closedPoly(d, view(planY, wd/2, false)) })
	sx := math.Max(hi, nodeB) + 4*h + wd/2
	add(func() error { return closedPoly(d, rectPts(sx-wd/2, elevY-dp/2, sx+wd/2, elevY+dp/2)) })
	if t := m.WallMM; t > 0 {
		add(func() error { return closedPoly(d, rectPts(sx-wd/2+t, elevY-dp/2+t, sx+wd/2-t, elevY+dp/2-t)) })
	}
	add(func() error { return useLayer(d, LayerBlank) })
	add(func() error { return closedPoly(d, rectPts(lo, elevY-dp/2, hi, elevY+dp/2)) })
	add(func() error { return closedPoly(d, rectPts(lo, planY-wd/2, hi, planY+wd/2)) })
	add(func() error { return useLayer(d, LayerSetOut) })
	for _, y := range []float64{elevY, planY} {
		add(func() error { return line(d, nodeA, y, nodeB, y) })
		for _, x := range []float64{nodeA, nodeB} { // node marks
			add(func() error { return line(d, x, y-0.6*h, x, y+0.6*h) })
		}
	}
	add(func() error { return useLayer(d, LayerDim) })
	dim := func(x0, x1, y float64, label string) {
		add(func() error { return dimension(d, x0, x1, y, h, label) })
	}
	f := m.Faces
	top, bottom := pointNames(f.Top, f.Bottom)
	pos, neg := pointNames(f.SidePos, f.SideNeg)
	// A view's upper edge runs from its corner 3 to 2, its lower from 0 to 1.
	edge := func(half float64, onZ, upper bool) (x0, x1 float64) {
		pts := view(0, half, onZ)
		if upper {
			return pts[3][0], pts[2][0]
		}
		return pts[0][0], pts[1][0]
	}
	tx0, tx1 := edge(dp/2, true, true)
	dim(tx0, tx1, elevY+dp/2+row, memberTopText+layout.Fixed(f.Top, 2)+" mm"+top)
	dim(0, L, elevY+dp/2+2*row, memberCutText+layout.Fixed(L, 2)+" mm (on the axis)")
	dim(lo, hi, elevY+dp/2+3*row, memberBlankText+layout.Fixed(m.BlankMM, 2)+" mm")
	bx0, bx1 := edge(dp/2, true, false)
	dim(bx0, bx1, elevY-dp/2-row, memberBottomText+layout.Fixed(f.Bottom, 2)+" mm"+bottom)
	dim(nodeA, nodeB, elevY-dp/2-2*row, memberSetOutText+layout.Fixed(m.SetOutMM, 2)+" mm (set-out line, node to node)")
	px0, px1 := edge(wd/2, false, true)
	dim(px0, px1, planY+wd/2+row, memberSideText+"+y "+layout.Fixed(f.SidePos, 2)+" mm"+pos)
	nx0, nx1 := edge(wd/2, false, false)
	dim(nx0, nx1, planY-wd/2-row, memberSideText+"-y "+layout.Fixed(f.SideNeg, 2)+" mm"+neg)
	for i, e := range m.Ends {
		x, anchor := 0.0, -1.0
		if i == 1 {
			x, anchor = L, 1
		}
		name := []string{"A", "B"}[i]
		lines := []string{
			[]string{"end A: the tag end", "end B: the other end"}[i],
			fmt.Sprintf("end %s: mitre %s°", name, layout.Fixed(e.MitreDeg, 3)),
			fmt.Sprintf("end %s: bevel %s°", name, layout.Fixed(e.BevelDeg, 3)),
			fmt.Sprintf("end %s: setback %s mm", name, layout.Fixed(e.SetbackMM, 2)),
		}
		for k, s := range lines {
			add(func() error { return text(d, s, x+anchor*12*h, planY-wd/2-2*row-1.6*float64(k)*h, 0, h, 0) })
		}
	}
	yTwist := planY - wd/2 - 2*row - 1.6*3*h - row
	add(func() error {
		return text(d, memberTwistText+layout.Fixed(m.TwistDeg, 3)+"° (the top face turns from end A to end B, right-handed about the axis from A to B)", L/2, yTwist, 0, h, 0)
	})
	sec := fmt.Sprintf("section %s x %s mm (width x depth)", layout.Fixed(wd, 1), layout.Fixed(dp, 1))
	if m.WallMM > 0 {
		sec = fmt.Sprintf("hollow section %s x %s mm (width x depth), wall %s mm", layout.Fixed(wd, 1), layout.Fixed(dp, 1), layout.Fixed(m.WallMM, 1))
	}
	add(func() error { return text(d, sec, sx, elevY+dp/2+row, 0, 0.8*h, 0) })
	add(func() error { return useLayer(d, LayerNote) })
	add(func() error {
		return text(d, "ELEVATION (x along the member from end A, z up to the top of the section)", L/2, elevY-dp/2-3*row, 0, 0.8*h, 0)
	})
	add(func() error { return text(d, "PLAN (seen from the top, y across)", L/2, planY+wd/2+2*row, 0, 0.8*h, 0) })
	notes := []string{fmt.Sprintf("%s: %d members, %s; largest deviation of a member from these values %s mm, %s°",
		m.Name, m.Count, m.Material, layout.Fixed(m.DevMM, 2), layout.Fixed(m.DevDeg, 3)),
		"End A is the tag end: every member of " + m.Name + " carries its tag at this drawing's end A."}
	notes = append(notes, wrapLabels("members: ", m.Parts, 12)...)
	if len(m.ReadFromB) > 0 {
		notes = append(notes, wrapLabels("members whose end B in the member list is this drawing's end A (bevels turned): ", m.ReadFromB, 10)...)
	}
	for k, s := range notes {
		add(func() error { return text(d, s, L/2, yTwist-row-1.5*float64(k)*h, 0, 0.8*h, 0) })
	}
	yt := yTwist - row - (1.5*float64(len(notes))+1)*h
	add(func() error { return useLayer(d, LayerTitle) })
	add(func() error { return text(d, m.Title+" - member type "+m.Name+", mm, 1:1", L/2, yt, 0, 1.5*h, 0) })
	add(func() error { return text(d, "CAUTION: "+report.Caution, L/2, yt-2.2*h, 0, 0.6*h, 0) })
	for i, wl := range layout.WarningLines(m.Warnings) {
		add(func() error { return text(d, wl, L/2, yt-(3.4+1.2*float64(i))*h, 0, 0.6*h, 0) })
	}
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	return nil
}

// endAllowance returns how far a member's blank reaches past an end cut's
// axis point: (w/2)·|tan mitre| + (d/2)·|tan bevel| (nodes/bars derives
// it), for drawing the blank.
func endAllowance(e report.TypeEndRow, w, d float64) float64 {
	return w/2*math.Abs(math.Tan(e.MitreDeg*math.Pi/180)) + d/2*math.Abs(math.Tan(e.BevelDeg*math.Pi/180))
}

// line draws a line in the drawing's plane.
func line(d *dxfDoc, x0, y0, x1, y1 float64) error {
	_, err := d.Line(x0, y0, 0, x1, y1, 0)
	return err
}

// dimension draws a dimension line between x0 and x1 at height y, with
// ticks and the label above its middle.
func dimension(d *dxfDoc, x0, x1, y, h float64, label string) error {
	if err := line(d, x0, y, x1, y); err != nil {
		return err
	}
	for _, x := range []float64{x0, x1} {
		if err := line(d, x, y-0.6*h, x, y+0.6*h); err != nil {
			return err
		}
	}
	return text(d, label, (x0+x1)/2, y+0.9*h, 0, h, 0)
}

// wrapLabels joins labels into lines of at most per labels, the first
// starting with lead.
func wrapLabels(lead string, labels []string, per int) []string {
	var out []string
	for i := 0; i < len(labels); i += per {
		s := strings.Join(labels[i:min(i+per, len(labels))], " ")
		if i == 0 {
			s = lead + s
		}
		out = append(out, s)
	}
	return out
}

// WriteMemberTypeDXF writes member type t of the report as a drawing
// (member-types/MT-NNN.dxf). Safe to call concurrently: drawings are built
// one at a time.
func WriteMemberTypeDXF(w io.Writer, rep *report.Report, t int) error {
	mt := rep.MemberTypes[t]
	return writeMemberDXF(w, memberDrawing{Title: rep.Title, Name: mt.Name, Material: rep.MemberMaterial.Name, Count: mt.Count,
		Parts: mt.Parts, ReadFromB: mt.ReadFromB, WidthMM: rep.Section.WidthMM, DepthMM: rep.Section.DepthMM, WallMM: rep.Section.WallMM,
		SetOutMM: mt.SetOutMM, Faces: mt.Faces,
		CutLengthMM: mt.CutLengthMM, BlankMM: mt.BlankMM, Ends: mt.Ends, TwistDeg: mt.TwistDeg,
		DevMM: mt.MaxDevMM, DevDeg: mt.MaxDevDeg, Warnings: rep.Warnings})
}
