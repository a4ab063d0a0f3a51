package export

import (
	"fmt"
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
