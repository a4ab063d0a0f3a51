// Package num rounds the numbers pqfab writes, so that output bytes do not
// depend on the last bits of a float.
package num

import "math"

// Round rounds x to d decimals without negative zero, so output bytes do
// not depend on the last bits of a float. Every writer and the command's
// printed numbers use it.
func Round(x float64, d int) float64 {
	p := math.Pow(10, float64(d))
	v := math.Round(x*p) / p
	if v == 0 {
		return 0
	}
	return v
}
