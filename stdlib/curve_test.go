package stdlib

import (
	"context"
	"math"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

// TestSampledCurve checks the shared value kind as the spiking bindings use
// it: copies of the inputs, interpolation, fields, both displays.
func TestSampledCurve(t *testing.T) {
	x := []float64{0, 1e-9, 2e-9}
	y := []float64{0, 10, 30}
	se := []float64{0, 1, 2}
	c := NewSampledCurve("invented f–I curve", x, units.Current, y, units.Frequency, se)
	x[1], y[1] = 99, 99 // the curve must have copied its inputs
	c.AddSeries("fit", []float64{0, 12, 28})
	cases := []struct {
		at, want float64 // linear interpolation (common practice), end values held
	}{{0.5e-9, 5}, {1.5e-9, 20}, {-1e-9, 0}, {5e-9, 30}}
	for _, tc := range cases {
		got, err := c.At(tc.at)
		// 1e−12: one interpolation step in float64.
		if err != nil || !rateClose(got, tc.want, 1e-12) {
			t.Errorf("At(%g) = %g, %v; want %g", tc.at, got, err, tc.want)
		}
	}
	bs, err := c.Show()
	if err != nil || len(bs) != 2 {
		t.Fatalf("Show: %d bundles, %v", len(bs), err)
	}
	if _, ok := bs[0].Data[display.MIMEHTML]; !ok {
		t.Error("first output is not the table")
	}
	if _, ok := bs[1].Data[display.MIMESVG]; !ok {
		t.Error("second output is not the figure")
	}
	f, _ := c.Figure()
	if s := f.Panels[0].Series[0]; s.Kind != display.Points || s.YErr == nil {
		t.Errorf("sampled curve drawn as %v with errors %v; want points with error bars", s.Kind, s.YErr)
	}
	for _, name := range []string{"x", "rate", "se", "fit", "parameters"} {
		if _, err := c.Field(name); err != nil {
			t.Errorf("field %s: %v", name, err)
		}
	}
	if _, err := c.Field("rates"); err == nil || !strings.Contains(err.Error(), "its fields are") {
		t.Errorf("unknown field: %v", err)
	}
}

// TestLIFTuningParams checks the analytic curve's parameters and a
// round trip through WithParams, against the closed form of Dayan & Abbott
// (2001), ch. 5: rate = 1/(τ_ref − τ_m ln(1 − 1/v)).
func TestLIFTuningParams(t *testing.T) {
	xs := []float64{0, 1e-9, 2e-9, 4e-9}
	c, err := NewLIFTuning(0.002, 0.02, 1e9, 0, xs, units.Current)
	if err != nil {
		t.Fatal(err)
	}
	ps := c.Params()
	if len(ps) != 4 || ps[2].Name != "gain" || ps[2].Dim != units.Dimensionless.Div(units.Current) {
		t.Fatalf("params %+v", ps)
	}
	vals := make([]float64, len(ps))
	for i, p := range ps {
		vals[i] = p.Value
	}
	vals[1] = 0.01 // τ_m = 10 ms
	d, err := c.WithParams(vals)
	if err != nil {
		t.Fatal(err)
	}
	want := 1 / (0.002 - 0.01*math.Log(1-1.0/2)) // v = 2
	// 1e−14: the closed form against itself, a few ulps of log1p.
	if !rateClose(d.Y[2], want, 1e-14) || c.Y[2] == d.Y[2] {
		t.Errorf("WithParams: rate %g at v = 2, want %g (original %g must differ)", d.Y[2], want, c.Y[2])
	}
	if _, err := c.WithParams(vals[:2]); err == nil {
		t.Error("WithParams accepted 2 values for 4 parameters")
	}
}

// TestFunctionFigure draws activation functions and a formula through a
// builtin that calls FunctionFigure, as plot() does.
func TestFunctionFigure(t *testing.T) {
	reg := runtime.NewRegistry()
	Register(reg)
	reg.Register(&runtime.Builtin{Name: "test_function_figure", Doc: "test only",
		Params: []runtime.Param{{Name: "over", Kind: runtime.KindNumbers}, {Name: "fs", Kind: runtime.KindFunction, Rest: true}},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			var fs []runtime.Function
			for _, v := range c.Rest() {
				fs = append(fs, v.(runtime.Function))
			}
			xs, d := c.Floats("over")
			fig, err := FunctionFigure(c, fs, &runtime.Vector{V: xs, Dim: d})
			if err != nil {
				return nil, err
			}
			return &rateFigure{fig: fig}, nil
		}})
	s := runtime.NewSession(reg)
	res, err := s.Execute(context.Background(), "cell",
		"formula kick(x) = 2 * x * 1 Hz\ntest_function_figure(span(-4, 4, n = 9), logistic, tanh, relu(), kick)", discard{})
	if err != nil {
		t.Fatal(err)
	}
	fig := res.Value.(*rateFigure).fig
	if len(fig.Panels) != 2 || len(fig.Panels[0].Series) != 3 {
		t.Fatalf("panels %d; want dimensionless functions together and the Hz formula apart", len(fig.Panels))
	}
	// common practice: σ(4) = 0.98201379
	if y := fig.Panels[0].Series[0].Y[8]; !rateClose(y, 0.9820137900379085, 1e-15) {
		t.Errorf("logistic(4) drawn at %g", y)
	}
	if _, err := fig.SVG(); err != nil {
		t.Error(err)
	}
}

// TestFunctionFigureLabels checks the y-axis names of function plots: f(x)
// for functions, f′(x) for derivatives (the prime is the usual notation of a
// first derivative, common practice), both for a mix.
func TestFunctionFigureLabels(t *testing.T) {
	cases := []struct{ src, want string }{
		{`plot(logistic, tanh, over = span(-4, 4, n = 9))`, "f(x)"},
		{`plot(derivative(logistic), over = span(-4, 4, n = 9))`, "f′(x)"},
		{`plot(logistic, derivative(logistic), over = span(-4, 4, n = 9))`, "f(x), f′(x)"},
	}
	for _, c := range cases {
		v, err := eval(t, nil, &record{}, c.src)
		if err != nil {
			t.Fatalf("%s: %v", c.src, err)
		}
		if got := v.(*FigureValue).F.Panels[0].YLabel; got != c.want {
			t.Errorf("%s: y axis %q, want %q", c.src, got, c.want)
		}
	}
}

// TestLegendName checks how series names read in legends: a compound
// modifier takes a hyphen and abbreviations are capitals (common practice in
// English technical writing, e.g. "first-ISI rate").
func TestLegendName(t *testing.T) {
	cases := []struct{ field, want string }{
		{"first_isi_rate", "first-ISI rate"},
		{"mean_isi", "mean ISI"},
		{"steady_rate", "steady rate"},
		{"noise-free", "noise-free"},
	}
	for _, c := range cases {
		if got := legendName(c.field); got != c.want {
			t.Errorf("legendName(%q) = %q, want %q", c.field, got, c.want)
		}
	}
	// the legend of a curve with such a series, as a sweep adds it
	cv := NewSampledCurve("sweep", []float64{0, 1e-10}, units.Current, []float64{0, 10}, units.Frequency, nil)
	cv.AddSeries("first_isi_rate", []float64{0, 12})
	f, err := cv.Figure()
	if err != nil {
		t.Fatal(err)
	}
	if got := f.Panels[0].Series[1].Name; got != "sweep, first-ISI rate" {
		t.Errorf("legend %q, want %q", got, "sweep, first-ISI rate")
	}
}

// TestPopulationDisplay checks the family figure and indexing.
func TestPopulationDisplay(t *testing.T) {
	v := rateEval(t, "seed(3)\nrate_population(150, positive_only = true)").(*Population)
	f, _ := v.Figure()
	if n := len(f.Panels[0].Series[0].Curves); n != maxFamily {
		t.Errorf("family draws %d curves, want %d", n, maxFamily)
	}
	c, err := v.Index(runtime.Num(-1))
	if err != nil {
		t.Fatal(err)
	}
	// Every neuron reaches its drawn maximum rate at x = 1 (the default
	// draw is uniform in [200, 400] Hz; GainBias, common practice).
	top := c.(*Curve).Y[len(v.X)-1]
	if top < 200 || top > 400 {
		t.Errorf("last neuron fires %g Hz at x = 1, outside [200, 400]", top)
	}
	if _, err := v.Index(runtime.Num(150)); err == nil {
		t.Error("index 150 of 150 neurons accepted")
	}
}

// TestReadoutNoiseAxis checks that noise levels spread over decades (the
// default 0.003–0.3) are drawn on a logarithmic axis, which never reaches 0
// or below, and levels within a decade on a linear one (common practice for
// quantities chosen in decades).
func TestReadoutNoiseAxis(t *testing.T) {
	cases := []struct {
		noise string
		log   bool
	}{
		{"", true},
		{", noise = [0.001, 0.3]", true},
		{", noise = [0.1, 0.2, 0.3]", false},
	}
	for _, c := range cases {
		v := rateEval(t, "seed(3)\nformula sq(x) = x^2\nreadout_noise(rate_population(20), sq"+c.noise+")")
		f, err := v.(*Curve).Figure()
		if err != nil {
			t.Fatal(err)
		}
		if got := f.Panels[0].LogX; got != c.log {
			t.Errorf("readout_noise(…%s): logarithmic x axis %v, want %v", c.noise, got, c.log)
		}
		if _, err := f.SVG(); err != nil {
			t.Errorf("readout_noise(…%s): %v", c.noise, err)
		}
	}
}

// BenchmarkPopulation1000 builds a 1,000-neuron population and its responses
// at 1,000 inputs through the language.
func BenchmarkPopulation1000(b *testing.B) {
	s := newTestSession()
	for range b.N {
		if _, err := s.Execute(context.Background(), "cell", "rate_population(1000, over = span(-1, 1, n = 1000))", discard{}); err != nil {
			b.Fatal(err)
		}
	}
}
