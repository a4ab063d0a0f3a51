package quadnet

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"pqfab/geom"
)

// DefaultBaySizeMM is the default bay size for labels: 6 m, a common
// structural grid spacing.
const DefaultBaySizeMM = 6000.0

// Bays cuts the plan into a grid of bays, like structural grid lines:
// columns lettered along x (A … H, J … N, P … Z, AA, …: I and O are left
// out, as on structural grids, where they read as 1 and 0) and rows
// numbered along y from 1. Bay C3 is the third column and third row.
type Bays struct {
	Origin geom.Vec2 // lower-left corner of bay A1
	SizeX  float64   // bay width along x (mm)
	SizeY  float64   // bay depth along y (mm)
}

// NewBays returns bays of the given size starting at the lower-left corner
// of the points' plan bounding box, rounded down to LabelResolutionMM.
func NewBays(pts []geom.Vec, sizeX, sizeY float64) (Bays, error) {
	if !(sizeX > 0) || !(sizeY > 0) || math.IsInf(sizeX, 0) || math.IsInf(sizeY, 0) {
		return Bays{}, fmt.Errorf("bay size %g × %g mm must be positive", sizeX, sizeY)
	}
	lo := geom.Vec2{X: math.Inf(1), Y: math.Inf(1)}
	for _, p := range pts {
		lo = geom.Vec2{X: math.Min(lo.X, p.X), Y: math.Min(lo.Y, p.Y)}
	}
	if len(pts) == 0 {
		lo = geom.Vec2{}
	}
	lo = geom.Vec2{X: math.Floor(lo.X/LabelResolutionMM) * LabelResolutionMM, Y: math.Floor(lo.Y/LabelResolutionMM) * LabelResolutionMM}
	return Bays{Origin: lo, SizeX: sizeX, SizeY: sizeY}, nil
}

// Cell returns the 0-based column and row of the bay holding plan point p.
// p is rounded to LabelResolutionMM first, so a point on a grid line (to
// within the resolution) belongs to the bay right of or above the line,
// whatever the last bits of its coordinates.
func (b Bays) Cell(p geom.Vec2) (col, row int) {
	col = int(math.Floor((roundRes(p.X) - b.Origin.X) / b.SizeX))
	row = int(math.Floor((roundRes(p.Y) - b.Origin.Y) / b.SizeY))
	return max(col, 0), max(row, 0)
}

// Name returns the name of bay (col, row), such as "C3".
func (b Bays) Name(col, row int) string { return ColumnLetters(col) + fmt.Sprint(row+1) }

// columnAlphabet is the letters of bay columns: A to Z without I and O.
const columnAlphabet = "ABCDEFGHJKLMNPQRSTUVWXYZ"

// ColumnLetters returns the letters of 0-based column i: A … H, J … N,
// P … Z, then AA, AB, … (two letters, then three, the way spreadsheet
// columns run, over the 24 letters without I and O).
func ColumnLetters(i int) string {
	n := len(columnAlphabet)
	s := ""
	for i++; i > 0; i = (i - 1) / n {
		s = string(columnAlphabet[(i-1)%n]) + s
	}
	return s
}

// ParseBay reads the bay at the head of a part label ("C3-M12" or "C3":
// column 2, row 2). It is false for anything ColumnLetters and Name do
// not write (the letters I and O, lower case, a row 0).
func ParseBay(label string) (col, row int, ok bool) {
	name, _, _ := strings.Cut(label, "-")
	i := 0
	for ; i < len(name); i++ {
		k := strings.IndexByte(columnAlphabet, name[i])
		if k < 0 {
			break
		}
		col = col*len(columnAlphabet) + k + 1
		if col > maxBayColumns {
			return 0, 0, false
		}
	}
	n, err := strconv.Atoi(name[i:])
	if i == 0 || err != nil || n < 1 || name[i] == '+' || name[i] == '0' {
		return 0, 0, false
	}
	return col - 1, n - 1, true
}

// maxBayColumns bounds the columns ParseBay reads (four letters), so a
// long run of letters cannot overflow.
const maxBayColumns = 24 * 24 * 24 * 24

// Label order inside a bay: rows separated by gaps in y, then x.
const (
	// LabelResolutionMM: positions are rounded to whole millimetres
	// before they are compared, so the order never hangs on the last bits
	// of a float.
	LabelResolutionMM = 1.0
	// RowGapFraction: inside a bay a new row starts where the next y is
	// more than this fraction of the typical spacing above the previous
	// one.
	RowGapFraction = 0.5
)

// Label names items by their bay and their order in the bay, such as
// "C3-07" (prefix "") or "C3-M12" (prefix "M"). Numbers run row by row
// from the bay's lower-left corner: the items of a bay are sorted by y;
// a new row starts where y rises by more than RowGapFraction of the
// typical spacing over the item before (the typical spacing is
// √(A / n), A the plan area of the bounding box of all the points and n
// their number: the spacing of n points spread evenly over it); rows go
// from low to high y, and inside a row items go by x, then y, then z,
// then by key. Positions are rounded to LabelResolutionMM before any
// comparison. The labels depend only on the points and keys, never on
// the order the items come in. Numbers are consecutive in each bay (01,
// 02, 03, …) with at least two digits, more where a bay holds more than
// 99 items.
func (b Bays) Label(pts []geom.Vec, keys []string, prefix string) []string {
	type item struct {
		i        int
		col, row int
		x, y, z  float64 // rounded to LabelResolutionMM
		line     int     // row inside the bay
	}
	items := make([]item, len(pts))
	lo, hi := geom.Vec2{X: math.Inf(1), Y: math.Inf(1)}, geom.Vec2{X: math.Inf(-1), Y: math.Inf(-1)}
	for i, p := range pts {
		c, r := b.Cell(geom.Vec2{X: p.X, Y: p.Y})
		items[i] = item{i: i, col: c, row: r, x: roundRes(p.X), y: roundRes(p.Y), z: roundRes(p.Z)}
		lo = geom.Vec2{X: math.Min(lo.X, items[i].x), Y: math.Min(lo.Y, items[i].y)}
		hi = geom.Vec2{X: math.Max(hi.X, items[i].x), Y: math.Max(hi.Y, items[i].y)}
	}
	gap := 0.0
	if len(pts) > 0 {
		gap = RowGapFraction * math.Sqrt((hi.X-lo.X)*(hi.Y-lo.Y)/float64(len(pts)))
	}
	bay := func(a, c item) int {
		if d := cmp.Compare(a.col, c.col); d != 0 {
			return d
		}
		return cmp.Compare(a.row, c.row)
	}
	tail := func(a, c item) int { // x, y, z, key
		if d := cmp.Compare(a.x, c.x); d != 0 {
			return d
		}
		if d := cmp.Compare(a.y, c.y); d != 0 {
			return d
		}
		if d := cmp.Compare(a.z, c.z); d != 0 {
			return d
		}
		return strings.Compare(keys[a.i], keys[c.i])
	}
	// By bay, then y: rows are cut where y jumps.
	slices.SortFunc(items, func(a, c item) int {
		if d := bay(a, c); d != 0 {
			return d
		}
		if d := cmp.Compare(a.y, c.y); d != 0 {
			return d
		}
		return tail(a, c)
	})
	width := 2
	for s := 0; s < len(items); {
		e := s + 1
		for e < len(items) && bay(items[e], items[s]) == 0 {
			line := items[e-1].line
			if items[e].y-items[e-1].y > gap {
				line++
			}
			items[e].line = line
			e++
		}
		// Then row by row, by x inside a row.
		slices.SortFunc(items[s:e], func(a, c item) int {
			if d := cmp.Compare(a.line, c.line); d != 0 {
				return d
			}
			return tail(a, c)
		})
		width = max(width, len(strconv.Itoa(e-s)))
		s = e
	}
	labels := make([]string, len(pts))
	k := 0
	name := ""
	for j, it := range items {
		if j == 0 || bay(it, items[j-1]) != 0 {
			k = 0
		}
		k++
		if k == 1 {
			name = b.Name(it.col, it.row) + "-" + prefix
		}
		num := strconv.Itoa(k)
		labels[it.i] = name + strings.Repeat("0", max(0, width-len(num))) + num
	}
	return labels
}

// roundRes rounds a coordinate to LabelResolutionMM.
func roundRes(v float64) float64 { return math.Round(v/LabelResolutionMM) * LabelResolutionMM }
