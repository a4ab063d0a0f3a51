package nodes

import (
	"fmt"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
	"pqfab/samples"
)

// rotateToZ rotates v by the rotation that takes unit vector a to +z
// about the horizontal line a × z (Rodrigues' rotation formula:
// v cos θ + (k × v) sin θ + k (k·v)(1 − cos θ)).
func rotateToZ(a, v geom.Vec) geom.Vec {
	k := r3.Cross(a, geom.Vec{Z: 1})
	s := r3.Norm(k)
	if s == 0 {
		if a.Z > 0 {
			return v
		}
		return geom.Vec{X: v.X, Y: -v.Y, Z: -v.Z} // half a turn about x
	}
	k = r3.Scale(1/s, k)
	c := a.Z
	return r3.Add(r3.Add(r3.Scale(c, v), r3.Scale(s, r3.Cross(k, v))), r3.Scale(r3.Dot(k, v)*(1-c), k))
}

// TestHubAzimuthFromNorth checks every hub of the least-twist wave
// against an independent computation: rotate the node so its axis is
// vertical (Rodrigues' formula about the horizontal line a × z, which
// carries the hub plane onto the plan); there the azimuth of an arm is
// its plan angle minus the plan angle of grid north rotated alike,
// counter-clockwise, and its elevation is the angle above the plan. The
// arms are listed going round the hub (azimuths ascending); the axis
// tilt is acos(a·z) and the axis's plan direction is north turned
// counter-clockwise by the tilt direction.
func TestHubAzimuthFromNorth(t *testing.T) {
	n, _ := samples.Make("wave", 300)
	topo := topoOf(t, n)
	bays, _ := quadnet.NewBays(n.Positions(), 6000, 6000)
	s, err := Build(n, topo, testOptions(AxisLeastTwist, 50, bays))
	if err != nil {
		t.Fatal(err)
	}
	const tolDeg = 1e-9
	worst := 0.0
	for i, nd := range s.Nodes {
		a := nd.Axis
		if nd.Zero != ZeroNorth {
			t.Fatalf("node %s: azimuth 0 is %q, want north (the wave's axes are near vertical)", nd.Label, nd.Zero)
		}
		north := rotateToZ(a, geom.Vec{Y: 1})
		n0 := math.Atan2(north.Y, north.X)
		if !slices.IsSortedFunc(nd.Arms, func(x, y HubArm) int { return int(math.Copysign(1, x.AzimuthDeg-y.AzimuthDeg)) }) {
			t.Errorf("node %s: arms not listed going round the hub: %v", nd.Label, nd.Arms)
		}
		for _, arm := range nd.Arms {
			d := rotateToZ(a, r3.Unit(r3.Sub(n.Nodes[topo.Other(arm.Member, i)].Pos, n.Nodes[i].Pos)))
			want := math.Mod((math.Atan2(d.Y, d.X)-n0)*180/math.Pi+720, 360)
			diff := math.Abs(want - arm.AzimuthDeg)
			diff = math.Min(diff, 360-diff)
			worst = math.Max(worst, diff)
			if diff > tolDeg {
				t.Errorf("node %s member %s: azimuth %.9f°, independent %.9f°", nd.Label, s.Members[arm.Member].Label, arm.AzimuthDeg, want)
			}
			if el := math.Atan2(d.Z, math.Hypot(d.X, d.Y)) * 180 / math.Pi; math.Abs(el-arm.ElevationDeg) > tolDeg {
				t.Errorf("node %s: elevation %.9f°, independent %.9f°", nd.Label, arm.ElevationDeg, el)
			}
		}
		if tilt := math.Acos(a.Z) * 180 / math.Pi; math.Abs(tilt-nd.TiltDeg) > 1e-6 {
			t.Errorf("node %s: tilt %.9f°, want %.9f°", nd.Label, nd.TiltDeg, tilt)
		}
		// North (0, 1) turned counter-clockwise by the tilt direction
		// points along the axis's plan part.
		tw := nd.TiltTowardDeg * math.Pi / 180
		h := math.Hypot(a.X, a.Y)
		if dx, dy := -math.Sin(tw)-a.X/h, math.Cos(tw)-a.Y/h; math.Hypot(dx, dy) > 1e-9 {
			t.Errorf("node %s: tilt toward %.6f° does not point along the axis (%g, %g)", nd.Label, nd.TiltTowardDeg, a.X, a.Y)
		}
	}
	t.Logf("%d nodes, largest difference from the independent azimuth %.2g°", len(s.Nodes), worst)
}

// TestHubTiltedAxis: closed-form cases on one flat panel (elementary
// geometry). Node 0 at the origin has members due east and due north in
// the plan. With its axis tilted by θ toward north the hub plane holds
// the east member, which lies a quarter turn clockwise from north seen
// from above (azimuth 270°, elevation 0), while the north member is
// grid north projected (azimuth 0, elevation θ). Tilted toward east, the
// north member is in the hub plane (azimuth 0, elevation 0), the east
// member at azimuth 270° and elevation θ (the axis leans toward it:
// sin el = d·a = sin θ), and the tilt points to 270°. An axis lying
// along the north-south line takes up as azimuth 0.
func TestHubTiltedAxis(t *testing.T) {
	n := &quadnet.Net{Nodes: []quadnet.Node{{ID: "1"}, {ID: "2", Pos: geom.Vec{X: 1000}}, {ID: "3", Pos: geom.Vec{Y: 1000}}, {ID: "4", Pos: geom.Vec{X: 1000, Y: 1000}}},
		Faces: []quadnet.Face{{ID: "1", Corners: []int{0, 1, 3, 2}}}}
	topo := topoOf(t, n)
	east, north := -1, -1
	for _, e := range topo.NodeEdges[0] {
		switch topo.Other(e, 0) {
		case 1:
			east = e
		case 2:
			north = e
		}
	}
	th := 20.0
	s, c := math.Sin(th*math.Pi/180), math.Cos(th*math.Pi/180)
	for _, tc := range []struct {
		name     string
		axis     geom.Vec
		zero     string
		az, el   map[int]float64
		tilt, to float64
	}{
		{"toward north", geom.Vec{Y: s, Z: c}, ZeroNorth, map[int]float64{north: 0, east: 270}, map[int]float64{north: th, east: 0}, th, 0},
		{"toward east", geom.Vec{X: s, Z: c}, ZeroNorth, map[int]float64{north: 0, east: 270}, map[int]float64{north: 0, east: th}, th, 270},
		{"toward west", geom.Vec{X: -s, Z: c}, ZeroNorth, map[int]float64{north: 0, east: 270}, map[int]float64{north: 0, east: -th}, th, 90},
		// Axis due north, horizontal: azimuth 0 is up; seen from the
		// axis's tip (from the north) counter-clockwise from up comes
		// east first: azimuth 90°.
		{"along north", geom.Vec{Y: 1}, ZeroUp, map[int]float64{east: 90}, map[int]float64{north: 90, east: 0}, 90, 0},
	} {
		axes := []geom.Vec{tc.axis, {Z: 1}, {Z: 1}, {Z: 1}}
		ms := make([]Member, len(topo.Edges))
		for k := range ms {
			ms[k].Label = fmt.Sprint(k)
		}
		nds, err := Hubs(n, topo, axes, ms, []string{"a", "b", "c", "d"})
		if err != nil {
			t.Fatal(err)
		}
		nd := nds[0]
		if nd.Zero != tc.zero || math.Abs(nd.TiltDeg-tc.tilt) > 1e-9 || math.Abs(nd.TiltTowardDeg-tc.to) > 1e-9 {
			t.Errorf("%s: zero %s, tilt %.9f° toward %.9f°; want %s, %g° toward %g°", tc.name, nd.Zero, nd.TiltDeg, nd.TiltTowardDeg, tc.zero, tc.tilt, tc.to)
		}
		for _, arm := range nd.Arms {
			if want, ok := tc.az[arm.Member]; ok && math.Abs(arm.AzimuthDeg-want) > 1e-9 {
				t.Errorf("%s: member %d azimuth %.9f°, want %g°", tc.name, arm.Member, arm.AzimuthDeg, want)
			}
			if want := tc.el[arm.Member]; math.Abs(arm.ElevationDeg-want) > 1e-9 {
				t.Errorf("%s: member %d elevation %.9f°, want %g°", tc.name, arm.Member, arm.ElevationDeg, want)
			}
		}
	}
}
