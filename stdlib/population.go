package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/tuning"
	"gonum.org/v1/gonum/mat"
)

// Population is the value kind of a population of LIF tuning curves: the
// neurons' parameters, the inputs X and the N × M response matrix R in Hz.
type Population struct {
	Pop *tuning.Population
	X   []float64
	R   *mat.Dense
}

// maxFamily is the most curves a population figure draws; more would hide
// each other and swell the SVG.
const maxFamily = 100

// Type implements runtime.Value.
func (*Population) Type() string { return "population" }

// Len implements runtime.Lener: the number of neurons.
func (p *Population) Len() int { return p.Pop.Len() }

// String is a one-line summary.
func (p *Population) String() string {
	return fmt.Sprintf("population of %d LIF tuning curves over %d inputs (τ_ref %s, τ_m %s)", p.Pop.Len(), len(p.X),
		units.Format(p.Pop.TauRef, units.Time), units.Format(p.Pop.TauM, units.Time))
}

// Index implements runtime.Indexer: pop[i] is neuron i's tuning curve.
func (p *Population) Index(i runtime.Value) (runtime.Value, error) {
	q, ok := i.(runtime.Quantity)
	n := p.Pop.Len()
	k := int(q.V)
	if k < 0 {
		k += n
	}
	if !ok || q.V != math.Trunc(q.V) || k < 0 || k >= n {
		return nil, runtime.ValueErrorf("a population of %d neurons is indexed by a whole number from 0 to %d (or -1 for the last), got %s", n, n-1, i)
	}
	cv := NewModelCurve(fmt.Sprintf("neuron %d", k), p.Pop.Curve(k), p.X, units.Dimensionless)
	cv.XName, cv.Source = "x", popSource
	return cv, nil
}

// neurons returns each neuron's rate at its preferred end x = e and its
// intercept (where gain·e·x + bias = 1).
func (p *Population) neurons() (maxRate, intercept []float64) {
	for i := range p.Pop.Len() {
		g, b := p.Pop.Gain[i], p.Pop.Bias[i]
		maxRate = append(maxRate, tuning.LIFRate(g+b, p.Pop.TauRef, p.Pop.TauM))
		intercept = append(intercept, (1-b)/g)
	}
	return maxRate, intercept
}

// FieldNames implements runtime.Fielder.
func (p *Population) FieldNames() []string {
	return []string{"n", "x", "gain", "bias", "encoder", "max_rate", "intercept"}
}

// Field implements runtime.Fielder.
func (p *Population) Field(name string) (runtime.Value, error) {
	vec := func(v []float64) *runtime.Vector { return &runtime.Vector{V: clone(v)} }
	mr, ic := p.neurons()
	switch name {
	case "n":
		return runtime.Num(float64(p.Pop.Len())), nil
	case "x":
		return vec(p.X), nil
	case "gain":
		return vec(p.Pop.Gain), nil
	case "bias":
		return vec(p.Pop.Bias), nil
	case "encoder":
		return vec(p.Pop.Encoder), nil
	case "max_rate":
		return &runtime.Vector{V: mr, Dim: units.Frequency}, nil
	case "intercept":
		return vec(ic), nil
	}
	return nil, runtime.ValueErrorf("a population has no field %s; its fields are %s", name, joinNames(p.FieldNames()))
}

// Table lists the neurons: encoder, gain, bias, maximum rate, intercept.
func (p *Population) Table() *display.Table {
	idx := make([]float64, p.Pop.Len())
	for i := range idx {
		idx[i] = float64(i)
	}
	mr, ic := p.neurons()
	return &display.Table{Title: p.String(), Columns: []display.Column{
		display.Numbers("neuron", "", idx), display.Numbers("encoder", "", p.Pop.Encoder),
		display.Numbers("gain", "", p.Pop.Gain), display.Numbers("bias", "", p.Pop.Bias),
		display.Numbers("max rate", "Hz", mr), display.Numbers("intercept", "", ic)},
		Note: "Source: " + popSource}
}

// Figure implements Plottable: the responses as a family of curves (the
// first maxFamily neurons).
func (p *Population) Figure() (*display.Figure, error) {
	n := min(p.Pop.Len(), maxFamily)
	curves := make([][]float64, n)
	for i := range n {
		curves[i] = p.R.RawRowView(i)
	}
	title := fmt.Sprintf("tuning curves of %d neurons", p.Pop.Len())
	if n < p.Pop.Len() {
		title += fmt.Sprintf(" (first %d shown)", n)
	}
	return &display.Figure{Title: title, Panels: []display.Panel{{XLabel: "x", YLabel: "rate (Hz)", NoLegend: true,
		Series: []display.Series{{Kind: display.Family, X: p.X, Curves: curves}}}}}, nil
}

// Show implements runtime.Shower: the neuron table, then the family figure.
func (p *Population) Show() ([]display.Bundle, error) {
	f, _ := p.Figure()
	return display.TableAndFigure(p.Table(), f)
}

// Readout is the value kind of a linear readout: the estimate and target as
// a curve, the decoders and the errors.
type Readout struct {
	Curve     *Curve
	Noise     float64
	Res       *tuning.Readout
	NoisyRMSE float64
	Dim       units.Dim // of the target
}

// Type implements runtime.Value.
func (*Readout) Type() string { return "readout" }

// String is a one-line summary.
func (r *Readout) String() string {
	return fmt.Sprintf("%s: RMS error %s without noise, %s with noise %g", r.Curve.Name,
		units.Format(r.Res.RMSE, r.Dim), units.Format(r.NoisyRMSE, r.Dim), r.Noise)
}

// FieldNames implements runtime.Fielder.
func (r *Readout) FieldNames() []string {
	return []string{"rmse", "noisy_rmse", "lambda", "decoders", "estimate", "target", "x", "curve"}
}

// Field implements runtime.Fielder.
func (r *Readout) Field(name string) (runtime.Value, error) {
	switch name {
	case "rmse":
		return runtime.Q(r.Res.RMSE, r.Dim), nil
	case "noisy_rmse":
		return runtime.Q(r.NoisyRMSE, r.Dim), nil
	case "lambda":
		return runtime.Q(r.Res.Lambda, units.Frequency.Mul(units.Frequency)), nil
	case "decoders":
		return &runtime.Vector{V: clone(r.Res.Decoders), Dim: r.Dim.Div(units.Frequency)}, nil
	case "estimate":
		return r.Curve.Field("rate")
	case "target":
		return r.Curve.Field("target")
	case "x":
		return r.Curve.Field("x")
	case "curve":
		return r.Curve, nil
	}
	return nil, runtime.ValueErrorf("a readout has no field %s; its fields are %s", name, joinNames(r.FieldNames()))
}

// Figure implements Plottable: estimate and target against x.
func (r *Readout) Figure() (*display.Figure, error) { return r.Curve.Figure() }

// Show implements runtime.Shower: a table of the errors, then the figure.
func (r *Readout) Show() ([]display.Bundle, error) {
	u := runtime.ChooseUnit([]float64{r.Res.RMSE, r.NoisyRMSE}, r.Dim)
	t := &display.Table{Title: r.Curve.Name, Columns: []display.Column{
		display.Numbers("noise", "", []float64{r.Noise}), display.Numbers("lambda", "Hz^2", []float64{r.Res.Lambda}),
		display.Numbers("RMS error", u.Symbol, []float64{Scalar(r.Res.RMSE, u)}),
		display.Numbers("RMS error with noise", u.Symbol, []float64{Scalar(r.NoisyRMSE, u)})}, Note: "Source: " + popSource}
	f, err := r.Figure()
	if err != nil {
		return nil, err
	}
	return display.TableAndFigure(t, f)
}

var (
	_ Plottable       = (*Population)(nil)
	_ runtime.Indexer = (*Population)(nil)
	_ Plottable       = (*Readout)(nil)
	_ runtime.Fielder = (*Readout)(nil)
)
