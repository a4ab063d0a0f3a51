package nest

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"sync"

	"pqfab/geom"
)

// Rotation is what turns a stock allows.
type Rotation string

// Rotation modes.
const (
	Free    Rotation = "free"    // any turn: pqfab tries each edge along the sheet's x axis, and a quarter turn of each
	Quarter Rotation = "quarter" // 0, 90, 180, 270°
	Grain   Rotation = "grain"   // 0 and 180° only (grain or coating direction along x)
)

// Stock is a size of sheet parts are cut from.
type Stock struct {
	Name      string
	WidthMM   float64
	HeightMM  float64
	MarginMM  float64 // clear edge strip all round
	SpacingMM float64 // least distance between parts: kerf plus clearance
	Rotation  Rotation
	Mirror    bool    // parts may be turned over (off for coated glass and faced boards)
	Count     int     // sheets in stock; 0 for no limit
	Price     float64 // per sheet; 0 if unknown
}

// Part is a flat outline to cut, counter-clockwise, in its own frame.
type Part struct {
	Label   string
	Outline geom.Polygon
}

// Placement puts a part on a sheet: mirror (x → −x) if Mirrored, then turn
// by RotationDeg about the part's origin, then move by (X, Y).
type Placement struct {
	Part        int
	X, Y        float64
	RotationDeg float64
	Mirrored    bool
	Outline     geom.Polygon // the part's outline where it lies on the sheet
}

// Sheet is one stock sheet with its parts.
type Sheet struct {
	Stock       int
	Placements  []Placement
	PartAreaMM2 float64
	Utilization float64 // part area / sheet area
}

// Unplaced is a part that is on no sheet, with the reason.
type Unplaced struct {
	Part   int
	Reason string
}

// StockUse sums up one stock size.
type StockUse struct {
	Stock     int
	Sheets    int
	AreaBound int // ceil(total part area / usable sheet area)
	Cost      float64
}

// Result is a whole nesting.
type Result struct {
	Sheets      []Sheet
	Unplaced    []Unplaced
	Stocks      []StockUse
	PartAreaMM2 float64 // all parts, placed or not
	Cost        float64
	Ordering    string // the part ordering that won

	stockPrice, stockArea []float64
}

// maxMisses ends the filling of a sheet after this many parts in a row
// found no place on it.
const maxMisses = 6

// maxSkips ends the filling of a sheet after this many parts were passed
// over as too large for the area left (or as large as one that failed).
const maxSkips = 400

// orientation is a part turned and maybe mirrored, ready to place.
type orientation struct {
	rot      float64
	mirrored bool
	grown    geom.Polygon // hull grown by half the spacing, from its lowest corner
	negGrown geom.Polygon // −grown, from its lowest corner
	lo, hi   geom.Vec2    // hull bounds
}

type partInfo struct {
	area    float64
	height  float64         // short side of the outline's bounding box
	length  float64         // long side
	orients [][]orientation // per stock
}

// Nest places every part on the stock sheets, or lists it as unplaced with
// the reason.
func Nest(parts []Part, stocks []Stock) (*Result, error) {
	if len(stocks) == 0 {
		return nil, fmt.Errorf("nest: no stock sheets given")
	}
	for i, s := range stocks {
		switch {
		case !(s.WidthMM > 0) || !(s.HeightMM > 0):
			return nil, fmt.Errorf("nest: stock %d (%s): size %g × %g mm must be positive", i+1, s.Name, s.WidthMM, s.HeightMM)
		case !(s.MarginMM >= 0) || !(s.SpacingMM >= 0) || 2*s.MarginMM >= math.Min(s.WidthMM, s.HeightMM):
			return nil, fmt.Errorf("nest: stock %d (%s): margin %g and spacing %g mm must be zero or more and leave room", i+1, s.Name, s.MarginMM, s.SpacingMM)
		case s.Count < 0 || !(s.Price >= 0):
			return nil, fmt.Errorf("nest: stock %d (%s): count and price must be zero or more", i+1, s.Name)
		}
		switch s.Rotation {
		case Free, Quarter, Grain:
		default:
			return nil, fmt.Errorf("nest: stock %d (%s): rotation %q (want free, quarter or grain)", i+1, s.Name, s.Rotation)
		}
	}
	info := make([]partInfo, len(parts))
	res := &Result{}
	for i, p := range parts {
		if len(p.Outline) < 3 || !p.Outline.CCW() {
			return nil, fmt.Errorf("nest: part %s: outline must be a counter-clockwise polygon", p.Label)
		}
		lo, hi := p.Outline.Bounds()
		info[i] = partInfo{area: p.Outline.Area(), height: math.Min(hi.X-lo.X, hi.Y-lo.Y), length: math.Max(hi.X-lo.X, hi.Y-lo.Y)}
		res.PartAreaMM2 += info[i].area
		for _, s := range stocks {
			info[i].orients = append(info[i].orients, orientations(p.Outline, s))
		}
	}
	orderings := []struct {
		name string
		key  func(i int) float64
	}{
		{"area", func(i int) float64 { return info[i].area }},
		{"short side", func(i int) float64 { return info[i].height }},
		{"perimeter", func(i int) float64 { return parts[i].Outline.Perimeter() }},
	}
	results := make([]*Result, len(orderings))
	var wg sync.WaitGroup
	for k, o := range orderings {
		order := make([]int, len(parts))
		for i := range order {
			order[i] = i
		}
		slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(o.key(b), o.key(a)) })
		wg.Add(1)
		go func(k int, order []int) {
			defer wg.Done()
			results[k] = run(parts, stocks, info, order)
			results[k].Ordering = orderings[k].name
		}(k, order)
	}
	wg.Wait()
	best := results[0]
	for _, r := range results[1:] {
		if better(r, best) {
			best = r
		}
	}
	best.PartAreaMM2 = res.PartAreaMM2
	for s, st := range stocks {
		usable := (st.WidthMM - 2*st.MarginMM) * (st.HeightMM - 2*st.MarginMM)
		use := StockUse{Stock: s, AreaBound: int(math.Ceil(res.PartAreaMM2 / usable))}
		for _, sh := range best.Sheets {
			if sh.Stock == s {
				use.Sheets++
				use.Cost += st.Price
			}
		}
		best.Stocks = append(best.Stocks, use)
		best.Cost += use.Cost
	}
	return best, nil
}

// better prefers fewer unplaced parts, then lower cost, then less sheet
// area.
func better(a, b *Result) bool {
	if len(a.Unplaced) != len(b.Unplaced) {
		return len(a.Unplaced) < len(b.Unplaced)
	}
	ca, cb := a.sheetCost(), b.sheetCost()
	if ca != cb {
		return ca < cb
	}
	return a.sheetArea() < b.sheetArea()
}

func (r *Result) sheetCost() float64 {
	var c float64
	for _, s := range r.Sheets {
		c += r.stockPrice[s.Stock]
	}
	return c
}

func (r *Result) sheetArea() float64 {
	var a float64
	for _, s := range r.Sheets {
		a += r.stockArea[s.Stock]
	}
	return a
}
