package pdf

import (
	"fmt"

	"github.com/go-pdf/fpdf"
	qrcode "github.com/skip2/go-qrcode"
)

// qrQuietModules is the clear border around a QR symbol, in modules (the
// QR standard, ISO/IEC 18004, asks for four).
const qrQuietModules = 4

// drawQR draws a QR code holding text, with its quiet zone, in a square of
// side mm whose top-left corner is (x, y) on the page: error correction
// level M (15 % of the symbol may be lost), dark modules as filled
// rectangles, one per run of dark modules along a row.
func drawQR(pdf *fpdf.Fpdf, text string, x, y, side float64) error {
	q, err := qrcode.New(text, qrcode.Medium)
	if err != nil {
		return fmt.Errorf("QR code for %q: %w", text, err)
	}
	q.DisableBorder = true
	bm := q.Bitmap()
	n := len(bm)
	mod := side / float64(n+2*qrQuietModules)
	ox, oy := x+qrQuietModules*mod, y+qrQuietModules*mod
	pdf.SetFillColor(0, 0, 0)
	for r, row := range bm {
		for c := 0; c < len(row); {
			if !row[c] {
				c++
				continue
			}
			e := c
			for e < len(row) && row[e] {
				e++
			}
			pdf.Rect(ox+float64(c)*mod, oy+float64(r)*mod, float64(e-c)*mod, mod, "F")
			c = e
		}
	}
	return nil
}
