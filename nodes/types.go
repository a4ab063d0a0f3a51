package nodes

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"pqfab/geom"
)

// Type tolerances: defaults, and the largest values accepted (beyond
// them "one type" would mean nothing).
const (
	DefaultTypeLengthTolMM = 1.0 // cut lengths within 1 mm are one type
	DefaultTypeAngleTolDeg = 0.5 // end angles within 0.5° are one type
	MaxTypeLengthTolMM     = 1000.0
	MaxTypeAngleTolDeg     = 45.0
)

// TypeOptions sets the tolerances for member and node types.
type TypeOptions struct {
	LengthTolMM float64
	AngleTolDeg float64
}

// Type is a group of congruent parts.
type Type struct {
	Name  string // MT-001, NT-001
	Parts []int  // member or node indices of the parts of this type, ascending
	Rep   int    // the part the others were compared with
}

// memberSig is what member types compare: cut length, twist, and the end
// angles read from either end. Reading a member from its other end turns
// its frame half a turn about z, which keeps mitres, elevations and twist
// but flips the sign of the bevels.
type memberSig struct {
	cut, twist float64
	fwd, rev   [6]float64 // mitre, bevel, elevation of the first end, then the second
}

func signature(m Member) memberSig {
	a, b := m.A, m.B
	return memberSig{cut: m.CutLengthMM, twist: m.TwistDeg,
		fwd: [6]float64{a.MitreDeg, a.BevelDeg, a.ElevationDeg, b.MitreDeg, b.BevelDeg, b.ElevationDeg},
		rev: [6]float64{b.MitreDeg, -b.BevelDeg, b.ElevationDeg, a.MitreDeg, -a.BevelDeg, a.ElevationDeg}}
}

// sameMember reports whether two members are one type: cut lengths within
// the length tolerance, twist and end angles within the angle tolerance,
// with the ends in either order.
func sameMember(p, q *memberSig, tol TypeOptions) bool {
	if math.Abs(p.cut-q.cut) > tol.LengthTolMM || math.Abs(p.twist-q.twist) > tol.AngleTolDeg {
		return false
	}
	return within(&p.fwd, &q.fwd, tol.AngleTolDeg) || within(&p.fwd, &q.rev, tol.AngleTolDeg)
}

func within(a, b *[6]float64, tol float64) bool {
	for i := range a {
		if math.Abs(a[i]-b[i]) > tol {
			return false
		}
	}
	return true
}

// GroupMembers groups members into types and sets each member's Type.
// Types are numbered by cut length, shortest first (MT-001, …).
func GroupMembers(ms []Member, tol TypeOptions) ([]Type, error) {
	if err := tol.Validate(); err != nil {
		return nil, err
	}
	keys := make([]float64, len(ms))
	sigs := make([]memberSig, len(ms))
	for i, m := range ms {
		keys[i] = m.CutLengthMM
		sigs[i] = signature(m)
	}
	groups := group(keys, tol.LengthTolMM, func(a, b int) bool { return sameMember(&sigs[a], &sigs[b], tol) })
	for t, g := range groups {
		for _, i := range g.Parts {
			ms[i].Type = t
		}
	}
	name(groups, "MT")
	return groups, nil
}

// nodeSignature returns the arms sorted by azimuth as (gap to the next
// arm, elevation) pairs: independent of which arm is first.
func nodeSignature(nd Node) [][2]float64 {
	arms := append([]HubArm(nil), nd.Arms...)
	sort.Slice(arms, func(i, j int) bool { return arms[i].AzimuthDeg < arms[j].AzimuthDeg })
	sig := make([][2]float64, len(arms))
	for k, a := range arms {
		next := arms[(k+1)%len(arms)].AzimuthDeg
		gap := next - a.AzimuthDeg
		if gap <= 0 {
			gap += 360
		}
		sig[k] = [2]float64{gap, a.ElevationDeg}
	}
	return sig
}

// sameNode reports whether two nodes have the same valence and hub angles
// within tol, up to turning one about its axis.
func sameNode(p, q [][2]float64, tol float64) bool {
	if len(p) != len(q) {
		return false
	}
	for shift := range q {
		ok := true
		for k := range p {
			r := q[(k+shift)%len(q)]
			if math.Abs(p[k][0]-r[0]) > tol || math.Abs(p[k][1]-r[1]) > tol {
				ok = false
				break
			}
		}
		if ok {
			return true
		}
	}
	return false
}

// GroupNodes groups nodes with the same valence and hub angles within the
// angle tolerance and sets each node's Type. Types are numbered by
// valence, then by the lowest arm elevation.
func GroupNodes(nds []Node, tol TypeOptions) []Type {
	sigs := make([][][2]float64, len(nds))
	keys := make([]float64, len(nds))
	for i, nd := range nds {
		sigs[i] = nodeSignature(nd)
		lo := math.Inf(1)
		for _, s := range sigs[i] {
			lo = math.Min(lo, s[1])
		}
		// Valence dominates the key; the lowest elevation orders within it.
		keys[i] = float64(nd.Valence)*1000 + lo
	}
	groups := group(keys, tol.AngleTolDeg, func(a, b int) bool { return sameNode(sigs[a], sigs[b], tol.AngleTolDeg) })
	for t, g := range groups {
		for _, i := range g.Parts {
			nds[i].Type = t
		}
	}
	name(groups, "NT")
	return groups
}

// group turns geom.GroupNear's groups into types.
func group(keys []float64, keyTol float64, same func(a, b int) bool) []Type {
	gs := geom.GroupNear(keys, keyTol, same)
	out := make([]Type, len(gs))
	for g, members := range gs {
		sorted := slices.Clone(members)
		slices.Sort(sorted)
		out[g] = Type{Rep: members[0], Parts: sorted}
	}
	return out
}

func name(groups []Type, prefix string) {
	width := max(3, len(fmt.Sprint(len(groups))))
	for g := range groups {
		groups[g].Name = fmt.Sprintf("%s-%0*d", prefix, width, g+1)
	}
}
