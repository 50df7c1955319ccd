package activation

import (
	"math"
	"math/big"
)

// This file holds the two elementary kernels the sigmoids are built from,
// e^x for x ≤ 0 and log(1+x) for 0 ≤ x ≤ 1, written for the slice forms.
//
// math.Exp costs about 14 ns on amd64 (an assembly routine that cannot be
// inlined and re-checks the CPU on every call) and math.Log1p about 20 ns
// (a general routine with many branches). Every activation here only ever
// needs e^(−|t|) and log(1+e^(−|t|)), so restricting the domain removes the
// overflow, sign and range branches; what is left is branch-free apart from
// one branch for arguments so negative that the result is subnormal, which
// never mispredicts on ordinary data.
//
// expNonPos uses a 64-entry table of 2^(j/64) and a short Taylor
// polynomial (no division); log1pUnit follows the reduction and minimax
// coefficients of fdlibm's e_log.c (Sun Microsystems, 1993; the constants
// Go's math package uses), whose documented error is below 1 ulp. The dense
// sweeps in fastmath_test.go find both within 2 ulps of math.Exp and
// math.Log1p, and tanh, logistic and softplus within 2 ulps of their
// math-package forms.

const (
	ln2Hi = 6.93147180369123816490e-01 // high 32 bits of ln 2 (low 21 bits zero)
	ln2Lo = 1.90821492927058770002e-10 // ln 2 − ln2Hi
	log2e = 1.44269504088896338700e+00 // 1/ln 2

	// expFastMin is the smallest argument for which 2^k in expNonPos is a
	// normal number (k ≥ −1022); below it the result is subnormal or zero
	// and math.Exp handles the gradual underflow.
	expFastMin = -708.0

	// expStepHi + expStepLo = ln2/64 to about 2^-90: the high part has its
	// low 11 bits zero so that k·expStepHi is exact for |k| < 2^17 (x ≥ −708).
	expStepHi  = ln2Hi / 64
	expStepLo  = ln2Lo / 64
	expInvStep = 64 * log2e

	// fdlibm e_log.c: R(s²) ≈ (log(1+f) − 2s)/s − s·… on |s| ≤ 0.1716.
	logL1 = 6.666666666666735130e-01
	logL2 = 3.999999999940941908e-01
	logL3 = 2.857142874366239149e-01
	logL4 = 2.222219843214978396e-01
	logL5 = 1.818357216161805012e-01
	logL6 = 1.531383769920937332e-01
	logL7 = 1.479819860511658591e-01

	sqrt2Bits = 0x3ff6a09e667f3bcd // bit pattern of √2
)

// expNonPos returns e^x for x ≤ 0 (and NaN for NaN). Positive arguments are
// outside its contract: it returns a wrong value for x > 0 (no panic).
//
// With x = (64m + j)·ln2/64 + r, 0 ≤ j < 64 and |r| ≤ ln2/128, the result is
// 2^m · 2^(j/64) · e^r: 2^(j/64) comes from a correctly rounded table,
// e^r − 1 from its Taylor polynomial to r⁵ (the omitted r⁶/720 < 3.5e-17
// is below 0.2 ulp), and 2^m is assembled from its bits. The polynomial is
// evaluated in Estrin's order to keep the dependency chain short, and there
// is no division, so consecutive elements overlap in the pipeline.
func expNonPos(x float64) float64 {
	if x < expFastMin {
		return math.Exp(x)
	}
	k := int64(x*expInvStep - 0.5) // truncation toward zero: rounds x/step ≤ 0
	fk := float64(k)
	r := (x - fk*expStepHi) - fk*expStepLo
	r2 := r * r
	p := r + r2*((0.5+r*(1.0/6))+r2*((1.0/24)+r*(1.0/120)))
	t := exp2Table[k&63]
	scale := math.Float64frombits(uint64(1023+(k>>6)) << 52)
	return (t + t*p) * scale
}

// exp2Table[j] is 2^(j/64) correctly rounded, computed once in big.Float
// arithmetic at 128 bits (2^(1/64) by six square roots, then powers).
var exp2Table = func() (t [64]float64) {
	const prec = 128
	step := new(big.Float).SetPrec(prec).SetInt64(2)
	for range 6 {
		step.Sqrt(step)
	}
	v := new(big.Float).SetPrec(prec).SetInt64(1)
	for j := range t {
		t[j], _ = v.Float64()
		v.Mul(v, step)
	}
	return t
}()

// log1pUnit returns log(1+x) for 0 ≤ x ≤ 1 (and NaN for NaN), accurate to
// about 1 ulp relative even for tiny x. Arguments outside [0, 1] are
// outside its contract (wrong value, no panic).
//
// u = 1+x is rounded; c = x − (u−1) is that rounding's exact error (u−1 is
// exact by Sterbenz's lemma) and enters as the first-order term c/u. u is
// scaled by 2^(−k), k ∈ {0, 1}, into [√2/2, √2) by integer arithmetic on
// its bits, so there is no data-dependent branch.
func log1pUnit(x float64) float64 {
	u := 1 + x
	c := x - (u - 1)
	b := math.Float64bits(u)
	k := 1 + (int64(b)-sqrt2Bits)>>63 // 1 when u ≥ √2, else 0
	f := math.Float64frombits(b-uint64(k)<<52) - 1
	s := f / (2 + f)
	z := s * s
	w := z * z
	r := z*(logL1+w*(logL3+w*(logL5+w*logL7))) + w*(logL2+w*(logL4+w*logL6))
	hfsq := 0.5 * f * f
	fk := float64(k)
	return fk*ln2Hi - ((hfsq - (s*(hfsq+r) + (fk*ln2Lo + c/u))) - f)
}
