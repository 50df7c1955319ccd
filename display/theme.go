package display

import (
	"image/color"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// The look of Loligo's figures is decided here and nowhere else.
//
// Background. Figures are drawn on a transparent background so that they
// sit on the notebook's own page colour, light or dark. Everything drawn on
// them must therefore stand out from both a white page and a dark grey one
// (#1E1E1E is our reference). WCAG 2.x relative luminance L gives the
// contrast ratio (L1+0.05)/(L2+0.05); against white a colour needs
// L <= 0.30 for 3:1, against #1E1E1E it needs L >= 0.14. All ink colours
// lie in that band, so each has at least the 3:1 that WCAG 2.1 asks of
// graphical objects (success criterion 1.4.11) on both themes. No single
// colour can reach 4.5:1 on both (the best is about 4.1:1 at L = 0.21), so
// text uses a neutral grey close to that optimum and a size of 10 pt or more.
//
// Series colours. Inside that luminance band the colours that stay apart
// for protanopes and deuteranopes lie along the blue–orange axis, with
// violet and two desaturated warm tones as further steps. The five colours
// below were chosen by us to maximise the smallest CIELAB distance between
// any two of them under normal vision and under the Machado, Oliveira and
// Fernandes (2009) simulation of protanopia and deuteranopia (the smallest
// distance is about 23 ΔE*ab; theme_test.go checks it stays above 20). A
// sixth and later series reuse the colours with a dash pattern, so that no
// two series of a panel look the same.
//
// Weights. Data lines are 1.4 pt, so that a trace is the strongest mark on
// the page; axes and ticks are 0.7 pt in the neutral ink, reference lines
// 0.9 pt dashed, raster ticks 0.9 pt. Text is Liberation Sans (bundled with
// gonum/plot, so rendering is identical on every machine): 10 pt for ticks
// and legends, 11 pt for axis labels, 12 pt bold for titles.
var (
	// Palette is the ordered series colours: cobalt, ember, violet, heather
	// and clay.
	Palette = []color.NRGBA{
		{0x3C, 0x78, 0xD2, 0xFF},
		{0xD2, 0x69, 0x3C, 0xFF},
		{0x6A, 0x4C, 0xF5, 0xFF},
		{0xA5, 0x87, 0x96, 0xFF},
		{0xA5, 0x69, 0x5A, 0xFF},
	}
	// Ink is the neutral grey of axes, text and reference lines.
	Ink = color.NRGBA{0x77, 0x77, 0x77, 0xFF}
	// RampStart and RampEnd are the ends of the colour ramp of a family
	// of curves (first curve cobalt, last ember), interpolated in linear
	// light so that the middle keeps the luminance of the ends.
	RampStart = Palette[0]
	RampEnd   = Palette[1]
)

// transparent is the background of PNG output.
var transparent = color.NRGBA{}

// Line weights and sizes, in points.
const (
	lineWidth    = 1.4
	axisWidth    = 0.7
	refWidth     = 0.9
	rasterWidth  = 0.9
	errBarWidth  = 0.9
	pointRadius  = 2.2
	bandOpacity  = 0x3A // fill alpha of a shaded band (about 23 %)
	tickFontSize = 10
	labelSize    = 11
	titleSize    = 12
)

// dashes are the patterns of the second, third, … round of the palette.
var dashes = [][]vg.Length{nil, {vg.Points(5), vg.Points(2.5)}, {vg.Points(1.5), vg.Points(2)}, {vg.Points(6), vg.Points(2), vg.Points(1.5), vg.Points(2)}}

// refDash is the pattern of reference lines.
var refDash = []vg.Length{vg.Points(3), vg.Points(3)}

// seriesColour returns the colour and dash pattern of the k-th automatically
// coloured series (k counts from 0).
func seriesColour(k int) (color.NRGBA, []vg.Length) {
	n := len(Palette)
	return Palette[k%n], dashes[(k/n)%len(dashes)]
}

// RampColour returns the colour at f in [0, 1] along the family ramp
// (f is clamped).
func RampColour(f float64) color.NRGBA {
	f = min(max(f, 0), 1)
	mix := func(a, b uint8) uint8 {
		la, lb := srgbToLinear(float64(a)/255), srgbToLinear(float64(b)/255)
		return uint8(linearToSRGB(la+(lb-la)*f)*255 + 0.5)
	}
	return color.NRGBA{mix(RampStart.R, RampEnd.R), mix(RampStart.G, RampEnd.G), mix(RampStart.B, RampEnd.B), 0xFF}
}

// textFont is the typeface of all figure text at the given size.
func textFont(size float64, bold bool) font.Font {
	f := font.Font{Typeface: "Liberation", Variant: "Sans", Size: vg.Points(size)}
	if bold {
		f.Weight = 3 // bold (CSS 700) in golang.org/x/image/font terms
	}
	return f
}
