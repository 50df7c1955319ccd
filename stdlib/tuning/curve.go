package tuning

import (
	"fmt"
	"math"
)

// Curve is a tuning curve: Rate returns the firing rate in Hz at input x.
// Params lists the adjustable parameters in a fixed order; WithParams
// returns a new curve with those values (same order and length) and leaves
// the receiver unchanged, so a fitter can vary a curve without mutating it.
type Curve interface {
	Rate(x float64) float64
	Params() []Param
	WithParams(values []float64) (Curve, error)
}

// Param is one parameter of a curve: its name, current value and unit text
// (e.g. "Hz", "s", "1/nA"; empty for a pure number).
type Param struct {
	Name  string
	Value float64
	Unit  string
}

// Activation is the element-wise function a RateCurve applies. Every
// function of package activation satisfies it; so does any type with an
// Eval method.
type Activation interface {
	Eval(z float64) float64
}

// Compile-time checks.
var (
	_ Curve = RateCurve{}
	_ Curve = LIFCurve{}
	_ Curve = (*Sampled)(nil)
)

// Tabulate sets dst[i] = c.Rate(xs[i]). It panics if the lengths differ;
// xs is not modified.
func Tabulate(dst []float64, c Curve, xs []float64) {
	if len(dst) != len(xs) {
		panic(fmt.Sprintf("tuning: len(dst) = %d != len(xs) = %d", len(dst), len(xs)))
	}
	for i, x := range xs {
		dst[i] = c.Rate(x)
	}
}

// Span returns n ≥ 2 evenly spaced points from lo to hi inclusive (the last
// is exactly hi). It returns an error unless lo < hi, both finite.
func Span(lo, hi float64, n int) ([]float64, error) {
	if !(lo < hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil, fmt.Errorf("tuning: span needs finite lo < hi, got [%g, %g]", lo, hi)
	}
	if n < 2 {
		return nil, fmt.Errorf("tuning: span needs at least 2 points, got %d", n)
	}
	xs := make([]float64, n)
	for i := range xs {
		// lo + (hi−lo)·i/(n−1) rather than repeated addition: no drift.
		xs[i] = lo + (hi-lo)*float64(i)/float64(n-1)
	}
	xs[n-1] = hi
	return xs, nil
}

// wantParams checks the length of a WithParams argument.
func wantParams(kind string, values []float64, n int) error {
	if len(values) != n {
		return fmt.Errorf("tuning: %s has %d parameters, got %d values", kind, n, len(values))
	}
	for i, v := range values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("tuning: %s parameter %d must be finite, got %g", kind, i, v)
		}
	}
	return nil
}

// RateCurve is a rate neuron's tuning curve Scale·Act(Gain·x + Bias). Gain
// is in 1/InputUnit, Bias is dimensionless and Scale is the output scale in
// Hz. InputUnit is only text for Params (e.g. "nA").
type RateCurve struct {
	Act               Activation
	Gain, Bias, Scale float64
	InputUnit         string
}

// Rate returns Scale·Act(Gain·x + Bias) in Hz.
func (c RateCurve) Rate(x float64) float64 { return c.Scale * c.Act.Eval(c.Gain*x+c.Bias) }

// Params returns gain, bias and scale.
func (c RateCurve) Params() []Param {
	return []Param{{"gain", c.Gain, inverseUnit(c.InputUnit)}, {"bias", c.Bias, ""}, {"scale", c.Scale, "Hz"}}
}

// WithParams returns a copy with gain, bias and scale replaced.
func (c RateCurve) WithParams(values []float64) (Curve, error) {
	if err := wantParams("rate curve", values, 3); err != nil {
		return nil, err
	}
	c.Gain, c.Bias, c.Scale = values[0], values[1], values[2]
	return c, nil
}

func inverseUnit(u string) string {
	if u == "" {
		return ""
	}
	return "1/" + u
}

// LIFCurve is the LIF closed form LIFRate(Gain·x + Bias, TauRef, TauM):
// TauRef and TauM in seconds, Gain in 1/InputUnit, Bias dimensionless. With
// Gain = 1/I_th and Bias = 0 the input x is a current in the unit of I_th;
// NewLIFCurve builds that case from membrane parameters.
type LIFCurve struct {
	TauRef, TauM float64
	Gain, Bias   float64
	InputUnit    string
}

// NewLIFCurve returns the LIF curve of input current in amperes for
// refractory period tauRef and membrane time constant tauM (seconds),
// threshold vth and rest el (volts) and resistance r (ohms): Gain = 1/I_th
// with I_th the rheobase, Bias = 0.
func NewLIFCurve(tauRef, tauM, vth, el, r float64) (LIFCurve, error) {
	if err := checkTaus(tauRef, tauM); err != nil {
		return LIFCurve{}, err
	}
	ith, err := Rheobase(vth, el, r)
	if err != nil {
		return LIFCurve{}, err
	}
	return LIFCurve{TauRef: tauRef, TauM: tauM, Gain: 1 / ith, InputUnit: "A"}, nil
}

// Rate returns the LIF rate in Hz at input x.
func (c LIFCurve) Rate(x float64) float64 { return LIFRate(c.Gain*x+c.Bias, c.TauRef, c.TauM) }

// Slope returns dRate/dx in Hz per input unit.
func (c LIFCurve) Slope(x float64) float64 {
	return c.Gain * LIFRateDeriv(c.Gain*x+c.Bias, c.TauRef, c.TauM)
}

// MaxRate returns 1/TauRef in Hz, the limit for large input.
func (c LIFCurve) MaxRate() float64 { return 1 / c.TauRef }

// Validate reports unusable time constants.
func (c LIFCurve) Validate() error { return checkTaus(c.TauRef, c.TauM) }

// Params returns tau_ref, tau_m, gain and bias.
func (c LIFCurve) Params() []Param {
	return []Param{{"tau_ref", c.TauRef, "s"}, {"tau_m", c.TauM, "s"},
		{"gain", c.Gain, inverseUnit(c.InputUnit)}, {"bias", c.Bias, ""}}
}

// WithParams returns a copy with tau_ref, tau_m, gain and bias replaced; it
// returns an error for unusable time constants.
func (c LIFCurve) WithParams(values []float64) (Curve, error) {
	if err := wantParams("LIF curve", values, 4); err != nil {
		return nil, err
	}
	c.TauRef, c.TauM, c.Gain, c.Bias = values[0], values[1], values[2], values[3]
	if err := c.Validate(); err != nil {
		return nil, err
	}
	return c, nil
}
