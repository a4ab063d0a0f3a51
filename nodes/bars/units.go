package bars

import (
	"math/big"
	"strconv"
	"strings"
)

// umPerMM is the solver's length resolution: lengths are whole
// micrometres inside.
const umPerMM = 1000

// toUM converts a length in mm to whole micrometres. A value whose
// shortest decimal form has at most three decimals (such as 36.6) is taken
// exactly; any other value is rounded up when up is true and down
// otherwise, on its exact binary value, so that rounding never turns an
// infeasible plan into a feasible one.
func toUM(mm float64, up bool) int64 {
	s := strconv.FormatFloat(mm, 'f', -1, 64)
	if i := strings.IndexByte(s, '.'); i < 0 || len(s)-i-1 <= 3 {
		r, ok := new(big.Rat).SetString(s)
		if ok {
			r.Mul(r, big.NewRat(umPerMM, 1))
			if r.IsInt() {
				return r.Num().Int64()
			}
		}
	}
	r := new(big.Rat).SetFloat64(mm)
	r.Mul(r, big.NewRat(umPerMM, 1))
	q, m := new(big.Int).DivMod(r.Num(), r.Denom(), new(big.Int))
	// DivMod rounds towards minus infinity (Euclidean, positive denominator).
	if up && m.Sign() != 0 {
		q.Add(q, big.NewInt(1))
	}
	return q.Int64()
}

// toMM converts whole micrometres back to mm.
func toMM(um int64) float64 { return float64(um) / umPerMM }
