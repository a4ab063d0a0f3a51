// Package bars makes cutting plans for member blanks: which bar of stock
// each blank is cut from (one-dimensional cutting stock).
//
// # Units and rounding
//
// Lengths are millimetres (float64); angles are degrees in every exported
// name ending in Deg. Inside, the solver counts whole micrometres: a length
// whose shortest decimal form has at most three decimals (such as 36.6) is
// taken exactly; any other is rounded against the plan (blanks, kerfs and
// trims up, bar lengths down), so a plan that fits in micrometres fits in
// the exact values too. Ties between pieces are decided on these
// micrometres, then on the label.
//
// # Kerf and trim
//
// A bar of length L loses the trim T at each end (the trim includes the
// saw cut that removes it), which leaves the usable length U = L − 2·T.
// Every cut between two pieces costs one kerf K. A bar holding the blanks
// b1 … bk fits when
//
//	2·T + b1 + … + bk + (k−1)·K ≤ L
//
// and that left side is the bar's used length. After the last piece a cut
// frees the rest of the bar as an offcut, and that cut costs a kerf too:
// the offcut is L − used − K when that is more than zero. When it is not,
// the last piece ends at (or within a kerf of) the trimmed end, no offcut
// remains and no further kerf is needed: the feasibility rule above has no
// kerf after the last piece. Waste is the rest: L − blanks − offcut (trims,
// kerfs and any sliver narrower than a kerf). The solver packs sizes b + K
// into a capacity U + K, which is the same rule.
//
// # Blank allowance
//
// A blank is the member's cut length (on its axis) plus an allowance at
// each end for the end cut (MemberBlankMM). In the member frame (x along the
// member, z the top of the section, y = z × x) an end cut is a plane
// through the axis point with normal n, mitre = atan2(n·y, n·x), bevel =
// atan2(n·z, n·x). The member's edge through the section corner (y, z)
// meets the plane at x = −y·tan(mitre) − z·tan(bevel), so on a w × d
// section the plane reaches past the axis point by
//
//	allowance = (w/2)·|tan(mitre)| + (d/2)·|tan(bevel)|
//
// (EndAllowanceMM has the derivation).
//
// # Lower bounds
//
// For a stock, the fewest bars by length is ceil(Σ (b + K) / (U + K)). The
// stronger bound reported beside it is the larger of L2 (Martello and
// Toth, Knapsack Problems, 1990), which counts pieces too long to share a
// bar, and ceil(n / k) where no bar holds more than k pieces (the k+1
// shortest overfill it). Plans report both per stock, and a lower bound on
// the cost.
//
// # The solver and what it guarantees
//
// One stock, fewest bars: the best of first-fit decreasing, best-fit
// decreasing (Johnson 1973), minimum bin slack (Gupta and Ho 1999, as MBS'
// of Fleszar and Hindi 2002) and a most-pieces packing (the longest piece
// left with the shortest ones, then traded up: it wins where members of
// nearly one length make the number a bar holds the limit). Then a
// consistent-neighbourhood tabu search after Buljubašić and Vasquez
// (Computers & Operations Research 76, 2016) saves one bar at a time: it
// empties the three least-filled bars into a pool, swaps groups of one or
// two pieces between the pool and the other bars (never overfilling a
// bar) to lower the pool's weight, and weights up the pieces that stay in
// the pool, until the pool fits into two bars. On plans of more than 300
// bars each move looks at 300 bars drawn at random. The search stops at
// the lower bound or when it has spent its effort (Options.Effort,
// counted in work units, never in time). When the bars equal the bound the
// plan is proven to use the fewest bars (Plan.Proven); otherwise it is a
// heuristic plan, and Plan.BudgetHit says whether the effort ran out. On
// the published Falkenauer (1996) instances it reaches the optimum on
// every triplet instance (t60) and the best known count, or one fewer, on
// every uniform instance (u250); the tests check the triplets exactly and
// the uniform class to within one bar.
//
// Several stocks, cheapest mix: for each stock, the pieces are packed into
// that stock alone (as above); when its count runs out its fullest bars
// are kept and the rest goes, the same way, to the stock with the lowest
// price per usable length among those left. Then, until nothing changes: a
// bar moves to the cheapest stock that holds its pieces; two bars whose
// pieces fit into one cheaper bar are merged; the pieces of one bar, or of
// two or three of the least efficient bars, are repacked by a bounded
// exhaustive search (up to 12 pieces) into the cheapest bars of any stock. The cheapest of these
// candidates is kept. What is guaranteed: every piece is on exactly one
// bar or listed as unplaced with its reason; counts are kept; the plan
// costs no more than packing into any one stock alone, where that stock
// holds every piece within its count; no bar can move to a cheaper stock
// that holds its pieces, and no two bars can become one cheaper bar (when
// the effort has not run out). The mix is otherwise heuristic: Plan
// reports a lower bound on the cost beside it. Cost ranks by price, then
// total bar length, then bars, so with no prices the plan uses the least
// bar length.
//
// # Determinism
//
// The pieces are sorted by length (longest first) and label before
// anything else, the search draws its tie-breaks from a fixed seed, and no
// step depends on map order, goroutines or the clock: the same multiset of
// pieces, in any order, with the same stocks and options, gives the same
// plan.
package bars
