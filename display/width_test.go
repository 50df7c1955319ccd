package display

import (
	"strings"
	"testing"
)

// TestTextWidth checks console widths. Reference: Python 3.11's
// unicodedata (Unicode 15.0): U+0304 and U+0301 have category Mn (combining
// class 230), U+200B is Cf, 日 and 本 have East_Asian_Width W (UAX #11).
func TestTextWidth(t *testing.T) {
	t.Parallel()
	cases := []struct {
		s    string
		want int
	}{
		{"tau_m", 5},
		{"τ_m", 3},            // U+03C4 is one column (width A, narrow in a Western console)
		{"g\u0304_Na", 4},     // ḡ as g + combining macron
		{"\u1e21_Na", 4},      // ḡ precomposed (NFC)
		{"e\u0301t\u00e9", 3}, // é decomposed and precomposed
		{"a\u200bb", 2},       // zero width space
		{"日本", 4},             // two wide ideographs
		{"", 0},
	}
	for _, c := range cases {
		if got := textWidth(c.s); got != c.want {
			t.Errorf("textWidth(%q) = %d, want %d", c.s, got, c.want)
		}
	}
}

// TestCardCombiningAlignment checks that a card whose symbols carry a
// combining mark (the conductance bar of ḡ_Na, written by latexText as g and
// U+0304) keeps its columns aligned: the expected rows are written out with
// the padding a console needs, the mark taking no column.
func TestCardCombiningAlignment(t *testing.T) {
	t.Parallel()
	c := &Card{Title: "Invented conductance model", Params: []Param{
		{Name: "g_Na", Symbol: `\bar{g}_{Na}`, Value: 120, Unit: "mS/cm^2", Note: "invented"},
		{Name: "g_K", Symbol: `\bar{g}_{K}`, Value: 36, Unit: "mS/cm^2", Note: "invented"},
		{Name: "C", Symbol: "C_m", Value: 1, Unit: "µF/cm^2", Note: "invented"},
	}}
	txt, err := c.Text()
	if err != nil {
		t.Fatal(err)
	}
	want := []string{
		"parameter  symbol  value  unit     note",
		"g_Na       g\u0304_Na    120    mS/cm^2  invented",
		"g_K        g\u0304_K     36     mS/cm^2  invented",
		"C          C_m     1      µF/cm^2  invented",
	}
	for _, w := range want {
		if !strings.Contains(txt, w+"\n") && !strings.HasSuffix(txt, w) {
			t.Errorf("card text lacks the aligned row %q:\n%s", w, txt)
		}
	}
}
