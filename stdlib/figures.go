package stdlib

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

// FigureValue is a figure of the language: what plot, scatter and
// histogram return. It shows as an SVG with a plain-text description and
// can be saved with save(fig, "name.svg") or ".png".
type FigureValue struct{ F *display.Figure }

var (
	_ runtime.Shower = (*FigureValue)(nil)
	_ runtime.Helper = (*FigureValue)(nil)
	_ Plottable      = (*FigureValue)(nil)
)

// Type implements runtime.Value.
func (*FigureValue) Type() string { return "figure" }

// String is a one-line summary: `figure "f–I": 1 panel, 2 series`.
func (fv *FigureValue) String() string {
	n := 0
	for _, p := range fv.F.Panels {
		n += len(p.Series)
	}
	title := ""
	if fv.F.Title != "" {
		title = fmt.Sprintf(" %q", fv.F.Title)
	}
	return fmt.Sprintf("figure%s: %s, %d series", title, plural(len(fv.F.Panels), "panel"), n)
}

// Figure implements Plottable, so figures can be combined: plot(fig1, fig2).
func (fv *FigureValue) Figure() (*display.Figure, error) { return fv.F, nil }

// Show implements runtime.Shower: SVG, a text summary and the size; never
// HTML, which front ends would prefer over the picture.
func (fv *FigureValue) Show() ([]display.Bundle, error) {
	b, err := fv.F.Bundle()
	if err != nil {
		return nil, err
	}
	return []display.Bundle{b}, nil
}

// Help implements runtime.Helper.
func (fv *FigureValue) Help() string {
	return fv.F.Summary() + "\n\nsave(fig, \"name.svg\") or \"name.png\" writes it to a file; plot(fig, other) overlays or stacks figures."
}

// plotOptions are plot's named arguments.
type plotOptions struct {
	title      string
	xName      string // names every panel's x axis; "" keeps the automatic names
	yName      string // names every panel's y axis
	logX, logY bool
	x          []float64 // for vectors; nil means against their index
	xDim       units.Dim
	over       []float64 // for function values
	overDim    units.Dim
}

// plotFn is plot(): every item becomes a figure, and the figures are merged.
func plotFn(c *runtime.Call) (runtime.Value, error) {
	o := plotOptions{title: c.Str("title"), xName: c.Str("x_name"), yName: c.Str("y_name"), logX: c.Bool("log_x"), logY: c.Bool("log_y")}
	if c.Has("x") {
		o.x, o.xDim = c.Floats("x")
	}
	if c.Has("over") {
		o.over, o.overDim = c.Floats("over")
		if len(o.over) < 2 {
			return nil, runtime.ValueErrorf("plot: over needs at least 2 points, got %d; use over = span(a, b, n = 200)", len(o.over))
		}
	}
	var figs []*display.Figure
	items, fs := splitFunctions(flatten(c.Rest()))
	for k, it := range items {
		var f *display.Figure
		var err error
		if it == nil { // where the first function stood: all functions in one figure
			f, err = functionsFigure(c, fs, o)
		} else {
			f, err = itemFigure(c, it, k+1, &o)
		}
		if err != nil {
			return nil, err
		}
		figs = append(figs, f)
	}
	if c.Has("y") {
		y, yd := c.Floats("y")
		f, err := vectorFigure(y, yd, "y", o, display.Points)
		if err != nil {
			return nil, err
		}
		figs = append(figs, f)
	}
	if len(figs) == 0 {
		return nil, runtime.ArgumentErrorf("plot: nothing to draw; give traces, vectors or functions, e.g. plot(r) or plot(logistic, over = span(-4, 4, n = 200)), or points with plot(x = …, y = …)")
	}
	f := mergeFigures(figs)
	if o.title != "" { // an empty title keeps the automatic one (a trace's model and stimulus)
		f.Title = o.title
	}
	for i := range f.Panels {
		pn := &f.Panels[i]
		pn.LogX, pn.LogY = pn.LogX || o.logX, pn.LogY || o.logY
		pn.XLabel, pn.YLabel = renameAxis(pn.XLabel, o.xName), renameAxis(pn.YLabel, o.yName)
	}
	if hint := indexHint(items, f, o); hint != "" {
		c.Warn(hint)
	}
	if err := f.Validate(); err != nil {
		return nil, runtime.ValueErrorf("plot: %s", strings.TrimPrefix(err.Error(), "display: "))
	}
	return &FigureValue{F: f}, nil
}

// renameAxis gives an axis label the name, keeping its unit: "x (pA)" with
// the name "current" becomes "current (pA)". An empty name keeps the label.
func renameAxis(label, name string) string {
	if name == "" {
		return label
	}
	if _, unit, ok := splitLabel(label); ok {
		return name + " (" + unit + ")"
	}
	return name
}

// indexHint explains a figure that is probably not what was meant: two or
// more vectors of one length, drawn against their index in separate panels
// because their dimensions differ, as plot(tab.angle, tab.rate) gives.
func indexHint(items []runtime.Value, f *display.Figure, o plotOptions) string {
	if o.x != nil || len(f.Panels) < 2 {
		return ""
	}
	n := -1
	for _, it := range items {
		v, ok := it.(*runtime.Vector)
		if !ok || (n >= 0 && len(v.V) != n) {
			return ""
		}
		n = len(v.V)
	}
	return fmt.Sprintf("plot: the %d vectors are drawn against their index, one panel per dimension; "+
		"to draw one against another write scatter(x, y) or plot(x = …, y = …), and name the axes with x_name = and y_name =\n", len(items))
}

// flatten spreads lists so that plot([a, b]) draws a and b.
func flatten(vs []runtime.Value) []runtime.Value {
	var out []runtime.Value
	for _, v := range vs {
		if l, ok := v.(*runtime.List); ok && !allQuantities(l) {
			out = append(out, flatten(l.Elems)...)
			continue
		}
		out = append(out, v)
	}
	return out
}

func allQuantities(l *runtime.List) bool {
	for _, e := range l.Elems {
		if _, ok := e.(runtime.Quantity); !ok {
			return false
		}
	}
	return len(l.Elems) > 0
}

// splitFunctions takes the function values out of items, leaving nil where
// the first of them stood, so that all are drawn together.
func splitFunctions(items []runtime.Value) ([]runtime.Value, []runtime.Function) {
	var out []runtime.Value
	var fs []runtime.Function
	for _, it := range items {
		f, ok := it.(runtime.Function)
		if !ok {
			out = append(out, it)
			continue
		}
		if len(fs) == 0 {
			out = append(out, nil)
		}
		fs = append(fs, f)
	}
	return out, fs
}

// functionsFigure draws functions of one variable over o.over, through
// FunctionFigure (stdlib/curve.go).
func functionsFigure(c *runtime.Call, fs []runtime.Function, o plotOptions) (*display.Figure, error) {
	if o.over == nil {
		return nil, runtime.ArgumentErrorf("plot: to draw %s give the inputs, e.g. over = span(-4, 4, n = 200)", fs[0].FuncName())
	}
	f, err := FunctionFigure(c, fs, &runtime.Vector{V: o.over, Dim: o.overDim})
	if err != nil {
		return nil, runtime.ValueErrorf("plot: %s", strings.TrimPrefix(err.Error(), "stdlib: "))
	}
	return f, nil
}

// itemFigure draws one argument of plot.
func itemFigure(c *runtime.Call, it runtime.Value, k int, o *plotOptions) (*display.Figure, error) {
	switch x := it.(type) {
	case Plottable:
		f, err := x.Figure()
		if err != nil {
			return nil, err
		}
		if f == nil {
			return nil, runtime.ValueErrorf("plot: argument %d (%s) has nothing to draw", k, x.Type())
		}
		return f, nil
	case *runtime.Vector:
		return vectorFigure(x.V, x.Dim, "y", *o, display.Line)
	case *runtime.List:
		v := &runtime.Vector{}
		for i, e := range x.Elems {
			q := e.(runtime.Quantity)
			if i > 0 && q.Dim != v.Dim {
				return nil, runtime.UnitErrorf("plot: argument %d mixes %s and %s; a list to draw must share one dimension", k, v.Dim.Describe(), q.Dim.Describe())
			}
			v.V, v.Dim = append(v.V, q.V), q.Dim
		}
		return vectorFigure(v.V, v.Dim, "y", *o, display.Line)
	case runtime.Function:
		return functionsFigure(c, []runtime.Function{x}, *o)
	}
	return nil, runtime.ArgumentErrorf("plot: argument %d is %s, which cannot be drawn; give a trace, curve, table, vector or function", k, it.Type())
}

// vectorFigure draws values against o.x, or against their index.
func vectorFigure(y []float64, yd units.Dim, name string, o plotOptions, kind display.SeriesKind) (*display.Figure, error) {
	if len(y) == 0 {
		return nil, runtime.ValueErrorf("plot: the vector to draw is empty")
	}
	ya := NewAxis(name, y, yd)
	var xa Axis
	if o.x == nil {
		if kind == display.Points {
			return nil, runtime.ArgumentErrorf("plot: y = … needs x = … of the same length")
		}
		idx := make([]float64, len(y))
		for i := range idx {
			idx[i] = float64(i)
		}
		xa = Axis{Label: "index", Unit: units.Unit{Scale: 1}, Data: idx}
	} else {
		if len(o.x) != len(y) {
			return nil, runtime.ValueErrorf("plot: x has %d values but y has %d; give vectors of the same length", len(o.x), len(y))
		}
		xa = NewAxis("x", o.x, o.xDim) // plot renames the axes after merging
	}
	s := display.Series{Kind: kind, X: xa.Data, Y: ya.Data}
	return &display.Figure{Panels: []display.Panel{{XLabel: xa.Label, YLabel: ya.Label, Series: []display.Series{s}, NoLegend: true}}}, nil
}

// saveFigure writes any plottable to path as SVG or PNG, atomically.
func saveFigure(v runtime.Value, path string) error {
	p, ok := v.(Plottable)
	if !ok {
		return runtime.ArgumentErrorf("save: %s is not a figure; save(plot(x), \"name.svg\") draws and saves it", v.Type())
	}
	ext := strings.ToLower(filepath.Ext(path))
	if ext != ".svg" && ext != ".png" {
		return runtime.ValueErrorf("save: cannot tell the format of %q; end the name in .svg or .png", path)
	}
	if err := checkFolder("save", path); err != nil {
		return err
	}
	f, err := p.Figure()
	if err != nil {
		return err
	}
	if err := f.Save(path); err != nil {
		return runtime.ValueErrorf("save: %s; choose a folder you can write to", strings.TrimPrefix(err.Error(), "display: "))
	}
	return nil
}

func init() { domains = append(domains, registerFigures) }

func registerFigures(reg *runtime.Registry) {
	reg.Register(&runtime.Builtin{
		Name: "plot", Category: "figures", Returns: "a figure",
		Doc: "Draws its arguments in one figure: traces, curves, fits, tables, figures, vectors (against their index, or against x = …) " +
			"and functions of one variable (builtins or formulas, drawn as y = f(x) at each point of over). Series whose panels have the " +
			"same axis labels are overlaid with a legend; the others are stacked, sharing the x axis when its label agrees. " +
			"plot(x = …, y = …) or scatter(x, y) draws y against x as points; plot(a, b) with two vectors draws both against their index. " +
			"Axes carry units and automatic names (x, y, index), which x_name and y_name replace; log_x and log_y use logarithmic axes.",
		Params: []runtime.Param{
			{Name: "items", Kind: runtime.KindAny, Rest: true, Doc: "what to draw"},
			{Name: "x", Kind: runtime.KindNumbers, Optional: true, Doc: "x values for vectors and for y"},
			{Name: "y", Kind: runtime.KindNumbers, Optional: true, Doc: "y values drawn as points against x"},
			{Name: "over", Kind: runtime.KindNumbers, Optional: true, Doc: "inputs for functions, e.g. span(-4, 4, n = 200)"},
			{Name: "title", Kind: runtime.KindString, Default: `""`, Doc: "empty keeps the automatic title (a trace's model and stimulus)"},
			{Name: "x_name", Kind: runtime.KindString, Default: `""`, Doc: "the name of every x axis, e.g. \"angle\"; empty keeps the automatic names"},
			{Name: "y_name", Kind: runtime.KindString, Default: `""`, Doc: "the name of every y axis, e.g. \"rate\"; units are added"},
			{Name: "log_x", Kind: runtime.KindBool, Default: "false"},
			{Name: "log_y", Kind: runtime.KindBool, Default: "false"},
		},
		Fn: plotFn,
	})
	reg.Register(&runtime.Builtin{
		Name: "scatter", Category: "figures", Returns: "a figure",
		Doc: "Draws points (x[i], y[i]) with axes in the units of x and y; the same as plot(x = x, y = y). " +
			"x_name and y_name name the axes (scatter(tab.angle, tab.rate, x_name = \"angle\", y_name = \"rate\")).",
		Params: []runtime.Param{
			{Name: "x", Kind: runtime.KindNumbers}, {Name: "y", Kind: runtime.KindNumbers},
			{Name: "title", Kind: runtime.KindString, Default: `""`},
			{Name: "x_name", Kind: runtime.KindString, Default: `"x"`, Doc: "the name of the x axis"},
			{Name: "y_name", Kind: runtime.KindString, Default: `"y"`, Doc: "the name of the y axis"},
		},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			x, xd := c.Floats("x")
			y, yd := c.Floats("y")
			f, err := vectorFigure(y, yd, "y", plotOptions{x: x, xDim: xd}, display.Points)
			if err != nil {
				return nil, runtime.ValueErrorf("scatter: %s", strings.TrimPrefix(err.Error(), "plot: "))
			}
			f.Title = c.Str("title")
			pn := &f.Panels[0]
			pn.XLabel, pn.YLabel = renameAxis(pn.XLabel, c.Str("x_name")), renameAxis(pn.YLabel, c.Str("y_name"))
			return &FigureValue{F: f}, nil
		},
	})
	reg.Register(&runtime.Builtin{
		Name: "histogram", Category: "figures", Returns: "a histogram",
		Doc: "Counts values in equal bins from the least to the greatest: bin i holds values from edge i up to, not including, edge i+1, " +
			"and the last bin includes its upper edge. Non-finite values are skipped. With density = true the heights are " +
			"count / (n · width), so that the bars' area is 1 (an estimate of the probability density, in 1/unit of the values). " +
			"Fields: edges, counts, centres.",
		Params: []runtime.Param{
			{Name: "values", Kind: runtime.KindNumbers},
			{Name: "bins", Kind: runtime.KindNumber, Dimensionless: true, Default: "30", Doc: "the number of bins, 1 to 10000"},
			{Name: "name", Kind: runtime.KindString, Default: `"value"`, Doc: "what the values are, for the x axis (\"ISI\")"},
			{Name: "density", Kind: runtime.KindBool, Default: "false"},
		},
		Source: "binning rule as documented for numpy.histogram (NumPy reference); density estimate as in Silverman (1986), Density Estimation, ch. 2",
		Fn:     histogramFn,
	})
	reg.Register(&runtime.Builtin{
		Name: "save", Category: "figures", Returns: "the path written",
		Doc: "Saves a figure (or anything plot can draw) as SVG or PNG, chosen by the extension of path. The file is written to a " +
			"temporary file in the same folder and renamed into place, so a failure never leaves half a file. The folder must exist.",
		Params: []runtime.Param{
			{Name: "figure", Kind: runtime.KindAny},
			{Name: "path", Kind: runtime.KindString, Doc: "ending in .svg or .png"},
		},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			if err := saveFigure(c.Value("figure"), c.Str("path")); err != nil {
				return nil, err
			}
			return runtime.String(c.Str("path")), nil
		},
	})
}
