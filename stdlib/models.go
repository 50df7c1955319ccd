package stdlib

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
)

func init() { domains = append(domains, registerModels) }

// modelSpec is what one kind of model shares: its builtin (the single
// declaration of its parameters, units, defaults and docs), its card text,
// the dimension of its input and how to build one neuron of it.
type modelSpec struct {
	builtin   *runtime.Builtin
	title     string
	equations []string
	input     units.Dim
	example   string // an input of the right kind, "10 uA/cm^2"
	build     func(m *Model, i int) (neuron.Model, error)
	rules     []rule // checks in the language's names and units, before building
}

// rule is one check of a model's parameters, run for every neuron. With
// below set it requires name < below; otherwise ok(value) must hold, and want
// says what is required ("must be positive").
type rule struct {
	name, below string
	ok          func(si float64) bool
	want, hint  string
}

func positiveRule(name, hint string) rule {
	return rule{name: name, ok: func(v float64) bool { return v > 0 }, want: "must be positive", hint: hint}
}

func nonNegRule(name, hint string) rule {
	return rule{name: name, ok: func(v float64) bool { return v >= 0 }, want: "must be ≥ 0", hint: hint}
}

// celsius is the declared unit of temperatures.
var celsius = units.MustParse("degC")

// modelParam is one parameter of a model value: SI values, one per neuron
// (a single value is shared by all).
type modelParam struct {
	name, symbol, unit, doc string
	dim                     units.Dim
	v                       []float64
}

// Model is a neuron model value: the parameters of one neuron, or of a
// population when some parameters are vectors of one common length N.
type Model struct {
	spec    *modelSpec
	params  []modelParam
	n       int
	class   string                         // Izhikevich firing class, if any
	rate    func(float64) (float64, error) // rate_neuron activation
	rateFn  runtime.Function
	outDim  units.Dim // rate_neuron output dimension
	rateErr error     // first error of the activation during a run
}

var (
	_ runtime.Shower  = (*Model)(nil)
	_ runtime.Fielder = (*Model)(nil)
	_ runtime.Helper  = (*Model)(nil)
	_ runtime.Lener   = (*Model)(nil)
)

// Type implements runtime.Value.
func (*Model) Type() string { return "model" }

// Len is the number of neurons the model describes (1 unless a parameter
// is a vector).
func (m *Model) Len() int { return m.n }

// Name is the builtin that made the model ("hh").
func (m *Model) Name() string { return m.spec.builtin.Name }

// String is "hh model: C = 1 µF/cm², …" with at most six parameters.
func (m *Model) String() string {
	var parts []string
	for i, p := range m.params {
		if i == 6 {
			parts = append(parts, "…")
			break
		}
		parts = append(parts, p.name+" = "+m.paramValue(p).String())
	}
	head := m.spec.title
	if m.n > 1 {
		head += fmt.Sprintf(" population of %d", m.n)
	}
	return head + " (" + strings.Join(parts, ", ") + ")"
}

// paramValue is a parameter as a value; temperatures keep the declared
// unit (°C), as on the card, instead of kelvin.
func (m *Model) paramValue(p modelParam) runtime.Value {
	var u *units.Unit
	if p.dim == units.Temperature {
		uu := displayUnit(p.unit, p.dim, p.v)
		u = &uu
	}
	if len(p.v) == 1 {
		return runtime.Quantity{V: p.v[0], Dim: p.dim, Unit: u}
	}
	return &runtime.Vector{V: p.v, Dim: p.dim, Unit: u}
}

// Field implements runtime.Fielder: every parameter by its name, and n.
func (m *Model) Field(name string) (runtime.Value, error) {
	for _, p := range m.params {
		if p.name == name {
			return m.paramValue(p), nil
		}
	}
	switch name {
	case "n":
		return runtime.Num(float64(m.n)), nil
	case "class":
		if m.class != "" {
			return runtime.String(m.class), nil
		}
	}
	return nil, fmt.Errorf("%s has no field %s; its fields are %s", m.Name(), name, strings.Join(m.FieldNames(), ", "))
}

// FieldNames implements runtime.Fielder.
func (m *Model) FieldNames() []string {
	out := make([]string, 0, len(m.params)+2)
	for _, p := range m.params {
		out = append(out, p.name)
	}
	out = append(out, "n")
	if m.class != "" {
		out = append(out, "class")
	}
	return out
}

// Help implements runtime.Helper: the card as text, then the declaration.
func (m *Model) Help() string {
	txt, err := m.card().Text()
	if err != nil {
		txt = m.String()
	}
	return txt + "\n" + m.spec.builtin.Help()
}

// Show implements runtime.Shower: the model card.
func (m *Model) Show() ([]display.Bundle, error) {
	b, err := m.card().Bundle()
	if err != nil {
		return nil, err
	}
	return []display.Bundle{b}, nil
}

func (m *Model) card() *display.Card {
	c := &display.Card{Title: m.spec.title, Equations: m.spec.equations, Source: m.spec.builtin.Source,
		Description: fmt.Sprintf("%s Input: %s, e.g. %s.", firstSentence(m.spec.builtin.Doc), m.spec.input.Describe(), m.spec.example)}
	if m.class != "" {
		c.Description += " Firing class: " + m.class + "."
	}
	if m.rateFn != nil {
		c.Description += " Activation: " + m.rateFn.FuncName() + "."
	}
	if m.n > 1 {
		c.Description += fmt.Sprintf(" A population of %d neurons.", m.n)
	}
	for _, p := range m.params {
		u := displayUnit(p.unit, p.dim, p.v)
		dp := display.Param{Name: p.name, Symbol: p.symbol, Value: Scalar(p.v[0], u), Unit: u.Symbol, Note: p.doc}
		if len(p.v) > 1 {
			dp.Value = Scalar(paramMean(p.v), u)
			dp.Note = fmt.Sprintf("mean of %d values, %s to %s; %s", len(p.v), units.FormatIn(paramMin(p.v), u), units.FormatIn(paramMax(p.v), u), p.doc)
		}
		c.Params = append(c.Params, dp)
	}
	return c
}

// displayUnit is the declared unit of a parameter, or one chosen for dim.
func displayUnit(text string, d units.Dim, v []float64) units.Unit {
	if text != "" {
		if u, err := units.Parse(text); err == nil && u.Dim == d {
			return u
		}
	}
	return runtime.ChooseUnit(v, d)
}

func firstSentence(s string) string {
	if i := strings.Index(s, ". "); i > 0 {
		return s[:i+1]
	}
	return s
}

// Neuron builds neuron i of the model (a fresh value each call, so that
// parallel runs share nothing).
func (m *Model) Neuron(i int) (neuron.Model, error) {
	nm, err := m.spec.build(m, i)
	if err != nil {
		return nil, err
	}
	if err := nm.Validate(); err != nil {
		return nil, runtime.ValueErrorf("%s: %s", m.Name(), strings.TrimPrefix(err.Error(), "neuron: "))
	}
	return nm, nil
}

// get returns parameter name of neuron i in SI units.
func (m *Model) get(name string, i int) float64 {
	for _, p := range m.params {
		if p.name == name {
			if len(p.v) == 1 {
				return p.v[0]
			}
			return p.v[i]
		}
	}
	panic("stdlib: model has no parameter " + name)
}

// newModel collects the parameters of spec's builtin from c (every number
// parameter with a unit or marked dimensionless; those not given and
// without default are skipped), checks they are finite and of one common
// length, and checks that every neuron builds and validates.
func newModel(c *runtime.Call, spec *modelSpec, symbols map[string]string) (*Model, error) {
	m := &Model{spec: spec, n: 1}
	for _, p := range c.Builtin.Params {
		if p.Kind != runtime.KindNumbers || !c.Has(p.Name) {
			continue
		}
		v, d := c.Floats(p.Name)
		if err := m.add(p.Name, symbols[p.Name], p.Unit, p.Doc, d, v); err != nil {
			return nil, err
		}
	}
	return m, nil
}

// add appends one parameter, checking finiteness and the common length.
func (m *Model) add(name, symbol, unit, doc string, d units.Dim, v []float64) error {
	b := m.spec.builtin.Name
	if len(v) == 0 {
		return runtime.ValueErrorf("%s: %s is an empty vector; give one value or one per neuron", b, name)
	}
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return runtime.ValueErrorf("%s: %s must be finite, got %s", b, name, units.Format(x, d))
		}
	}
	if len(v) > 1 {
		if m.n > 1 && len(v) != m.n {
			return runtime.ValueErrorf("%s: %s has %d values but another parameter has %d; give every vector parameter one value per neuron", b, name, len(v), m.n)
		}
		m.n = len(v)
	}
	m.params = append(m.params, modelParam{name: name, symbol: symbol, unit: unit, doc: doc, dim: d, v: v})
	return nil
}

// finish checks the spec's rules and then that every neuron of m builds;
// c tells which parameters the caller gave (for the hint on a default).
func (m *Model) finish(c *runtime.Call) (*Model, error) {
	for _, r := range m.spec.rules {
		if err := m.check(c, r); err != nil {
			return nil, err
		}
	}
	for i := 0; i < m.n; i++ {
		if _, err := m.Neuron(i); err != nil {
			return nil, err
		}
	}
	return m, nil
}

// check applies one rule to every neuron, telling a failure in the
// parameter's own name and unit.
func (m *Model) check(c *runtime.Call, r rule) error {
	for i := 0; i < m.n; i++ {
		v := m.get(r.name, i)
		if r.below != "" {
			if w := m.get(r.below, i); !(v < w) {
				return runtime.ValueErrorf("%s: %s = %s must lie below %s = %s%s; %s", m.Name(), r.name, m.show(r.name, v), r.below, m.show(r.below, w),
					m.which(i), m.belowHint(c, r))
			}
		} else if !r.ok(v) {
			return runtime.ValueErrorf("%s: %s %s, got %s%s; %s", m.Name(), r.name, r.want, m.show(r.name, v), m.which(i), r.hint)
		}
	}
	return nil
}

// which names neuron i of a population.
func (m *Model) which(i int) string {
	if m.n == 1 {
		return ""
	}
	return fmt.Sprintf(" for neuron %d (counting from 0)", i)
}

// belowHint says how to restore the order, pointing at a default the caller
// may not know they relied on.
func (m *Model) belowHint(c *runtime.Call, r rule) string {
	for _, p := range c.Builtin.Params {
		if p.Name == r.name && p.Default != "" && !c.Given(r.name) {
			return fmt.Sprintf("%s defaults to %s, so give %s too, below %s", r.name, p.Default, r.name, r.below)
		}
	}
	if r.hint != "" {
		return r.hint
	}
	return fmt.Sprintf("lower %s or raise %s", r.name, r.below)
}

// show formats an SI value of a parameter in its declared unit.
func (m *Model) show(name string, v float64) string {
	for _, p := range m.params {
		if p.name == name {
			return units.FormatIn(v, displayUnit(p.unit, p.dim, p.v))
		}
	}
	return units.FormatNumber(v)
}

func registerModels(reg *runtime.Registry) {
	reg.Register(lifSpec.builtin, lifNormSpec.builtin, hhSpec.builtin, adexSpec.builtin, izhSpec.builtin, rateSpec.builtin)
}

// num declares a model parameter that may be a vector (one per neuron).
func num(name, unit, def, doc string) runtime.Param {
	return runtime.Param{Name: name, Kind: runtime.KindNumbers, Unit: unit, Default: def, Doc: doc}
}

// pure declares a dimensionless model parameter.
func pure(name, def, doc string) runtime.Param {
	return runtime.Param{Name: name, Kind: runtime.KindNumbers, Dimensionless: true, Default: def, Doc: doc}
}

// opt declares an optional model parameter without a default.
func opt(name, unit, doc string) runtime.Param {
	return runtime.Param{Name: name, Kind: runtime.KindNumbers, Unit: unit, Optional: true, Doc: doc}
}

// modelFn is the Fn of a model builtin whose parameters map one to one.
func modelFn(spec **modelSpec, symbols map[string]string) func(c *runtime.Call) (runtime.Value, error) {
	return func(c *runtime.Call) (runtime.Value, error) {
		m, err := newModel(c, *spec, symbols)
		if err != nil {
			return nil, err
		}
		return m.finish(c)
	}
}

func paramMean(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x
	}
	return s / float64(len(v))
}

func paramMin(v []float64) float64 {
	m := v[0]
	for _, x := range v {
		m = math.Min(m, x)
	}
	return m
}

func paramMax(v []float64) float64 {
	m := v[0]
	for _, x := range v {
		m = math.Max(m, x)
	}
	return m
}
