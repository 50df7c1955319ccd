package kernel

import (
	"bytes"
	"fmt"
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
)

// The logo is our own mark: a single action potential (rise, overshoot,
// undershoot, recovery) drawn in white across a deep-teal disc. The trace
// is a fixed polyline in unit coordinates, shared by the PNG and SVG.
var logoTrace = [][2]float64{
	{0.14, 0.62}, {0.36, 0.62}, {0.42, 0.58}, {0.47, 0.20}, {0.52, 0.20},
	{0.58, 0.72}, {0.66, 0.74}, {0.74, 0.64}, {0.86, 0.62},
}

var (
	logoDisc = color.NRGBA{0x0e, 0x5c, 0x63, 0xff}
	logoInk  = color.NRGBA{0xff, 0xff, 0xff, 0xff}
)

// logoPNG draws the logo as an n×n PNG, anti-aliased by 4×4 supersampling.
func logoPNG(w io.Writer, n int) error {
	img := image.NewNRGBA(image.Rect(0, 0, n, n))
	const ss = 4
	width := 0.075 // trace width in unit coordinates
	for py := 0; py < n; py++ {
		for px := 0; px < n; px++ {
			var disc, line int
			for sy := 0; sy < ss; sy++ {
				for sx := 0; sx < ss; sx++ {
					x := (float64(px) + (float64(sx)+0.5)/ss) / float64(n)
					y := (float64(py) + (float64(sy)+0.5)/ss) / float64(n)
					if math.Hypot(x-0.5, y-0.5) <= 0.48 {
						disc++
						if distToTrace(x, y) <= width/2 {
							line++
						}
					}
				}
			}
			img.SetNRGBA(px, py, blend(disc, line, ss*ss))
		}
	}
	return png.Encode(w, img)
}

// blend mixes disc and trace colours by their sample counts out of total.
func blend(disc, line, total int) color.NRGBA {
	if disc == 0 {
		return color.NRGBA{}
	}
	f := float64(line) / float64(disc)
	mix := func(a, b uint8) uint8 { return uint8(math.Round(float64(a)*(1-f) + float64(b)*f)) }
	return color.NRGBA{mix(logoDisc.R, logoInk.R), mix(logoDisc.G, logoInk.G),
		mix(logoDisc.B, logoInk.B), uint8(math.Round(255 * float64(disc) / float64(total)))}
}

// distToTrace is the distance from (x, y) to the nearest trace segment.
func distToTrace(x, y float64) float64 {
	best := math.Inf(1)
	for i := 1; i < len(logoTrace); i++ {
		a, b := logoTrace[i-1], logoTrace[i]
		dx, dy := b[0]-a[0], b[1]-a[1]
		t := ((x-a[0])*dx + (y-a[1])*dy) / (dx*dx + dy*dy)
		t = math.Max(0, math.Min(1, t))
		best = math.Min(best, math.Hypot(x-a[0]-t*dx, y-a[1]-t*dy))
	}
	return best
}

// logoSVG returns the logo as SVG on a 64-unit canvas.
func logoSVG() []byte {
	var b bytes.Buffer
	b.WriteString(`<svg xmlns="http://www.w3.org/2000/svg" width="64" height="64" viewBox="0 0 64 64">` + "\n")
	fmt.Fprintf(&b, `<circle cx="32" cy="32" r="30.72" fill="#%02x%02x%02x"/>`+"\n", logoDisc.R, logoDisc.G, logoDisc.B)
	b.WriteString(`<polyline fill="none" stroke="#ffffff" stroke-width="4.8" stroke-linejoin="round" stroke-linecap="round" points="`)
	for i, p := range logoTrace {
		if i > 0 {
			b.WriteByte(' ')
		}
		fmt.Fprintf(&b, "%.2f,%.2f", 64*p[0], 64*p[1])
	}
	b.WriteString(`"/>` + "\n</svg>\n")
	return b.Bytes()
}
