package tuning

import (
	"math"
	"strings"
	"testing"
)

const ulp = 0x1p-52

// within reports whether got is within abs or rel·|want| of want (whichever
// is larger); NaN matches only NaN and infinities only themselves.
func within(got, want, abs, rel float64) bool {
	if math.IsNaN(want) || math.IsNaN(got) {
		return math.IsNaN(want) && math.IsNaN(got)
	}
	if math.IsInf(want, 0) || math.IsInf(got, 0) {
		return got == want
	}
	return math.Abs(got-want) <= math.Max(abs, rel*math.Abs(want))
}

func checkClose(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !within(got, want, abs, rel) {
		t.Errorf("%s = %.17g, want %.17g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}

const tauRef, tauM = 0.002, 0.02 // s; common practice

// TestLIFRateValues checks the closed form (Dayan & Abbott 2001, ch. 5,
// from memory) at points with known values.
func TestLIFRateValues(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name     string
		v, want  float64
		abs, rel float64
	}{
		// Common practice: τ_ref = 2 ms, τ_m = 20 ms gives about 63 Hz at
		// v = 2; exactly 1/(0.002 + 0.02 ln 2) = 63.0401… Hz. Tolerance:
		// a few roundings, 8 ulps.
		{"v = 2, about 63 Hz", 2, 1 / (0.002 + 0.02*math.Ln2), 0, 8 * ulp},
		{"v = 2 is near 63 Hz (common practice)", 2, 63, 0.1, 0},
		// The rate tends to 1/τ_ref = 500 Hz (common practice); at v = 1e12
		// the correction τ_m/v is 2e-14 s, i.e. 2.5e-9 Hz.
		{"v = Inf gives 1/τ_ref", math.Inf(1), 500, 0, 0},
		{"v = 1e12 near 500 Hz", 1e12, 500, 1e-8, 0},
		{"v = 1e300 is 500 Hz", 1e300, 500, 0, ulp},
		{"v = 1 gives 0", 1, 0, 0, 0},
		{"v = 0.5 gives 0", 0.5, 0, 0, 0},
		{"v = −Inf gives 0", math.Inf(-1), 0, 0, 0},
		{"NaN gives NaN", math.NaN(), math.NaN(), 0, 0},
	}
	for _, c := range cases {
		checkClose(t, c.name, LIFRate(c.v, tauRef, tauM), c.want, c.abs, c.rel)
	}
}

// TestLIFRateNearOne checks the limit from above at v = 1 and the precision
// there: with ε = v − 1 (exact in float64 for these v), the rate is
// 1/(τ_ref + τ_m ln((1+ε)/ε)) (algebra on the closed form), which the
// naive 1 − 1/v would get wrong by up to 10 % at ε = 1e-15.
func TestLIFRateNearOne(t *testing.T) {
	t.Parallel()
	prev := math.Inf(1)
	for k := 1; k <= 15; k++ {
		v := 1 + math.Pow(10, -float64(k))
		eps := v - 1
		want := 1 / (tauRef + tauM*(math.Log1p(eps)-math.Log(eps)))
		// A handful of roundings in each expression: 16 ulps.
		checkClose(t, "rate just above 1", LIFRate(v, tauRef, tauM), want, 0, 16*ulp)
		r := LIFRate(v, tauRef, tauM)
		if !(r < prev) {
			t.Errorf("rate at 1+1e-%d = %g did not fall below %g", k, r, prev)
		}
		prev = r
	}
	// The limit is 0 but approached like 1/(τ_m ln(1/ε)): at the smallest
	// v above 1 (ε = 2.2e-16) it is still 1.38 Hz, and the bound
	// 1/(τ_m ln(1/ε)) → 0 as ε → 0.
	r := LIFRate(math.Nextafter(1, 2), tauRef, tauM)
	if bound := 1 / (tauM * math.Log(1/ulp)); !(r > 0 && r <= bound) {
		t.Errorf("rate at nextafter(1) = %g, want in (0, %g]", r, bound)
	}
}

// TestLIFRateDeriv compares the analytic slope with central differences,
// h = 1e-6·v: truncation h²r”'/6 and rounding ulp·r/h are both below
// 1e-6 relative for v ≥ 1.01 (where r”' stays moderate), so 1e-6 rel.
func TestLIFRateDeriv(t *testing.T) {
	t.Parallel()
	for _, v := range []float64{1.01, 1.1, 1.5, 1.99, 2, 2.01, 3, 10, 100, 1e4} {
		h := 1e-6 * v
		fd := (LIFRate(v+h, tauRef, tauM) - LIFRate(v-h, tauRef, tauM)) / (2 * h)
		checkClose(t, "dr/dv", LIFRateDeriv(v, tauRef, tauM), fd, 0, 1e-6)
	}
	checkClose(t, "dr/dv at 1", LIFRateDeriv(1, tauRef, tauM), 0, 0, 0)
	checkClose(t, "dr/dv at Inf", LIFRateDeriv(math.Inf(1), tauRef, tauM), 0, 0, 0)
	checkClose(t, "dr/dv at 1e300", LIFRateDeriv(1e300, tauRef, tauM), 0, 0, 0)
}

// TestLIFInverseRoundTrip checks LIFRate(LIFInverse(r)) = r.
func TestLIFInverseRoundTrip(t *testing.T) {
	t.Parallel()
	for _, r := range []float64{10, 63, 200, 400, 499} {
		v, err := LIFInverse(r, tauRef, tauM)
		if err != nil {
			t.Fatal(err)
		}
		// Rates near 1/τ_ref are ill-conditioned in v (dr/dv ≈ 0), and
		// below ~10 Hz v − 1 < 1e-2 carries the rounding of v itself, so
		// allow 1e-9 relative rather than ulps over 10..499 Hz.
		checkClose(t, "rate(inverse(r))", LIFRate(v, tauRef, tauM), r, 0, 1e-9)
	}
	for _, r := range []float64{0, -1, 0.5, 500, 600, math.NaN()} {
		if _, err := LIFInverse(r, tauRef, tauM); err == nil || !strings.HasPrefix(err.Error(), "tuning: ") {
			t.Errorf("LIFInverse(%g) error = %v, want a tuning: error", r, err)
		}
	}
}

// TestPhysicalUnits checks the rheobase (V_th − E_L)/R and a curve of
// current in amperes: with V_th − E_L = 15 mV and R = 100 MΩ, I_th = 150 pA
// (Ohm's law), and I = 2 I_th gives the 63 Hz of v = 2.
func TestPhysicalUnits(t *testing.T) {
	t.Parallel()
	ith, err := Rheobase(-0.055, -0.070, 1e8)
	if err != nil {
		t.Fatal(err)
	}
	checkClose(t, "rheobase", ith, 150e-12, 0, 4*ulp)
	c, err := NewLIFCurve(tauRef, tauM, -0.055, -0.070, 1e8)
	if err != nil {
		t.Fatal(err)
	}
	checkClose(t, "rate at 2 I_th", c.Rate(2*ith), LIFRate(2, tauRef, tauM), 0, 8*ulp)
	checkClose(t, "rate at I_th", c.Rate(ith*(1-1e-12)), 0, 0, 0)
	checkClose(t, "max rate", c.MaxRate(), 500, 0, 0)
	h := 1e-6 * ith
	fd := (c.Rate(3*ith+h) - c.Rate(3*ith-h)) / (2 * h)
	checkClose(t, "slope in Hz/A", c.Slope(3*ith), fd, 0, 1e-6)
	bad := []func() error{
		func() error { _, err := Rheobase(-0.07, -0.055, 1e8); return err },
		func() error { _, err := Rheobase(-0.055, -0.07, 0); return err },
		func() error { _, err := NewLIFCurve(-1, tauM, -0.055, -0.07, 1e8); return err },
		func() error { _, err := NewLIFCurve(tauRef, 0, -0.055, -0.07, 1e8); return err },
	}
	for i, f := range bad {
		if err := f(); err == nil || !strings.HasPrefix(err.Error(), "tuning: ") {
			t.Errorf("bad case %d: error %v, want a tuning: error", i, err)
		}
	}
}
