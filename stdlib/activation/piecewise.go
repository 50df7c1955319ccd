package activation

import (
	"fmt"
	"math"
)

// Threshold is the Heaviside step in its 0/1 form: 0 for z < 0, 1 for z > 0
// and AtZero at z = 0. AtZero must lie in [0, 1]; the descriptor default
// (used by New and NewThreshold) is 1/2, the value the steep logistic tends
// to at 0 and the midpoint of the jump. A zero-valued literal Threshold{}
// takes 0 at z = 0 (the left-continuous step), so set AtZero explicitly
// when building a literal.
type Threshold struct{ AtZero float64 }

// NewThreshold returns the 0/1 threshold with the default value 1/2 at 0.
func NewThreshold() Threshold { return Threshold{AtZero: 0.5} }

// step returns lo, mid or hi for z < 0, z = 0, z > 0, and NaN for NaN.
func step(z, lo, mid, hi float64) float64 {
	switch {
	case z > 0:
		return hi
	case z < 0:
		return lo
	case z == 0:
		return mid
	}
	return z // NaN
}

// stepDeriv returns 0 for every number and NaN for NaN. At z = 0 the true
// derivative is a Dirac impulse; 0 is the common-practice stand-in.
func stepDeriv(z float64) float64 {
	if z != z {
		return z
	}
	return 0
}

// Eval returns H(z).
func (f Threshold) Eval(z float64) float64 { return step(z, 0, f.AtZero, 1) }

// Deriv returns 0 (NaN for NaN; see the package note on kinks).
func (f Threshold) Deriv(z float64) float64 { return stepDeriv(z) }

// Apply sets dst[i] = H(src[i]).
func (f Threshold) Apply(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = step(z, 0, f.AtZero, 1)
	}
}

// ApplyDeriv sets dst[i] = 0, or NaN where src[i] is NaN.
func (f Threshold) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = stepDeriv(z)
	}
}

// Name returns "threshold".
func (Threshold) Name() string { return "threshold" }

// Params returns the value at zero.
func (f Threshold) Params() []Param { return []Param{{"at_zero", f.AtZero}} }

// Validate reports a value at zero outside [0, 1].
func (f Threshold) Validate() error { return checkRange("threshold", f.AtZero, 0, 1) }

// SignThreshold is the sign step in its −1/+1 form: −1 for z < 0, +1 for
// z > 0 and AtZero at z = 0, in [−1, 1]; the default (also the zero value)
// is 0, the midpoint of the jump and the limit of steep tanh and arctan.
type SignThreshold struct{ AtZero float64 }

// Eval returns sgn(z).
func (f SignThreshold) Eval(z float64) float64 { return step(z, -1, f.AtZero, 1) }

// Deriv returns 0 (NaN for NaN).
func (f SignThreshold) Deriv(z float64) float64 { return stepDeriv(z) }

// Apply sets dst[i] = sgn(src[i]).
func (f SignThreshold) Apply(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = step(z, -1, f.AtZero, 1)
	}
}

// ApplyDeriv sets dst[i] = 0, or NaN where src[i] is NaN.
func (f SignThreshold) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = stepDeriv(z)
	}
}

// Name returns "sign_threshold".
func (SignThreshold) Name() string { return "sign_threshold" }

// Params returns the value at zero.
func (f SignThreshold) Params() []Param { return []Param{{"at_zero", f.AtZero}} }

// Validate reports a value at zero outside [−1, 1].
func (f SignThreshold) Validate() error { return checkRange("sign_threshold", f.AtZero, -1, 1) }

// checkRange reports v outside [lo, hi] (NaN included).
func checkRange(fn string, v, lo, hi float64) error {
	if !(v >= lo && v <= hi) {
		return fmt.Errorf("activation: %s at_zero must lie in [%v, %v], got %v; the midpoint %v is the usual choice", fn, lo, hi, v, (lo+hi)/2)
	}
	return nil
}

// ReLU is the rectified linear unit max(0, z), range [0, ∞). It has no
// parameters; ReLU'(0) = 0 (left-hand value).
type ReLU struct{}

// relu returns max(0, z), +0 for −0, and NaN for NaN (NaN <= 0 is false).
func relu(z float64) float64 {
	if z <= 0 {
		return 0
	}
	return z
}

// Eval returns max(0, z).
func (ReLU) Eval(z float64) float64 { return relu(z) }

// Deriv returns 1 for z > 0, else 0.
func (ReLU) Deriv(z float64) float64 { return twoSlopeDeriv(z, 0, 1) }

// Apply sets dst[i] = max(0, src[i]).
func (ReLU) Apply(dst, src []float64) {
	checkLen(dst, src)
	// The builtin max is branch-free, gives NaN for NaN and +0 for −0,
	// exactly as relu does; random signs would defeat a branch predictor.
	for i, z := range src {
		dst[i] = max(z, 0)
	}
}

// ApplyDeriv sets dst[i] = ReLU'(src[i]).
func (ReLU) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = twoSlopeDeriv(z, 0, 1)
	}
}

// Name returns "relu".
func (ReLU) Name() string { return "relu" }

// Params returns no parameters.
func (ReLU) Params() []Param { return nil }

// Validate always succeeds.
func (ReLU) Validate() error { return nil }

// twoSlope returns r·z for z ≥ 0 and l·z for z < 0. A zero slope gives
// exactly 0 (not 0·∞ = NaN) so that the limits at ±Inf are right.
func twoSlope(z, l, r float64) float64 {
	s := r
	if z < 0 {
		s = l
	}
	if s == 0 && z == z {
		return 0
	}
	return s * z
}

// twoSlopeDeriv returns r for z > 0, l for z ≤ 0 and NaN for NaN.
func twoSlopeDeriv(z, l, r float64) float64 {
	switch {
	case z > 0:
		return r
	case z <= 0:
		return l
	}
	return z // NaN
}

// LeakyReLU is z for z > 0 and s·z otherwise. Slope is s (finite); zero
// means the common-practice default 0.01 (use ReLU for a zero slope).
type LeakyReLU struct{ Slope float64 }

func (f LeakyReLU) slope() float64 {
	if f.Slope == 0 {
		return 0.01
	}
	return f.Slope
}

// Eval returns z or s·z.
func (f LeakyReLU) Eval(z float64) float64 { return twoSlope(z, f.slope(), 1) }

// Deriv returns 1 for z > 0, else s.
func (f LeakyReLU) Deriv(z float64) float64 { return twoSlopeDeriv(z, f.slope(), 1) }

// Apply sets dst[i] = f(src[i]).
func (f LeakyReLU) Apply(dst, src []float64) { TwoSlope{f.slope(), 1}.Apply(dst, src) }

// ApplyDeriv sets dst[i] = f'(src[i]).
func (f LeakyReLU) ApplyDeriv(dst, src []float64) { TwoSlope{f.slope(), 1}.ApplyDeriv(dst, src) }

// Name returns "leaky_relu".
func (LeakyReLU) Name() string { return "leaky_relu" }

// Params returns the negative-side slope.
func (f LeakyReLU) Params() []Param { return []Param{{"slope", f.slope()}} }

// Validate reports a non-finite slope.
func (f LeakyReLU) Validate() error { return checkFinite("leaky_relu", "slope", f.slope()) }

// TwoSlope is the general piecewise-linear unit through the origin: Right·z
// for z ≥ 0 and Left·z for z < 0. Both slopes are used as given (the zero
// value is the zero function); ReLU is {0, 1}, the absolute value {−1, 1}.
type TwoSlope struct{ Left, Right float64 }

// Eval returns the piecewise-linear value.
func (f TwoSlope) Eval(z float64) float64 { return twoSlope(z, f.Left, f.Right) }

// Deriv returns Right for z > 0, else Left.
func (f TwoSlope) Deriv(z float64) float64 { return twoSlopeDeriv(z, f.Left, f.Right) }

// Apply sets dst[i] = f(src[i]).
func (f TwoSlope) Apply(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = twoSlope(z, f.Left, f.Right)
	}
}

// ApplyDeriv sets dst[i] = f'(src[i]).
func (f TwoSlope) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	for i, z := range src {
		dst[i] = twoSlopeDeriv(z, f.Left, f.Right)
	}
}

// Name returns "two_slope".
func (TwoSlope) Name() string { return "two_slope" }

// Params returns the left and right slopes.
func (f TwoSlope) Params() []Param { return []Param{{"left", f.Left}, {"right", f.Right}} }

// Validate reports a non-finite slope.
func (f TwoSlope) Validate() error {
	if err := checkFinite("two_slope", "left", f.Left); err != nil {
		return err
	}
	return checkFinite("two_slope", "right", f.Right)
}

// ELU is the exponential linear unit: z for z > 0 and α(e^z − 1) otherwise,
// range (−α, ∞). Alpha is α (> 0, finite); zero means the default 1.
type ELU struct{ Alpha float64 }

// elu uses expm1 so that small negative z keep full relative precision.
func elu(z, alpha float64) float64 {
	if z > 0 {
		return z
	}
	return alpha * math.Expm1(z)
}

// eluDeriv returns 1 for z > 0 and α e^z otherwise (α at 0, left value).
func eluDeriv(z, alpha float64) float64 {
	if z > 0 {
		return 1
	}
	return alpha * math.Exp(z)
}

// Eval returns the ELU value.
func (f ELU) Eval(z float64) float64 { return elu(z, gainOr1(f.Alpha)) }

// Deriv returns 1 for z > 0, else α e^z.
func (f ELU) Deriv(z float64) float64 { return eluDeriv(z, gainOr1(f.Alpha)) }

// Apply sets dst[i] = ELU(src[i]).
func (f ELU) Apply(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Alpha)
	for i, z := range src {
		dst[i] = elu(z, a)
	}
}

// ApplyDeriv sets dst[i] = ELU'(src[i]).
func (f ELU) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Alpha)
	for i, z := range src {
		dst[i] = eluDeriv(z, a)
	}
}

// Name returns "elu".
func (ELU) Name() string { return "elu" }

// Params returns α.
func (f ELU) Params() []Param { return []Param{{"alpha", gainOr1(f.Alpha)}} }

// Validate reports an unusable α.
func (f ELU) Validate() error {
	a := gainOr1(f.Alpha)
	if !(a > 0) || math.IsInf(a, 1) {
		return fmt.Errorf("activation: elu alpha must be positive and finite, got %v; use 1", a)
	}
	return nil
}
