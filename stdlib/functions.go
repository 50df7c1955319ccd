package stdlib

import (
	"fmt"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
)

// FunctionFigure evaluates each function value of one variable (a builtin,
// an activation function, a formula) at the inputs of over and draws it as
// a line. Functions whose results share a dimension share a panel; the
// others get panels of their own. It checks c.Ctx between functions and
// returns an error naming the function that fails.
func FunctionFigure(c *runtime.Call, fs []runtime.Function, over *runtime.Vector) (*display.Figure, error) {
	if over == nil || len(over.V) < 2 {
		return nil, runtime.ArgumentErrorf("stdlib: plotting a function needs an input span of at least 2 points, e.g. over = span(-4, 4, n = 200)")
	}
	xa := NewAxis("x", over.V, over.Dim)
	fig := &display.Figure{}
	panelOf := map[units.Dim]int{}
	var kinds []derivKinds // per panel
	var names []string
	for _, f := range fs {
		if err := c.Ctx.Err(); err != nil {
			return nil, err
		}
		y, d, err := evalOver(c, f, over)
		if err != nil {
			return nil, err
		}
		i, ok := panelOf[d]
		if !ok {
			i = len(fig.Panels)
			panelOf[d] = i
			fig.Panels = append(fig.Panels, display.Panel{XLabel: xa.Label})
			kinds = append(kinds, derivKinds{})
		}
		kinds[i].add(f.FuncName())
		u := runtime.ChooseUnit(y, d)
		fig.Panels[i].YLabel = Label(kinds[i].label(), u)
		fig.Panels[i].Series = append(fig.Panels[i].Series,
			display.Series{Kind: display.Line, Name: f.FuncName(), X: xa.Data, Y: AxisIn("", y, u).Data})
		names = append(names, f.FuncName())
	}
	fig.Title = joinNames(names)
	fig.SharedX = len(fig.Panels) > 1
	return fig, nil
}

// derivKinds records whether a panel of functions holds functions, their
// derivatives (named "derivative of …" by derivative()), or both.
type derivKinds struct{ plain, deriv bool }

func (k *derivKinds) add(name string) {
	if strings.HasPrefix(name, "derivative of ") {
		k.deriv = true
	} else {
		k.plain = true
	}
}

// label is the y-axis name: f(x), f′(x) (with the prime U+2032, the usual
// mark of a first derivative), or both.
func (k derivKinds) label() string {
	switch {
	case k.plain && k.deriv:
		return "f(x), f′(x)"
	case k.deriv:
		return "f′(x)"
	}
	return "f(x)"
}

// evalOver evaluates f at every input; a point where f fails is an error.
func evalOver(c *runtime.Call, f runtime.Function, over *runtime.Vector) ([]float64, units.Dim, error) {
	g, d, err := c.ScalarFunc(f, over.Dim, over.V[0])
	if err != nil {
		return nil, d, err
	}
	y := make([]float64, len(over.V))
	for i, x := range over.V {
		if y[i], err = g(x); err != nil {
			return nil, d, fmt.Errorf("%s at %s: %w", f.FuncName(), units.Format(x, over.Dim), err)
		}
	}
	return y, d, nil
}
