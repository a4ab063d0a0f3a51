package nest

import (
	"math"
	"slices"
)

// The free-piece driver fills sheet after sheet with the free-piece packer
// (guillotine.go) and its search (sheetsearch.go): for each new sheet it
// searches a layout on every stock size that has sheets left and keeps the
// one that carries the most part area per unit of price (or of sheet area
// when prices are not given).

// Search settings of the free-piece driver.
const (
	maxSheetSteps = 8000 // steps of the search for one sheet, at most
	repackSteps   = 6000 // the same in the improvement phase
	maxRepacks    = 5    // sheets the improvement phase searches, at most
	searchBranch  = 12   // moves tried per step
	searchLook    = 12   // moves looked at per step
	searchOrders  = 2    // orders of cuts tried per move
	allShapes     = 128  // up to this many shapes, the packer looks at all of them
	pieceWindow   = 32   // for more, it looks at this many: the first with parts left
)

// pieceWeights weigh the move score of the free-piece packer.
var pieceWeights = gWeights{fit: 1, fill: 1, size: 1, tall: 1}

// runPieces nests the parts that fit some stock with the free-piece
// packer, spending at most budget search steps.
func (j *job) runPieces(fitsSome []bool, budget int) *layout {
	lay := &layout{method: "free pieces"}
	left := make([]int, len(j.shapes))
	var leftArea float64
	partsLeft := 0
	for si, sh := range j.shapes {
		if fitsSome[si] {
			left[si] = len(sh.parts)
			leftArea += float64(left[si]) * sh.area
			partsLeft += left[si]
		}
	}
	packers := make([]*gPacker, len(j.stocks))
	sheetsLeft := make([]int, len(j.stocks))
	var most float64 // largest usable area
	priced := true
	for k, st := range j.stocks {
		g := newGPacker(st, j.shapes, pieceWeights, st.Cuts == EdgeToEdge)
		g.left = left
		for si := range j.shapes {
			g.extra[si] = j.extra[si][k]
		}
		packers[k] = g
		sheetsLeft[k] = st.Count
		if st.Count == 0 {
			sheetsLeft[k] = -1 // no limit
		}
		most = math.Max(most, st.usableArea())
		priced = priced && st.Price > 0
	}
	for partsLeft > 0 {
		stopped := j.ctx.Err() != nil
		if stopped {
			lay.stopped = true
			budget = 0
		}
		// Share what is left of the budget among the sheets still to come;
		// what they leave is for the improvement phase.
		est := math.Max(1, math.Ceil(leftArea/most)) * float64(len(j.stocks))
		per := int(math.Min(maxSheetSteps, float64(budget)/est))
		var best *gState
		bestStock, bestScore := -1, math.Inf(-1)
		for k, st := range j.stocks {
			if sheetsLeft[k] == 0 {
				continue
			}
			s, used := packers[k].fillSheet(per, searchBranch, searchLook, searchOrders, j.ctx)
			budget -= used
			lay.steps += used
			if s == nil || len(s.placed) == 0 {
				continue
			}
			score := s.area / (st.WidthMM * st.HeightMM)
			if priced {
				score = s.area / st.Price
			}
			if score > bestScore {
				best, bestStock, bestScore = s, k, score
			}
		}
		if best == nil {
			break
		}
		if sheetsLeft[bestStock] > 0 {
			sheetsLeft[bestStock]--
		}
		ls := sheetOf(bestStock, best)
		for _, p := range ls.parts {
			left[p.shape]--
			leftArea -= j.shapes[p.shape].area
			partsLeft--
		}
		lay.sheets = append(lay.sheets, ls)
		j.report(PhaseLayout, lay.method, lay.sheets)
	}
	repack := func(pool []int, k, b int) (layoutSheet, int) {
		saved := slices.Clone(left)
		copy(left, pool)
		s, n := packers[k].fillSheet(b, searchBranch, searchLook, searchOrders, j.ctx)
		copy(left, saved)
		return sheetOf(k, s), n
	}
	lay.repack, lay.budget, lay.perRepack = repack, min(max(budget, 0), maxRepacks*repackSteps), repackSteps
	for si := range j.shapes {
		for ; left[si] > 0; left[si]-- {
			lay.unplaced = append(lay.unplaced, unplacedShape{si, ReasonNoStock})
		}
	}
	return lay
}

// sheetOf turns a free-piece packer's sheet into a layout sheet.
func sheetOf(k int, s *gState) layoutSheet {
	ls := layoutSheet{stock: k, area: s.area, cuts: s.cuts}
	for _, p := range s.placed {
		ls.parts = append(ls.parts, placedShape{shape: p.shape, deg: p.deg(), mirror: p.mirror, t: p.t})
	}
	return ls
}
