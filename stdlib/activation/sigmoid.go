package activation

import "math"

// gainOr1 returns a, or 1 when a is zero (the documented default).
func gainOr1(a float64) float64 {
	if a == 0 {
		return 1
	}
	return a
}

// logistic returns 1/(1+e^(−x)) without overflow: with e = e^(−|x|) ≤ 1 it
// is 1/(1+e) for x ≥ 0 and the equivalent e/(1+e) for x < 0. NaN
// propagates through expNonPos.
//
// The choice between the numerators 1 and e^(−|x|) is made on the sign bit
// with integer masks rather than a branch: on data of mixed sign a branch
// mispredicts about half the time, which cost a third of the running time.
func logistic(x float64) float64 {
	e := expNonPos(-math.Abs(x))
	neg := uint64(int64(math.Float64bits(x)) >> 63) // all ones when x < 0 or x is −0
	num := math.Float64frombits(oneBits&^neg | math.Float64bits(e)&neg)
	return num / (1 + e)
}

// oneBits is the bit pattern of 1.0.
const oneBits = 0x3ff0000000000000

// tanhSmall is the |x| below which tanh is left to math.Tanh's rational
// approximation: 1 − 2e/(1+e) with e = e^(−2|x|) loses relative accuracy
// as x → 0 (the subtraction cancels); at 0.625 it costs under one bit.
const tanhSmall = 0.625

// tanh returns tanh(x) as sign(x)·(1 − 2e/(1+e)), e = e^(−2|x|), for
// |x| ≥ tanhSmall and math.Tanh(x) below; the dense sweep in
// fastmath_test.go finds it within 2 ulps of math.Tanh. e underflows to 0
// for large |x|, giving exactly ±1 with no overflow; NaN propagates.
func tanh(x float64) float64 {
	z := math.Abs(x)
	if z < tanhSmall {
		return math.Tanh(x)
	}
	e := expNonPos(-2 * z)
	return math.Copysign(1-2*e/(1+e), x)
}

// logisticDeriv returns σ(x)σ(−x), which has no cancellation, unlike
// σ(x)(1−σ(x)) for large x.
func logisticDeriv(x float64) float64 {
	e := expNonPos(-math.Abs(x))
	return e / ((1 + e) * (1 + e))
}

// tanhDeriv returns 1/cosh²(x) as 4e^(−2|x|)/(1+e^(−2|x|))², which
// underflows gracefully instead of forming cosh(x)² (overflow above 355).
func tanhDeriv(x float64) float64 {
	t := expNonPos(-2 * math.Abs(x))
	return 4 * t / ((1 + t) * (1 + t))
}

// atanDeriv returns 1/(1+x²), using u²/(1+u²) with u = 1/x for |x| > 1 so
// that x² never overflows.
func atanDeriv(x float64) float64 {
	if math.Abs(x) <= 1 {
		return 1 / (1 + x*x)
	}
	u := 1 / x
	return u * u / (1 + u*u)
}

// Logistic is the logistic sigmoid σ(a·z) = 1/(1+e^(−a z)), range (0, 1).
// Gain is the steepness a (> 0, finite); zero means the default 1.
type Logistic struct{ Gain float64 }

// Eval returns σ(a z); it is exact to rounding for any finite z.
func (f Logistic) Eval(z float64) float64 { return logistic(gainOr1(f.Gain) * z) }

// Deriv returns a·σ(a z)·σ(−a z).
func (f Logistic) Deriv(z float64) float64 {
	a := gainOr1(f.Gain)
	return a * logisticDeriv(a*z)
}

// Apply sets dst[i] = σ(a src[i]).
func (f Logistic) Apply(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = logistic(a * z)
	}
}

// ApplyDeriv sets dst[i] = a σ(a src[i]) σ(−a src[i]).
func (f Logistic) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = a * logisticDeriv(a*z)
	}
}

// Name returns "logistic".
func (Logistic) Name() string { return "logistic" }

// Params returns the gain.
func (f Logistic) Params() []Param { return []Param{{"gain", gainOr1(f.Gain)}} }

// Validate reports an unusable gain.
func (f Logistic) Validate() error { return checkGain("logistic", gainOr1(f.Gain)) }

// Tanh is the hyperbolic tangent tanh(a·z), range (−1, 1). Gain is the
// steepness a (> 0, finite); zero means the default 1.
type Tanh struct{ Gain float64 }

// Eval returns tanh(a z).
func (f Tanh) Eval(z float64) float64 { return tanh(gainOr1(f.Gain) * z) }

// Deriv returns a/cosh²(a z), computed without overflow.
func (f Tanh) Deriv(z float64) float64 {
	a := gainOr1(f.Gain)
	return a * tanhDeriv(a*z)
}

// Apply sets dst[i] = tanh(a src[i]).
func (f Tanh) Apply(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = tanh(a * z)
	}
}

// ApplyDeriv sets dst[i] = a/cosh²(a src[i]).
func (f Tanh) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = a * tanhDeriv(a*z)
	}
}

// Name returns "tanh".
func (Tanh) Name() string { return "tanh" }

// Params returns the gain.
func (f Tanh) Params() []Param { return []Param{{"gain", gainOr1(f.Gain)}} }

// Validate reports an unusable gain.
func (f Tanh) Validate() error { return checkGain("tanh", gainOr1(f.Gain)) }

// Arctan is the arctangent atan(a·z), range (−π/2, π/2). Gain is the
// steepness a (> 0, finite); zero means the default 1. Multiply by 2/π for
// the range (−1, 1) of the sign threshold.
type Arctan struct{ Gain float64 }

// Eval returns atan(a z).
func (f Arctan) Eval(z float64) float64 { return math.Atan(gainOr1(f.Gain) * z) }

// Deriv returns a/(1+(a z)²), computed without overflow.
func (f Arctan) Deriv(z float64) float64 {
	a := gainOr1(f.Gain)
	return a * atanDeriv(a*z)
}

// Apply sets dst[i] = atan(a src[i]).
func (f Arctan) Apply(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = math.Atan(a * z)
	}
}

// ApplyDeriv sets dst[i] = a/(1+(a src[i])²).
func (f Arctan) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = a * atanDeriv(a*z)
	}
}

// Name returns "arctan".
func (Arctan) Name() string { return "arctan" }

// Params returns the gain.
func (f Arctan) Params() []Param { return []Param{{"gain", gainOr1(f.Gain)}} }

// Validate reports an unusable gain.
func (f Arctan) Validate() error { return checkGain("arctan", gainOr1(f.Gain)) }

// Softplus is the smooth rectifier log(1+e^(a·z))/a, range (0, ∞); it tends
// to ReLU as a → ∞. Gain is the sharpness a (> 0, finite); zero means 1.
type Softplus struct{ Gain float64 }

// softplusGain returns log(1+e^(a z))/a as max(z, 0) + log1p(e^(−a|z|))/a,
// so that e^(a z) is never formed for large z (it would overflow). The
// exponent −a|z| may round to −Inf for huge z, which gives e = 0 and the
// exact answer z. There is no branch on the sign of z: on data of mixed
// sign it would mispredict about half the time.
func softplusGain(a, z float64) float64 {
	return max(z, 0) + log1pUnit(expNonPos(-a*math.Abs(z)))/a
}

// Eval returns log(1+e^(a z))/a, finite for every finite z.
func (f Softplus) Eval(z float64) float64 { return softplusGain(gainOr1(f.Gain), z) }

// Deriv returns σ(a z).
func (f Softplus) Deriv(z float64) float64 { return logistic(gainOr1(f.Gain) * z) }

// Apply sets dst[i] = log(1+e^(a src[i]))/a.
func (f Softplus) Apply(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = softplusGain(a, z)
	}
}

// ApplyDeriv sets dst[i] = σ(a src[i]).
func (f Softplus) ApplyDeriv(dst, src []float64) {
	checkLen(dst, src)
	a := gainOr1(f.Gain)
	for i, z := range src {
		dst[i] = logistic(a * z)
	}
}

// Name returns "softplus".
func (Softplus) Name() string { return "softplus" }

// Params returns the gain.
func (f Softplus) Params() []Param { return []Param{{"gain", gainOr1(f.Gain)}} }

// Validate reports an unusable gain.
func (f Softplus) Validate() error { return checkGain("softplus", gainOr1(f.Gain)) }
