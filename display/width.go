package display

import (
	"strings"
	"unicode"
)

// textWidth is the number of columns s takes in a monospaced console:
// combining marks (ḡ written as g + U+0304) and format characters (zero
// width space, joiners) take none, East Asian wide and fullwidth characters
// take two (Unicode Standard Annex #11), every other rune one. Alignment of
// plain-text tables and progress lines counts this, not runes or bytes.
func textWidth(s string) int {
	n := 0
	for _, r := range s {
		n += runeWidth(r)
	}
	return n
}

// runeWidth is the console width of one rune (see textWidth).
func runeWidth(r rune) int {
	switch {
	case r < 0x300: // ASCII and Latin-1: the common case, no table look-up
		if r < 0x20 || r >= 0x7f && r < 0xa0 {
			return 0 // control characters print nothing
		}
		return 1
	case unicode.In(r, unicode.Mn, unicode.Me, unicode.Cf):
		return 0
	case isWide(r):
		return 2
	}
	return 1
}

// wideRanges are the main blocks of East Asian Wide (W) and Fullwidth (F)
// characters of UAX #11: Hangul Jamo, CJK punctuation to Yi, Hangul
// syllables, CJK compatibility ideographs, vertical and small forms,
// fullwidth forms, the pictographs most often typed as emoji, and the
// supplementary ideographic planes.
var wideRanges = [...][2]rune{
	{0x1100, 0x115f}, {0x2e80, 0x303e}, {0x3041, 0x33ff}, {0x3400, 0x4dbf},
	{0x4e00, 0x9fff}, {0xa000, 0xa4cf}, {0xac00, 0xd7a3}, {0xf900, 0xfaff},
	{0xfe30, 0xfe4f}, {0xff00, 0xff60}, {0xffe0, 0xffe6}, {0x1f300, 0x1f64f},
	{0x1f900, 0x1f9ff}, {0x20000, 0x3fffd},
}

func isWide(r rune) bool {
	for _, w := range wideRanges {
		if r >= w[0] && r <= w[1] {
			return true
		}
	}
	return false
}

// padWidth pads s with spaces to width w columns, on the left when right
// is set.
func padWidth(s string, w int, right bool) string {
	fill := strings.Repeat(" ", max(w-textWidth(s), 0))
	if right {
		return fill + s
	}
	return s + fill
}
