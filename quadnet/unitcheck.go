package quadnet

import (
	"fmt"
	"math"
	"slices"
	"strconv"

	"gonum.org/v1/gonum/spatial/r3"
)

// typicalMemberMM is the middle, on a log scale, of the 0.3–5 m members of
// real gridshells: the unit check suggests the unit that brings the
// median edge nearest to it.
const typicalMemberMM = 1225.0

var unitNames = map[Unit]string{MM: "millimetres", CM: "centimetres", M: "metres"}

// edgeStats are the median and mean edge length of a net (mm).
type edgeStats struct {
	count        int
	median, mean float64
}

// edgeLengths returns the edge statistics of a net (E log E).
func edgeLengths(n *Net, t *Topology) edgeStats {
	if len(t.Edges) == 0 {
		return edgeStats{}
	}
	lengths := make([]float64, len(t.Edges))
	var sum float64
	for e, ed := range t.Edges {
		lengths[e] = r3.Norm(r3.Sub(n.Nodes[ed.B].Pos, n.Nodes[ed.A].Pos))
		sum += lengths[e]
	}
	slices.Sort(lengths)
	return edgeStats{count: len(lengths), median: lengths[len(lengths)/2], mean: sum / float64(len(lengths))}
}

// checkUnit returns an error naming the file when the net's median edge
// lies outside [opt.MinMedianEdgeMM, opt.MaxMedianEdgeMM]: the net was
// read in the wrong unit. The message gives the extent and the median
// edge in the unit read and the unit that fits, if one does. The work is
// E log E for E edges.
func checkUnit(n *Net, es edgeStats, opt ValidateOptions) *InputError {
	if es.count == 0 {
		return nil
	}
	med := es.median
	inRange := func(mm float64) bool {
		return !(opt.MinMedianEdgeMM > 0 && mm < opt.MinMedianEdgeMM) && !(opt.MaxMedianEdgeMM > 0 && mm > opt.MaxMedianEdgeMM)
	}
	if inRange(med) {
		return nil
	}
	unit := n.Unit
	if unit == 0 {
		unit = MM
	}
	lo, hi := n.Bounds()
	in := func(mm float64) float64 { return mm / float64(unit) }
	msg := fmt.Sprintf("the net measures %s × %s × %s %s with a median edge of %s %s; members of a building net are %s to %s long",
		sig4(in(hi.X-lo.X)), sig4(in(hi.Y-lo.Y)), sig4(in(hi.Z-lo.Z)), unit, sig4(in(med)), unit, lengthText(opt.MinMedianEdgeMM), lengthText(opt.MaxMedianEdgeMM))
	best, bestDist := Unit(0), math.Inf(1)
	for _, u := range []Unit{MM, CM, M} {
		mm := in(med) * float64(u)
		if u == unit || !inRange(mm) {
			continue
		}
		if d := math.Abs(math.Log(mm / typicalMemberMM)); d < bestDist {
			best, bestDist = u, d
		}
	}
	if best == 0 {
		msg += ", and no unit pqfab reads (mm, cm, m) makes it so: check the scale of the file"
	} else {
		msg += fmt.Sprintf(": it looks like %s: set the unit to %s", unitNames[best], best)
	}
	return &InputError{File: n.Source, Msg: msg, Err: ErrWrongUnit}
}

// sig4 writes v rounded to four significant digits without an exponent
// (1e+05 is written 100000).
func sig4(v float64) string {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 4, 64), 64)
	return strconv.FormatFloat(r, 'f', -1, 64)
}

// lengthText writes a bound for people: "30 mm", "30 m", "any" for 0.
func lengthText(mm float64) string {
	switch {
	case mm <= 0:
		return "any length"
	case mm >= 1000:
		return fmt.Sprintf("%g m", mm/1000)
	}
	return fmt.Sprintf("%g mm", mm)
}
