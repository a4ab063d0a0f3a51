package web

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

// histogramSVG draws a histogram of values as an inline SVG element.
func histogramSVG(title, xlabel string, values []float64, fill color.Color) (string, error) {
	if len(values) == 0 {
		return "", nil
	}
	p := plot.New()
	p.Title.Text = title
	p.X.Label.Text = xlabel
	p.Y.Label.Text = "count"
	bins := 30
	lo, hi := values[0], values[0]
	for _, v := range values {
		lo, hi = min(lo, v), max(hi, v)
	}
	vs := plotter.Values(values)
	if hi == lo {
		bins = 1
	}
	h, err := plotter.NewHist(vs, bins)
	if err != nil {
		return "", err
	}
	h.FillColor = fill
	h.LineStyle.Color = color.RGBA{R: 40, G: 40, B: 40, A: 255}
	h.LineStyle.Width = vg.Points(0.5)
	p.Add(h)
	wt, err := p.WriterTo(4.6*vg.Inch, 2.6*vg.Inch, "svg")
	if err != nil {
		return "", err
	}
	var buf bytes.Buffer
	if _, err := wt.WriteTo(&buf); err != nil {
		return "", err
	}
	s := buf.String()
	// Inline: drop the XML prolog; the page is the document.
	if i := strings.Index(s, "<svg"); i >= 0 {
		s = s[i:]
	}
	return s, nil
}

// palette colours for the plan views: our own choices.
var (
	moveLow   = [3]float64{247, 244, 214} // pale straw: no move
	moveHigh  = [3]float64{20, 60, 110}   // deep slate blue: largest move
	twistNeg  = [3]float64{38, 110, 160}  // lake blue: negative twist
	twistZero = [3]float64{245, 245, 240} // near white: no twist
	twistPos  = [3]float64{190, 80, 40}   // brick: positive twist
)

func mix(a, b [3]float64, t float64) string {
	t = max(0, min(1, t))
	return fmt.Sprintf("#%02x%02x%02x", int(a[0]+(b[0]-a[0])*t+0.5), int(a[1]+(b[1]-a[1])*t+0.5), int(a[2]+(b[2]-a[2])*t+0.5))
}

// typeColour gives type i a colour by walking the hue circle by the golden
// angle, so neighbouring type numbers look different.
func typeColour(i int) string {
	h := float64(i) * 137.508
	h = math.Mod(h, 360)
	return hsl(h, 0.55, 0.62)
}

func hsl(h, s, l float64) string {
	c := (1 - math.Abs(2*l-1)) * s
	x := c * (1 - math.Abs(math.Mod(h/60, 2)-1))
	m := l - c/2
	var r, g, b float64
	switch {
	case h < 60:
		r, g, b = c, x, 0
	case h < 120:
		r, g, b = x, c, 0
	case h < 180:
		r, g, b = 0, c, x
	case h < 240:
		r, g, b = 0, x, c
	case h < 300:
		r, g, b = x, 0, c
	default:
		r, g, b = c, 0, x
	}
	return fmt.Sprintf("#%02x%02x%02x", int((r+m)*255+0.5), int((g+m)*255+0.5), int((b+m)*255+0.5))
}
