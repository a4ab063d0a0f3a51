package nest

import (
	"cmp"
	"slices"
)

// The improvement phase works on a finished layout to empty its worst
// sheets: it takes the parts of a poorly used sheet W and of one other
// sheet S, lays as many of them as it can on S, and the rest on W. The
// change is kept when S then holds more part area than either held before
// and the rest fits on one sheet; W goes when nothing is left for it.
// Every kept change moves part area onto fuller sheets (the sum of the
// squares of the sheets' part areas grows), so the phase ends. It takes
// the sheets as W from the worst up, each with the emptiest maxPartners
// others as S, starts again from the worst after each kept change, and
// stops when its steps are used up or no pair gains.

// maxPartners: the improvement phase pairs a sheet with at most this many
// others (the emptiest).
const maxPartners = 8

// repacker lays the parts counted in pool (per shape) on one sheet of
// stock k and returns the sheet and the steps it took.
type repacker func(pool []int, k, budget int) (layoutSheet, int)

// improve runs the improvement phase on lay with at most budget steps and
// at most per steps for each sheet laid out, and returns the steps taken.
func (j *job) improve(lay *layout, budget, per int, repack repacker) int {
	used := 0
	const gainTol = 1e-9    // relative gain in part area that counts
	tried := map[int]bool{} // positions in idx of sheets tried as W since the last change
	for budget-used > 0 && len(lay.sheets) > 1 {
		if j.ctx.Err() != nil {
			lay.stopped = true
			break
		}
		idx := make([]int, len(lay.sheets))
		for i := range idx {
			idx[i] = i
		}
		slices.SortStableFunc(idx, func(a, b int) int { return cmp.Compare(lay.sheets[a].area, lay.sheets[b].area) })
		wi := -1
		for i := range idx {
			if !tried[i] {
				wi = i
				break
			}
		}
		if wi < 0 {
			break
		}
		tried[wi] = true
		w := idx[wi]
		W := lay.sheets[w]
		kept := false
		partners := 0
		for _, s := range idx {
			// A full sheet cannot take more.
			if s == w || lay.sheets[s].area >= j.stocks[lay.sheets[s].stock].usableArea()*(1-gainTol) {
				continue
			}
			if budget-used <= 0 || partners == maxPartners {
				break
			}
			partners++
			S := lay.sheets[s]
			pool := make([]int, len(j.shapes))
			for _, p := range S.parts {
				pool[p.shape]++
			}
			for _, p := range W.parts {
				pool[p.shape]++
			}
			first, n := repack(pool, S.stock, min(per, budget-used))
			used += n
			if first.area <= max(S.area, W.area)*(1+gainTol) {
				continue
			}
			for _, p := range first.parts {
				pool[p.shape]--
			}
			rest := 0
			for _, c := range pool {
				rest += c
			}
			if rest == 0 {
				lay.sheets[s] = first
				lay.sheets = slices.Delete(lay.sheets, w, w+1)
				kept = true
				break
			}
			second, n := repack(pool, W.stock, min(per, max(budget-used, 0)))
			used += n
			if len(second.parts) != rest {
				continue
			}
			lay.sheets[s], lay.sheets[w] = first, second
			kept = true
			break
		}
		if kept {
			clear(tried)
			j.report(PhaseImprove, lay.method, lay.sheets)
		}
	}
	return used
}
