package activation

import (
	"fmt"
	"math"
)

// Func is an element-wise activation function with its derivative.
//
// Eval returns f(z) and Deriv returns df/dz. Apply sets dst[i] = f(src[i])
// and ApplyDeriv sets dst[i] = f'(src[i]); both panic if len(dst) != len(src)
// (programmer misuse) and allow dst and src to be the same slice. Name
// returns the descriptor name, Params the current parameter values in the
// descriptor's order, and Validate reports whether the parameters are usable.
type Func interface {
	Eval(z float64) float64
	Deriv(z float64) float64
	Apply(dst, src []float64)
	ApplyDeriv(dst, src []float64)
	Name() string
	Params() []Param
	Validate() error
}

// Param is one parameter value of a function: its name, as in the
// descriptor, and its current value (dimensionless).
type Param struct {
	Name  string
	Value float64
}

// checkLen panics when the slices of a slice form differ in length: that is
// a programming error, not bad data.
func checkLen(dst, src []float64) {
	if len(dst) != len(src) {
		panic(fmt.Sprintf("activation: len(dst) = %d != len(src) = %d", len(dst), len(src)))
	}
}

// checkGain reports whether a gain is positive and finite.
func checkGain(fn string, a float64) error {
	if !(a > 0) || math.IsInf(a, 1) {
		return fmt.Errorf("activation: %s gain must be positive and finite, got %v; use a value such as 1", fn, a)
	}
	return nil
}

// checkFinite reports whether a parameter is finite.
func checkFinite(fn, name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("activation: %s %s must be finite, got %v", fn, name, v)
	}
	return nil
}

// Compile-time checks that every function type satisfies Func.
var (
	_ Func = Logistic{}
	_ Func = Tanh{}
	_ Func = Arctan{}
	_ Func = Threshold{}
	_ Func = SignThreshold{}
	_ Func = ReLU{}
	_ Func = LeakyReLU{}
	_ Func = TwoSlope{}
	_ Func = Softplus{}
	_ Func = ELU{}
)
