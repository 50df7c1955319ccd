package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/stimulus"
)

func init() { domains = append(domains, registerStimuli) }

// Stimulus is an injected-current waveform of the language: the plain-Go
// waveform with the dimension of its values (a current, a current density
// or dimensionless), a description in the units it was written in, the
// last time anything changes (for plotting) and the end of any noise it
// holds (simulate checks the noise covers the run).
type Stimulus struct {
	in       stimulus.Input
	dim      units.Dim
	desc     string
	end      float64
	noiseEnd float64
}

var (
	_ runtime.Shower  = (*Stimulus)(nil)
	_ runtime.Operand = (*Stimulus)(nil)
	_ Plottable       = (*Stimulus)(nil)
)

// Type implements runtime.Value.
func (*Stimulus) Type() string { return "stimulus" }

// String is the description, "step 0.5 nA from 100 ms to 600 ms".
func (s *Stimulus) String() string { return "stimulus: " + s.desc }

// Dim is the dimension of the stimulus values.
func (s *Stimulus) Dim() units.Dim { return s.dim }

// Input is the waveform for a simulator: a piecewise-constant view when the
// waveform is one, so that exact integrators can step from change to change.
func (s *Stimulus) Input() stimulus.Input {
	if pw, ok := stimulus.AsPiecewise(s.in); ok {
		return pw
	}
	return s.in
}

// Show implements runtime.Shower: the waveform's figure.
func (s *Stimulus) Show() ([]display.Bundle, error) {
	f, err := s.Figure()
	if err != nil {
		return nil, err
	}
	b, err := f.Bundle()
	return []display.Bundle{b}, err
}

// Figure implements Plottable: the waveform from 0 to a little past its
// last change (1 s for a waveform that never changes).
func (s *Stimulus) Figure() (*display.Figure, error) {
	stop := s.end * 1.1
	if !(stop > 0) || math.IsInf(stop, 0) {
		stop = 1
	}
	t, y := s.sample(stop, 2001)
	ta, ya := NewAxis("time", t, units.Time), NewAxis("I", y, s.dim)
	return &display.Figure{Title: s.desc, Panels: []display.Panel{{XLabel: ta.Label, YLabel: ya.Label,
		Series: []display.Series{{Kind: display.Line, Name: "stimulus", X: ta.Data, Y: ya.Data}}}}}, nil
}

// sample evaluates the waveform at n points from 0 to stop.
func (s *Stimulus) sample(stop float64, n int) (t, y []float64) {
	t, y = make([]float64, n), make([]float64, n)
	for i := range t {
		t[i] = stop * float64(i) / float64(n-1)
	}
	for i, x := range t {
		y[i] = s.in.At(x)
	}
	return t, y
}

// Operate implements runtime.Operand: stimulus ± stimulus, stimulus ±
// constant, stimulus × number and stimulus / number.
func (s *Stimulus) Operate(op string, other runtime.Value, right bool) (runtime.Value, bool, error) {
	switch o := other.(type) {
	case *Stimulus:
		if op != "+" && op != "-" {
			return nil, false, nil
		}
		return s.combine(op, o, right)
	case runtime.Quantity:
		switch op {
		case "*":
			return s.scaled(o.V, s.dim.Mul(o.Dim), units.Format(o.V, o.Dim)+" × "), true, nil
		case "/":
			if right {
				return nil, true, runtime.ValueErrorf("cannot divide by a stimulus; scale it instead, e.g. 2 * step(…)")
			}
			return s.scaled(1/o.V, s.dim.Div(o.Dim), "1/"+units.Format(o.V, o.Dim)+" × "), true, nil
		case "+", "-":
			c := &Stimulus{in: stimulus.Constant{Value: o.V}, dim: o.Dim, desc: "constant " + o.String(), noiseEnd: math.Inf(1)}
			return s.combine(op, c, right)
		}
	}
	return nil, false, nil
}

func (s *Stimulus) scaled(f float64, d units.Dim, prefix string) *Stimulus {
	return &Stimulus{in: stimulus.Scaled{Factor: f, S: s.in}, dim: d, desc: prefix + "(" + s.desc + ")", end: s.end, noiseEnd: s.noiseEnd}
}

// combine adds (or subtracts) o to s; right means o is the left operand.
func (s *Stimulus) combine(op string, o *Stimulus, right bool) (runtime.Value, bool, error) {
	a, b := s, o
	if right {
		a, b = o, s
	}
	if a.dim != b.dim {
		return nil, true, runtime.UnitErrorf("cannot add stimuli of %s and %s; write both in one kind of unit (both currents, or both current densities)",
			a.dim.Describe(), b.dim.Describe())
	}
	bin := b.in
	if op == "-" {
		bin = stimulus.Scaled{Factor: -1, S: b.in}
	}
	return &Stimulus{in: stimulus.Sum{Parts: []stimulus.Input{a.in, bin}}, dim: a.dim, desc: a.desc + " " + op + " " + b.desc,
		end: math.Max(a.end, b.end), noiseEnd: math.Min(a.noiseEnd, b.noiseEnd)}, true, nil
}

// newStimulus validates a waveform and wraps it.
func newStimulus(name string, w stimulus.Stimulus, d units.Dim, desc string, end float64) (*Stimulus, error) {
	if err := w.Validate(); err != nil {
		return nil, runtime.ValueErrorf("%s: %s", name, trimPkg(err.Error()))
	}
	if math.IsInf(end, 0) || math.IsNaN(end) {
		end = 0
	}
	return &Stimulus{in: w, dim: d, desc: desc, end: end, noiseEnd: math.Inf(1)}, nil
}

// trimPkg drops a "package: " prefix of a numerics error.
func trimPkg(msg string) string {
	for _, p := range []string{"stimulus: ", "neuron: ", "spikes: "} {
		if len(msg) > len(p) && msg[:len(p)] == p {
			return msg[len(p):]
		}
	}
	return msg
}

// sameDim checks that a companion amplitude (an offset, a mean) has the
// dimension of the main one; a plain zero is accepted for any.
func sameDim(name, what string, q runtime.Quantity, d units.Dim) error {
	if q.Dim == d || (q.V == 0 && q.Dim.IsDimensionless()) {
		return nil
	}
	return runtime.UnitErrorf("%s: %s is %s but the amplitude is %s; give both in one kind of unit", name, what, q.Dim.Describe(), d.Describe())
}

func fmtQ(v float64, d units.Dim) string { return units.Format(v, d) }

func window(start, stop float64) string {
	if math.IsInf(stop, 1) {
		return "from " + fmtQ(start, units.Time)
	}
	return "from " + fmtQ(start, units.Time) + " to " + fmtQ(stop, units.Time)
}

// checkWindow reports a stop not after start in the units the cell wrote,
// before the numerics package would tell it in seconds.
func checkWindow(c *runtime.Call) error {
	if c.Has("stop") && !(c.Float("stop") > c.Float("start")) {
		return runtime.ValueErrorf("%s: stop (%s) must be after start (%s); swap them or lengthen the window", c.Builtin.Name, c.Quantity("stop"), c.Quantity("start"))
	}
	return nil
}

// checkPositive reports a time or amplitude argument that is not positive
// (or, with zeroOK, negative), in the unit the cell wrote.
func checkPositive(c *runtime.Call, name string, zeroOK bool, hint string) error {
	v := c.Float(name)
	if v > 0 || (zeroOK && v == 0) {
		return nil
	}
	want := "positive"
	if zeroOK {
		want = "≥ 0"
	}
	return runtime.ValueErrorf("%s: %s must be %s, got %s; %s", c.Builtin.Name, name, want, c.Quantity(name), hint)
}

// stopOf is the stop argument, +Inf when not given.
func stopOf(c *runtime.Call) float64 {
	if c.Has("stop") {
		return c.Float("stop")
	}
	return math.Inf(1)
}

func amp(doc string) runtime.Param {
	return runtime.Param{Name: "amplitude", Kind: runtime.KindNumber, Doc: doc}
}

func timeParam(name, def, doc string) runtime.Param {
	return runtime.Param{Name: name, Kind: runtime.KindNumber, Unit: "ms", Default: def, Doc: doc}
}

func optTime(name, doc string) runtime.Param {
	return runtime.Param{Name: name, Kind: runtime.KindNumber, Unit: "ms", Optional: true, Doc: doc}
}

const ampDoc = "a current (nA), a current density (uA/cm^2) or a dimensionless input, to match the model"

func registerStimuli(reg *runtime.Registry) {
	reg.Register(constantBuiltin(), stepBuiltin(), rampBuiltin(), sineBuiltin(), pulsesBuiltin(), noiseBuiltin(), recordedBuiltin())
}

func constantBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "constant", Category: "stimuli", Returns: "a stimulus",
		Doc:    "A constant injected current, the same at all times. Its unit must suit the model: a current for lif and adex, a current density for hh, a bare number for lif_norm and izhikevich.",
		Params: []runtime.Param{amp(ampDoc)},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			q := c.Quantity("amplitude")
			return newStimulus("constant", stimulus.Constant{Value: q.V}, q.Dim, "constant "+q.String(), 0)
		},
	}
}

func stepBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "step", Category: "stimuli", Returns: "a stimulus",
		Doc: "A current step: amplitude from start until stop (on for start ≤ t < stop), zero elsewhere; without stop it stays on. " +
			"Steps add (step(…) + step(…)) and scale (2 * step(…)) to build a protocol.",
		Params: []runtime.Param{amp(ampDoc), timeParam("start", "0 ms", "onset"), optTime("stop", "offset; none means never")},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			if err := checkWindow(c); err != nil {
				return nil, err
			}
			q, on, off := c.Quantity("amplitude"), c.Float("start"), stopOf(c)
			return newStimulus("step", stimulus.Step{Amplitude: q.V, Start: on, Stop: off}, q.Dim,
				"step "+q.String()+" "+window(on, off), math.Max(on, off))
		},
	}
}

func rampBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "ramp", Category: "stimuli", Returns: "a stimulus",
		Doc: "A linear ramp from `from` at start to `to` at stop, zero outside [start, stop). " +
			"A slow ramp finds the current at which a model starts firing in one run.",
		Params: []runtime.Param{
			{Name: "from", Kind: runtime.KindNumber, Doc: "value at start; 0 for any unit"},
			{Name: "to", Kind: runtime.KindNumber, Doc: "value reached at stop, " + ampDoc},
			timeParam("start", "0 ms", "start of the ramp"), {Name: "stop", Kind: runtime.KindNumber, Unit: "ms", Doc: "end of the ramp"},
		},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			from, to := c.Quantity("from"), c.Quantity("to")
			if err := sameDim("ramp", "from", from, to.Dim); err != nil {
				return nil, err
			}
			if err := checkWindow(c); err != nil {
				return nil, err
			}
			on, off := c.Float("start"), c.Float("stop")
			return newStimulus("ramp", stimulus.Ramp{From: from.V, To: to.V, Start: on, Stop: off}, to.Dim,
				"ramp "+fmtQ(from.V, to.Dim)+" → "+to.String()+" "+window(on, off), off)
		},
	}
}

func sineBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "sine", Category: "stimuli", Returns: "a stimulus",
		Doc: "A sinusoidal current offset + amplitude·sin(2π·frequency·(t − start) + phase) on [start, stop), zero outside; without stop it never ends. phase is in radians.",
		Params: []runtime.Param{amp(ampDoc), {Name: "frequency", Kind: runtime.KindNumber, Unit: "Hz", Doc: "frequency"},
			{Name: "phase", Kind: runtime.KindNumber, Dimensionless: true, Default: "0", Doc: "phase in radians"},
			{Name: "offset", Kind: runtime.KindNumber, Default: "0", Doc: "constant added, in the amplitude's unit"},
			timeParam("start", "0 ms", "start"), optTime("stop", "end; none means never")},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			q, off := c.Quantity("amplitude"), c.Quantity("offset")
			if err := sameDim("sine", "offset", off, q.Dim); err != nil {
				return nil, err
			}
			if err := checkWindow(c); err != nil {
				return nil, err
			}
			on, stop := c.Float("start"), stopOf(c)
			w := stimulus.Sine{Amplitude: q.V, Frequency: c.Float("frequency"), Phase: c.Float("phase"), Offset: off.V, Start: on, Stop: stop}
			return newStimulus("sine", w, q.Dim, fmt.Sprintf("sine %s at %s %s", q, c.Quantity("frequency"), window(on, stop)), stop)
		},
	}
}

func pulsesBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "pulses", Category: "stimuli", Returns: "a stimulus",
		Doc: "A pulse train: count rectangular pulses of the given amplitude and width, one every period (or at rate pulses per second; give one of the two), from start. count = 0 means an endless train.",
		Params: []runtime.Param{amp(ampDoc), timeParam("width", "1 ms", "pulse length"),
			{Name: "rate", Kind: runtime.KindNumber, Unit: "Hz", Optional: true, Doc: "pulses per second"},
			optTime("period", "time from one pulse onset to the next"),
			{Name: "count", Kind: runtime.KindNumber, Dimensionless: true, Default: "0", Doc: "number of pulses; 0 = endless"},
			timeParam("start", "0 ms", "onset of the first pulse")},
		Fn: pulsesFn,
	}
}

func pulsesFn(c *runtime.Call) (runtime.Value, error) {
	if c.Has("rate") == c.Has("period") {
		return nil, runtime.ArgumentErrorf("pulses: give exactly one of rate (e.g. 20 Hz) or period (e.g. 50 ms)")
	}
	n, err := c.Int("count", 0, 1<<30)
	if err != nil {
		return nil, err
	}
	if err := checkPositive(c, "width", false, "use e.g. width = 1 ms"); err != nil {
		return nil, err
	}
	for _, name := range []string{"rate", "period"} {
		if c.Has(name) {
			if err := checkPositive(c, name, false, "use e.g. rate = 20 Hz or period = 50 ms"); err != nil {
				return nil, err
			}
		}
	}
	q := c.Quantity("amplitude")
	w := stimulus.PulseTrain{Amplitude: q.V, Width: c.Float("width"), Count: n, Start: c.Float("start")}
	p := 0.0
	if c.Has("rate") {
		w.Rate = c.Float("rate")
		p = 1 / w.Rate
	} else {
		w.Period = c.Float("period")
		p = w.Period
	}
	end := math.Inf(1)
	desc := fmt.Sprintf("pulses of %s, %s wide, every %s from %s", q, fmtQ(w.Width, units.Time), fmtQ(p, units.Time), fmtQ(w.Start, units.Time))
	if n > 0 {
		end = w.Start + float64(n)*p
		desc = fmt.Sprintf("%d ", n) + desc
	}
	return newStimulus("pulses", w, q.Dim, desc, end)
}

func noiseBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "noise", Category: "stimuli", Returns: "a stimulus",
		Doc: "Ornstein–Uhlenbeck noise: a fluctuating current of stationary mean and standard deviation sigma with correlation time tau, " +
			"generated on a grid of step dt from start for duration with the exact update x ← μ + (x − μ)e^(−dt/τ) + σ√(1 − e^(−2dt/τ))·ξ, and zero after it. " +
			"Draws come from the session's seeded source (see seed), so a notebook repeats exactly. Add it to a step: step(…) + noise(…).",
		Source: "Gillespie (1996), Phys. Rev. E 54:2084–2091 (exact OU update)",
		Params: []runtime.Param{
			{Name: "sigma", Kind: runtime.KindNumber, Doc: "stationary standard deviation, " + ampDoc},
			timeParam("tau", "5 ms", "correlation time"),
			{Name: "mean", Kind: runtime.KindNumber, Default: "0", Doc: "stationary mean, in sigma's unit"},
			timeParam("duration", "1000 ms", "length of the noise; it is zero afterwards"),
			timeParam("dt", "0.1 ms", "grid step; the value holds between grid points"),
			timeParam("start", "0 ms", "first grid point"),
		},
		Fn: noiseFn,
	}
}

func noiseFn(c *runtime.Call) (runtime.Value, error) {
	sig, mean := c.Quantity("sigma"), c.Quantity("mean")
	if err := sameDim("noise", "mean", mean, sig.Dim); err != nil {
		return nil, err
	}
	for _, p := range []struct {
		name   string
		zeroOK bool
		hint   string
	}{{"sigma", true, "a standard deviation has no sign; give its size"}, {"tau", false, "use a correlation time such as 5 ms"},
		{"dt", false, "use a grid step such as 0.1 ms"}, {"duration", false, "give the length of the run, e.g. 1000 ms"}} {
		if err := checkPositive(c, p.name, p.zeroOK, p.hint); err != nil {
			return nil, err
		}
	}
	p := stimulus.OUParams{Mean: mean.V, Sigma: sig.V, Tau: c.Float("tau"), Dt: c.Float("dt"),
		Start: c.Float("start"), Duration: c.Float("duration"), Seed: c.Seed()}
	ou, err := stimulus.NewOUContext(c.Ctx, p)
	if err != nil {
		if c.Ctx.Err() != nil {
			return nil, err
		}
		return nil, runtime.ValueErrorf("noise: %s", trimPkg(err.Error()))
	}
	end := p.Start + p.Duration
	desc := fmt.Sprintf("noise sigma %s, tau %s, mean %s %s", sig, fmtQ(p.Tau, units.Time), fmtQ(mean.V, sig.Dim), window(p.Start, end))
	return &Stimulus{in: ou, dim: sig.Dim, desc: desc, end: end, noiseEnd: end}, nil
}

func recordedBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "playback", Category: "stimuli", Returns: "a stimulus",
		Doc: "A stimulus from recorded samples, such as two columns of a table: values[i] at time t[i] (strictly increasing). " +
			`mode = "linear" interpolates between samples, "hold" keeps each value until the next sample; outside = "zero" makes it 0 outside the recording, "hold" keeps the end values.`,
		Params: []runtime.Param{
			{Name: "t", Kind: runtime.KindNumbers, Unit: "ms", Doc: "sample times"},
			{Name: "values", Kind: runtime.KindNumbers, Doc: "sampled values, " + ampDoc},
			{Name: "mode", Kind: runtime.KindString, Default: `"linear"`, Doc: `"linear" or "hold"`},
			{Name: "outside", Kind: runtime.KindString, Default: `"zero"`, Doc: `"zero" or "hold"`},
		},
		Fn: recordedFn,
	}
}

func recordedFn(c *runtime.Call) (runtime.Value, error) {
	t, _ := c.Floats("t")
	v, d := c.Floats("values")
	if len(t) != len(v) {
		return nil, runtime.ValueErrorf("recorded: %d times but %d values; give one value per time", len(t), len(v))
	}
	w := stimulus.Sampled{Times: t, Values: v}
	switch c.Str("mode") {
	case "linear":
	case "hold":
		w.Mode = stimulus.Hold
	default:
		return nil, runtime.ValueErrorf(`recorded: mode must be "linear" or "hold", got %q`, c.Str("mode"))
	}
	switch c.Str("outside") {
	case "zero":
	case "hold":
		w.Outside = stimulus.HoldEnds
	default:
		return nil, runtime.ValueErrorf(`recorded: outside must be "zero" or "hold", got %q`, c.Str("outside"))
	}
	if len(t) < 2 {
		return nil, runtime.ValueErrorf("recorded: needs at least 2 samples, got %d", len(t))
	}
	desc := fmt.Sprintf("recorded, %d samples %s", len(t), window(t[0], t[len(t)-1]))
	return newStimulus("playback", w, d, desc, t[len(t)-1])
}
