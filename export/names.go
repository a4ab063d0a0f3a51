package export

import (
	"pqfab/panels/nest"
)

// SheetFile returns the cut sheet file name of sheet i of n (sheet-01.dxf, …).
func SheetFile(i, n int) string { return "sheet-" + nest.SheetNumber(i, n) + ".dxf" }
