package export

import (
	"fmt"
	"io"
	"math"
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

// typeLayers are the layers of every type drawing.
var typeLayers = []dxfLayer{{LayerPart, color.Red, nil}, {LayerSetOut, color.Grey128, nil}, {LayerBlank, color.Cyan, nil},
	{LayerDim, color.Yellow, nil}, {LayerNote, color.Green, nil}, {LayerTitle, color.White, nil}}

// Texts of the member type drawings start with these words, so a reader
// can find each number (the read-back tests do).
const (
	memberCutText   = "cut length "
	memberBlankText = "blank length "
	memberTwistText = "twist "
)

// memberDrawing is what a member type drawing shows: the nominal part.
type memberDrawing struct {
	Title, Name, Material string
	Count                 int
	Parts, ReadFromB      []string
	WidthMM, DepthMM      float64
	CutLengthMM, BlankMM  float64
	Ends                  [2]TypeEndRow // nominal mitre, bevel and setback at A and B
	TwistDeg              float64
	DevMM, DevDeg         float64 // largest deviation of a part from the nominal
	Warnings              []string
}

// endOffset returns how far along the member axis the end cut at section
// point (y, z) lies from the cut's axis point, for a plane with the given
// mitre and bevel (normal oriented along +x): x = −y·tan(mitre) − z·tan(bevel).
func endOffset(e TypeEndRow, y, z float64) float64 {
	return -y*math.Tan(e.MitreDeg*math.Pi/180) - z*math.Tan(e.BevelDeg*math.Pi/180)
}

// writeMemberDXF draws one member type at 1:1 in mm: the elevation (x along
// the member, z up to the top of the section) and the plan (y across) of
// the nominal member between its two end cuts, with the blank it is cut
// from dashed around it, the section beside them, the end cuts' mitre,
// bevel and setback, cut and blank lengths, the twist, every member of the
// type and a title block with the caution.
func writeMemberDXF(w io.Writer, m memberDrawing) error {
	return writeDXF(w, typeLayers, 0, func(d *dxfDoc) error { return drawMember(d, m) })
}

// drawMember draws a member type.
func drawMember(d *dxfDoc, m memberDrawing) error {
	L, wd, dp := m.CutLengthMM, m.WidthMM, m.DepthMM
	a, b := m.Ends[0], m.Ends[1]
	h := math.Max(12, math.Min(60, L/60)) // text height
	gap := math.Max(3*dp, 12*h)
	// A view: the member between its cuts, seen across the coordinate c
	// (z in the elevation, y in the plan), drawn with c upwards at y0.
	view := func(y0, half float64, onZ bool) [][2]float64 {
		off := func(e TypeEndRow, c float64) float64 {
			if onZ {
				return endOffset(e, 0, c)
			}
			return endOffset(e, c, 0)
		}
		return [][2]float64{{off(a, -half), y0 - half}, {L + off(b, -half), y0 - half}, {L + off(b, half), y0 + half}, {off(a, half), y0 + half}}
	}
	elevY, planY := 0.0, -gap
	lo := -endAllowance(a, wd, dp)
	hi := L + endAllowance(b, wd, dp)
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	add(func() error { return useLayer(d, LayerPart) })
	add(func() error { return closedPoly(d, view(elevY, dp/2, true)) })
	add(func() error { return closedPoly(d, view(planY, wd/2, false)) })
	sx := hi + 4*h + wd/2
	add(func() error { return closedPoly(d, rectPts(sx-wd/2, elevY-dp/2, sx+wd/2, elevY+dp/2)) })
	add(func() error { return useLayer(d, LayerBlank) })
	add(func() error { return closedPoly(d, rectPts(lo, elevY-dp/2, hi, elevY+dp/2)) })
	add(func() error { return closedPoly(d, rectPts(lo, planY-wd/2, hi, planY+wd/2)) })
	add(func() error { return useLayer(d, LayerSetOut) })
	add(func() error { return line(d, lo-2*h, elevY, hi+2*h, elevY) })
	add(func() error { return line(d, lo-2*h, planY, hi+2*h, planY) })
	add(func() error { return useLayer(d, LayerDim) })
	dim := func(x0, x1, y float64, label string) {
		add(func() error { return dimension(d, x0, x1, y, h, label) })
	}
	dim(0, L, elevY+dp/2+2.5*h, memberCutText+fixed(L, 2)+" mm (on the axis)")
	dim(lo, hi, elevY+dp/2+6*h, memberBlankText+fixed(m.BlankMM, 2)+" mm")
	for i, e := range m.Ends {
		x, anchor := 0.0, -1.0
		if i == 1 {
			x, anchor = L, 1
		}
		name := []string{"A", "B"}[i]
		lines := []string{
			fmt.Sprintf("end %s: mitre %s°", name, fixed(e.MitreDeg, 3)),
			fmt.Sprintf("end %s: bevel %s°", name, fixed(e.BevelDeg, 3)),
			fmt.Sprintf("end %s: setback %s mm", name, fixed(e.SetbackMM, 2)),
		}
		for k, s := range lines {
			add(func() error { return text(d, s, x+anchor*10*h, planY-wd/2-(2.5+1.6*float64(k))*h, 0, h, 0) })
		}
	}
	add(func() error {
		return text(d, memberTwistText+fixed(m.TwistDeg, 3)+"° (the top face turns from end A to end B, right-handed about the axis from A to B)", L/2, planY-wd/2-8*h, 0, h, 0)
	})
	add(func() error {
		return text(d, fmt.Sprintf("section %s x %s mm (width x depth)", fixed(wd, 1), fixed(dp, 1)), sx, elevY+dp/2+2*h, 0, 0.8*h, 0)
	})
	add(func() error { return useLayer(d, LayerNote) })
	add(func() error {
		return text(d, "ELEVATION (x along the member from end A, z up to the top of the section)", L/2, elevY-dp/2-2*h, 0, 0.8*h, 0)
	})
	add(func() error { return text(d, "PLAN (seen from the top, y across)", L/2, planY+wd/2+1.5*h, 0, 0.8*h, 0) })
	notes := []string{fmt.Sprintf("%s: %d members, %s; largest deviation of a member from these values %s mm, %s°",
		m.Name, m.Count, m.Material, fixed(m.DevMM, 2), fixed(m.DevDeg, 3))}
	notes = append(notes, wrapLabels("members: ", m.Parts, 12)...)
	if len(m.ReadFromB) > 0 {
		notes = append(notes, wrapLabels("read from their end B (their end B is end A here, bevels turned): ", m.ReadFromB, 10)...)
	}
	for k, s := range notes {
		add(func() error { return text(d, s, L/2, planY-wd/2-(11+1.5*float64(k))*h, 0, 0.8*h, 0) })
	}
	yt := planY - wd/2 - (13+1.5*float64(len(notes)))*h
	add(func() error { return useLayer(d, LayerTitle) })
	add(func() error { return text(d, m.Title+" - member type "+m.Name+", mm, 1:1", L/2, yt, 0, 1.5*h, 0) })
	add(func() error { return text(d, "CAUTION: "+Caution, L/2, yt-2.2*h, 0, 0.6*h, 0) })
	for i, wl := range warningLines(m.Warnings) {
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
func endAllowance(e TypeEndRow, w, d float64) float64 {
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
func WriteMemberTypeDXF(w io.Writer, rep *Report, t int) error {
	mt := rep.MemberTypes[t]
	return writeMemberDXF(w, memberDrawing{Title: rep.Title, Name: mt.Name, Material: rep.MemberMaterial.Name, Count: mt.Count,
		Parts: mt.Parts, ReadFromB: mt.ReadFromB, WidthMM: rep.Section.WidthMM, DepthMM: rep.Section.DepthMM,
		CutLengthMM: mt.CutLengthMM, BlankMM: mt.BlankMM, Ends: mt.Ends, TwistDeg: mt.TwistDeg,
		DevMM: mt.MaxDevMM, DevDeg: mt.MaxDevDeg, Warnings: rep.Warnings})
}
