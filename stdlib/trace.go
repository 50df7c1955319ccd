package stdlib

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
	"github.com/loligo-lab/loligo/stdlib/spikes"
)

// spikeSummary is one line: count, rate, first spike, CV, each to the four
// significant digits tables use (a summary is read, not computed with).
func spikeSummary(train []float64, duration float64) string {
	if len(train) == 0 {
		return "no spikes in " + fmtQ(duration, units.Time)
	}
	s := fmt.Sprintf("%d spikes in %s (mean rate %s), first at %s", len(train), fmtQ(duration, units.Time),
		fmtQ(sig4(float64(len(train))/duration), units.Frequency), fmtQ(sig4(train[0]), units.Time))
	if cv, err := spikes.CV(train); err == nil && !math.IsNaN(cv) {
		s += ", CV of ISIs " + units.FormatNumber(sig4(math.Round(cv*1e4)/1e4))
	}
	return s
}

// sig4 rounds v to four significant digits.
func sig4(v float64) float64 {
	if v == 0 || math.IsInf(v, 0) || math.IsNaN(v) {
		return v
	}
	p := math.Pow(10, 3-math.Floor(math.Log10(math.Abs(v))))
	return math.Round(v*p) / p
}

// summary is the line under a trace: its spikes, or for a rate neuron
// (which has none) the range and final value of its rate.
func (t *Trace) summary() string {
	if t.model.spec.title != rateSpec.title || len(t.tr.Data) == 0 {
		return spikeSummary(t.tr.Spikes, t.duration)
	}
	r, d := t.tr.Data[0], t.dims[0]
	return fmt.Sprintf("rate neuron over %s: r from %s to %s, %s at the end", fmtQ(t.duration, units.Time),
		fmtQ(sig4(paramMin(r)), d), fmtQ(sig4(paramMax(r)), d), fmtQ(sig4(r[len(r)-1]), d))
}

// Trace is the result of simulating one neuron: sample times, recorded
// state variables with their dimensions, the input, and the spike times.
type Trace struct {
	tr       *neuron.Trace
	model    *Model
	dims     []units.Dim
	inDim    units.Dim
	duration float64
	stim     string
}

var (
	_ runtime.Shower  = (*Trace)(nil)
	_ runtime.Fielder = (*Trace)(nil)
	_ runtime.Lener   = (*Trace)(nil)
	_ Plottable       = (*Trace)(nil)
)

func newTrace(r *runSpec, nm neuron.Model, tr *neuron.Trace) *Trace {
	t := &Trace{tr: tr, model: r.model, inDim: r.model.spec.input, duration: r.duration, stim: "no input"}
	if r.stim != nil {
		t.stim = r.stim.desc
	}
	for i := range tr.Names {
		d := units.Dimensionless
		if u, err := units.Parse(tr.Units[i]); err == nil && tr.Units[i] != "1" {
			d = u.Dim
		}
		if r.model.spec.title == rateSpec.title {
			d = r.model.outDim
		}
		t.dims = append(t.dims, d)
	}
	return t
}

// Type implements runtime.Value.
func (*Trace) Type() string { return "trace" }

// Len is the number of samples.
func (t *Trace) Len() int { return len(t.tr.T) }

// Spikes are the spike times in seconds (not to be modified).
func (t *Trace) Spikes() []float64 { return t.tr.Spikes }

// Duration is the simulated time in seconds.
func (t *Trace) Duration() float64 { return t.duration }

// String is a one-line summary: model, samples, spikes.
func (t *Trace) String() string {
	return fmt.Sprintf("trace of %s, %s, %d samples: %s", t.model.spec.title, t.stim, len(t.tr.T), t.summary())
}

// FieldNames implements runtime.Fielder.
func (t *Trace) FieldNames() []string {
	out := []string{"t"}
	if !contains(t.tr.Names, "v") {
		out = append(out, "v")
	}
	out = append(out, t.tr.Names...)
	return append(out, "spikes", "input", "count", "rate", "model")
}

// Field implements runtime.Fielder: v is the first state variable (the
// membrane potential), count and rate are over the whole run.
func (t *Trace) Field(name string) (runtime.Value, error) {
	switch name {
	case "t":
		return &runtime.Vector{V: t.tr.T, Dim: units.Time}, nil
	case "spikes":
		return &runtime.Vector{V: t.tr.Spikes, Dim: units.Time}, nil
	case "input":
		return &runtime.Vector{V: t.tr.Input, Dim: t.inDim}, nil
	case "count":
		return runtime.Num(float64(len(t.tr.Spikes))), nil
	case "rate":
		return runtime.Q(float64(len(t.tr.Spikes))/t.duration, units.Frequency), nil
	case "model":
		return t.model, nil
	}
	for i, n := range t.tr.Names {
		if n == name {
			return &runtime.Vector{V: t.tr.Data[i], Dim: t.dims[i]}, nil
		}
	}
	if name == "v" && len(t.tr.Names) > 0 && !t.recorded(t.model.firstVar()) {
		return nil, runtime.ValueErrorf("the membrane potential was not recorded; add %q to record", t.model.firstVar())
	}
	if name == "v" && len(t.tr.Names) > 0 {
		return &runtime.Vector{V: t.tr.Data[0], Dim: t.dims[0]}, nil
	}
	return nil, fmt.Errorf("a trace has no field %s; its fields are %s", name, strings.Join(t.FieldNames(), ", "))
}

func (t *Trace) recorded(name string) bool { return contains(t.tr.Names, name) }

// firstVar is the name of the model's membrane potential.
func (m *Model) firstVar() string {
	nm, err := m.Neuron(0)
	if err != nil {
		return "V"
	}
	return nm.Vars()[0].Name
}

// Show implements runtime.Shower: the figure, then the spike summary.
func (t *Trace) Show() ([]display.Bundle, error) {
	f, err := t.Figure()
	if err != nil {
		return nil, err
	}
	b, err := f.Bundle()
	if err != nil {
		return nil, err
	}
	return []display.Bundle{b, display.Text(t.summary())}, nil
}

// Figure implements Plottable: the membrane potential on top, other
// recorded variables grouped by dimension beneath, then the stimulus, all
// on one time axis; spike times are marked on the voltage panel.
func (t *Trace) Figure() (*display.Figure, error) {
	if len(t.tr.T) == 0 {
		return nil, runtime.ValueErrorf("the trace is empty; nothing to plot")
	}
	ta := NewAxis("time", t.tr.T, units.Time)
	f := &display.Figure{Title: t.model.spec.title + ": " + t.stim, SharedX: true}
	type slot struct {
		k int
		u units.Unit
	}
	byDim := map[units.Dim]slot{}
	for i, name := range t.tr.Names {
		if sl, ok := byDim[t.dims[i]]; ok && i > 0 {
			k := sl.k
			a := AxisIn(name, t.tr.Data[i], sl.u)
			f.Panels[k].YLabel = Label(dimLabel(t.dims[i]), sl.u)
			f.Panels[k].Series = append(f.Panels[k].Series, display.Series{Kind: display.Line, Name: name, X: ta.Data, Y: a.Data})
			continue
		}
		a := NewAxis(name, t.tr.Data[i], t.dims[i])
		byDim[t.dims[i]] = slot{len(f.Panels), a.Unit}
		h, x, y := 1.0, ta.Data, a.Data
		if i > 0 {
			h = 0.5
		} else if peak, ok := t.peak(); ok {
			x, y = withSpikes(x, y, t.tr.Spikes, Scalar(peak, a.Unit), ta.Unit)
		}
		f.Panels = append(f.Panels, display.Panel{YLabel: a.Label, Height: h,
			Series: []display.Series{{Kind: display.Line, Name: name, X: x, Y: y}}})
	}
	in := NewAxis("input", t.tr.Input, t.inDim)
	f.Panels = append(f.Panels, display.Panel{XLabel: ta.Label, YLabel: in.Label, Height: 0.35,
		Series: []display.Series{{Kind: display.Line, Name: "input", X: ta.Data, Y: in.Data}}})
	return f, nil
}

// peak is the voltage a reset model's spikes reach (its cut-off), if it has
// one: the sampled trace misses the instant of the spike, which falls
// between samples.
func (t *Trace) peak() (float64, bool) {
	nm, err := t.model.spec.build(t.model, 0)
	if err != nil {
		return 0, false
	}
	rs, ok := nm.(neuron.Resetter)
	if !ok {
		return 0, false
	}
	return rs.Peak(), true
}

// withSpikes returns the voltage line with a point at the cut-off at each
// spike time, so every spike of a reset model is drawn to its peak (the
// line then falls to the reset value at the next sample). x and y are in
// display units, spike times in SI; the inputs are not modified.
func withSpikes(x, y, spikes []float64, peak float64, tu units.Unit) ([]float64, []float64) {
	if len(spikes) == 0 {
		return x, y
	}
	ox := make([]float64, 0, len(x)+len(spikes))
	oy := make([]float64, 0, len(y)+len(spikes))
	k := 0
	for i := range x {
		for k < len(spikes) && Scalar(spikes[k], tu) <= x[i] {
			ox, oy = append(ox, Scalar(spikes[k], tu)), append(oy, peak)
			k++
		}
		ox, oy = append(ox, x[i]), append(oy, y[i])
	}
	return ox, oy
}

// dimLabel names a panel holding several variables of one dimension.
func dimLabel(d units.Dim) string {
	if d.IsDimensionless() {
		return "gates"
	}
	return d.Name()
}
