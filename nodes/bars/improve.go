package bars

import (
	"cmp"
	"slices"
)

// improve makes a plan cheaper by three moves until none applies or the
// work reaches the effort: a bar goes to the cheapest stock left that
// holds its pieces (downsize); two bars whose pieces fit together into one
// bar that costs less become that bar (merge); the pieces of one bar, or of
// two or three of the least efficient bars (price per blank length), are
// cut the cheapest way from any stocks left, found by a bounded exhaustive
// search (repack: it splits a dear bar into cheaper ones, or shares
// several bars' pieces out anew).
func (p *problem) improve(m *mix) {
	im := &improver{p: p, m: m, used: make([]int, len(p.su))}
	for _, b := range m.bars {
		im.used[b.stock]++
	}
	for changed := true; changed && im.work < p.effort; {
		changed = im.downsize()
		changed = im.merge() || changed
		changed = im.repackSingles() || changed
		changed = im.repackGroups() || changed
	}
}

// improver holds a plan being improved and the bars used per stock.
type improver struct {
	p    *problem
	m    *mix
	used []int
	work int64
}

func (im *improver) left(k int) int {
	if im.p.su[k].count == 0 {
		return unlimited
	}
	return im.p.su[k].count - im.used[k]
}

func (im *improver) blank(items []int32) int64 {
	var l int64
	for _, i := range items {
		l += im.p.blank[i]
	}
	return l
}

// fits: blanks plus one kerf each within the capacity (usable + kerf).
func (im *improver) fits(blank int64, n int, k int) bool {
	u := im.p.su[k]
	return blank+int64(n)*u.kerf <= u.capacity
}

// cheaper: lower price, then shorter.
func cheaper(pa float64, la int64, pb float64, lb int64) bool {
	return pa < pb || pa == pb && la < lb
}

func (im *improver) downsize() bool {
	changed := false
	for b := range im.m.bars {
		bar := &im.m.bars[b]
		blank := im.blank(bar.items)
		best := bar.stock
		for k, u := range im.p.su {
			im.work++
			if k != bar.stock && im.left(k) > 0 && im.fits(blank, len(bar.items), k) &&
				cheaper(u.price, u.length, im.p.su[best].price, im.p.su[best].length) {
				best = k
			}
		}
		if best != bar.stock {
			im.used[bar.stock]--
			im.used[best]++
			bar.stock = best
			changed = true
		}
	}
	return changed
}

func (im *improver) merge() bool {
	bars := im.m.bars
	blank := make([]int64, len(bars))
	order := make([]int, len(bars))
	maxCap := int64(0)
	for _, u := range im.p.su {
		maxCap = max(maxCap, u.capacity)
	}
	for b := range bars {
		blank[b] = im.blank(bars[b].items)
		order[b] = b
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(blank[a], blank[b]) })
	gone := make([]bool, len(bars))
	changed := false
pairs:
	for x, i := range order {
		for _, j := range order[x+1:] {
			im.work++
			if gone[i] || blank[i]+blank[j] > maxCap {
				continue pairs
			}
			if gone[j] {
				continue
			}
			si, sj := im.p.su[bars[i].stock], im.p.su[bars[j].stock]
			n := len(bars[i].items) + len(bars[j].items)
			best := -1
			for k, u := range im.p.su {
				free := im.left(k)
				if bars[i].stock == k {
					free++
				}
				if bars[j].stock == k {
					free++
				}
				if free <= 0 || !im.fits(blank[i]+blank[j], n, k) || !cheaper(u.price, u.length, si.price+sj.price, si.length+sj.length) {
					continue
				}
				if best < 0 || cheaper(u.price, u.length, im.p.su[best].price, im.p.su[best].length) {
					best = k
				}
			}
			if best < 0 {
				continue
			}
			im.used[bars[i].stock]--
			im.used[bars[j].stock]--
			im.used[best]++
			bars[i].stock = best
			bars[i].items = append(bars[i].items, bars[j].items...)
			slices.Sort(bars[i].items)
			blank[i] += blank[j]
			gone[j] = true
			changed = true
			continue pairs
		}
	}
	if changed {
		kept := bars[:0]
		for b := range bars {
			if !gone[b] {
				kept = append(kept, bars[b])
			}
		}
		im.m.bars = kept
	}
	return changed
}

// maxRepackPieces caps the pieces one exhaustive repack takes on, and
// repackNodes the nodes of its search; worstBars is how many of the least
// efficient bars are repacked in pairs, worstTriples in threes.
const (
	maxRepackPieces = 12
	repackNodes     = 20_000
	worstBars       = 40
	worstTriples    = 12
)

func (im *improver) repackSingles() bool {
	changed := false
	for b := 0; b < len(im.m.bars) && im.work < im.p.effort; b++ {
		if n := len(im.m.bars[b].items); n >= 2 && n <= maxRepackPieces && im.replace([]int{b}) {
			changed = true
			b--
		}
	}
	return changed
}

func (im *improver) repackGroups() bool {
	bars := im.m.bars
	order := make([]int, len(bars))
	eff := make([]float64, len(bars))
	for b := range bars {
		order[b] = b
		u := im.p.su[bars[b].stock]
		// Price per blank length, then bar length per blank length.
		eff[b] = u.price / float64(im.blank(bars[b].items))
		if u.price == 0 {
			eff[b] = float64(u.length) / float64(im.blank(bars[b].items))
		}
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(eff[b], eff[a]) })
	pieces := func(set ...int) int {
		n := 0
		for _, b := range set {
			n += len(bars[b].items)
		}
		return n
	}
	order = order[:min(len(order), worstBars)]
	for x, i := range order {
		for _, j := range order[x+1:] {
			if im.work >= im.p.effort {
				return false
			}
			if pieces(i, j) <= maxRepackPieces && im.replace([]int{i, j}) {
				return true // the bars have changed: start over
			}
		}
	}
	order = order[:min(len(order), worstTriples)]
	for x, i := range order {
		for y, j := range order[x+1:] {
			for _, k := range order[x+y+2:] {
				if im.work >= im.p.effort {
					return false
				}
				if pieces(i, j, k) <= maxRepackPieces && im.replace([]int{i, j, k}) {
					return true
				}
			}
		}
	}
	return false
}

// replace repacks the pieces of the bars set exhaustively and puts the
// result in their place if it is cheaper; it reports whether it did.
func (im *improver) replace(set []int) bool {
	var items []int32
	var price float64
	var length int64
	avail := make([]int, len(im.p.su))
	for k := range avail {
		avail[k] = im.left(k)
	}
	for _, b := range set {
		bar := im.m.bars[b]
		items = append(items, bar.items...)
		u := im.p.su[bar.stock]
		price += u.price
		length += u.length
		if avail[bar.stock] != unlimited {
			avail[bar.stock]++
		}
	}
	slices.Sort(items)
	bars, ok := im.repack(items, avail, price, length)
	if !ok {
		return false
	}
	for _, b := range set {
		im.used[im.m.bars[b].stock]--
	}
	for _, b := range bars {
		im.used[b.stock]++
	}
	// The first bars of the set take the new bars; the rest are removed.
	slices.Sort(set)
	for x, b := range set {
		if x < len(bars) {
			im.m.bars[b] = bars[x]
		}
	}
	for x := len(set) - 1; x >= len(bars); x-- {
		im.m.bars = slices.Delete(im.m.bars, set[x], set[x]+1)
	}
	im.m.bars = append(im.m.bars, bars[min(len(bars), len(set)):]...)
	return true
}

// repack cuts items (canonical, ascending) from bars of any stock, at most
// avail[k] of stock k, at the least (price, length), by a depth-first
// search: each item, longest first, goes into an open bar with room or a
// new bar. It returns a plan only if it beats (price, length).
func (im *improver) repack(items []int32, avail []int, price float64, length int64) ([]mixBar, bool) {
	type open struct {
		stock int
		free  int64 // capacity left, in this stock's sizes
		items []int32
	}
	var cur, best []open
	bestPrice, bestLength := price, length
	found := false
	nodes := 0
	var dfs func(x int, price float64, length int64)
	dfs = func(x int, price float64, length int64) {
		if !cheaper(price, length, bestPrice, bestLength) || nodes >= repackNodes {
			return
		}
		nodes++
		im.work++
		if x == len(items) {
			bestPrice, bestLength, found = price, length, true
			best = best[:0]
			for _, o := range cur {
				best = append(best, open{o.stock, o.free, slices.Clone(o.items)})
			}
			return
		}
		i := items[x]
		for b := range cur {
			size := im.p.blank[i] + im.p.su[cur[b].stock].kerf
			if size > cur[b].free {
				continue
			}
			cur[b].free -= size
			cur[b].items = append(cur[b].items, i)
			dfs(x+1, price, length)
			cur[b].items = cur[b].items[:len(cur[b].items)-1]
			cur[b].free += size
		}
		for k, u := range im.p.su {
			size := im.p.blank[i] + u.kerf
			if avail[k] <= 0 || size > u.capacity {
				continue
			}
			avail[k]--
			cur = append(cur, open{k, u.capacity - size, []int32{i}})
			dfs(x+1, price+u.price, length+u.length)
			cur = cur[:len(cur)-1]
			avail[k]++
		}
	}
	dfs(0, 0, 0)
	if !found {
		return nil, false
	}
	out := make([]mixBar, len(best))
	for b, o := range best {
		out[b] = mixBar{o.stock, o.items}
		slices.Sort(out[b].items)
	}
	return out, true
}
