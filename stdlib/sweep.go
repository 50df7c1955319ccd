package stdlib

import (
	"context"
	"errors"
	"fmt"
	"math"
	goruntime "runtime"
	"sync"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
)

// Step protocols: f–I sweeps and rheobase, and running many neurons on all
// cores with results independent of their number.

// singleNeuron checks that m is one spiking neuron and returns a factory.
func singleNeuron(c *runtime.Call, m *Model) (func() neuron.Model, error) {
	name := c.Builtin.Name
	if m.n > 1 {
		return nil, runtime.ValueErrorf("%s: takes one neuron, but the model holds %d; give scalar parameters", name, m.n)
	}
	if m.spec.title == rateSpec.title {
		return nil, runtime.ValueErrorf("%s: needs a spiking model; a rate neuron's f–I curve is its activation, see rate_curve", name)
	}
	if _, err := m.Neuron(0); err != nil {
		return nil, err
	}
	return func() neuron.Model { nm, _ := m.Neuron(0); return nm }, nil
}

// maxStepWork bounds the integration steps of one sweep or rheobase call:
// 10⁹ steps are minutes of Hodgkin–Huxley work on a shared machine, far
// more than an f–I curve needs (its steady rates settle within a second of
// model time).
const maxStepWork = 1e9

// rheobaseRuns is about how many steps a rheobase bisection simulates: a
// few to bracket, then log2(1/tolerance) halvings.
const rheobaseRuns = 20

// stepSettings reads the shared integration arguments of sweep and
// rheobase, which will simulate about runs steps of the given duration.
func stepSettings(c *runtime.Call, runs int) (*neuron.Settings, error) {
	meth, ok := methods[c.Str("method")]
	if !ok {
		return nil, runtime.ValueErrorf(`%s: unknown method %q; use "auto", "rk4", "exp_euler", "dopri5" or "exact"`, c.Builtin.Name, c.Str("method"))
	}
	dt, d := c.Float("dt"), c.Float("duration")
	if !(dt > 0) || !(d > 0) || dt > d || math.IsInf(d, 0) {
		return nil, runtime.ValueErrorf("%s: need 0 < dt ≤ duration, got dt = %s and duration = %s; use e.g. dt = 0.01 ms", c.Builtin.Name, c.Quantity("dt"), c.Quantity("duration"))
	}
	if work := float64(runs) * d / dt; work > maxStepWork {
		fewer := ""
		if c.Builtin.Name == "sweep" {
			fewer = " fewer amplitudes or"
		}
		return nil, runtime.ValueErrorf("%s: %d runs of %s at dt = %s make %.3g integration steps, above the limit of %.0g (minutes of work); firing settles within about 1000 ms, so shorten duration, or use%s a larger dt",
			c.Builtin.Name, runs, c.Quantity("duration"), c.Quantity("dt"), work, maxStepWork, fewer)
	}
	return &neuron.Settings{Dt: dt, Method: meth}, nil
}

var stepParams = []runtime.Param{
	timeParam("duration", "500 ms", "length of each current step"),
	timeParam("dt", "0.01 ms", "integration step"),
	{Name: "method", Kind: runtime.KindString, Default: `"auto"`, Doc: `integrator, as for simulate`},
}

func sweepBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "sweep", Category: "analysis", Returns: "an f–I curve",
		Doc: "The f–I curve of a model: one current step of each amplitude, lasting duration, and for each the steady rate (the inverse mean ISI of the spikes in the last window of the step, by default its second half) " +
			"and the first-ISI rate. Runs on all cores; the result does not depend on their number. Interrupted, it shows the curve of the amplitudes finished and the cell ends as interrupted.",
		Source: "f–I curves as in Dayan & Abbott (2001), ch. 5; steady rate as common practice",
		Params: append([]runtime.Param{{Name: "model", Kind: runtime.KindAny, Doc: "a spiking model"},
			{Name: "amplitude", Kind: runtime.KindNumbers, Doc: "step amplitudes, e.g. span(0, 20, by = 1) uA/cm^2"}},
			append(stepParams, optTime("window", "steady-rate window at the end of the step; default half the step"))...),
		Fn: sweepFn,
	}
}

func sweepFn(c *runtime.Call) (runtime.Value, error) {
	m, err := modelArg(c, "sweep")
	if err != nil {
		return nil, err
	}
	factory, err := singleNeuron(c, m)
	if err != nil {
		return nil, err
	}
	amps, d := c.Floats("amplitude")
	if err := checkInputDim(m, d); err != nil {
		return nil, err
	}
	sim, err := stepSettings(c, len(amps))
	if err != nil {
		return nil, err
	}
	s := &neuron.SweepSettings{Sim: sim, Length: c.Float("duration")}
	if c.Has("window") {
		if s.Window = c.Float("window"); !(s.Window > 0) || s.Window > s.Length {
			return nil, runtime.ValueErrorf("sweep: window must lie between 0 and the step's %s, got %s", c.Quantity("duration"), c.Quantity("window"))
		}
	}
	prog := progressFor(c, "f–I sweep", float64(len(amps)))
	s.Progress = func(done, _ int) { prog.Set(float64(done)) }
	res, err := neuron.Sweep(c.Ctx, factory, amps, s)
	if err != nil && (c.Ctx.Err() == nil || res == nil) {
		prog.Done()
		return nil, runtime.ValueErrorf("sweep: %s", neuronMsg(err, m))
	}
	if err != nil {
		prog.Set(float64(res.Finished))
		prog.Interrupted()
		partial, note := sweepPartial(m, res, d)
		return nil, c.Interrupted(partial, note)
	}
	prog.Done()
	return fiCurve(m, res, d), nil
}

// sweepPartial is what an interrupted sweep shows: the curve of the
// amplitudes finished, or nothing (and a note saying so) when none finished.
func sweepPartial(m *Model, res *neuron.SweepResult, d units.Dim) (runtime.Value, string) {
	n := len(res.Amplitudes)
	if res.Finished == 0 {
		return nil, fmt.Sprintf("no amplitude of %d finished, so there is no partial curve; run it again, or with fewer amplitudes or a shorter duration", n)
	}
	return fiCurve(m, res, d), fmt.Sprintf("%d of %d amplitudes finished; the partial curve is shown above", res.Finished, n)
}

// fiCurve keeps the finished entries of a sweep as a curve.
func fiCurve(m *Model, res *neuron.SweepResult, d units.Dim) *Curve {
	var x, r, f []float64
	for i, a := range res.Amplitudes {
		if !math.IsNaN(res.Rate[i]) {
			x, r, f = append(x, a), append(r, res.Rate[i]), append(f, res.FirstRate[i])
		}
	}
	cv := NewSampledCurve(m.spec.title+" (f–I)", x, d, r, units.Frequency, nil)
	cv.AddSeries("first_isi_rate", f)
	return cv
}

func rheobaseBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "rheobase", Category: "analysis", Returns: "a current (or current density)",
		Doc: "The rheobase: the smallest amplitude of a long current step (duration) that makes the model fire at least min_spikes spikes during the step. " +
			"For a LIF model and one spike it is the closed form ((V_th − E_L) − (V_0 − E_L) e^(−duration/tau_m)) / ((1 − e^(−duration/tau_m)) R), which for a long step is (V_th − E_L)/R; " +
			"otherwise it is the middle of a bisection bracket of the relative width tolerance. " +
			"With the default of one spike it is the threshold of a single spike; a larger min_spikes asks for repetitive firing, which for a type II model (Hodgkin–Huxley) starts abruptly at a higher amplitude.",
		Source: "rheobase as defined in Dayan & Abbott (2001), ch. 5, with the LIF's closed form from its exponential relaxation; bisection on the step amplitude otherwise",
		Params: append([]runtime.Param{{Name: "model", Kind: runtime.KindAny, Doc: "a spiking model"},
			{Name: "tolerance", Kind: runtime.KindNumber, Dimensionless: true, Default: "1e-4", Doc: "relative width of the final bisection bracket"},
			{Name: "min_spikes", Kind: runtime.KindNumber, Dimensionless: true, Default: "1", Doc: "spikes during the step that count as firing"}},
			timeParam("duration", "1000 ms", "length of the step"), stepParams[1], stepParams[2]),
		Fn: rheobaseFn,
	}
}

func rheobaseFn(c *runtime.Call) (runtime.Value, error) {
	m, err := modelArg(c, "rheobase")
	if err != nil {
		return nil, err
	}
	factory, err := singleNeuron(c, m)
	if err != nil {
		return nil, err
	}
	runs := rheobaseRuns
	if (m.spec == lifSpec || m.spec == lifNormSpec) && c.Float("min_spikes") == 1 {
		runs = 0 // the closed form simulates nothing
	}
	sim, err := stepSettings(c, runs)
	if err != nil {
		return nil, err
	}
	tol := c.Float("tolerance")
	if !(tol > 0 && tol < 1) {
		return nil, runtime.ValueErrorf("rheobase: tolerance must lie between 0 and 1, got %s; use e.g. 1e-3", units.FormatNumber(tol))
	}
	minSpikes, err := c.Int("min_spikes", 1, 1_000_000)
	if err != nil {
		return nil, err
	}
	res, err := neuron.Rheobase(c.Ctx, factory, &neuron.RheobaseSettings{Sweep: neuron.SweepSettings{Sim: sim, Length: c.Float("duration")}, RelTol: tol, MinSpikes: minSpikes})
	if err != nil {
		if c.Ctx.Err() != nil || errors.Is(err, context.Canceled) {
			return nil, err
		}
		return nil, runtime.ValueErrorf("rheobase: %s", neuronMsg(err, m))
	}
	return runtime.Q(res.Amplitude, m.spec.input), nil
}

// runEach simulates n neurons on all cores, each result at its own index,
// so the outcome does not depend on the number of cores.
func runEach(ctx context.Context, n int, prog *display.Progress, run func(i int) error) error {
	var (
		wg   sync.WaitGroup
		mu   sync.Mutex
		next int
		errs = make([]error, n)
	)
	for w := 0; w < min(n, goruntime.GOMAXPROCS(0)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				mu.Lock()
				i := next
				next++
				mu.Unlock()
				if i >= n || ctx.Err() != nil {
					return
				}
				errs[i] = run(i)
				prog.Add(1)
			}
		}()
	}
	wg.Wait()
	if ctx.Err() != nil {
		return ctx.Err()
	}
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}
