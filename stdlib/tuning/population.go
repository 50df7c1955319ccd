package tuning

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"sync"

	"gonum.org/v1/gonum/mat"
)

// Population is a set of N LIF tuning curves over a normalised input
// x ∈ [−1, 1]: neuron i fires LIFRate(Gain[i]·Encoder[i]·x + Bias[i],
// TauRef, TauM), with Encoder[i] = ±1 its preferred direction. The slices
// have equal length N; use NewPopulation or PopulationFromVectors, which
// check them.
type Population struct {
	TauRef, TauM        float64
	Gain, Bias, Encoder []float64
}

// PopulationSettings states the distributions NewPopulation draws from. A
// nil *PopulationSettings or a zero field means the default.
type PopulationSettings struct {
	// TauRef and TauM are in seconds; defaults 0.002 and 0.02 (common
	// practice).
	TauRef, TauM float64
	// MaxRateLo and MaxRateHi bound the uniform distribution of each
	// neuron's rate at its preferred end x = Encoder (Hz); default
	// [200, 400] Hz (common practice, from memory). Both must be below
	// 1/TauRef.
	MaxRateLo, MaxRateHi float64
	// InterceptLo and InterceptHi bound the uniform distribution of the
	// intercept, the value of Encoder·x at which the neuron starts firing;
	// default [−0.95, 0.95]. Intercepts must be below 1 (an intercept at 1
	// would need an infinite gain); the default keeps 5 % of the span.
	InterceptLo, InterceptHi float64
	// PositiveOnly, if true, gives every neuron Encoder = +1; by default
	// each encoder is ±1 with probability 1/2, so that even functions of x
	// can be read out.
	PositiveOnly bool
}

func (s *PopulationSettings) withDefaults() PopulationSettings {
	var d PopulationSettings
	if s != nil {
		d = *s
	}
	def := func(v *float64, x float64) {
		if *v == 0 {
			*v = x
		}
	}
	def(&d.TauRef, 0.002)
	def(&d.TauM, 0.02)
	if d.MaxRateLo == 0 && d.MaxRateHi == 0 {
		d.MaxRateLo, d.MaxRateHi = 200, 400
	}
	if d.InterceptLo == 0 && d.InterceptHi == 0 {
		d.InterceptLo, d.InterceptHi = -0.95, 0.95
	}
	return d
}

// GainBias converts a neuron's maximum rate (Hz, at Encoder·x = 1) and
// intercept x0 < 1 (where it starts firing) into gain and bias:
//
//	v_max = LIFInverse(maxRate) = 1/(1 − exp((τ_ref − 1/maxRate)/τ_m)),
//	gain  = (v_max − 1)/(1 − x0),   bias = 1 − gain·x0,
//
// so that gain·x0 + bias = 1 (the rheobase) and gain + bias = v_max
// (common practice).
func GainBias(maxRate, intercept, tauRef, tauM float64) (gain, bias float64, err error) {
	if !(intercept < 1) || math.IsInf(intercept, -1) {
		return 0, 0, fmt.Errorf("tuning: intercept must be finite and below 1, got %g; use e.g. a value in [−0.95, 0.95]", intercept)
	}
	vmax, err := LIFInverse(maxRate, tauRef, tauM)
	if err != nil {
		return 0, 0, err
	}
	gain = (vmax - 1) / (1 - intercept)
	return gain, 1 - gain*intercept, nil
}

// NewPopulation draws n neurons from the distributions in s (nil means
// defaults) with a PCG generator seeded by seed; the same seed gives the
// same population everywhere. Per neuron it draws, in order, the maximum
// rate, the intercept and (unless PositiveOnly) the encoder sign.
func NewPopulation(n int, seed uint64, s *PopulationSettings) (*Population, error) {
	d := s.withDefaults()
	if err := checkTaus(d.TauRef, d.TauM); err != nil {
		return nil, err
	}
	if n < 1 {
		return nil, fmt.Errorf("tuning: a population needs at least 1 neuron, got %d", n)
	}
	if !(d.MaxRateLo > 0 && d.MaxRateLo <= d.MaxRateHi) || !(d.InterceptLo <= d.InterceptHi) {
		return nil, fmt.Errorf("tuning: need 0 < max-rate low ≤ high and intercept low ≤ high, got [%g, %g] Hz and [%g, %g]",
			d.MaxRateLo, d.MaxRateHi, d.InterceptLo, d.InterceptHi)
	}
	rng := rand.New(rand.NewPCG(seed, 0x6c6f6c69676f)) // second word fixed: "loligo"
	p := &Population{TauRef: d.TauRef, TauM: d.TauM,
		Gain: make([]float64, n), Bias: make([]float64, n), Encoder: make([]float64, n)}
	for i := range n {
		r := d.MaxRateLo + (d.MaxRateHi-d.MaxRateLo)*rng.Float64()
		x0 := d.InterceptLo + (d.InterceptHi-d.InterceptLo)*rng.Float64()
		g, b, err := GainBias(r, x0, d.TauRef, d.TauM)
		if err != nil {
			return nil, err
		}
		p.Gain[i], p.Bias[i], p.Encoder[i] = g, b, 1
		if !d.PositiveOnly && rng.IntN(2) == 0 {
			p.Encoder[i] = -1
		}
	}
	return p, nil
}

// PopulationFromVectors returns a population with the given parameters; the
// slices are copied. Encoders must be ±1, gains and biases finite, lengths
// equal and non-zero.
func PopulationFromVectors(tauRef, tauM float64, gain, bias, encoder []float64) (*Population, error) {
	if err := checkTaus(tauRef, tauM); err != nil {
		return nil, err
	}
	if len(gain) == 0 || len(bias) != len(gain) || len(encoder) != len(gain) {
		return nil, fmt.Errorf("tuning: gains, biases and encoders need the same non-zero length, got %d, %d, %d", len(gain), len(bias), len(encoder))
	}
	for i := range gain {
		if math.IsNaN(gain[i]) || math.IsInf(gain[i], 0) || math.IsNaN(bias[i]) || math.IsInf(bias[i], 0) {
			return nil, fmt.Errorf("tuning: neuron %d has gain %g, bias %g; both must be finite", i, gain[i], bias[i])
		}
		if encoder[i] != 1 && encoder[i] != -1 {
			return nil, fmt.Errorf("tuning: neuron %d has encoder %g; encoders must be +1 or −1", i, encoder[i])
		}
	}
	return &Population{TauRef: tauRef, TauM: tauM, Gain: clone(gain), Bias: clone(bias), Encoder: clone(encoder)}, nil
}

// Len returns the number of neurons.
func (p *Population) Len() int { return len(p.Gain) }

// Curve returns neuron i's tuning curve as a LIFCurve of x.
func (p *Population) Curve(i int) LIFCurve {
	return LIFCurve{TauRef: p.TauRef, TauM: p.TauM, Gain: p.Gain[i] * p.Encoder[i], Bias: p.Bias[i]}
}

// Responses sets dst (N × M) to the rates in Hz of the N neurons at the M
// inputs xs, using up to workers goroutines (0 means GOMAXPROCS). Each row
// is computed by one goroutine in the same order, so the result does not
// depend on workers. It checks ctx before each row and returns ctx.Err() if
// cancelled (dst is then partly written). It panics if dst is not N × M.
func (p *Population) Responses(ctx context.Context, dst *mat.Dense, xs []float64, workers int) error {
	if r, c := dst.Dims(); r != p.Len() || c != len(xs) {
		panic(fmt.Sprintf("tuning: dst is %d × %d, want %d × %d", r, c, p.Len(), len(xs)))
	}
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, p.Len())
	rows := make(chan int)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range rows {
				p.fillRow(dst.RawRowView(i), i, xs)
			}
		}()
	}
	var err error
feed:
	for i := range p.Len() {
		select {
		case <-ctx.Done():
			err = ctx.Err()
			break feed
		case rows <- i:
		}
	}
	close(rows)
	wg.Wait()
	return err
}

// fillRow is the allocation-free inner loop for neuron i.
func (p *Population) fillRow(row []float64, i int, xs []float64) {
	g, b := p.Gain[i]*p.Encoder[i], p.Bias[i]
	tr, tm := p.TauRef, p.TauM
	for j, x := range xs {
		row[j] = LIFRate(g*x+b, tr, tm)
	}
}
