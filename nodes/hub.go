package nodes

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// HubArm is one member arriving at a node, seen in the node's hub frame.
type HubArm struct {
	Member       int     // member index
	AzimuthDeg   float64 // in [0, 360), counter-clockwise about the axis from the hub's azimuth 0
	ElevationDeg float64 // above (+) or below (−) the hub's plane
}

// Azimuth references: what a hub's azimuth 0 is.
const (
	// ZeroNorth: grid north (+y of the plan) projected on the hub plane.
	ZeroNorth = "north"
	// ZeroUp: up (+z) projected on the hub plane, for an axis within
	// NorthLostDeg of the north–south line, where north has no usable
	// projection.
	ZeroUp = "up"
)

// NorthLostDeg: where the axis lies within this angle of the north–south
// line, grid north projected on the hub plane is too short to mark
// (sin 5° ≈ 0.087 of its length) and azimuth 0 is up instead.
const NorthLostDeg = 5.0

// Node is a node of the structure with its hub.
type Node struct {
	Label   string
	Axis    geom.Vec
	Valence int
	// Frame of the hub: Z the axis, X azimuth 0 (grid north, +y of the
	// plan, projected on the plane normal to the axis; up where the axis
	// lies along the north–south line, Zero says which), Y = Z × X. A
	// site team finds north before any member is in and marks it on the
	// hub.
	Frame geom.Frame
	Zero  string   // ZeroNorth or ZeroUp
	Arms  []HubArm // going round the hub: by azimuth, ties by elevation, then member
	// TiltDeg is the angle of the axis from vertical (up); TiltTowardDeg
	// the plan direction it leans toward, counter-clockwise from grid
	// north seen from above, in [0, 360) (0 for a vertical axis).
	TiltDeg, TiltTowardDeg float64
	Type                   int // index into the node types
}

// Hubs computes every node's hub frame, arms and axis tilt. Members must
// carry their labels.
func Hubs(n *quadnet.Net, topo *quadnet.Topology, axes []geom.Vec, ms []Member, labels []string) ([]Node, error) {
	out := make([]Node, len(n.Nodes))
	north, up := geom.Vec{Y: 1}, geom.Vec{Z: 1}
	minProj := math.Sin(NorthLostDeg * math.Pi / 180)
	for i := range n.Nodes {
		es := topo.NodeEdges[i]
		nd := Node{Label: labels[i], Axis: axes[i], Valence: len(es), Zero: ZeroNorth}
		if len(es) == 0 {
			return nil, nodeErr(n, i, "belongs to no member")
		}
		ref := north
		if r3.Norm(r3.Sub(north, r3.Scale(r3.Dot(north, axes[i]), axes[i]))) < minProj {
			ref, nd.Zero = up, ZeroUp
		}
		fr, err := geom.PlaneFrame(n.Nodes[i].Pos, axes[i], ref, degenerateUnit)
		if err != nil {
			return nil, nodeErr(n, i, "its axis has no hub plane")
		}
		nd.Frame = fr
		for _, e := range es {
			d := r3.Unit(r3.Sub(n.Nodes[topo.Other(e, i)].Pos, n.Nodes[i].Pos))
			az := deg(math.Atan2(r3.Dot(d, fr.Y), r3.Dot(d, fr.X)))
			if az < 0 {
				az += 360
			}
			if az >= 360 {
				az -= 360
			}
			el := deg(math.Asin(math.Max(-1, math.Min(1, r3.Dot(d, fr.Z)))))
			nd.Arms = append(nd.Arms, HubArm{Member: e, AzimuthDeg: az, ElevationDeg: el})
		}
		sort.Slice(nd.Arms, func(a, b int) bool {
			x, y := nd.Arms[a], nd.Arms[b]
			if x.AzimuthDeg != y.AzimuthDeg {
				return x.AzimuthDeg < y.AzimuthDeg
			}
			if x.ElevationDeg != y.ElevationDeg {
				return x.ElevationDeg < y.ElevationDeg
			}
			return ms[x.Member].Label < ms[y.Member].Label
		})
		a := axes[i]
		nd.TiltDeg = deg(math.Acos(math.Max(-1, math.Min(1, a.Z))))
		if math.Hypot(a.X, a.Y) > degenerateUnit {
			// Counter-clockwise from +y seen from above: atan2(−x, y).
			nd.TiltTowardDeg = deg(math.Atan2(-a.X, a.Y))
			if nd.TiltTowardDeg < 0 {
				nd.TiltTowardDeg += 360
			}
		}
		out[i] = nd
	}
	return out, nil
}
