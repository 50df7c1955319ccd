package stimulus

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"
)

// MaxOUSamples bounds the grid of one OU waveform (400 MB of float64), so that
// a mistyped step or duration fails at once instead of exhausting memory.
const MaxOUSamples = 50_000_000

// ouStream is the PCG stream constant paired with the user's seed ("Loligo-O"
// in ASCII); fixing it keeps seed → values identical across versions.
const ouStream = 0x4c6f6c69676f2d4f

// OUParams are the parameters of Ornstein–Uhlenbeck noise.
type OUParams struct {
	Mean  float64 // μ, in the waveform's value unit
	Sigma float64 // σ, stationary standard deviation, ≥ 0
	Tau   float64 // τ, correlation time in s, > 0
	Dt    float64 // grid step in s, > 0
	Start float64 // s, time of the first grid point
	// Duration is the length of the grid in s; it holds ceil(Duration/Dt) points
	// (a ratio within 1e-9 of a whole number counts as that number).
	Duration float64
	Seed     uint64
}

// OU is Ornstein–Uhlenbeck noise precomputed on a regular grid at
// construction. Grid point k is at Start + k·Dt; its value holds until the next
// grid point. The waveform is 0 before Start and from the end of the grid on.
// The first value is drawn from the stationary distribution N(μ, σ²), so the
// statistics are stationary from the start. An *OU is immutable and safe for
// concurrent use.
type OU struct {
	p OUParams
	x []float64
}

// Validate checks the parameters, including the grid size limit.
func (p OUParams) Validate() error {
	if err := finite("OU", []string{"mean", "sigma", "tau", "dt", "start", "duration"},
		p.Mean, p.Sigma, p.Tau, p.Dt, p.Start, p.Duration); err != nil {
		return err
	}
	switch {
	case p.Sigma < 0:
		return fmt.Errorf("stimulus: OU sigma must be ≥ 0, got %g; it is a standard deviation", p.Sigma)
	case p.Tau <= 0:
		return fmt.Errorf("stimulus: OU tau must be positive, got %g s; use a correlation time such as 0.005 s", p.Tau)
	case p.Dt <= 0:
		return fmt.Errorf("stimulus: OU dt must be positive, got %g s; use the simulation step, e.g. 0.0001 s", p.Dt)
	case p.Duration <= 0:
		return fmt.Errorf("stimulus: OU duration must be positive, got %g s; give the length of the run", p.Duration)
	}
	if n := p.points(); n > MaxOUSamples {
		return fmt.Errorf("stimulus: OU grid would hold %.3g points (%.3g MB), more than the limit of %d; use a larger dt or a shorter duration", n, n*8/1e6, MaxOUSamples)
	}
	return nil
}

// points returns the number of grid points as a float64 (it may be huge).
func (p OUParams) points() float64 {
	r := p.Duration / p.Dt
	if math.Abs(r-math.Round(r)) <= 1e-9*r {
		return math.Max(1, math.Round(r))
	}
	return math.Ceil(r)
}

// NewOU validates p and generates the noise; see NewOUContext.
func NewOU(p OUParams) (*OU, error) { return NewOUContext(context.Background(), p) }

// NewOUContext validates p and generates the noise with the exact update of
// Gillespie (1996), stopping early with ctx's error if ctx is cancelled.
func NewOUContext(ctx context.Context, p OUParams) (*OU, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	x := make([]float64, int(p.points()))
	if err := fillOU(ctx, x, p); err != nil {
		return nil, err
	}
	return &OU{p: p, x: x}, nil
}

// fillOU writes the OU path into x. The decay a = e^{−dt/τ} and the noise gain
// σ·sqrt(1 − e^{−2dt/τ}) (via Expm1, accurate when dt ≪ τ) are exact for any dt.
func fillOU(ctx context.Context, x []float64, p OUParams) error {
	rng := rand.New(rand.NewPCG(p.Seed, ouStream))
	a := math.Exp(-p.Dt / p.Tau)
	b := p.Sigma * math.Sqrt(-math.Expm1(-2*p.Dt/p.Tau))
	mu := p.Mean
	x[0] = mu + p.Sigma*rng.NormFloat64()
	for k := 1; k < len(x); k++ {
		if k&0xffff == 0 {
			if err := ctx.Err(); err != nil {
				return fmt.Errorf("stimulus: OU generation stopped at point %d of %d: %w", k, len(x), err)
			}
		}
		x[k] = mu + (x[k-1]-mu)*a + b*rng.NormFloat64()
	}
	return nil
}

// grid returns the time of grid point k.
func (o *OU) grid(k int) float64 { return o.p.Start + float64(k)*o.p.Dt }

// index returns the grid interval holding t ≥ Start (it may be ≥ Len()).
func (o *OU) index(t float64) int {
	f := math.Floor((t - o.p.Start) / o.p.Dt)
	if f > float64(len(o.x)) {
		return len(o.x)
	}
	k := int(math.Max(f, 0))
	for k > 0 && o.grid(k) > t {
		k--
	}
	for k < len(o.x) && o.grid(k+1) <= t {
		k++
	}
	return k
}

// At returns the value of the grid point at or before t, or 0 outside the grid.
func (o *OU) At(t float64) float64 {
	if t < o.p.Start {
		return 0
	}
	if k := o.index(t); k < len(o.x) {
		return o.x[k]
	}
	return 0
}

// NextChange returns the next grid time after t, the end of the grid, or +Inf.
func (o *OU) NextChange(t float64) float64 {
	if t < o.p.Start {
		return o.p.Start
	}
	if k := o.index(t); k < len(o.x) {
		return o.grid(k + 1)
	}
	return math.Inf(1)
}

// Len returns the number of grid points.
func (o *OU) Len() int { return len(o.x) }

// Values appends the grid values to dst and returns the extended slice.
func (o *OU) Values(dst []float64) []float64 { return append(dst, o.x...) }

// Settings returns the parameters the noise was generated with.
func (o *OU) Settings() OUParams { return o.p }

// Validate re-checks the parameters (always nil for an *OU from NewOU).
func (o *OU) Validate() error { return o.p.Validate() }

// Describe returns e.g. "OU noise mean 0, sigma 1e-11, tau 0.005 s, dt 0.0001 s, from 0 s to 1 s, seed 7".
func (o *OU) Describe() string {
	p := o.p
	return fmt.Sprintf("OU noise mean %s, sigma %s, tau %s s, dt %s s, %s, seed %d",
		g(p.Mean), g(p.Sigma), g(p.Tau), g(p.Dt), span(p.Start, o.grid(len(o.x))), p.Seed)
}

// Params lists mean, sigma, tau, dt, start, duration and seed.
func (o *OU) Params() []Param {
	p := o.p
	return []Param{{Name: "mean", Value: p.Mean}, {Name: "sigma", Value: p.Sigma}, {Name: "tau", Value: p.Tau, Unit: "s"},
		{Name: "dt", Value: p.Dt, Unit: "s"}, {Name: "start", Value: p.Start, Unit: "s"}, {Name: "duration", Value: p.Duration, Unit: "s"},
		{Name: "seed", Value: float64(p.Seed), Text: strconv.FormatUint(p.Seed, 10)}}
}
