package nest_test

import (
	"context"
	"fmt"

	"pqfab/geom"
	"pqfab/panels/nest"
)

func ExampleNest() {
	square := geom.Polygon{{X: 0, Y: 0}, {X: 500, Y: 0}, {X: 500, Y: 500}, {X: 0, Y: 500}}
	var parts []nest.Part
	for i := 0; i < 8; i++ {
		parts = append(parts, nest.Part{Label: fmt.Sprintf("P%d", i+1), Outline: square})
	}
	res, err := nest.Nest(parts, []nest.Stock{{Name: "board", WidthMM: 1000, HeightMM: 2000, Rotation: nest.Quarter}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d sheet, %.0f %% used, %d unplaced\n", len(res.Sheets), 100*res.Sheets[0].Utilization, len(res.Unplaced))
	// Output:
	// 1 sheet, 100 % used, 0 unplaced
}

func ExampleNestWith() {
	// Two right trapezoids that make a 1000 × 600 mm rectangle when one is
	// turned a half turn, on a glass sheet scored and broken edge to edge.
	trapezoid := geom.Polygon{{X: 0, Y: 0}, {X: 700, Y: 0}, {X: 300, Y: 600}, {X: 0, Y: 600}}
	parts := []nest.Part{{Label: "T1", Outline: trapezoid}, {Label: "T2", Outline: trapezoid}}
	glass := nest.Stock{Name: "float", WidthMM: 1000, HeightMM: 600, Rotation: nest.Free, Cuts: nest.EdgeToEdge}
	res, err := nest.NestWith(context.Background(), parts, []nest.Stock{glass}, nest.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	sh := res.Sheets[0]
	fmt.Printf("%d sheet, %d parts, %d cut of %.0f mm\n", len(res.Sheets), len(sh.Placements), len(sh.Cuts), sh.CutLengthMM)
	// Output:
	// 1 sheet, 2 parts, 1 cut of 721 mm
}
