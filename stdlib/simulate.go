package stdlib

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
	"github.com/loligo-lab/loligo/stdlib/stimulus"
)

func init() { domains = append(domains, registerSimulate) }

// maxTraceValues bounds what one simulate call may record: 20 M float64
// values (160 MB), a tenth of the numerics package's own limit, because a
// session keeps its traces and the machine is shared.
const maxTraceValues = 20_000_000

// methods maps the language's method names to integrators.
var methods = map[string]neuron.Method{"auto": neuron.Auto, "rk4": neuron.RK4, "exp_euler": neuron.ExponentialEuler,
	"dopri5": neuron.DormandPrince54, "exact": neuron.Exact}

func registerSimulate(reg *runtime.Registry) {
	reg.Register(simulateBuiltin())
}

func simulateBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "simulate", Category: "simulation", Returns: "a trace, or a population result for a model with vector parameters",
		Doc: "Simulates a model driven by a stimulus for duration and returns its trace: time t, every recorded state variable (v is the membrane potential), " +
			"the spike times and the input. method picks the integrator: \"auto\" (exact for LIF models, rk4 otherwise), \"rk4\" (fixed step dt), " +
			"\"exp_euler\" (exponential Euler, Hodgkin–Huxley only, first order), \"dopri5\" (adaptive Dormand–Prince 5(4) to the relative tolerance; dt is then the sample spacing) or \"exact\" (LIF). " +
			"record lists the variables to keep (all by default) and every keeps one sample in every; spikes are found at every step whatever is recorded. " +
			"A model whose parameters are vectors is simulated as a population of independent neurons sharing the stimulus, giving spike trains for rasters and PSTHs.",
		Source: "Runge–Kutta 4 and Dormand & Prince (1980), J. Comput. Appl. Math. 6:19–26; exact LIF integration as in Dayan & Abbott (2001), ch. 5",
		Params: []runtime.Param{
			{Name: "model", Kind: runtime.KindAny, Doc: "a model such as lif(), hh(), adex(), izhikevich(), rate_neuron(…)"},
			{Name: "stimulus", Kind: runtime.KindAny, Optional: true, Doc: "a stimulus, or a constant number; none means no input"},
			{Name: "duration", Kind: runtime.KindNumber, Unit: "ms", Doc: "simulated time"},
			{Name: "dt", Kind: runtime.KindNumber, Unit: "ms", Default: "0.01 ms", Doc: "step of the fixed-step methods and sample spacing"},
			{Name: "method", Kind: runtime.KindString, Default: `"auto"`, Doc: `"auto", "rk4", "exp_euler", "dopri5" or "exact"`},
			{Name: "tolerance", Kind: runtime.KindNumber, Dimensionless: true, Default: "1e-6", Doc: "relative tolerance of dopri5"},
			{Name: "record", Kind: runtime.KindList, Optional: true, Doc: `variable names to record, e.g. ["V", "n"]; default all`},
			{Name: "every", Kind: runtime.KindNumber, Dimensionless: true, Default: "1", Doc: "keep every N-th sample"},
		},
		Fn: simulateFn,
	}
}

// runSpec is a checked simulate call.
type runSpec struct {
	model    *Model
	stim     *Stimulus // nil: no input
	duration float64
	set      neuron.Settings
}

func simulateFn(c *runtime.Call) (runtime.Value, error) {
	r, err := checkRun(c)
	if err != nil {
		return nil, err
	}
	if r.model.n > 1 {
		return simulatePopulation(c, r)
	}
	nm, err := r.model.Neuron(0)
	if err != nil {
		return nil, err
	}
	r.model.rateErr = nil
	set := r.set
	var prog *display.Progress
	if r.duration/set.Dt >= longRun {
		prog = progressFor(c, "simulating "+fmtQ(r.duration, units.Time)+" of model time (ms done)", r.duration*1e3)
		set.Progress = func(t float64) { prog.Set(t * 1e3) }
	}
	tr, err := neuron.Simulate(c.Ctx, neuron.Problem{Model: nm, Input: r.input(), Duration: r.duration}, &set)
	if prog != nil {
		if err != nil && c.Ctx.Err() != nil {
			prog.Interrupted()
		} else {
			prog.Done()
		}
	}
	if err != nil {
		return nil, simError(c, r.model, err)
	}
	return newTrace(r, nm, tr), nil
}

// longRun is the number of steps from which a single simulation shows its
// progress: about a second of work for a conductance model.
const longRun = 2_000_000

// simError turns a numerics error into the language's: interrupts pass
// through, an activation's own error comes first, the rest are ValueErrors.
func simError(c *runtime.Call, m *Model, err error) error {
	if c.Ctx.Err() != nil || errors.Is(err, context.Canceled) {
		return err
	}
	if m.rateErr != nil {
		return m.rateErr
	}
	return runtime.ValueErrorf("simulate: %s", neuronMsg(err, m))
}

// goNames turns the numerics package's Go names of methods and settings in
// its advice into what a cell writes.
var goNames = strings.NewReplacer(
	"use RK4 or DormandPrince54", `use method = "rk4" or "dopri5"`,
	"use RK4, ExponentialEuler, DormandPrince54 or Exact", `use method = "rk4", "exp_euler", "dopri5" or "exact"`,
	"use DormandPrince54", `use method = "dopri5"`,
	"the Exact method", `method "exact"`,
	"; set RheobaseSettings.Hi to an amplitude that fires", "; the model may not fire under a long step at all",
)

// neuronMsg is a numerics error as the language tells it: without the
// package prefix, with the language's method names, and for the
// Hodgkin–Huxley membrane the exponential Euler step offered too (it stays
// stable for the fast sodium gate at steps where rk4 blows up).
func neuronMsg(err error, m *Model) string {
	msg := goNames.Replace(trimPkg(err.Error()))
	if m != nil && m.spec == hhSpec && strings.HasSuffix(msg, `use method = "dopri5"`) {
		msg += ` or "exp_euler"`
	}
	return msg
}

func (r *runSpec) input() neuron.Input {
	if r.stim == nil {
		return nil
	}
	return r.stim.Input()
}

// checkRun unpacks and checks every argument of simulate before any work.
func checkRun(c *runtime.Call) (*runSpec, error) {
	m, err := modelArg(c, "simulate")
	if err != nil {
		return nil, err
	}
	r := &runSpec{model: m, duration: c.Float("duration")}
	if r.stim, err = stimulusArg(c, m); err != nil {
		return nil, err
	}
	dt := c.Float("dt")
	switch {
	case !(r.duration > 0) || math.IsInf(r.duration, 0):
		return nil, runtime.ValueErrorf("simulate: duration must be positive and finite, got %s; use e.g. 200 ms", c.Quantity("duration"))
	case !(dt > 0) || math.IsInf(dt, 0):
		return nil, runtime.ValueErrorf("simulate: dt must be positive, got %s; use a step such as 0.01 ms", c.Quantity("dt"))
	case dt > r.duration:
		return nil, runtime.ValueErrorf("simulate: dt %s is longer than the duration %s; use a smaller step such as 0.01 ms", c.Quantity("dt"), c.Quantity("duration"))
	}
	if r.stim != nil && r.stim.noiseEnd < r.duration*(1-1e-9) {
		return nil, runtime.ValueErrorf("simulate: the noise in the stimulus ends at %s, before the run ends at %s; give noise(…, duration = %s)",
			fmtQ(r.stim.noiseEnd, units.Time), c.Quantity("duration"), c.Quantity("duration"))
	}
	meth, ok := methods[c.Str("method")]
	if !ok {
		return nil, runtime.ValueErrorf(`simulate: unknown method %q; use "auto", "rk4", "exp_euler", "dopri5" or "exact"`, c.Str("method"))
	}
	tol := c.Float("tolerance")
	if !(tol > 0 && tol < 1) {
		return nil, runtime.ValueErrorf("simulate: tolerance must lie between 0 and 1, got %s; use e.g. 1e-6", units.FormatNumber(tol))
	}
	every, err := c.Int("every", 1, 1<<40)
	if err != nil {
		return nil, err
	}
	r.set = neuron.Settings{Dt: dt, Method: meth, RTol: tol, Every: every, MaxValues: maxTraceValues}
	if err := r.checkMethod(c.Str("method")); err != nil {
		return nil, err
	}
	if r.set.Record, err = recordArg(c, m); err != nil {
		return nil, err
	}
	return r, r.checkMemory()
}

// checkMethod names the methods a model can use.
func (r *runSpec) checkMethod(name string) error {
	spec := r.model.spec
	lif := spec == lifSpec || spec == lifNormSpec
	switch {
	case r.set.Method == neuron.Exact && !lif:
		return runtime.ValueErrorf(`simulate: method "exact" needs a LIF model (lif or lif_norm), not %s; use "rk4" or "dopri5"`, r.model.Name())
	case r.set.Method == neuron.ExponentialEuler && spec != hhSpec:
		return runtime.ValueErrorf(`simulate: method "exp_euler" needs hh(), not %s; use "rk4" or "dopri5"`, r.model.Name())
	}
	return nil
}

// checkMemory fails at once when the recording would exceed the limit.
func (r *runSpec) checkMemory() error {
	series := len(r.set.Record) + 2
	if r.set.Record == nil {
		nm, _ := r.model.Neuron(0)
		series = len(nm.Vars()) + 2
	}
	steps := math.Ceil(r.duration / r.set.Dt)
	samples := steps/float64(r.set.Every) + 2
	if need := samples * float64(series); need > maxTraceValues {
		every := int(math.Ceil(steps*float64(series)/maxTraceValues)) + 1
		return runtime.ValueErrorf("simulate: recording %.0f samples of %d series needs %.0f values (%.0f MB), above the limit of %d values; record fewer samples with every = %d, or fewer variables with record = [...]",
			samples, series, need, need*8/1e6, maxTraceValues, every)
	}
	return nil
}

// modelArg returns the model argument or an error saying what is expected.
func modelArg(c *runtime.Call, fn string) (*Model, error) {
	m, ok := c.Value("model").(*Model)
	if !ok {
		return nil, runtime.ArgumentErrorf("%s: model must be a model such as lif(), hh() or adex(), got %s", fn, c.Value("model").Type())
	}
	return m, nil
}

// stimulusArg returns the stimulus argument (a bare quantity becomes a
// constant), checked against the model's input dimension.
func stimulusArg(c *runtime.Call, m *Model) (*Stimulus, error) {
	var s *Stimulus
	switch x := c.Value("stimulus").(type) {
	case nil:
		return nil, nil
	case *Stimulus:
		s = x
	case runtime.Quantity:
		s = &Stimulus{in: stimulus.Constant{Value: x.V}, dim: x.Dim, desc: "constant " + x.String(), noiseEnd: math.Inf(1)}
	default:
		return nil, runtime.ArgumentErrorf("%s: stimulus must be a stimulus such as step(…) or a number, got %s", c.Builtin.Name, x.Type())
	}
	return s, checkInputDim(m, s.dim)
}

// checkInputDim reports a stimulus of the wrong kind for the model.
func checkInputDim(m *Model, d units.Dim) error {
	if d == m.spec.input {
		return nil
	}
	return runtime.UnitErrorf("%s() takes %s such as %s; got %s", m.Name(), kindOf(m.spec.input), m.spec.example, kindOf(d))
}

// kindOf names an input dimension the way the lab does.
func kindOf(d units.Dim) string {
	switch d {
	case units.Current:
		return "a current (pA, nA)"
	case units.CurrentDensity:
		return "a current density (uA/cm^2)"
	case units.Dimensionless:
		return "a dimensionless input (a bare number)"
	}
	return d.Describe()
}

// recordArg checks the names in record against the model's variables.
func recordArg(c *runtime.Call, m *Model) ([]string, error) {
	l, ok := c.Value("record").(*runtime.List)
	if !ok {
		return nil, nil
	}
	nm, err := m.Neuron(0)
	if err != nil {
		return nil, err
	}
	var names []string
	for _, v := range nm.Vars() {
		names = append(names, v.Name)
	}
	var out []string
	for _, e := range l.Elems {
		s, ok := e.(runtime.String)
		if !ok {
			return nil, runtime.ArgumentErrorf("simulate: record must list variable names as strings, e.g. [%q]; got %s", names[0], e.Type())
		}
		if !contains(names, string(s)) {
			return nil, runtime.ValueErrorf("simulate: %s has no variable %q; its variables are %s", m.Name(), string(s), strings.Join(names, ", "))
		}
		out = append(out, string(s))
	}
	if len(out) == 0 {
		return nil, runtime.ValueErrorf("simulate: record is empty; list at least one variable of %s", strings.Join(names, ", "))
	}
	return out, nil
}

func contains(xs []string, s string) bool {
	for _, x := range xs {
		if x == s {
			return true
		}
	}
	return false
}

// simulatePopulation runs every neuron of a model with vector parameters:
// LIF populations through the exact population kernel, others one
// simulation per neuron on all cores.
func simulatePopulation(c *runtime.Call, r *runSpec) (runtime.Value, error) {
	m := r.model
	if m.spec.title == rateSpec.title {
		return nil, runtime.ValueErrorf("simulate: populations of rate neurons give no spikes; simulate one rate neuron at a time")
	}
	pop := &SpikePop{trains: make([][]float64, m.n), duration: r.duration, model: m, stim: "no input"}
	if r.stim != nil {
		pop.stim = r.stim.desc
	}
	if cells, ok := lifCells(m); ok {
		res, err := neuron.SimulatePopulation(c.Ctx, neuron.PopulationProblem{Cells: cells, Input: r.input(), Duration: r.duration},
			&neuron.PopulationSettings{Dt: r.set.Dt})
		if err != nil {
			return nil, simError(c, m, err)
		}
		copy(pop.trains, res.Spikes)
		return pop, nil
	}
	set := r.set
	set.Record = []string{m.firstVar()}
	set.Every = int(math.Ceil(r.duration / set.Dt)) // keep only the ends: the trains are what a population needs
	prog := progressFor(c, "simulating "+fmt.Sprint(m.n)+" neurons", float64(m.n))
	err := runEach(c.Ctx, m.n, prog, func(i int) error {
		nm, err := m.Neuron(i)
		if err != nil {
			return err
		}
		tr, err := neuron.Simulate(c.Ctx, neuron.Problem{Model: nm, Input: r.input(), Duration: r.duration}, &set)
		if err != nil {
			return err
		}
		pop.trains[i] = tr.Spikes
		return nil
	})
	if err != nil {
		prog.Interrupted()
		return nil, simError(c, m, err)
	}
	prog.Done()
	return pop, nil
}

// lifCells returns the population's cells when the model is a LIF; the
// normalised LIF is the physical one with C = τ_m, g_L = 1, E_L = 0,
// threshold 1 and reset 0, its dimensionless input taking the current's
// place.
func lifCells(m *Model) ([]neuron.LIF, bool) {
	if m.spec != lifSpec && m.spec != lifNormSpec {
		return nil, false
	}
	cells := make([]neuron.LIF, m.n)
	for i := range cells {
		nm, _ := m.Neuron(i)
		switch x := nm.(type) {
		case *neuron.LIF:
			cells[i] = *x
		case *neuron.NormLIF:
			cells[i] = neuron.LIF{C: x.Tau, GL: 1, EL: 0, VTh: 1, VReset: 0, TRef: x.TRef, V0: 0}
		}
	}
	return cells, true
}
