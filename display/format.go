package display

import (
	"math"
	"strconv"
	"strings"
)

// DefaultDigits is the number of significant digits a number column or a
// caption shows when no other count is asked for. Four digits resolve a
// membrane potential to 0.01 mV and a rate to 0.1 Hz in their usual ranges,
// which is as far as most recorded or simulated values are meaningful.
const DefaultDigits = 4

// numberFormat is the common presentation of a column of numbers: either
// fixed notation with a given count of decimals, or scientific notation
// with a given count of mantissa decimals when magnitudes are very large or
// very small.
type numberFormat struct {
	sci      bool
	decimals int
}

// columnFormat chooses one format for all finite values of xs so that the
// largest magnitude shows digits significant digits and every row has the
// same number of decimals (so that the decimal points line up). Whole
// numbers below 1e15 are shown without decimals.
func columnFormat(xs []float64, digits int) numberFormat {
	s := newMagnitudes()
	s.add(xs)
	return s.format(digits)
}

// magnitudes gathers what columnFormat needs to know of one or more columns:
// the largest and the smallest non-zero finite magnitude, and whether every
// finite value is whole. Columns of one Group are gathered together.
type magnitudes struct {
	maxAbs, minAbs float64
	whole          bool
}

func newMagnitudes() magnitudes { return magnitudes{minAbs: math.Inf(1), whole: true} }

func (s *magnitudes) add(xs []float64) {
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		a := math.Abs(x)
		s.maxAbs = math.Max(s.maxAbs, a)
		if a > 0 {
			s.minAbs = math.Min(s.minAbs, a)
		}
		if x != math.Trunc(x) {
			s.whole = false
		}
	}
}

// format is the numberFormat for the gathered values (see columnFormat).
func (s *magnitudes) format(digits int) numberFormat {
	if digits <= 0 {
		digits = DefaultDigits
	}
	switch {
	case s.whole && s.maxAbs < 1e15:
		return numberFormat{}
	case s.maxAbs >= 1e6 || s.maxAbs < 1e-3:
		return numberFormat{sci: true, decimals: digits - 1}
	}
	// A column whose small values would all round to zero at the largest
	// value's precision (say 0.0021 beside 250) gets scientific notation too.
	if s.minAbs < s.maxAbs*1e-4 && s.minAbs < 1e-2 {
		return numberFormat{sci: true, decimals: digits - 1}
	}
	d := digits - 1 - int(math.Floor(math.Log10(s.maxAbs)))
	return numberFormat{decimals: min(max(d, 0), 9)}
}

// format renders x in the chosen format; NaN and infinities are given as
// nan, and ±inf with the sign.
func (f numberFormat) format(x float64, nan, inf string) string {
	switch {
	case math.IsNaN(x):
		return nan
	case math.IsInf(x, 1):
		return inf
	case math.IsInf(x, -1):
		return "-" + inf
	case f.sci:
		return strconv.FormatFloat(x, 'e', f.decimals, 64)
	}
	s := strconv.FormatFloat(x, 'f', f.decimals, 64)
	if s == "-0" || strings.Trim(s, "-0.") == "" && strings.HasPrefix(s, "-") {
		s = s[1:] // a value that rounds to zero shows no sign
	}
	return s
}

// FormatNumber renders one number with digits significant digits (0 means
// DefaultDigits), trailing zeros dropped, thousands grouped with commas
// (100,001), and a true minus sign (U+2212) for prose such as captions.
// NaN is "NaN" and infinities "∞" with their sign.
func FormatNumber(x float64, digits int) string {
	if digits <= 0 {
		digits = DefaultDigits
	}
	switch {
	case math.IsNaN(x):
		return "NaN"
	case math.IsInf(x, 1):
		return "∞"
	case math.IsInf(x, -1):
		return "−∞"
	}
	a := math.Abs(x)
	var s string
	if x == math.Trunc(x) && a < 1e6 {
		return strings.Replace(groupThousands(strconv.FormatFloat(x, 'f', 0, 64)), "-", "−", 1)
	}
	if a != 0 && (a >= 1e6 || a < 1e-4) {
		s = strconv.FormatFloat(x, 'e', digits-1, 64)
		mant, exp, _ := strings.Cut(s, "e")
		if strings.Contains(mant, ".") {
			mant = strings.TrimRight(strings.TrimRight(mant, "0"), ".")
		}
		n, _ := strconv.Atoi(exp)
		s = mant + "e" + strconv.Itoa(n)
	} else {
		r, _ := strconv.ParseFloat(strconv.FormatFloat(x, 'g', digits, 64), 64)
		s = groupThousands(strconv.FormatFloat(r, 'f', -1, 64))
	}
	return strings.Replace(s, "-", "−", 1)
}

// FormatCount renders a whole count with thousands grouped: 100,001.
func FormatCount(n int) string {
	return groupThousands(strconv.Itoa(n))
}

// groupThousands inserts commas into the integer part of a plain decimal.
func groupThousands(s string) string {
	sign := ""
	if strings.HasPrefix(s, "-") {
		sign, s = "-", s[1:]
	}
	intPart, frac, hasFrac := strings.Cut(s, ".")
	var b strings.Builder
	for i, r := range intPart {
		if i > 0 && (len(intPart)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(r)
	}
	if hasFrac {
		b.WriteByte('.')
		b.WriteString(frac)
	}
	return sign + b.String()
}

// plural returns "1 line" or "3 lines".
func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return FormatCount(n) + " " + many
}
