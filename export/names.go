package export

import (
	"pqfab/internal/num"
	"pqfab/panels/nest"
)

// SheetFile returns the cut sheet file name of sheet i of n (sheet-01.dxf, …).
func SheetFile(i, n int) string { return "sheet-" + nest.SheetNumber(i, n) + ".dxf" }

// r is the rounding every number drawn or printed goes through.
var r = num.Round
