package panels

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
	"pqfab/quadnet"
)

// Flat is one panel laid flat: its plane, outlines and the numbers a
// workshop and a site need.
type Flat struct {
	Face  int
	Label string
	// Start is the corner of the net's face that is this flat panel's
	// corner 1: the flat's corner i is the face's corner (Start + i) mod k.
	// Flatten starts at the face's first corner; StartAt moves it.
	Start int
	Plane geom.Plane
	// Frame maps the 2D outline back to 3D: origin at the first corner
	// projected on the plane, X along the first edge, Z the plane normal.
	Frame geom.Frame
	// Outline is the set-out outline: the corners (node points) in the
	// frame, counter-clockwise seen from outside (the side the normal
	// points to: up, or out of a closed net).
	Outline geom.Polygon
	Cut     geom.Polygon // outline with the edge inset: what is cut
	// Set-out (centre-line) numbers, per edge k (corner k to k+1), per
	// corner k, and diagonals between every pair of non-adjacent corners:
	// (0,2), (1,3) for a quad.
	EdgeMM    []float64
	AngleDeg  []float64
	Diagonals []Diagonal
	// The same numbers for the cut outline: what a glazier orders.
	CutEdgeMM    []float64
	CutAngleDeg  []float64
	CutDiagonals []Diagonal
	// BoxMM is the cut outline's smallest enclosing rectangle, long side
	// then short side (mm): the size shaped panes are commonly priced on.
	BoxMM [2]float64
	// GrainDeg is the direction the grain (or the coating's direction)
	// must follow, in the panel's frame: degrees from the first edge.
	GrainDeg float64
	// Per edge k:
	FoldDeg     []float64 // signed angle to the neighbour's normal, ridge positive; 0 on the boundary
	BevelDeg    []float64 // fold / 2 (butt joint on the bisector plane); the job's boundary bevel outside
	Neighbour   []int     // face across the edge, -1 on the boundary
	AreaM2      float64   // of the cut outline
	PerimeterMM float64   // of the cut outline
	WeightKg    float64
	FlatnessMM  float64 // deviation of the 3D corners from the plane
	Type        int
	// SpecGroup: panels of different groups never share a type (a
	// specification given to some panels only, such as another
	// build-up); 0 for every panel unless the caller sets it.
	SpecGroup int
}

// Diagonal is the distance between corners I and J of the outline.
type Diagonal struct {
	I, J int
	MM   float64
}

// Flatten lays every panel of n flat. labels gives each panel's label
// (see Labels).
func Flatten(n *quadnet.Net, topo *quadnet.Topology, mat Material, labels []string) ([]Flat, error) {
	if err := mat.Validate(); err != nil {
		return nil, err
	}
	flats := make([]Flat, len(n.Faces))
	var pts []geom.Vec
	for f := range n.Faces {
		pts = n.FacePoints(pts[:0], f)
		fl, err := layFlat(n, f, pts, mat)
		if err != nil {
			return nil, err
		}
		fl.Label = labels[f]
		flats[f] = fl
	}
	// Folds and bevels across every edge.
	for f, face := range n.Faces {
		k := len(face.Corners)
		fl := &flats[f]
		fl.FoldDeg = make([]float64, k)
		fl.BevelDeg = make([]float64, k)
		fl.Neighbour = make([]int, k)
		for i, e := range topo.FaceEdges[f] {
			fl.Neighbour[i] = -1
			ed := topo.Edges[e]
			if len(ed.Faces) != 2 {
				fl.BevelDeg[i] = mat.BoundaryBevelDeg
				continue
			}
			g := ed.Faces[0]
			if g == f {
				g = ed.Faces[1]
			}
			fl.Neighbour[i] = g
			a, b := n.Nodes[face.Corners[i]].Pos, n.Nodes[face.Corners[(i+1)%k]].Pos
			dir := r3.Unit(r3.Sub(b, a))
			fold := geom.FoldAngle(fl.Plane.Normal, flats[g].Plane.Normal, dir) * 180 / math.Pi
			fl.FoldDeg[i] = fold
			fl.BevelDeg[i] = fold / 2
		}
	}
	return flats, nil
}

// layFlat lays the panel with corners pts (face f of n, from its corner
// 1) flat in material mat: plane, frame, outlines and their numbers.
func layFlat(n *quadnet.Net, f int, pts []geom.Vec, mat Material) (Flat, error) {
	fl, err := flatten(pts)
	if err != nil {
		return Flat{}, faceErr(n, f, nil, "%v", err)
	}
	fl.Face = f
	if mat.EdgeInsetMM > 0 {
		if fl.Cut, err = Inset(fl.Outline, mat.EdgeInsetMM); err != nil {
			return Flat{}, faceErr(n, f, ErrInsetTooLarge, "%v", err)
		}
	} else {
		fl.Cut = fl.Outline
	}
	fl.CutEdgeMM, fl.CutAngleDeg, fl.CutDiagonals = measure(fl.Cut)
	long, short, _ := fl.Cut.MinAreaRect()
	fl.BoxMM = [2]float64{long, short}
	fl.GrainDeg = mat.Grain.direction(fl)
	fl.AreaM2 = fl.Cut.Area() / 1e6
	fl.PerimeterMM = fl.Cut.Perimeter()
	fl.WeightKg = mat.WeightKg(fl.AreaM2)
	return fl, nil
}

// StartAt lays flat panel fl (made by Flatten from n with mat) flat again
// with its corner start as corner 1, so that a panel's corner 1 can be its
// type's corner 1 on every drawing: the frame, outlines and every per-corner
// and per-edge number follow (edge i of the result is edge start+i).
func StartAt(n *quadnet.Net, mat Material, fl *Flat, start int) error {
	k := len(fl.Outline)
	start = ((start % k) + k) % k
	if start == 0 {
		return nil
	}
	face := n.Faces[fl.Face].Corners
	pts := make([]geom.Vec, k)
	for i := range pts {
		pts[i] = n.Nodes[face[(fl.Start+start+i)%k]].Pos
	}
	nf, err := layFlat(n, fl.Face, pts, mat)
	if err != nil {
		return err
	}
	nf.Label, nf.Type, nf.Start, nf.SpecGroup = fl.Label, fl.Type, (fl.Start+start)%k, fl.SpecGroup
	turn := func(xs []float64) []float64 {
		out := make([]float64, k)
		for i := range out {
			out[i] = xs[(start+i)%k]
		}
		return out
	}
	nf.FoldDeg, nf.BevelDeg = turn(fl.FoldDeg), turn(fl.BevelDeg)
	nf.Neighbour = make([]int, k)
	for i := range nf.Neighbour {
		nf.Neighbour[i] = fl.Neighbour[(start+i)%k]
	}
	*fl = nf
	return nil
}

// faceErr names panel f of n by file, line and id, wrapping cause (may be
// nil).
func faceErr(n *quadnet.Net, f int, cause error, format string, args ...any) *quadnet.InputError {
	return &quadnet.InputError{File: n.Source, Line: n.Faces[f].Line, Elem: "panel " + n.Faces[f].ID, Msg: fmt.Sprintf(format, args...), Err: cause}
}

// flatten projects a panel's corners on their least-squares plane and
// writes them in the panel's own frame.
func flatten(pts []geom.Vec) (Flat, error) {
	fit, err := geom.FitPlane(pts)
	if err != nil {
		return Flat{}, err
	}
	o := fit.Project(pts[0])
	fr, err := geom.PlaneFrame(o, fit.Normal, r3.Sub(fit.Project(pts[1]), o), parallelSin)
	if err != nil {
		return Flat{}, errors.New("first edge has no length in the panel plane")
	}
	fl := Flat{Plane: fit.Plane, Frame: fr, FlatnessMM: fit.MaxDist}
	k := len(pts)
	fl.Outline = make(geom.Polygon, k)
	for i, p := range pts {
		q := fr.ToLocal(p)
		fl.Outline[i] = geom.Vec2{X: q.X, Y: q.Y}
	}
	fl.Outline[0] = geom.Vec2{} // exactly the origin
	fl.Outline[1].Y = 0         // exactly on the x axis
	if !fl.Outline.CCW() {
		return Flat{}, errors.New("outline runs clockwise in its own plane (folded or bow-tie panel)")
	}
	if fl.Outline.SelfIntersects() {
		return Flat{}, errors.New("outline crosses itself")
	}
	fl.EdgeMM, fl.AngleDeg, fl.Diagonals = measure(fl.Outline)
	return fl, nil
}

// OutlineNumbers returns a counter-clockwise outline's edge lengths (edge
// k from corner k to k+1), inner corner angles (degrees) and diagonals
// between every pair of non-adjacent corners, as Flatten measures panels.
func OutlineNumbers(p geom.Polygon) (edges, anglesDeg []float64, diags []Diagonal) { return measure(p) }

// measure returns a counter-clockwise outline's edge lengths (edge k runs
// from corner k to k+1), inner corner angles (degrees) and diagonals
// between every pair of non-adjacent corners.
func measure(p geom.Polygon) (edges, angles []float64, diags []Diagonal) {
	k := len(p)
	edges = make([]float64, k)
	angles = make([]float64, k)
	for i := range p {
		a, b, c := p[(i+k-1)%k], p[i], p[(i+1)%k]
		edges[i] = c.Sub(b).Norm()
		u, v := a.Sub(b), c.Sub(b)
		ang := math.Atan2(v.Cross(u), v.Dot(u)) * 180 / math.Pi
		if ang < 0 {
			ang += 360
		}
		angles[i] = ang
	}
	for i := 0; i < k; i++ {
		for j := i + 2; j < k; j++ {
			if i == 0 && j == k-1 {
				continue
			}
			diags = append(diags, Diagonal{I: i, J: j, MM: p[j].Sub(p[i]).Norm()})
		}
	}
	return edges, angles, diags
}
