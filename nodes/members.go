package nodes

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Section is a member's cross-section (mm): solid, or a rectangular
// hollow section with walls WallMM thick.
type Section struct {
	WidthMM, DepthMM float64
	WallMM           float64 // 0: solid
}

// AreaMM2 is the section's area (mm²): w·d solid, w·d − (w − 2t)(d − 2t)
// hollow. The hollow's corners are square: a formed hollow section's
// rounded corners make it a few per cent lighter (give its catalogue
// mass per metre instead for weights to that accuracy).
func (s Section) AreaMM2() float64 {
	a := s.WidthMM * s.DepthMM
	if s.WallMM > 0 {
		a -= (s.WidthMM - 2*s.WallMM) * (s.DepthMM - 2*s.WallMM)
	}
	return a
}

// End is the cut at one end of a member, where it meets a hub.
type End struct {
	Node         int     // node index
	ElevationDeg float64 // asin(e_out · a): member above (+) or below (−) the hub's plane
	SetbackMM    float64 // r / cos(elevation): length lost to the hub at this end
	MitreDeg     float64 // cut-plane normal turned about the member's z axis
	BevelDeg     float64 // cut-plane normal turned about the member's y axis
}

// Member is a structural member along an edge of the net.
type Member struct {
	Edge        int    // edge index in the topology
	Label       string // such as C3-M12
	A, B        End    // ends at the edge's first and second node
	LengthMM    float64
	CutLengthMM float64
	TwistDeg    float64 // signed angle from u_A to u_B about e
	// Frame: origin at the midpoint, X along the member (A to B), Z the top
	// of the section (mean of the axes seen along the member), Y = Z × X.
	Frame geom.Frame
	// DihedralDeg is the angle between the two panels at the member,
	// measured through the structure's inside (180° for coplanar panels);
	// 0 on the boundary.
	DihedralDeg float64
	Type        int // index into the member types
}

// MemberOptions sets up member geometry. A zero field means its default.
type MemberOptions struct {
	HubRadiusMM float64 // 0: DefaultHubRadiusMM, which is no hub: members run to the node point
}

// withDefaults returns the options with every zero field set to its
// default.
func (o MemberOptions) withDefaults() MemberOptions {
	if o.HubRadiusMM == 0 {
		o.HubRadiusMM = DefaultHubRadiusMM
	}
	return o
}

// Validate checks the hub radius's range, zero standing for the default.
func (o MemberOptions) Validate() error {
	o = o.withDefaults()
	if !(o.HubRadiusMM >= 0) || o.HubRadiusMM > MaxHubRadiusMM {
		return geom.FieldErrorf("HubRadiusMM", "%g must be between 0 and %g mm", o.HubRadiusMM, MaxHubRadiusMM)
	}
	return nil
}

// Members computes every member of the net from node axes, to the
// definitions in the design notes: u_i = unit(a_i − (a_i·e)e), twist =
// signed angle from u_A to u_B about e, frame x = e, z = unit(u_A + u_B),
// y = z × x, and at each end the hub cut: the plane containing the node
// axis, normal to the member direction projected on the plane normal to
// the axis, at distance r from the axis; setback s = r / cos(elevation).
// The cut-plane normal n is oriented along +x (from A to B) at both ends,
// so a square cut reads mitre 0, bevel 0; mitre = atan2(n·y, n·x), bevel =
// atan2(n·z, n·x).
func Members(n *quadnet.Net, topo *quadnet.Topology, axes []geom.Vec, opt MemberOptions) ([]Member, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	opt = opt.withDefaults()
	normals := faceNormals(n)
	ms := make([]Member, len(topo.Edges))
	for k, ed := range topo.Edges {
		pa, pb := n.Nodes[ed.A].Pos, n.Nodes[ed.B].Pos
		d := r3.Sub(pb, pa)
		L := r3.Norm(d)
		if L == 0 {
			return nil, memberErr(n, topo, k, nil, "has zero length")
		}
		e := r3.Scale(1/L, d)
		ua, err := across(axes[ed.A], e)
		if err != nil {
			return nil, memberErr(n, topo, k, nil, "the axis of node %s %v", n.Nodes[ed.A].ID, err)
		}
		ub, err := across(axes[ed.B], e)
		if err != nil {
			return nil, memberErr(n, topo, k, nil, "the axis of node %s %v", n.Nodes[ed.B].ID, err)
		}
		z := r3.Add(ua, ub)
		if r3.Norm(z) < degenerateUnit {
			return nil, memberErr(n, topo, k, nil, "twisted half a turn: no top face")
		}
		z = r3.Unit(z)
		fr := geom.Frame{Origin: r3.Scale(0.5, r3.Add(pa, pb)), X: e, Z: z, Y: r3.Cross(z, e)}
		m := Member{Edge: k, LengthMM: L, Frame: fr, TwistDeg: deg(geom.SignedAngle(ua, ub, e))}
		m.A = endCut(ed.A, axes[ed.A], e, fr, opt.HubRadiusMM)
		m.B = endCut(ed.B, axes[ed.B], r3.Scale(-1, e), fr, opt.HubRadiusMM)
		m.CutLengthMM = L - m.A.SetbackMM - m.B.SetbackMM
		if m.CutLengthMM <= 0 {
			return nil, memberErr(n, topo, k, ErrHubTooLarge, "%v: hub radius %g mm, member %.1f mm long", ErrHubTooLarge, opt.HubRadiusMM, L)
		}
		if len(ed.Faces) == 2 {
			f1, f2 := ed.Faces[0], ed.Faces[1]
			if edgeRunsForward(n, f1, ed.A, ed.B) {
				m.DihedralDeg = 180 - deg(geom.FoldAngle(normals[f1], normals[f2], e))
			} else {
				m.DihedralDeg = 180 - deg(geom.FoldAngle(normals[f2], normals[f1], e))
			}
		}
		ms[k] = m
	}
	return ms, nil
}

// SetbackMM returns the setback of a hub cut with the given mitre and
// bevel at a hub of radius r: r / cos(elevation), where the member's
// elevation above the hub plane satisfies tan² elevation = tan² mitre +
// tan² bevel (the cut plane holds the node axis, so its normal in the
// member frame is the member direction projected across the axis; see the
// member type coordinates in types.go).
func SetbackMM(r, mitreDeg, bevelDeg float64) float64 {
	tm, tb := math.Tan(mitreDeg*math.Pi/180), math.Tan(bevelDeg*math.Pi/180)
	return r * math.Sqrt(1+tm*tm+tb*tb)
}

// across returns unit(a − (a·e)e), the axis seen along the member.
func across(a, e geom.Vec) (geom.Vec, error) {
	u := r3.Sub(a, r3.Scale(r3.Dot(a, e), e))
	if r3.Norm(u) < degenerateUnit {
		return geom.Vec{}, fmt.Errorf("runs along the member")
	}
	return r3.Unit(u), nil
}

// endCut computes the hub cut at a node with axis a for a member leaving
// the node in direction out.
func endCut(node int, a, out geom.Vec, fr geom.Frame, r float64) End {
	// Direction of the member in the plane normal to the axis: the cut
	// plane's normal, pointing from the axis into the member.
	p := r3.Unit(r3.Sub(out, r3.Scale(r3.Dot(out, a), a)))
	el := math.Asin(math.Max(-1, math.Min(1, r3.Dot(out, a))))
	end := End{Node: node, ElevationDeg: deg(el), SetbackMM: r / math.Cos(el)}
	nrm := p
	if r3.Dot(nrm, fr.X) < 0 {
		nrm = r3.Scale(-1, nrm)
	}
	nx, ny, nz := r3.Dot(nrm, fr.X), r3.Dot(nrm, fr.Y), r3.Dot(nrm, fr.Z)
	end.MitreDeg = deg(math.Atan2(ny, nx))
	end.BevelDeg = deg(math.Atan2(nz, nx))
	return end
}

// faceNormals returns the unit Newell normal of every face.
func faceNormals(n *quadnet.Net) []geom.Vec {
	out := make([]geom.Vec, len(n.Faces))
	var pts []geom.Vec
	for f := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		out[f] = r3.Unit(geom.VectorArea(pts))
	}
	return out
}

// edgeRunsForward reports whether face f runs from node a to node b.
func edgeRunsForward(n *quadnet.Net, f, a, b int) bool {
	c := n.Faces[f].Corners
	for i := range c {
		if c[i] == a && c[(i+1)%len(c)] == b {
			return true
		}
	}
	return false
}

func deg(r float64) float64 { return r * 180 / math.Pi }

// degenerateUnit: a sum or projection of unit vectors shorter than this
// has no usable direction (the vectors cancel or are parallel to within
// about 1e-9 rad).
const degenerateUnit = 1e-9
