package display

import "math"

// srgbToLinear converts an sRGB component in [0, 1] to linear light
// (IEC 61966-2-1, as used by WCAG 2.x relative luminance).
func srgbToLinear(c float64) float64 {
	if c <= 0.04045 {
		return c / 12.92
	}
	return math.Pow((c+0.055)/1.055, 2.4)
}

// linearToSRGB is the inverse of srgbToLinear.
func linearToSRGB(c float64) float64 {
	if c <= 0.0031308 {
		return 12.92 * c
	}
	return 1.055*math.Pow(c, 1/2.4) - 0.055
}
