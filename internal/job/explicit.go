package job

import (
	"fmt"

	"pqfab/geom"
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/quadnet"
)

// A job file, and a flag of the single-stage commands, reads 0 as 0; the
// libraries read a zero option field as the field's default, and take a
// negative constant (panels.NoFairness, panels.NoTypeTol,
// nodes.NoTypeTol, quadnet.NoTol, quadnet.NoBound) where 0 is a setting of its
// own. The Explicit functions take options whose every field is given, 0
// meaning 0 (filled from a job or from flags), and return them as the
// libraries read them, checked, so that a job and a flag mean what they
// always meant:
//
//   - 0 where the library has a zero setting becomes the constant that
//     asks for it;
//   - 0 where it has none (a flatness tolerance, an allowed move, an
//     iteration budget, a member width or depth) is an error;
//   - the constant's own value, given as a number, is an error, as every
//     other negative number is.
//
// The errors are worded as the library words a value out of its range,
// as a *geom.FieldError naming the Go field, so the job names the key
// and the commands the flag.

// explicitField is a float field of a library option given in full.
type explicitField struct {
	name string   // the Go field, for errors
	v    *float64 // the value given, 0 meaning 0
	zero float64  // the library's constant for 0; 0 where it has none
	want string   // the library's wording of the field's range
}

// explicit turns the fields given into the library's reading, or returns
// the first that cannot be.
func explicit(fs ...explicitField) error {
	for _, f := range fs {
		switch v := *f.v; {
		case v == 0 && f.zero == 0, v != 0 && v == f.zero:
			return geom.FieldErrorf(f.name, "%g %s", v, f.want)
		case v == 0:
			*f.v = f.zero
		}
	}
	return nil
}

// typeTolWant is how nodes and panels word a type tolerance's range.
func typeTolWant(max float64, unit string) string {
	return fmt.Sprintf("must be between 0 and %g%s", max, unit)
}

// ExplicitPlanarize returns planarize options given in full, 0 meaning 0,
// as panels.Planarize reads them, and the first problem with them.
func ExplicitPlanarize(o panels.PlanarizeOptions) (panels.PlanarizeOptions, error) {
	err := explicit(
		explicitField{"TolMM", &o.TolMM, 0, fmt.Sprintf("must be more than 0 and at most %g mm", panels.MaxFlatTolMM)},
		explicitField{"MaxMoveMM", &o.MaxMoveMM, 0, fmt.Sprintf("must be more than 0 and at most %g mm", panels.MaxMoveMM)},
		explicitField{"Fairness", &o.Fairness, panels.NoFairness, fmt.Sprintf("must be between 0 and %g", panels.MaxFairness)})
	if err == nil && o.MaxIter == 0 {
		err = geom.FieldErrorf("MaxIter", "0 must be between 1 and %d", panels.MaxIter)
	}
	if err != nil {
		return o, err
	}
	return o, o.Validate()
}

// ExplicitNodes returns node options given in full, 0 meaning 0, as
// nodes.Build reads them, and the first problem with them. An empty axis
// method is normal axes, as it always was for a job and the flags; a hub
// radius of 0 is no hub, which is the library's default.
func ExplicitNodes(o nodes.Options) (nodes.Options, error) {
	if o.Axis == "" {
		o.Axis = nodes.AxisNormal
	}
	section := fmt.Sprintf("must be more than 0 and at most %g mm", nodes.MaxSectionMM)
	err := explicit(
		explicitField{"Section.WidthMM", &o.Section.WidthMM, 0, section},
		explicitField{"Section.DepthMM", &o.Section.DepthMM, 0, section},
		explicitField{"Types.LengthTolMM", &o.Types.LengthTolMM, nodes.NoTypeTol, typeTolWant(nodes.MaxTypeLengthTolMM, " mm")},
		explicitField{"Types.AngleTolDeg", &o.Types.AngleTolDeg, nodes.NoTypeTol, typeTolWant(nodes.MaxTypeAngleTolDeg, "°")})
	if err != nil {
		return o, err
	}
	return o, o.Validate()
}

// ExplicitPanelTypes returns panel type tolerances given in full, 0
// meaning 0, as panels.Group reads them, and the first problem with them.
func ExplicitPanelTypes(o panels.TypeOptions) (panels.TypeOptions, error) {
	err := explicit(
		explicitField{"TolMM", &o.TolMM, panels.NoTypeTol, typeTolWant(panels.MaxTypeTolMM, " mm")},
		explicitField{"AngleTolDeg", &o.AngleTolDeg, panels.NoTypeTol, typeTolWant(panels.MaxTypeAngleTolDeg, "°")})
	if err != nil {
		return o, err
	}
	return o, o.Validate()
}

// ExplicitValidate returns net checks given in full, 0 meaning 0, as
// quadnet.Validate reads them, and the first problem with them.
func ExplicitValidate(o quadnet.ValidateOptions) (quadnet.ValidateOptions, error) {
	const want = "must be a finite number, zero or more"
	err := explicit(
		explicitField{"CoincidentTolMM", &o.CoincidentTolMM, quadnet.NoTol, want},
		explicitField{"MinAreaMM2", &o.MinAreaMM2, quadnet.NoBound, want},
		explicitField{"MinMedianEdgeMM", &o.MinMedianEdgeMM, quadnet.NoBound, want},
		explicitField{"MaxMedianEdgeMM", &o.MaxMedianEdgeMM, quadnet.NoBound, want})
	if err != nil {
		return o, err
	}
	return o, o.Validate()
}
