package stdlib

import (
	"fmt"
	"math"
	goruntime "runtime"
	"strings"
	"sync"
	"weak"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/activation"
)

// The activation functions of the language. Each is a builtin named after
// its descriptor in package activation (arctan is written atan), acting
// element-wise on a dimensionless number or vector:
//
//	logistic(x, gain = 1)        logistic(gain = 4)   → a function value
//	derivative(logistic)         → the function value of f'(x)
//
// Called without x, an activation builtin returns a new function value with
// its parameters fixed, which plot(), rate neurons and fits call like any
// other function of one variable. derivative(f) of any of them returns the
// exact derivative as a function value (our design: derivatives are values,
// so they plot and compose like the functions themselves).

func init() { domains = append(domains, registerActivation) }

// languageName maps descriptor names to the language's names where they
// differ.
var languageName = map[string]string{"arctan": "atan"}

// actInfo is what an activation function value stands for.
type actInfo struct {
	f     activation.Func
	deriv bool
}

// actFuncs maps the activation function values (registered builtins and
// those made by fixing parameters) to their function. Keys are weak, so a
// value the session no longer holds is collected and its entry removed.
var actFuncs sync.Map // weak.Pointer[runtime.Builtin] → actInfo

func remember(b *runtime.Builtin, info actInfo) {
	k := weak.Make(b)
	actFuncs.Store(k, info)
	goruntime.AddCleanup(b, func(k weak.Pointer[runtime.Builtin]) { actFuncs.Delete(k) }, k)
}

// activationOf returns the activation function a function value stands for.
func activationOf(f runtime.Value) (actInfo, bool) {
	b, ok := f.(*runtime.Builtin)
	if !ok {
		return actInfo{}, false
	}
	v, ok := actFuncs.Load(weak.Make(b))
	if !ok {
		return actInfo{}, false
	}
	return v.(actInfo), true
}

func registerActivation(reg *runtime.Registry) {
	for _, d := range activation.Table {
		f, err := activation.New(d.Name, nil)
		if err != nil {
			panic("stdlib: activation table: " + err.Error()) // the table is ours
		}
		b := activationBuiltin(d, f)
		remember(b, actInfo{f: f})
		reg.Register(b)
	}
	reg.Register(derivativeBuiltin(), steepnessBuiltin())
	registerGroup(reg)
}

// activationBuiltin declares one activation function from its descriptor:
// x optional (absent gives a function value), then the descriptor's
// parameters with their defaults.
func activationBuiltin(d activation.Descriptor, f activation.Func) *runtime.Builtin {
	name := d.Name
	if n, ok := languageName[name]; ok {
		name = n
	}
	params := []runtime.Param{{Name: "x", Kind: runtime.KindNumbers, Dimensionless: true, Optional: true,
		Doc: "the input, dimensionless (divide a current by its scale first); leave out to get the function with its parameters fixed"}}
	for _, p := range d.Params {
		params = append(params, runtime.Param{Name: p.Name, Kind: runtime.KindNumber, Dimensionless: true,
			Default: units0(p.Default), Doc: p.Doc})
	}
	return &runtime.Builtin{
		Name: name, Category: "activation", Params: params,
		Returns: "a number or vector, dimensionless (or a function value without x)",
		Doc:     activationDoc(d, name),
		Source:  d.Source,
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			g, err := withParams(c, d)
			if err != nil {
				return nil, err
			}
			if !c.Has("x") {
				return fixedFunction(name, g, false), nil
			}
			return applyAct(g, false, c.Value("x")), nil
		},
	}
}

func activationDoc(d activation.Descriptor, name string) string {
	var s strings.Builder
	fmt.Fprintf(&s, "The %s activation function, element-wise: %s, range %s.", name, display.LatexText(d.Formula), display.LatexText(d.Range))
	s.WriteString(" NaN gives NaN and ±∞ give the limits of the function.")
	if len(d.Params) > 0 && d.Params[0].Name == "gain" {
		s.WriteString(" The gain a sets the steepness, f(a·x); as a → ∞ the function tends to the threshold function of the same range at every x ≠ 0.")
	}
	fmt.Fprintf(&s, " Without x, %s(…) returns the function with its parameters fixed; derivative(%s) is its exact derivative.", name, name)
	return s.String()
}

// units0 writes a default in the language (plain numbers).
func units0(v float64) string { return fmt.Sprint(v) }

// withParams builds the function with the call's parameter values,
// reporting a value out of range as the package does.
func withParams(c *runtime.Call, d activation.Descriptor) (activation.Func, error) {
	vals := make(map[string]float64, len(d.Params))
	for _, p := range d.Params {
		vals[p.Name] = c.Float(p.Name)
	}
	g, err := activation.New(d.Name, vals)
	if err != nil {
		return nil, runtime.ValueErrorf("%s: %v", c.Builtin.Name, err)
	}
	return g, nil
}

// applyAct applies f (or f') element-wise to a quantity or vector.
func applyAct(f activation.Func, deriv bool, x runtime.Value) runtime.Value {
	switch v := x.(type) {
	case runtime.Quantity:
		if deriv {
			return runtime.Num(f.Deriv(v.V))
		}
		return runtime.Num(f.Eval(v.V))
	case *runtime.Vector:
		out := make([]float64, len(v.V))
		if deriv {
			f.ApplyDeriv(out, v.V)
		} else {
			f.Apply(out, v.V)
		}
		return &runtime.Vector{V: out}
	}
	return x
}

// fixedFunction returns a function value of one dimensionless variable
// standing for f (or f'), named for legends as "logistic[gain = 4]".
func fixedFunction(name string, f activation.Func, deriv bool) *runtime.Builtin {
	label := name + paramText(f)
	// Brackets, not parentheses: the signature adds "(x)" after the name.
	what := "The activation function " + label
	if deriv {
		label = "derivative of " + label
		what = "The exact derivative of the activation function " + name + paramText(f)
	}
	b := &runtime.Builtin{
		Name: label, Category: "activation", Returns: "a number or vector, dimensionless",
		Params: []runtime.Param{{Name: "x", Kind: runtime.KindNumbers, Dimensionless: true, Doc: "the input, dimensionless"}},
		Doc:    what + ", element-wise on a dimensionless number or vector; NaN gives NaN.",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			return applyAct(f, deriv, c.Value("x")), nil
		},
	}
	if d, ok := activation.Lookup(f.Name()); ok {
		b.Source = d.Source
	}
	remember(b, actInfo{f: f, deriv: deriv})
	return b
}

// paramText is "[gain = 4]" for parameters away from their defaults.
func paramText(f activation.Func) string {
	d, _ := activation.Lookup(f.Name())
	var parts []string
	for i, p := range f.Params() {
		if i < len(d.Params) && p.Value == d.Params[i].Default {
			continue
		}
		parts = append(parts, fmt.Sprintf("%s = %s", p.Name, fmt.Sprint(p.Value)))
	}
	if len(parts) == 0 {
		return ""
	}
	return "[" + strings.Join(parts, ", ") + "]"
}

func derivativeBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "derivative", Category: "activation",
		Params: []runtime.Param{{Name: "f", Kind: runtime.KindAny,
			Doc: "an activation function (logistic, relu(…) …) or an analytic tuning curve"}},
		Returns: "a function value, or a curve of slopes",
		Doc: "The exact derivative of an activation function, as a function value: derivative(logistic)(0) is 0.25. " +
			"Piecewise functions take the left-hand slope at their kink (relu'(0) = 0). " +
			"For an analytic tuning curve (lif_rate, rate_curve) it returns the curve of its slope d rate/d input " +
			"on the same inputs, in hertz per input unit; for the LIF closed form dr/dv = r² τ_m/(v (v − 1)).",
		Source: "common practice; LIF slope from differentiating Dayan & Abbott (2001), ch. 5",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			v := c.Value("f")
			if info, ok := activationOf(v); ok {
				if info.deriv {
					return nil, runtime.ValueErrorf("derivative: second derivatives of activation functions are not provided; differentiate the first one numerically or use the function itself")
				}
				name := info.f.Name()
				if n, ok := languageName[name]; ok {
					name = n
				}
				return fixedFunction(name, info.f, true), nil
			}
			if cv, ok := v.(*Curve); ok {
				return curveSlope(cv)
			}
			return nil, runtime.ArgumentErrorf("derivative: f must be an activation function (logistic, tanh, relu(…) …) or an analytic tuning curve, got %s; for a formula, write its derivative as another formula", v.Type())
		},
	}
}

// groupFn is a function of a whole vector: dst from src at temperature t.
type groupFn func(dst, src []float64, t float64) error

func registerGroup(reg *runtime.Registry) {
	x := runtime.Param{Name: "x", Kind: runtime.KindNumbers, Dimensionless: true,
		Doc: "the inputs of the group, dimensionless (one per neuron or class)"}
	temp := runtime.Param{Name: "temperature", Kind: runtime.KindNumber, Dimensionless: true, Default: "1",
		Doc: "the temperature T > 0; small T sharpens towards one_hot"}
	const src = "Bridle (1990), Probabilistic interpretation of feedforward classification network outputs; log-sum-exp shift: common practice"
	reg.Register(
		&runtime.Builtin{
			Name: "softmax", Category: "activation", Params: []runtime.Param{x, temp},
			Returns: "a dimensionless vector summing to 1",
			Doc: "The softmax of a group: softmax(x)_i = exp(x_i/T) / Σ_j exp(x_j/T), computed with the largest x subtracted " +
				"first (log-sum-exp shift) so that [1000, 1001, 1002] gives finite values. Entries of −∞ get weight 0. " +
				"An empty vector, a NaN or +∞ entry, or a temperature that is not positive are errors (NaN would spoil every entry).",
			Source: src,
			Fn:     groupAdapter(activation.Softmax),
		},
		&runtime.Builtin{
			Name: "log_softmax", Category: "activation", Params: []runtime.Param{x, temp},
			Returns: "a dimensionless vector",
			Doc: "The logarithm of softmax, log softmax(x)_i = (x_i − m)/T − log Σ_j exp((x_j − m)/T) with m the largest entry, " +
				"accurate even where softmax itself would round to 0. The same inputs are errors as for softmax.",
			Source: src,
			Fn:     groupAdapter(activation.LogSoftmax),
		},
		&runtime.Builtin{
			Name: "one_hot", Category: "activation", Params: []runtime.Param{x},
			Returns: "a dimensionless vector summing to 1",
			Doc: "The limit of softmax(x, temperature = T) as T → 0: weight 1 on the largest entry and 0 elsewhere; " +
				"k tied largest entries get 1/k each (tied entries keep equal weights at every temperature, so this is the true limit). " +
				"The same inputs are errors as for softmax.",
			Source: "common practice (limit of " + src + ")",
			Fn: groupAdapter(func(dst, src []float64, _ float64) error {
				return activation.OneHot(dst, src)
			}),
		},
		&runtime.Builtin{
			Name: "argmax", Category: "activation", Params: []runtime.Param{x},
			Returns: "a whole number, counting from 0 like indexing",
			Doc: "The position of the largest entry of x, counting from 0 as x[i] does; the first one on ties. " +
				"An empty vector or a NaN entry is an error (NaN has no order); ±∞ are ordered as usual.",
			Source: "common practice",
			Fn: func(c *runtime.Call) (runtime.Value, error) {
				xs, _ := c.Floats("x")
				i, err := activation.Argmax(xs)
				if err != nil {
					return nil, runtime.ValueErrorf("%s", languageText(err))
				}
				return runtime.Num(float64(i)), nil
			},
		},
	)
}

// groupAdapter wraps a group function as a builtin body.
func groupAdapter(f groupFn) func(c *runtime.Call) (runtime.Value, error) {
	return func(c *runtime.Call) (runtime.Value, error) {
		xs, _ := c.Floats("x")
		t := 1.0
		for _, p := range c.Builtin.Params {
			if p.Name == "temperature" {
				t = c.Float("temperature")
			}
		}
		out := make([]float64, len(xs))
		if err := f(out, xs, t); err != nil {
			return nil, runtime.ValueErrorf("%s", languageText(err))
		}
		return &runtime.Vector{V: out}, nil
	}
}

// languageText rewrites the package's Go names in an error message as the
// language spells them.
func languageText(err error) string {
	return strings.NewReplacer("OneHot", "one_hot(x)", "Softmax", "softmax", "LogSoftmax", "log_softmax").Replace(err.Error())
}

func steepnessBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "steepness", Category: "activation",
		Params: []runtime.Param{
			{Name: "f", Kind: runtime.KindFunction, Default: "logistic", Doc: "a sigmoid with a gain: logistic, tanh or atan"},
			{Name: "gains", Kind: runtime.KindNumbers, Dimensionless: true, Default: "[1, 3, 10, 30, 100]"},
			{Name: "over", Kind: runtime.KindNumbers, Dimensionless: true, Default: "span(-2, 2, n = 401)"},
		},
		Returns: "a figure",
		Doc: "A figure of a sigmoid f(a·x) at several gains a, drawn over the threshold function of the same range: " +
			"as a → ∞ the sigmoid tends to the threshold at every x ≠ 0 (for the logistic, to the 0/1 threshold with 1/2 at 0).",
		Source: "common practice",
		Fn:     steepness,
	}
}

func steepness(c *runtime.Call) (runtime.Value, error) {
	info, ok := activationOf(c.Value("f"))
	d, _ := activation.Lookup(info.f.Name())
	if !ok || info.deriv || len(d.Params) == 0 || d.Params[0].Name != "gain" {
		return nil, runtime.ArgumentErrorf("steepness: f must be a sigmoid with a gain (logistic, tanh or atan)")
	}
	gains, _ := c.Floats("gains")
	xs, _ := c.Floats("over")
	fig := &display.Figure{Title: "steepness limit of " + c.Value("f").(runtime.Function).FuncName()}
	p := display.Panel{XLabel: "x", YLabel: "f(a·x)"}
	for i, a := range gains {
		g, err := activation.New(d.Name, map[string]float64{"gain": a})
		if err != nil {
			return nil, runtime.ValueErrorf("steepness: %v", err)
		}
		y := make([]float64, len(xs))
		g.Apply(y, xs)
		p.Series = append(p.Series, display.Series{Kind: display.Line, Name: "a = " + units.FormatNumber(a), X: xs, Y: y, Colour: i%5 + 1})
	}
	lo, hi := info.f.Eval(math.Inf(-1)), info.f.Eval(math.Inf(1))
	p.Series = append(p.Series, display.Series{Kind: display.Line, Name: "threshold (a → ∞)", X: xs, Y: limitOf(xs, lo, hi), Colour: 4})
	fig.Panels = []display.Panel{p}
	return &rateFigure{fig: fig}, nil
}

// limitOf is the threshold function with range {lo, mid, hi}.
func limitOf(xs []float64, lo, hi float64) []float64 {
	y := make([]float64, len(xs))
	for i, x := range xs {
		switch {
		case x < 0:
			y[i] = lo
		case x > 0:
			y[i] = hi
		default:
			y[i] = (lo + hi) / 2
		}
	}
	return y
}

// rateFigure is a figure made by a builtin of this domain.
type rateFigure struct{ fig *display.Figure }

func (*rateFigure) Type() string                       { return "figure" }
func (f *rateFigure) String() string                   { return f.fig.Summary() }
func (f *rateFigure) Figure() (*display.Figure, error) { return f.fig, nil }
func (f *rateFigure) Show() ([]display.Bundle, error)  { return display.Bundles(f.fig) }

var _ Plottable = (*rateFigure)(nil)
