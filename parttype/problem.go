package parttype

import (
	"errors"
	"fmt"
	"math"
)

// Resolution is the resolution, in each coordinate's own unit (mm or
// degrees), to which values are rounded wherever the grouping orders or
// compares parts for anything but the tolerance: sorting, ties, which
// reading of a part comes first. Parts whose coordinates agree within it
// (and within the tolerance) are treated as one part, so they always share
// a type and their order in the input does not matter.
const Resolution = 1e-6

// Problem describes parts to sort into types (congruent-part counting:
// member, node and panel types). Each part is described by coordinates, a
// vector of Dim values, and can be read in several ways: one reading
// (variant) for each element of a finite symmetry group, such as a member
// read from either end or a panel read from any start corner.
//
// A type is a set of parts, each read in a chosen variant, such that every
// coordinate ranges within its tolerance over the type. Then every pair of
// parts in a type agrees within every tolerance, and every part lies within
// half the tolerance of the type's nominal part (the middle of each
// coordinate's range).
type Problem struct {
	Parts int       // number of parts
	Dim   int       // coordinates per variant
	Tol   []float64 // per coordinate, ≥ 0
	// Compose is the symmetry group's table: Compose[a][b] is variant a
	// followed by b, where a part read in variant a is read again in the
	// way b reads a part. Variant 0 is the identity (the part as given).
	// For a panel read from start corner a, then from that reading's
	// corner b, the composition is the reading from corner a+b.
	Compose [][]int
	// Permutes says that every symmetry only permutes the coordinates and
	// changes signs (members, panels), so a type's ranges are the same in
	// every variant of the type; when false (node arms measured from the
	// first arm) every variant of a type is tried when types grow.
	Permutes bool
	// Coords holds the coordinates: variant s of part p at
	// Coords[(p*len(Compose)+s)*Dim:][:Dim].
	Coords []float64
	// Keys are quantities that no symmetry changes and that range within
	// their Tol inside every type (a coordinate every variant keeps, or an
	// order statistic of coordinates the symmetries permute, such as the
	// shortest edge). At least one. Every key gives a lower bound; the
	// sweep runs along the most spread one.
	Keys []Key
}

// Key is a quantity that no symmetry changes: one value per part, and
// the range it stays within inside every type.
type Key struct {
	Name   string // such as "cut length"
	Tol    float64
	Values []float64
}

// Ordinal names the j-th of n sorted values for a Key's name: first
// ("lowest", "shortest", …), "2nd lowest", "3rd lowest", …, last.
func Ordinal(j, n int, first, last string) string {
	switch {
	case j == 0:
		return first
	case j == n-1:
		return last
	}
	suffix := "th"
	if m := (j + 1) % 100; m < 11 || m > 13 {
		switch m % 10 {
		case 1:
			suffix = "st"
		case 2:
			suffix = "nd"
		case 3:
			suffix = "rd"
		}
	}
	return fmt.Sprintf("%d%s %s", j+1, suffix, first)
}

// Group is one type: its parts, the variant each is read in, and the
// range of each coordinate over the parts in those variants.
type Group struct {
	Parts    []int     // ascending
	Variants []int     // per entry of Parts
	Min, Max []float64 // per coordinate
}

// Nominal returns the type's nominal coordinates: the middle of each
// coordinate's range.
func (g Group) Nominal() []float64 {
	out := make([]float64, len(g.Min))
	for d := range out {
		out[d] = (g.Min[d] + g.Max[d]) / 2
	}
	return out
}

// Solve sorts parts into the fewest types it can find in which every
// coordinate ranges within its tolerance, and returns them with a lower
// bound on the count.
//
// Method:
//  1. Parts are sorted by the keys, most spread first (see sweepKey),
//     ties by their rounded coordinates, all rounded to Resolution;
//     parts that agree within Resolution (and the tolerances) become
//     one item.
//  2. Sweep: each item in that order joins, in the variant that fits
//     best, the open type whose ranges it grows least (sum of squared
//     ranges over tolerances), or opens a type. Only types whose first
//     key lies within its tolerance are open, and keys tell most misfits
//     at a glance, so the work is near linear. With one coordinate this is
//     the classic greedy interval cover, which is optimal: the count
//     equals the bound.
//  3. Refinement, repeated: merge any two types whose union fits, all
//     of one read in a common variant (and, where the variants are not
//     permutations, the other in another); then empty types, smallest
//     first, by moving each of their items into another type it fits, if
//     need be after pushing up to MaxEject items of that type into
//     others. The last step is a merge pass that finds nothing to merge.
//
// Guarantees: every type keeps every tolerance; no two types can be
// merged with each read in a common variant; the count is at least the
// returned bound (how far above it is the quality of the heuristic: box
// cover is NP-hard in two or more dimensions). The order of the work is
// decided on values rounded to Resolution, so the result does not
// depend on the order of the parts, except among parts equal to that
// resolution, which are interchangeable.
//
// Types come out in the order of their rounded nominal coordinates, each
// in the variant whose nominal coordinates come first (among those where
// the type keeps its tolerances).
func Solve(p *Problem) ([]Group, Bound, error) {
	if err := p.check(); err != nil {
		return nil, Bound{}, err
	}
	if p.Parts == 0 {
		return nil, Bound{}, nil
	}
	g := newGrouper(p)
	g.makeItems()
	bound := g.bound()
	g.sweep()
	for range MaxRefineRounds {
		for g.mergePass() {
		}
		if !g.emptyPass() {
			break
		}
	}
	for g.mergePass() {
	}
	return g.result(), bound, nil
}

func (p *Problem) check() error {
	G := len(p.Compose)
	switch {
	case p.Parts < 0 || p.Dim < 1 || G < 1:
		return errors.New("type problem: no parts, coordinates or variants")
	case len(p.Tol) != p.Dim:
		return errors.New("type problem: one tolerance per coordinate")
	case len(p.Coords) != p.Parts*G*p.Dim:
		return errors.New("type problem: coordinates for every part and variant")
	case len(p.Keys) == 0:
		return errors.New("type problem: no key")
	}
	for _, t := range p.Tol {
		if !(t >= 0) || math.IsInf(t, 0) {
			return errors.New("type problem: tolerances must be finite and ≥ 0")
		}
	}
	for _, k := range p.Keys {
		if len(k.Values) != p.Parts || !(k.Tol >= 0) {
			return errors.New("type problem: key " + k.Name + " needs a value per part and a tolerance ≥ 0")
		}
	}
	for a, row := range p.Compose {
		if len(row) != G || row[0] != a || p.Compose[0][a] != a {
			return errors.New("type problem: variant 0 must be the identity")
		}
	}
	for _, v := range p.Coords {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return errors.New("type problem: coordinates must be finite")
		}
	}
	return nil
}
