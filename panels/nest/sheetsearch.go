package nest

import (
	"cmp"
	"context"
	"math"
	"slices"
)

// sheetSearch fills one sheet with the free-piece packer by a tree search
// over moves. At each step it takes one free piece that some part still
// fits (the one the fewest parts fit, then the one whose best move scores
// highest: the most constrained piece first) and tries the best few
// moves into it, each with its best orders of cuts, least waste first, and
// last leaving the piece empty.
//
// As in the bin-oriented heuristic of Djang and Finch (1998), which
// López-Camacho, Ochoa, Terashima-Marín and Burke (2013) carried over to
// irregular pieces, the search first asks for a sheet with no waste and
// allows more waste step by step: a branch is cut when the area placed
// plus the room left in pieces some part fits falls short of the target.
// Within a step the tree is searched by limited discrepancy (Harvey and
// Ginsberg 1995): first the path of best moves, then the paths that leave
// it once, twice, and so on, so that early choices are revised as often
// as late ones. The search keeps the sheet with the most part area and
// stops after a fixed number of steps, so its result depends on nothing
// but the input.
type sheetSearch struct {
	g         *gPacker
	budget    int // expansions left
	visits    int // visits left (revisits are cheap but not free)
	branch    int // moves tried per step
	look      int // moves looked at per step
	orders    int // cut orders tried per move
	best      *gState
	target    float64 // least area a branch must be able to reach
	leftArea  float64 // area of the parts left
	exhausted bool    // no branch was cut by the discrepancy limit
	dive      bool    // the first descent: no budget applies
	expanded  int     // states worked out
	ctx       context.Context
	bs        []branch // scratch of expand
	tr        turned   // scratch of expand
}

// ctxEvery: the search looks at its context every this many steps.
const ctxEvery = 64

// wasteSteps are the waste the search allows, one after another, as
// shares of the waste of the first descent (the path of best moves), each
// with its share of the search's steps: most go to a sheet without waste,
// the rest to closing the gap to it by thirds.
var wasteSteps = []struct{ waste, steps float64 }{{0, 0.6}, {0.3, 0.15}, {0.6, 0.15}, {1, 0.1}}

// maxDiscrepancy bounds the discrepancies of the search.
const maxDiscrepancy = 60

// visitsPerStep: the search may revisit this many nodes per expansion of
// its budget.
const visitsPerStep = 50

// gKid is a branch of a search node: a move into the node's chosen piece
// with an order of cuts, or leaving that piece empty (shape −1). The
// state it leads to is worked out when the search first goes there.
type gKid struct {
	st    *gState
	shape int
	m     gMove
	order []int
}

// branch is a move with an order of cuts, while a node is expanded.
type branch struct {
	m    gMove
	plan cutPlan
}

// fillSheet searches a layout for one sheet and returns it with the steps
// it took. It always finishes the path of best moves, whatever the
// budget; when ctx ends it stops searching beyond that.
//
// When the packer looks at a window of the shapes (more than allShapes),
// the sheet is filled in rounds: once the search has used up shapes of
// the window, the window moves on to the next shapes with parts left and
// the search goes on from the best sheet so far, its free pieces looked
// at again, until a round places nothing more. Many small parts, each a
// shape of its own, so fill the whole sheet and not only the window's
// share of it. A piece an earlier round chose to leave empty stays empty.
//
// fillSheet changes g.left while it searches and sets it back before it
// returns; the packers of all stocks share that slice, so the driver calls
// them one after another, never side by side.
func (g *gPacker) fillSheet(budget, branch, look, orders int, ctx context.Context) (*gState, int) {
	saved := slices.Clone(g.left)
	defer copy(g.left, saved)
	g.setWindow()
	best, used := g.searchSheet(g.emptySheet(), budget, branch, look, orders, ctx)
	for len(g.shapes) > allShapes && ctx.Err() == nil {
		copy(g.left, saved)
		for _, m := range best.placed {
			g.left[m.shape]--
		}
		if !g.setWindow() {
			break
		}
		root := g.resume(best)
		if root == nil {
			break
		}
		st, n := g.searchSheet(root, budget-used, branch, look, orders, ctx)
		used += n
		if st.area <= best.area {
			break
		}
		best = st
	}
	return best, used
}

// resume returns a fresh search node with the placements, cuts and free
// pieces of st, each piece's moves looked up again for the shapes now in
// the window, or nil when no piece takes a move.
func (g *gPacker) resume(st *gState) *gState {
	r := &gState{placed: st.placed[:len(st.placed):len(st.placed)], cuts: st.cuts[:len(st.cuts):len(st.cuts)], area: st.area}
	r.pieces = slices.Clone(st.pieces)
	open := false
	for i := range r.pieces {
		r.pieces[i].moves = g.cachedMoves(&r.pieces[i])
		for _, m := range r.pieces[i].moves {
			if g.left[m.shape] > 0 {
				open = true
				break
			}
		}
	}
	if !open {
		return nil
	}
	return r
}

// searchSheet runs the search of fillSheet from root: the path of best
// moves, then the waste steps within the budget.
func (g *gPacker) searchSheet(root *gState, budget, branch, look, orders int, ctx context.Context) (*gState, int) {
	s := &sheetSearch{g: g, branch: branch, look: look, orders: orders, visits: visitsPerStep * max(budget, 0), ctx: ctx}
	for si, sh := range g.shapes {
		if !g.convex || sh.convex {
			s.leftArea += float64(g.left[si]) * sh.area
		}
	}
	full := math.Min(g.usable, root.area+s.leftArea)
	s.best = root
	// The path of best moves first, whatever the budget.
	s.target = full
	s.dive = true
	s.dfs(root, 0)
	s.dive = false
	budget -= s.expanded
	shares := 0.0
	dive := s.best.area
	for _, w := range wasteSteps {
		shares += w.steps
	}
	for _, w := range wasteSteps {
		s.target = full - w.waste*(full-dive)
		if s.reached() {
			break
		}
		s.budget = int(float64(budget) * w.steps / shares)
		shares -= w.steps
		budget -= s.budget
		for d := 0; s.budget > 0 && s.visits > 0 && !s.reached() && d <= maxDiscrepancy; d++ {
			s.exhausted = true
			s.dfs(root, d)
			if s.exhausted {
				break
			}
		}
		budget += s.budget
	}
	return s.best, s.expanded
}

func (s *sheetSearch) reached() bool { return s.best.area >= s.target*(1-1e-12) }

// minArea returns the area of the smallest shape with parts left.
func (g *gPacker) minArea() float64 {
	m := math.Inf(1)
	for si, sh := range g.shapes {
		if g.left[si] > 0 && sh.area < m {
			m = sh.area
		}
	}
	return m
}

// firstMove returns the best move into pc of a shape with parts left.
func (s *sheetSearch) firstMove(pc *freePiece) (gMove, bool) {
	for _, m := range pc.moves {
		if s.g.left[m.shape] > 0 {
			return m, true
		}
	}
	return gMove{}, false
}

func (s *sheetSearch) dfs(st *gState, disc int) {
	if st.area > s.best.area {
		s.best = st
	}
	if s.reached() || (s.visits <= 0 && !s.dive) {
		return
	}
	if !s.dive {
		s.visits--
	}
	if !st.expanded {
		if !s.dive {
			if s.budget <= 0 {
				s.exhausted = false
				return
			}
			s.budget--
			if s.expanded%ctxEvery == 0 && s.ctx.Err() != nil {
				s.budget, s.visits = 0, 0
			}
		}
		s.expanded++
		s.expand(st)
	}
	if !s.dive && st.area+math.Min(st.room, s.leftArea) < s.target*(1-1e-12) {
		return
	}
	for i := range st.kids {
		if i > disc {
			s.exhausted = false
			return
		}
		k := &st.kids[i]
		if k.st == nil {
			if k.shape >= 0 {
				s.g.left[k.shape]--
				k.st = s.g.child(st, st.pick, k.m, s.g.placed(k.m), k.order, s.g.minArea())
				s.g.left[k.shape]++
			} else {
				c := &gState{placed: st.placed, cuts: st.cuts, area: st.area}
				c.pieces = append(append(make([]freePiece, 0, len(st.pieces)-1), st.pieces[:st.pick]...), st.pieces[st.pick+1:]...)
				k.st = c
			}
		}
		if k.shape >= 0 {
			s.g.left[k.shape]--
			s.leftArea -= s.g.shapes[k.shape].area
		}
		s.dfs(k.st, disc-i)
		if k.shape >= 0 {
			s.g.left[k.shape]++
			s.leftArea += s.g.shapes[k.shape].area
		}
		if s.reached() || (s.visits <= 0 && !s.dive) {
			return
		}
	}
}

// expand works out the branches of a node.
func (s *sheetSearch) expand(st *gState) {
	st.expanded = true
	pick := -1
	var pickScore float64
	pickN := 0
	for i := range st.pieces {
		pc := &st.pieces[i]
		m, ok := s.firstMove(pc)
		if !ok {
			continue
		}
		st.room += s.room(pc)
		n := 0
		for _, mm := range pc.moves {
			if s.g.left[mm.shape] > 0 {
				n++
			}
		}
		if pick < 0 || n < pickN || (n == pickN && (m.score > pickScore || (m.score == pickScore && pc.area > st.pieces[pick].area))) {
			pick, pickScore, pickN = i, m.score, n
		}
	}
	if pick < 0 {
		return
	}
	pc := &st.pieces[pick]
	// The best few moves by score, each with its best orders of cuts,
	// tried least waste first.
	bs := s.bs[:0]
	looked := 0
	for _, m := range pc.moves {
		if s.g.left[m.shape] == 0 {
			continue
		}
		if looked >= s.look {
			break
		}
		looked++
		s.g.left[m.shape]--
		minArea := s.g.minArea()
		s.g.left[m.shape]++
		tr := s.g.placedInto(&s.tr, m)
		for _, p := range s.g.cutOrders(pc, tr, needCuts(pc, tr), minArea, s.orders) {
			bs = append(bs, branch{m, p})
		}
	}
	slices.SortStableFunc(bs, func(a, b branch) int { return cmp.Compare(a.plan.waste, b.plan.waste) })
	if len(bs) > s.branch {
		bs = bs[:s.branch]
	}
	s.bs = bs
	st.pick = pick
	st.kids = make([]gKid, 0, len(bs)+1)
	for _, b := range bs {
		st.kids = append(st.kids, gKid{shape: b.m.shape, m: b.m, order: b.plan.order})
	}
	// Last, leave the piece empty.
	st.kids = append(st.kids, gKid{shape: -1})
}

// room returns how much part area a free piece can take at most: its
// area, or when it can hold no more than two parts (by the area of the
// smallest part that fits it), the largest area of one or two parts that
// fit it one by one.
func (s *sheetSearch) room(pc *freePiece) float64 {
	least := math.Inf(1)
	for _, m := range pc.moves {
		if s.g.left[m.shape] > 0 {
			least = min(least, s.g.shapes[m.shape].area)
		}
	}
	if pc.area >= 3*least {
		return pc.area
	}
	// Parts may reach fitSlackMM past the piece.
	tol := 2 * fitSlackMM * (pc.hi.X - pc.lo.X + pc.hi.Y - pc.lo.Y) * 2
	var best float64
	for i, m := range pc.moves {
		if s.g.left[m.shape] == 0 {
			continue
		}
		a := s.g.shapes[m.shape].area
		if a > pc.area+tol {
			continue
		}
		best = max(best, a)
		for _, n := range pc.moves[i:] {
			if s.g.left[n.shape] == 0 || (n.shape == m.shape && s.g.left[m.shape] < 2) {
				continue
			}
			if b := a + s.g.shapes[n.shape].area; b <= pc.area+tol {
				best = max(best, b)
			}
		}
	}
	return min(best, pc.area)
}
