package nest

import (
	"math"
	"sync"

	"pqfab/geom"
)

// The no-fit polygon driver fills sheet after sheet: for each new sheet it
// goes through the parts in order and places every one that finds room,
// on the stock size that carries the most part area per unit of price (or
// of sheet area when prices are not given).

// maxMisses ends the filling of a sheet after this many parts in a row
// found no place on it.
const maxMisses = 6

// maxSkips ends the filling of a sheet after this many parts were passed
// over as too large for the area left (or as large as one that failed).
const maxSkips = 400

// nfpShape is what the driver knows of a shape: its size and its
// orientations per stock.
type nfpShape struct {
	area    float64
	perim   float64
	height  float64     // short side of the outline's bounding box
	length  float64     // long side
	orients [][]nOrient // per stock
}

// fill places parts from order (shape indices, one entry a part) on one
// sheet of stock si, skipping those done, and returns the sheet and the
// positions in order of the parts placed.
func fill(info []nfpShape, s Stock, si int, order []int, done []bool, start int) (*sheetState, []int) {
	st := newSheetState(s)
	var used []int
	free := s.usableArea()
	misses, skips := 0, 0
	var failed []int // shapes that found no place on this sheet
	for k := start; k < len(order); k++ {
		if done[k] {
			continue
		}
		sh := order[k]
		if info[sh].area > free-st.area+2*fitSlackMM*info[sh].perim || dominated(info, sh, failed) {
			if skips++; skips >= maxSkips {
				break
			}
			continue
		}
		var bestScore score
		var bestPos geom.Vec2
		var bestO *nOrient
		for oi := range info[sh].orients[si] {
			o := &info[sh].orients[si][oi]
			var bound *score
			if bestO != nil {
				bound = &bestScore
			}
			pos, sc, ok := st.place(o, bound)
			if !ok {
				continue
			}
			if bestO == nil || sc.less(bestScore) {
				bestScore, bestPos, bestO = sc, pos, o
			}
		}
		if bestO == nil {
			failed = append(failed, sh)
			if misses++; misses >= maxMisses {
				break
			}
			continue
		}
		misses = 0
		st.add(sh, bestO, bestPos, info[sh].area)
		used = append(used, k)
	}
	return st, used
}

// dominated reports whether shape a is at least as large as a shape that
// already failed on this sheet: at least its area (less 1 %) and at least
// its short and long side. Such a part is not tried: a heuristic that
// spares most of the work of filling a sheet's last gaps.
func dominated(info []nfpShape, a int, failed []int) bool {
	for _, f := range failed {
		if f == a || (info[a].area >= 0.99*info[f].area && info[a].height >= info[f].height && info[a].length >= info[f].length) {
			return true
		}
	}
	return false
}

// runNFP nests the parts in the given order (shape indices, one entry a
// part, of parts known to fit some allowed stock) sheet after sheet,
// reporting progress as method.
// Stocks not in allowed are not used.
func (j *job) runNFP(info []nfpShape, order []int, allowed []bool, method string) *layout {
	lay := &layout{method: method}
	priced := true
	for _, s := range j.stocks {
		if s.Price == 0 {
			priced = false
		}
	}
	left := make([]int, len(j.stocks))
	for i, s := range j.stocks {
		left[i] = s.Count
		if s.Count == 0 {
			left[i] = -1 // no limit
		}
	}
	done := make([]bool, len(order))
	start, remaining := 0, len(order)
	for remaining > 0 {
		for done[start] {
			start++
		}
		if j.ctx.Err() != nil {
			lay.stopped = true
		}
		// The stocks' sheets are filled side by side (each fill only reads
		// what the others read); the best is chosen in stock order.
		fills := make([]struct {
			st   *sheetState
			used []int
		}, len(j.stocks))
		var wg sync.WaitGroup
		for si, s := range j.stocks {
			if left[si] == 0 || !allowed[si] {
				continue
			}
			wg.Go(func() { fills[si].st, fills[si].used = fill(info, s, si, order, done, start) })
		}
		wg.Wait()
		var best *sheetState
		var bestUsed []int
		bestStock, bestScore := -1, math.Inf(-1)
		for si, s := range j.stocks {
			st, used := fills[si].st, fills[si].used
			if st == nil || len(st.placed) == 0 {
				continue
			}
			score := st.area / (s.WidthMM * s.HeightMM)
			if priced {
				score = st.area / s.Price
			}
			if score > bestScore {
				best, bestUsed, bestStock, bestScore = st, used, si, score
			}
		}
		if best == nil {
			for k, sh := range order {
				if !done[k] {
					lay.unplaced = append(lay.unplaced, unplacedShape{sh, ReasonNoStock})
				}
			}
			break
		}
		if left[bestStock] > 0 {
			left[bestStock]--
		}
		ls := layoutSheet{stock: bestStock, area: best.area}
		for _, p := range best.placed {
			ls.parts = append(ls.parts, placedShape{shape: p.shape, deg: p.o.rot, mirror: p.o.mirrored, t: p.t})
		}
		lay.sheets = append(lay.sheets, ls)
		j.report(PhaseLayout, method, lay.sheets)
		for _, k := range bestUsed {
			done[k] = true
		}
		remaining -= len(bestUsed)
	}
	return lay
}
