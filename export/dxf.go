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
	LayerSheetEdge   = "PQ-SHEET-EDGE"   // outline of the stock sheet
	LayerSheetMargin = "PQ-SHEET-MARGIN" // edge of the usable area
	LayerCut         = "PQ-CUT"          // panel cut outlines
	LayerPartLabel   = "PQ-PART-LABEL"   // panel labels on cut sheets
	LayerPlanMember  = "PQ-PLAN-MEMBER"  // members seen from above
	LayerPlanPanel   = "PQ-PLAN-PANEL"   // panel outlines seen from above
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
	t, err := d.Text(s, r(x, dxfDigits), r(y, dxfDigits), r(z, dxfDigits), h)
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

// WriteSheetDXF writes one stock sheet as a cut sheet in mm: the sheet
// outline, the usable area inside the margin, every part's cut outline
// where it lies, and its label and type at its centre.
func WriteSheetDXF(w io.Writer, rep *Report, sheet int) error {
	dxfMu.Lock()
	defer dxfMu.Unlock()
	s := rep.Sheets[sheet]
	d, err := newDrawing([]dxfLayer{{LayerSheetEdge, color.Grey128}, {LayerSheetMargin, color.Cyan},
		{LayerCut, color.Red}, {LayerPartLabel, color.Green}, {LayerTitle, color.White}})
	if err != nil {
		return err
	}
	margin := stockMargin(rep, s)
	steps := []func() error{
		func() error { return useLayer(d, LayerSheetEdge) },
		func() error { return closedPoly(d, rectPts(0, 0, s.WidthMM, s.HeightMM)) },
		func() error { return useLayer(d, LayerSheetMargin) },
		func() error { return closedPoly(d, rectPts(margin, margin, s.WidthMM-margin, s.HeightMM-margin)) },
		func() error { return useLayer(d, LayerCut) },
	}
	for _, p := range s.Placements {
		p := p
		steps = append(steps, func() error { return closedPoly(d, p.Outline) })
	}
	steps = append(steps, func() error { return useLayer(d, LayerPartLabel) })
	panelType := rep.panelTypes()
	for _, p := range s.Placements {
		p := p
		steps = append(steps, func() error {
			cx, cy, size := labelSpot(p.Outline)
			h := math.Max(10, math.Min(80, size/12))
			if err := text(d, p.Panel, cx, cy+0.7*h, 0, h, 0); err != nil {
				return err
			}
			return text(d, panelType[p.Panel], cx, cy-0.7*h, 0, 0.6*h, 0)
		})
	}
	steps = append(steps, func() error { return useLayer(d, LayerTitle) },
		func() error {
			return text(d, fmt.Sprintf("%s  %s  %s %g x %g mm  %d parts  %.1f %%", rep.Title, s.Name, s.Stock, s.WidthMM, s.HeightMM, len(s.Placements), 100*s.Utilization),
				s.WidthMM/2, -60, 0, 30, 0)
		},
		func() error { return text(d, "CAUTION: "+Caution, s.WidthMM/2, -110, 0, 14, 0) })
	for _, st := range steps {
		if err := st(); err != nil {
			return err
		}
	}
	d.SetExt()
	_, err = d.WriteTo(w)
	return err
}

// panelTypes maps panel labels to type names, built once per report.
func (rep *Report) panelTypes() map[string]string {
	if rep.typeOf == nil {
		rep.typeOf = make(map[string]string, len(rep.Panels))
		for _, p := range rep.Panels {
			rep.typeOf[p.Label] = p.Type
		}
	}
	return rep.typeOf
}

// stockMargin finds the margin of a sheet's stock in the report settings
// (carried in the sheet row's stock name).
func stockMargin(rep *Report, s SheetRow) float64 {
	for _, st := range rep.stockInfo {
		if st.Name == s.Stock {
			return st.MarginMM
		}
	}
	return 0
}

// labelSpot returns the centroid of an outline and its size.
func labelSpot(pts [][2]float64) (x, y, size float64) {
	var a, cx, cy float64
	lox, loy, hix, hiy := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for i, p := range pts {
		q := pts[(i+1)%len(pts)]
		c := p[0]*q[1] - q[0]*p[1]
		a += c
		cx += (p[0] + q[0]) * c
		cy += (p[1] + q[1]) * c
		lox, loy = math.Min(lox, p[0]), math.Min(loy, p[1])
		hix, hiy = math.Max(hix, p[0]), math.Max(hiy, p[1])
	}
	if a == 0 {
		return (lox + hix) / 2, (loy + hiy) / 2, 0
	}
	return cx / (3 * a), cy / (3 * a), math.Min(hix-lox, hiy-loy)
}
