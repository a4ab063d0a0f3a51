package bars

import (
	"fmt"
	"math"

	"pqfab/nodes"
)

// EndAllowanceMM is the extra length an end cut needs beyond the cut
// length, which is measured on the member's axis.
//
// In the member frame (x along the member, z the top of the section, y =
// z × x) the end is cut by a plane through the axis point at the cut
// length, with normal n = (nx, ny, nz), nx > 0, and mitre = atan2(ny, nx),
// bevel = atan2(nz, nx) (the design notes' definitions). Taking the axis
// point as origin, the plane is nx·x + ny·y + nz·z = 0, so the edge of the
// member through the section corner (y, z) meets it at
//
//	x = −(ny·y + nz·z) / nx = −y·tan(mitre) − z·tan(bevel).
//
// The section is a widthMM × depthMM rectangle, y in ±w/2 and z in ±d/2;
// the plane reaches farthest along the axis at the corner where both terms
// have one sign:
//
//	allowance = (w/2)·|tan(mitre)| + (d/2)·|tan(bevel)|
//
// (the same at either end, the section being symmetric). A square cut
// needs 0; a 45° mitre on a 60 mm wide member needs 30 mm. The allowance
// grows without bound as an angle nears 90°: it returns +Inf for an angle
// of 90° or more in size and for a size or angle that is not a finite
// number or a negative size, so that no NaN reaches a plan.
func EndAllowanceMM(widthMM, depthMM, mitreDeg, bevelDeg float64) float64 {
	finite := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	if !finite(widthMM) || !finite(depthMM) || widthMM < 0 || depthMM < 0 ||
		!(math.Abs(mitreDeg) < 90) || !(math.Abs(bevelDeg) < 90) {
		return math.Inf(1)
	}
	rad := math.Pi / 180
	return widthMM/2*math.Abs(math.Tan(mitreDeg*rad)) + depthMM/2*math.Abs(math.Tan(bevelDeg*rad))
}

// MemberBlankMM is the length of bar a member is cut from: its cut length
// plus the end allowance at end A and at end B (EndAllowanceMM). The error
// names the member when an end cut has no finite allowance or the section
// is not a positive size.
func MemberBlankMM(m nodes.Member, s nodes.Section) (float64, error) {
	if !(s.WidthMM > 0) || !(s.DepthMM > 0) || math.IsInf(s.WidthMM, 0) || math.IsInf(s.DepthMM, 0) {
		return 0, fmt.Errorf("member %s: section %g × %g mm must be a positive size", m.Label, s.WidthMM, s.DepthMM)
	}
	blank := m.CutLengthMM
	for _, e := range []struct {
		name string
		end  nodes.End
	}{{"A", m.A}, {"B", m.B}} {
		a := EndAllowanceMM(s.WidthMM, s.DepthMM, e.end.MitreDeg, e.end.BevelDeg)
		if math.IsInf(a, 1) {
			return 0, fmt.Errorf("member %s: end %s cut (mitre %g°, bevel %g°) runs along the member", m.Label, e.name, e.end.MitreDeg, e.end.BevelDeg)
		}
		blank += a
	}
	if !(blank > 0) || math.IsInf(blank, 0) {
		return 0, fmt.Errorf("member %s: cut length %g mm gives no blank", m.Label, m.CutLengthMM)
	}
	return blank, nil
}

// MemberPieces makes a piece for every member: its label and its blank
// length (MemberBlankMM), in the members' order.
func MemberPieces(ms []nodes.Member, s nodes.Section) ([]Piece, error) {
	out := make([]Piece, len(ms))
	for i, m := range ms {
		b, err := MemberBlankMM(m, s)
		if err != nil {
			return nil, err
		}
		out[i] = Piece{Label: m.Label, LengthMM: b}
	}
	return out, nil
}
