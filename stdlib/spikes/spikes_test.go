package spikes

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// near reports whether got is within abs or rel·|want| of want; NaN matches NaN.
// It is the one tolerance helper of this package's tests.
func near(got, want, abs, rel float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	if got == want {
		return true
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

var nan = math.NaN()

// TestDetectAnalytic checks interpolated crossing times against analytic ones.
// A linear ramp v = a·t + c crosses θ at (θ − c)/a, and linear interpolation is
// exact for a line (tolerance 1e-15 s: rounding only). A sine A·sin(2πft)
// crosses A/2 upwards at t = (1/12 + k)/f (asin(1/2) = π/6); the interpolation
// error is at most dt²/8·|v”/v'| = dt²/8·2πf·tan(π/6) ≈ 4.5e-10 s for
// dt = 1e-5 s and f = 10 Hz (interpolation error bound, any numerical analysis
// handbook), so 1e-9 s is allowed.
func TestDetectAnalytic(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		n    int
		dt   float64
		v    func(t float64) float64
		th   float64
		want []float64
		tol  float64
	}{
		{"ramp", 11, 0.1, func(t float64) float64 { return 0.3*t - 0.07 }, 0.05, []float64{0.12 / 0.3}, 1e-15},
		{"sine", 30001, 1e-5, func(t float64) float64 { return 0.04 * math.Sin(2*math.Pi*10*t) }, 0.02,
			[]float64{1.0 / 120, 1.0/120 + 0.1, 1.0/120 + 0.2}, 1e-9},
	}
	for _, c := range cases {
		ts, vs := make([]float64, c.n), make([]float64, c.n)
		for i := range ts {
			ts[i] = float64(i) * c.dt
			vs[i] = c.v(ts[i])
		}
		got, err := Detect(nil, ts, vs, &DetectSettings{Threshold: c.th, Hysteresis: 0.001})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if len(got) != len(c.want) {
			t.Fatalf("%s: spikes %v, want %v", c.name, got, c.want)
		}
		for i := range got {
			if !near(got[i], c.want[i], c.tol, 0) {
				t.Errorf("%s: spike %d at %.12g s, want %.12g s", c.name, i, got[i], c.want[i])
			}
		}
	}
}

// TestDetectRearm checks the hysteresis and refractory rules on hand-made
// traces (times 0, 1, 2, … s; threshold 0 V; default hysteresis 5 mV).
func TestDetectRearm(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		v    []float64
		s    *DetectSettings
		want []float64
	}{
		// The dip to −1 mV does not re-arm (needs < −5 mV): one spike, not two.
		{"wiggle near threshold", []float64{-0.05, 0.01, -0.001, 0.01, -0.05, 0.01}, nil, []float64{0.05 / 0.06, 4 + 0.05/0.06}},
		// A trace starting above threshold is not a spike until it re-arms.
		{"starts mid-spike", []float64{0.03, 0.01, -0.05, 0.03}, nil, []float64{2 + 0.05/0.08}},
		{"exact threshold sample counts", []float64{-0.01, 0, -0.01}, nil, []float64{1}},
		{"refractory drops second", []float64{-0.05, 0.01, -0.05, 0.01, -0.05, 0.01}, &DetectSettings{Refractory: 2.5},
			[]float64{0.05 / 0.06, 4 + 0.05/0.06}},
		{"flat", []float64{-0.07, -0.07, -0.07}, nil, nil},
		{"empty trace", nil, nil, nil},
	}
	for _, c := range cases {
		ts := make([]float64, len(c.v))
		for i := range ts {
			ts[i] = float64(i)
		}
		got, err := Detect(nil, ts, c.v, c.s)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if len(got) != len(c.want) {
			t.Errorf("%s: spikes %v, want %v", c.name, got, c.want)
			continue
		}
		for i := range got {
			if !near(got[i], c.want[i], 1e-14, 0) { // rounding of one division
				t.Errorf("%s: spike %d at %v, want %v", c.name, i, got[i], c.want[i])
			}
		}
	}
}

// periodic returns n spikes at t0 + k·p.
func periodic(n int, t0, p float64) []float64 {
	s := make([]float64, n)
	for k := range s {
		s[k] = t0 + float64(k)*p
	}
	return s
}

// TestMeasures checks every measure on hand-computable trains. A periodic
// train has CV = LV = adaptation = 0 and rate 1/period (definitions, Dayan &
// Abbott 2001 ch. 1). ISIs 1, 2, 4 s give adaptation (1/3 + 1/3)/2 = 1/3 and
// LV = 3/2·(1/9 + 1/9) = 1/3 (Shinomoto et al. 2003 formula by hand); ISIs
// 1, 3 give CV = 1/2 (mean 2, population sd 1). Periodic times are rounded
// products, so 1e-12 absolute is allowed where 1/period is expected; CV, LV
// and adaptation of a periodic train must be exactly 0 (tolerance 0), also for
// times accumulated step by step as an integrator does (acc), whose ISIs
// differ by rounding. Alternating ISIs a, b (alt) have CV = |a−b|/(a+b) and
// LV = 3((a−b)/(a+b))² (both definitions by hand): a real variation of 1 µs in
// 10 ms must survive the rounding snap.
func TestMeasures(t *testing.T) {
	t.Parallel()
	per := periodic(40, 0.01, 0.025)
	geo := []float64{0, 1, 3, 7}
	acc := make([]float64, 41)
	acc[0] = 0.03074
	for i := 1; i < len(acc); i++ {
		acc[i] = acc[i-1] + 0.0239722
	}
	alt := make([]float64, 21)
	for i := 1; i < len(alt); i++ {
		alt[i] = alt[i-1] + 0.01 + 1e-6*float64(i%2)
	}
	r := 1e-6 / 0.020001
	type f func() (float64, error)
	cases := []struct {
		name string
		fn   f
		want float64
		tol  float64
	}{
		{"periodic rate in [0,1)", func() (float64, error) { return Rate(per, 0, 1) }, 40, 0},
		{"periodic steady rate", func() (float64, error) { return SteadyRate(per, 0.2, 0.8) }, 40, 1e-12},
		{"periodic first-ISI rate", func() (float64, error) { return FirstISIRate(per, 0.5) }, 40, 1e-9},
		{"periodic CV", func() (float64, error) { return CV(per) }, 0, 0},
		{"periodic LV", func() (float64, error) { return LV(per) }, 0, 0},
		{"periodic adaptation", func() (float64, error) { return AdaptationIndex(per) }, 0, 0},
		{"accumulated periodic CV", func() (float64, error) { return CV(acc) }, 0, 0},
		{"accumulated periodic LV", func() (float64, error) { return LV(acc) }, 0, 0},
		{"accumulated periodic adaptation", func() (float64, error) { return AdaptationIndex(acc) }, 0, 0},
		// Relative 1e-9: the ISIs carry rounding of about 1e-16 s on a 1e-6 s difference.
		{"alternating CV", func() (float64, error) { return CV(alt) }, r, 1e-9 * r},
		{"alternating LV", func() (float64, error) { return LV(alt) }, 3 * r * r, 1e-9 * r * r},
		{"latency", func() (float64, error) { return Latency(per, 0.1) }, 0.01 + 4*0.025 - 0.1, 1e-15},
		{"latency on a spike is 0", func() (float64, error) { return Latency(geo, 3) }, 0, 0},
		{"adaptation 1,2,4", func() (float64, error) { return AdaptationIndex(geo) }, 1.0 / 3, 1e-15},
		{"LV 1,2,4", func() (float64, error) { return LV(geo) }, 1.0 / 3, 1e-15},
		{"CV 1,3", func() (float64, error) { return CV([]float64{0, 1, 4}) }, 0.5, 1e-15},
		{"no spikes: rate 0", func() (float64, error) { return Rate(nil, 0, 1) }, 0, 0},
		{"no spikes: CV NaN", func() (float64, error) { return CV(nil) }, nan, 0},
		{"no spikes: latency NaN", func() (float64, error) { return Latency(nil, 0) }, nan, 0},
		{"one spike: CV NaN", func() (float64, error) { return CV([]float64{1}) }, nan, 0},
		{"one spike: steady rate NaN", func() (float64, error) { return SteadyRate([]float64{1}, 0, 2) }, nan, 0},
		{"two spikes: LV NaN", func() (float64, error) { return LV([]float64{1, 2}) }, nan, 0},
		{"two spikes: adaptation NaN", func() (float64, error) { return AdaptationIndex([]float64{1, 2}) }, nan, 0},
		{"one spike: first-ISI NaN", func() (float64, error) { return FirstISIRate([]float64{1}, 0) }, nan, 0},
		{"periodic Fano is 0", func() (float64, error) { return Fano(per, 0.0, 1.0, 0.1) }, 0, 0},
		{"Fano single window NaN", func() (float64, error) { return Fano(per, 0, 1, 0.6) }, nan, 0},
	}
	for _, c := range cases {
		got, err := c.fn()
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !near(got, c.want, c.tol, 0) {
			t.Errorf("%s = %v, want %v", c.name, got, c.want)
		}
	}
}

// TestBadInput checks that unsorted, repeated or non-finite spike times and
// bad windows are errors that say how to fix them, never panics.
func TestBadInput(t *testing.T) {
	t.Parallel()
	uns := []float64{0.1, 0.3, 0.2}
	cases := []struct {
		name string
		err  error
		want string
	}{
		{"unsorted CV", second(CV(uns)), "sort the times"},
		{"repeat ISIs", second2(ISIs(nil, []float64{1, 1})), "increase strictly"},
		{"NaN LV", second(LV([]float64{0, nan, 1})), "must be finite"},
		{"empty window", second(Rate([]float64{1}, 2, 2)), "start < stop"},
		{"Fano width", second(Fano([]float64{1}, 0, 2, 0)), "width must be positive"},
		{"trace lengths", second2(Detect(nil, []float64{0, 1}, []float64{0}, nil)), "2 times but 1 voltages"},
		{"trace order", second2(Detect(nil, []float64{0, 2, 1}, []float64{0, 0, 0}, nil)), "sort the trace"},
		{"negative hysteresis", second2(Detect(nil, nil, nil, &DetectSettings{Hysteresis: -1})), "hysteresis must be positive"},
		{"PSTH bins", second3(PSTH([][]float64{{1}}, PSTHSettings{Start: 0, Stop: 1, BinWidth: 0.3})), "not a whole number"},
		{"PSTH unsorted train", second3(PSTH([][]float64{{1}, uns}, PSTHSettings{Start: 0, Stop: 1, BinWidth: 0.1})), "in train 2"},
		{"PSTH no trains", second3(PSTH(nil, PSTHSettings{Start: 0, Stop: 1, BinWidth: 0.1})), "at least one"},
		{"PSTH too many bins", second3(PSTH([][]float64{{}}, PSTHSettings{Start: 0, Stop: 1e3, BinWidth: 1e-6})), "wider bins"},
	}
	for _, c := range cases {
		if c.err == nil || !strings.Contains(c.err.Error(), c.want) || !strings.HasPrefix(c.err.Error(), "spikes: ") {
			t.Errorf("%s: error %v, want one containing %q", c.name, c.err, c.want)
		}
	}
}

func second(_ float64, err error) error      { return err }
func second2(_ []float64, err error) error   { return err }
func second3(_ *PSTHResult, err error) error { return err }

// poisson returns n spike times of a homogeneous Poisson process of the given
// rate, from exponential ISIs of a seeded PCG generator.
func poisson(n int, rate float64, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 1))
	s := make([]float64, n)
	t := 0.0
	for i := range s {
		t += rng.ExpFloat64() / rate
		s[i] = t
	}
	return s
}

// TestPoisson checks CV, LV and Fano of a seeded Poisson train against their
// Poisson values of 1 (Dayan & Abbott 2001, ch. 1; Shinomoto et al. 2003).
// Tolerances are 5 standard errors from the sample size:
//   - CV over n exponential ISIs: by the delta method on sd/mean with the
//     exponential's moments (μ3 = 2μ³, μ4 = 9μ⁴) the variance is 1/n, so
//     sd = 1/sqrt(40000) = 0.005.
//   - LV: for i.i.d. exponential a, b the ratio (a−b)/(a+b) is uniform on
//     (−1, 1), so each term 3r² has variance 9/5 − 1 = 0.8; neighbouring terms
//     share one ISI, so the variance of the mean is at most 3·0.8/n, sd ≤ 0.0078.
//   - Fano: K windows with Poisson counts of mean m have var(F) ≈ (2 + 1/m)/K;
//     m = 10, K = 4000 give sd ≈ 0.023.
//
// The seed is fixed, so the outcome is deterministic; a missing square or a
// wrong factor in a formula fails clearly.
func TestPoisson(t *testing.T) {
	t.Parallel()
	const n, rate = 40001, 20.0
	s := poisson(n, rate, 99)
	cv, _ := CV(s)
	lv, _ := LV(s)
	T := math.Floor(s[n-1]/0.5) * 0.5 // whole windows only
	fano, _ := Fano(s, 0, T, 0.5)
	r, _ := Rate(s, 0, s[n-1])
	checks := []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"CV", cv, 1, 5 * 0.005},
		{"LV", lv, 1, 5 * 0.0078},
		{"Fano", fano, 1, 5 * 0.023},
		// Rate: n/T with T a sum of n exponentials has relative sd 1/sqrt(n) = 0.5%.
		{"rate", r, rate, 5 * 0.005 * rate},
	}
	for _, c := range checks {
		if !near(c.got, c.want, c.tol, 0) {
			t.Errorf("Poisson %s = %v, want %v ± %v", c.name, c.got, c.want, c.tol)
		}
	}
}

// TestInstantRate checks 1/ISI on a hand case and that inputs are unchanged.
func TestInstantRate(t *testing.T) {
	t.Parallel()
	s := []float64{0, 0.5, 0.75}
	got, err := InstantRate([]float64{nan, nan, nan}, s)
	if err != nil || len(got) != 2 || got[0] != 2 || got[1] != 4 {
		t.Fatalf("InstantRate = %v, %v; want [2 4]", got, err)
	}
	if s[0] != 0 || s[1] != 0.5 || s[2] != 0.75 {
		t.Fatal("InstantRate modified its input")
	}
}

// BenchmarkTrainMeasures measures CV, LV and the adaptation index of a
// 10,000-spike Poisson train (no allocations expected).
func BenchmarkTrainMeasures(b *testing.B) {
	s := poisson(10000, 20, 5)
	b.ReportAllocs()
	for range b.N {
		_, _ = CV(s)
		_, _ = LV(s)
		_, _ = AdaptationIndex(s)
	}
}
