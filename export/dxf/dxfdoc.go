package dxf

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"pqfab/export/internal/layout"
	"strconv"
	"strings"
	"sync"
	"unicode/utf8"

	"github.com/yofu/dxf"
	"github.com/yofu/dxf/color"
	"github.com/yofu/dxf/insunit"
	"github.com/yofu/dxf/table"
	"golang.org/x/text/encoding/charmap"
)

// DXF drawings are written in two parts. The document's structure (header,
// tables with the layers and line types, blocks and objects: the parts of
// an AC1015 file that readers need besides the entities) comes from the
// yofu/dxf library, for a drawing with the layers and no entities. The
// entities are streamed into it by dxfDoc, with fixed decimals, so that a
// drawing of any size is written without being held in memory. Each
// drawing is generated twice: once to measure its extents and count its
// entities (for the header), once to write.

// dxfDigits: coordinates are written to 1e-4 mm, so the bytes written do
// not depend on the last bits of a float.
const dxfDigits = 4

// yofu/dxf keeps some package-level state (the default layer and text
// style, whose handles each drawing sets when it is written), so the
// document structures are made one at a time.
var dxfMu sync.Mutex

type dxfLayer struct {
	name     string
	color    color.ColorNumber
	lineType *table.LineType // nil: continuous
}

// dxfDoc receives a drawing's entities: it writes them, or, while
// measuring, only counts them and grows the extents.
type dxfDoc struct {
	w      *bufio.Writer // nil while measuring
	buf    []byte
	layer  string
	handle int // of the next entity
	count  int
	lo, hi [3]float64
	err    error
}

// writeDXF writes a drawing in mm with the given layers, whose entities
// draw makes (it is called twice). ltScale, when not zero, scales the
// line types' patterns. Safe to call from several goroutines.
func writeDXF(w io.Writer, layers []dxfLayer, ltScale float64, draw func(d *dxfDoc) error) error {
	m := &dxfDoc{lo: [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, hi: [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}}
	if err := draw(m); err != nil {
		return err
	}
	if m.count == 0 {
		m.lo, m.hi = [3]float64{}, [3]float64{}
	}
	head, tail, first, err := dxfSkeleton(layers, ltScale, m.lo, m.hi, m.count)
	if err != nil {
		return err
	}
	d := &dxfDoc{w: bufio.NewWriterSize(w, 1<<16), handle: first}
	d.w.Write(head)
	if err := draw(d); err != nil {
		return err
	}
	if d.err != nil {
		return d.err
	}
	d.w.Write(tail)
	return d.w.Flush()
}

// dxfSkeleton returns the document around the entities: everything up to
// the ENTITIES section's header and everything from its end, for a
// drawing with the given layers, extents and number of entities, and the
// handle of the first entity.
func dxfSkeleton(layers []dxfLayer, ltScale float64, lo, hi [3]float64, entities int) (head, tail []byte, first int, err error) {
	s, err := emptyDrawing(layers, ltScale)
	if err != nil {
		return nil, nil, 0, err
	}
	const open = "0\nSECTION\n2\nENTITIES\n"
	const end = "0\nENDSEC\n"
	i := bytes.Index(s, []byte(open))
	if i < 0 {
		return nil, nil, 0, errors.New("DXF library wrote no ENTITIES section")
	}
	j := i + len(open)
	if !bytes.HasPrefix(s[j:], []byte(end)) {
		return nil, nil, 0, errors.New("DXF library wrote entities into an empty drawing")
	}
	head, tail = s[:j], s[j:]
	// The entities take the handles from the document's handle seed on;
	// the seed moves past them, and the header gets the extents.
	seed, head, err := replaceGroup(head, "$HANDSEED", func(old []string) []string {
		return []string{"5", fmt.Sprintf("%X", hexValue(old)+entities)}
	})
	if err != nil {
		return nil, nil, 0, err
	}
	first = hexValue(seed)
	for _, e := range []struct {
		name string
		p    [3]float64
	}{{"$EXTMIN", lo}, {"$EXTMAX", hi}} {
		if _, head, err = replaceGroup(head, e.name, func([]string) []string {
			return []string{"10", fixedNum(e.p[0]), "20", fixedNum(e.p[1]), "30", fixedNum(e.p[2])}
		}); err != nil {
			return nil, nil, 0, err
		}
	}
	return head, tail, first, nil
}

// emptyDrawings caches the DXF library's drawings with no entities, by
// their layers and line type scale (a build writes many drawings with the
// same layers).
var emptyDrawings sync.Map

// emptyDrawing returns the DXF library's drawing with the given layers
// and no entities.
func emptyDrawing(layers []dxfLayer, ltScale float64) ([]byte, error) {
	key := fmt.Sprint(ltScale)
	for _, l := range layers {
		lt := ""
		if l.lineType != nil {
			lt = l.lineType.Name()
		}
		key += "|" + l.name + "/" + fmt.Sprint(l.color) + "/" + lt
	}
	if b, ok := emptyDrawings.Load(key); ok {
		return b.([]byte), nil
	}
	dxfMu.Lock()
	defer dxfMu.Unlock()
	d := dxf.NewDrawing()
	d.Header().InsUnit = insunit.Millimeters
	d.Header().InsLUnit = insunit.Decimal
	if ltScale > 0 {
		d.Header().LtScale = ltScale
	}
	for _, l := range layers {
		lt := l.lineType
		if lt == nil {
			lt = table.LT_CONTINUOUS
		}
		if _, err := d.AddLayer(l.name, l.color, lt, false); err != nil {
			return nil, err
		}
	}
	var b bytes.Buffer
	if _, err := d.WriteTo(&b); err != nil {
		return nil, err
	}
	emptyDrawings.Store(key, b.Bytes())
	return b.Bytes(), nil
}

// replaceGroup replaces the value lines of header variable name (the code
// and value pairs after "9\nNAME\n" up to the next "9" or "0") by what
// with returns, and returns the old pairs.
func replaceGroup(head []byte, name string, with func(old []string) []string) ([]string, []byte, error) {
	key := []byte("9\n" + name + "\n")
	i := bytes.Index(head, key)
	if i < 0 {
		return nil, nil, fmt.Errorf("DXF header has no %s", name)
	}
	j := i + len(key)
	lines := bytes.Split(head[j:], []byte("\n"))
	var old []string
	k := 0
	for ; k+1 < len(lines); k += 2 {
		c := string(bytes.TrimSpace(lines[k]))
		if c == "9" || c == "0" {
			break
		}
		old = append(old, c, string(lines[k+1]))
	}
	n := 0
	for _, l := range lines[:k] {
		n += len(l) + 1
	}
	var out bytes.Buffer
	out.Write(head[:j])
	for _, v := range with(old) {
		out.WriteString(v)
		out.WriteByte('\n')
	}
	out.Write(head[j+n:])
	return old, out.Bytes(), nil
}

// hexValue reads the value of a handle pair ("5", "2A").
func hexValue(pairs []string) int {
	if len(pairs) < 2 {
		return 0
	}
	v, _ := strconv.ParseInt(pairs[1], 16, 64)
	return int(v)
}

func fixedNum(x float64) string { return string(layout.AppendFixed(nil, x, dxfDigits)) }

// grow widens the extents by point p.
func (d *dxfDoc) grow(x, y, z float64) {
	d.lo = [3]float64{math.Min(d.lo[0], x), math.Min(d.lo[1], y), math.Min(d.lo[2], z)}
	d.hi = [3]float64{math.Max(d.hi[0], x), math.Max(d.hi[1], y), math.Max(d.hi[2], z)}
}

// start begins an entity of kind with its handle, layer and subclass.
func (d *dxfDoc) start(kind, subclass string) {
	d.count++
	if d.w == nil {
		return
	}
	d.buf = append(d.buf[:0], "0\n"...)
	d.buf = append(d.buf, kind...)
	d.buf = append(d.buf, "\n5\n"...)
	d.buf = strconv.AppendInt(d.buf, int64(d.handle), 16)
	d.handle++
	d.buf = append(d.buf, "\n100\nAcDbEntity\n8\n"...)
	d.buf = append(d.buf, d.layer...)
	d.buf = append(d.buf, "\n100\n"...)
	d.buf = append(d.buf, subclass...)
	d.buf = append(d.buf, '\n')
}

// num appends a group with a number of fixed decimals.
func (d *dxfDoc) num(code int, x float64) {
	d.buf = strconv.AppendInt(d.buf, int64(code), 10)
	d.buf = append(d.buf, '\n')
	d.buf = layout.AppendFixed(d.buf, x, dxfDigits)
	d.buf = append(d.buf, '\n')
}

// point appends a 3D point as the groups code, code+10 and code+20 (x, y
// and z).
func (d *dxfDoc) point(code int, x, y, z float64) {
	d.num(code, x)
	d.num(code+10, y)
	d.num(code+20, z)
}

// str appends a group with a text value (already safe for DXF).
func (d *dxfDoc) str(code int, s string) {
	d.buf = strconv.AppendInt(d.buf, int64(code), 10)
	d.buf = append(d.buf, '\n')
	d.buf = append(d.buf, s...)
	d.buf = append(d.buf, '\n')
}

// flush writes the entity built in buf.
func (d *dxfDoc) flush() {
	if d.w == nil || d.err != nil {
		return
	}
	if _, err := d.w.Write(d.buf); err != nil {
		d.err = err
	}
}

// Line adds a LINE from (x0, y0, z0) to (x1, y1, z1).
func (d *dxfDoc) Line(x0, y0, z0, x1, y1, z1 float64) (int, error) {
	d.grow(x0, y0, z0)
	d.grow(x1, y1, z1)
	d.start("LINE", "AcDbLine")
	if d.w != nil {
		d.point(10, x0, y0, z0)
		d.point(11, x1, y1, z1)
	}
	d.flush()
	return d.count, d.err
}

// Circle adds a CIRCLE of radius r about (x, y, z).
func (d *dxfDoc) Circle(x, y, z, rad float64) (int, error) {
	d.grow(x-rad, y-rad, z)
	d.grow(x+rad, y+rad, z)
	d.start("CIRCLE", "AcDbCircle")
	if d.w != nil {
		d.point(10, x, y, z)
		d.num(40, rad)
		d.point(210, 0, 0, 1) // extrusion: +z
	}
	d.flush()
	return d.count, d.err
}

// Text adds TEXT s (made safe by dxfText) of height h with its baseline's
// left end at (x, y, z).
func (d *dxfDoc) Text(s string, x, y, z, h float64) (int, error) {
	return d.text(s, x, y, z, h, 0, false)
}

// text adds TEXT; centred puts the middle of the text at (x, y, z).
func (d *dxfDoc) text(s string, x, y, z, h, rot float64, centred bool) (int, error) {
	s = dxfText(s)
	w := dxfTextWidth(s, h)
	d.grow(x-w, y-h, z)
	d.grow(x+w, y+h, z)
	d.start("TEXT", "AcDbText")
	if d.w != nil {
		d.point(10, x, y, z)
		d.num(40, h)
		d.num(50, rot)
		d.num(41, 1)
		d.num(51, 0)
		d.str(1, s)
		d.str(7, "Standard")
		if centred {
			d.str(72, "1")
			d.point(11, x, y, z)
		}
		d.str(100, "AcDbText")
		if centred {
			d.str(73, "2")
		}
	}
	d.flush()
	return d.count, d.err
}

// poly adds a closed LWPOLYLINE through pts.
func (d *dxfDoc) poly(pts [][2]float64) error { return d.lwpoly(pts, true) }

// openPoly adds an open LWPOLYLINE through pts.
func (d *dxfDoc) openPoly(pts [][2]float64) error { return d.lwpoly(pts, false) }

// lwpoly adds an LWPOLYLINE through pts, closed or open.
func (d *dxfDoc) lwpoly(pts [][2]float64, closed bool) error {
	for _, p := range pts {
		d.grow(p[0], p[1], 0)
	}
	d.start("LWPOLYLINE", "AcDbPolyline")
	if d.w != nil {
		d.str(90, strconv.Itoa(len(pts)))
		if closed {
			d.str(70, "1")
		} else {
			d.str(70, "0")
		}
		for _, p := range pts {
			d.num(10, p[0])
			d.num(20, p[1])
		}
	}
	d.flush()
	return d.err
}

// useLayer makes name the layer of the entities that follow.
func useLayer(d *dxfDoc, name string) error { d.layer = name; return d.err }

// text adds TEXT s of height h centred on (x, y, z), turned by rot
// degrees (made safe for DXF by dxfText).
func text(d *dxfDoc, s string, x, y, z, h, rot float64) error {
	_, err := d.text(s, x, y, z, h, rot, true)
	return err
}

// closedPoly adds a closed polyline through pts.
func closedPoly(d *dxfDoc, pts [][2]float64) error { return d.poly(pts) }

func rectPts(x0, y0, x1, y1 float64) [][2]float64 {
	return [][2]float64{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}
}

// dxfText makes s safe for a DXF TEXT value in an AC1015 file, which
// declares no code page and which readers therefore take as code page 1252
// (ANSI_1252): control characters (a newline would end the group value
// and break the file's structure) become spaces; a character of code page
// 1252 outside ASCII (such as ° or é) is written as its one byte there;
// every other character, and the backslash, is written as a \U+XXXX escape
// (the DXF notation for Unicode in files before AC1021; characters outside
// the Basic Multilingual Plane, which it cannot hold, and bytes that are
// not UTF-8 become "?"); and a percent sign next to another (a TEXT
// control code) is written as "%%%", which readers show as one percent
// sign. The result is meant for the DXF writer, not for Go: it need not be
// UTF-8.
func dxfText(s string) string {
	if plainDXF(s) {
		return s
	}
	var b strings.Builder
	for i, r := range s {
		switch {
		case r < 0x20 || r == 0x7f || (r >= 0x80 && r < 0xa0):
			b.WriteByte(' ')
		case r == utf8.RuneError || r > 0xffff:
			b.WriteByte('?')
		case r >= 0x80:
			if c, ok := charmap.Windows1252.EncodeRune(r); ok {
				b.WriteByte(c)
			} else {
				fmt.Fprintf(&b, `\U+%04X`, r)
			}
		case r == '\\' || r == '^': // the escape's own sign, and the caret of TEXT control codes
			fmt.Fprintf(&b, `\U+%04X`, r)
		case r == '%' && (strings.HasPrefix(s[i:], "%%") || (i > 0 && s[i-1] == '%')):
			b.WriteString("%%%")
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

// plainDXF reports whether s is printable ASCII without the characters
// dxfText rewrites (backslash, caret, percent sign): it then stands as it is.
func plainDXF(s string) bool {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c < 0x20 || c >= 0x7f || c == '\\' || c == '^' || c == '%' {
			return false
		}
	}
	return true
}
