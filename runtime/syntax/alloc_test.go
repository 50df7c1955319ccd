package syntax

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// TestFastFloat checks the exact fast path of number conversion against
// strconv.ParseFloat (the Go standard library's correctly rounded
// conversion, IEEE 754 round-to-nearest): every text it accepts must give
// the same bits, so the tolerance is zero; texts outside its range must
// be refused, not approximated.
func TestFastFloat(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name, text string
		accept     bool
	}{
		{"integer", "20", true},
		{"decimal", "1.5", true},
		{"leading dot", ".5", true},
		{"trailing dot", "5.", true},
		{"negative exponent", "2.5e-3", true},
		{"plus exponent", "1E+22", true},
		{"tenth", "0.1", true},                      // 0.1 is inexact: one division rounds it
		{"fifteen digits", "123456789012345", true}, // < 2^53, exact
		{"sixteen digits", "1234567890123456", false},
		{"exponent too large", "1e23", false},
		{"exponent too small", "1e-23", false},
		{"long exponent", "1e0001", false},
		{"empty exponent", "1e", false},
		{"zero", "0", true},
		{"not a number", "x", false},
	}
	for _, tc := range cases {
		v, ok := fastFloat(tc.text)
		if ok != tc.accept {
			t.Errorf("%s: fastFloat(%q) accepted = %v, want %v", tc.name, tc.text, ok, tc.accept)
			continue
		}
		if ok {
			checkSameFloat(t, tc.text, v)
		}
	}
	// Seeded random decimals of the shapes the scanner produces.
	r := rand.New(rand.NewPCG(1990, 0))
	for range 100000 {
		text := strconv.FormatUint(r.Uint64N(1e8), 10)
		if r.IntN(2) == 0 {
			text += "." + strconv.FormatUint(r.Uint64N(1e7), 10)
		}
		if r.IntN(2) == 0 {
			text += "e" + strconv.Itoa(r.IntN(61)-30)
		}
		if v, ok := fastFloat(text); ok {
			checkSameFloat(t, text, v)
		}
	}
}

// checkSameFloat compares v with strconv.ParseFloat(text) bit for bit.
func checkSameFloat(t *testing.T, text string, v float64) {
	t.Helper()
	want, err := strconv.ParseFloat(text, 64)
	if err != nil || math.Float64bits(v) != math.Float64bits(want) {
		t.Errorf("fastFloat(%q) = %v, strconv.ParseFloat = %v (%v)", text, v, want, err)
	}
}

// TestSlabChunks checks that a slab hands out distinct zeroed nodes across
// chunk boundaries.
func TestSlabChunks(t *testing.T) {
	t.Parallel()
	var s slab[NumberLit]
	seen := map[*NumberLit]bool{}
	for i := range 1000 {
		x := s.new()
		if seen[x] || x.Raw != "" || x.Value != 0 {
			t.Fatalf("node %d reused or not zeroed: %+v", i, *x)
		}
		seen[x] = true
		x.Value = float64(i)
	}
}
