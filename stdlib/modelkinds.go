package stdlib

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
)

// The model kinds of the language, one declaration each: parameters with
// units, defaults and sources, equations for the card, and how each builds
// its plain-Go model.

var lifSymbols = map[string]string{"C": "C", "g_L": "g_L", "tau_m": `\tau_m`, "R": "R", "E_L": "E_L",
	"V_th": `V_{th}`, "V_reset": `V_{reset}`, "t_ref": `t_{ref}`, "V_0": "V_0"}

var lifSpec = &modelSpec{
	title: "Leaky integrate-and-fire", input: units.Current, example: "0.3 nA",
	equations: []string{`C \frac{dV}{dt} = -g_L (V - E_L) + I(t)`,
		`V \ge V_{th} \to \text{spike},\ V \leftarrow V_{reset} \text{ held for } t_{ref}`,
		`\tau_m = C / g_L = R C`},
	build: func(m *Model, i int) (neuron.Model, error) {
		v0 := math.NaN()
		if m.has("V_0") {
			v0 = m.get("V_0", i)
		}
		return &neuron.LIF{C: m.get("C", i), GL: m.get("g_L", i), EL: m.get("E_L", i), VTh: m.get("V_th", i),
			VReset: m.get("V_reset", i), TRef: m.get("t_ref", i), V0: v0}, nil
	},
	rules: []rule{nonNegRule("t_ref", "use 0 ms for no refractory period"), {name: "V_reset", below: "V_th"}},
}

func init() {
	lifSpec.builtin = &runtime.Builtin{
		Name: "lif", Category: "models", Returns: "a LIF model",
		Doc: "A leaky integrate-and-fire neuron in physical units: C dV/dt = −g_L (V − E_L) + I(t); when V reaches V_th a spike is emitted and V is reset to V_reset and held there for t_ref. " +
			"The membrane is given by its time constant tau_m and input resistance R (what a current-clamp recording measures), or by C and g_L instead: give at most one of C and tau_m, and at most one of g_L and R. " +
			"Between input changes it is integrated exactly and threshold crossings are solved in closed form. Any parameter may be a vector (one value per neuron) to make a population. Input: a current (pA, nA).",
		Source: "Dayan & Abbott (2001), Theoretical Neuroscience, MIT Press, ch. 5; defaults common practice (τ_m = 20 ms, R = 100 MΩ)",
		Params: []runtime.Param{
			num("tau_m", "ms", "20 ms", "membrane time constant C/g_L"),
			num("R", "MOhm", "100 MOhm", "input resistance 1/g_L"),
			opt("C", "pF", "membrane capacitance; give it in place of tau_m"),
			opt("g_L", "nS", "leak conductance; give it in place of R"),
			num("E_L", "mV", "-70 mV", "leak reversal (resting) potential"),
			num("V_th", "mV", "-50 mV", "spike threshold"),
			num("V_reset", "mV", "-70 mV", "reset potential"),
			num("t_ref", "ms", "2 ms", "absolute refractory period"),
			opt("V_0", "mV", "initial potential; default E_L"),
		},
		Fn: lifFn,
	}
}

// lifFn resolves the membrane pair (C or tau_m, g_L or R) and builds the model.
func lifFn(c *runtime.Call) (runtime.Value, error) {
	for _, pair := range [][2]string{{"C", "tau_m"}, {"g_L", "R"}} {
		if c.Given(pair[0]) && c.Given(pair[1]) {
			return nil, runtime.ArgumentErrorf("lif: give %s or %s, not both (they fix the same property of the membrane)", pair[0], pair[1])
		}
	}
	if err := lifMembrane(c); err != nil {
		return nil, err
	}
	m := &Model{spec: lifSpec, n: 1}
	g, _ := c.Floats("R")
	g = mapSlice(g, func(r float64) float64 { return 1 / r })
	if c.Given("g_L") {
		g, _ = c.Floats("g_L")
	}
	tau, _ := c.Floats("tau_m")
	var cm []float64
	if c.Given("C") {
		cm, _ = c.Floats("C")
		tau = zipSlice(cm, g, func(a, b float64) float64 { return a / b })
	} else {
		cm = zipSlice(tau, g, func(a, b float64) float64 { return a * b })
	}
	r := mapSlice(g, func(x float64) float64 { return 1 / x })
	decl := c.Builtin.Params
	for _, p := range []struct {
		i int
		v []float64
		d units.Dim
	}{{2, cm, units.Capacitance}, {3, g, units.Conductance}, {0, tau, units.Time}, {1, r, units.Resistance}} {
		name := decl[p.i].Name
		if err := m.add(name, lifSymbols[name], decl[p.i].Unit, lifNote(c, name), p.d, p.v); err != nil {
			return nil, err
		}
	}
	for _, p := range decl[4:] {
		if c.Has(p.Name) {
			v, d := c.Floats(p.Name)
			if err := m.add(p.Name, lifSymbols[p.Name], p.Unit, p.Doc, d, v); err != nil {
				return nil, err
			}
		}
	}
	return m.finish(c)
}

// lifPair maps each membrane parameter to the one it replaces, with an
// example value for the hint.
var lifPair = map[string][2]string{"tau_m": {"C", "20 ms"}, "C": {"tau_m", "200 pF"}, "R": {"g_L", "100 MOhm"}, "g_L": {"R", "10 nS"}}

// lifMembrane checks that the membrane parameters the cell uses (C or
// tau_m, g_L or R) are positive, before the others are derived from them,
// so that the message names what was written and in its unit.
func lifMembrane(c *runtime.Call) error {
	for _, name := range []string{"tau_m", "R"} {
		if c.Given(lifPair[name][0]) {
			name = lifPair[name][0]
		}
		v, _ := c.Floats(name)
		for i, x := range v {
			if x > 0 {
				continue
			}
			at := ""
			if len(v) > 1 {
				at = fmt.Sprintf(" for neuron %d (counting from 0)", i)
			}
			return runtime.ValueErrorf("lif: %s must be positive, got %s%s; use e.g. %s = %s", name,
				units.FormatIn(x, units.MustParse(declUnit(c, name))), at, name, lifPair[name][1])
		}
	}
	return nil
}

// declUnit is the declared unit of a builtin's parameter.
func declUnit(c *runtime.Call, name string) string {
	for _, p := range c.Builtin.Params {
		if p.Name == name {
			return p.Unit
		}
	}
	return ""
}

// lifNote is the card note of a membrane parameter: what it is, and for the
// two derived from the others, from what (so the card does not read as if
// they had been given).
func lifNote(c *runtime.Call, name string) string {
	note := map[string]string{"tau_m": "membrane time constant", "C": "membrane capacitance", "R": "input resistance", "g_L": "leak conductance"}[name]
	other := lifPair[name][0]
	if c.Given(other) || (!c.Given(name) && (name == "C" || name == "g_L")) {
		switch name {
		case "tau_m":
			return note + ", C/g_L"
		case "C":
			return note + ", tau_m/R"
		case "R":
			return note + ", 1/g_L"
		case "g_L":
			return note + ", 1/R"
		}
	}
	return note
}

// has reports whether the model holds a parameter.
func (m *Model) has(name string) bool {
	for _, p := range m.params {
		if p.name == name {
			return true
		}
	}
	return false
}

func mapSlice(v []float64, f func(float64) float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = f(x)
	}
	return out
}

// zipSlice applies f element-wise, broadcasting a slice of one.
func zipSlice(a, b []float64, f func(x, y float64) float64) []float64 {
	n := max(len(a), len(b))
	if len(a) > 1 && len(b) > 1 && len(a) != len(b) {
		n = min(len(a), len(b)) // lengths are reported by Model.add on the other vectors
	}
	out := make([]float64, n)
	for i := range out {
		out[i] = f(a[min(i, len(a)-1)], b[min(i, len(b)-1)])
	}
	return out
}

var lifNormSpec = &modelSpec{
	title: "Normalised leaky integrate-and-fire", input: units.Dimensionless, example: "1.5 (in units of threshold)",
	equations: []string{`\tau_m \frac{dv}{dt} = v_{in}(t) - v`, `v \ge 1 \to \text{spike},\ v \leftarrow 0 \text{ held for } \tau_{ref}`,
		`r = 1 / (\tau_{ref} - \tau_m \ln(1 - 1/v_{in}))`},
	build: func(m *Model, i int) (neuron.Model, error) {
		return &neuron.NormLIF{Tau: m.get("tau_m", i), TRef: m.get("tau_ref", i)}, nil
	},
	rules: []rule{positiveRule("tau_m", "use e.g. tau_m = 20 ms"), nonNegRule("tau_ref", "use 0 ms for no refractory period")},
}

func init() {
	lifNormSpec.builtin = &runtime.Builtin{
		Name: "lif_norm", Category: "models", Returns: "a normalised LIF model",
		Doc: "The dimensionless leaky integrate-and-fire neuron: tau_m dv/dt = v_in − v, threshold 1, reset 0, held for tau_ref. " +
			"The input v_in is dimensionless, the steady-state potential in units of threshold; for constant v_in > 1 the rate is 1/(tau_ref − tau_m ln(1 − 1/v_in)). Integrated exactly between input changes.",
		Source: "Dayan & Abbott (2001), Theoretical Neuroscience, ch. 5; defaults common practice",
		Params: []runtime.Param{num("tau_m", "ms", "20 ms", "membrane time constant"), num("tau_ref", "ms", "2 ms", "refractory period")},
	}
	lifNormSpec.builtin.Fn = modelFn(&lifNormSpec, map[string]string{"tau_m": `\tau_m`, "tau_ref": `\tau_{ref}`})
}

var hhSpec = &modelSpec{
	title: "Hodgkin–Huxley", input: units.CurrentDensity, example: "10 uA/cm^2",
	equations: []string{`C \frac{dV}{dt} = I - \bar g_{Na} m^3 h (V - E_{Na}) - \bar g_K n^4 (V - E_K) - \bar g_L (V - E_L)`,
		`\frac{dx}{dt} = \phi\,(\alpha_x(V)(1 - x) - \beta_x(V)\,x),\quad x \in \{m, h, n\},\quad \phi = 3^{(T - 6.3)/10}`,
		`\alpha_m = \frac{0.1(V+40)}{1 - e^{-(V+40)/10}},\ \beta_m = 4 e^{-(V+65)/18}`,
		`\alpha_h = 0.07 e^{-(V+65)/20},\ \beta_h = \frac{1}{1 + e^{-(V+35)/10}}`,
		`\alpha_n = \frac{0.01(V+55)}{1 - e^{-(V+55)/10}},\ \beta_n = 0.125 e^{-(V+65)/80}`},
	build: func(m *Model, i int) (neuron.Model, error) {
		return &neuron.HH{C: m.get("C", i), GNa: m.get("g_Na", i), GK: m.get("g_K", i), GL: m.get("g_L", i),
			ENa: m.get("E_Na", i), EK: m.get("E_K", i), EL: m.get("E_L", i),
			Temp: m.get("temperature", i) - 273.15, VDetect: m.get("V_detect", i)}, nil
	},
	rules: []rule{
		{name: "temperature", ok: func(k float64) bool { return k >= 273.15+neuron.HHMinTemp && k <= 273.15+neuron.HHMaxTemp },
			want: fmt.Sprintf("must lie between %g °C and %g °C", neuron.HHMinTemp, neuron.HHMaxTemp), hint: neuron.HHTempWhy},
		positiveRule("C", "use e.g. C = 1 uF/cm^2"),
		nonNegRule("g_Na", "use 0 mS/cm^2 to block the channel"), nonNegRule("g_K", "use 0 mS/cm^2 to block the channel"),
		nonNegRule("g_L", "use e.g. g_L = 0.3 mS/cm^2"),
	},
}

func init() {
	hhSpec.builtin = &runtime.Builtin{
		Name: "hh", Category: "models", Returns: "a Hodgkin–Huxley model",
		Doc: "The Hodgkin–Huxley squid giant axon membrane, in the modern convention with rest near −65 mV: sodium (m³h), potassium (n⁴) and leak currents, " +
			"C dV/dt = I − ḡNa m³h (V − E_Na) − ḡK n⁴ (V − E_K) − ḡL (V − E_L); gate rates scale by Q10 = 3 from 6.3 °C. " +
			"Parameters are per membrane area, so the input is a current density (uA/cm^2). Spikes are upward crossings of V_detect, located by interpolation.",
		Source: "Hodgkin & Huxley (1952), J. Physiol. 117:500–544",
		Params: []runtime.Param{
			num("temperature", "degC", "6.3 degC", "temperature; rates scale by Q10 = 3"),
			num("C", "uF/cm^2", "1 uF/cm^2", "membrane capacitance per area"),
			num("g_Na", "mS/cm^2", "120 mS/cm^2", "maximal sodium conductance"),
			num("g_K", "mS/cm^2", "36 mS/cm^2", "maximal potassium conductance"),
			num("g_L", "mS/cm^2", "0.3 mS/cm^2", "leak conductance"),
			num("E_Na", "mV", "50 mV", "sodium reversal potential"),
			num("E_K", "mV", "-77 mV", "potassium reversal potential"),
			num("E_L", "mV", "-54.387 mV", "leak reversal potential"),
			num("V_detect", "mV", "0 mV", "spike detection threshold"),
		},
	}
	hhSpec.builtin.Fn = modelFn(&hhSpec, map[string]string{"temperature": "T", "C": "C", "g_Na": `\bar g_{Na}`,
		"g_K": `\bar g_K`, "g_L": `\bar g_L`, "E_Na": `E_{Na}`, "E_K": `E_K`, "E_L": `E_L`, "V_detect": `V_{detect}`})
}

var adexSpec = &modelSpec{
	title: "Adaptive exponential integrate-and-fire", input: units.Current, example: "1 nA",
	equations: []string{`C \frac{dV}{dt} = -g_L (V - E_L) + g_L \Delta_T e^{(V - V_T)/\Delta_T} - w + I`,
		`\tau_w \frac{dw}{dt} = a (V - E_L) - w`, `V \ge V_{peak} \to V \leftarrow V_r,\ w \leftarrow w + b`},
	build: func(m *Model, i int) (neuron.Model, error) {
		return &neuron.AdEx{C: m.get("C", i), GL: m.get("g_L", i), EL: m.get("E_L", i), VT: m.get("V_T", i),
			DeltaT: m.get("Delta_T", i), TauW: m.get("tau_w", i), A: m.get("a", i), B: m.get("b", i),
			VR: m.get("V_r", i), VPeak: m.get("V_peak", i)}, nil
	},
	rules: []rule{positiveRule("C", "use e.g. C = 281 pF"), positiveRule("g_L", "use e.g. g_L = 30 nS"),
		positiveRule("Delta_T", "use e.g. Delta_T = 2 mV"), positiveRule("tau_w", "use e.g. tau_w = 144 ms"),
		{name: "V_r", below: "V_peak"}},
}

func init() {
	adexSpec.builtin = &runtime.Builtin{
		Name: "adex", Category: "models", Returns: "an AdEx model",
		Doc: "The adaptive exponential integrate-and-fire neuron: C dV/dt = −g_L (V − E_L) + g_L Δ_T exp((V − V_T)/Δ_T) − w + I, τ_w dw/dt = a (V − E_L) − w; " +
			"at V_peak, V ← V_r and w ← w + b. Defaults are the published ones (V_peak = 20 mV from memory). Input: a current (pA, nA).",
		Source: "Brette & Gerstner (2005), J. Neurophysiol. 94:3637–3642",
		Params: []runtime.Param{
			num("C", "pF", "281 pF", "membrane capacitance"), num("g_L", "nS", "30 nS", "leak conductance"),
			num("E_L", "mV", "-70.6 mV", "leak reversal potential"), num("V_T", "mV", "-50.4 mV", "threshold slope centre"),
			num("Delta_T", "mV", "2 mV", "slope factor"), num("tau_w", "ms", "144 ms", "adaptation time constant"),
			num("a", "nS", "4 nS", "subthreshold adaptation"), num("b", "nA", "0.0805 nA", "spike-triggered adaptation"),
			num("V_r", "mV", "-70.6 mV", "reset potential"), num("V_peak", "mV", "20 mV", "spike cut-off"),
		},
	}
	adexSpec.builtin.Fn = modelFn(&adexSpec, map[string]string{"C": "C", "g_L": "g_L", "E_L": "E_L", "V_T": "V_T",
		"Delta_T": `\Delta_T`, "tau_w": `\tau_w`, "a": "a", "b": "b", "V_r": "V_r", "V_peak": `V_{peak}`})
}

var izhSpec = &modelSpec{
	title: "Izhikevich simple model", input: units.Dimensionless, example: "10 (published units)",
	equations: []string{`\frac{dv}{dt} = 0.04 v^2 + 5 v + 140 - u + I`, `\frac{du}{dt} = a (b v - u)`,
		`v \ge v_{peak} \to v \leftarrow c,\ u \leftarrow u + d`},
	build: func(m *Model, i int) (neuron.Model, error) {
		// The package keeps a in 1/ms and c, v_peak in mV, as published.
		return &neuron.Izhikevich{A: m.get("a", i) / 1000, B: m.get("b", i), C: m.get("c", i) * 1000,
			D: m.get("d", i), VPeak: m.get("v_peak", i) * 1000}, nil
	},
	rules: []rule{positiveRule("a", "use e.g. a = 0.02 1/ms"), {name: "c", below: "v_peak"}},
}

func init() {
	izhSpec.builtin = &runtime.Builtin{
		Name: "izhikevich", Category: "models", Returns: "an Izhikevich model",
		Doc: "The Izhikevich simple model, v' = 0.04 v² + 5 v + 140 − u + I and u' = a (b v − u) with v in mV and t in ms; at v_peak, v ← c and u ← u + d. " +
			"class picks a published parameter set (regular spiking, intrinsically bursting, chattering, fast spiking, low-threshold spiking, thalamo-cortical, resonator); a, b, c, d override it. " +
			"The input I is dimensionless, in the published units (as are b and d).",
		Source: "Izhikevich (2003), IEEE Trans. Neural Netw. 14:1569–1572, fig. 2",
		Params: []runtime.Param{
			{Name: "class", Kind: runtime.KindString, Default: `"regular spiking"`, Doc: "published firing class"},
			opt("a", "1/ms", "recovery rate; default from class"),
			{Name: "b", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true, Doc: "recovery sensitivity; default from class"},
			opt("c", "mV", "reset potential; default from class"),
			{Name: "d", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true, Doc: "recovery jump after a spike; default from class"},
			num("v_peak", "mV", "30 mV", "spike cut-off"),
		},
		Fn: izhFn,
	}
}

func izhFn(c *runtime.Call) (runtime.Value, error) {
	class := c.Str("class")
	p, ok := neuron.IzhikevichClasses[class]
	if !ok {
		return nil, runtime.ValueErrorf("izhikevich: unknown class %q; use one of %s", class, strings.Join(izhClasses(), ", "))
	}
	m := &Model{spec: izhSpec, n: 1, class: class}
	defs := map[string]float64{"a": p.A * 1000, "b": p.B, "c": p.C / 1000, "d": p.D}
	for _, d := range c.Builtin.Params[1:] {
		v, dim := []float64{defs[d.Name]}, units.Dimensionless
		if d.Name == "c" {
			dim = units.Voltage
		} else if d.Name == "a" {
			dim = units.Frequency
		}
		if c.Has(d.Name) {
			v, dim = c.Floats(d.Name)
		}
		if err := m.add(d.Name, d.Name, d.Unit, d.Doc, dim, v); err != nil {
			return nil, err
		}
	}
	return m.finish(c)
}

func izhClasses() []string {
	return []string{`"regular spiking"`, `"intrinsically bursting"`, `"chattering"`, `"fast spiking"`,
		`"low-threshold spiking"`, `"thalamo-cortical"`, `"resonator"`}
}

var rateSpec = &modelSpec{
	title:     "Rate neuron",
	equations: []string{`\tau \frac{dr}{dt} = -r + f(g I + b)`, `\tau = 0:\ r = f(g I + b)`},
	build: func(m *Model, i int) (neuron.Model, error) {
		f := m.rate
		return &neuron.Rate{Tau: m.get("tau", i), Gain: m.get("gain", i), Bias: m.get("bias", i), F: func(x float64) float64 {
			y, err := f(x)
			if err != nil {
				m.rateErr = err
				return math.NaN()
			}
			return y
		}}, nil
	},
}

func init() {
	rateSpec.builtin = &runtime.Builtin{
		Name: "rate_neuron", Category: "models", Returns: "a rate-neuron model",
		Doc: "A rate neuron whose output follows an activation function of its input: tau dr/dt = −r + f(gain·I + bias), or r = f(gain·I + bias) when tau = 0. " +
			"f is any function of one variable (a builtin such as logistic, or a formula); its argument is dimensionless, so gain carries the inverse unit of the input (gain = 2/nA takes currents, a bare number takes dimensionless input). " +
			"The output r has the unit f returns.",
		Source: "Dayan & Abbott (2001), Theoretical Neuroscience, ch. 7 (firing-rate models)",
		Params: []runtime.Param{
			{Name: "activation", Kind: runtime.KindFunction, Doc: "activation function of one dimensionless variable"},
			{Name: "gain", Kind: runtime.KindNumbers, Default: "1", Doc: "input gain, in 1/(input unit)"},
			pure("bias", "0", "input bias"),
			num("tau", "ms", "10 ms", "time constant; 0 for an instantaneous rate"),
		},
		Fn: rateFn,
	}
}

func rateFn(c *runtime.Call) (runtime.Value, error) {
	fn := c.Value("activation").(runtime.Function)
	f, out, err := c.ScalarFunc(fn, units.Dimensionless, 0)
	if err != nil {
		return nil, runtime.ValueErrorf("rate_neuron: the activation %s cannot be called with one number: %v", fn.FuncName(), err)
	}
	m, err := newModel(c, rateSpec, map[string]string{"gain": "g", "bias": "b", "tau": `\tau`})
	if err != nil {
		return nil, err
	}
	spec := *rateSpec
	_, gd := c.Floats("gain")
	spec.input = units.Dimensionless.Div(gd)
	spec.example = "1 " + runtime.ChooseUnit([]float64{1}, spec.input).Symbol
	m.spec, m.rate, m.rateFn, m.outDim = &spec, f, fn, out
	return m.finish(c)
}
