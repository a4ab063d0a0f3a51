package geom

import "math"

// MinAreaRect returns the smallest-area rectangle that holds the polygon:
// its long side, short side (mm) and the direction of the long side
// (radians from the x axis, in [0, π)). The smallest rectangle has a side
// along an edge of the convex hull (Freeman and Shapira, "Determining the
// minimum-area encasing rectangle for an arbitrary closed curve", CACM
// 18(7), 1975), so every hull edge direction is tried.
func (p Polygon) MinAreaRect() (long, short, dir float64) {
	hull := ConvexHull(p)
	if len(hull) < 2 {
		return 0, 0, 0
	}
	best := math.Inf(1)
	for i := range hull {
		e := hull[(i+1)%len(hull)].Sub(hull[i])
		l := e.Norm()
		if l == 0 {
			continue
		}
		u := e.Scale(1 / l)
		v := u.Perp()
		lo, hi := [2]float64{math.Inf(1), math.Inf(1)}, [2]float64{math.Inf(-1), math.Inf(-1)}
		for _, q := range hull {
			a, b := q.Dot(u), q.Dot(v)
			lo[0], hi[0] = math.Min(lo[0], a), math.Max(hi[0], a)
			lo[1], hi[1] = math.Min(lo[1], b), math.Max(hi[1], b)
		}
		w, h := hi[0]-lo[0], hi[1]-lo[1]
		if w*h < best*(1-1e-9) { // the first of equal rectangles wins
			best = w * h
			long, short, dir = w, h, math.Atan2(u.Y, u.X)
			if h > w {
				long, short, dir = h, w, math.Atan2(v.Y, v.X)
			}
		}
	}
	dir = math.Mod(dir+2*math.Pi, math.Pi)
	return long, short, dir
}
