package activation

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// ParamSpec declares one parameter of a function: its name, default value,
// the closed interval [Min, Max] of allowed values (±Inf for no bound) and a
// one-line description. All parameters are dimensionless.
type ParamSpec struct {
	Name     string
	Default  float64
	Min, Max float64
	Doc      string
}

// Descriptor declares one element-wise function once, for code, the
// language layer and the documentation alike: Name (lower snake case),
// Formula (LaTeX, with a for the gain), Range (LaTeX interval), Params, and
// Source (the reference for the definition or "common practice").
type Descriptor struct {
	Name    string
	Formula string
	Range   string
	Params  []ParamSpec
	Source  string
	build   func(p []float64) Func
}

// gainSpec is the shared steepness parameter of the sigmoids.
var gainSpec = ParamSpec{"gain", 1, math.SmallestNonzeroFloat64, math.MaxFloat64, "steepness a; f is evaluated at a·z"}

// Table lists every element-wise function, in documentation order. It must
// not be modified.
var Table = []Descriptor{
	{"logistic", `\sigma(az) = \frac{1}{1+e^{-az}}`, `(0, 1)`, []ParamSpec{gainSpec},
		"common practice", func(p []float64) Func { return Logistic{p[0]} }},
	{"tanh", `\tanh(az)`, `(-1, 1)`, []ParamSpec{gainSpec},
		"Abramowitz & Stegun 1964, ch. 4", func(p []float64) Func { return Tanh{p[0]} }},
	{"arctan", `\arctan(az)`, `(-\pi/2, \pi/2)`, []ParamSpec{gainSpec},
		"Abramowitz & Stegun 1964, ch. 4", func(p []float64) Func { return Arctan{p[0]} }},
	{"threshold", `H(z) = \begin{cases}0 & z<0\\ h_0 & z=0\\ 1 & z>0\end{cases}`, `\{0, h_0, 1\}`,
		[]ParamSpec{{"at_zero", 0.5, 0, 1, "value h_0 at z = 0"}},
		"common practice (Heaviside step)", func(p []float64) Func { return Threshold{p[0]} }},
	{"sign_threshold", `\operatorname{sgn}(z) = \begin{cases}-1 & z<0\\ s_0 & z=0\\ 1 & z>0\end{cases}`, `\{-1, s_0, 1\}`,
		[]ParamSpec{{"at_zero", 0, -1, 1, "value s_0 at z = 0"}},
		"common practice", func(p []float64) Func { return SignThreshold{p[0]} }},
	{"relu", `\max(0, z)`, `[0, \infty)`, nil,
		"common practice", func([]float64) Func { return ReLU{} }},
	{"leaky_relu", `\begin{cases}z & z>0\\ sz & z\le 0\end{cases}`, `(-\infty, \infty)`,
		[]ParamSpec{{"slope", 0.01, -math.MaxFloat64, math.MaxFloat64, "slope s for z ≤ 0"}},
		"common practice", func(p []float64) Func { return LeakyReLU{p[0]} }},
	{"two_slope", `\begin{cases}r z & z\ge 0\\ l z & z<0\end{cases}`, `depends on l, r`,
		[]ParamSpec{{"left", 0, -math.MaxFloat64, math.MaxFloat64, "slope l for z < 0"},
			{"right", 1, -math.MaxFloat64, math.MaxFloat64, "slope r for z ≥ 0"}},
		"common practice", func(p []float64) Func { return TwoSlope{p[0], p[1]} }},
	{"softplus", `\frac{1}{a}\log(1+e^{az})`, `(0, \infty)`, []ParamSpec{gainSpec},
		"common practice", func(p []float64) Func { return Softplus{p[0]} }},
	{"elu", `\begin{cases}z & z>0\\ \alpha(e^{z}-1) & z\le 0\end{cases}`, `(-\alpha, \infty)`,
		[]ParamSpec{{"alpha", 1, math.SmallestNonzeroFloat64, math.MaxFloat64, "saturation depth α"}},
		"Clevert, Unterthiner & Hochreiter 2016 (ICLR)", func(p []float64) Func { return ELU{p[0]} }},
}

// Lookup returns the descriptor with the given name and whether it exists.
func Lookup(name string) (Descriptor, bool) {
	for _, d := range Table {
		if d.Name == name {
			return d, true
		}
	}
	return Descriptor{}, false
}

// New returns the function called name with the given parameter values;
// parameters missing from values take their defaults. It returns an error
// for an unknown name, an unknown parameter or a value out of range.
// values is not modified.
func New(name string, values map[string]float64) (Func, error) {
	d, ok := Lookup(name)
	if !ok {
		return nil, fmt.Errorf("activation: unknown function %q; known functions are %s", name, knownNames())
	}
	p := make([]float64, len(d.Params))
	for i, s := range d.Params {
		p[i] = s.Default
	}
	for k, v := range values {
		i := d.paramIndex(k)
		if i < 0 {
			return nil, fmt.Errorf("activation: %s has no parameter %q; its parameters are %s", name, k, d.paramNames())
		}
		s := d.Params[i]
		if !(v >= s.Min && v <= s.Max) {
			return nil, fmt.Errorf("activation: %s %s must lie in [%g, %g], got %v; the default is %g", name, k, s.Min, s.Max, v, s.Default)
		}
		p[i] = v
	}
	f := d.build(p)
	return f, f.Validate()
}

func (d Descriptor) paramIndex(name string) int {
	for i, s := range d.Params {
		if s.Name == name {
			return i
		}
	}
	return -1
}

func (d Descriptor) paramNames() string {
	if len(d.Params) == 0 {
		return "none"
	}
	names := make([]string, len(d.Params))
	for i, s := range d.Params {
		names[i] = s.Name
	}
	return strings.Join(names, ", ")
}

func knownNames() string {
	names := make([]string, len(Table))
	for i, d := range Table {
		names[i] = d.Name
	}
	sort.Strings(names)
	return strings.Join(names, ", ")
}
