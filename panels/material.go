package panels

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"pqfab/geom"
)

// Panel material defaults (float glass; common practice values) and the
// largest values accepted.
const (
	DefaultThicknessMM      = 10.0
	DefaultDensityKgM3      = 2500.0 // soda-lime glass, common practice
	DefaultEdgeInsetMM      = 0.0
	DefaultBoundaryBevelDeg = 0.0
	DefaultMaterialName     = "float glass"
	DefaultGrain            = GrainFirstEdge
	MaxThicknessMM          = 1000.0
	MaxDensityKgM3          = 25000.0 // denser than any building material
	MaxEdgeInsetMM          = 1000.0
)

// DefaultMaterial returns the default material: its name, thickness,
// density, edge inset, boundary bevel and grain rule.
func DefaultMaterial() Material {
	return Material{Name: DefaultMaterialName, ThicknessMM: DefaultThicknessMM, DensityKgM3: DefaultDensityKgM3,
		EdgeInsetMM: DefaultEdgeInsetMM, BoundaryBevelDeg: DefaultBoundaryBevelDeg, Grain: Grain{Rule: DefaultGrain}}
}

// Material is what panels are cut from.
type Material struct {
	Name             string
	ThicknessMM      float64
	DensityKgM3      float64
	EdgeInsetMM      float64 // each edge moved inward by this much for the cut outline
	BoundaryBevelDeg float64 // edge bevel on the net's boundary
	Grain            Grain   // which panel direction follows the grain
	// BevelledEdges: the edges are ground to their bevels, so each edge's
	// bevel is part of a panel's type (TypeOptions.Bevels).
	BevelledEdges bool
}

// WeightKg returns the weight of areaM2 square metres of the material.
func (m Material) WeightKg(areaM2 float64) float64 {
	return areaM2 * m.ThicknessMM / 1000 * m.DensityKgM3
}

// Grain rules: which direction of each panel must follow the grain of a
// board (or the roll direction of a coating) on stock that allows only
// turns of 0 and 180°.
const (
	GrainFirstEdge   = "first-edge"   // the first edge, corner 1 to corner 2
	GrainLongestEdge = "longest-edge" // the longest edge of the cut outline (the first of equal ones)
	GrainPlan        = "plan"         // a direction in plan (PlanDeg), projected on the panel
)

// Grain says which panel direction follows the grain.
type Grain struct {
	Rule    string  // GrainFirstEdge (default when empty), GrainLongestEdge or GrainPlan
	PlanDeg float64 // for GrainPlan: the direction in plan, degrees counter-clockwise from +x
}

// direction returns the grain direction in a flat panel's frame (degrees
// from its first edge). A plan direction that is square to a panel's plane
// has no projection on it; the first edge is taken then.
func (g Grain) direction(fl Flat) float64 {
	switch g.Rule {
	case GrainLongestEdge:
		best := 0
		for k, e := range fl.CutEdgeMM {
			if e > fl.CutEdgeMM[best]*(1+grainTieShare) {
				best = k
			}
		}
		k := len(fl.Cut)
		d := fl.Cut[(best+1)%k].Sub(fl.Cut[best])
		return math.Atan2(d.Y, d.X) * 180 / math.Pi
	case GrainPlan:
		s, c := math.Sincos(g.PlanDeg * math.Pi / 180)
		d := geom.Vec{X: c, Y: s}
		x, y := r3.Dot(d, fl.Frame.X), r3.Dot(d, fl.Frame.Y)
		if math.Hypot(x, y) < grainSquareSin {
			return 0
		}
		return math.Atan2(y, x) * 180 / math.Pi
	}
	return 0
}

// grainTieShare: edges within this share of the longest count as equally
// long, and the first of them is taken, so that rounding noise does not
// pick another edge. grainSquareSin: a plan direction whose projection on
// a panel is shorter than this (a unit vector) is square to the panel.
const (
	grainTieShare  = 1e-9
	grainSquareSin = 1e-6
)

// Validate checks the material's ranges and returns a *geom.FieldError
// naming the first bad field.
func (m Material) Validate() error {
	switch {
	case !(m.ThicknessMM > 0) || m.ThicknessMM > MaxThicknessMM:
		return geom.FieldErrorf("ThicknessMM", "%g must be more than 0 and at most %g mm", m.ThicknessMM, MaxThicknessMM)
	case !(m.DensityKgM3 >= 0) || m.DensityKgM3 > MaxDensityKgM3:
		return geom.FieldErrorf("DensityKgM3", "%g must be between 0 and %g kg/m³", m.DensityKgM3, MaxDensityKgM3)
	case !(m.EdgeInsetMM >= 0) || m.EdgeInsetMM > MaxEdgeInsetMM:
		return geom.FieldErrorf("EdgeInsetMM", "%g must be between 0 and %g mm", m.EdgeInsetMM, MaxEdgeInsetMM)
	case !(math.Abs(m.BoundaryBevelDeg) < 90):
		return geom.FieldErrorf("BoundaryBevelDeg", "%g must lie between -90 and 90", m.BoundaryBevelDeg)
	case !(math.Abs(m.Grain.PlanDeg) <= 360):
		return geom.FieldErrorf("Grain.PlanDeg", "%g must lie between -360 and 360", m.Grain.PlanDeg)
	}
	switch m.Grain.Rule {
	case "", GrainFirstEdge, GrainLongestEdge, GrainPlan:
	default:
		return geom.FieldErrorf("Grain.Rule", "%q: want first-edge, longest-edge or plan", m.Grain.Rule)
	}
	return nil
}
