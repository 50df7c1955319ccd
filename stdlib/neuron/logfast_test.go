package neuron

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestLogFastValues checks logFast at points whose logarithms are known.
func TestLogFastValues(t *testing.T) {
	cases := []struct {
		name string
		x    float64
		want float64
	}{
		{"one", 1, 0},                            // exact
		{"two", 2, math.Ln2},                     // ln 2 = 0.693147180559945309… (common practice)
		{"ten", 10, math.Ln10},                   // ln 10 = 2.302585092994045684… (common practice)
		{"e", math.E, 1},                         // exact up to the rounding of e
		{"half", 0.5, -math.Ln2},                 // −ln 2 (common practice)
		{"2^-1000", 0x1p-1000, -1000 * math.Ln2}, // −1000 ln 2 = −693.147180559945… (common practice)
		{"just above one", 1 + 0x1p-20, 0x1p-20 - 0x1p-41 + 0x1p-60/3 - 0x1p-80/4}, // ln(1+u) = u − u²/2 + u³/3 − …, Taylor series (common practice)
	}
	for _, c := range cases {
		// Two ulps: one for logFast (see TestLogFastAgainstMath), one for the
		// rounding of x or of the reference constant; zero needs the absolute part.
		checkNear(t, c.name, logFast(c.x), c.want, 1e-300, 4.5e-16)
	}
}

// TestLogFastAgainstMath compares logFast with Go's math.Log (the Go math package,
// whose error is below one ulp by its fdlibm origin) over dense seeded sweeps: the
// ratios the crossing times take (just above 1), the neighbourhood of 1 on both
// sides, every table subinterval of one octave, and the full normal range.
func TestLogFastAgainstMath(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	ranges := []struct {
		name   string
		lo, hi float64 // log-uniform when log is set, else uniform
		log    bool
	}{
		{"crossing ratios", 1, 1.02, false},
		{"around one", 0.9, 1.1, false},
		{"one octave", 0.70703125, 1.4140625, false},
		{"full normal range", 0x1p-1022, math.MaxFloat64, true},
	}
	for _, r := range ranges {
		worst, at := 0.0, 0.0
		for i := 0; i < 200000; i++ {
			x := r.lo + (r.hi-r.lo)*rng.Float64()
			if r.log {
				x = math.Exp(math.Log(r.lo) + (math.Log(r.hi)-math.Log(r.lo))*rng.Float64())
			}
			if u := ulpDiff(logFast(x), math.Log(x)); u > worst {
				worst, at = u, x
			}
		}
		// Within one ulp of math.Log: both round a value known to well under an
		// ulp, so they may land on neighbouring doubles but no further apart.
		if worst > 1 {
			t.Errorf("%s: logFast differs from math.Log by %.0f ulp at %v, want ≤ 1", r.name, worst, at)
		}
	}
}

// TestLogFastSpecial checks that the arguments outside the fast path give exactly
// what math.Log gives.
func TestLogFastSpecial(t *testing.T) {
	for _, x := range []float64{0, math.Copysign(0, -1), -1, 0x1p-1074, 0x1p-1030, math.Inf(1), math.Inf(-1), math.MaxFloat64} {
		got, want := logFast(x), math.Log(x)
		if got != want && !(math.IsNaN(got) && math.IsNaN(want)) {
			t.Errorf("logFast(%g) = %g, want math.Log's %g", x, got, want)
		}
	}
	if !math.IsNaN(logFast(math.NaN())) {
		t.Error("logFast(NaN) is not NaN")
	}
}

// ulpDiff returns |got − want| in units of the last place of want.
func ulpDiff(got, want float64) float64 {
	a := math.Abs(want)
	return math.Abs(got-want) / (math.Nextafter(a, math.Inf(1)) - a)
}
