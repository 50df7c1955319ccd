package stdlib

import (
	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

// Plottable is implemented by every value kind that plot() can draw (traces,
// curves, fits, rasters, activation functions over a span): Figure returns
// the value's own figure. plot(a, b, …) overlays the series of values whose
// panels carry the same axis labels and stacks the others.
type Plottable interface {
	runtime.Value
	Figure() (*display.Figure, error)
}

// Axis holds data ready for a figure: values converted from SI to one
// readable unit, and the axis label that names that unit.
type Axis struct {
	Label string // "V (mV)"
	Unit  units.Unit
	Data  []float64 // in Unit
}

// NewAxis converts si (of dimension d) for display under the name, choosing
// one unit for all values (runtime.ChooseUnit). The input is not modified.
func NewAxis(name string, si []float64, d units.Dim) Axis {
	return AxisIn(name, si, runtime.ChooseUnit(si, d))
}

// AxisIn is NewAxis with the unit given.
func AxisIn(name string, si []float64, u units.Unit) Axis {
	out := make([]float64, len(si))
	for i, x := range si {
		out[i] = (x - u.Offset) / u.Scale
	}
	return Axis{Label: Label(name, u), Unit: u, Data: out}
}

// Label is "name (unit)", or the bare name for a dimensionless unit.
func Label(name string, u units.Unit) string {
	if u.Symbol == "" {
		return name
	}
	return name + " (" + u.Symbol + ")"
}

// Scalar converts one SI value into u.
func Scalar(si float64, u units.Unit) float64 { return (si - u.Offset) / u.Scale }
