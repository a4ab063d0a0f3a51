package nodes

import (
	"cmp"
	"fmt"
	"maps"
	"slices"

	"pqfab/parttype"
)

// Type tolerances: defaults, and the largest values accepted (beyond
// them "one type" would mean nothing).
const (
	DefaultTypeLengthTolMM = 1.0 // cut lengths within 1 mm are one type
	DefaultTypeAngleTolDeg = 0.5 // end angles within 0.5° are one type
	MaxTypeLengthTolMM     = 1000.0
	MaxTypeAngleTolDeg     = 45.0
)

// NoTypeTol, given as a tolerance of TypeOptions, asks for a tolerance of
// zero: parts are one type only where those values are equal (the
// field's zero value means its default).
const NoTypeTol = parttype.NoTol

// TypeOptions sets the tolerances for member and node types. A zero
// field means its default; NoTypeTol asks for a tolerance of zero.
type TypeOptions struct {
	LengthTolMM float64 // 0: DefaultTypeLengthTolMM
	AngleTolDeg float64 // 0: DefaultTypeAngleTolDeg
}

// withDefaults returns the tolerances to compute with: every zero set to
// its default, and NoTypeTol to 0. Its zeros mean zero, so its result
// goes only to unexported code, never back to GroupMembers or GroupNodes.
func (t TypeOptions) withDefaults() TypeOptions {
	t.LengthTolMM = parttype.TolOf(t.LengthTolMM, DefaultTypeLengthTolMM)
	t.AngleTolDeg = parttype.TolOf(t.AngleTolDeg, DefaultTypeAngleTolDeg)
	return t
}

// EndCut is the cut at one end of a member type.
type EndCut struct {
	MitreDeg, BevelDeg float64
}

// MemberType is a type of member: a promise that every two of its members
// agree within the tolerances (cut length within LengthTolMM; both ends'
// mitre and bevel and the twist within AngleTolDeg), each read from the
// end its entry of Reversed says. The nominal member (the values to cut)
// is the middle of each value's range, so every member lies within half
// the tolerance of it.
type MemberType struct {
	Name  string // MT-001, …
	Parts []int  // member indices, ascending
	// Reversed, per entry of Parts: the member is read from its end B,
	// so its end B is the type's end A (its bevels change sign; its
	// mitres and twist do not). At most half the members of a type are
	// reversed. The type's end A is where every member of it carries its
	// tag.
	Reversed []bool
	// Nominal member.
	CutLengthMM float64
	A, B        EndCut
	TwistDeg    float64
	// Largest deviation of any member from the nominal.
	MaxDevMM  float64 // cut length
	MaxDevDeg float64 // mitres, bevels, twist
	// TotalCutLengthMM is the sum of the members' own cut lengths.
	TotalCutLengthMM float64
}

// memberDim: cut length, mitre A, bevel A, mitre B, bevel B, twist.
const memberDim = 6

// memberCoords returns a member's coordinates read from end A, or from
// end B (reversed). Read from its other end, a member's frame turns half
// a turn about z: x and y change sign, z stays. The cut normal, oriented
// along x, changes sign too, so mitre = atan2(n·y, n·x) stays and bevel =
// atan2(n·z, n·x) changes sign; the twist, the angle from u_A to u_B about
// e, becomes the angle from u_B to u_A about −e, which is the same angle.
// So (cut, mA, bA, mB, bB, t) → (cut, mB, −bB, mA, −bA, t).
//
// The ends' elevations are not coordinates: with the axis in the frame's
// x–z half-plane above the member (a·z > 0, which holds for any twist under
// 90°), tan² elevation = tan² mitre + tan² bevel and the elevation's sign
// is the bevel's opposite, and the setbacks are in the cut length.
func memberCoords(m Member, reversed bool) [memberDim]float64 {
	if reversed {
		return [memberDim]float64{m.CutLengthMM, m.B.MitreDeg, -m.B.BevelDeg, m.A.MitreDeg, -m.A.BevelDeg, m.TwistDeg}
	}
	return [memberDim]float64{m.CutLengthMM, m.A.MitreDeg, m.A.BevelDeg, m.B.MitreDeg, m.B.BevelDeg, m.TwistDeg}
}

// GroupMembers sorts members into the fewest types it finds (see
// parttype.Solve for the method and its guarantees), sets each member's
// Type, and returns the types numbered by nominal cut length, ties by the
// nominal end angles and twist, with a lower bound on their number. A
// zero tolerance of tol means its default.
func GroupMembers(ms []Member, tol TypeOptions) ([]MemberType, parttype.Bound, error) {
	if err := tol.Validate(); err != nil {
		return nil, parttype.Bound{}, err
	}
	tol = tol.withDefaults()
	L, A := tol.LengthTolMM, tol.AngleTolDeg
	p := &parttype.Problem{Parts: len(ms), Dim: memberDim, Tol: []float64{L, A, A, A, A, A},
		Compose: [][]int{{0, 1}, {1, 0}}, Permutes: true, Coords: make([]float64, 0, 2*memberDim*len(ms))}
	keys := []parttype.Key{{Name: "cut length", Tol: L}, {Name: "twist", Tol: A},
		{Name: "smaller mitre", Tol: A}, {Name: "larger mitre", Tol: A},
		{Name: "smaller of bevel A and −bevel B", Tol: A}, {Name: "larger of bevel A and −bevel B", Tol: A}}
	for k := range keys {
		keys[k].Values = make([]float64, len(ms))
	}
	for i, m := range ms {
		f, r := memberCoords(m, false), memberCoords(m, true)
		p.Coords = append(append(p.Coords, f[:]...), r[:]...)
		mlo, mhi := minmax(f[1], f[3])
		blo, bhi := minmax(f[2], -f[4])
		for k, v := range []float64{f[0], f[5], mlo, mhi, blo, bhi} {
			keys[k].Values[i] = v
		}
	}
	p.Keys = keys
	groups, bound, err := parttype.Solve(p)
	if err != nil {
		return nil, parttype.Bound{}, err
	}
	types := make([]MemberType, len(groups))
	for t, g := range groups {
		n := g.Nominal()
		mt := MemberType{Parts: g.Parts, CutLengthMM: n[0], A: EndCut{n[1], n[2]}, B: EndCut{n[3], n[4]}, TwistDeg: n[5],
			MaxDevMM: (g.Max[0] - g.Min[0]) / 2}
		for d := 1; d < memberDim; d++ {
			mt.MaxDevDeg = max(mt.MaxDevDeg, (g.Max[d]-g.Min[d])/2)
		}
		for k, i := range g.Parts {
			mt.Reversed = append(mt.Reversed, g.Variants[k] == 1)
			mt.TotalCutLengthMM += ms[i].CutLengthMM
			ms[i].Type = t
		}
		types[t] = orientType(mt)
	}
	width := nameWidth(len(types))
	for t := range types {
		types[t].Name = fmt.Sprintf("MT-%0*d", width, t+1)
	}
	return types, bound, nil
}

// orientType turns a type end for end when more than half of its members
// are read from their end B, so that as many members as can be are read
// from their own end A (a tie stays as it is). Read from its other end,
// the nominal member (cut, mA, bA, mB, bB, t) is (cut, mB, −bB, mA, −bA,
// t), as for one member (memberCoords); the largest deviations stay.
func orientType(mt MemberType) MemberType {
	rev := 0
	for _, r := range mt.Reversed {
		if r {
			rev++
		}
	}
	if 2*rev <= len(mt.Reversed) {
		return mt
	}
	for k := range mt.Reversed {
		mt.Reversed[k] = !mt.Reversed[k]
	}
	mt.A, mt.B = EndCut{mt.B.MitreDeg, -mt.B.BevelDeg}, EndCut{mt.A.MitreDeg, -mt.A.BevelDeg}
	return mt
}

func minmax(a, b float64) (float64, float64) { return min(a, b), max(a, b) }

// nameWidth is the number of digits in type names: at least 3.
func nameWidth(n int) int { return max(3, len(fmt.Sprint(n))) }

// TypeArm is one arm of a node type's nominal hub.
type TypeArm struct {
	AzimuthDeg   float64 // counter-clockwise about the axis from the type's first arm (0 for it)
	ElevationDeg float64
}

// NodeType is a type of node: every two of its nodes have the same number
// of members and agree within AngleTolDeg in every arm's direction: its
// elevation, and its azimuth measured from the type's first arm, with the
// arms taken counter-clockwise about the axis from that arm (ArmOrder
// says which arm of each node is which arm of the type). The nominal hub
// is the middle of each value's range.
type NodeType struct {
	Name          string // NT-001, …
	Parts         []int  // node indices, ascending
	MembersAtNode int
	// ArmOrder, per entry of Parts: indices into the node's Arms, in the
	// type's arm order.
	ArmOrder [][]int
	Arms     []TypeArm // nominal hub, in the type's arm order
	// MaxDevDeg is the largest deviation of any arm's azimuth or elevation
	// from the nominal.
	MaxDevDeg float64
}

// armsByAzimuth fills idx with the indices of a node's arms sorted by
// azimuth (ties by elevation, then member).
func armsByAzimuth(idx []int, nd Node) {
	for i := range idx {
		idx[i] = i
	}
	slices.SortFunc(idx, func(a, b int) int {
		x, y := nd.Arms[a], nd.Arms[b]
		if c := cmp.Compare(x.AzimuthDeg, y.AzimuthDeg); c != 0 {
			return c
		}
		if c := cmp.Compare(x.ElevationDeg, y.ElevationDeg); c != 0 {
			return c
		}
		return cmp.Compare(x.Member, y.Member)
	})
}

// nodeCoords appends the coordinates of a node read from its s-th arm by
// azimuth (sorted: the arms by azimuth): the azimuths of the next k−1 arms
// counter-clockwise, measured from arm s, then the k elevations from
// arm s on.
func nodeCoords(dst []float64, nd Node, sorted []int, s int) []float64 {
	k := len(sorted)
	az0 := nd.Arms[sorted[s]].AzimuthDeg
	for i := 1; i < k; i++ {
		a := nd.Arms[sorted[(s+i)%k]].AzimuthDeg - az0
		if a < 0 {
			a += 360
		}
		dst = append(dst, a)
	}
	for i := range k {
		dst = append(dst, nd.Arms[sorted[(s+i)%k]].ElevationDeg)
	}
	return dst
}

// GroupNodes sorts nodes into the fewest types it finds (see
// parttype.Solve), nodes with different numbers of members apart, sets
// each node's Type, and returns the types numbered by members at node,
// then by the nominal arms, with a lower bound on their number. A zero
// tolerance of tol means its default.
func GroupNodes(nds []Node, tol TypeOptions) ([]NodeType, parttype.Bound, error) {
	if err := tol.Validate(); err != nil {
		return nil, parttype.Bound{}, err
	}
	tol = tol.withDefaults()
	A := tol.AngleTolDeg
	byCount := map[int][]int{}
	for i, nd := range nds {
		byCount[len(nd.Arms)] = append(byCount[len(nd.Arms)], i)
	}
	counts := slices.Sorted(maps.Keys(byCount))
	var types []NodeType
	var bound parttype.Bound
	for _, k := range counts {
		idx := byCount[k]
		if k == 0 {
			return nil, parttype.Bound{}, fmt.Errorf("node %s has no members", nds[idx[0]].Label)
		}
		dim := 2*k - 1
		p := &parttype.Problem{Parts: len(idx), Dim: dim, Tol: make([]float64, dim), Compose: make([][]int, k),
			Coords: make([]float64, 0, len(idx)*k*dim)}
		for d := range p.Tol {
			p.Tol[d] = A
		}
		for a := range k {
			p.Compose[a] = make([]int, k)
			for b := range k {
				p.Compose[a][b] = (a + b) % k
			}
		}
		// Keys: the elevations sorted (each within the tolerance), and the
		// gaps between arms sorted (each a difference of two azimuths
		// measured from the first arm, so within twice the tolerance).
		for j := range k {
			p.Keys = append(p.Keys, parttype.Key{Name: parttype.Ordinal(j, k, "lowest", "highest") + " arm elevation", Tol: A, Values: make([]float64, len(idx))})
		}
		for j := range k {
			p.Keys = append(p.Keys, parttype.Key{Name: parttype.Ordinal(j, k, "smallest", "largest") + " angle between neighbouring arms", Tol: 2 * A, Values: make([]float64, len(idx))})
		}
		sorted := make([][]int, len(idx))
		sortedAll := make([]int, len(idx)*k)
		el, gap := make([]float64, k), make([]float64, k)
		for n, i := range idx {
			sorted[n] = sortedAll[n*k : (n+1)*k : (n+1)*k]
			armsByAzimuth(sorted[n], nds[i])
			for s := range k {
				p.Coords = nodeCoords(p.Coords, nds[i], sorted[n], s)
			}
			for j, a := range sorted[n] {
				el[j] = nds[i].Arms[a].ElevationDeg
				next := nds[i].Arms[sorted[n][(j+1)%k]].AzimuthDeg
				gap[j] = next - nds[i].Arms[a].AzimuthDeg
				if gap[j] < 0 || k == 1 {
					gap[j] += 360
				}
			}
			slices.Sort(el)
			slices.Sort(gap)
			for j := range k {
				p.Keys[j].Values[n] = el[j]
				p.Keys[k+j].Values[n] = gap[j]
			}
		}
		groups, b, err := parttype.Solve(p)
		if err != nil {
			return nil, parttype.Bound{}, err
		}
		bound = bound.Add(b.Of(fmt.Sprintf("nodes with %d members", k)))
		for _, g := range groups {
			nom := g.Nominal()
			nt := NodeType{MembersAtNode: k, Arms: make([]TypeArm, k)}
			for j := range k {
				if j > 0 {
					nt.Arms[j].AzimuthDeg = nom[j-1]
				}
				nt.Arms[j].ElevationDeg = nom[k-1+j]
			}
			for d := range dim {
				nt.MaxDevDeg = max(nt.MaxDevDeg, (g.Max[d]-g.Min[d])/2)
			}
			orders := make([]int, len(g.Parts)*k)
			for e, n := range g.Parts {
				i := idx[n]
				order := orders[e*k : (e+1)*k : (e+1)*k]
				for j := range k {
					order[j] = sorted[n][(g.Variants[e]+j)%k]
				}
				nt.Parts = append(nt.Parts, i)
				nt.ArmOrder = append(nt.ArmOrder, order)
			}
			types = append(types, nt)
		}
	}
	// Parts were listed within their class; list them ascending.
	for t := range types {
		nt := &types[t]
		perm := make([]int, len(nt.Parts))
		for i := range perm {
			perm[i] = i
		}
		slices.SortFunc(perm, func(a, b int) int { return cmp.Compare(nt.Parts[a], nt.Parts[b]) })
		parts, orders := make([]int, len(perm)), make([][]int, len(perm))
		for i, j := range perm {
			parts[i], orders[i] = nt.Parts[j], nt.ArmOrder[j]
		}
		nt.Parts, nt.ArmOrder = parts, orders
		for _, i := range nt.Parts {
			nds[i].Type = t
		}
	}
	width := nameWidth(len(types))
	for t := range types {
		types[t].Name = fmt.Sprintf("NT-%0*d", width, t+1)
	}
	return types, bound, nil
}
