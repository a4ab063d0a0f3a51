package bars

import (
	"cmp"
	"math"
	"slices"
)

// packOne packs items (canonical positions, ascending) into bars of stock
// k, fewest bars first: the better of first-fit and best-fit decreasing,
// then the tabu search down to the bound L2. Each bar's items come back
// ascending.
func (p *problem) packOne(k int, items []int32) (bins [][]int32, hit bool) {
	u := p.su[k]
	size := make([]int64, len(items))
	for x, i := range items {
		size[x] = p.blank[i] + u.kerf
	}
	start := firstFitDecreasing(size, u.capacity)
	if bfd := bestFitDecreasing(size, u.capacity); len(bfd) < len(start) {
		start = bfd
	}
	best, hit := reduceBars(size, u.capacity, start, boundL2(size, u.capacity), p.effort)
	bins = make([][]int32, len(best))
	for b, xs := range best {
		for _, x := range xs {
			bins[b] = append(bins[b], items[x])
		}
		slices.Sort(bins[b])
	}
	return bins, hit
}

// solveMix makes one candidate plan per stock, each starting from that
// stock alone, improves each, and keeps the best (the first of equals).
func (p *problem) solveMix(items []int32) mix {
	if len(items) == 0 {
		return mix{}
	}
	var best mix
	for k := range p.su {
		m := p.fromPrimary(k, items)
		p.improve(&m)
		if k == 0 || p.better(m, best) {
			best = m
		}
	}
	return best
}

// unlimited stands for a stock with no count limit.
const unlimited = math.MaxInt

func (p *problem) avail() []int {
	a := make([]int, len(p.su))
	for k, u := range p.su {
		a[k] = u.count
		if u.count == 0 {
			a[k] = unlimited
		}
	}
	return a
}

// fromPrimary packs all items that fit stock k into bars of k; if k runs
// out, it keeps its fullest bars; what is left goes to the stock with the
// lowest price per capacity among those not yet used that hold some of
// it, and so on.
func (p *problem) fromPrimary(k int, items []int32) mix {
	avail := p.avail()
	tried := make([]bool, len(p.su))
	var m mix
	remaining := items
	for k >= 0 {
		tried[k] = true
		var fit, rest []int32
		for _, i := range remaining {
			if p.blank[i] <= p.su[k].usable {
				fit = append(fit, i)
			} else {
				rest = append(rest, i)
			}
		}
		bins, hit := p.packOne(k, fit)
		m.budgetHit = m.budgetHit || hit
		if len(bins) > avail[k] {
			load := func(b []int32) int64 {
				var l int64
				for _, i := range b {
					l += p.blank[i]
				}
				return l
			}
			slices.SortStableFunc(bins, func(a, b []int32) int {
				if c := cmp.Compare(load(b), load(a)); c != 0 {
					return c
				}
				return int(a[0] - b[0])
			})
			for _, b := range bins[avail[k]:] {
				rest = append(rest, b...)
			}
			bins = bins[:avail[k]]
		}
		if avail[k] != unlimited {
			avail[k] -= len(bins)
		}
		for _, b := range bins {
			m.bars = append(m.bars, mixBar{k, b})
		}
		slices.Sort(rest)
		remaining = rest
		k = -1
		for k2, u := range p.su {
			if tried[k2] || avail[k2] == 0 || len(remaining) == 0 || p.blank[remaining[len(remaining)-1]] > u.usable {
				continue
			}
			if k < 0 || u.price*float64(p.su[k].capacity) < p.su[k].price*float64(u.capacity) {
				k = k2
			}
		}
	}
	m.unplaced = remaining
	return m
}

// improve makes a plan cheaper by two moves until neither applies: a bar
// goes to the cheapest stock left that holds its pieces (downsize), and two
// bars whose pieces fit together into one bar that costs less become that
// bar (merge).
func (p *problem) improve(m *mix) {
	used := make([]int, len(p.su))
	for _, b := range m.bars {
		used[b.stock]++
	}
	left := func(k int) int {
		if p.su[k].count == 0 {
			return unlimited
		}
		return p.su[k].count - used[k]
	}
	type agg struct{ blank, n int64 }
	aggOf := func(items []int32) agg {
		a := agg{n: int64(len(items))}
		for _, i := range items {
			a.blank += p.blank[i]
		}
		return a
	}
	fits := func(a agg, k int) bool { return a.blank+a.n*p.su[k].kerf <= p.su[k].capacity }
	// cheaper: lower price, then shorter.
	cheaper := func(pa float64, la int64, pb float64, lb int64) bool { return pa < pb || pa == pb && la < lb }
	aggs := make([]agg, len(m.bars))
	for b := range m.bars {
		aggs[b] = aggOf(m.bars[b].items)
	}
	maxCap := int64(0)
	for _, u := range p.su {
		maxCap = max(maxCap, u.capacity)
	}
	work := int64(0)
	for changed := true; changed && work < p.effort; {
		changed = false
		for b := range m.bars {
			cur := m.bars[b].stock
			best := cur
			for k, u := range p.su {
				if k != cur && left(k) > 0 && fits(aggs[b], k) && cheaper(u.price, u.length, p.su[best].price, p.su[best].length) {
					best = k
				}
			}
			if best != cur {
				used[cur]--
				used[best]++
				m.bars[b].stock = best
				changed = true
			}
		}
		order := make([]int, len(m.bars))
		for b := range order {
			order[b] = b
		}
		slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(aggs[a].blank, aggs[b].blank) })
		gone := make([]bool, len(m.bars))
	pairs:
		for x, i := range order {
			for _, j := range order[x+1:] {
				work++
				if gone[i] || aggs[i].blank+aggs[j].blank > maxCap {
					continue pairs
				}
				if gone[j] {
					continue
				}
				si, sj := p.su[m.bars[i].stock], p.su[m.bars[j].stock]
				both := agg{aggs[i].blank + aggs[j].blank, aggs[i].n + aggs[j].n}
				best := -1
				for k, u := range p.su {
					free := left(k)
					if m.bars[i].stock == k {
						free++
					}
					if m.bars[j].stock == k {
						free++
					}
					if free <= 0 || !fits(both, k) || !cheaper(u.price, u.length, si.price+sj.price, si.length+sj.length) {
						continue
					}
					if best < 0 || cheaper(u.price, u.length, p.su[best].price, p.su[best].length) {
						best = k
					}
				}
				if best < 0 {
					continue
				}
				used[m.bars[i].stock]--
				used[m.bars[j].stock]--
				used[best]++
				m.bars[i].stock = best
				m.bars[i].items = append(m.bars[i].items, m.bars[j].items...)
				slices.Sort(m.bars[i].items)
				aggs[i] = both
				gone[j] = true
				changed = true
				continue pairs
			}
		}
		if changed {
			kept := m.bars[:0]
			keptAggs := aggs[:0]
			for b := range m.bars {
				if !gone[b] {
					kept = append(kept, m.bars[b])
					keptAggs = append(keptAggs, aggs[b])
				}
			}
			m.bars, aggs = kept, keptAggs
		}
	}
}

// better orders plans: fewer unplaced pieces, then lower cost, then less
// bar length, then fewer bars.
func (p *problem) better(a, b mix) bool {
	if len(a.unplaced) != len(b.unplaced) {
		return len(a.unplaced) < len(b.unplaced)
	}
	ca, la := p.costLength(a)
	cb, lb := p.costLength(b)
	if ca != cb {
		return ca < cb
	}
	if la != lb {
		return la < lb
	}
	return len(a.bars) < len(b.bars)
}

func (p *problem) costLength(m mix) (float64, int64) {
	var c float64
	var l int64
	for _, b := range m.bars {
		c += p.su[b.stock].price
		l += p.su[b.stock].length
	}
	return c, l
}
