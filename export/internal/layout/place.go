package layout

import "math"

// Box is an oriented rectangle in the plan: centre, unit direction of
// its width, half width and half height. Text boxes, member lines (as
// thin boxes) and node marks are Boxes.
type Box struct {
	CX, CY float64
	UX, UY float64 // unit vector along the width; the height runs along (-uy, ux)
	HW, HH float64
}

// AxisBox returns the box of width w and height h centred on (cx, cy),
// square to the axes.
func AxisBox(cx, cy, w, h float64) Box { return Box{CX: cx, CY: cy, UX: 1, HW: w / 2, HH: h / 2} }

// SegmentBox is the segment a–b widened by half a clearance on each side.
func SegmentBox(a, b [2]float64, half float64) Box {
	dx, dy := b[0]-a[0], b[1]-a[1]
	l := math.Hypot(dx, dy)
	if l == 0 {
		return AxisBox(a[0], a[1], 2*half, 2*half)
	}
	return Box{CX: (a[0] + b[0]) / 2, CY: (a[1] + b[1]) / 2, UX: dx / l, UY: dy / l, HW: l/2 + half, HH: half}
}

func (b Box) bounds() (x0, y0, x1, y1 float64) {
	ex := math.Abs(b.UX)*b.HW + math.Abs(b.UY)*b.HH
	ey := math.Abs(b.UY)*b.HW + math.Abs(b.UX)*b.HH
	return b.CX - ex, b.CY - ey, b.CX + ex, b.CY + ey
}

// overlaps reports whether two oriented rectangles share interior points
// (separating axis test on the four edge normals; touching is no overlap).
func (b Box) overlaps(c Box) bool {
	dx, dy := c.CX-b.CX, c.CY-b.CY
	for _, n := range [4][2]float64{{b.UX, b.UY}, {-b.UY, b.UX}, {c.UX, c.UY}, {-c.UY, c.UX}} {
		rb := b.HW*math.Abs(b.UX*n[0]+b.UY*n[1]) + b.HH*math.Abs(-b.UY*n[0]+b.UX*n[1])
		rc := c.HW*math.Abs(c.UX*n[0]+c.UY*n[1]) + c.HH*math.Abs(-c.UY*n[0]+c.UX*n[1])
		if math.Abs(dx*n[0]+dy*n[1]) >= rb+rc {
			return false
		}
	}
	return true
}

// Corners returns the rectangle's Corners counter-clockwise.
func (b Box) Corners() [4][2]float64 {
	vx, vy := -b.UY, b.UX
	c := func(s, t float64) [2]float64 {
		return [2]float64{b.CX + s*b.HW*b.UX + t*b.HH*vx, b.CY + s*b.HW*b.UY + t*b.HH*vy}
	}
	return [4][2]float64{c(-1, -1), c(1, -1), c(1, 1), c(-1, 1)}
}

// EdgePoint returns the point of the rectangle's outline on the way from
// its centre towards p (where a leader line ends).
func (b Box) EdgePoint(p [2]float64) [2]float64 {
	dx, dy := p[0]-b.CX, p[1]-b.CY
	s, t := dx*b.UX+dy*b.UY, -dx*b.UY+dy*b.UX
	k := math.Inf(1)
	if s != 0 {
		k = math.Min(k, b.HW/math.Abs(s))
	}
	if t != 0 {
		k = math.Min(k, b.HH/math.Abs(t))
	}
	if math.IsInf(k, 1) || k > 1 {
		return [2]float64{b.CX, b.CY}
	}
	return [2]float64{b.CX + k*dx, b.CY + k*dy}
}

// BoxIndex holds occupied rectangles in a uniform grid of square cells
// over a fixed extent, so a free-space test looks only at the rectangles
// near it. A rectangle reaching past the extent is filed under the border
// cells, which keeps every test exact (only slower out there). Each cell
// holds a linked list of entries in flat arrays: adding never allocates
// per cell.
type BoxIndex struct {
	cell      float64
	x0, y0    float64 // lower-left corner of the extent
	nx, ny    int32   // cells along x and y
	head      []int32 // per cell, its first entry or -1
	next, box []int32 // per entry: the next entry of its cell, and its rectangle
	boxes     []Box
	seen      []uint32 // per rectangle, the query that last tested it
	query     uint32
}

// maxIndexCells bounds the cells of an index; a larger extent gets larger
// cells.
const maxIndexCells = 1 << 24

// NewBoxIndex returns an index with cells of about side cell over the
// extent lo–hi.
func NewBoxIndex(cell float64, lo, hi [2]float64) *BoxIndex {
	w, h := math.Max(hi[0]-lo[0], cell), math.Max(hi[1]-lo[1], cell)
	if n := (w / cell) * (h / cell); n > maxIndexCells {
		cell *= math.Sqrt(n / maxIndexCells)
	}
	ix := &BoxIndex{cell: cell, x0: lo[0], y0: lo[1], nx: int32(math.Ceil(w/cell)) + 1, ny: int32(math.Ceil(h/cell)) + 1}
	ix.head = make([]int32, int(ix.nx)*int(ix.ny))
	for i := range ix.head {
		ix.head[i] = -1
	}
	return ix
}

func (ix *BoxIndex) cellRange(b Box) (i0, j0, i1, j1 int32) {
	x0, y0, x1, y1 := b.bounds()
	f := func(v, o float64, n int32) int32 {
		c := math.Floor((v - o) / ix.cell)
		return int32(max(0, min(float64(n-1), c)))
	}
	return f(x0, ix.x0, ix.nx), f(y0, ix.y0, ix.ny), f(x1, ix.x0, ix.nx), f(y1, ix.y0, ix.ny)
}

// maxCellsPerBox bounds the cells one rectangle is filed under; a larger
// rectangle (a member longer than many label heights) is filed under the
// cells along its axis only, which still covers it as long as it is thin.
const maxCellsPerBox = 4096

func (ix *BoxIndex) file(i, j, k int32) {
	c := j*ix.nx + i
	if h := ix.head[c]; h >= 0 && ix.box[h] == k {
		return // filed here just before
	}
	ix.next = append(ix.next, ix.head[c])
	ix.box = append(ix.box, k)
	ix.head[c] = int32(len(ix.box) - 1)
}

// Add files box b in the index.
func (ix *BoxIndex) Add(b Box) {
	k := int32(len(ix.boxes))
	ix.boxes = append(ix.boxes, b)
	ix.seen = append(ix.seen, 0)
	i0, j0, i1, j1 := ix.cellRange(b)
	if int64(i1-i0+1)*int64(j1-j0+1) <= maxCellsPerBox {
		for i := i0; i <= i1; i++ {
			for j := j0; j <= j1; j++ {
				// Skip cells a slanted rectangle misses (long diagonal
				// members); border cells also hold what lies beyond.
				if i0 == i1 || j0 == j1 || i == 0 || j == 0 || i == ix.nx-1 || j == ix.ny-1 ||
					b.overlaps(AxisBox(ix.x0+(float64(i)+0.5)*ix.cell, ix.y0+(float64(j)+0.5)*ix.cell, ix.cell, ix.cell)) {
					ix.file(i, j, k)
				}
			}
		}
		return
	}
	// Walk along the axis in half-cell steps, filing the cells around.
	steps := int(math.Ceil(2*b.HW/(ix.cell/2))) + 1
	for s := 0; s <= steps; s++ {
		t := -b.HW + 2*b.HW*float64(s)/float64(steps)
		sub := Box{CX: b.CX + t*b.UX, CY: b.CY + t*b.UY, UX: b.UX, UY: b.UY, HW: ix.cell / 2, HH: b.HH}
		a0, c0, a1, c1 := ix.cellRange(sub)
		for i := a0; i <= a1; i++ {
			for j := c0; j <= c1; j++ {
				ix.file(i, j, k)
			}
		}
	}
}

// free reports whether b overlaps no rectangle in the index.
func (ix *BoxIndex) free(b Box) bool {
	ix.query++
	i0, j0, i1, j1 := ix.cellRange(b)
	for j := j0; j <= j1; j++ {
		for i := i0; i <= i1; i++ {
			for e := ix.head[j*ix.nx+i]; e >= 0; e = ix.next[e] {
				k := ix.box[e]
				if ix.seen[k] == ix.query {
					continue
				}
				ix.seen[k] = ix.query
				if ix.boxes[k].overlaps(b) {
					return false
				}
			}
		}
	}
	return true
}

// Placement is where a label went.
type Placement struct {
	Box    Box
	Scale  float64 // 1 at full size
	Leader bool    // drawn away from its part, with a line back to anchor
}

// labelScales are the sizes tried before a label moves away on a leader.
var labelScales = [...]float64{1, 0.8, 0.65}

// leaderDirections is how many directions each leader ring tries.
const leaderDirections = 16

// Placer puts labels one by one where they overlap nothing placed before
// and no obstacle (deterministic greedy: the first free candidate wins).
type Placer struct {
	Index *BoxIndex
	// Ring is the step between leader rings; rings is how many are
	// tried before a label goes to the overflow column.
	Ring  float64
	Rings int
	// overflow: the column right of everything, where a label that found
	// no room goes (with a leader); it grows downwards from the top.
	OverflowX, OverflowY float64
	// Scales are the sizes tried before a label moves away on a leader;
	// labelScales when nil.
	Scales []float64
}

// Place tries cands at each of its scales, then rings of positions
// around anchor (full size, with a leader), then the overflow column. The
// chosen box is added to the index. w and h are the full-size box
// (width along the label, height across), for the leader positions.
func (p *Placer) Place(anchor [2]float64, w, h float64, cands func(scale float64) []Box) Placement {
	scales := p.Scales
	if scales == nil {
		scales = labelScales[:]
	}
	for _, s := range scales {
		for _, c := range cands(s) {
			if p.Index.free(c) {
				p.Index.Add(c)
				return Placement{Box: c, Scale: s}
			}
		}
	}
	for k := 1; k <= p.Rings; k++ {
		d := math.Hypot(w, h)/2 + float64(k)*p.Ring
		for j := 0; j < leaderDirections; j++ {
			a := 2 * math.Pi * (float64(j) + 0.5*float64(k%2)) / leaderDirections
			c := AxisBox(anchor[0]+d*math.Cos(a), anchor[1]+d*math.Sin(a), w, h)
			if p.Index.free(c) {
				p.Index.Add(c)
				return Placement{Box: c, Scale: 1, Leader: true}
			}
		}
	}
	c := AxisBox(p.OverflowX+w/2, p.OverflowY-h/2, w, h)
	for !p.Index.free(c) {
		c.CY -= h
	}
	p.OverflowY = c.CY - h/2
	p.Index.Add(c)
	return Placement{Box: c, Scale: 1, Leader: true}
}

// SideSlack is added to the distance of a label from its member line, as
// a fraction of the label's height, so a label does not merely touch the
// clear band along the line (where the last bits of a float decide).
const SideSlack = 0.1

// NodeCandidates: the label block in the four quadrants off the node
// (the corner of the block gap away from it), then above, below, right,
// left.
func NodeCandidates(x, y, w, h, gap, scale float64) []Box {
	w, h = scale*w, scale*h
	dx, dy := gap+w/2, gap+h/2
	return []Box{
		AxisBox(x+dx, y+dy, w, h), AxisBox(x-dx, y+dy, w, h), AxisBox(x-dx, y-dy, w, h), AxisBox(x+dx, y-dy, w, h),
		AxisBox(x, y+dy, w, h), AxisBox(x, y-dy, w, h), AxisBox(x+dx, y, w, h), AxisBox(x-dx, y, w, h),
	}
}

// PanelCandidates: the panel's centre, then shifted by a fifth of its
// size towards its sides and corners.
func PanelCandidates(x, y, size, w, h, scale float64) []Box {
	w, h = scale*w, scale*h
	s := size / 5
	out := make([]Box, 0, 9)
	for _, d := range [...][2]float64{{0, 0}, {0, 1}, {0, -1}, {1, 0}, {-1, 0}, {1, 1}, {-1, 1}, {-1, -1}, {1, -1}} {
		out = append(out, AxisBox(x+d[0]*s, y+d[1]*s, w, h))
	}
	return out
}

// LabelSpot returns the centroid of an outline and its size.
func LabelSpot(pts [][2]float64) (x, y, size float64) {
	var a, cx, cy float64
	lox, loy, hix, hiy := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for i, p := range pts {
		q := pts[(i+1)%len(pts)]
		c := p[0]*q[1] - q[0]*p[1]
		a += c
		cx += (p[0] + q[0]) * c
		cy += (p[1] + q[1]) * c
		lox, loy = math.Min(lox, p[0]), math.Min(loy, p[1])
		hix, hiy = math.Max(hix, p[0]), math.Max(hiy, p[1])
	}
	if a == 0 {
		return (lox + hix) / 2, (loy + hiy) / 2, 0
	}
	return cx / (3 * a), cy / (3 * a), math.Min(hix-lox, hiy-loy)
}
