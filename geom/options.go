package geom

// MaxCoincidentTolMM is the largest coincidence tolerance accepted (100
// mm): nodes that far apart are not one node entered twice.
const MaxCoincidentTolMM = 100.0

// Validate checks the tolerances' ranges and returns a *FieldError naming
// the first bad field.
func (o ValidateOptions) Validate() error {
	if !(o.CoincidentTolMM >= 0) || o.CoincidentTolMM > MaxCoincidentTolMM {
		return FieldErrorf("CoincidentTolMM", "%g must be between 0 and %g mm", o.CoincidentTolMM, MaxCoincidentTolMM)
	}
	if !(o.MinAreaMM2 > 0) || o.MinAreaMM2 > 1e12 {
		return FieldErrorf("MinAreaMM2", "%g must be more than 0 mm²", o.MinAreaMM2)
	}
	return nil
}
