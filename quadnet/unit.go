package quadnet

import "fmt"

// Unit is a length unit of an input file; its value is millimetres per unit.
type Unit float64

// Units a net file may be in.
const (
	MM Unit = 1
	CM Unit = 10
	M  Unit = 1000
)

// DefaultUnit is the unit of a net file when none is given.
const DefaultUnit = MM

// ParseUnit reads "mm", "cm" or "m".
func ParseUnit(s string) (Unit, error) {
	switch s {
	case "mm":
		return MM, nil
	case "cm":
		return CM, nil
	case "m":
		return M, nil
	}
	return 0, fmt.Errorf("unknown unit %s (want mm, cm or m)", quote(s))
}

// String returns the unit's symbol.
func (u Unit) String() string {
	switch u {
	case MM:
		return "mm"
	case CM:
		return "cm"
	case M:
		return "m"
	}
	return fmt.Sprintf("%gmm", float64(u))
}
