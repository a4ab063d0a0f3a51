package panels

import (
	"math"

	"pqfab/geom"
)

// Panel material defaults (float glass; common practice values) and the
// largest values accepted.
const (
	DefaultThicknessMM      = 10.0
	DefaultDensityKgM3      = 2500.0 // soda-lime glass, common practice
	DefaultEdgeInsetMM      = 0.0
	DefaultBoundaryBevelDeg = 0.0
	MaxThicknessMM          = 1000.0
	MaxDensityKgM3          = 25000.0 // denser than any building material
	MaxEdgeInsetMM          = 1000.0
)

// Material is what panels are cut from.
type Material struct {
	Name             string
	ThicknessMM      float64
	DensityKgM3      float64
	EdgeInsetMM      float64 // each edge moved inward by this much for the cut outline
	BoundaryBevelDeg float64 // edge bevel on the net's boundary
}

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
	}
	return nil
}
