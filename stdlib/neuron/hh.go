package neuron

import (
	"fmt"
	"math"
)

// HH is the Hodgkin–Huxley (1952, J. Physiol. 117:500) squid giant axon membrane in
// the modern convention with rest near −65 mV. Internally, as published, it works
// in ms, mV, µA/cm², mS/cm² and µF/cm²; the fields and the state are SI.
//
//	C dV/dt = I − ḡNa m³h (V − E_Na) − ḡK n⁴ (V − E_K) − ḡL (V − E_L)
//	dx/dt   = φ (α_x(V)(1 − x) − β_x(V) x),   x ∈ {m, h, n},  φ = 3^((T − 6.3 °C)/10)
//	α_m = 0.1(V+40)/(1−e^{−(V+40)/10})   β_m = 4 e^{−(V+65)/18}
//	α_h = 0.07 e^{−(V+65)/20}             β_h = 1/(1+e^{−(V+35)/10})
//	α_n = 0.01(V+55)/(1−e^{−(V+55)/10})  β_n = 0.125 e^{−(V+65)/80}
//
// with V in mV and rates in 1/ms. Defaults (NewHH): C = 1 µF/cm², ḡNa = 120,
// ḡK = 36, ḡL = 0.3 mS/cm², E_Na = 50, E_K = −77, E_L = −54.387 mV, T = 6.3 °C.
// The input is a current density in A/m² (1 µA/cm² = 0.01 A/m²). The state starts at
// the steady state of the resting potential, found numerically to 1e-9 mV.
// HH emits no reset; spikes are upward crossings of VDetect (default 0 V).
type HH struct {
	C           float64 // membrane capacitance, F/m²
	GNa, GK, GL float64 // maximal conductances, S/m²
	ENa, EK, EL float64 // reversal potentials, V
	Temp        float64 // temperature, °C
	VDetect     float64 // spike detection threshold, V
}

// NewHH returns the Hodgkin–Huxley membrane with the defaults stated on HH.
func NewHH() *HH {
	return &HH{C: 1e-2, GNa: 1200, GK: 360, GL: 3, ENa: 50e-3, EK: -77e-3, EL: -54.387e-3, Temp: 6.3}
}

// Name returns "Hodgkin–Huxley".
func (m *HH) Name() string { return "Hodgkin–Huxley" }

// Vars returns V (volts) and the gates m, h, n (dimensionless).
func (m *HH) Vars() []Var {
	return []Var{{"V", "V", "membrane potential", 0.1}, {"m", "1", "Na activation", 1},
		{"h", "1", "Na inactivation", 1}, {"n", "1", "K activation", 1}}
}

// Params lists the membrane parameters in SI units.
func (m *HH) Params() []Param {
	return []Param{
		{"C", "F/m^2", m.C, "membrane capacitance per area"},
		{"gNa", "S/m^2", m.GNa, "maximal sodium conductance"},
		{"gK", "S/m^2", m.GK, "maximal potassium conductance"},
		{"gL", "S/m^2", m.GL, "leak conductance"},
		{"ENa", "V", m.ENa, "sodium reversal potential"},
		{"EK", "V", m.EK, "potassium reversal potential"},
		{"EL", "V", m.EL, "leak reversal potential"},
		{"T", "degC", m.Temp, "temperature (rates scale by Q10 = 3)"},
		{"Vdetect", "V", m.VDetect, "spike detection threshold"},
	}
}

// HHMinTemp and HHMaxTemp bound the temperature (°C) HH accepts, and
// HHTempWhy says why.
const (
	HHMinTemp = 0.0
	HHMaxTemp = 50.0
	HHTempWhy = "the gate rates were measured on squid axon near 6.3 °C and scale by Q10 = 3 (Hodgkin & Huxley 1952); far outside the range of living tissue the scaling means nothing, and the gates become too fast to integrate"
)

// Validate checks that parameters are finite, the temperature within
// [HHMinTemp, HHMaxTemp] °C, C positive and conductances ≥ 0.
func (m *HH) Validate() error {
	if err := checkFinite("Hodgkin–Huxley", m.Params()); err != nil {
		return err
	}
	if !(m.Temp >= HHMinTemp && m.Temp <= HHMaxTemp) {
		return fmt.Errorf("neuron: Hodgkin–Huxley temperature must lie between %g and %g °C, got %g °C; %s", HHMinTemp, HHMaxTemp, m.Temp, HHTempWhy)
	}
	if err := positive("Hodgkin–Huxley", "C", m.C, "F/m^2"); err != nil {
		return err
	}
	for _, p := range m.Params()[1:4] {
		if p.Value < 0 {
			return fmt.Errorf("neuron: Hodgkin–Huxley parameter %s must be ≥ 0, got %g S/m^2", p.Name, p.Value)
		}
	}
	return nil
}

// vtrap returns x/(1 − e^{−x}) without 0/0: a series near 0, expm1 elsewhere.
func vtrap(x float64) float64 {
	if math.Abs(x) < 1e-6 {
		return 1 + x/2 + x*x/12
	}
	return x / -math.Expm1(-x)
}

// hhRates returns α and β for m, h, n at v (mV), in 1/ms at 6.3 °C, with math.Exp.
// It serves Deriv (and so the adaptive method, whose step control would turn a
// last-place change into a different step sequence), the resting state and the
// spike-time search.
func hhRates(v float64) (am, bm, ah, bh, an, bn float64) {
	return ratesFrom(v, math.Exp(-(v+65)*(1.0/720)), math.Exp(-((v + 40) * 0.1)))
}

// hhRatesFast is hhRates with expFast: the same rates to within about one unit in
// the last place, for the fixed-step HH runs, where the exponentials are most of
// the cost of a step.
func hhRatesFast(v float64) (am, bm, ah, bh, an, bn float64) {
	return ratesFrom(v, expFast(-(v+65)*(1.0/720)), expFast(-((v + 40) * 0.1)))
}

// ratesFrom returns the rates at v (mV) given u = e^{−(V+65)/720} and
// em = e^{−(V+40)/10}. The other exponentials are powers or multiples of these:
// e^{−(V+65)/80} = u⁹, e^{−(V+65)/20} = u³⁶ and e^{−(V+65)/18} = u⁴⁰ (relative error
// below 1e-13), and e^{−(V+35)/10}, e^{−(V+55)/10} are em times a constant.
func ratesFrom(v, u, em float64) (am, bm, ah, bh, an, bn float64) {
	u2 := u * u
	u4 := u2 * u2
	u9 := u4 * u4 * u
	u18 := u9 * u9
	u36 := u18 * u18
	bm = 4 * u36 * u4
	ah = 0.07 * u36
	bn = 0.125 * u9
	xm := (v + 40) * 0.1
	am = trap(xm, em)
	bh = 1 / (1 + em*expHalf)
	an = 0.1 * trap(xm+1.5, em*expMinus1p5)
	return
}

// expHalf and expMinus1p5 shift e^{−(V+40)/10} to e^{−(V+35)/10} and e^{−(V+55)/10}.
var expHalf, expMinus1p5 = math.Exp(0.5), math.Exp(-1.5)

// trap returns x/(1 − e^{−x}) given e = e^{−x}; near x = 0, where 1 − e cancels, it
// uses vtrap (series or expm1).
func trap(x, e float64) float64 {
	if math.Abs(x) < 0.1 {
		return vtrap(x)
	}
	return x / (1 - e)
}

// phi returns the Q10 rate factor 3^((T − 6.3)/10).
// At the reference 6.3 °C it is exactly 1 without a call to math.Pow.
func (m *HH) phi() float64 {
	if m.Temp == 6.3 {
		return 1
	}
	return math.Pow(3, (m.Temp-6.3)/10)
}

// ionic returns the ionic current density (µA/cm²) at v (mV) with gates x.
func (m *HH) ionic(v, gm, gh, gn float64) float64 {
	gna, gk, gl := m.GNa*0.1, m.GK*0.1, m.GL*0.1 // S/m² → mS/cm²
	return gna*gm*gm*gm*gh*(v-m.ENa*1e3) + gk*gn*gn*gn*gn*(v-m.EK*1e3) + gl*(v-m.EL*1e3)
}

// Deriv writes dV/dt (V/s) and the gate derivatives (1/s). One mV/ms is one V/s.
func (m *HH) Deriv(dst []float64, _ float64, y []float64, in float64) {
	_ = dst[3]
	v := y[0] * 1e3
	gm, gh, gn := y[1], y[2], y[3]
	am, bm, ah, bh, an, bn := hhRates(v)
	k := 1e3 * m.phi()
	dst[0] = (in*100 - m.ionic(v, gm, gh, gn)) / (m.C * 100)
	dst[1] = k * (am*(1-gm) - bm*gm)
	dst[2] = k * (ah*(1-gh) - bh*gh)
	dst[3] = k * (an*(1-gn) - bn*gn)
}

// steady returns the steady-state gates at v (mV).
func steady(v float64) (gm, gh, gn float64) {
	am, bm, ah, bh, an, bn := hhRates(v)
	return am / (am + bm), ah / (ah + bh), an / (an + bn)
}

// Rest returns the resting potential (V) with zero input: the root of the steady-state
// current, found by bisection on [−100, 0] mV to 1e-9 mV or better.
func (m *HH) Rest() float64 {
	f := func(v float64) float64 { gm, gh, gn := steady(v); return m.ionic(v, gm, gh, gn) }
	lo, hi := -100.0, 0.0
	if f(lo) > 0 || f(hi) < 0 {
		return m.EL // no root in range: fall back to the leak reversal
	}
	for hi-lo > 1e-12 {
		mid := 0.5 * (lo + hi)
		if f(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi) * 1e-3
}

// Init writes the steady state at the resting potential.
func (m *HH) Init(dst []float64) {
	v := m.Rest()
	dst[0] = v
	dst[1], dst[2], dst[3] = steady(v * 1e3)
}

// Detect returns the spike detection threshold VDetect (V).
func (m *HH) Detect() float64 { return m.VDetect }

// InputScale returns 0.1 A/m² (10 µA/cm²), above the repetitive-firing threshold.
func (m *HH) InputScale() float64 { return 0.1 }

// ExpEulerStep advances y in place by dt seconds at input in: each gate is updated
// exactly with V frozen, then V by the exact solution of the current that is linear
// in V with the new gates (first order overall).
func (m *HH) ExpEulerStep(y []float64, dt, in float64) {
	_ = y[3]
	h := dt * 1e3 * m.phi() // ms scaled by Q10
	v := y[0] * 1e3
	am, bm, ah, bh, an, bn := hhRatesFast(v)
	y[1] = gateStep(y[1], am, bm, h)
	y[2] = gateStep(y[2], ah, bh, h)
	y[3] = gateStep(y[3], an, bn, h)
	gm, gh, gn := y[1], y[2], y[3]
	gna := m.GNa * 0.1 * gm * gm * gm * gh
	gk := m.GK * 0.1 * gn * gn * gn * gn
	gl := m.GL * 0.1
	g := gna + gk + gl
	vinf := (gna*m.ENa*1e3 + gk*m.EK*1e3 + gl*m.EL*1e3 + in*100) / g
	y[0] = (vinf + (v-vinf)*expFast(-dt*1e3*g/(m.C*100))) * 1e-3
}

// gateStep is the exact update of dx/dt = α(1−x) − βx over h with α, β frozen,
// with expFast.
func gateStep(x, a, b, h float64) float64 {
	s := a + b
	inf := a / s
	return inf + (x-inf)*expFast(-h*s)
}

// Detector is implemented by models without a reset whose spikes are the upward
// crossings of a threshold on y[0].
type Detector interface{ Detect() float64 }

// ExpEulerStepper is implemented by models with an exponential Euler step.
type ExpEulerStepper interface {
	ExpEulerStep(y []float64, dt, in float64)
}

var (
	_ Detector        = (*HH)(nil)
	_ ExpEulerStepper = (*HH)(nil)
)
