package tuning

import (
	"math"
	"strings"
	"testing"
)

// logistic is a stand-in Activation for the rate-curve tests; any type
// with an Eval method satisfies Activation.
type logistic struct{}

func (logistic) Eval(z float64) float64 { return 1 / (1 + math.Exp(-z)) }

func TestCurvesEvaluateAndExposeParams(t *testing.T) {
	t.Parallel()
	rc := RateCurve{Act: logistic{}, Gain: 2, Bias: -1, Scale: 100, InputUnit: "nA"}
	// 100·σ(2·0.5 − 1) = 100·σ(0) = 50 Hz exactly (σ(0) = 1/2).
	checkClose(t, "rate curve at midpoint", rc.Rate(0.5), 50, 0, 0)
	ps := rc.Params()
	if len(ps) != 3 || ps[0].Name != "gain" || ps[0].Unit != "1/nA" || ps[2].Unit != "Hz" {
		t.Errorf("rate curve params = %+v", ps)
	}
	c2, err := rc.WithParams([]float64{4, -2, 10})
	if err != nil {
		t.Fatal(err)
	}
	checkClose(t, "changed copy", c2.Rate(0.5), 5, 0, 0)
	checkClose(t, "original unchanged", rc.Rate(0.5), 50, 0, 0)

	lc := LIFCurve{TauRef: tauRef, TauM: tauM, Gain: 1, Bias: 1}
	checkClose(t, "LIF curve at x = 1 (v = 2)", lc.Rate(1), LIFRate(2, tauRef, tauM), 0, 0)
	if _, err := lc.WithParams([]float64{-1, tauM, 1, 0}); err == nil {
		t.Error("LIF WithParams with τ_ref < 0: want an error")
	}
	if _, err := lc.WithParams([]float64{1, 2}); err == nil || !strings.HasPrefix(err.Error(), "tuning: ") {
		t.Errorf("WithParams with 2 values: error %v", err)
	}

	xs, err := Span(-1, 3, 5)
	if err != nil {
		t.Fatal(err)
	}
	dst := []float64{math.NaN(), math.NaN(), math.NaN(), math.NaN(), math.NaN()}
	Tabulate(dst, lc, xs)
	for i, x := range xs {
		checkClose(t, "tabulated", dst[i], lc.Rate(x), 0, 0)
	}
	checkClose(t, "span end", xs[4], 3, 0, 0)
	if _, err := Span(1, 1, 3); err == nil {
		t.Error("Span(1, 1): want an error")
	}
	if _, err := Span(0, 1, 1); err == nil {
		t.Error("Span with 1 point: want an error")
	}
}

// TestSampledInterpolation checks linear interpolation through invented
// demo points (not measurements): exact at the nodes, linear between,
// held outside.
func TestSampledInterpolation(t *testing.T) {
	t.Parallel()
	x := []float64{0, 1, 2, 4}       // nA, invented
	rate := []float64{0, 10, 30, 50} // Hz, invented
	se := []float64{0.5, 1, 2, 2}    // Hz, invented
	s, err := NewSampled(x, rate, se)
	if err != nil {
		t.Fatal(err)
	}
	x[1] = 99 // the curve keeps its own copy
	cases := []struct{ x, rate, se float64 }{
		{-5, 0, 0.5}, {0, 0, 0.5}, {0.5, 5, 0.75}, {1, 10, 1}, {1.25, 15, 1.25},
		{3, 40, 2}, {4, 50, 2}, {10, 50, 2}, {math.NaN(), math.NaN(), math.NaN()},
	}
	for _, c := range cases {
		// Linear interpolation of small integers: one or two roundings.
		checkClose(t, "sampled rate", s.Rate(c.x), c.rate, 0, 2*ulp)
		checkClose(t, "sampled SE", s.SE(c.x), c.se, 0, 2*ulp)
	}
	if len(s.Params()) != 0 {
		t.Error("sampled curve should have no parameters")
	}
	bad := []struct {
		x, r, se []float64
		want     string
	}{
		{[]float64{0}, []float64{1}, nil, "≥ 2 points"},
		{[]float64{0, 0}, []float64{1, 2}, nil, "strictly increasing"},
		{[]float64{0, 1}, []float64{1, math.NaN()}, nil, "finite"},
		{[]float64{0, 1}, []float64{1, 2}, []float64{-1, 0}, "≥ 0"},
	}
	for _, b := range bad {
		if _, err := NewSampled(b.x, b.r, b.se); err == nil || !strings.Contains(err.Error(), b.want) {
			t.Errorf("NewSampled(%v, %v, %v) error %v, want %q", b.x, b.r, b.se, err, b.want)
		}
	}
}
