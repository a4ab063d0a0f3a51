package report

import (
	"fmt"
	"math"

	"pqfab/internal/pipeline"
)

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

// PanelSpec is a panel's plain-text specification, with its thickness and
// density (see pipeline.PanelSpec).
type PanelSpec = pipeline.PanelSpec

// cost turns the job's rates into a cost summary (nil without rates).
// Each quantity is charged once: making rates cover processing only, the
// material comes from the bar and sheet prices (or, for a stock without a
// price, from the material rates), a node is one charge, and the type
// rates are a setup charge per distinct type. Amounts are rounded to the
// cent and the total is their sum.
func costOf(res *pipeline.Result) *Cost {
	j, st, flats, nres, stocks, plan, barStocks, blanks := res.Job, res.Structure, res.Flats, res.Nesting, res.Stocks, res.BarPlan, res.BarStocks, res.Blanks
	panelTypes := len(res.PanelTypes)
	rt := j.Rates
	if rt == nil {
		return nil
	}
	c := &Cost{Currency: rt.Currency}
	var cents int64
	add := func(kind, item string, q float64, unit string, rate float64) {
		q = math.Round(q*1000) / 1000 // the quantity shown is the one charged
		ct := int64(math.Round(q * rate * 100))
		c.Lines = append(c.Lines, CostLine{Kind: kind, Item: item, Quantity: q, Unit: unit, Rate: rate, Amount: float64(ct) / 100})
		cents += ct
	}
	// Members: material from the bars, making by cut length, setup by type.
	var metres float64
	for _, m := range st.Members {
		metres += m.CutLengthMM / 1000
	}
	onBar := make([]bool, len(blanks))
	if plan != nil {
		for _, u := range plan.Stocks {
			if u.Bars == 0 {
				continue
			}
			s := barStocks[u.Stock]
			switch {
			case s.Price > 0 || rt.BarPerM == 0:
				add(CostMaterial, fmt.Sprintf("Member material: bars %s (%g mm), at the bar price", s.Name, s.LengthMM), float64(u.Bars), "bar", s.Price)
			default:
				add(CostMaterial, fmt.Sprintf("Member material: bars %s (%g mm), no bar price: by bar length", s.Name, s.LengthMM), float64(u.Bars)*s.LengthMM/1000, "m", rt.BarPerM)
			}
		}
		for _, b := range plan.Bars {
			for _, p := range b.Pieces {
				onBar[p] = true
			}
		}
	}
	var loose float64
	for i, p := range blanks {
		if !onBar[i] {
			loose += p.LengthMM / 1000
		}
	}
	if loose > 0 && rt.BarPerM > 0 {
		add(CostMaterial, "Member material: members on no bar, by blank length", loose, "m", rt.BarPerM)
	}
	add(CostMaking, "Member making: cutting and end cuts, by cut length", metres, "m", rt.MemberPerM)
	if rt.MemberTypeEach > 0 {
		add(CostSetup, "Member types: setup and drawing", float64(len(st.MemberTypes)), "type", rt.MemberTypeEach)
	}
	// Nodes: one charge each, supplied and made.
	add(CostMaking, "Nodes: supplied and made", float64(len(st.Nodes)), "each", rt.NodeEach)
	if rt.NodeTypeEach > 0 {
		add(CostSetup, "Node types: setup and drawing", float64(len(st.NodeTypes)), "type", rt.NodeTypeEach)
	}
	// Panels: material from the sheets, making by cut area, setup by type.
	for _, u := range nres.Stocks {
		if u.Sheets == 0 {
			continue
		}
		s := stocks[u.Stock]
		switch {
		case s.Price > 0:
			add(CostMaterial, "Panel material: sheets "+s.Name+", at the sheet price", float64(u.Sheets), "sheet", s.Price)
		case rt.SheetPerM2 > 0:
			add(CostMaterial, "Panel material: sheets "+s.Name+", no sheet price: by sheet area", float64(u.Sheets)*s.WidthMM*s.HeightMM/1e6, "m²", rt.SheetPerM2)
		default:
			add(CostMaterial, "Panel material: sheets "+s.Name+", no sheet price: per sheet", float64(u.Sheets), "sheet", rt.SheetEach)
		}
	}
	var area float64
	for _, f := range flats {
		area += f.AreaM2
	}
	add(CostMaking, "Panel making: cutting and edge work, by cut area", area, "m²", rt.PanelPerM2)
	if rt.PanelTypeEach > 0 {
		add(CostSetup, "Panel types: setup and drawing", float64(panelTypes), "type", rt.PanelTypeEach)
	}
	c.Total = float64(cents) / 100
	return c
}
