package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/spikes"
	"github.com/loligo-lab/loligo/stdlib/table"
)

func init() { domains = append(domains, registerAnalysis) }

func registerAnalysis(reg *runtime.Registry) {
	reg.Register(spikesBuiltin(), isiBuiltin(), rateBuiltin(), cvBuiltin(), latencyBuiltin(), adaptationBuiltin(),
		psthBuiltin(), rasterBuiltin(), sweepBuiltin(), rheobaseBuiltin())
}

// trainArg returns the spike train of argument x (a trace, or a vector of
// spike times) and the run's duration (NaN for a bare vector).
func trainArg(c *runtime.Call) ([]float64, float64, error) {
	name := c.Builtin.Name
	switch x := c.Value("x").(type) {
	case *Trace:
		return x.Spikes(), x.Duration(), nil
	case *runtime.Vector:
		if x.Dim != units.Time {
			return nil, 0, runtime.UnitErrorf("%s: spike times must be times, got %s", name, x.Dim.Describe())
		}
		if err := spikes.CheckTrain(x.V); err != nil {
			return nil, 0, runtime.ValueErrorf("%s: %s", name, trimPkg(err.Error()))
		}
		return x.V, math.NaN(), nil
	}
	return nil, 0, runtime.ArgumentErrorf("%s: x must be a trace from simulate(…) or a vector of spike times, got %s", name, c.Value("x").Type())
}

var xParam = runtime.Param{Name: "x", Kind: runtime.KindAny, Doc: "a trace from simulate, or a vector of spike times"}

// trainStat declares a builtin computing one number from a spike train.
func trainStat(name, doc, source string, d units.Dim, f func([]float64) (float64, error)) *runtime.Builtin {
	return &runtime.Builtin{
		Name: name, Category: "analysis", Returns: "a number", Doc: doc, Source: source,
		Params: []runtime.Param{xParam},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			train, _, err := trainArg(c)
			if err != nil {
				return nil, err
			}
			v, err := f(train)
			if err != nil {
				return nil, runtime.ValueErrorf("%s: %s", name, trimPkg(err.Error()))
			}
			return runtime.Q(v, d), nil
		},
	}
}

func cvBuiltin() *runtime.Builtin {
	return trainStat("cv", "The coefficient of variation of the inter-spike intervals, sd/mean (sd with 1/n): 0 for a regular train, near 1 for a Poisson train; NaN with fewer than 2 spikes.",
		"Dayan & Abbott (2001), Theoretical Neuroscience, ch. 1", units.Dimensionless, spikes.CV)
}

func adaptationBuiltin() *runtime.Builtin {
	return trainStat("adaptation", "The adaptation index: the mean over consecutive ISI pairs of (I[k+1] − I[k])/(I[k+1] + I[k]); positive when firing slows down, 0 for a regular train, NaN with fewer than 3 spikes.",
		"common practice in electrophysiology feature sets (from memory)", units.Dimensionless, spikes.AdaptationIndex)
}

func isiBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "isi", Category: "analysis", Returns: "a vector of times",
		Doc:    "The inter-spike intervals s[i+1] − s[i] of a spike train; n spikes give n − 1 intervals.",
		Params: []runtime.Param{xParam},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			train, _, err := trainArg(c)
			if err != nil {
				return nil, err
			}
			out, _ := spikes.ISIs(nil, train)
			return &runtime.Vector{V: out, Dim: units.Time}, nil
		},
	}
}

func rateBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "rate", Category: "analysis", Returns: "a rate (Hz)",
		Doc:    "The mean firing rate in the window [from, to): spikes counted in it divided by its length. For a trace, to defaults to the end of the run.",
		Params: []runtime.Param{xParam, timeParam("from", "0 ms", "window start"), optTime("to", "window end; default the end of the run")},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			train, dur, err := trainArg(c)
			if err != nil {
				return nil, err
			}
			if c.Has("to") {
				dur = c.Float("to")
			} else if math.IsNaN(dur) {
				return nil, runtime.ArgumentErrorf("rate: for a vector of spike times give the window end, e.g. rate(s, to = 1000 ms)")
			}
			if !(dur > c.Float("from")) {
				return nil, runtime.ValueErrorf("rate: the window [%s, %s) is empty; give to > from", c.Quantity("from"), fmtQ(dur, units.Time))
			}
			r, err := spikes.Rate(train, c.Float("from"), dur)
			if err != nil {
				return nil, runtime.ValueErrorf("rate: %s", trimPkg(err.Error()))
			}
			return runtime.Q(r, units.Frequency), nil
		},
	}
}

func latencyBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "latency", Category: "analysis", Returns: "a time",
		Doc:    "The first-spike latency: the time from onset to the first spike at or after it; NaN when there is none.",
		Params: []runtime.Param{xParam, timeParam("onset", "0 ms", "stimulus onset")},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			train, _, err := trainArg(c)
			if err != nil {
				return nil, err
			}
			l, err := spikes.Latency(train, c.Float("onset"))
			if err != nil {
				return nil, runtime.ValueErrorf("latency: %s", trimPkg(err.Error()))
			}
			return runtime.Q(l, units.Time), nil
		},
	}
}

func spikesBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "spikes", Category: "analysis", Returns: "a table",
		Doc: "The spikes of a trace as a table: spike time, the inter-spike interval ending at it and the instantaneous rate 1/ISI (the first spike has neither). " +
			"Spike times are interpolated between samples, not rounded to the grid.",
		Params: []runtime.Param{xParam},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			train, _, err := trainArg(c)
			if err != nil {
				return nil, err
			}
			t, isi, r := make([]float64, len(train)), make([]float64, len(train)), make([]float64, len(train))
			for i, s := range train {
				t[i], isi[i], r[i] = s*1e3, math.NaN(), math.NaN()
				if i > 0 {
					isi[i] = (s - train[i-1]) * 1e3
					r[i] = 1e3 / isi[i]
				}
			}
			tab := table.New()
			for _, col := range []struct {
				n, u string
				v    []float64
			}{{"time", "ms", t}, {"isi", "ms", isi}, {"rate", "Hz", r}} {
				if err := tab.AddFloats(col.n, col.u, col.v); err != nil {
					return nil, err
				}
			}
			tv, err := NewTableValue(tab)
			if err != nil {
				return nil, err
			}
			tv.Title = fmt.Sprintf("%d spikes", len(train))
			return tv, nil
		},
	}
}

// SpikePop is the result of simulating a population: one spike train per
// neuron, all over the same run.
type SpikePop struct {
	trains   [][]float64
	duration float64
	model    *Model
	stim     string
}

var (
	_ runtime.Shower  = (*SpikePop)(nil)
	_ runtime.Fielder = (*SpikePop)(nil)
	_ Plottable       = (*SpikePop)(nil)
)

// Type implements runtime.Value.
func (*SpikePop) Type() string { return "population result" }

// Len is the number of neurons.
func (p *SpikePop) Len() int { return len(p.trains) }

// String summarises the population.
func (p *SpikePop) String() string {
	n := 0
	for _, t := range p.trains {
		n += len(t)
	}
	return fmt.Sprintf("population of %d %s neurons, %s, %s: %d spikes, mean rate %s", len(p.trains), p.model.Name(), p.stim,
		fmtQ(p.duration, units.Time), n, fmtQ(float64(n)/float64(len(p.trains))/p.duration, units.Frequency))
}

// FieldNames implements runtime.Fielder.
func (p *SpikePop) FieldNames() []string {
	return []string{"spikes", "rates", "n", "duration", "model"}
}

// Field implements runtime.Fielder: spikes is a list of spike-time vectors,
// rates each neuron's mean rate.
func (p *SpikePop) Field(name string) (runtime.Value, error) {
	switch name {
	case "spikes":
		l := &runtime.List{}
		for _, t := range p.trains {
			l.Elems = append(l.Elems, &runtime.Vector{V: t, Dim: units.Time})
		}
		return l, nil
	case "rates":
		r := make([]float64, len(p.trains))
		for i, t := range p.trains {
			r[i] = float64(len(t)) / p.duration
		}
		return &runtime.Vector{V: r, Dim: units.Frequency}, nil
	case "n":
		return runtime.Num(float64(len(p.trains))), nil
	case "duration":
		return runtime.Q(p.duration, units.Time), nil
	case "model":
		return p.model, nil
	}
	return nil, fmt.Errorf("a population result has no field %s; its fields are spikes, rates, n, duration, model", name)
}

// Show implements runtime.Shower.
func (p *SpikePop) Show() ([]display.Bundle, error) {
	f, err := p.Figure()
	if err != nil {
		return nil, err
	}
	b, err := f.Bundle()
	return []display.Bundle{b, display.Text(p.String())}, err
}

// Figure implements Plottable: the raster over the population rate in 50
// bins.
func (p *SpikePop) Figure() (*display.Figure, error) {
	ps, err := p.psth(p.duration/50, 0)
	if err != nil {
		return nil, err
	}
	f := p.rasterFigure()
	f.SharedX = true
	f.Panels[0].XLabel = ""
	f.Panels = append(f.Panels, ps.panel(true))
	return f, nil
}

func (p *SpikePop) rasterFigure() *display.Figure {
	idx, ts := spikes.Raster(p.trains)
	y := make([]float64, len(idx))
	for i, k := range idx {
		y[i] = float64(k)
	}
	ta := AxisIn("time", ts, units.MustParse("ms"))
	if len(ts) == 0 { // an empty raster still needs a drawable series
		ta.Data, y = []float64{0}, []float64{math.NaN()}
	}
	// The time axis spans the whole run, not just first to last spike.
	return &display.Figure{Title: p.model.spec.title + " population: " + p.stim, Panels: []display.Panel{{XLabel: ta.Label, YLabel: "neuron",
		XFrom: 0, XTo: Scalar(p.duration, ta.Unit),
		Series: []display.Series{{Kind: display.Raster, Name: "spikes", X: ta.Data, Y: y}}}}}
}

// PSTH is a peri-stimulus time histogram of a population's spikes.
type PSTH struct {
	r      *spikes.PSTHResult
	name   string
	smooth bool // the rate is smoothed, the counts are not
}

var _ Plottable = (*PSTH)(nil)

func (p *SpikePop) psth(bin, smooth float64) (*PSTH, error) {
	if !(bin > 0) || bin > p.duration {
		return nil, runtime.ValueErrorf("psth: bin must lie between 0 and the run's %s, got %s", fmtQ(p.duration, units.Time), fmtQ(bin, units.Time))
	}
	n := math.Round(p.duration / bin)
	if math.Abs(n*bin-p.duration) > 1e-9*p.duration {
		return nil, runtime.ValueErrorf("psth: the run's %s is not a whole number of %s bins; use e.g. bin = %s", fmtQ(p.duration, units.Time),
			fmtQ(bin, units.Time), fmtQ(p.duration/math.Max(1, n), units.Time))
	}
	r, err := spikes.PopulationRate(p.trains, spikes.PSTHSettings{Stop: p.duration, BinWidth: p.duration / n, Smooth: smooth})
	if err != nil {
		return nil, runtime.ValueErrorf("psth: %s", trimPkg(err.Error()))
	}
	who := fmt.Sprintf("%d neurons", len(p.trains))
	if len(p.trains) == 1 {
		who = "one trace"
	}
	name := fmt.Sprintf("PSTH of %s, %s bins", who, fmtQ(bin, units.Time))
	if smooth > 0 {
		name += ", rate smoothed with σ = " + fmtQ(smooth, units.Time)
	}
	return &PSTH{r: r, name: name, smooth: smooth > 0}, nil
}

// Type implements runtime.Value.
func (*PSTH) Type() string { return "psth" }

// String summarises the histogram.
func (p *PSTH) String() string {
	return fmt.Sprintf("%s, peak %s", p.name, fmtQ(paramMax(p.r.Rate), units.Frequency))
}

func (p *PSTH) panel(x bool) display.Panel {
	e := AxisIn("time", p.r.Edges, units.MustParse("ms"))
	pn := display.Panel{YLabel: "rate (Hz)", Height: 0.5, Series: []display.Series{{Kind: display.Steps, Name: "population rate", X: e.Data, Y: p.r.Rate}}}
	if x {
		pn.XLabel = e.Label
	}
	return pn
}

// Figure implements Plottable.
func (p *PSTH) Figure() (*display.Figure, error) {
	pn := p.panel(true)
	pn.Height = 1
	return &display.Figure{Title: p.name, Panels: []display.Panel{pn}}, nil
}

// Show implements runtime.Shower: the table of bins, then the histogram.
func (p *PSTH) Show() ([]display.Bundle, error) {
	f, _ := p.Figure()
	start := make([]float64, len(p.r.Rate))
	for i := range start {
		start[i] = p.r.Edges[i] * 1e3
	}
	t := &display.Table{Title: p.name, Columns: []display.Column{display.Numbers("bin start", "ms", start),
		display.Numbers("count", "", p.r.Counts), display.Numbers(p.rateLabel(), "Hz", p.r.Rate)}}
	return display.TableAndFigure(t, f)
}

// rateLabel names the rate column: "smoothed rate" beside the raw counts
// when it is smoothed.
func (p *PSTH) rateLabel() string {
	if p.smooth {
		return "smoothed rate"
	}
	return "rate"
}

// FieldNames implements runtime.Fielder.
func (p *PSTH) FieldNames() []string { return []string{"t", "rate", "count"} }

// Field implements runtime.Fielder: t is the bin centres.
func (p *PSTH) Field(name string) (runtime.Value, error) {
	switch name {
	case "t":
		c := make([]float64, len(p.r.Rate))
		for i := range c {
			c[i] = (p.r.Edges[i] + p.r.Edges[i+1]) / 2
		}
		return &runtime.Vector{V: c, Dim: units.Time}, nil
	case "rate":
		return &runtime.Vector{V: p.r.Rate, Dim: units.Frequency}, nil
	case "count":
		return &runtime.Vector{V: p.r.Counts}, nil
	}
	return nil, fmt.Errorf("a psth has no field %s; its fields are t, rate, count", name)
}

// popArgOf returns the pop argument: a population result, or a single
// trace taken as a population of one (one trial's histogram).
func popArgOf(c *runtime.Call) (*SpikePop, error) {
	switch x := c.Value("pop").(type) {
	case *SpikePop:
		return x, nil
	case *Trace:
		return &SpikePop{trains: [][]float64{x.Spikes()}, duration: x.Duration(), model: x.model, stim: x.stim}, nil
	}
	return nil, runtime.ArgumentErrorf("%s: pop must be a population result or a trace: simulate a model with vector parameters, e.g. simulate(lif(tau_m = [10, 20, 30] ms), …); got %s",
		c.Builtin.Name, c.Value("pop").Type())
}

func psthBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "psth", Category: "analysis", Returns: "a histogram (table and figure)",
		Doc:    "The population rate as a histogram: spikes of all neurons in each bin divided by the number of neurons and the bin width (Hz), optionally smoothed by a Gaussian of standard deviation smooth (the counts stay raw). A single trace counts as a population of one. The run must be a whole number of bins.",
		Source: "Gerstner, Kistler, Naud & Paninski (2014), Neuronal Dynamics, ch. 7 (population activity; from memory)",
		Params: []runtime.Param{{Name: "pop", Kind: runtime.KindAny, Doc: "a population result of simulate, or one trace"},
			timeParam("bin", "5 ms", "bin width"), timeParam("smooth", "0 ms", "Gaussian smoothing σ; 0 for none")},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			p, err := popArgOf(c)
			if err != nil {
				return nil, err
			}
			return p.psth(c.Float("bin"), c.Float("smooth"))
		},
	}
}

func rasterBuiltin() *runtime.Builtin {
	return &runtime.Builtin{
		Name: "raster", Category: "analysis", Returns: "a figure",
		Doc:    "The spike raster of a population: one row of ticks per neuron, spike times along the x axis.",
		Params: []runtime.Param{{Name: "pop", Kind: runtime.KindAny, Doc: "a population result of simulate"}},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			p, err := popArgOf(c)
			if err != nil {
				return nil, err
			}
			return &FigureValue{F: p.rasterFigure()}, nil
		},
	}
}
