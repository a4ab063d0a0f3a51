package bars

import (
	"cmp"
	"math"
	"slices"
)

// packOne packs items (canonical positions, ascending) into bars of stock
// k, fewest bars first: the best of first-fit and best-fit decreasing,
// minimum bin slack and most pieces, then the tabu search down to the
// lower bound. Each bar's items come back
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
	if mbs := minBinSlack(size, u.capacity); len(mbs) < len(start) {
		start = mbs
	}
	if mp := mostPieces(size, u.capacity); len(mp) < len(start) {
		start = mp
	}
	best, hit := reduceBars(size, u.capacity, start, lowerBound(size, u.capacity), p.effort)
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
