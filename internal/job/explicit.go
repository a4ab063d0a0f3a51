package job

import (
	"pqfab/nodes"
	"pqfab/panels"
	"pqfab/quadnet"
)

// A job file, and a flag of the single-stage commands, reads 0 as 0; the
// libraries read a zero option field as the field's default, and take a
// negative constant (panels.NoFairness, panels.NoTypeTol,
// nodes.NoTypeTol, quadnet.NoTol, quadnet.NoBound) where 0 is a setting of its
// own. The Explicit functions take options whose every field is given, 0
// meaning 0 (filled from a job or from flags), check them as given with
// the library's ValidateExact (so a 0 the library has no setting for, and
// a negative constant typed as a number, are refused in the library's
// words), and return them as the library reads them: each 0 that is a
// setting of its own turned into the constant that asks for it.

// zeroAs sets *v to the library's constant for zero when it is 0.
func zeroAs(v *float64, constant float64) {
	if *v == 0 {
		*v = constant
	}
}

// ExplicitPlanarize returns planarize options given in full, 0 meaning 0,
// as panels.Planarize reads them, and the first problem with them.
func ExplicitPlanarize(o panels.PlanarizeOptions) (panels.PlanarizeOptions, error) {
	if err := o.ValidateExact(); err != nil {
		return o, err
	}
	zeroAs(&o.Fairness, panels.NoFairness)
	return o, nil
}

// ExplicitNodes returns node options given in full, 0 meaning 0, as
// nodes.Build reads them, and the first problem with them. An empty axis
// method is normal axes, as it always was for a job and the flags; a hub
// radius of 0 is no hub, which is the library's default.
func ExplicitNodes(o nodes.Options) (nodes.Options, error) {
	if o.Axis == "" {
		o.Axis = nodes.AxisNormal
	}
	if err := o.ValidateExact(); err != nil {
		return o, err
	}
	zeroAs(&o.Types.LengthTolMM, nodes.NoTypeTol)
	zeroAs(&o.Types.AngleTolDeg, nodes.NoTypeTol)
	return o, nil
}

// ExplicitPanelTypes returns panel type tolerances given in full, 0
// meaning 0, as panels.Group reads them, and the first problem with them.
func ExplicitPanelTypes(o panels.TypeOptions) (panels.TypeOptions, error) {
	if err := o.ValidateExact(); err != nil {
		return o, err
	}
	zeroAs(&o.TolMM, panels.NoTypeTol)
	zeroAs(&o.AngleTolDeg, panels.NoTypeTol)
	return o, nil
}

// ExplicitValidate returns net checks given in full, 0 meaning 0, as
// quadnet.Validate reads them, and the first problem with them.
func ExplicitValidate(o quadnet.ValidateOptions) (quadnet.ValidateOptions, error) {
	if err := o.ValidateExact(); err != nil {
		return o, err
	}
	zeroAs(&o.CoincidentTolMM, quadnet.NoTol)
	zeroAs(&o.MinAreaMM2, quadnet.NoBound)
	zeroAs(&o.MinMedianEdgeMM, quadnet.NoBound)
	zeroAs(&o.MaxMedianEdgeMM, quadnet.NoBound)
	return o, nil
}
