package geom

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// DefaultBaySizeMM is the default bay size for labels: 6 m, a common
// structural grid spacing.
const DefaultBaySizeMM = 6000.0

// Bays cuts the plan into a grid of bays, like structural grid lines:
// columns lettered along x (A, B, …, Z, AA, …) and rows numbered along y
// from 1. Bay C3 is the third column and third row.
type Bays struct {
	Origin Vec2    // lower-left corner of bay A1
	SizeX  float64 // bay width along x (mm)
	SizeY  float64 // bay depth along y (mm)
}

// NewBays returns bays of the given size starting at the lower-left corner
// of the points' plan bounding box.
func NewBays(pts []Vec, sizeX, sizeY float64) (Bays, error) {
	if !(sizeX > 0) || !(sizeY > 0) || math.IsInf(sizeX, 0) || math.IsInf(sizeY, 0) {
		return Bays{}, fmt.Errorf("geom: bay size %g × %g mm must be positive", sizeX, sizeY)
	}
	lo := Vec2{math.Inf(1), math.Inf(1)}
	for _, p := range pts {
		lo = Vec2{math.Min(lo.X, p.X), math.Min(lo.Y, p.Y)}
	}
	if len(pts) == 0 {
		lo = Vec2{}
	}
	return Bays{Origin: lo, SizeX: sizeX, SizeY: sizeY}, nil
}

// Cell returns the 0-based column and row of the bay holding plan point p.
func (b Bays) Cell(p Vec2) (col, row int) {
	col = int(math.Floor((p.X - b.Origin.X) / b.SizeX))
	row = int(math.Floor((p.Y - b.Origin.Y) / b.SizeY))
	return max(col, 0), max(row, 0)
}

// Name returns the name of bay (col, row), such as "C3".
func (b Bays) Name(col, row int) string { return ColumnLetters(col) + fmt.Sprint(row+1) }

// ColumnLetters returns the spreadsheet-style letters of 0-based column i:
// A … Z, AA, AB, ….
func ColumnLetters(i int) string {
	s := ""
	for i++; i > 0; i = (i - 1) / 26 {
		s = string(rune('A'+(i-1)%26)) + s
	}
	return s
}

// Label names items by their bay and their order in the bay, such as
// "C3-07" (prefix "") or "C3-M12" (prefix "M"). Items in a bay are
// ordered by x, then y, then z of their point, then by key, which makes
// the labels independent of the order the items come in. Numbers have at
// least two digits, more where a bay holds more than 99 items.
func (b Bays) Label(pts []Vec, keys []string, prefix string) []string {
	type item struct {
		i        int
		col, row int
		p        Vec
	}
	items := make([]item, len(pts))
	for i, p := range pts {
		c, r := b.Cell(Vec2{p.X, p.Y})
		items[i] = item{i, c, r, p}
	}
	slices.SortFunc(items, func(a, c item) int {
		if d := cmp.Compare(a.col, c.col); d != 0 {
			return d
		}
		if d := cmp.Compare(a.row, c.row); d != 0 {
			return d
		}
		if d := cmp.Compare(a.p.X, c.p.X); d != 0 {
			return d
		}
		if d := cmp.Compare(a.p.Y, c.p.Y); d != 0 {
			return d
		}
		if d := cmp.Compare(a.p.Z, c.p.Z); d != 0 {
			return d
		}
		return strings.Compare(keys[a.i], keys[c.i])
	})
	width := 2
	for s := 0; s < len(items); {
		e := s
		for e < len(items) && items[e].col == items[s].col && items[e].row == items[s].row {
			e++
		}
		width = max(width, len(fmt.Sprint(e-s)))
		s = e
	}
	labels := make([]string, len(pts))
	k := 0
	bay := ""
	for j, it := range items {
		if j == 0 || it.col != items[j-1].col || it.row != items[j-1].row {
			k = 0
		}
		k++
		if k == 1 {
			bay = b.Name(it.col, it.row) + "-" + prefix
		}
		num := strconv.Itoa(k)
		labels[it.i] = bay + strings.Repeat("0", max(0, width-len(num))) + num
	}
	return labels
}
