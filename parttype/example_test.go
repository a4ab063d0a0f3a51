package parttype_test

import (
	"fmt"

	"pqfab/parttype"
)

// ExampleSolve sorts four members, each described by its cut length
// and its two end bevels, into types: within 1 mm and 0.5°, read from
// either end (which swaps the ends and turns the bevels' signs).
func ExampleSolve() {
	members := [][3]float64{{1500.0, 10, -12}, {1500.6, 12.2, -10.1}, {1500.3, 20, -20}, {1502, 10, -12}}
	p := &parttype.Problem{Parts: len(members), Dim: 3, Tol: []float64{1, 0.5, 0.5},
		Compose: [][]int{{0, 1}, {1, 0}}, Permutes: true}
	key := parttype.Key{Name: "cut length", Tol: 1}
	for _, m := range members {
		p.Coords = append(p.Coords, m[0], m[1], m[2], m[0], -m[2], -m[1]) // as given, then reversed
		key.Values = append(key.Values, m[0])
	}
	p.Keys = []parttype.Key{key}
	types, bound, err := parttype.Solve(p)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, t := range types {
		n := t.Nominal()
		fmt.Printf("parts %v read %v: nominal %.2f mm, %.2f°, %.2f°\n", t.Parts, t.Variants, n[0], n[1], n[2])
	}
	fmt.Println("at least", bound.Count, "types, by", bound.Quantity)
	// Output:
	// parts [0 1] read [0 1]: nominal 1500.30 mm, 10.05°, -12.10°
	// parts [2] read [0]: nominal 1500.30 mm, 20.00°, -20.00°
	// parts [3] read [0]: nominal 1502.00 mm, 10.00°, -12.00°
	// at least 3 types, by parts pairwise out of tolerance
}
