package quadnet

import (
	"cmp"
	"slices"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// Work bounds of the proximity checks (coincident nodes, T-junctions):
// each makes at most nearTestsBase + nearTestsPerItem × (nodes + edges)
// distance tests, enough for any real net many times over (a grid net
// needs a handful per node), and reports when it ran out.
const (
	nearTestsBase    = 1 << 20
	nearTestsPerItem = 64
)

// nearTestBudget is the distance tests allowed for a net of items nodes
// and edges.
func nearTestBudget(items int) int { return nearTestsBase + nearTestsPerItem*items }

// skewDir is the direction the coincident-node check sorts along: not
// parallel to any axis or diagonal, so grid nets lined up with the axes
// spread out along it.
var skewDir = r3.Unit(geom.Vec{X: 0.5377, Y: 0.3112, Z: 0.7833})

// coincidentNodes returns pairs (a, b), a < b, of used nodes within tol, sorted
// by b then a. It sorts the nodes by their projection on a skew direction
// and compares only neighbours whose projections differ by at most tol,
// so the work is V log V for any net that is not a cloud of
// near-duplicates. It stops after MaxReportedPairs pairs (more reports
// whether another pair exists) or after budget distance tests (done is
// then false).
func coincidentNodes(n *Net, used []bool, tol float64, budget int) (pairs [][2]int, more, done bool) {
	type item struct {
		proj float64
		i    int
	}
	items := make([]item, 0, len(n.Nodes))
	for i, nd := range n.Nodes {
		if used[i] {
			items = append(items, item{r3.Dot(nd.Pos, skewDir), i})
		}
	}
	slices.SortFunc(items, func(a, b item) int { return cmp.Or(cmp.Compare(a.proj, b.proj), cmp.Compare(a.i, b.i)) })
	tests := 0
	done = true
scan:
	for x, it := range items {
		for y := x + 1; y < len(items) && items[y].proj-it.proj <= tol; y++ {
			if tests++; tests > budget {
				done = false
				break scan
			}
			j := items[y].i
			if r3.Norm(r3.Sub(n.Nodes[j].Pos, n.Nodes[it.i].Pos)) <= tol {
				if len(pairs) == MaxReportedPairs {
					more = true
					break scan
				}
				pairs = append(pairs, [2]int{min(it.i, j), max(it.i, j)})
			}
		}
	}
	sort.Slice(pairs, func(a, b int) bool {
		if pairs[a][1] != pairs[b][1] {
			return pairs[a][1] < pairs[b][1]
		}
		return pairs[a][0] < pairs[b][0]
	})
	return pairs, more, done
}
