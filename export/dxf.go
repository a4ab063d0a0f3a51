package export

import (
	"fmt"
	"io"
	"math"
	"sync"

	"github.com/yofu/dxf"
	"github.com/yofu/dxf/color"
	"github.com/yofu/dxf/drawing"
	"github.com/yofu/dxf/entity"
	"github.com/yofu/dxf/insunit"
	"github.com/yofu/dxf/table"
)

// DXF layer names: our own, one concept each. Colours come from the layer.
const (
	LayerPlanMember  = "PQ-PLAN-MEMBER" // members seen from above
	LayerPlanPanel   = "PQ-PLAN-PANEL"  // panel outlines seen from above
	LayerNodeLabel   = "PQ-NODE-LABEL"
	LayerMemberLabel = "PQ-MEMBER-LABEL"
	LayerPanelLabel  = "PQ-PANEL-LABEL"
	Layer3DMember    = "PQ-3D-MEMBER" // member lines in space
	LayerPlanBar     = "PQ-PLAN-BAR"  // top face of each member between its hub cuts, seen from above
	LayerTitle       = "PQ-TITLE"     // title and caution
)

// yofu/dxf keeps some package-level state (the default layer and text
// style, whose handles each drawing sets when it is written), so drawings
// are built and written one at a time.
var dxfMu sync.Mutex

// dxfDigits: coordinates are rounded to 1e-4 mm so the bytes written do not
// depend on the last bits of a float.
const dxfDigits = 4

type dxfLayer struct {
	name  string
	color color.ColorNumber
}

func newDrawing(layers []dxfLayer) (*drawing.Drawing, error) {
	d := dxf.NewDrawing()
	d.Header().InsUnit = insunit.Millimeters
	d.Header().InsLUnit = insunit.Decimal
	for _, l := range layers {
		if _, err := d.AddLayer(l.name, l.color, table.LT_CONTINUOUS, false); err != nil {
			return nil, err
		}
	}
	return d, nil
}

func useLayer(d *drawing.Drawing, name string) error { return d.ChangeLayer(name) }

func text(d *drawing.Drawing, s string, x, y, z, h, rot float64) error {
	t, err := d.Text(dxfText(s), r(x, dxfDigits), r(y, dxfDigits), r(z, dxfDigits), h)
	if err != nil {
		return err
	}
	t.Rotation = r(rot, 3)
	t.Anchor(entity.CENTER_CENTER)
	return nil
}

func closedPoly(d *drawing.Drawing, pts [][2]float64) error {
	vs := make([][]float64, len(pts))
	for i, p := range pts {
		vs[i] = []float64{r(p[0], dxfDigits), r(p[1], dxfDigits)}
	}
	_, err := d.LwPolyline(true, vs...)
	return err
}

func rectPts(x0, y0, x1, y1 float64) [][2]float64 {
	return [][2]float64{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}
}

// maxWarningLines is the most warnings a drawing's title block lists;
// report.json and the schedule list them all.
const maxWarningLines = 5

// warningLines returns the lines a title block shows for the warnings.
func warningLines(ws []string) []string {
	var out []string
	for i, w := range ws {
		if i == maxWarningLines {
			out = append(out, fmt.Sprintf("WARNING: … and %d more (see report.json)", len(ws)-i))
			break
		}
		out = append(out, "WARNING: "+w)
	}
	return out
}

// WriteAssemblyDXF writes the assembly plan in mm: members and panel
// outlines seen from above (z = 0) with node, member and panel labels on
// their own layers, and every member as a 3D line at its true height.
func WriteAssemblyDXF(w io.Writer, rep *Report) error {
	dxfMu.Lock()
	defer dxfMu.Unlock()
	d, err := newDrawing([]dxfLayer{{LayerPlanMember, color.White}, {LayerPlanPanel, color.Grey128},
		{LayerNodeLabel, color.Red}, {LayerMemberLabel, color.Yellow}, {LayerPanelLabel, color.Green},
		{Layer3DMember, color.Blue}, {LayerPlanBar, color.Cyan}, {LayerTitle, color.White}})
	if err != nil {
		return err
	}
	pos := make(map[string][3]float64, len(rep.Nodes))
	for _, n := range rep.Nodes {
		pos[n.Label] = n.Pos
	}
	var steps []func() error
	add := func(f func() error) { steps = append(steps, f) }
	add(func() error { return useLayer(d, LayerPlanMember) })
	for _, m := range rep.Members {
		a, b := pos[m.NodeA], pos[m.NodeB]
		add(func() error {
			_, err := d.Line(r(a[0], dxfDigits), r(a[1], dxfDigits), 0, r(b[0], dxfDigits), r(b[1], dxfDigits), 0)
			return err
		})
	}
	add(func() error { return useLayer(d, LayerPlanPanel) })
	for _, p := range rep.Panels {
		pts := make([][2]float64, len(p.Corners))
		for i, c := range p.Corners {
			pts[i] = [2]float64{pos[c][0], pos[c][1]}
		}
		add(func() error { return closedPoly(d, pts) })
	}
	if rep.Section.WidthMM > 0 {
		add(func() error { return useLayer(d, LayerPlanBar) })
		for _, m := range rep.Members {
			add(func() error { return closedPoly(d, barOutline(m, pos[m.NodeA], pos[m.NodeB], rep.Section.WidthMM)) })
		}
	}
	add(func() error { return useLayer(d, Layer3DMember) })
	for _, m := range rep.Members {
		a, b := pos[m.NodeA], pos[m.NodeB]
		add(func() error {
			_, err := d.Line(r(a[0], dxfDigits), r(a[1], dxfDigits), r(a[2], dxfDigits), r(b[0], dxfDigits), r(b[1], dxfDigits), r(b[2], dxfDigits))
			return err
		})
	}
	h := rep.labelHeight
	add(func() error { return useLayer(d, LayerNodeLabel) })
	for _, n := range rep.Nodes {
		add(func() error { return text(d, n.Label, n.Pos[0], n.Pos[1]+0.8*h, 0, h, 0) })
	}
	add(func() error { return useLayer(d, LayerMemberLabel) })
	for _, m := range rep.Members {
		a, b := pos[m.NodeA], pos[m.NodeB]
		ang := math.Atan2(b[1]-a[1], b[0]-a[0]) * 180 / math.Pi
		if ang > 90 {
			ang -= 180
		} else if ang < -90 {
			ang += 180
		}
		add(func() error { return text(d, m.Label, (a[0]+b[0])/2, (a[1]+b[1])/2, 0, 0.7*h, ang) })
	}
	add(func() error { return useLayer(d, LayerPanelLabel) })
	for _, p := range rep.Panels {
		var cx, cy float64
		for _, c := range p.Corners {
			cx += pos[c][0]
			cy += pos[c][1]
		}
		k := float64(len(p.Corners))
		add(func() error { return text(d, p.Label, cx/k, cy/k, 0, h, 0) })
	}
	add(func() error { return useLayer(d, LayerTitle) })
	add(func() error {
		return text(d, rep.Title+" - assembly plan, mm, seen from above", rep.planCentre[0], rep.planLow-8*h, 0, 3*h, 0)
	})
	add(func() error { return text(d, "CAUTION: "+Caution, rep.planCentre[0], rep.planLow-12*h, 0, 1.2*h, 0) })
	for _, s := range steps {
		if err := s(); err != nil {
			return err
		}
	}
	d.SetExt()
	_, err = d.WriteTo(w)
	return err
}

// barOutline returns the plan outline of a member's top face: the
// section width across the member (along its frame's Y axis) and the cut
// length between the hub setbacks.
func barOutline(m MemberRow, a, b [3]float64, width float64) [][2]float64 {
	d := [3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}
	l := math.Sqrt(d[0]*d[0] + d[1]*d[1] + d[2]*d[2])
	at := func(t, side float64) [2]float64 {
		return [2]float64{a[0] + d[0]*t/l + m.FrameY[0]*side, a[1] + d[1]*t/l + m.FrameY[1]*side}
	}
	s0, s1 := m.Ends[0].SetbackMM, l-m.Ends[1].SetbackMM
	h := width / 2
	return [][2]float64{at(s0, -h), at(s1, -h), at(s1, h), at(s0, h)}
}

// planLayout sets the label height and title position of the plan from
// the nodes' extent.
func (rep *Report) planLayout() {
	lox, loy, hix := math.Inf(1), math.Inf(1), math.Inf(-1)
	var span float64
	for _, n := range rep.Nodes {
		lox, loy, hix = math.Min(lox, n.Pos[0]), math.Min(loy, n.Pos[1]), math.Max(hix, n.Pos[0])
	}
	for _, m := range rep.Members {
		span += m.LengthMM
	}
	if len(rep.Members) > 0 {
		span /= float64(len(rep.Members))
	}
	rep.labelHeight = r(math.Max(20, span/15), 1)
	rep.planCentre = [2]float64{(lox + hix) / 2, 0}
	rep.planLow = loy
}
