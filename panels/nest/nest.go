package nest

import (
	"context"
	"fmt"
	"math"

	"pqfab/geom"
)

// Rotation is what turns a stock allows.
type Rotation string

// Rotation modes.
const (
	Free    Rotation = "free"    // any turn: pqfab lays part edges along sheet and piece edges
	Quarter Rotation = "quarter" // 0, 90, 180, 270°
	Grain   Rotation = "grain"   // 0 and 180° only (grain or coating direction along x)
)

// CutRule says how parts come free from a sheet.
type CutRule string

// Cut rules.
const (
	// AnyCut: parts are cut out along their outlines in any way (saw,
	// router, waterjet); the layout need not allow straight cuts.
	AnyCut CutRule = ""
	// EdgeToEdge: every part comes free by straight cuts that each run
	// across the whole piece they split, at any angle, as float and
	// laminated glass is scored and broken. The layout then carries its
	// cuts in order (Sheet.Cuts).
	EdgeToEdge CutRule = "edge-to-edge"
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
	Cuts      CutRule // how parts come free (AnyCut or EdgeToEdge)
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
//
// For a stock with edge-to-edge cuts, Cuts lists the cuts in the order
// they are made. The pieces are numbered as they arise: piece 0 is the
// whole sheet, and cut i (counting from 0) splits piece Cuts[i].Piece
// into piece 2i+1, left of the line From→To, and piece 2i+2, right of it.
// Each cut runs straight from edge to edge of the piece it splits; every
// part comes free whole as one of the last pieces, and no cut crosses a
// part. Pieces no cut splits and no part fills are waste.
type Sheet struct {
	Stock       int
	Placements  []Placement
	PartAreaMM2 float64
	Utilization float64 // part area / sheet area
	Cuts        []Cut   // edge-to-edge stocks only, in cutting order
	CutLengthMM float64 // total length of Cuts
}

// Cut is one straight cut across a whole piece of a sheet, in sheet
// coordinates (mm); see Sheet for the numbering of pieces.
type Cut struct {
	Piece    int // the piece it splits
	From, To geom.Vec2
}

// Unplaced is a part that is on no sheet, with the reason.
type Unplaced struct {
	Part   int
	Reason Reason
}

// Reason is why a part is on no sheet.
type Reason int

// Reasons a part is unplaced.
const (
	ReasonTooLarge  Reason = iota + 1 // larger than every stock sheet in every allowed rotation
	ReasonNoStock                     // the counted stock ran out
	ReasonNonConvex                   // edge-to-edge cuts cannot free it and no other stock takes it
)

// String says the reason in plain words.
func (r Reason) String() string {
	switch r {
	case ReasonTooLarge:
		return "larger than every stock sheet (inside its margins) in every allowed rotation"
	case ReasonNoStock:
		return "no stock sheet left that it fits"
	case ReasonNonConvex:
		return "its outline is not convex, so edge-to-edge cuts cannot free it, and it fits no other stock"
	}
	return fmt.Sprintf("Reason(%d)", int(r))
}

// StockUse sums up one stock size.
type StockUse struct {
	Stock     int
	Sheets    int
	AreaBound int // ceil(total part area / usable sheet area): the fewest sheets by area
	Cost      float64
}

// Result is a whole nesting.
type Result struct {
	Sheets      []Sheet
	Unplaced    []Unplaced
	Stocks      []StockUse
	PartAreaMM2 float64 // all parts, placed or not
	Cost        float64
	Ordering    string // the method (and order of the parts) whose layout won
	Steps       int    // search steps taken
	Stopped     bool   // the context ended the search before its steps were used up
}

// Options tune the search. A zero field means its default.
type Options struct {
	// Steps is the search effort: how many partial sheets the search may
	// work out in all. The layout depends only on the parts, the stocks
	// and Steps; 0: DefaultSteps.
	Steps int
	// Progress, if set, is told how the nesting goes: after each sheet a
	// method fills and after each change the improvement phase keeps.
	// It is called one call at a time, from the nesting's goroutines; it
	// changes nothing in the result.
	Progress func(Progress)
}

// Progress is the state of a nesting.
type Progress struct {
	Phase  string // PhaseLayout or PhaseImprove
	Method string // the method laying parts out (in PhaseLayout)
	Sheets int    // sheets filled so far by that method (the layout's sheets in PhaseImprove)
	Placed int    // parts on them
	Parts  int    // parts to place (those that fit some stock)
}

// Phases of a nesting, for Progress.
const (
	PhaseLayout  = "laying out"
	PhaseImprove = "improving"
)

// DefaultSteps is the search effort when Options.Steps is 0: on a 2-core
// machine of 2026 about two seconds for ten thousand panels on jumbo
// glass sheets, and up to a second or two for a hundred parts.
const DefaultSteps = 60000

// maxSteps bounds Options.Steps.
const maxSteps = 1e9

// Nest places every part on the stock sheets, or lists it as unplaced with
// the reason, with the default options and no time limit.
func Nest(parts []Part, stocks []Stock) (*Result, error) {
	return NestWith(context.Background(), parts, stocks, Options{})
}

// NestWith is Nest with options and a context: when the context ends
// (its deadline passes), the search stops early, finishes the layout by
// its quickest rules and reports Stopped. The layout for a given input
// and Options.Steps is the same every time unless the context stops it.
// The parts and stocks are not changed. A zero field of opt means its
// default.
func NestWith(ctx context.Context, parts []Part, stocks []Stock, opt Options) (*Result, error) {
	if err := validate(parts, stocks, opt); err != nil {
		return nil, err
	}
	opt = opt.withDefaults()
	j := newJob(ctx, parts, stocks, opt.Steps)
	j.progress = opt.Progress
	res := j.run()
	var total float64
	for _, p := range parts {
		total += p.Outline.Area()
	}
	res.PartAreaMM2 = total
	res.Stocks = nil
	res.Cost = 0
	for s, st := range stocks {
		use := StockUse{Stock: s, AreaBound: int(math.Ceil(total / st.usableArea()))}
		for _, sh := range res.Sheets {
			if sh.Stock == s {
				use.Sheets++
				use.Cost += st.Price
			}
		}
		res.Stocks = append(res.Stocks, use)
		res.Cost += use.Cost
	}
	return res, nil
}

func (s Stock) usableArea() float64 {
	return (s.WidthMM - 2*s.MarginMM) * (s.HeightMM - 2*s.MarginMM)
}

// Describe returns a one-line summary of a stock size.
func (s Stock) Describe() string {
	return fmt.Sprintf("%s %g × %g mm", s.Name, s.WidthMM, s.HeightMM)
}
