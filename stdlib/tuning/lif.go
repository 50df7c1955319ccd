package tuning

import (
	"fmt"
	"math"
)

// LIFRate returns the firing rate in Hz of a LIF neuron with refractory
// period tauRef ≥ 0 and membrane time constant tauM > 0 (seconds), driven by
// the normalised input v = I/I_th:
//
//	r(v) = 1/(tauRef − tauM·ln(1 − 1/v)) for v > 1, else 0.
//
// Near v = 1 the log is formed as ln((v−1)/v), where v−1 is exact, so the
// rate stays accurate to a few ulps as v → 1⁺ (it tends to 0, though only
// logarithmically); for v ≥ 2 log1p(−1/v) keeps full precision as v grows,
// and r(+Inf) = 1/tauRef. NaN gives NaN. Parameters are not checked here
// (see LIFCurve.Validate); it is the allocation-free inner kernel.
func LIFRate(v, tauRef, tauM float64) float64 {
	if !(v > 1) {
		if v != v {
			return v
		}
		return 0
	}
	return 1 / (tauRef - tauM*lnOneMinusInv(v))
}

// lnOneMinusInv returns ln(1 − 1/v) for v > 1 without cancellation.
func lnOneMinusInv(v float64) float64 {
	if v < 2 {
		return math.Log((v - 1) / v)
	}
	return math.Log1p(-1 / v)
}

// LIFRateDeriv returns dr/dv of LIFRate in Hz per unit of v:
//
//	dr/dv = r² · tauM / (v (v − 1))   for v > 1, else 0.
//
// At v = 1 it returns 0, the left-hand derivative (the right-hand one is
// infinite). NaN gives NaN.
func LIFRateDeriv(v, tauRef, tauM float64) float64 {
	if !(v > 1) {
		if v != v {
			return v
		}
		return 0
	}
	r := LIFRate(v, tauRef, tauM)
	// v(v−1) is formed as v·(v−1) with v−1 exact near 1; for huge v it
	// overflows to +Inf and the derivative correctly underflows to 0.
	return r * r * tauM / (v * (v - 1))
}

// LIFInverse returns the normalised input v > 1 at which LIFRate equals
// rate, for 0 < rate < 1/tauRef:
//
//	v = 1 / (1 − exp((tauRef − 1/rate)/tauM)).
//
// It returns an error for a rate outside that interval, or one so low that
// v − 1 would round to 0 (about 1.4 Hz for τ_ref = 2 ms, τ_m = 20 ms).
func LIFInverse(rate, tauRef, tauM float64) (float64, error) {
	if !(rate > 0) || !(rate*tauRef < 1) {
		return 0, fmt.Errorf("tuning: rate must lie in (0, 1/τ_ref) = (0, %g) Hz, got %g Hz; lower it or shorten τ_ref", 1/tauRef, rate)
	}
	// −expm1(x) = 1 − e^x without cancellation for x near 0 (rates near
	// 1/τ_ref).
	v := 1 / -math.Expm1((tauRef-1/rate)/tauM)
	if !(v > 1) {
		return 0, fmt.Errorf("tuning: rate %g Hz is too low to resolve: its input lies within float64 rounding of the rheobase (v − 1 < 2.2e-16); use a rate above %.3g Hz",
			rate, LIFRate(math.Nextafter(1, 2), tauRef, tauM))
	}
	return v, nil
}

// Rheobase returns the threshold current I_th = (vth − el)/r in amperes for
// threshold and resting potentials in volts and membrane resistance r in
// ohms. It returns an error unless vth > el and r > 0, all finite.
func Rheobase(vth, el, r float64) (float64, error) {
	if !(vth > el) || math.IsInf(vth-el, 0) {
		return 0, fmt.Errorf("tuning: threshold %g V must lie above the resting potential %g V (both finite)", vth, el)
	}
	if !(r > 0) || math.IsInf(r, 1) {
		return 0, fmt.Errorf("tuning: membrane resistance must be positive and finite, got %g Ω; use e.g. 1e8 Ω (100 MΩ)", r)
	}
	return (vth - el) / r, nil
}

// checkTaus validates a refractory period and membrane time constant.
func checkTaus(tauRef, tauM float64) error {
	if !(tauRef >= 0) || math.IsInf(tauRef, 1) {
		return fmt.Errorf("tuning: refractory period must be ≥ 0 s and finite, got %g s; use e.g. 0.002 s", tauRef)
	}
	if !(tauM > 0) || math.IsInf(tauM, 1) {
		return fmt.Errorf("tuning: membrane time constant must be positive and finite, got %g s; use e.g. 0.02 s", tauM)
	}
	return nil
}
