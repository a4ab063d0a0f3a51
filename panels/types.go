package panels

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"pqfab/geom"
)

// DefaultTypeTolMM: panels whose edges and diagonals agree within 1 mm are
// one type. MaxTypeTolMM is the largest tolerance accepted.
const (
	DefaultTypeTolMM = 1.0
	MaxTypeTolMM     = 1000.0
)

// TypeOptions says when two panels are one type.
type TypeOptions struct {
	TolMM  float64 // edges and diagonals agree within this (mm)
	Mirror bool    // a panel and its mirror image may be one type
}

// Validate checks the tolerance's range.
func (o TypeOptions) Validate() error {
	if !(o.TolMM >= 0) || o.TolMM > MaxTypeTolMM {
		return geom.FieldErrorf("TolMM", "%g must be between 0 and %g mm", o.TolMM, MaxTypeTolMM)
	}
	return nil
}

// Type is a group of congruent panels.
type Type struct {
	Name     string // PT-001, …
	Panels   []int  // face indices, ascending
	Rep      int    // the panel the others were compared with
	Mirrored []bool // per entry of Panels: congruent only as a mirror image
}

// distances returns the matrix of distances between the corners of a flat
// outline; congruence of planar polygons is equality of these matrices
// under a correspondence of corners.
func distances(p geom.Polygon) [][]float64 {
	d := make([][]float64, len(p))
	for i := range p {
		d[i] = make([]float64, len(p))
		for j := range p {
			d[i][j] = p[j].Sub(p[i]).Norm()
		}
	}
	return d
}

// match reports whether outline distances q equal p's within tol under
// corner map i → (s + dir·i) mod k.
func match(p, q [][]float64, s, dir int, tol float64) bool {
	k := len(p)
	idx := func(i int) int { return ((s+dir*i)%k + k) % k }
	for i := 0; i < k; i++ {
		for j := i + 1; j < k; j++ {
			if math.Abs(p[i][j]-q[idx(i)][idx(j)]) > tol {
				return false
			}
		}
	}
	return true
}

// congruent reports whether two outlines are congruent within tol, up to
// cyclic order, and whether only as mirror images (reversed order). Both
// outlines run counter-clockwise, so a match in the same order is a turn,
// a match in reverse order a reflection.
func congruent(p, q [][]float64, tol float64, mirror bool) (ok, mirrored bool) {
	if len(p) != len(q) {
		return false, false
	}
	for s := range p {
		if match(p, q, s, 1, tol) {
			return true, false
		}
	}
	if mirror {
		for s := range p {
			if match(p, q, s, -1, tol) {
				return true, true
			}
		}
	}
	return false, false
}

// Group groups flat panels into congruent types by their cut outlines
// and sets each panel's Type: edge lengths and diagonals within opt.TolMM,
// up to cyclic order, and mirrored only when opt.Mirror is true. Types are
// numbered by area, smallest first.
func Group(flats []Flat, opt TypeOptions) ([]Type, error) {
	if err := opt.Validate(); err != nil {
		return nil, err
	}
	tol, mirror := opt.TolMM, opt.Mirror
	d := make([][][]float64, len(flats))
	keys := make([]float64, len(flats))
	for i, fl := range flats {
		d[i] = distances(fl.Cut)
		keys[i] = fl.PerimeterMM
	}
	// Congruent outlines have perimeters within k·tol.
	keyTol := tol * float64(geom.MaxCorners)
	groups := geom.GroupNear(keys, keyTol, func(a, b int) bool {
		ok, _ := congruent(d[a], d[b], tol, mirror)
		return ok
	})
	slices.SortStableFunc(groups, func(a, b []int) int {
		return cmp.Compare(flats[a[0]].AreaM2, flats[b[0]].AreaM2)
	})
	width := max(3, len(fmt.Sprint(len(groups))))
	types := make([]Type, len(groups))
	for t, g := range groups {
		ty := Type{Name: fmt.Sprintf("PT-%0*d", width, t+1), Rep: g[0], Panels: slices.Sorted(slices.Values(g))}
		for _, f := range ty.Panels {
			_, m := congruent(d[g[0]], d[f], tol, mirror)
			ty.Mirrored = append(ty.Mirrored, m)
			flats[f].Type = t
		}
		types[t] = ty
	}
	return types, nil
}
