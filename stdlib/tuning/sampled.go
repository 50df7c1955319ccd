package tuning

import (
	"fmt"
	"math"
	"sort"
)

// Sampled is a tuning curve given by points (x, rate, optional standard
// error), such as an f–I sweep of a spiking model, read by linear
// interpolation. Outside [x_0, x_last] it holds the end values (it does not
// extrapolate). It has no adjustable parameters. Build it with NewSampled.
type Sampled struct {
	x, rate, se []float64
}

// NewSampled returns the sampled curve through (x[i], rate[i]) with standard
// errors se[i] (se may be nil). The slices are copied. It returns an error
// unless x is strictly increasing and finite with at least two points,
// rates are finite and errors finite and ≥ 0, and lengths agree.
func NewSampled(x, rate, se []float64) (*Sampled, error) {
	if len(x) < 2 || len(rate) != len(x) || (se != nil && len(se) != len(x)) {
		return nil, fmt.Errorf("tuning: sampled curve needs ≥ 2 points with as many rates (and errors, if given); got %d x, %d rates, %d errors", len(x), len(rate), len(se))
	}
	for i := range x {
		if math.IsNaN(x[i]) || math.IsInf(x[i], 0) || (i > 0 && !(x[i] > x[i-1])) {
			return nil, fmt.Errorf("tuning: sampled curve inputs must be finite and strictly increasing; x[%d] = %g breaks that", i, x[i])
		}
		if math.IsNaN(rate[i]) || math.IsInf(rate[i], 0) {
			return nil, fmt.Errorf("tuning: sampled curve rate[%d] = %g must be finite", i, rate[i])
		}
		if se != nil && (!(se[i] >= 0) || math.IsInf(se[i], 1)) {
			return nil, fmt.Errorf("tuning: sampled curve error[%d] = %g must be finite and ≥ 0", i, se[i])
		}
	}
	s := &Sampled{x: clone(x), rate: clone(rate)}
	if se != nil {
		s.se = clone(se)
	}
	return s, nil
}

func clone(s []float64) []float64 { return append([]float64(nil), s...) }

// interp interpolates ys linearly at x; NaN gives NaN.
func (s *Sampled) interp(ys []float64, x float64) float64 {
	n := len(s.x)
	switch {
	case x != x:
		return x
	case x <= s.x[0]:
		return ys[0]
	case x >= s.x[n-1]:
		return ys[n-1]
	}
	// First index with s.x[i] ≥ x; 1 ≤ i ≤ n−1 here.
	i := sort.SearchFloat64s(s.x, x)
	if s.x[i] == x {
		return ys[i]
	}
	t := (x - s.x[i-1]) / (s.x[i] - s.x[i-1])
	return ys[i-1] + t*(ys[i]-ys[i-1])
}

// Rate returns the interpolated rate in Hz at x.
func (s *Sampled) Rate(x float64) float64 { return s.interp(s.rate, x) }

// SE returns the linearly interpolated standard error at x, or 0 if none
// were given.
func (s *Sampled) SE(x float64) float64 {
	if s.se == nil {
		return 0
	}
	return s.interp(s.se, x)
}

// Points returns copies of the inputs, rates and errors (nil if none).
func (s *Sampled) Points() (x, rate, se []float64) {
	if s.se != nil {
		se = clone(s.se)
	}
	return clone(s.x), clone(s.rate), se
}

// Params returns no parameters: the points are data, not parameters.
func (s *Sampled) Params() []Param { return nil }

// WithParams returns s for an empty argument and an error otherwise.
func (s *Sampled) WithParams(values []float64) (Curve, error) {
	if len(values) != 0 {
		return nil, fmt.Errorf("tuning: a sampled curve has no parameters, got %d values", len(values))
	}
	return s, nil
}
