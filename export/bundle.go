package export

import (
	"math"
	"pqfab/nodes/bars"
	"strconv"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/panels/nest"
	"pqfab/parttype"
)

// Caution is printed in every report and schedule.
const Caution = "pqfab computes geometry only. It does not check strength, stability, glass safety or " +
	"connections. A qualified structural engineer must check the design; local building codes and " +
	"licensed practice decide. Check every figure before cutting."

// Bundle is everything a build computed, as the writers need it.
type Bundle struct {
	Title    string
	JobFile  string
	NetFile  string
	Settings []Setting // job settings for the summary, in order
	Warnings []string

	Net       *geom.Net // planarized
	Supports  []bool
	Planarize *panels.PlanarizeResult
	TolMM     float64

	Bays           geom.Bays // the plan bays of the labels
	Structure      *nodes.Structure
	Flats          []panels.Flat // one per face
	PanelTypes     []panels.Type
	PanelTypeBound parttype.Bound
	// PanelTypeSetOut is each panel type's nominal set-out outline (its
	// nominal cut outline grown by the edge inset), for the drawings.
	PanelTypeSetOut []geom.Polygon
	HubRadiusMM     float64

	Stocks  []nest.Stock
	Nesting *nest.Result // part i is face i

	Blanks            []bars.Piece // piece i is member i: its blank
	BarStocks         []bars.Stock
	BarPlan           *bars.Plan // nil without bar stock
	MemberMaterial    string
	MemberDensityKgM3 float64
	// MemberSection is the section's kind (solid, hollow or mass) and
	// MemberKgPerM the members' mass per metre, which every member weight
	// comes from.
	MemberSection string
	MemberKgPerM  float64

	PanelMaterial panels.Material
	PanelSpec     PanelSpec            // for every panel type
	TypeSpecs     map[string]PanelSpec // by panel type: the job's, field by field overridden

	Cost *Cost // nil when the job gives no rates

	TagSize string // site/tags.pdf: a name in TagSizes ("" for office)
}

// PanelSpec is a panel's plain-text specification, as the job gives it.
type PanelSpec struct {
	BuildUp       string `json:"build_up,omitempty"`
	EdgeWork      string `json:"edge_work,omitempty"`
	Coating       string `json:"coating,omitempty"`
	HeatTreatment string `json:"heat_treatment,omitempty"`
	Grade         string `json:"grade,omitempty"`
	// Thickness and density of a panel type's panels (0: the job's).
	ThicknessMM float64 `json:"thickness_mm,omitempty"`
	DensityKgM3 float64 `json:"density_kg_m3,omitempty"`
}

// specOf returns the specification of a panel type: the type's own where
// the job gives one, else the job's.
func (b *Bundle) specOf(typeName string) PanelSpec {
	if s, ok := b.TypeSpecs[typeName]; ok {
		return s
	}
	return b.PanelSpec
}

// Setting is one job setting shown in the summary: Value is a number
// (float64 or int, in the unit the name gives) or text.
type Setting struct {
	Name  string `json:"name"`
	Value any    `json:"value"`
}

// Cost is the estimator's summary. Its lines sum to Total, and each
// quantity is charged once: material lines charge the stock bought,
// making lines the processing only, setup lines each distinct type.
type Cost struct {
	Currency string     `json:"currency"`
	Lines    []CostLine `json:"lines"`
	Total    float64    `json:"total"`
}

// CostNote says, beside every cost estimate, what each kind of line covers.
const CostNote = "Each quantity is charged once. Material: the bars and sheets bought, at their prices (or the job's material rates where a stock has no price). " +
	"Making: cutting, end cuts and edge work only, by cut length or cut area; nodes supplied and made. Setup: setup and drawing per distinct type. The lines add up to the total."

// Kinds of cost line.
const (
	CostMaterial = "material" // stock bought: bars, sheets
	CostMaking   = "making"   // processing: cutting, end cuts, edge work; nodes supplied and made
	CostSetup    = "setup"    // setup and drawing, per distinct type
)

// CostLine is one line of the cost summary: Amount is Quantity × Rate
// rounded to the cent.
type CostLine struct {
	Kind     string  `json:"kind"`
	Item     string  `json:"item"`
	Quantity float64 `json:"quantity"`
	Unit     string  `json:"unit"`
	Rate     float64 `json:"rate"`
	Amount   float64 `json:"amount"`
}

// SheetName numbers sheet i of n: S-01, S-02, … with as many digits as
// the count needs (at least two), so names sort in order.
func SheetName(i, n int) string { return "S-" + padNum(i+1, n) }

// SheetFile returns the cut sheet file name of sheet i of n (sheet-01.dxf, …).
func SheetFile(i, n int) string { return "sheet-" + padNum(i+1, n) + ".dxf" }

func padNum(i, n int) string {
	w := max(2, len(strconv.Itoa(n)))
	s := strconv.Itoa(i)
	for len(s) < w {
		s = "0" + s
	}
	return s
}

// sheetOf returns, per face, the sheet index it lies on or -1.
func (b *Bundle) sheetOf() []int {
	out := make([]int, len(b.Flats))
	for i := range out {
		out[i] = -1
	}
	if b.Nesting == nil {
		return out
	}
	for s, sh := range b.Nesting.Sheets {
		for _, p := range sh.Placements {
			out[p.Part] = s
		}
	}
	return out
}

// Round rounds x to d decimals without negative zero, so output bytes do
// not depend on the last bits of a float. Every writer and the command's
// printed numbers use it.
func Round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	v := math.Round(x*p) / p
	if v == 0 {
		return 0
	}
	return v
}

// RoundSpread rounds a spread's three numbers to d decimals.
func RoundSpread(s panels.Spread, d int) panels.Spread {
	return panels.Spread{Min: Round(s.Min, d), Median: Round(s.Median, d), Max: Round(s.Max, d)}
}

// r and spread are the short names used throughout this package.
var (
	r      = Round
	spread = RoundSpread
)
