package units

import (
	"strings"
	"unicode/utf8"
)

// hints are spellings from outside the SI that people type, with the SI
// symbol they mean; edit distance alone would not find most of them.
var hints = map[string]string{
	"sec": "s", "secs": "s", "msec": "ms", "usec": "us", "hr": "h", "hrs": "h", "hour": "h",
	"deg": "degC", "celsius": "degC", "Celsius": "degC", "micron": "um", "microns": "um",
	"volt": "V", "amp": "A", "ohms": "ohm", "mho": "S", "liter": "L", "litre": "L",
}

// maxSuggestRunes bounds the names suggest looks at; a longer name is not a
// mistyped unit, and the bound keeps the distance table small.
const maxSuggestRunes = 24

// suggest returns the known spelling closest to name, or "" when none is
// close. Candidates are every spelling Parse accepts, prefixes included. A
// spelling equal to name but for case wins outright ("mv" → "mV"); otherwise
// the smallest edit distance wins (after a few fixed hints such as
// "sec" → "s"), then a spelling from Names, then the
// shorter, then the first in byte order, so the answer never depends on map
// order. A name of up to three runes may be one edit away, a longer one two.
func suggest(name string) string {
	if h, ok := hints[name]; ok {
		return h
	}
	n := utf8.RuneCountInString(name)
	if n == 0 || n > maxSuggestRunes {
		return ""
	}
	limit := 1
	if n > 3 {
		limit = 2
	}
	best, bestKey := "", [3]int{limit + 1, 0, 0}
	for _, s := range spellings {
		var k [3]int
		if strings.EqualFold(s, name) {
			k = rank(s, -1) // differs only in case: ahead of any edit
		} else if d := editDistance(name, s, limit); d <= limit {
			k = rank(s, d)
		} else {
			continue
		}
		if less(k, bestKey) {
			best, bestKey = s, k
		}
	}
	return best
}

// rank orders candidates at distance d: nearer first, common names first,
// shorter first. Ties are left in byte order, as spellings is sorted.
func rank(s string, d int) [3]int {
	uncommon := 1
	if isCommon(s) {
		uncommon = 0
	}
	return [3]int{d, uncommon, len(s)}
}

func less(a, b [3]int) bool {
	for i := range a {
		if a[i] != b[i] {
			return a[i] < b[i]
		}
	}
	return false
}

// editDistance returns the optimal-string-alignment distance between a and
// b over runes (insertions, deletions, substitutions and transpositions of
// neighbours each cost one), or limit+1 as soon as it must exceed limit.
func editDistance(a, b string, limit int) int {
	var ra, rb [maxSuggestRunes + 1]rune
	na, nb := toRunes(ra[:], a), toRunes(rb[:], b)
	if na < 0 || nb < 0 {
		return limit + 1
	}
	if d := na - nb; d > limit || -d > limit {
		return limit + 1
	}
	// Three rolling rows of the dynamic-programming table, on the stack.
	var rows [3][maxSuggestRunes + 2]int
	prev2, prev, cur := &rows[0], &rows[1], &rows[2]
	for j := 0; j <= nb; j++ {
		prev[j] = j
	}
	for i := 1; i <= na; i++ {
		cur[0] = i
		rowMin := cur[0]
		for j := 1; j <= nb; j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			v := min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				v = min(v, prev2[j-2]+1)
			}
			cur[j] = v
			rowMin = min(rowMin, v)
		}
		if rowMin > limit {
			return limit + 1
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[nb]
}

// toRunes decodes s into dst and returns the count, or -1 if s does not fit.
func toRunes(dst []rune, s string) int {
	n := 0
	for _, r := range s {
		if n == len(dst) {
			return -1
		}
		dst[n] = r
		n++
	}
	return n
}
