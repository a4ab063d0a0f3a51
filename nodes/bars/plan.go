package bars

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"pqfab/geom"
)

// DefaultEffort is the work (comparisons of piece groups and search
// nodes) the solver may spend on one packing of the pieces into one stock,
// and again on improving each mix: under a second on a current core. It
// cuts the search short only where the plan has not reached its lower
// bound; on the u250 and t60 instances of Falkenauer (1996) a thirtieth of
// it is enough. Harder instances gain from more: a triplet instance of 501
// items reaches its optimum with about five times as much (TestTripletsLarge).
const DefaultEffort = 15_000_000

// Options tune Solve. A zero field means its default.
type Options struct {
	// Effort caps the search, in work units (see DefaultEffort); 0:
	// DefaultEffort. The same effort gives the same plan on every machine.
	Effort int64
}

// withDefaults returns the options with every zero field set to its
// default.
func (o Options) withDefaults() Options {
	if o.Effort == 0 {
		o.Effort = DefaultEffort
	}
	return o
}

// Validate reports a bad option as a *geom.FieldError naming the Go
// field, a zero field standing for its default.
func (o Options) Validate() error {
	if o = o.withDefaults(); o.Effort < 0 {
		return geom.FieldErrorf("Effort", "%d must be zero (the default) or a positive number", o.Effort)
	}
	return nil
}

// Bar is one bar of stock with the pieces cut from it.
type Bar struct {
	Stock    int     // index into the stocks
	Pieces   []int   // indices into the pieces, in cutting order: longest first, equal lengths by label
	BlankMM  float64 // sum of the pieces' blank lengths
	UsedMM   float64 // 2·trim + blanks + one kerf between each two pieces
	OffcutMM float64 // usable length left after the cut that frees it: LengthMM − UsedMM − kerf, or 0
	WasteMM  float64 // LengthMM − BlankMM − OffcutMM: trims, kerfs and any sliver too short to free
}

// Unplaced is a piece that is on no bar: why (Reason), and the same said
// with the numbers for a message (Detail).
type Unplaced struct {
	Piece  int
	Reason Reason
	Detail string
}

// Reason says why a piece is on no bar.
type Reason int

// Reasons a piece is on no bar.
const (
	// ReasonTooLong: its blank is longer than the usable length of every
	// bar stock.
	ReasonTooLong Reason = iota + 1
	// ReasonNoBarLeft: every bar it fits is used (the stocks' counts).
	ReasonNoBarLeft
)

// String names the reason in plain words.
func (r Reason) String() string {
	switch r {
	case ReasonTooLong:
		return "longer than every bar"
	case ReasonNoBarLeft:
		return "no bar left that it fits"
	}
	return "unknown reason"
}

// StockUse sums up one stock.
type StockUse struct {
	Stock int
	Bars  int
	Cost  float64
	// LengthBound is the fewest bars by length if every placed piece that
	// fits this stock were cut from it: ceil(Σ (blank + kerf) / (usable +
	// kerf)). Bound is a stronger lower bound on the same pieces: the
	// larger of L2 (Martello and Toth 1990) and ceil(n / k) where no bar
	// holds more than k pieces; Bound ≥ LengthBound.
	LengthBound int
	Bound       int
	Fits        int // placed pieces that fit this stock
}

// Plan is a cutting plan.
type Plan struct {
	Bars     []Bar
	Unplaced []Unplaced
	Stocks   []StockUse
	StockMM  float64 // total length of the bars used
	BlankMM  float64 // total blank length placed
	OffcutMM float64
	WasteMM  float64
	Cost     float64
	// CostBound is a lower bound on the cost of cutting the placed pieces:
	// each piece i costs at least min over stocks k of price_k·(blank_i +
	// kerf_k) / (usable_k + kerf_k), and with one stock price·Bound.
	CostBound float64
	// Proven: one stock, every piece placed, and the bars equal the lower
	// bound Bound, so no plan has fewer bars.
	Proven bool
	// BudgetHit: the search stopped at Options.Effort before it reached
	// its lower bound; more effort might save bars.
	BudgetHit bool
}

// stockU is a stock in the solver's units (µm). An item's size in a bar of
// this stock is its blank plus one kerf, the bar's capacity its usable
// length plus one kerf: Σ blanks + (k−1)·kerf ≤ usable ⇔ Σ (blank + kerf)
// ≤ usable + kerf.
type stockU struct {
	length, kerf, trim, usable, capacity int64
	price                                float64
	count                                int
}

// problem holds the pieces in canonical order: longest blank first (in
// whole µm), equal blanks by label, then by input index.
type problem struct {
	stocks []Stock
	su     []stockU
	blank  []int64 // by canonical position
	index  []int   // canonical position → input index
	effort int64
}

// Solve assigns every piece to a bar of one of the stocks, or lists it as
// unplaced with the reason, making the plan as cheap as it can: least total
// price, then least total bar length, then fewest bars. With one stock
// this is the fewest bars. The plan depends only on the multiset of
// (label, length) pieces and on the stocks, never on the pieces' order.
// A zero field of opt means its default.
func Solve(pieces []Piece, stocks []Stock, opt Options) (*Plan, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	opt = opt.withDefaults()
	if len(stocks) == 0 {
		return nil, fmt.Errorf("no bar stock given")
	}
	p := &problem{stocks: stocks, effort: opt.Effort}
	longest := 0.0
	for k, s := range stocks {
		if err := s.Validate(); err != nil {
			var fe *geom.FieldError
			if !errors.As(err, &fe) {
				return nil, err
			}
			return nil, &geom.FieldError{Field: fmt.Sprintf("Stocks[%d].%s", k, fe.Field), Msg: fmt.Sprintf("stock %d (%s): %s", k+1, s.Name, fe.Msg)}
		}
		u := stockU{length: toUM(s.LengthMM, false), kerf: toUM(s.KerfMM, true), trim: toUM(s.TrimMM, true), price: s.Price, count: s.Count}
		u.usable = u.length - 2*u.trim
		if u.usable <= 0 {
			return nil, geom.FieldErrorf(fmt.Sprintf("Stocks[%d].TrimMM", k), "stock %d (%s): end trim %g mm at each end leaves nothing of a %g mm bar", k+1, s.Name, s.TrimMM, s.LengthMM)
		}
		u.capacity = u.usable + u.kerf
		p.su = append(p.su, u)
		longest = max(longest, s.UsableMM())
	}
	plan := &Plan{}
	type canon struct {
		blank int64
		label string
		index int
	}
	var cs []canon
	for i, pc := range pieces {
		if math.IsNaN(pc.LengthMM) || !(pc.LengthMM > 0) {
			return nil, geom.FieldErrorf(fmt.Sprintf("Pieces[%d].LengthMM", i), "blank %q: length %g mm must be a number more than zero", pc.Label, pc.LengthMM)
		}
		if pc.LengthMM > MaxLengthMM {
			plan.Unplaced = append(plan.Unplaced, Unplaced{i, ReasonTooLong, tooLong(pc.LengthMM, longest)})
			continue
		}
		cs = append(cs, canon{toUM(pc.LengthMM, true), pc.Label, i})
	}
	slices.SortFunc(cs, func(a, b canon) int {
		if c := cmp.Compare(b.blank, a.blank); c != 0 {
			return c
		}
		if c := cmp.Compare(a.label, b.label); c != 0 {
			return c
		}
		return cmp.Compare(a.index, b.index)
	})
	var items []int32
	for _, c := range cs {
		fits := false
		for _, u := range p.su {
			fits = fits || c.blank <= u.usable
		}
		if !fits {
			plan.Unplaced = append(plan.Unplaced, Unplaced{c.index, ReasonTooLong, tooLong(pieces[c.index].LengthMM, longest)})
			continue
		}
		items = append(items, int32(len(p.blank)))
		p.blank = append(p.blank, c.blank)
		p.index = append(p.index, c.index)
	}
	m := p.solveMix(items)
	p.fill(plan, m)
	return plan, nil
}

func tooLong(blankMM, longestMM float64) string {
	return fmt.Sprintf("blank %s mm is longer than the longest usable bar length, %s mm", mmText(blankMM), mmText(longestMM))
}

// mmText writes a length to the micrometre, without trailing zeros (and
// an absurd one in exponent form).
func mmText(mm float64) string {
	if mm > MaxLengthMM {
		return strconv.FormatFloat(mm, 'g', 6, 64)
	}
	return strconv.FormatFloat(math.Round(mm*umPerMM)/umPerMM, 'f', -1, 64)
}

// mixBar is a bar in canonical positions.
type mixBar struct {
	stock int
	items []int32 // canonical positions, ascending
}

// mix is a candidate plan.
type mix struct {
	bars      []mixBar
	unplaced  []int32 // canonical positions out of stock
	budgetHit bool
}

// fill writes a mix into the plan, in µm arithmetic, with the bars ordered
// by stock, then by their first piece.
func (p *problem) fill(plan *Plan, m mix) {
	bars := slices.Clone(m.bars)
	slices.SortFunc(bars, func(a, b mixBar) int {
		if a.stock != b.stock {
			return a.stock - b.stock
		}
		return int(a.items[0] - b.items[0])
	})
	plan.Stocks = make([]StockUse, len(p.stocks))
	var placed []int32
	var stockUM, blankUM, offcutUM int64
	for _, b := range bars {
		u := p.su[b.stock]
		var blank int64
		out := Bar{Stock: b.stock}
		for _, i := range b.items {
			blank += p.blank[i]
			out.Pieces = append(out.Pieces, p.index[i])
			placed = append(placed, i)
		}
		used := 2*u.trim + blank + int64(len(b.items)-1)*u.kerf
		offcut := max(0, u.length-used-u.kerf)
		out.BlankMM, out.UsedMM, out.OffcutMM = toMM(blank), toMM(used), toMM(offcut)
		out.WasteMM = toMM(u.length - blank - offcut)
		plan.Bars = append(plan.Bars, out)
		stockUM += u.length
		blankUM += blank
		offcutUM += offcut
		plan.Stocks[b.stock].Bars++
		plan.Stocks[b.stock].Cost += u.price
		plan.Cost += u.price
	}
	plan.StockMM, plan.BlankMM, plan.OffcutMM = toMM(stockUM), toMM(blankUM), toMM(offcutUM)
	plan.WasteMM = toMM(stockUM - blankUM - offcutUM)
	slices.Sort(placed)
	for k, u := range p.su {
		su := &plan.Stocks[k]
		su.Stock = k
		var size []int64
		for _, i := range placed {
			if p.blank[i] <= u.usable {
				size = append(size, p.blank[i]+u.kerf)
			}
		}
		su.Fits = len(size)
		if len(size) > 0 {
			su.LengthBound = lengthBound(size, u.capacity)
			su.Bound = lowerBound(size, u.capacity)
		}
	}
	for _, i := range placed {
		best := math.Inf(1)
		for _, u := range p.su {
			best = math.Min(best, u.price*float64(p.blank[i]+u.kerf)/float64(u.capacity))
		}
		plan.CostBound += best
	}
	for _, i := range m.unplaced {
		plan.Unplaced = append(plan.Unplaced, Unplaced{p.index[i], ReasonNoBarLeft, p.outOfStock(i)})
	}
	slices.SortFunc(plan.Unplaced, func(a, b Unplaced) int { return a.Piece - b.Piece })
	if len(p.stocks) == 1 {
		plan.CostBound = math.Max(plan.CostBound, p.su[0].price*float64(plan.Stocks[0].Bound))
		plan.Proven = len(plan.Unplaced) == 0 && len(plan.Bars) == plan.Stocks[0].Bound
	}
	plan.BudgetHit = m.budgetHit
}

// outOfStock is the reason a piece that fits some stock is unplaced.
func (p *problem) outOfStock(i int32) string {
	var names []string
	for k, u := range p.su {
		if p.blank[i] <= u.usable {
			names = append(names, fmt.Sprintf("%s (%d bars)", p.stocks[k].Name, u.count))
		}
	}
	return fmt.Sprintf("no bar left: every bar it fits is used: %s", strings.Join(names, ", "))
}
