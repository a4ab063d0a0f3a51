package panels

import (
	"errors"
	"fmt"
	"math"

	"pqfab/geom"
)

// ErrInsetTooLarge is wrapped by errors for insets a panel cannot take.
var ErrInsetTooLarge = errors.New("edge inset too large")

// Inset moves every edge of a counter-clockwise polygon inward by d and
// returns the polygon of the moved lines' intersections. It fails when the
// inset swallows an edge (the result would turn or cross itself).
func Inset(p geom.Polygon, d float64) (geom.Polygon, error) {
	k := len(p)
	type line struct{ o, dir geom.Vec2 }
	lines := make([]line, k)
	for i := range p {
		a, b := p[i], p[(i+1)%k]
		dir := b.Sub(a)
		l := dir.Norm()
		if l == 0 {
			return nil, fmt.Errorf("edge %d has no length", i+1)
		}
		dir = dir.Scale(1 / l)
		lines[i] = line{o: a.Add(dir.Perp().Scale(d)), dir: dir}
	}
	out := make(geom.Polygon, k)
	for i := range p {
		l1, l2 := lines[(i+k-1)%k], lines[i]
		den := l1.dir.Cross(l2.dir)
		if math.Abs(den) < parallelSin {
			// Straight corner: the moved point on both lines.
			out[i] = p[i].Add(l2.dir.Perp().Scale(d))
			continue
		}
		t := l2.o.Sub(l1.o).Cross(l2.dir) / den
		out[i] = l1.o.Add(l1.dir.Scale(t))
	}
	for i := range p {
		// Each inset edge must keep the direction of the original edge.
		if out[(i+1)%k].Sub(out[i]).Dot(p[(i+1)%k].Sub(p[i])) <= 0 {
			return nil, fmt.Errorf("%w: %.3g mm swallows edge %d", ErrInsetTooLarge, d, i+1)
		}
	}
	if !out.CCW() || out.SelfIntersects() {
		return nil, fmt.Errorf("%w: %.3g mm turns the outline inside out", ErrInsetTooLarge, d)
	}
	return out, nil
}
