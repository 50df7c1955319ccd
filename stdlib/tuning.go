package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/activation"
	"github.com/loligo-lab/loligo/stdlib/tuning"
	"gonum.org/v1/gonum/mat"
)

// Tuning curves in the language: the LIF closed form (normalised and in
// physical units), the tuning curve of any rate neuron and evaluation of a
// curve at an input. Populations
// and readouts are in the second half of this file.

func init() { domains = append(domains, registerTuning) }

const lifSource = "Dayan & Abbott (2001), Theoretical Neuroscience, ch. 5 (LIF firing rate for constant input)"

var (
	tauRef = runtime.Param{Name: "tau_ref", Kind: runtime.KindNumber, Unit: "ms", Default: "2 ms", Doc: "refractory period τ_ref ≥ 0; the rate never exceeds 1/τ_ref"}
	tauM   = runtime.Param{Name: "tau_m", Kind: runtime.KindNumber, Unit: "ms", Default: "20 ms", Doc: "membrane time constant τ_m > 0"}
)

func registerTuning(reg *runtime.Registry) {
	reg.Register(lifRateBuiltin(), lifTuningBuiltin(), rateCurveBuiltin(), atBuiltin())
	registerPopulation(reg)
}

func lifRateBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "lif_rate", Category: "tuning",
		Params: []runtime.Param{{Name: "v", Kind: runtime.KindNumbers, Dimensionless: true,
			Doc: "the input in units of the threshold current, v = I/I_th (1 is the rheobase)"}, tauRef, tauM},
		Returns: "a rate (number or vector, Hz)",
		Doc: "The normalised LIF tuning curve in closed form, element-wise: rate = 1/(τ_ref − τ_m ln(1 − 1/v)) for v > 1, " +
			"and 0 for v ≤ 1 (v = 1 gives 0). The rate rises steeply from threshold and tends to its maximum 1/τ_ref as v → ∞: " +
			"with τ_ref = 2 ms and τ_m = 20 ms, about 63 Hz at v = 2 and at most 500 Hz. NaN gives NaN.",
		Source: lifSource,
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			m := tuning.LIFCurve{TauRef: c.Float("tau_ref"), TauM: c.Float("tau_m"), Gain: 1}
			if err := m.Validate(); err != nil {
				return nil, runtime.ValueErrorf("lif_rate: %v", err)
			}
			if q, ok := c.Value("v").(runtime.Quantity); ok {
				return runtime.Q(m.Rate(q.V), units.Frequency), nil
			}
			xs, _ := c.Floats("v")
			out := make([]float64, len(xs))
			tuning.Tabulate(out, m, xs)
			return &runtime.Vector{V: out, Dim: units.Frequency}, nil
		},
	}
}

func lifTuningBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "lif_tuning", Category: "tuning",
		Params: []runtime.Param{
			{Name: "threshold", Kind: runtime.KindNumber, Default: "1 nA", Doc: "the threshold current I_th (the rheobase, e.g. rheobase(cell)); a current or a current density"},
			tauRef, tauM,
			{Name: "gain", Kind: runtime.KindNumber, Dimensionless: true, Default: "1", Doc: "multiplies I/I_th"},
			{Name: "bias", Kind: runtime.KindNumber, Dimensionless: true, Default: "0", Doc: "added to gain·I/I_th"},
			{Name: "over", Kind: runtime.KindNumbers, Optional: true, Doc: "inputs to tabulate at, in the dimension of threshold; default 201 points from 0 to 5·I_th"},
		},
		Returns: "a curve (analytic)",
		Doc: "The LIF tuning curve in physical units: rate(I) = 1/(τ_ref − τ_m ln(1 − 1/v)) with v = gain·I/I_th + bias, " +
			"0 where v ≤ 1. Its maximum is 1/τ_ref; derivative(curve) gives its slope dr/dI = (gain/I_th)·r² τ_m/(v (v − 1)). " +
			"The curve shows a table and a figure, evaluates anywhere with at(curve, I), and exposes tau_ref, tau_m, gain (per ampere) and bias as its parameters.",
		Source: lifSource,
		Fn:     lifTuning,
	}
}

func lifTuning(c *runtime.Call) (runtime.Value, error) {
	th := c.Quantity("threshold")
	if !(th.V > 0) || math.IsInf(th.V, 0) {
		return nil, runtime.ValueErrorf("lif_tuning: threshold must be positive and finite, got %s; give the rheobase, e.g. threshold = 0.5 nA", th)
	}
	xs, err := inputsOver(c, th, 5)
	if err != nil {
		return nil, err
	}
	cv, err := NewLIFTuning(c.Float("tau_ref"), c.Float("tau_m"), c.Float("gain")/th.V, c.Float("bias"), xs, th.Dim)
	if err != nil {
		return nil, runtime.ValueErrorf("lif_tuning: %v", err)
	}
	cv.Note = fmt.Sprintf("threshold %s, maximum rate 1/τ_ref = %s", th, units.Format(cv.Model.(tuning.LIFCurve).MaxRate(), units.Frequency))
	return cv, nil
}

// inputsOver returns the "over" inputs in the dimension of scale, or the
// default grid of 201 points from 0 to upTo·scale.
func inputsOver(c *runtime.Call, scale runtime.Quantity, upTo float64) ([]float64, error) {
	if !c.Has("over") {
		return tuning.Span(0, upTo*scale.V, 201)
	}
	xs, d := c.Floats("over")
	if d != scale.Dim {
		return nil, runtime.UnitErrorf("%s: over must be %s like %s, got %s", c.Builtin.Name, scale.Dim.Describe(), scale, d.Describe())
	}
	return xs, nil
}

func rateCurveBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "rate_curve", Category: "tuning",
		Params: []runtime.Param{
			{Name: "f", Kind: runtime.KindFunction, Default: "logistic", Doc: "the activation: an activation function or a dimensionless formula of one variable"},
			{Name: "gain", Kind: runtime.KindNumber, Doc: "per input unit, e.g. 4 / nA"},
			{Name: "bias", Kind: runtime.KindNumber, Dimensionless: true, Default: "0"},
			{Name: "scale", Kind: runtime.KindNumber, Unit: "Hz", Default: "100 Hz", Doc: "the output scale, the largest rate of a sigmoid"},
			{Name: "over", Kind: runtime.KindNumbers, Doc: "the inputs to tabulate at, e.g. span(0, 1, n = 101) nA"},
		},
		Returns: "a curve (analytic)",
		Doc: "The tuning curve of a rate neuron: rate(I) = scale·f(gain·I + bias), with gain·I dimensionless. " +
			"The curve evaluates anywhere with at(curve, I) and exposes gain, bias and scale as its parameters; derivative(curve) gives its slope.",
		Source: "common practice (rate neuron: activation of gain·I + bias)",
		Fn:     rateCurve,
	}
}

func rateCurve(c *runtime.Call) (runtime.Value, error) {
	xs, xd := c.Floats("over")
	g := c.Quantity("gain")
	if !g.Dim.Mul(xd).IsDimensionless() {
		return nil, runtime.UnitErrorf("rate_curve: gain·over must be dimensionless, but gain is %s and over %s; write the gain per input unit, e.g. gain = 4 / nA",
			g.Dim.Describe(), xd.Describe())
	}
	f, err := activationFor(c, c.Value("f").(runtime.Function))
	if err != nil {
		return nil, err
	}
	m := tuning.RateCurve{Act: f, Gain: g.V, Bias: c.Float("bias"), Scale: c.Float("scale"), InputUnit: siSymbol(xd)}
	cv := NewModelCurve(c.Value("f").(runtime.Function).FuncName()+" tuning curve", m, xs, xd)
	if f, ok := f.(*calledAct); ok && f.err != nil {
		return nil, f.err
	}
	cv.Source = "common practice (rate neuron: activation of gain·I + bias)"
	return cv, nil
}

// activationFor returns the element-wise function a function value stands
// for: the activation itself, or a wrapper calling a formula or builtin.
func activationFor(c *runtime.Call, f runtime.Function) (tuning.Activation, error) {
	if info, ok := activationOf(f); ok && !info.deriv {
		return info.f, nil
	}
	g, d, err := c.ScalarFunc(f, units.Dimensionless, 0)
	if err != nil {
		return nil, err
	}
	if !d.IsDimensionless() {
		return nil, runtime.UnitErrorf("%s: the activation %s returns %s; it must be dimensionless (the rate comes from scale)", c.Builtin.Name, f.FuncName(), d.Describe())
	}
	return &calledAct{g: g}, nil
}

// calledAct evaluates a language function as an activation; the first
// error is kept (the curve's values are then not to be used) and later
// calls give NaN.
type calledAct struct {
	g   func(float64) (float64, error)
	err error
}

func (a *calledAct) Eval(z float64) float64 {
	if a.err != nil {
		return math.NaN()
	}
	y, err := a.g(z)
	if err != nil {
		a.err = err
		return math.NaN()
	}
	return y
}

func atBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "at", Category: "tuning",
		Params: []runtime.Param{
			{Name: "curve", Kind: runtime.KindAny, Doc: "a tuning curve"},
			{Name: "x", Kind: runtime.KindNumbers, Doc: "the input(s), in the curve's input dimension"},
		},
		Returns: "the response (number or vector)",
		Doc: "The response of a curve at an input: exact for an analytic curve (lif_tuning, rate_curve), " +
			"by linear interpolation between the points of a sampled one (an f–I sweep), holding the end values outside them.",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			cv, ok := c.Value("curve").(*Curve)
			if !ok {
				return nil, runtime.ArgumentErrorf("at: curve must be a curve (from lif_tuning, rate_curve or a sweep), got %s", c.Value("curve").Type())
			}
			xs, d := c.Floats("x")
			if d != cv.XDim {
				return nil, runtime.UnitErrorf("at: %s takes %s, got %s", cv.Name, cv.XDim.Describe(), d.Describe())
			}
			out := make([]float64, len(xs))
			for i, x := range xs {
				y, err := cv.At(x)
				if err != nil {
					return nil, err
				}
				out[i] = y
			}
			if _, one := c.Value("x").(runtime.Quantity); one {
				return runtime.Q(out[0], cv.YDim), nil
			}
			return &runtime.Vector{V: out, Dim: cv.YDim}, nil
		},
	}
}

// curveSlope is derivative(curve) for the analytic curves built here.
func curveSlope(cv *Curve) (runtime.Value, error) {
	var slope func(x float64) float64
	switch m := cv.Model.(type) {
	case tuning.LIFCurve:
		slope = m.Slope
	case tuning.RateCurve:
		f, ok := m.Act.(activation.Func)
		if !ok {
			return nil, runtime.ValueErrorf("derivative: %s uses a formula, whose derivative is not known; write it as a formula", cv.Name)
		}
		slope = func(x float64) float64 { return m.Scale * m.Gain * f.Deriv(m.Gain*x+m.Bias) }
	default:
		return nil, runtime.ValueErrorf("derivative: %s is sampled; only analytic curves (lif_tuning, rate_curve) have an exact derivative", cv.Name)
	}
	y := make([]float64, len(cv.X))
	for i, x := range cv.X {
		y[i] = slope(x)
	}
	out := NewSampledCurve("slope of "+cv.Name, cv.X, cv.XDim, y, cv.YDim.Div(cv.XDim), nil)
	out.Line, out.YName, out.Source = true, "slope", cv.Source
	xu := runtime.ChooseUnit(cv.X, cv.XDim)
	if u, err := units.Parse("Hz/" + xu.Symbol); err == nil && xu.Symbol != "" && cv.YDim == units.Frequency && u.Dim == out.YDim {
		out.YUnit = &u
	}
	return out, nil
}

// The population of tuning curves and its linear readout.

const popSource = "Eliasmith & Anderson (2003), Neural Engineering, ch. 2 (populations of LIF tuning curves, regularised least-squares decoders)"

func registerPopulation(reg *runtime.Registry) {
	pop := runtime.Param{Name: "pop", Kind: runtime.KindAny, Doc: "a population from rate_population"}
	target := runtime.Param{Name: "target", Kind: runtime.KindFunction, Doc: "a function of the normalised input x ∈ [−1, 1], e.g. a formula"}
	reg.Register(
		&runtime.Builtin{
			Name: "rate_population", Category: "tuning",
			Params: []runtime.Param{
				{Name: "n", Kind: runtime.KindNumber, Dimensionless: true, Optional: true, Doc: "the number of neurons (drawn); leave out when gain and bias are given"},
				tauRef, tauM,
				{Name: "max_rate", Kind: runtime.KindNumbers, Unit: "Hz", Default: "[200, 400] Hz", Doc: "bounds of the uniform draw of each neuron's rate at its preferred end"},
				{Name: "intercept", Kind: runtime.KindNumbers, Dimensionless: true, Default: "[-0.95, 0.95]", Doc: "bounds of the uniform draw of where each neuron starts firing (below 1)"},
				{Name: "positive_only", Kind: runtime.KindBool, Default: "false", Doc: "all encoders +1 instead of ±1 at random"},
				{Name: "gain", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true, Doc: "given gains instead of drawn ones (with bias)"},
				{Name: "bias", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true, Doc: "given biases (with gain)"},
				{Name: "encoder", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true, Doc: "given encoders ±1 (default all +1)"},
				{Name: "over", Kind: runtime.KindNumbers, Dimensionless: true, Default: "span(-1, 1, n = 201)", Doc: "the inputs x the responses are tabulated at"},
			},
			Returns: "a population",
			Doc: "A population of N LIF tuning curves over a normalised input x ∈ [−1, 1]: neuron i fires " +
				"1/(τ_ref − τ_m ln(1 − 1/v_i)) with v_i = gain_i·e_i·x + bias_i and encoder e_i = ±1. " +
				"Drawn populations take, per neuron, a maximum rate uniform in max_rate and an intercept uniform in intercept " +
				"(converted to gain and bias so that v = 1 at the intercept), from the session's seed; or give gain and bias as vectors. " +
				"It shows a table of its neurons and its responses as a family of curves; pop[i] is neuron i's tuning curve.",
			Source: popSource,
			Fn:     ratePopulation,
		},
		&runtime.Builtin{
			Name: "readout", Category: "tuning",
			Params: []runtime.Param{pop, target,
				{Name: "noise", Kind: runtime.KindNumber, Dimensionless: true, Default: "0.1", Doc: "the response noise σ the decoders tolerate, as a fraction of the largest rate"},
				{Name: "lambda", Kind: runtime.KindNumber, Optional: true, Doc: "the ridge parameter λ in Hz², instead of the rule from noise"}},
			Returns: "a readout",
			Doc: "A linear readout of target(x) from the population's rates: decoders d solve the ridge least-squares problem " +
				"(R Rᵀ + λ I) d = R y with R the N × M responses, y the target at the M inputs and λ = M (σ r_max)². " +
				"It reports the RMS error of the estimate dᵀR against the target, without noise and with Gaussian noise of σ r_max " +
				"added to every response (seeded), and shows target and estimate.",
			Source: popSource,
			Fn:     readoutFn,
		},
		&runtime.Builtin{
			Name: "readout_noise", Category: "tuning",
			Params: []runtime.Param{pop, target,
				{Name: "noise", Kind: runtime.KindNumbers, Dimensionless: true, Default: "[0.003, 0.01, 0.03, 0.1, 0.3]", Doc: "the noise levels σ (fractions of the largest rate), each positive"}},
			Returns: "a curve of RMS error against noise",
			Doc: "The readout error against the noise level: for each σ, decoders regularised for σ, and the RMS error of the estimate " +
				"with noise σ r_max on every response (rate column) and without noise (noise-free column). More noise needs more " +
				"regularisation, which bends the estimate away from the target.",
			Source: popSource,
			Fn:     readoutNoise,
		},
	)
}

// spansDecade reports whether positive values spread over at least a factor
// of 10, where a logarithmic axis shows them evenly (common practice for
// levels chosen in decades); within a decade a linear axis reads better.
func spansDecade(xs []float64) bool {
	lo, hi := minMax(xs)
	return len(xs) > 1 && lo > 0 && hi >= 10*lo
}

func ratePopulation(c *runtime.Call) (runtime.Value, error) {
	xs, _ := c.Floats("over")
	var p *tuning.Population
	var err error
	if c.Has("gain") || c.Has("bias") {
		p, err = givenPopulation(c)
	} else {
		p, err = drawnPopulation(c)
	}
	if err != nil {
		return nil, err
	}
	pv := &Population{Pop: p, X: clone(xs)}
	if err := pv.fill(c); err != nil {
		return nil, err
	}
	return pv, nil
}

func drawnPopulation(c *runtime.Call) (*tuning.Population, error) {
	if !c.Has("n") {
		return nil, runtime.ArgumentErrorf("rate_population: give n (the number of neurons), or gain and bias as vectors")
	}
	n, err := c.Int("n", 1, 100000)
	if err != nil {
		return nil, err
	}
	rates, _ := c.Floats("max_rate")
	icpt, _ := c.Floats("intercept")
	if len(rates) != 2 || len(icpt) != 2 {
		return nil, runtime.ArgumentErrorf("rate_population: max_rate and intercept are bounds [low, high], e.g. max_rate = [200, 400] Hz")
	}
	s := &tuning.PopulationSettings{TauRef: c.Float("tau_ref"), TauM: c.Float("tau_m"), MaxRateLo: rates[0], MaxRateHi: rates[1],
		InterceptLo: icpt[0], InterceptHi: icpt[1], PositiveOnly: c.Bool("positive_only")}
	if s.TauRef == 0 {
		return nil, runtime.ValueErrorf("rate_population: tau_ref must be positive for a drawn population (the maximum rate is below 1/τ_ref); use e.g. 2 ms")
	}
	p, err := tuning.NewPopulation(n, c.Seed(), s)
	if err != nil {
		return nil, runtime.ValueErrorf("rate_population: %v", err)
	}
	return p, nil
}

func givenPopulation(c *runtime.Call) (*tuning.Population, error) {
	if !c.Has("gain") || !c.Has("bias") {
		return nil, runtime.ArgumentErrorf("rate_population: give gain and bias together (vectors of one value per neuron)")
	}
	g, _ := c.Floats("gain")
	b, _ := c.Floats("bias")
	e := make([]float64, len(g))
	for i := range e {
		e[i] = 1
	}
	if c.Has("encoder") {
		e, _ = c.Floats("encoder")
	}
	if len(b) != len(g) || len(e) != len(g) || (c.Has("n") && c.Float("n") != float64(len(g))) {
		return nil, runtime.ArgumentErrorf("rate_population: gain, bias and encoder must have one value per neuron; got %d, %d and %d", len(g), len(b), len(e))
	}
	p, err := tuning.PopulationFromVectors(c.Float("tau_ref"), c.Float("tau_m"), g, b, e)
	if err != nil {
		return nil, runtime.ValueErrorf("rate_population: %v", err)
	}
	return p, nil
}

// fill computes the response matrix in blocks of rows, reporting progress
// for large populations; on interrupt it returns the context's error.
func (pv *Population) fill(c *runtime.Call) error {
	n, m := pv.Pop.Len(), len(pv.X)
	pv.R = mat.NewDense(n, m, nil)
	const block = 64
	var prog *display.Progress
	if n*m >= 1<<20 {
		prog = progressFor(c, fmt.Sprintf("responses of %d neurons", n), float64(n))
	}
	for lo := 0; lo < n; lo += block {
		hi := min(lo+block, n)
		sub, _ := tuning.PopulationFromVectors(pv.Pop.TauRef, pv.Pop.TauM, pv.Pop.Gain[lo:hi], pv.Pop.Bias[lo:hi], pv.Pop.Encoder[lo:hi])
		if err := sub.Responses(c.Ctx, pv.R.Slice(lo, hi, 0, m).(*mat.Dense), pv.X, 0); err != nil {
			if prog != nil {
				prog.Interrupted()
			}
			return err
		}
		if prog != nil {
			prog.Set(float64(hi))
		}
	}
	if prog != nil {
		prog.Done()
	}
	return nil
}

// targetOver evaluates the target at the population's inputs.
func targetOver(c *runtime.Call, pv *Population) ([]float64, units.Dim, error) {
	f := c.Value("target").(runtime.Function)
	y, d, err := evalOver(c, f, &runtime.Vector{V: pv.X})
	if err != nil {
		return nil, d, err
	}
	return y, d, nil
}

func popArg(c *runtime.Call) (*Population, error) {
	pv, ok := c.Value("pop").(*Population)
	if !ok {
		return nil, runtime.ArgumentErrorf("%s: pop must be a population from rate_population, got %s", c.Builtin.Name, c.Value("pop").Type())
	}
	return pv, nil
}

func readoutFn(c *runtime.Call) (runtime.Value, error) {
	pv, err := popArg(c)
	if err != nil {
		return nil, err
	}
	y, d, err := targetOver(c, pv)
	if err != nil {
		return nil, err
	}
	s := &tuning.ReadoutSettings{Noise: c.Float("noise")}
	if !(s.Noise > 0) {
		return nil, runtime.ValueErrorf("readout: noise must be positive, got %g; use a small level such as 0.01, or give lambda", s.Noise)
	}
	if c.Has("lambda") {
		if s.Lambda = c.Float("lambda"); !(s.Lambda > 0) {
			return nil, runtime.ValueErrorf("readout: lambda must be positive, got %g", s.Lambda)
		}
	}
	prob := tuning.ReadoutProblem{Responses: pv.R, Target: y}
	r, err := tuning.Decode(prob, s)
	if err != nil {
		return nil, runtime.ValueErrorf("readout: %v", err)
	}
	noisy, err := r.NoisyRMSE(prob, s.Noise, c.Seed())
	if err != nil {
		return nil, runtime.ValueErrorf("readout: %v", err)
	}
	name := "readout of " + c.Value("target").(runtime.Function).FuncName()
	cv := NewSampledCurve(name, pv.X, units.Dimensionless, r.Estimate, d, nil)
	cv.XName, cv.YName, cv.Line, cv.Source = "x", "estimate", true, popSource
	cv.AddSeries("target", y)
	return &Readout{Curve: cv, Noise: s.Noise, Res: r, NoisyRMSE: noisy, Dim: d}, nil
}

func readoutNoise(c *runtime.Call) (runtime.Value, error) {
	pv, err := popArg(c)
	if err != nil {
		return nil, err
	}
	y, d, err := targetOver(c, pv)
	if err != nil {
		return nil, err
	}
	levels, _ := c.Floats("noise")
	for _, s := range levels {
		if !(s > 0) || math.IsInf(s, 0) {
			return nil, runtime.ValueErrorf("readout_noise: every noise level must be positive and finite, got %g", s)
		}
	}
	prob := tuning.ReadoutProblem{Responses: pv.R, Target: y}
	prog := progressFor(c, "readout error against noise", float64(len(levels)))
	var noisy, clean []float64
	for _, s := range levels {
		if c.Ctx.Err() != nil {
			prog.Interrupted()
			break
		}
		r, err := tuning.Decode(prob, &tuning.ReadoutSettings{Noise: s})
		if err != nil {
			return nil, runtime.ValueErrorf("readout_noise: at noise %g: %v", s, err)
		}
		e, err := r.NoisyRMSE(prob, s, c.Seed())
		if err != nil {
			return nil, runtime.ValueErrorf("readout_noise: %v", err)
		}
		noisy, clean = append(noisy, e), append(clean, r.RMSE)
		prog.Add(1)
	}
	if len(noisy) == len(levels) {
		prog.Done()
	}
	name := "readout error of " + c.Value("target").(runtime.Function).FuncName()
	cv := NewSampledCurve(name, levels[:len(noisy)], units.Dimensionless, noisy, d, nil)
	cv.XName, cv.YName, cv.Line, cv.Source = "noise", "RMS error", true, popSource
	cv.LogX = spansDecade(levels) // the default levels run from 0.003 to 0.3
	cv.AddSeries("noise-free", clean)
	if len(noisy) < len(levels) {
		cv.Note = fmt.Sprintf("interrupted: %d of %d noise levels computed", len(noisy), len(levels))
		return nil, c.Interrupted(cv, cv.Note+"; the partial curve is shown above")
	}
	return cv, nil
}
