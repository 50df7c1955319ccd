package stdlib

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/tuning"
)

// Curve is the value kind of a tuning curve: a response (usually a firing
// rate) as a function of one input (usually a current). Tuning curves of rate
// neurons, the LIF closed form and the f–I sweeps of spiking models all share
// it, so they show, tabulate, plot, evaluate and fit the same way.
//
// A sampled curve holds measured or simulated points (X, Y and optional
// standard errors SE) and is drawn as points with error bars; between points
// it is read by linear interpolation. An analytic curve holds a Model that
// gives the exact response at any input (X, Y are then its values on a grid)
// and is drawn as a line. All values are in SI units of XDim and YDim. Extra
// holds further named series over the same X (AddSeries). A Curve is not
// modified after it is shown to the language; build a new one instead.
type Curve struct {
	Name       string
	XName      string // axis and column name of the input: "I" for a current
	YName      string // of the response: "rate" for a frequency
	XDim, YDim units.Dim
	X, Y, SE   []float64
	Extra      []CurveSeries
	// Model, if non-nil, is the analytic curve (input in SI units of XDim,
	// output in hertz); its parameters are exposed with their units.
	Model tuning.Curve
	// Line asks for a sampled curve to be drawn as a line (a dense
	// estimate or slope) rather than as points.
	Line bool
	// LogX asks for a logarithmic input axis (inputs spread over decades,
	// such as noise levels); the inputs must then be positive.
	LogX bool
	// YUnit, if set, is the unit responses are shown in (a slope in Hz/nA
	// rather than the SI form 1/C); nil chooses one from the values.
	YUnit  *units.Unit
	Note   string // a line under the table: a source or a caveat
	Source string // the published form the curve follows, if any
}

// maxRater is a model with a largest rate (the LIF curve: 1/τ_ref).
type maxRater interface{ MaxRate() float64 }

// CurveSeries is one further named series of a Curve over the same inputs.
type CurveSeries struct {
	Name string
	Y    []float64
}

// CurveParam is one adjustable parameter of an analytic curve: its name and
// its value in SI units of Dim, so a fitter can vary it as a quantity.
type CurveParam struct {
	Name  string
	Value float64
	Dim   units.Dim
}

var (
	_ runtime.Value   = (*Curve)(nil)
	_ runtime.Shower  = (*Curve)(nil)
	_ runtime.Fielder = (*Curve)(nil)
	_ runtime.Helper  = (*Curve)(nil)
	_ Plottable       = (*Curve)(nil)
)

// NewSampledCurve returns a sampled curve through (x[i], y[i]) with standard
// errors se[i] (se may be nil), x in SI units of xDim and y of yDim. The
// slices are copied. It panics if the lengths differ (programmer misuse).
func NewSampledCurve(name string, x []float64, xDim units.Dim, y []float64, yDim units.Dim, se []float64) *Curve {
	if len(y) != len(x) || (se != nil && len(se) != len(x)) {
		panic(fmt.Sprintf("stdlib: NewSampledCurve: %d x, %d y, %d se", len(x), len(y), len(se)))
	}
	c := &Curve{Name: name, XDim: xDim, YDim: yDim, X: clone(x), Y: clone(y)}
	if se != nil {
		c.SE = clone(se)
	}
	c.XName, c.YName = axisNames(xDim, yDim)
	return c
}

// NewModelCurve returns the analytic curve of m tabulated at the inputs x
// (SI units of xDim; copied); the response is a rate in hertz.
func NewModelCurve(name string, m tuning.Curve, x []float64, xDim units.Dim) *Curve {
	y := make([]float64, len(x))
	tuning.Tabulate(y, m, x)
	c := &Curve{Name: name, XDim: xDim, YDim: units.Frequency, X: clone(x), Y: y, Model: m}
	c.XName, c.YName = axisNames(xDim, units.Frequency)
	return c
}

// NewLIFTuning returns the LIF tuning curve in closed form,
// rate = 1/(tauRef − tauM ln(1 − 1/v)) with v = gain·x + bias, tabulated at
// x (SI units of xDim): gain is in SI units of 1/xDim, times in seconds.
// It returns an error for unusable time constants.
func NewLIFTuning(tauRef, tauM, gain, bias float64, x []float64, xDim units.Dim) (*Curve, error) {
	m := tuning.LIFCurve{TauRef: tauRef, TauM: tauM, Gain: gain, Bias: bias, InputUnit: siSymbol(xDim)}
	if err := m.Validate(); err != nil {
		return nil, fmt.Errorf("stdlib: %v", err)
	}
	c := NewModelCurve("LIF tuning curve", m, x, xDim)
	c.Source = "Dayan & Abbott (2001), Theoretical Neuroscience, ch. 5"
	return c, nil
}

// AddSeries adds a further named series over the curve's inputs, in SI units
// of the curve's YDim; y is copied. It panics if len(y) != len(c.X).
func (c *Curve) AddSeries(name string, y []float64) {
	if len(y) != len(c.X) {
		panic(fmt.Sprintf("stdlib: AddSeries %q: %d values for %d inputs", name, len(y), len(c.X)))
	}
	c.Extra = append(c.Extra, CurveSeries{Name: name, Y: clone(y)})
}

// Type implements runtime.Value.
func (*Curve) Type() string { return "curve" }

// Len implements runtime.Lener: the number of tabulated inputs.
func (c *Curve) Len() int { return len(c.X) }

// String is a one-line summary: name, size, input range, largest response.
func (c *Curve) String() string {
	kind := "sampled"
	if c.Model != nil {
		kind = "analytic"
	}
	if len(c.X) == 0 {
		return fmt.Sprintf("%s (%s curve, no points)", c.Name, kind)
	}
	lo, hi := minMax(c.X)
	_, top := minMax(c.Y)
	return fmt.Sprintf("%s (%s curve, %d points, %s from %s to %s, %s up to %s)", c.Name, kind,
		len(c.X), c.XName, units.Format(lo, c.XDim), units.Format(hi, c.XDim), c.YName, units.Format(top, c.YDim))
}

// Params returns the adjustable parameters of an analytic curve in SI units
// (nil for a sampled curve), in the model's fixed order.
func (c *Curve) Params() []CurveParam {
	if c.Model == nil {
		return nil
	}
	ps := c.Model.Params()
	out := make([]CurveParam, len(ps))
	for i, p := range ps {
		scale, d := paramUnit(p.Unit, c.XDim)
		out[i] = CurveParam{Name: p.Name, Value: p.Value * scale, Dim: d}
	}
	return out
}

// WithParams returns a copy of an analytic curve with its parameters set to
// values (SI, the order of Params), tabulated on the same inputs; the
// receiver is unchanged. It returns an error for a sampled curve, a wrong
// count or unusable values.
func (c *Curve) WithParams(values []float64) (*Curve, error) {
	if c.Model == nil {
		return nil, runtime.ValueErrorf("stdlib: %s is sampled and has no parameters to vary", c.Name)
	}
	ps := c.Model.Params()
	if len(values) != len(ps) {
		return nil, runtime.ArgumentErrorf("stdlib: %s has %d parameters, got %d values", c.Name, len(ps), len(values))
	}
	native := make([]float64, len(values))
	for i, p := range ps {
		scale, _ := paramUnit(p.Unit, c.XDim)
		native[i] = values[i] / scale
	}
	m, err := c.Model.WithParams(native)
	if err != nil {
		return nil, runtime.ValueErrorf("stdlib: %v", err)
	}
	out := NewModelCurve(c.Name, m, c.X, c.XDim)
	out.XName, out.YName, out.Note, out.Source = c.XName, c.YName, c.Note, c.Source
	return out, nil
}

// At returns the response at input x (SI): exact for an analytic curve,
// by linear interpolation for a sampled one (holding the end values outside
// the sampled range). It returns an error for a sampled curve that cannot be
// interpolated (fewer than two points, inputs not increasing, NaN rates).
func (c *Curve) At(x float64) (float64, error) {
	if c.Model != nil {
		return c.Model.Rate(x), nil
	}
	s, err := tuning.NewSampled(c.X, c.Y, nil)
	if err != nil {
		return 0, runtime.ValueErrorf("stdlib: cannot read %s between its points: %v", c.Name, err)
	}
	return s.Rate(x), nil
}

// paramUnit is the scale onto SI and the dimension of a model parameter's
// unit text. Gains are "1/<input unit>", and the models built here take the
// input in SI units, so a gain is in SI units of 1/xDim.
func paramUnit(text string, xDim units.Dim) (float64, units.Dim) {
	if strings.HasPrefix(text, "1/") {
		return 1, units.Dimensionless.Div(xDim)
	}
	if u, err := units.Parse(text); text != "" && err == nil {
		return u.Scale, u.Dim
	}
	return 1, units.Dimensionless
}

func axisNames(x, y units.Dim) (string, string) {
	xn, yn := "input", "response"
	if x == units.Current || x == units.CurrentDensity {
		xn = "I"
	}
	if y == units.Frequency {
		yn = "rate"
	}
	return xn, yn
}

// siSymbol is the SI form of a dimension, the text the tuning package uses
// for the input unit of a gain ("A" gives gains in "1/A").
func siSymbol(d units.Dim) string {
	if d.IsDimensionless() {
		return ""
	}
	return d.SIForm()
}

func clone(s []float64) []float64 { return append([]float64(nil), s...) }

func minMax(s []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range s {
		if v < lo {
			lo = v
		}
		if v > hi {
			hi = v
		}
	}
	return lo, hi
}

// joinNames lists names for titles: "logistic, tanh".
func joinNames(names []string) string { return strings.Join(names, ", ") }

// Table returns the curve as a table: input, response, its standard error
// when known, and each further series, in readable units.
func (c *Curve) Table() *display.Table {
	xa := NewAxis(c.XName, c.X, c.XDim)
	yu := c.yUnit()
	cols := []display.Column{display.Numbers(c.XName, xa.Unit.Symbol, xa.Data),
		display.Numbers(c.YName, yu.Symbol, AxisIn(c.YName, c.Y, yu).Data)}
	if c.SE != nil {
		cols = append(cols, display.Numbers("se", yu.Symbol, AxisIn("se", c.SE, units.Unit{Symbol: yu.Symbol, Scale: yu.Scale}).Data))
	}
	for _, s := range c.Extra {
		cols = append(cols, display.Numbers(s.Name, yu.Symbol, AxisIn(s.Name, s.Y, yu).Data))
	}
	return &display.Table{Title: c.Name, Columns: cols, Note: c.note()}
}

func (c *Curve) yUnit() units.Unit {
	if c.YUnit != nil {
		return *c.YUnit
	}
	return runtime.ChooseUnit(c.Y, c.YDim)
}

func (c *Curve) note() string {
	parts := []string{}
	if c.Note != "" {
		parts = append(parts, c.Note)
	}
	if c.Source != "" {
		parts = append(parts, "Source: "+c.Source)
	}
	return strings.Join(parts, " · ")
}

// Figure implements Plottable: points with error bars for a sampled curve,
// a line for an analytic one, and one more series per extra series.
func (c *Curve) Figure() (*display.Figure, error) {
	if len(c.X) == 0 {
		return nil, runtime.ValueErrorf("stdlib: %s has no points to plot", c.Name)
	}
	xa := NewAxis(c.XName, c.X, c.XDim)
	yu := c.yUnit()
	main := display.Series{Kind: display.Line, Name: c.Name, X: xa.Data, Y: AxisIn("", c.Y, yu).Data}
	if c.Model == nil && !c.Line {
		main.Kind = display.Points
		if c.SE != nil {
			main.YErr = AxisIn("", c.SE, units.Unit{Symbol: yu.Symbol, Scale: yu.Scale}).Data
		}
	}
	p := display.Panel{XLabel: xa.Label, YLabel: Label(c.YName, yu), Series: []display.Series{main}, LogX: c.LogX}
	for _, s := range c.Extra {
		// Drawn as lines so that they stay apart from the main points when
		// they coincide (a LIF's first-ISI rate is its steady rate).
		name := legendName(s.Name)
		if c.Name != "" {
			name = c.Name + ", " + name
		}
		p.Series = append(p.Series, display.Series{Kind: display.Line, Name: name, X: xa.Data, Y: AxisIn("", s.Y, yu).Data})
	}
	return &display.Figure{Title: c.Name, Panels: []display.Panel{p}}, nil
}

// legendPhrases are series names whose legend needs more than spaces for
// underscores: a compound modifier takes a hyphen ("first-ISI rate", the
// rate from the first inter-spike interval).
var legendPhrases = map[string]string{"first_isi_rate": "first-ISI rate"}

// legendAbbrevs are the trade's abbreviations, written in capitals in legends.
var legendAbbrevs = map[string]string{"isi": "ISI", "cv": "CV", "lv": "LV", "psth": "PSTH", "rms": "RMS", "fi": "f–I"}

// legendName is how a series name (a field name such as first_isi_rate)
// reads in a legend: underscores become spaces and abbreviations capitals.
func legendName(field string) string {
	if p, ok := legendPhrases[field]; ok {
		return p
	}
	words := strings.Split(field, "_")
	for i, w := range words {
		if a, ok := legendAbbrevs[w]; ok {
			words[i] = a
		}
	}
	return strings.Join(words, " ")
}

// Show implements runtime.Shower: the table, then the figure.
func (c *Curve) Show() ([]display.Bundle, error) {
	f, err := c.Figure()
	if err != nil {
		return nil, err
	}
	return display.TableAndFigure(c.Table(), f)
}

// FieldNames implements runtime.Fielder.
func (c *Curve) FieldNames() []string {
	names := []string{"x", "rate", "se", "parameters", "name"}
	if _, ok := c.Model.(maxRater); ok {
		names = append(names, "max_rate")
	}
	for _, s := range c.Extra {
		names = append(names, s.Name)
	}
	return names
}

// Field implements runtime.Fielder: x and rate (the tabulated inputs and
// responses; "rate" is the response whatever its dimension), se, parameters
// (a record of quantities), name, and each extra series by its name.
func (c *Curve) Field(name string) (runtime.Value, error) {
	switch name {
	case "x":
		return &runtime.Vector{V: clone(c.X), Dim: c.XDim}, nil
	case "rate":
		return &runtime.Vector{V: clone(c.Y), Dim: c.YDim}, nil
	case "se":
		if c.SE == nil {
			return nil, runtime.ValueErrorf("%s has no standard errors (it is %s)", c.Name, c.kind())
		}
		return &runtime.Vector{V: clone(c.SE), Dim: c.YDim}, nil
	case "parameters":
		r := &runtime.Record{}
		for _, p := range c.Params() {
			r.Names = append(r.Names, p.Name)
			r.Values = append(r.Values, runtime.Q(p.Value, p.Dim))
		}
		return r, nil
	case "name":
		return runtime.String(c.Name), nil
	case "max_rate":
		if m, ok := c.Model.(maxRater); ok {
			return runtime.Q(m.MaxRate(), units.Frequency), nil
		}
	}
	for _, s := range c.Extra {
		if s.Name == name {
			return &runtime.Vector{V: clone(s.Y), Dim: c.YDim}, nil
		}
	}
	return nil, runtime.ValueErrorf("a curve has no field %s; its fields are %s", name, joinNames(c.FieldNames()))
}

func (c *Curve) kind() string {
	if c.Model != nil {
		return "an analytic curve"
	}
	return "a sampled curve without errors"
}

// Help implements runtime.Helper.
func (c *Curve) Help() string {
	var b strings.Builder
	b.WriteString(c.String() + "\n\n")
	if c.Model != nil {
		b.WriteString("An analytic tuning curve: at(curve, x) evaluates it exactly at any input.\nParameters:\n")
		for _, p := range c.Params() {
			fmt.Fprintf(&b, "  %-8s %s\n", p.Name, units.Format(p.Value, p.Dim))
		}
	} else {
		b.WriteString("A sampled curve: at(curve, x) interpolates linearly between its points.\n")
	}
	b.WriteString("Fields: " + joinNames(c.FieldNames()) + "\n")
	if c.Source != "" {
		b.WriteString("Source: " + c.Source + "\n")
	}
	return b.String()
}

func init() { domains = append(domains, registerCurve) }

func registerCurve(reg *runtime.Registry) {
	reg.Register(&runtime.Builtin{
		Name: "curve", Category: "tuning", Returns: "a sampled curve",
		Doc: "A curve through measured points (x[i], y[i]), such as the f–I relation read from a recording: " +
			"curve(steps.current, steps.rate, se = steps.rate_se). It shows and plots as a sweep's curve does " +
			"(points with error bars), so recorded and simulated f–I curves overlay in one figure, and at() interpolates it.",
		Params: []runtime.Param{
			{Name: "x", Kind: runtime.KindNumbers, Doc: "the inputs, increasing"},
			{Name: "y", Kind: runtime.KindNumbers, Doc: "the responses, one per input"},
			{Name: "se", Kind: runtime.KindNumbers, Optional: true, Doc: "standard errors of y, in y's unit"},
			{Name: "name", Kind: runtime.KindString, Default: `"measured"`},
			{Name: "x_name", Kind: runtime.KindString, Default: `""`, Doc: "the name of the input for axes and columns, e.g. \"angle\"; empty gives I for a current, otherwise input"},
			{Name: "y_name", Kind: runtime.KindString, Default: `""`, Doc: "the name of the response; empty gives rate for a frequency, otherwise response"},
		},
		Fn: curveFn,
	})
}

func curveFn(c *runtime.Call) (runtime.Value, error) {
	x, xd := c.Floats("x")
	y, yd := c.Floats("y")
	if len(x) != len(y) || len(x) == 0 {
		return nil, runtime.ValueErrorf("curve: x has %d values and y %d; give one response per input", len(x), len(y))
	}
	for i := 1; i < len(x); i++ {
		if !(x[i] > x[i-1]) {
			return nil, runtime.ValueErrorf("curve: x must increase, but x[%d] = %s follows %s; sort the rows first", i, units.Format(x[i], xd), units.Format(x[i-1], xd))
		}
	}
	var se []float64
	if c.Has("se") {
		var sd units.Dim
		se, sd = c.Floats("se")
		if sd != yd || len(se) != len(y) {
			return nil, runtime.ValueErrorf("curve: se must have one value per point in y's unit (%s)", yd.Describe())
		}
	}
	cv := NewSampledCurve(c.Str("name"), x, xd, y, yd, se)
	if n := c.Str("x_name"); n != "" {
		cv.XName = n
	}
	if n := c.Str("y_name"); n != "" {
		cv.YName = n
	}
	return cv, nil
}
