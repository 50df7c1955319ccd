package neuron

import (
	"errors"
	"fmt"
	"math"
)

// AdEx is the adaptive exponential integrate-and-fire neuron (Brette & Gerstner 2005,
// J. Neurophysiol. 94:3637):
//
//	C dV/dt = −g_L (V − E_L) + g_L Δ_T exp((V − V_T)/Δ_T) − w + I
//	τ_w dw/dt = a (V − E_L) − w
//	V ≥ V_peak → V ← V_r, w ← w + b
//
// Defaults (NewAdEx) are the paper's: C = 281 pF, g_L = 30 nS, E_L = −70.6 mV,
// V_T = −50.4 mV, Δ_T = 2 mV, τ_w = 144 ms, a = 4 nS, b = 0.0805 nA, V_r = E_L.
// Spikes are cut at V_peak = 20 mV (the cut-off we recall the paper's figures use,
// from memory): beyond V_T + 5Δ_T the upswing diverges within about 0.05 ms, so
// spike times hardly depend on the cut-off. The exponent is capped at 100 so that
// trial stages beyond the peak stay finite; the cap lies far above V_peak.
type AdEx struct {
	C, GL, EL, VT, DeltaT float64 // F, S, V, V, V
	TauW, A, B            float64 // s, S, A
	VR, VPeak             float64 // V, V
}

// NewAdEx returns an AdEx neuron with the published defaults stated on AdEx.
func NewAdEx() *AdEx {
	return &AdEx{C: 281e-12, GL: 30e-9, EL: -70.6e-3, VT: -50.4e-3, DeltaT: 2e-3,
		TauW: 144e-3, A: 4e-9, B: 0.0805e-9, VR: -70.6e-3, VPeak: 20e-3}
}

// Name returns "AdEx".
func (m *AdEx) Name() string { return "AdEx" }

// Vars returns V (volts) and the adaptation current w (amperes).
func (m *AdEx) Vars() []Var {
	return []Var{{"V", "V", "membrane potential", 0.1}, {"w", "A", "adaptation current", 1e-9}}
}

// Params lists the AdEx parameters in SI units.
func (m *AdEx) Params() []Param {
	return []Param{
		{"C", "F", m.C, "membrane capacitance"}, {"gL", "S", m.GL, "leak conductance"},
		{"EL", "V", m.EL, "leak reversal potential"}, {"VT", "V", m.VT, "threshold slope centre"},
		{"DeltaT", "V", m.DeltaT, "slope factor"}, {"tauw", "s", m.TauW, "adaptation time constant"},
		{"a", "S", m.A, "subthreshold adaptation"}, {"b", "A", m.B, "spike-triggered adaptation"},
		{"Vr", "V", m.VR, "reset potential"}, {"Vpeak", "V", m.VPeak, "spike cut-off"},
	}
}

// Validate checks finiteness, C, g_L, Δ_T, τ_w > 0 and V_r < V_peak.
func (m *AdEx) Validate() error {
	if err := checkFinite("AdEx", m.Params()); err != nil {
		return err
	}
	return firstErr(positive("AdEx", "C", m.C, "F"), positive("AdEx", "gL", m.GL, "S"),
		positive("AdEx", "DeltaT", m.DeltaT, "V"), positive("AdEx", "tauw", m.TauW, "s"),
		resetBelow("AdEx", m.VR, m.VPeak, "V"))
}

// Init writes V = E_L, w = 0.
func (m *AdEx) Init(dst []float64) { dst[0], dst[1] = m.EL, 0 }

// Deriv writes dV/dt (V/s) and dw/dt (A/s).
func (m *AdEx) Deriv(dst []float64, _ float64, y []float64, in float64) {
	_ = dst[1]
	v, w := y[0], y[1]
	x := math.Min((v-m.VT)/m.DeltaT, 100)
	dst[0] = (-m.GL*(v-m.EL) + m.GL*m.DeltaT*math.Exp(x) - w + in) / m.C
	dst[1] = (m.A*(v-m.EL) - w) / m.TauW
}

// Peak returns V_peak.
func (m *AdEx) Peak() float64 { return m.VPeak }

// Reset sets V to V_r and adds b to w.
func (m *AdEx) Reset(y []float64) { y[0], y[1] = m.VR, y[1]+m.B }

// Refractory returns 0: AdEx has no absolute refractory period.
func (m *AdEx) Refractory() float64 { return 0 }

// InputScale returns 1 nA.
func (m *AdEx) InputScale() float64 { return 1e-9 }

// Izhikevich is the simple model of Izhikevich (2003, IEEE Trans. Neural Netw.
// 14:1569), in its published units: v in mV, t in ms, I dimensionless,
//
//	v' = 0.04 v² + 5 v + 140 − u + I,   u' = a (b v − u),   v ≥ 30 mV → v ← c, u ← u + d.
//
// Unit convention here: the state v is stored in volts (v_mV/1000) and time is in
// seconds; u and the input I keep their published numbers (they are, like v', in
// mV/ms, which is V/s). The parameters a (1/ms), b, c (mV), d keep the published
// units. The state starts at v = −65 mV, u = b·v as in the paper.
type Izhikevich struct {
	A, B, C, D float64 // published units: 1/ms, 1, mV, 1
	VPeak      float64 // spike cut-off, mV (30 as published)
}

// Izhikevich firing classes with (a, b, c, d) from figure 2 of the 2003 paper.
var (
	RegularSpiking            = Izhikevich{A: 0.02, B: 0.2, C: -65, D: 8, VPeak: 30}
	IntrinsicallyBursting     = Izhikevich{A: 0.02, B: 0.2, C: -55, D: 4, VPeak: 30}
	Chattering                = Izhikevich{A: 0.02, B: 0.2, C: -50, D: 2, VPeak: 30}
	FastSpiking               = Izhikevich{A: 0.1, B: 0.2, C: -65, D: 2, VPeak: 30}
	LowThresholdSpiking       = Izhikevich{A: 0.02, B: 0.25, C: -65, D: 2, VPeak: 30}
	ThalamoCortical           = Izhikevich{A: 0.02, B: 0.25, C: -65, D: 0.05, VPeak: 30}
	Resonator                 = Izhikevich{A: 0.1, B: 0.26, C: -65, D: 2, VPeak: 30}
	IzhikevichClasses         = map[string]Izhikevich{"regular spiking": RegularSpiking, "intrinsically bursting": IntrinsicallyBursting, "chattering": Chattering, "fast spiking": FastSpiking, "low-threshold spiking": LowThresholdSpiking, "thalamo-cortical": ThalamoCortical, "resonator": Resonator}
	errUnknownIzhikevichClass = errors.New("neuron: unknown Izhikevich class")
)

// NewIzhikevich returns the named firing class ("regular spiking", "intrinsically
// bursting", "chattering", "fast spiking", "low-threshold spiking",
// "thalamo-cortical", "resonator").
func NewIzhikevich(class string) (*Izhikevich, error) {
	p, ok := IzhikevichClasses[class]
	if !ok {
		return nil, fmt.Errorf("%w %q; use one of regular spiking, intrinsically bursting, chattering, fast spiking, low-threshold spiking, thalamo-cortical, resonator", errUnknownIzhikevichClass, class)
	}
	return &p, nil
}

// Name returns "Izhikevich".
func (m *Izhikevich) Name() string { return "Izhikevich" }

// Vars returns v (volts) and the recovery variable u (published units, mV/ms).
func (m *Izhikevich) Vars() []Var {
	return []Var{{"v", "V", "membrane potential", 0.1}, {"u", "mV/ms", "recovery variable", 10}}
}

// Params lists a, b, c, d and the cut-off in published units.
func (m *Izhikevich) Params() []Param {
	return []Param{
		{"a", "1/ms", m.A, "recovery rate"}, {"b", "1", m.B, "recovery sensitivity"},
		{"c", "mV", m.C, "reset potential"}, {"d", "mV/ms", m.D, "recovery jump"},
		{"vpeak", "mV", m.VPeak, "spike cut-off"},
	}
}

// Validate checks finiteness, a > 0 and c < v_peak.
func (m *Izhikevich) Validate() error {
	if err := checkFinite("Izhikevich", m.Params()); err != nil {
		return err
	}
	return firstErr(positive("Izhikevich", "a", m.A, "1/ms"), resetBelow("Izhikevich", m.C, m.VPeak, "mV"))
}

// Init writes v = −65 mV and u = b·v.
func (m *Izhikevich) Init(dst []float64) { dst[0], dst[1] = -65e-3, m.B*-65 }

// Deriv writes dv/dt in V/s (numerically mV/ms) and du/dt per second.
func (m *Izhikevich) Deriv(dst []float64, _ float64, y []float64, in float64) {
	_ = dst[1]
	v, u := y[0]*1e3, y[1]
	dst[0] = 0.04*v*v + 5*v + 140 - u + in
	dst[1] = 1e3 * m.A * (m.B*v - u)
}

// Peak returns the cut-off in volts.
func (m *Izhikevich) Peak() float64 { return m.VPeak * 1e-3 }

// Reset sets v to c and adds d to u.
func (m *Izhikevich) Reset(y []float64) { y[0], y[1] = m.C*1e-3, y[1]+m.D }

// Refractory returns 0.
func (m *Izhikevich) Refractory() float64 { return 0 }

// InputScale returns 10, a typical published drive.
func (m *Izhikevich) InputScale() float64 { return 10 }

// Rate is a rate neuron dr/dt = (−r + F(Gain·I + Bias))/Tau; with Tau = 0 the rate
// follows its input instantly, r = F(Gain·I + Bias). The unit of r is whatever F
// returns (often Hz); Gain converts the input to F's argument.
type Rate struct {
	Tau, Gain, Bias float64 // s, 1/input unit, 1
	F               func(float64) float64
}

// Name returns "rate".
func (m *Rate) Name() string { return "rate" }

// Vars returns r.
func (m *Rate) Vars() []Var { return []Var{{"r", "1", "rate (unit of F)", 1}} }

// Params lists τ, gain and bias.
func (m *Rate) Params() []Param {
	return []Param{{"tau", "s", m.Tau, "time constant (0: instantaneous)"},
		{"gain", "1", m.Gain, "input gain"}, {"bias", "1", m.Bias, "input bias"}}
}

// Validate checks finiteness, τ ≥ 0 and that F is set.
func (m *Rate) Validate() error {
	if err := checkFinite("rate", m.Params()); err != nil {
		return err
	}
	if m.Tau < 0 {
		return fmt.Errorf("neuron: rate parameter tau must be ≥ 0, got %g s; use 0 for an instantaneous rate", m.Tau)
	}
	if m.F == nil {
		return errors.New("neuron: rate neuron has no activation function F; set F, e.g. to a ReLU")
	}
	return nil
}

// Init writes r = F(Bias), the rate with no input.
func (m *Rate) Init(dst []float64) { dst[0] = m.F(m.Bias) }

// Deriv writes dr/dt; with Tau = 0 it writes 0 (the simulator sets r directly).
func (m *Rate) Deriv(dst []float64, _ float64, y []float64, in float64) {
	if m.Tau == 0 {
		dst[0] = 0
		return
	}
	dst[0] = (m.F(m.Gain*in+m.Bias) - y[0]) / m.Tau
}

// instant sets r = F(Gain·in + Bias) when Tau = 0 and reports whether it did.
func (m *Rate) instant(y []float64, in float64) bool {
	if m.Tau != 0 {
		return false
	}
	y[0] = m.F(m.Gain*in + m.Bias)
	return true
}

var (
	_ Resetter = (*AdEx)(nil)
	_ Resetter = (*Izhikevich)(nil)
	_ Model    = (*Rate)(nil)
)
