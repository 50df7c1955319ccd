package tuning

import (
	"context"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
)

func responses(t testing.TB, p *Population, xs []float64, workers int) *mat.Dense {
	t.Helper()
	r := mat.NewDense(p.Len(), len(xs), nil)
	if err := p.Responses(context.Background(), r, xs, workers); err != nil {
		t.Fatal(err)
	}
	return r
}

// TestPopulationDraws checks the max-rate/intercept conversion: each neuron
// is at the rheobase (v = 1) at its intercept and at its drawn max rate at
// its preferred end, within the drawn ranges (common practice).
func TestPopulationDraws(t *testing.T) {
	t.Parallel()
	s := &PopulationSettings{MaxRateLo: 100, MaxRateHi: 200, InterceptLo: -0.5, InterceptHi: 0.5}
	p, err := NewPopulation(50, 7, s)
	if err != nil {
		t.Fatal(err)
	}
	for i := range p.Len() {
		e := p.Encoder[i]
		x0 := (1 - p.Bias[i]) / p.Gain[i] // intercept implied by gain and bias
		if x0 < -0.5 || x0 > 0.5 {
			t.Errorf("neuron %d intercept %g outside [−0.5, 0.5]", i, x0)
		}
		rmax := p.Curve(i).Rate(e)
		if rmax < 100 || rmax > 200*(1+1e-12) {
			t.Errorf("neuron %d rate at preferred end %g Hz outside [100, 200]", i, rmax)
		}
		checkClose(t, "rate at intercept", p.Curve(i).Rate(e*x0), 0, 1e-6, 0)
	}
	q, _ := NewPopulation(50, 7, s)
	for i := range p.Len() {
		if p.Gain[i] != q.Gain[i] || p.Bias[i] != q.Bias[i] || p.Encoder[i] != q.Encoder[i] {
			t.Fatalf("same seed gave a different neuron %d", i)
		}
	}
	r, _ := NewPopulation(50, 8, s)
	if r.Gain[0] == p.Gain[0] {
		t.Error("different seeds gave the same first gain")
	}
	// GainBias at a max rate of 63.04 Hz and intercept 0: v_max = 2
	// (the common-practice value of TestLIFRateValues), so gain 1, bias 1.
	g, b, err := GainBias(LIFRate(2, tauRef, tauM), 0, tauRef, tauM)
	if err != nil {
		t.Fatal(err)
	}
	checkClose(t, "gain for v_max = 2", g, 1, 0, 1e-12)
	checkClose(t, "bias for v_max = 2", b, 1, 0, 1e-12)
}

func TestPopulationErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		err  error
	}{
		{"no neurons", func() error { _, err := NewPopulation(0, 1, nil); return err }()},
		{"max rate above 1/τ_ref", func() error {
			_, err := NewPopulation(3, 1, &PopulationSettings{MaxRateLo: 100, MaxRateHi: 600})
			return err
		}()},
		{"intercept at 1", func() error {
			_, err := NewPopulation(3, 1, &PopulationSettings{InterceptLo: 1, InterceptHi: 1})
			return err
		}()},
		{"bad encoder", func() error {
			_, err := PopulationFromVectors(tauRef, tauM, []float64{1}, []float64{1}, []float64{0.5})
			return err
		}()},
		{"length mismatch", func() error {
			_, err := PopulationFromVectors(tauRef, tauM, []float64{1, 2}, []float64{1}, []float64{1})
			return err
		}()},
	}
	for _, c := range cases {
		if c.err == nil {
			t.Errorf("%s: want an error", c.name)
		}
	}
}

// TestResponsesIndependentOfWorkers checks that 1, 2 and 7 workers give
// bit-identical matrices equal to the per-neuron curves.
func TestResponsesIndependentOfWorkers(t *testing.T) {
	t.Parallel()
	p, err := NewPopulation(40, 3, nil)
	if err != nil {
		t.Fatal(err)
	}
	xs, _ := Span(-1, 1, 33)
	ref := responses(t, p, xs, 1)
	for _, w := range []int{2, 7, 0} {
		got := responses(t, p, xs, w)
		if !mat.Equal(got, ref) {
			t.Errorf("%d workers gave a different response matrix", w)
		}
	}
	for i := range p.Len() {
		for j, x := range xs {
			checkClose(t, "response", ref.At(i, j), p.Curve(i).Rate(x), 0, 0)
		}
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if err := p.Responses(ctx, mat.NewDense(p.Len(), len(xs), nil), xs, 2); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled Responses returned %v, want context.Canceled", err)
	}
}

// readoutError decodes target(x) from n neurons at relative noise sigma
// and returns the RMS error on noisy responses, averaged over 4 seeds of
// both the population and the noise.
func readoutError(t *testing.T, n int, sigma float64, target func(float64) float64) float64 {
	t.Helper()
	xs, _ := Span(-1, 1, 201)
	y := make([]float64, len(xs))
	for j, x := range xs {
		y[j] = target(x)
	}
	sum := 0.0
	for seed := uint64(1); seed <= 4; seed++ {
		p, err := NewPopulation(n, seed, nil)
		if err != nil {
			t.Fatal(err)
		}
		prob := ReadoutProblem{Responses: responses(t, p, xs, 0), Target: y}
		ro, err := Decode(prob, &ReadoutSettings{Noise: sigma})
		if err != nil {
			t.Fatal(err)
		}
		e, err := ro.NoisyRMSE(prob, sigma, 100+seed)
		if err != nil {
			t.Fatal(err)
		}
		sum += e
	}
	return sum / 4
}

// TestReadoutTrends reports readout error against noise level and
// population size. Expected trends (common practice, from memory): the
// error of a ridge readout from noisy LIF responses grows with the noise
// and falls roughly like 1/√N with the number of neurons.
func TestReadoutTrends(t *testing.T) {
	t.Parallel()
	id := func(x float64) float64 { return x }
	sq := func(x float64) float64 { return x * x }
	prev := 0.0
	for _, sigma := range []float64{0.01, 0.03, 0.1, 0.3} {
		e := readoutError(t, 50, sigma, id)
		t.Logf("N = 50, noise %.2f: RMS error of x %.4f", sigma, e)
		if !(e > prev) {
			t.Errorf("error %g at noise %g did not grow from %g", e, sigma, prev)
		}
		prev = e
	}
	prev = math.Inf(1)
	for _, n := range []int{10, 40, 160} {
		e := readoutError(t, n, 0.1, sq)
		t.Logf("noise 0.1, N = %d: RMS error of x² %.4f", n, e)
		if !(e < prev) {
			t.Errorf("error %g with %d neurons did not shrink from %g", e, n, prev)
		}
		prev = e
	}
}

func TestDecodeErrors(t *testing.T) {
	t.Parallel()
	r := mat.NewDense(2, 3, []float64{1, 2, 3, 4, 5, 6})
	cases := []struct {
		name string
		p    ReadoutProblem
		s    *ReadoutSettings
	}{
		{"target length", ReadoutProblem{r, []float64{1, 2}}, nil},
		{"NaN target", ReadoutProblem{r, []float64{1, math.NaN(), 3}}, nil},
		{"negative noise", ReadoutProblem{r, []float64{1, 2, 3}}, &ReadoutSettings{Noise: -1}},
		{"all-zero responses", ReadoutProblem{mat.NewDense(2, 3, nil), []float64{1, 2, 3}}, nil},
	}
	for _, c := range cases {
		if _, err := Decode(c.p, c.s); err == nil {
			t.Errorf("%s: want an error", c.name)
		}
	}
}
