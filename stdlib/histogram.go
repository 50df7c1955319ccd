package stdlib

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

// HistogramValue is a histogram: bin edges and counts (or densities). It
// draws as steps and has the fields edges, counts and centres.
type HistogramValue struct {
	Edges   []float64 // SI, len(Counts)+1
	Counts  []float64 // counts, or densities in 1/Dim when Density
	Dim     units.Dim // of the binned values
	Name    string
	Density bool
}

var (
	_ Plottable       = (*HistogramValue)(nil)
	_ runtime.Fielder = (*HistogramValue)(nil)
	_ runtime.Shower  = (*HistogramValue)(nil)
)

// histogram bins the finite values of xs into n equal bins from their least
// to their greatest value; each bin holds [lo, hi) except the last, which
// holds its upper edge too (the same rule as numpy.histogram). A range of
// zero width is widened by half the value's magnitude (or 0.5) each side.
func histogram(xs []float64, n int) (edges, counts []float64, used int) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range xs {
		if !math.IsNaN(x) && !math.IsInf(x, 0) {
			lo, hi = min(lo, x), max(hi, x)
			used++
		}
	}
	if used == 0 {
		return nil, nil, 0
	}
	if lo == hi {
		w := 0.5 * math.Abs(lo)
		if w == 0 {
			w = 0.5
		}
		lo, hi = lo-w, hi+w
	}
	edges, counts = make([]float64, n+1), make([]float64, n)
	for i := range edges {
		edges[i] = lo + (hi-lo)*float64(i)/float64(n)
	}
	edges[n] = hi
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		k := min(int((x-lo)/(hi-lo)*float64(n)), n-1)
		// Rounding may put x one bin off its edges; the edges decide.
		for k > 0 && x < edges[k] {
			k--
		}
		for k < n-1 && x >= edges[k+1] {
			k++
		}
		counts[k]++
	}
	return edges, counts, used
}

// Type implements runtime.Value.
func (*HistogramValue) Type() string { return "histogram" }

// String is a summary: "histogram of ISI: 30 bins from 4 ms to 61 ms, 212 values".
func (h *HistogramValue) String() string {
	total := 0.0
	for i, c := range h.Counts {
		if h.Density {
			c *= h.Edges[i+1] - h.Edges[i]
		}
		total += c
	}
	if h.Density {
		return fmt.Sprintf("histogram of %s: %d bins from %s to %s, density", h.Name, len(h.Counts),
			units.Format(h.Edges[0], h.Dim), units.Format(h.Edges[len(h.Edges)-1], h.Dim))
	}
	return fmt.Sprintf("histogram of %s: %d bins from %s to %s, %s", h.Name, len(h.Counts),
		units.Format(h.Edges[0], h.Dim), units.Format(h.Edges[len(h.Edges)-1], h.Dim), plural(int(total), "value"))
}

// FieldNames implements runtime.Fielder.
func (*HistogramValue) FieldNames() []string { return []string{"edges", "counts", "centres"} }

// Field implements runtime.Fielder.
func (h *HistogramValue) Field(name string) (runtime.Value, error) {
	switch name {
	case "edges":
		return &runtime.Vector{V: append([]float64(nil), h.Edges...), Dim: h.Dim}, nil
	case "counts":
		var d units.Dim
		if h.Density {
			d = units.Dimensionless.Div(h.Dim)
		}
		return &runtime.Vector{V: append([]float64(nil), h.Counts...), Dim: d}, nil
	case "centres":
		c := make([]float64, len(h.Counts))
		for i := range c {
			c[i] = h.Edges[i] + (h.Edges[i+1]-h.Edges[i])/2
		}
		return &runtime.Vector{V: c, Dim: h.Dim}, nil
	}
	return nil, runtime.ValueErrorf("a histogram has no field %s; its fields are edges, counts and centres", name)
}

// Figure implements Plottable: the bins as steps.
func (h *HistogramValue) Figure() (*display.Figure, error) {
	xa := NewAxis(h.Name, h.Edges, h.Dim)
	ylabel := "count"
	ys := h.Counts
	if h.Density {
		ya := NewAxis("density", h.Counts, units.Dimensionless.Div(h.Dim))
		ylabel, ys = ya.Label, ya.Data
	}
	s := display.Series{Kind: display.Steps, Name: h.Name, X: xa.Data, Y: ys}
	return &display.Figure{Panels: []display.Panel{{XLabel: xa.Label, YLabel: ylabel, Series: []display.Series{s}, NoLegend: true}}}, nil
}

// Show implements runtime.Shower.
func (h *HistogramValue) Show() ([]display.Bundle, error) {
	f, _ := h.Figure()
	return (&FigureValue{F: f}).Show()
}

func histogramFn(c *runtime.Call) (runtime.Value, error) {
	n, err := c.Int("bins", 1, 10000)
	if err != nil {
		return nil, err
	}
	xs, d := c.Floats("values")
	edges, counts, used := histogram(xs, n)
	if used == 0 {
		return nil, runtime.ValueErrorf("histogram: no finite values to count (got %d values); check the input", len(xs))
	}
	h := &HistogramValue{Edges: edges, Counts: counts, Dim: d, Name: c.Str("name"), Density: c.Bool("density")}
	if h.Density {
		for i := range counts {
			counts[i] /= float64(used) * (edges[i+1] - edges[i])
		}
	}
	return h, nil
}
