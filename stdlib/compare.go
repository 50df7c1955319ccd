package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

func init() { domains = append(domains, registerCompare) }

func registerCompare(reg *runtime.Registry) {
	reg.Register(
		&runtime.Builtin{
			Name: "residuals", Category: "figures", Returns: "a residual table and figure",
			Doc: "Compares a model curve (an f–I sweep, a tuning curve) with measured points (a curve made with curve()): " +
				"the model is read at each measured input (by at()), and the residual is measured − model. " +
				"It shows a table of input, measured, model and residual, and a figure with both curves above the residuals " +
				"on a shared input axis; fields: x, measured, model, residual, rms.",
			Params: []runtime.Param{
				{Name: "model", Kind: runtime.KindAny, Doc: "the curve of the model"},
				{Name: "data", Kind: runtime.KindAny, Doc: "the measured curve"},
			},
			Fn: residualsFn,
		},
		&runtime.Builtin{
			Name: "phase", Category: "figures", Returns: "a figure",
			Doc: "The phase-plane view of a trace: one recorded variable against another (by default the gating variable n against the membrane potential v), " +
				"drawn as a line in time order.",
			Params: []runtime.Param{
				{Name: "trace", Kind: runtime.KindAny},
				{Name: "x", Kind: runtime.KindString, Default: `"v"`, Doc: "the variable on the horizontal axis"},
				{Name: "y", Kind: runtime.KindString, Default: `"n"`, Doc: "the variable on the vertical axis"},
			},
			Fn: phaseFn,
		},
	)
}

// Residuals is a model curve read at measured points.
type Residuals struct {
	model, data                *Curve
	x, measured, fitted, resid []float64
	rms                        float64
}

func residualsFn(c *runtime.Call) (runtime.Value, error) {
	m, ok1 := c.Value("model").(*Curve)
	d, ok2 := c.Value("data").(*Curve)
	if !ok1 || !ok2 {
		return nil, runtime.ArgumentErrorf("residuals: model and data must be curves (from sweep, lif_tuning, rate_curve or curve())")
	}
	if m.XDim != d.XDim || m.YDim != d.YDim {
		return nil, runtime.UnitErrorf("residuals: the model maps %s to %s but the data %s to %s", m.XDim.Describe(), m.YDim.Describe(), d.XDim.Describe(), d.YDim.Describe())
	}
	r := &Residuals{model: m, data: d, x: d.X, measured: d.Y}
	ss := 0.0
	for i, x := range d.X {
		y, err := m.At(x)
		if err != nil {
			return nil, runtime.ValueErrorf("residuals: %v", err)
		}
		r.fitted = append(r.fitted, y)
		r.resid = append(r.resid, d.Y[i]-y)
		ss += (d.Y[i] - y) * (d.Y[i] - y)
	}
	r.rms = math.Sqrt(ss / float64(len(d.X)))
	return r, nil
}

// Type implements runtime.Value.
func (*Residuals) Type() string { return "residuals" }

// String is a one-line summary.
func (r *Residuals) String() string {
	return fmt.Sprintf("residuals of %s against %s: %d points, RMS %s", r.model.Name, r.data.Name, len(r.x), units.Format(r.rms, r.data.YDim))
}

// FieldNames implements runtime.Fielder.
func (*Residuals) FieldNames() []string { return []string{"x", "measured", "model", "residual", "rms"} }

// Field implements runtime.Fielder.
func (r *Residuals) Field(name string) (runtime.Value, error) {
	vec := func(v []float64, d units.Dim) runtime.Value { return &runtime.Vector{V: v, Dim: d} }
	switch name {
	case "x":
		return vec(r.x, r.data.XDim), nil
	case "measured":
		return vec(r.measured, r.data.YDim), nil
	case "model":
		return vec(r.fitted, r.data.YDim), nil
	case "residual":
		return vec(r.resid, r.data.YDim), nil
	case "rms":
		return runtime.Q(r.rms, r.data.YDim), nil
	}
	return nil, fmt.Errorf("residuals have no field %s; they have x, measured, model, residual and rms", name)
}

// Figure implements Plottable: both curves, and the residuals beneath with
// a zero line, on one input axis.
func (r *Residuals) Figure() (*display.Figure, error) {
	top, err := mergeCurves(r.data, r.model)
	if err != nil {
		return nil, err
	}
	xa := NewAxis(r.data.XName, r.x, r.data.XDim)
	ya := NewAxis("residual", r.resid, r.data.YDim)
	top.Panels[0].XLabel = xa.Label
	res := display.Panel{XLabel: xa.Label, YLabel: ya.Label, Height: 0.45, NoLegend: true, Series: []display.Series{
		{Kind: display.HLine, Level: 0},
		{Kind: display.Points, Name: "measured − model", X: xa.Data, Y: ya.Data},
	}}
	top.Panels = append(top.Panels, res)
	top.SharedX = true
	top.Title = "residuals: " + r.data.Name + " against " + r.model.Name
	return top, nil
}

func mergeCurves(cs ...*Curve) (*display.Figure, error) {
	figs := make([]*display.Figure, len(cs))
	for i, c := range cs {
		f, err := c.Figure()
		if err != nil {
			return nil, err
		}
		figs[i] = f
	}
	return mergeFigures(figs), nil
}

// Show implements runtime.Shower: the table, then the figure.
func (r *Residuals) Show() ([]display.Bundle, error) {
	xa := NewAxis(r.data.XName, r.x, r.data.XDim)
	yu := runtime.ChooseUnit(append(append([]float64{}, r.measured...), r.fitted...), r.data.YDim)
	t := &display.Table{Title: r.String(), Columns: []display.Column{
		display.Numbers(r.data.XName, xa.Unit.Symbol, xa.Data),
		grouped(display.Numbers("measured", yu.Symbol, AxisIn("", r.measured, yu).Data)),
		grouped(display.Numbers("model", yu.Symbol, AxisIn("", r.fitted, yu).Data)),
		grouped(display.Numbers("residual", yu.Symbol, AxisIn("", r.resid, yu).Data)),
	}}
	f, err := r.Figure()
	if err != nil {
		return nil, err
	}
	return display.TableAndFigure(t, f)
}

func phaseFn(c *runtime.Call) (runtime.Value, error) {
	t, ok := c.Value("trace").(*Trace)
	if !ok {
		return nil, runtime.ArgumentErrorf("phase: trace must be a trace from simulate(), got %s", c.Value("trace").Type())
	}
	xi, yi := t.index(c.Str("x")), t.index(c.Str("y"))
	if xi < 0 || yi < 0 {
		return nil, runtime.ValueErrorf("phase: the trace records %v; choose x and y among them", t.tr.Names)
	}
	xa := NewAxis(t.tr.Names[xi], t.tr.Data[xi], t.dims[xi])
	ya := NewAxis(t.tr.Names[yi], t.tr.Data[yi], t.dims[yi])
	f := &display.Figure{Title: "phase plane: " + t.model.spec.title, Panels: []display.Panel{{
		XLabel: xa.Label, YLabel: ya.Label, NoLegend: true,
		Series: []display.Series{{Kind: display.Line, Name: ya.Label + " against " + xa.Label, X: xa.Data, Y: ya.Data}},
	}}}
	return &FigureValue{F: f}, nil
}

// index is the position of a recorded variable, or −1; "v" is the
// membrane potential whatever the model calls it, as the trace's field is.
func (t *Trace) index(name string) int {
	for i, n := range t.tr.Names {
		if n == name {
			return i
		}
	}
	if name == "v" && len(t.tr.Names) > 0 && t.tr.Names[0] == t.model.firstVar() {
		return 0
	}
	return -1
}

var (
	_ Plottable       = (*Residuals)(nil)
	_ runtime.Fielder = (*Residuals)(nil)
)

// grouped puts a column in the group of the response, so that measured,
// model and residual share their decimals and the subtraction reads right.
func grouped(c display.Column) display.Column {
	c.Group = "response"
	return c
}
