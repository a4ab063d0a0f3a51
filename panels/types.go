package panels

import (
	"cmp"
	"fmt"
	"maps"
	"math"
	"slices"

	"gonum.org/v1/gonum/mat"

	"pqfab/geom"
	"pqfab/parttype"
)

// Panel type tolerances: defaults, and the largest values accepted.
const (
	DefaultTypeTolMM       = 1.0 // edges and diagonals within 1 mm are one type
	DefaultTypeAngleTolDeg = 0.5 // corner angles within 0.5° are one type
	MaxTypeTolMM           = 1000.0
	MaxTypeAngleTolDeg     = 45.0
)

// NoTypeTol, given as a tolerance of TypeOptions, asks for a tolerance of
// zero: panels are one type only where those values are equal (the
// field's zero value means its default).
const NoTypeTol = parttype.NoTol

// TypeOptions says when two panels are one type. A zero field means its
// default; NoTypeTol asks for a tolerance of zero.
type TypeOptions struct {
	TolMM       float64 // edges and diagonals agree within this (mm); 0: DefaultTypeTolMM
	AngleTolDeg float64 // corner angles agree within this (degrees); 0: DefaultTypeAngleTolDeg
	Mirror      bool    // a panel and its mirror image may be one type
	// Bevels: the edges are bevelled, so each edge's bevel (sign
	// included) is part of the type and agrees within AngleTolDeg; a
	// panel turned over has its bevels' signs reversed (see TypeBevels).
	Bevels bool
}

// withDefaults returns the options to compute with: every zero tolerance
// set to its default, and NoTypeTol to 0. Its zeros mean zero, so its
// result goes only to unexported code, never back to Group.
func (o TypeOptions) withDefaults() TypeOptions {
	o.TolMM = parttype.TolOf(o.TolMM, DefaultTypeTolMM)
	o.AngleTolDeg = parttype.TolOf(o.AngleTolDeg, DefaultTypeAngleTolDeg)
	return o
}

// Validate checks the tolerances' ranges, a zero tolerance standing for
// its default.
func (o TypeOptions) Validate() error { return o.withDefaults().check() }

// ValidateExact checks the options as given: a zero field means zero (an
// error where the option has no zero setting) and the negative constants
// are refused, as a job file or a flag means them. The errors are
// Validate's.
func (o TypeOptions) ValidateExact() error { return o.check() }

// check checks the tolerances' ranges as they stand.
func (o TypeOptions) check() error {
	if !(o.TolMM >= 0) || o.TolMM > MaxTypeTolMM {
		return geom.FieldErrorf("TolMM", "%g must be between 0 and %g mm", o.TolMM, MaxTypeTolMM)
	}
	if !(o.AngleTolDeg >= 0) || o.AngleTolDeg > MaxTypeAngleTolDeg {
		return geom.FieldErrorf("AngleTolDeg", "%g must be between 0 and %g°", o.AngleTolDeg, MaxTypeAngleTolDeg)
	}
	return nil
}

// Type is a type of panel: a promise that every two of its panels have the
// same number of corners and agree within TolMM in every edge and every
// diagonal of their cut outlines and within AngleTolDeg in every corner
// angle (and every edge bevel where TypeOptions.Bevels), with corners matched as Start and Mirrored say (cyclic order;
// reversed order, a panel turned over, only where mirroring is allowed).
// The nominal panel (what is cut) is the middle of each value's range, so
// every panel lies within half the tolerance of it.
type Type struct {
	Name   string // PT-001, …
	Panels []int  // face indices, ascending
	// Per entry of Panels: the panel's corner that is the type's corner 1
	// (an index into its outline), and whether its corners run the other
	// way round (the panel turned over). Corner i of the type is corner
	// (Start + i) mod k of the panel, or (Start − i) mod k when mirrored;
	// see Corner.
	Start    []int
	Mirrored []bool
	// Nominal panel, in the type's corner order: EdgeMM[i] from corner i to
	// corner i+1, AngleDeg[i] at corner i, Diagonals between non-adjacent
	// corners as in Flat.
	EdgeMM    []float64
	Diagonals []Diagonal
	AngleDeg  []float64
	// BevelDeg is the nominal bevel of each edge, for the type's faces,
	// where bevels are part of the type (TypeOptions.Bevels); else nil.
	BevelDeg []float64
	// Outline is a nominal outline for drawings: corner 1 at the origin,
	// corner 2 on the x axis, its edges and diagonals as near the nominal
	// ones as one outline can be (least squares: a quad's four edges and two
	// diagonals are one more length than its shape has freedoms);
	// OutlineMisfitMM and OutlineMisfitDeg are its largest differences from
	// the nominal edges and diagonals and the nominal corner angles.
	Outline          geom.Polygon
	OutlineMisfitMM  float64
	OutlineMisfitDeg float64
	// OutlineDevMM and OutlineDevDeg are the largest deviations of any
	// panel from the nominal outline's own numbers (its edges, diagonals
	// and corner angles as measured on it: what a drawing of the type
	// prints) and from the nominal bevels where they are part of the type,
	// at most the MaxDev values plus the misfits.
	OutlineDevMM  float64
	OutlineDevDeg float64
	AreaM2        float64 // of the nominal outline
	PerimeterMM   float64 // sum of the nominal edges
	// Largest deviation of any panel from the nominal.
	MaxDevMM  float64 // edges and diagonals
	MaxDevDeg float64 // corner angles (and bevels where they are part of the type)
	// Totals over the panels (their own cut outlines).
	TotalAreaM2   float64
	TotalWeightKg float64
}

// Corner returns the panel corner (index into the outline of panel
// t.Panels[entry]) that is corner i of the type.
func (t *Type) Corner(entry, i int) int {
	k := len(t.EdgeMM)
	if t.Mirrored[entry] {
		return ((t.Start[entry]-i)%k + k) % k
	}
	return (t.Start[entry] + i) % k
}

// TypeBevels returns the edge bevels of fl, entry n of t, by the type's
// edges (type edge i runs from type corner i to i+1) and for the type's
// faces: a panel turned over (Mirrored) has its outside on the type's
// inside face, so its bevels change sign (see BevelDeg in Flat).
func TypeBevels(t *Type, n int, fl Flat) []float64 {
	k := len(t.EdgeMM)
	out := make([]float64, k)
	for e := range out {
		pe := t.Corner(n, e)
		if t.Mirrored[n] {
			out[e] = -fl.BevelDeg[(pe-1+k)%k]
			continue
		}
		out[e] = fl.BevelDeg[pe]
	}
	return out
}

// Retotal sums the type's totals again from its panels' areas and weights
// (after the caller changed the weights, such as for another thickness).
func (t *Type) Retotal(flats []Flat) {
	t.TotalAreaM2, t.TotalWeightKg = 0, 0
	for _, f := range t.Panels {
		t.TotalAreaM2 += flats[f].AreaM2
		t.TotalWeightKg += flats[f].WeightKg
	}
}

// panelShape lays out the coordinates of a k-corner panel: k edges, the
// diagonals in Flat's order, k corner angles.
type panelShape struct {
	k      int
	diags  [][2]int
	dim    int  // coordinates of the outline: edges, diagonals, corner angles
	bevels bool // k more coordinates follow: the edge bevels
}

// full returns the number of coordinates of a panel: the outline's and
// the bevels'.
func (s panelShape) full() int {
	if s.bevels {
		return s.dim + s.k
	}
	return s.dim
}

// bevelCoords appends the edge bevels of a panel read in variant v: edge
// i of the reading joins its corners i and i+1; read backward (the panel
// turned over) it is the panel's edge before corner start−i, and its
// bevel changes sign.
func (s panelShape) bevelCoords(dst []float64, bevel []float64, v int) []float64 {
	k := s.k
	start, dir := s.variant(v)
	for i := range k {
		c := ((start+dir*i)%k + k) % k
		if dir > 0 {
			dst = append(dst, bevel[c])
		} else {
			dst = append(dst, -bevel[(c-1+k)%k])
		}
	}
	return dst
}

func newShape(k int) panelShape {
	s := panelShape{k: k}
	for i := 0; i < k; i++ {
		for j := i + 2; j < k; j++ {
			if i == 0 && j == k-1 {
				continue
			}
			s.diags = append(s.diags, [2]int{i, j})
		}
	}
	s.dim = 2*k + len(s.diags)
	return s
}

// variant returns the corner map of variant v: corner i of the reading is
// corner start + dir·i of the panel; variants 0..k−1 run forward from
// corner v, variants k..2k−1 backward from corner v−k.
func (s panelShape) variant(v int) (start, dir int) {
	if v < s.k {
		return v, 1
	}
	return v - s.k, -1
}

func (s panelShape) index(start, dir int) int {
	start = (start%s.k + s.k) % s.k
	if dir > 0 {
		return start
	}
	return s.k + start
}

// coords appends the coordinates of a panel read in variant v, from its
// corner distances dist (k×k) and corner angles.
func (s panelShape) coords(dst []float64, dist [][]float64, angle []float64, v int) []float64 {
	k := s.k
	start, dir := s.variant(v)
	c := func(i int) int { return ((start+dir*i)%k + k) % k }
	for i := range k {
		dst = append(dst, dist[c(i)][c(i+1)])
	}
	for _, d := range s.diags {
		dst = append(dst, dist[c(d[0])][c(d[1])])
	}
	for i := range k {
		dst = append(dst, angle[c(i)])
	}
	return dst
}

// cornerAngles returns the inside angle at every corner of a
// counter-clockwise outline (degrees).
func cornerAngles(p geom.Polygon) []float64 {
	k := len(p)
	out := make([]float64, k)
	for i := range p {
		a, b, c := p[(i+k-1)%k], p[i], p[(i+1)%k]
		u, v := a.Sub(b), c.Sub(b)
		ang := math.Atan2(v.Cross(u), v.Dot(u)) * 180 / math.Pi
		if ang < 0 {
			ang += 360
		}
		out[i] = ang
	}
	return out
}

// Group sorts flat panels into the fewest types it finds by their cut
// outlines (see parttype.Solve for the method and its guarantees), panels
// with different corner counts or specification groups (Flat.SpecGroup) apart, sets each panel's Type, and returns
// the types numbered by nominal area, ties by the nominal edges, with a
// lower bound on their number. A zero tolerance of opt means its default.
func Group(flats []Flat, opt TypeOptions) ([]Type, parttype.Bound, error) {
	if err := opt.Validate(); err != nil {
		return nil, parttype.Bound{}, err
	}
	opt = opt.withDefaults()
	// Panels with other corner counts or in other specification groups
	// never share a type.
	byCount := map[[2]int][]int{}
	for f, fl := range flats {
		key := [2]int{fl.SpecGroup, len(fl.Cut)}
		byCount[key] = append(byCount[key], f)
	}
	counts := slices.SortedFunc(maps.Keys(byCount), func(a, b [2]int) int {
		if c := cmp.Compare(a[0], b[0]); c != 0 {
			return c
		}
		return cmp.Compare(a[1], b[1])
	})
	var types []Type
	var bound parttype.Bound
	for _, key := range counts {
		k := key[1]
		sh := newShape(k)
		sh.bevels = opt.Bevels
		ts, b, err := groupShape(flats, byCount[key], sh, opt)
		if err != nil {
			return nil, parttype.Bound{}, err
		}
		types = append(types, ts...)
		bound = bound.Add(b.Of(fmt.Sprintf("%d-corner panels", k)))
	}
	slices.SortStableFunc(types, func(a, b Type) int {
		return cmp.Compare(math.Round(a.AreaM2/areaResolutionM2), math.Round(b.AreaM2/areaResolutionM2))
	})
	width := max(3, len(fmt.Sprint(len(types))))
	for t := range types {
		types[t].Name = fmt.Sprintf("PT-%0*d", width, t+1)
		for _, f := range types[t].Panels {
			flats[f].Type = t
		}
	}
	return types, bound, nil
}

// areaResolutionM2 is the resolution to which nominal areas are rounded
// when types are numbered (1 mm²); ties go by the nominal edges.
const areaResolutionM2 = 1e-6

// groupShape groups the panels idx, all with the corners of s.
func groupShape(flats []Flat, idx []int, s panelShape, opt TypeOptions) ([]Type, parttype.Bound, error) {
	k := s.k
	G := k
	if opt.Mirror {
		G = 2 * k
	}
	full := s.full()
	p := &parttype.Problem{Parts: len(idx), Dim: full, Tol: make([]float64, full), Compose: make([][]int, G),
		Permutes: true, Coords: make([]float64, 0, len(idx)*G*full)}
	for d := range p.Tol {
		p.Tol[d] = opt.TolMM
		if d >= k+len(s.diags) {
			p.Tol[d] = opt.AngleTolDeg
		}
	}
	for a := range G {
		p.Compose[a] = make([]int, G)
		sa, da := s.variant(a)
		for b := range G {
			// Corner i of b is corner sb + db·i of a's reading, which is
			// corner sa + da·(sb + db·i) of the panel.
			sb, db := s.variant(b)
			p.Compose[a][b] = s.index(sa+da*sb, da*db)
		}
	}
	// Keys: the edges, the diagonals and the corner angles, each sorted:
	// every symmetry only permutes them, so each order statistic stays
	// within its tolerance inside a type.
	nd := len(s.diags)
	addKeys := func(n int, what, first, last string, tol float64) {
		for j := range n {
			name := parttype.Ordinal(j, n, first, last) + " " + what
			p.Keys = append(p.Keys, parttype.Key{Name: name, Tol: tol, Values: make([]float64, len(idx))})
		}
	}
	addKeys(k, "edge", "shortest", "longest", opt.TolMM)
	addKeys(nd, "diagonal", "shortest", "longest", opt.TolMM)
	addKeys(k, "corner angle", "smallest", "largest", opt.AngleTolDeg)
	if s.bevels {
		// A turn-over changes the bevels' signs: their sizes are keys.
		addKeys(k, "edge bevel size", "smallest", "largest", opt.AngleTolDeg)
	}
	dist := make([][]float64, k)
	for i := range dist {
		dist[i] = make([]float64, k)
	}
	for n, f := range idx {
		cut := flats[f].Cut
		for i := range k {
			for j := range k {
				dist[i][j] = cut[j].Sub(cut[i]).Norm()
			}
		}
		ang := cornerAngles(cut)
		for v := range G {
			p.Coords = s.coords(p.Coords, dist, ang, v)
			if s.bevels {
				p.Coords = s.bevelCoords(p.Coords, flats[f].BevelDeg, v)
			}
		}
		x := slices.Clone(p.Coords[n*G*full:][:full])
		slices.Sort(x[:k])
		slices.Sort(x[k : k+nd])
		slices.Sort(x[k+nd : s.dim])
		if s.bevels {
			for j := s.dim; j < full; j++ {
				x[j] = math.Abs(x[j])
			}
			slices.Sort(x[s.dim:])
		}
		for j, v := range x {
			p.Keys[j].Values[n] = v
		}
	}
	groups, bound, err := parttype.Solve(p)
	if err != nil {
		return nil, parttype.Bound{}, err
	}
	types := make([]Type, len(groups))
	for t, g := range groups {
		types[t] = panelType(flats, idx, s, g)
	}
	return types, bound, nil
}

// panelType fills a type from its group.
func panelType(flats []Flat, idx []int, s panelShape, g parttype.Group) Type {
	k, nd := s.k, len(s.diags)
	nom := g.Nominal()
	ty := Type{EdgeMM: nom[:k], AngleDeg: nom[k+nd : s.dim]}
	if s.bevels {
		ty.BevelDeg = nom[s.dim:]
	}
	for j, d := range s.diags {
		ty.Diagonals = append(ty.Diagonals, Diagonal{I: d[0], J: d[1], MM: nom[k+j]})
	}
	for d := range s.full() {
		dev := (g.Max[d] - g.Min[d]) / 2
		if d < k+nd {
			ty.MaxDevMM = max(ty.MaxDevMM, dev)
		} else {
			ty.MaxDevDeg = max(ty.MaxDevDeg, dev)
		}
	}
	for _, e := range ty.EdgeMM {
		ty.PerimeterMM += e
	}
	ty.Outline = fitOutline(s, nom, fanOutline(s, nom))
	ty.AreaM2 = ty.Outline.Area() / 1e6
	got := cornerDist(ty.Outline)
	for i, e := range ty.EdgeMM {
		ty.OutlineMisfitMM = max(ty.OutlineMisfitMM, math.Abs(got[i][(i+1)%k]-e))
	}
	for _, d := range ty.Diagonals {
		ty.OutlineMisfitMM = max(ty.OutlineMisfitMM, math.Abs(got[d.I][d.J]-d.MM))
	}
	for i, a := range cornerAngles(ty.Outline) {
		ty.OutlineMisfitDeg = max(ty.OutlineMisfitDeg, math.Abs(a-ty.AngleDeg[i]))
	}
	ov := s.coords(nil, got, cornerAngles(ty.Outline), 0)
	var pv []float64
	for e, n := range g.Parts {
		f := idx[n]
		pv = s.coords(pv[:0], cornerDist(flats[f].Cut), cornerAngles(flats[f].Cut), g.Variants[e])
		for d := range pv {
			dev := math.Abs(pv[d] - ov[d])
			if d < k+nd {
				ty.OutlineDevMM = max(ty.OutlineDevMM, dev)
			} else {
				ty.OutlineDevDeg = max(ty.OutlineDevDeg, dev)
			}
		}
		start, dir := s.variant(g.Variants[e])
		ty.Panels = append(ty.Panels, f)
		ty.Start = append(ty.Start, start)
		ty.Mirrored = append(ty.Mirrored, dir < 0)
	}
	ty.Retotal(flats)
	if s.bevels {
		for e, f := range ty.Panels {
			for i, b := range TypeBevels(&ty, e, flats[f]) {
				ty.OutlineDevDeg = max(ty.OutlineDevDeg, math.Abs(b-ty.BevelDeg[i]))
			}
		}
	}
	// idx is ascending, so Panels are.
	return ty
}

// cornerDist returns the distances between every two corners of p.
func cornerDist(p geom.Polygon) [][]float64 {
	k := len(p)
	out := make([][]float64, k)
	for i := range out {
		out[i] = make([]float64, k)
		for j := range out[i] {
			out[i][j] = p[j].Sub(p[i]).Norm()
		}
	}
	return out
}

// fitOutline moves the corners of out (corner 0 at the origin, corner 1
// on the x axis kept so) to the least sum of squared differences between
// its edges and diagonals and the nominal ones, by Gauss-Newton steps from
// out: a k-corner outline has 2k−3 degrees of freedom and k + k(k−3)/2
// lengths, so where the nominal lengths are not those of one outline the
// misfit is shared among them instead of falling on the last diagonals.
func fitOutline(s panelShape, nom []float64, out geom.Polygon) geom.Polygon {
	k := s.k
	type pair struct {
		i, j int
		want float64
	}
	var pairs []pair
	for i := range k {
		pairs = append(pairs, pair{i, (i + 1) % k, nom[i]})
	}
	for n, d := range s.diags {
		pairs = append(pairs, pair{d[0], d[1], nom[k+n]})
	}
	// Unknowns: x of corner 1, then x and y of corners 2 … k−1.
	col := func(c, axis int) int {
		switch {
		case c == 0, c == 1 && axis == 1:
			return -1
		case c == 1:
			return 0
		}
		return 1 + 2*(c-2) + axis
	}
	nu := 2*k - 3
	p := slices.Clone(out)
	jac := mat.NewDense(len(pairs), nu, nil)
	res := mat.NewVecDense(len(pairs), nil)
	for range fitSteps {
		jac.Zero()
		for r, pr := range pairs {
			d := p[pr.j].Sub(p[pr.i])
			l := d.Norm()
			if l == 0 {
				return out
			}
			res.SetVec(r, l-pr.want)
			for axis, g := range [2]float64{d.X / l, d.Y / l} {
				if c := col(pr.j, axis); c >= 0 {
					jac.Set(r, c, g)
				}
				if c := col(pr.i, axis); c >= 0 {
					jac.Set(r, c, -g)
				}
			}
		}
		var step mat.VecDense
		if err := step.SolveVec(jac, res); err != nil {
			return out
		}
		move := 0.0
		for c := range k {
			for axis := range 2 {
				if u := col(c, axis); u >= 0 {
					v := step.AtVec(u)
					move = max(move, math.Abs(v))
					if axis == 0 {
						p[c].X -= v
					} else {
						p[c].Y -= v
					}
				}
			}
		}
		if move < fitStopMM {
			break
		}
	}
	if !p.CCW() || p.SelfIntersects() {
		return out
	}
	return p
}

// fitSteps and fitStopMM bound the outline fit: at most this many steps,
// stopping when no corner moves more than this (mm).
const (
	fitSteps  = 20
	fitStopMM = 1e-9
)

// fanOutline builds an outline from nominal coordinates: corner 0 at the
// origin, corner 1 on the x axis at the first edge's length, and each
// further corner j where the circle about corner 0 (radius: the diagonal
// 0–j, or the last edge) meets the circle about corner j−1 (radius: edge
// j−1), on the left of the line from corner 0 to corner j−1 (the outline
// runs counter-clockwise). Where the circles do not meet (nominal values
// that no triangle has) the corner goes on the line through their centres.
func fanOutline(s panelShape, nom []float64) geom.Polygon {
	k := s.k
	out := make(geom.Polygon, k)
	out[1] = geom.Vec2{X: nom[0]}
	// from0[j]: the coordinate of the distance from corner 0 to corner j
	// (the diagonals come first in s.diags, then the last edge).
	from0 := make([]int, k)
	from0[k-1] = k - 1
	for n, d := range s.diags {
		if d[0] == 0 {
			from0[d[1]] = k + n
		}
	}
	for j := 2; j < k; j++ {
		r0, r1 := nom[from0[j]], nom[j-1]
		c := out[j-1]
		d := c.Norm()
		u := c.Scale(1 / d)
		x := (d*d + r0*r0 - r1*r1) / (2 * d)
		h := math.Sqrt(math.Max(0, r0*r0-x*x))
		out[j] = u.Scale(x).Add(u.Perp().Scale(h))
	}
	return out
}
