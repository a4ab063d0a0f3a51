package pdf

import (
	"bytes"
	"io"
	"pqfab/export/internal/layout"
	"time"

	"github.com/go-pdf/fpdf"
)

// pdfEpoch is the creation date written into every PDF, so the same
// input gives the same bytes (the Unix epoch; no clock is read).
var pdfEpoch = time.Unix(0, 0).UTC()

// ptMM is one typographic point in millimetres.
const ptMM = 25.4 / 72

// capHeight is the height of Helvetica's capital letters as a fraction of
// the font size (718/1000 in the font's metrics).
const capHeight = 0.718

// newPDF starts a deterministic PDF in mm with the given page size: no
// automatic page breaks, catalogue entries sorted, fixed dates, and the
// document title translated like every other text.
func newPDF(orientation string, size string, title, subject string) *fpdf.Fpdf {
	pdf := fpdf.New(orientation, "mm", size, "")
	pdf.SetCatalogSort(true)
	pdf.SetCreationDate(pdfEpoch)
	pdf.SetModificationDate(pdfEpoch)
	pdf.SetAutoPageBreak(false, 0)
	pdf.SetMargins(0, 0, 0)
	pdf.SetCreator("pqfab", false)
	pdf.SetProducer("pqfab", false)
	pdf.SetTitle(layout.NoControls(title), true)
	pdf.SetSubject(subject, false)
	return pdf
}

// writePDF writes a finished document.
func writePDF(w io.Writer, pdf *fpdf.Fpdf) error {
	var buf bytes.Buffer
	if err := pdf.Output(&buf); err != nil {
		return err
	}
	_, err := w.Write(buf.Bytes())
	return err
}

// cp1252High maps the characters of Windows code page 1252 in 0x80–0x9F
// (the code page of the PDF core fonts, WinAnsiEncoding) to their bytes;
// 0xA0–0xFF are the Latin-1 characters of the same numbers.
var cp1252High = map[rune]byte{
	'€': 0x80, '‚': 0x82, 'ƒ': 0x83, '„': 0x84, '…': 0x85, '†': 0x86, '‡': 0x87, 'ˆ': 0x88, '‰': 0x89,
	'Š': 0x8a, '‹': 0x8b, 'Œ': 0x8c, 'Ž': 0x8e, '‘': 0x91, '’': 0x92, '“': 0x93, '”': 0x94, '•': 0x95,
	'–': 0x96, '—': 0x97, '˜': 0x98, '™': 0x99, 'š': 0x9a, '›': 0x9b, 'œ': 0x9c, 'ž': 0x9e, 'Ÿ': 0x9f,
}

// pdfText translates a string for the PDF core fonts (code page 1252):
// control characters become spaces, characters the code page lacks become
// '?'. The result is bytes for fpdf, not UTF-8.
func pdfText(s string) string {
	b := make([]byte, 0, len(s))
	for _, c := range s {
		switch {
		case c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0):
			b = append(b, ' ')
		case c < 0x80 || (c >= 0xa0 && c <= 0xff):
			b = append(b, byte(c))
		default:
			if x, ok := cp1252High[c]; ok {
				b = append(b, x)
			} else {
				b = append(b, '?')
			}
		}
	}
	return string(b)
}

// fitText shortens already translated text with an ellipsis until it is at
// most w mm wide in the current font.
func fitText(pdf *fpdf.Fpdf, s string, w float64) string {
	if pdf.GetStringWidth(s) <= w {
		return s
	}
	const ellipsis = "\x85" // … in code page 1252
	for len(s) > 0 && pdf.GetStringWidth(s+ellipsis) > w {
		s = s[:len(s)-1]
	}
	return s + ellipsis
}

// splitLines breaks translated text into lines at most w mm wide in the
// current font, at spaces (a longer word stands alone). fpdf's SplitText
// reads its input as UTF-8, so it cannot take code page 1252 bytes.
func splitLines(pdf *fpdf.Fpdf, s string, w float64) []string {
	return layout.WrapFields(s, func(line string) bool { return pdf.GetStringWidth(line) <= w })
}
