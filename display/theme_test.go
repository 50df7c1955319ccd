package display

import (
	"image/color"
	"math"
	"testing"
)

// relLuminance is WCAG 2.x relative luminance (W3C, Web Content
// Accessibility Guidelines 2.1, definition of "relative luminance").
func relLuminance(c color.NRGBA) float64 {
	r, g, b := srgbToLinear(float64(c.R)/255), srgbToLinear(float64(c.G)/255), srgbToLinear(float64(c.B)/255)
	return 0.2126*r + 0.7152*g + 0.0722*b
}

// contrast is the WCAG 2.x contrast ratio (L1 + 0.05) / (L2 + 0.05).
func contrast(a, b color.NRGBA) float64 {
	la, lb := relLuminance(a), relLuminance(b)
	return (math.Max(la, lb) + 0.05) / (math.Min(la, lb) + 0.05)
}

var (
	white    = color.NRGBA{0xFF, 0xFF, 0xFF, 0xFF}
	black    = color.NRGBA{0, 0, 0, 0xFF}
	darkGrey = color.NRGBA{0x1E, 0x1E, 0x1E, 0xFF} // our reference dark theme page
)

// TestWCAGReference checks the contrast function on values the standard
// fixes: white on black is 21:1 and a colour on itself 1:1 (WCAG 2.1,
// contrast ratio range 1 to 21); #777777 on white is 4.48:1 (from memory,
// the often quoted figure for that grey).
func TestWCAGReference(t *testing.T) {
	cases := []struct {
		name string
		a, b color.NRGBA
		want float64
		tol  float64 // rounding of the quoted figure
	}{
		{"white on black", white, black, 21, 1e-9},
		{"same colour", Ink, Ink, 1, 1e-12},
		{"#777 on white", Ink, white, 4.48, 0.005},
	}
	for _, c := range cases {
		if got := contrast(c.a, c.b); !near(got, c.want, c.tol, 0) {
			t.Errorf("%s: contrast %.4f, want %.2f", c.name, got, c.want)
		}
	}
}

// TestThemeContrast checks that every colour drawn on the transparent
// background has at least 3:1 contrast on a white page and on a dark grey
// page: the WCAG 2.1 minimum for graphical objects (success criterion
// 1.4.11, non-text contrast).
func TestThemeContrast(t *testing.T) {
	colours := map[string]color.NRGBA{"ink": Ink}
	for i, c := range Palette {
		colours["palette "+string(rune('1'+i))] = c
	}
	for _, f := range []float64{0, 0.25, 0.5, 0.75, 1} {
		colours["ramp "+FormatNumber(f, 2)] = RampColour(f)
	}
	for name, c := range colours {
		for _, bg := range []color.NRGBA{white, darkGrey} {
			if r := contrast(c, bg); r < 3 {
				t.Errorf("%s %v has contrast %.2f on %v, want at least 3", name, c, r, bg)
			}
		}
	}
}

// Machado, Oliveira and Fernandes (2009), "A physiologically-based model
// for simulation of color vision deficiency", IEEE TVCG 15(6):1291–1298:
// the severity-1.0 matrices for protanopia and deuteranopia, applied to
// linear RGB (values from memory; each row sums to 1, so white stays
// white, which TestMachadoRows checks).
var (
	protanopia = [3][3]float64{
		{0.152286, 1.052583, -0.204868},
		{0.114503, 0.786281, 0.099216},
		{-0.003882, -0.048116, 1.051998},
	}
	deuteranopia = [3][3]float64{
		{0.367322, 0.860646, -0.227968},
		{0.280085, 0.672501, 0.047413},
		{-0.011820, 0.042940, 0.968881},
	}
	normalVision = [3][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}
)

func TestMachadoRows(t *testing.T) {
	for _, m := range [][3][3]float64{protanopia, deuteranopia} {
		for i, row := range m {
			if s := row[0] + row[1] + row[2]; !near(s, 1, 2e-6, 0) { // 6 printed decimals
				t.Errorf("row %d sums to %v, want 1", i, s)
			}
		}
	}
}

// labOf converts a colour seen through matrix m to CIELAB (D65 white;
// sRGB to XYZ per IEC 61966-2-1, XYZ to L*a*b* per CIE 15:2004).
func labOf(c color.NRGBA, m [3][3]float64) [3]float64 {
	lin := [3]float64{srgbToLinear(float64(c.R) / 255), srgbToLinear(float64(c.G) / 255), srgbToLinear(float64(c.B) / 255)}
	var v [3]float64
	for i := range 3 {
		v[i] = math.Min(math.Max(m[i][0]*lin[0]+m[i][1]*lin[1]+m[i][2]*lin[2], 0), 1)
	}
	x := 0.4124*v[0] + 0.3576*v[1] + 0.1805*v[2]
	y := 0.2126*v[0] + 0.7152*v[1] + 0.0722*v[2]
	z := 0.0193*v[0] + 0.1192*v[1] + 0.9505*v[2]
	f := func(t float64) float64 {
		if t > 216.0/24389 {
			return math.Cbrt(t)
		}
		return (24389.0/27*t + 16) / 116
	}
	fx, fy, fz := f(x/0.95047), f(y), f(z/1.08883)
	return [3]float64{116*fy - 16, 500 * (fx - fy), 200 * (fy - fz)}
}

func deltaE(a, b [3]float64) float64 {
	return math.Sqrt((a[0]-b[0])*(a[0]-b[0]) + (a[1]-b[1])*(a[1]-b[1]) + (a[2]-b[2])*(a[2]-b[2]))
}

// TestPaletteDistinct checks that any two palette colours differ by at
// least 20 ΔE*ab (CIE 1976) under normal vision and simulated protanopia
// and deuteranopia. A ΔE*ab of about 2.3 is a just noticeable difference
// (Sharma, Digital Color Imaging Handbook, 2003); 20 keeps thin lines
// apart at a glance. White under each matrix must stay L* = 100 (CIE 15).
func TestPaletteDistinct(t *testing.T) {
	visions := []struct {
		name string
		m    [3][3]float64
	}{{"normal", normalVision}, {"protanopia", protanopia}, {"deuteranopia", deuteranopia}}
	for _, v := range visions {
		if l := labOf(white, v.m)[0]; !near(l, 100, 0.01, 0) { // rounding of the matrices
			t.Errorf("%s: white has L* %.3f, want 100", v.name, l)
		}
		for i := range Palette {
			for j := i + 1; j < len(Palette); j++ {
				if d := deltaE(labOf(Palette[i], v.m), labOf(Palette[j], v.m)); d < 20 {
					t.Errorf("%s: palette %d and %d differ by ΔE %.1f, want at least 20", v.name, i+1, j+1, d)
				}
			}
		}
	}
}
