package parttype

// NoTol, given as a type tolerance in options whose zero value means the
// default (nodes.TypeOptions, panels.TypeOptions), asks for a tolerance of
// zero: parts are one type only where that coordinate is equal.
const NoTol = -1.0

// TolOf returns the tolerance to group with for tol given where zero means
// the default def: def for 0, 0 for NoTol, else tol.
func TolOf(tol, def float64) float64 {
	switch tol {
	case 0:
		return def
	case NoTol:
		return 0
	}
	return tol
}
