package neuron

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestExpFastValues checks expFast at points whose exponentials are known.
func TestExpFastValues(t *testing.T) {
	cases := []struct {
		name string
		x    float64
		want float64
	}{
		{"zero", 0, 1},                         // exact
		{"one", 1, math.E},                     // e, the double nearest 2.718281828459045… (common practice)
		{"minus one", -1, 0.36787944117144233}, // 1/e (common practice)
		{"ln 2", math.Ln2, 2},                  // exact up to the rounding of ln 2
		{"minus 10 ln 2", -10 * math.Ln2, 1.0 / 1024},
		{"ten", 10, 22026.465794806718},            // e^10 = 22026.4657948067… (from memory)
		{"minus a half", -0.5, 0.6065306597126334}, // 1/√e = 0.60653065971263342… (common practice)
	}
	for _, c := range cases {
		// Two units in the last place: expFast is within one (see
		// TestExpFastAgainstMath); the second covers the rounding of x itself.
		checkNear(t, c.name, expFast(c.x), c.want, 0, 4.5e-16)
	}
}

// TestExpFastAgainstMath compares expFast with Go's math.Exp (whose own error is
// below one ulp, per its documentation) on the ranges the HH steps use and on the
// full range down to the fallback.
func TestExpFastAgainstMath(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	ranges := []struct {
		name   string
		lo, hi float64
	}{
		{"gate and voltage decays", -2, 0},
		{"rate exponentials", -15, 15},
		{"full", -699, 699},
	}
	for _, r := range ranges {
		worst := 0.0
		for i := 0; i < 100000; i++ {
			x := r.lo + (r.hi-r.lo)*rng.Float64()
			want := math.Exp(x)
			ulp := math.Nextafter(want, math.Inf(1)) - want
			worst = math.Max(worst, math.Abs(expFast(x)-want)/ulp)
		}
		// One ulp each for expFast and math.Exp, so the two differ by at most two.
		if worst > 2 {
			t.Errorf("%s: expFast differs from math.Exp by %.2f ulp, want ≤ 2", r.name, worst)
		}
	}
	for _, x := range []float64{-800, 800, math.Inf(-1), math.Inf(1)} {
		if got, want := expFast(x), math.Exp(x); got != want {
			t.Errorf("expFast(%g) = %g, want math.Exp's %g", x, got, want)
		}
	}
	if !math.IsNaN(expFast(math.NaN())) {
		t.Error("expFast(NaN) is not NaN")
	}
}
