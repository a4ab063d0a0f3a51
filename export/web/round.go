package web

import "pqfab/internal/num"

// r is the rounding every number drawn or printed goes through.
var r = num.Round
