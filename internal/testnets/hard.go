package testnets

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"
)

// Hard nets: quad grids that do not follow the curvature of the surface
// they lie on, and planar-quad nets with noise, so their panels are off
// flat by amounts like those of nets from other design tools. They are
// invented test geometry (no outside data); z is up and quads run
// counter-clockwise seen from above.

// PlanGrid returns an nu × nv grid of square quads of the given pitch in
// plan, centred on the origin and turned by turnDeg about z, every node
// lifted to z = height(x, y).
func PlanGrid(nu, nv int, pitch, turnDeg float64, height func(x, y float64) float64) Polyhedron {
	var p Polyhedron
	c, s := math.Cos(turnDeg*math.Pi/180), math.Sin(turnDeg*math.Pi/180)
	for j := 0; j <= nv; j++ {
		for i := 0; i <= nu; i++ {
			u, v := (float64(i)-float64(nu)/2)*pitch, (float64(j)-float64(nv)/2)*pitch
			x, y := c*u-s*v, s*u+c*v
			p.Points = append(p.Points, r3.Vec{X: x, Y: y, Z: height(x, y)})
		}
	}
	id := func(i, j int) int { return j*(nu+1) + i }
	for j := 0; j < nv; j++ {
		for i := 0; i < nu; i++ {
			p.Faces = append(p.Faces, []int{id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1)})
		}
	}
	return p
}

// Paraboloid returns a plan grid draped on the elliptic paraboloid
// z = x²/(2 r1) + y²/(2 r2) (principal radii r1, r2 at the apex), the grid
// turned turnDeg from the principal axes. Along the axes the grid would be
// a translational net with planar quads; turned, each quad's corners are
// off their plane by a twist of (1/(2 r2) − 1/(2 r1)) sin(2 turn) pitch²
// (exact for a quadratic surface).
func Paraboloid(nu, nv int, pitch, r1, r2, turnDeg float64) Polyhedron {
	return PlanGrid(nu, nv, pitch, turnDeg, func(x, y float64) float64 {
		return x*x/(2*r1) + y*y/(2*r2)
	})
}

// SphereCap returns a plan grid draped on the sphere of radius r about
// (0, 0, 0), above the plane z = 0 (the grid must lie inside the sphere's
// plan). Its quads are flat along the two middle grid lines and twisted
// more and more towards the corners.
func SphereCap(nu, nv int, pitch, r, turnDeg float64) Polyhedron {
	return PlanGrid(nu, nv, pitch, turnDeg, func(x, y float64) float64 {
		return math.Sqrt(r*r - x*x - y*y)
	})
}

// TranslationalNoisy returns the translational net
// x(u, v) = (u, v, a(u) + b(v)) with parabolic arches a and b (every quad a
// parallelogram, so exactly planar: Liu et al. 2006) on an nu × nv grid,
// each coordinate of every node then moved by a seeded uniform noise in
// [−noise, noise].
func TranslationalNoisy(nu, nv int, pitch, noise float64, seed uint64) Polyhedron {
	lx, ly := float64(nu)*pitch, float64(nv)*pitch
	arch := func(t, rise float64) float64 { return 4 * rise * t * (1 - t) }
	p := PlanGrid(nu, nv, pitch, 0, func(x, y float64) float64 {
		return arch(x/lx+0.5, lx/8) + arch(y/ly+0.5, ly/6)
	})
	rng := rand.New(rand.NewPCG(seed, seed^0x9e3779b97f4a7c15))
	u := func() float64 { return (2*rng.Float64() - 1) * noise }
	for i := range p.Points {
		p.Points[i] = r3.Add(p.Points[i], r3.Vec{X: u(), Y: u(), Z: u()})
	}
	return p
}

// Remeshed returns an irregular quad net like a remeshing tool makes: a
// regular hexagon of circumradius r cut into six triangles about its
// centre, each triangle cut into three quads (centre, edge midpoints,
// corners), then every quad cut into four, levels times; nodes where 3, 4
// or 6 members meet. Each node is then lifted to z = height(x, y).
func Remeshed(r float64, levels int, height func(x, y float64) float64) Polyhedron {
	type pt = [2]float64
	var pts []pt
	add := func(p pt) int { pts = append(pts, p); return len(pts) - 1 }
	mid := map[[2]int]int{}
	midpoint := func(a, b int) int {
		k := [2]int{min(a, b), max(a, b)}
		if m, ok := mid[k]; ok {
			return m
		}
		m := add(pt{(pts[a][0] + pts[b][0]) / 2, (pts[a][1] + pts[b][1]) / 2})
		mid[k] = m
		return m
	}
	c := add(pt{0, 0})
	var ring []int
	for i := 0; i < 6; i++ {
		a := float64(i) * math.Pi / 3
		ring = append(ring, add(pt{r * math.Cos(a), r * math.Sin(a)}))
	}
	var quads [][4]int
	for i := 0; i < 6; i++ {
		a, b := ring[i], ring[(i+1)%6]
		g := add(pt{(pts[c][0] + pts[a][0] + pts[b][0]) / 3, (pts[c][1] + pts[a][1] + pts[b][1]) / 3})
		mca, mab, mbc := midpoint(c, a), midpoint(a, b), midpoint(b, c)
		quads = append(quads, [4]int{c, mca, g, mbc}, [4]int{a, mab, g, mca}, [4]int{b, mbc, g, mab})
	}
	for l := 0; l < levels; l++ {
		var next [][4]int
		for _, q := range quads {
			ctr := add(pt{(pts[q[0]][0] + pts[q[1]][0] + pts[q[2]][0] + pts[q[3]][0]) / 4,
				(pts[q[0]][1] + pts[q[1]][1] + pts[q[2]][1] + pts[q[3]][1]) / 4})
			m := [4]int{midpoint(q[0], q[1]), midpoint(q[1], q[2]), midpoint(q[2], q[3]), midpoint(q[3], q[0])}
			next = append(next, [4]int{q[0], m[0], ctr, m[3]}, [4]int{m[0], q[1], m[1], ctr},
				[4]int{ctr, m[1], q[2], m[2]}, [4]int{m[3], ctr, m[2], q[3]})
		}
		quads = next
	}
	var p Polyhedron
	for _, q := range pts {
		p.Points = append(p.Points, r3.Vec{X: q[0], Y: q[1], Z: height(q[0], q[1])})
	}
	for _, q := range quads {
		// Counter-clockwise seen from above.
		a, b, d := pts[q[0]], pts[q[1]], pts[q[3]]
		if (b[0]-a[0])*(d[1]-a[1])-(b[1]-a[1])*(d[0]-a[0]) < 0 {
			q[1], q[3] = q[3], q[1]
		}
		p.Faces = append(p.Faces, []int{q[0], q[1], q[2], q[3]})
	}
	return p
}
