package neuron

import (
	"fmt"
	"math"
)

// LIF is the leaky integrate-and-fire neuron in physical units:
//
//	C dV/dt = −g_L (V − E_L) + I(t),   V ≥ V_th → spike, V ← V_reset, held for t_ref.
//
// The membrane time constant is τ_m = C/g_L. Defaults (NewLIF) are a common-practice
// point neuron: C = 200 pF, g_L = 10 nS (τ_m = 20 ms, R = 100 MΩ), E_L = −70 mV,
// V_th = −50 mV, V_reset = −70 mV, t_ref = 2 ms (Dayan & Abbott, Theoretical
// Neuroscience, 2001, ch. 5, use τ_m = 20 ms and similar potentials).
type LIF struct {
	C      float64 // membrane capacitance, F
	GL     float64 // leak conductance, S
	EL     float64 // leak reversal (rest), V
	VTh    float64 // threshold, V
	VReset float64 // reset potential, V
	TRef   float64 // absolute refractory period, s
	V0     float64 // initial potential, V; NaN means E_L
}

// NewLIF returns a LIF neuron with the defaults stated on LIF.
func NewLIF() *LIF {
	return &LIF{C: 200e-12, GL: 10e-9, EL: -70e-3, VTh: -50e-3, VReset: -70e-3, TRef: 2e-3, V0: math.NaN()}
}

// Name returns "LIF".
func (m *LIF) Name() string { return "LIF" }

// Vars returns the single state variable V (volts).
func (m *LIF) Vars() []Var { return []Var{{"V", "V", "membrane potential", 0.1}} }

// Params lists C, g_L, E_L, V_th, V_reset and t_ref.
func (m *LIF) Params() []Param {
	return []Param{
		{"C", "F", m.C, "membrane capacitance"},
		{"gL", "S", m.GL, "leak conductance"},
		{"EL", "V", m.EL, "leak reversal potential"},
		{"Vth", "V", m.VTh, "spike threshold"},
		{"Vreset", "V", m.VReset, "reset potential"},
		{"tref", "s", m.TRef, "absolute refractory period"},
	}
}

// Validate checks that parameters are finite, C and g_L positive, t_ref ≥ 0 and
// V_reset < V_th.
func (m *LIF) Validate() error {
	if err := checkFinite("LIF", m.Params()); err != nil {
		return err
	}
	return firstErr(positive("LIF", "C", m.C, "F"), positive("LIF", "gL", m.GL, "S"),
		refractory("LIF", m.TRef), resetBelow("LIF", m.VReset, m.VTh, "V"))
}

// Init writes V0 (or E_L when V0 is NaN).
func (m *LIF) Init(dst []float64) {
	dst[0] = m.EL
	if !math.IsNaN(m.V0) {
		dst[0] = m.V0
	}
}

// Deriv writes dV/dt = (−g_L(V − E_L) + I)/C in V/s.
func (m *LIF) Deriv(dst []float64, _ float64, y []float64, in float64) {
	dst[0] = (-m.GL*(y[0]-m.EL) + in) / m.C
}

// Peak returns V_th.
func (m *LIF) Peak() float64 { return m.VTh }

// Reset sets V to V_reset.
func (m *LIF) Reset(y []float64) { y[0] = m.VReset }

// Refractory returns t_ref.
func (m *LIF) Refractory() float64 { return m.TRef }

// InputScale returns the rheobase g_L (V_th − E_L), a natural current scale.
func (m *LIF) InputScale() float64 { return math.Abs(m.GL * (m.VTh - m.EL)) }

func (m *LIF) lif() (float64, float64, float64, func(float64) float64) {
	el, r := m.EL, 1/m.GL
	return m.C / m.GL, m.VTh, m.VReset, func(in float64) float64 { return el + r*in }
}

// NormLIF is the dimensionless leaky integrate-and-fire neuron
//
//	τ_m dv/dt = v_in(t) − v,   v ≥ 1 → spike, v ← 0, held for τ_ref,
//
// with threshold 1 and reset 0; the input v_in is dimensionless (the steady-state
// potential in units of threshold). Defaults (NewNormLIF): τ_m = 20 ms,
// τ_ref = 2 ms (common practice).
type NormLIF struct {
	Tau  float64 // membrane time constant τ_m, s
	TRef float64 // refractory period τ_ref, s
}

// NewNormLIF returns a normalised LIF with τ_m = 20 ms and τ_ref = 2 ms.
func NewNormLIF() *NormLIF { return &NormLIF{Tau: 20e-3, TRef: 2e-3} }

// Name returns "normalised LIF".
func (m *NormLIF) Name() string { return "normalised LIF" }

// Vars returns the single dimensionless state variable v.
func (m *NormLIF) Vars() []Var {
	return []Var{{"v", "1", "membrane potential in units of threshold", 1}}
}

// Params lists τ_m and τ_ref.
func (m *NormLIF) Params() []Param {
	return []Param{
		{"tau", "s", m.Tau, "membrane time constant"},
		{"tref", "s", m.TRef, "absolute refractory period"},
	}
}

// Validate checks that τ_m > 0 and τ_ref ≥ 0 and both are finite.
func (m *NormLIF) Validate() error {
	if err := checkFinite("normalised LIF", m.Params()); err != nil {
		return err
	}
	return firstErr(positive("normalised LIF", "tau", m.Tau, "s"), refractory("normalised LIF", m.TRef))
}

// Init writes v = 0.
func (m *NormLIF) Init(dst []float64) { dst[0] = 0 }

// Deriv writes dv/dt = (v_in − v)/τ_m in 1/s.
func (m *NormLIF) Deriv(dst []float64, _ float64, y []float64, in float64) {
	dst[0] = (in - y[0]) / m.Tau
}

// Peak returns the threshold 1.
func (m *NormLIF) Peak() float64 { return 1 }

// Reset sets v to 0.
func (m *NormLIF) Reset(y []float64) { y[0] = 0 }

// Refractory returns τ_ref.
func (m *NormLIF) Refractory() float64 { return m.TRef }

// InputScale returns 1, the threshold input.
func (m *NormLIF) InputScale() float64 { return 1 }

func (m *NormLIF) lif() (float64, float64, float64, func(float64) float64) {
	return m.Tau, 1, 0, func(in float64) float64 { return in }
}

// LIFRate returns the steady firing rate (Hz) of a LIF neuron driven to the
// steady-state potential vinf from reset vreset with threshold vth:
//
//	r = 1 / (t_ref + τ ln((V∞ − V_reset)/(V∞ − V_th)))   for V∞ > V_th, else 0
//
// (Dayan & Abbott, Theoretical Neuroscience, 2001, ch. 5).
func LIFRate(tau, tref, vth, vreset, vinf float64) float64 {
	if !(vinf > vth) {
		return 0
	}
	return 1 / (tref + tau*math.Log((vinf-vreset)/(vinf-vth)))
}

func refractory(model string, t float64) error {
	if t < 0 {
		return fmt.Errorf("neuron: %s parameter tref must be ≥ 0, got %g s; use 0 for no refractory period", model, t)
	}
	return nil
}

func resetBelow(model string, reset, th float64, unit string) error {
	if !(reset < th) {
		return fmt.Errorf("neuron: %s reset %g %s must lie below threshold %g %s", model, reset, unit, th, unit)
	}
	return nil
}

var (
	_ exactLIF    = (*LIF)(nil)
	_ exactLIF    = (*NormLIF)(nil)
	_ InputScaler = (*LIF)(nil)
)
