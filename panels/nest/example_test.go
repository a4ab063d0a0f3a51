package nest_test

import (
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
