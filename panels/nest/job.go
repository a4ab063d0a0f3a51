package nest

import (
	"cmp"
	"context"
	"math"
	"slices"
	"sync"

	"pqfab/geom"
)

// job is one call of NestWith: the parts grouped by shape, what fits
// where, and the methods that lay them out.
type job struct {
	ctx    context.Context
	parts  []Part
	stocks []Stock
	shapes []*shape
	steps  int
	fits   [][]bool      // per shape and stock: it fits an empty sheet
	extra  [][][]float64 // per shape and stock: turns beyond the usual ones that let it fit

	progress func(Progress) // nil for none
	toPlace  int            // parts that fit some stock
	mu       sync.Mutex     // one call of progress at a time
}

// report tells the progress callback, if any, how a method goes.
func (j *job) report(phase, method string, sheets []layoutSheet) {
	if j.progress == nil {
		return
	}
	placed := 0
	for _, s := range sheets {
		placed += len(s.parts)
	}
	j.mu.Lock()
	defer j.mu.Unlock()
	j.progress(Progress{Phase: phase, Method: method, Sheets: len(sheets), Placed: placed, Parts: j.toPlace})
}

// placedShape is a part of a shape on a sheet: its outline (from the
// shape's lowest corner) mirrored, turned by deg and moved by t.
type placedShape struct {
	shape  int
	deg    float64
	mirror bool
	t      geom.Vec2
}

// layoutSheet is a sheet of a layout.
type layoutSheet struct {
	stock int
	parts []placedShape
	cuts  []Cut
	area  float64
}

type unplacedShape struct {
	shape  int
	reason Reason
}

// layout is a method's answer, by shapes, with what its improvement
// phase needs: the method's repacker, the steps it may still take and at
// most how many for one sheet.
type layout struct {
	sheets   []layoutSheet
	unplaced []unplacedShape
	method   string
	steps    int
	stopped  bool

	repack    repacker
	budget    int
	perRepack int
}

func newJob(ctx context.Context, parts []Part, stocks []Stock, steps int) *job {
	j := &job{ctx: ctx, parts: parts, stocks: stocks, shapes: shapesOf(parts), steps: steps}
	j.fits = make([][]bool, len(j.shapes))
	j.extra = make([][][]float64, len(j.shapes))
	for si, sh := range j.shapes {
		j.fits[si] = make([]bool, len(stocks))
		j.extra[si] = make([][]float64, len(stocks))
		for k, st := range stocks {
			if st.Cuts == EdgeToEdge && !sh.convex {
				continue
			}
			j.fits[si][k] = fitsEmpty(sh, st, nil)
			if !j.fits[si][k] && st.Rotation == Free {
				if a, ok := fitTurn(sh, st); ok {
					j.extra[si][k] = []float64{a}
					j.fits[si][k] = fitsEmpty(sh, st, j.extra[si][k])
				}
			}
		}
	}
	return j
}

// sameTurns reports whether stocks a and b give a shape the same
// orientations for the placer (nOrientations): same turns, mirror and
// spacing.
func sameTurns(a, b Stock) bool {
	return a.Rotation == b.Rotation && a.Mirror == b.Mirror && a.SpacingMM == b.SpacingMM
}

// fitsEmpty reports whether a shape fits an empty sheet of stock s in one
// of the turns the placers try.
func fitsEmpty(sh *shape, s Stock, extra []float64) bool {
	angles, mirrors := nTurns(sh, s, extra)
	for _, m := range mirrors {
		for _, a := range angles {
			lo, hi := orient(sh.poly, m, a, geom.Vec2{}).Bounds()
			_, _, okx := span(s.MarginMM-lo.X, s.WidthMM-s.MarginMM-hi.X)
			_, _, oky := span(s.MarginMM-lo.Y, s.HeightMM-s.MarginMM-hi.Y)
			if okx && oky {
				return true
			}
		}
	}
	return false
}

// fitTurnSamples: fitTurn looks at this many turns spread over a full
// turn before it refines the best.
const fitTurnSamples = 3600

// fitTurn looks for a turn at which a shape's bounding box fits the
// usable area of stock s when no edge-aligned turn does (a long part laid
// across a sheet's diagonal): the least over turns of how far the box
// sticks out, sampled and then refined by golden-section search.
func fitTurn(sh *shape, s Stock) (float64, bool) {
	w, h := s.WidthMM-2*s.MarginMM, s.HeightMM-2*s.MarginMM
	over := func(deg float64) float64 {
		lo, hi := orient(sh.hull, false, deg, geom.Vec2{}).Bounds()
		return math.Max(hi.X-lo.X-w, hi.Y-lo.Y-h)
	}
	best, bestOver := 0.0, math.Inf(1)
	step := 360.0 / fitTurnSamples
	for i := 0; i < fitTurnSamples; i++ {
		if o := over(float64(i) * step); o < bestOver {
			best, bestOver = float64(i)*step, o
		}
	}
	a, b := best-step, best+step
	g := (math.Sqrt(5) - 1) / 2
	for i := 0; i < 60; i++ {
		c, d := b-g*(b-a), a+g*(b-a)
		if over(c) < over(d) {
			b = d
		} else {
			a = c
		}
	}
	best = normDeg((a + b) / 2)
	return best, over(best) <= 2*fitSlackMM
}

// run lays the parts out by each method and returns the best layout.
func (j *job) run() *Result {
	base := &layout{}
	fitsSome := make([]bool, len(j.shapes))
	for si, sh := range j.shapes {
		for k := range j.stocks {
			fitsSome[si] = fitsSome[si] || j.fits[si][k]
		}
		if fitsSome[si] {
			j.toPlace += len(sh.parts)
			continue
		}
		reason := ReasonTooLarge
		for _, st := range j.stocks {
			if st.Cuts == EdgeToEdge && !sh.convex && fitsEmpty(sh, st, nil) {
				reason = ReasonNonConvex
			}
		}
		for range sh.parts {
			base.unplaced = append(base.unplaced, unplacedShape{si, reason})
		}
	}
	anyCut := false
	for _, st := range j.stocks {
		anyCut = anyCut || st.Cuts == EdgeToEdge
	}
	// The methods run side by side; each has a fixed share of the steps
	// and depends on nothing but its input.
	var lays []*layout
	var mu sync.Mutex
	var wg sync.WaitGroup
	keep := func(i int, l *layout) {
		mu.Lock()
		defer mu.Unlock()
		for len(lays) <= i {
			lays = append(lays, nil)
		}
		lays[i] = l
	}
	// The free-piece packer is the only method for edge-to-edge cuts; for
	// other stocks it runs beside the no-fit polygon driver unless the
	// parts are many, or many to a sheet (where it is slow and rarely
	// wins).
	if anyCut || (len(j.parts) <= manyParts && j.perSheet(fitsSome) <= manyPerSheet) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			keep(0, j.runPieces(fitsSome, j.steps))
		}()
	}
	if !anyCut {
		wg.Add(1)
		go func() {
			defer wg.Done()
			keep(1, j.runOrders(fitsSome))
		}()
	}
	wg.Wait()
	// The improvement phase works on the better layout only.
	var best *layout
	steps, stopped := 0, false
	for _, l := range lays {
		if l == nil {
			continue
		}
		steps += l.steps
		stopped = stopped || l.stopped
		if best == nil || j.better(l, best) {
			best = l
		}
	}
	if !best.stopped && best.repack != nil {
		steps += j.improve(best, best.budget, best.perRepack, best.repack)
		stopped = stopped || best.stopped
	}
	best.unplaced = append(best.unplaced, base.unplaced...)
	res := j.result(best)
	res.Steps, res.Stopped = steps, stopped
	return res
}

// runOrders runs the no-fit polygon driver over a few orders of the parts
// and returns the best layout.
func (j *job) runOrders(fitsSome []bool) *layout {
	info := make([]nfpShape, len(j.shapes))
	for si, sh := range j.shapes {
		lo, hi := sh.poly.Bounds()
		info[si] = nfpShape{area: sh.area, perim: sh.perim, height: math.Min(hi.X-lo.X, hi.Y-lo.Y), length: math.Max(hi.X-lo.X, hi.Y-lo.Y)}
		info[si].orients = make([][]nOrient, len(j.stocks))
		for k, st := range j.stocks {
			// Stocks that turn, mirror and space parts alike share them.
			for e := range k {
				if sameTurns(j.stocks[e], st) && slices.Equal(j.extra[si][e], j.extra[si][k]) {
					info[si].orients[k] = info[si].orients[e]
					break
				}
			}
			if info[si].orients[k] == nil {
				info[si].orients[k] = nOrientations(sh, st, j.extra[si][k])
			}
		}
	}
	allowed := make([]bool, len(j.stocks))
	for k, st := range j.stocks {
		allowed[k] = st.Cuts != EdgeToEdge
	}
	orderings := []struct {
		name string
		key  func(si int) float64
		idx  []int // the shapes in this order
	}{
		{"no-fit polygons, largest area first", func(si int) float64 { return info[si].area }, nil},
		{"no-fit polygons, longest short side first", func(si int) float64 { return info[si].height }, nil},
		{"no-fit polygons, longest perimeter first", func(si int) float64 { return j.shapes[si].perim }, nil},
	}
	if len(j.parts) > manyParts {
		orderings = orderings[:1]
	}
	var best *layout
	for oi := range orderings {
		o := &orderings[oi]
		// Shapes are in geometric order already; a stable sort keeps it
		// on ties.
		idx := make([]int, len(j.shapes))
		for i := range idx {
			idx[i] = i
		}
		slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(o.key(b), o.key(a)) })
		o.idx = idx
		var order []int
		for _, si := range idx {
			if !fitsSome[si] {
				continue
			}
			for range j.shapes[si].parts {
				order = append(order, si)
			}
		}
		l := j.runNFP(info, order, allowed, o.name)
		if best == nil || j.better(l, best) {
			best = l
		}
		if l.stopped || (oi == 0 && fillSteps(l)*len(orderings) > j.steps) {
			break
		}
	}
	// The improvement phase repacks pairs of sheets by each ordering in
	// turn and keeps the sheet with the most part area; filling a sheet
	// from n parts costs n² steps (fillSteps), and a fill the steps left
	// cannot pay for is not made.
	repack := func(pool []int, k, budget int) (layoutSheet, int) {
		var bestSheet layoutSheet
		steps := 0
		for _, o := range orderings {
			var order []int
			for _, si := range o.idx {
				for c := 0; c < pool[si]; c++ {
					order = append(order, si)
				}
			}
			cost := max(1, len(order)*len(order))
			if steps+cost > budget {
				// Not to be afforded: the budget counts as spent.
				steps = max(steps, budget)
				break
			}
			steps += cost
			st, _ := fill(info, j.stocks[k], k, order, make([]bool, len(order)), 0)
			if st.area > bestSheet.area {
				bestSheet = layoutSheet{stock: k, area: st.area}
				for _, p := range st.placed {
					bestSheet.parts = append(bestSheet.parts, placedShape{shape: p.shape, deg: p.o.rot, mirror: p.o.mirrored, t: p.t})
				}
			}
		}
		bestSheet.stock = k
		return bestSheet, steps
	}
	best.repack, best.budget, best.perRepack = repack, j.steps, j.steps
	return best
}

// fillSteps returns what the no-fit polygon driver's layout cost in
// steps: n² for a sheet of n parts. The driver tries its other orders of
// the parts only when the steps pay for all of them: with hundreds of
// parts to a sheet one order is all the steps allow.
func fillSteps(l *layout) int {
	n := 0
	for _, s := range l.sheets {
		n += len(s.parts) * len(s.parts)
	}
	return n
}

// manyPerSheet: when more parts than this go on a sheet of the largest
// stock (by their mean area), the free-piece packer does not run for
// stocks without edge-to-edge cuts.
const manyPerSheet = 100

// perSheet returns how many of the parts that fit some stock would go on
// a sheet of the largest stock by their mean area and the sheet's usable
// area.
func (j *job) perSheet(fitsSome []bool) float64 {
	var area float64
	n := 0
	for si, sh := range j.shapes {
		if fitsSome[si] {
			area += float64(len(sh.parts)) * sh.area
			n += len(sh.parts)
		}
	}
	var most float64
	for _, st := range j.stocks {
		most = max(most, st.usableArea())
	}
	if area == 0 {
		return 0
	}
	return most / (area / float64(n))
}

// manyParts: above this many parts the no-fit polygon driver tries one
// order of the parts only.
const manyParts = 2000

// better prefers fewer unplaced parts, then lower cost (when every stock
// has a price), then less sheet area, then fewer sheets.
func (j *job) better(a, b *layout) bool {
	if len(a.unplaced) != len(b.unplaced) {
		return len(a.unplaced) < len(b.unplaced)
	}
	var ca, cb, aa, ab float64
	for _, s := range a.sheets {
		ca += j.stocks[s.stock].Price
		aa += j.stocks[s.stock].WidthMM * j.stocks[s.stock].HeightMM
	}
	for _, s := range b.sheets {
		cb += j.stocks[s.stock].Price
		ab += j.stocks[s.stock].WidthMM * j.stocks[s.stock].HeightMM
	}
	if ca != cb {
		return ca < cb
	}
	if aa != ab {
		return aa < ab
	}
	return len(a.sheets) < len(b.sheets)
}

// result turns a layout by shapes into placements of parts: the parts of
// a shape take its places in index order, sheet by sheet.
func (j *job) result(l *layout) *Result {
	res := &Result{Ordering: l.method}
	next := make([]int, len(j.shapes))
	take := func(si int) (int, geom.Vec2) {
		k := next[si]
		next[si]++
		return j.shapes[si].parts[k], j.shapes[si].starts[k]
	}
	for _, ls := range l.sheets {
		s := j.stocks[ls.stock]
		sh := Sheet{Stock: ls.stock}
		for _, ps := range ls.parts {
			p, start := take(ps.shape)
			x := ps.t.Sub(turnVec(start, ps.mirror, ps.deg))
			sh.Placements = append(sh.Placements, Placement{Part: p, X: x.X, Y: x.Y, RotationDeg: ps.deg, Mirrored: ps.mirror,
				Outline: orient(j.parts[p].Outline, ps.mirror, ps.deg, x)})
			sh.PartAreaMM2 += j.parts[p].Outline.Area()
		}
		sh.Utilization = sh.PartAreaMM2 / (s.WidthMM * s.HeightMM)
		if s.Cuts == EdgeToEdge {
			sh.Cuts = ls.cuts
			for _, c := range ls.cuts {
				sh.CutLengthMM += c.To.Sub(c.From).Norm()
			}
		}
		res.Sheets = append(res.Sheets, sh)
	}
	for _, u := range l.unplaced {
		p, _ := take(u.shape)
		res.Unplaced = append(res.Unplaced, Unplaced{Part: p, Reason: u.reason})
	}
	slices.SortFunc(res.Unplaced, func(a, b Unplaced) int { return a.Part - b.Part })
	return res
}
