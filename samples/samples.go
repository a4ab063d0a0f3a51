package samples

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"pqfab/geom"
	"pqfab/quadnet"
)

// PanelPitchMM is the nominal panel size of every sample (invented).
const PanelPitchMM = 1500.0

// Limits on the panel count a sample is asked for, and the count asked
// for when none is given.
const (
	MinPanels     = 10
	MaxPanels     = 100000
	DefaultPanels = 1000
)

// Generator makes a sample net of about the given number of panels.
type Generator func(panels int) *quadnet.Net

// Catalogue lists the samples by name.
var catalogue = map[string]struct {
	gen  Generator
	desc string
}{
	"canopy": {Canopy, "translational canopy over the library courtyard (planar quads by construction)"},
	"dome":   {Dome, "open dome of revolution with an oculus over the reading room (planar quads by construction)"},
	"wave":   {Wave, "corrugated vault over the entrance with set-out offsets (quads 0.3–2 % off planar)"},
}

// Names returns the sample names, sorted.
func Names() []string {
	var s []string
	for k := range catalogue {
		s = append(s, k)
	}
	sort.Strings(s)
	return s
}

// Describe returns a one-line description of a sample.
func Describe(name string) string { return catalogue[name].desc }

// Make returns the named sample with about the given number of panels.
func Make(name string, panels int) (*quadnet.Net, error) {
	c, ok := catalogue[name]
	if !ok {
		return nil, fmt.Errorf("unknown sample %q (have %v)", name, Names())
	}
	if panels < MinPanels || panels > MaxPanels {
		return nil, fmt.Errorf("%d panels is outside %d to %d", panels, MinPanels, MaxPanels)
	}
	return c.gen(panels), nil
}

// grid makes a net from an (nu+1)×(nv+1) grid of points, quads running
// counter-clockwise when u runs along x and v along y. Nodes where
// support(i, j) holds are supports.
func grid(name string, nu, nv int, pt func(i, j int) geom.Vec, support func(i, j int) bool) *quadnet.Net {
	n := &quadnet.Net{Source: name}
	id := func(i, j int) int { return j*(nu+1) + i }
	for j := 0; j <= nv; j++ {
		for i := 0; i <= nu; i++ {
			n.Nodes = append(n.Nodes, quadnet.Node{ID: strconv.Itoa(len(n.Nodes) + 1), Pos: pt(i, j), Support: support(i, j)})
		}
	}
	for j := 0; j < nv; j++ {
		for i := 0; i < nu; i++ {
			n.Faces = append(n.Faces, quadnet.Face{ID: strconv.Itoa(len(n.Faces) + 1),
				Corners: []int{id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1)}})
		}
	}
	return n
}

// gridSize splits a panel count into nu × nv with nu/nv ≈ aspect.
func gridSize(panels int, aspect float64) (nu, nv int) {
	nv = max(2, int(math.Round(math.Sqrt(float64(panels)/aspect))))
	nu = max(2, int(math.Ceil(float64(panels)/float64(nv))))
	return nu, nv
}

// Canopy is a translational surface x(u, v) = a(u) + b(v) over a 3:2
// courtyard: a parabolic arch along x plus a parabolic arch along y. Every
// quad is a parallelogram, so exactly planar (Liu et al. 2006). Edge nodes
// are supports.
func Canopy(panels int) *quadnet.Net {
	nu, nv := gridSize(panels, 1.5)
	lx, ly := float64(nu)*PanelPitchMM, float64(nv)*PanelPitchMM
	riseX, riseY := lx/10, ly/8
	arch := func(t, rise float64) float64 { return 4 * rise * t * (1 - t) }
	return grid("canopy", nu, nv, func(i, j int) geom.Vec {
		u, v := float64(i)/float64(nu), float64(j)/float64(nv)
		return geom.Vec{X: u * lx, Y: v * ly, Z: 4000 + arch(u, riseX) + arch(v, riseY)}
	}, func(i, j int) bool { return i == 0 || j == 0 || i == nu || j == nv })
}

// Dome is a spherical dome of revolution cut at its base (latitude 5°)
// and open at an oculus (latitude 65°), meshed on meridians and parallels:
// every quad is an isosceles trapezoid, so exactly planar, and the node
// axes meet the rotation axis (Liu et al. 2006; Pottmann et al. 2007). The
// base ring is supported.
func Dome(panels int) *quadnet.Net {
	lat0, lat1 := 5*math.Pi/180, 65*math.Pi/180
	mid := (lat0 + lat1) / 2
	rings := max(1, int(math.Round(math.Sqrt(float64(panels)*(lat1-lat0)/(2*math.Pi*math.Cos(mid))))))
	segs := max(3, int(math.Round(float64(panels)/float64(rings))))
	radius := float64(rings) * PanelPitchMM / (lat1 - lat0)
	n := &quadnet.Net{Source: "dome"}
	for j := 0; j <= rings; j++ {
		lat := lat0 + (lat1-lat0)*float64(j)/float64(rings)
		for i := 0; i < segs; i++ {
			lon := 2 * math.Pi * float64(i) / float64(segs)
			r := radius * math.Cos(lat)
			n.Nodes = append(n.Nodes, quadnet.Node{ID: strconv.Itoa(len(n.Nodes) + 1), Support: j == 0,
				Pos: geom.Vec{X: r * math.Cos(lon), Y: r * math.Sin(lon), Z: radius * math.Sin(lat)}})
		}
	}
	id := func(i, j int) int { return j*segs + i%segs }
	for j := 0; j < rings; j++ {
		for i := 0; i < segs; i++ {
			n.Faces = append(n.Faces, quadnet.Face{ID: strconv.Itoa(len(n.Faces) + 1),
				Corners: []int{id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1)}})
		}
	}
	return n
}

// Wave is a corrugated vault over the library entrance: in design a
// translational surface (a wavy arch swept along a skew wavy path, so its
// generating curves do not follow the x and y grid lines) whose quads are
// planar, exported with alternating set-out offsets inside its edges of up to 15 mm, as a
// form-finding run stopped at a loose tolerance leaves them. Its quads are
// 0.3–2 % off planar — the kind of net a planarization job starts from —
// and a planar net lies within about 20 mm of every node. The two long
// edges are supported.
func Wave(panels int) *quadnet.Net {
	nu, nv := gridSize(panels, 1.5)
	ly := float64(nv) * PanelPitchMM
	const (
		skew       = 0.35 // the sweep path drifts 0.35 mm in x per mm in y
		wavelength = 8 * PanelPitchMM
		amplitude  = 600.0 // wave height of the arch (mm)
		offset     = 15.0  // largest set-out offset (mm)
	)
	k := 2 * math.Pi / wavelength
	rise := math.Min(ly/6, 6000)
	return grid("wave", nu, nv, func(i, j int) geom.Vec {
		u, v := float64(i)*PanelPitchMM, float64(j)*PanelPitchMM
		// a(u): the wavy arch profile along x; b(v): the sweep path, which
		// drifts sideways and undulates as it climbs over the vault.
		t := v / ly
		a := geom.Vec{X: u, Z: amplitude * squarish(k*u)}
		b := geom.Vec{X: skew * v, Y: v, Z: 3500 + 4*rise*t*(1-t) + 0.5*amplitude*math.Sin(0.7*k*v)}
		p := geom.Vec{X: a.X + b.X, Y: a.Y + b.Y, Z: a.Z + b.Z}
		// Alternating offsets, modulated smoothly over the shell.
		m := 0.65 + 0.35*math.Sin(0.37*k*u)*math.Cos(0.29*k*v)
		if (i+j)%2 == 1 {
			m = -m
		}
		if i == 0 || j == 0 || i == nu || j == nv {
			m = 0 // the edge beam is set out exactly
		}
		p.Z += offset * m
		return p
	}, func(i, j int) bool { return j == 0 || j == nv })
}

// squarish is a wave profile whose curvature is close to a square wave:
// the first odd harmonics of the parabolic wave, so most panels get a
// similar twist and few sit near the zero crossings.
func squarish(x float64) float64 {
	return math.Sin(x) + math.Sin(3*x)/27 + math.Sin(5*x)/125 + math.Sin(7*x)/343
}
