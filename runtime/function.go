package runtime

import (
	"strings"

	"github.com/loligo-lab/loligo/runtime/syntax"
	"github.com/loligo-lab/loligo/runtime/units"
)

// Function is a value that can be called: a builtin or a formula.
type Function interface {
	Value
	FuncName() string
}

// FuncName implements Function.
func (b *Builtin) FuncName() string { return b.Name }

// Formula is a user's formula: formula sat(I; rmax, half, slope) = …. Vars
// are its independent variables, Params the parameters a fit may vary.
// Free names in the body are looked up when it is called.
type Formula struct {
	Name   string
	Vars   []string
	Params []string
	Body   syntax.Expr
	File   string
	Src    string
	At     syntax.Pos
}

// Type implements Value.
func (*Formula) Type() string { return "formula" }

// FuncName implements Function.
func (f *Formula) FuncName() string { return f.Name }

// String is the formula's head and body as written.
func (f *Formula) String() string {
	return "formula " + f.Head() + " = " + f.BodyText()
}

// Head is "name(x; p1, p2)".
func (f *Formula) Head() string {
	h := f.Name + "(" + strings.Join(f.Vars, ", ")
	if len(f.Params) > 0 {
		h += "; " + strings.Join(f.Params, ", ")
	}
	return h + ")"
}

// BodyText is the body's source text.
func (f *Formula) BodyText() string {
	p, e := f.Body.Pos(), f.Body.End()
	if p.Offset < 0 || e.Offset > len(f.Src) || p.Offset > e.Offset {
		return "…"
	}
	return f.Src[p.Offset:e.Offset]
}

// ArgNames is every name the formula can be called with: vars, then params.
func (f *Formula) ArgNames() []string {
	return append(append([]string{}, f.Vars...), f.Params...)
}

// ScalarFunc adapts a function value of one variable to a Go function for
// numerics: x is given in SI units of dimension in, and the result is
// returned in SI units. The result's dimension is found by one trial call at
// probe and returned; every later call must keep it (else an error).
// Other arguments (a formula's parameters) are passed as fixed.
func (c *Call) ScalarFunc(f Function, in units.Dim, probe float64, fixed ...Arg) (func(float64) (float64, error), units.Dim, error) {
	call := func(x float64) (Quantity, error) {
		args := append([]Arg{{Value: Q(x, in)}}, fixed...)
		v, err := c.Apply(f, args...)
		if err != nil {
			return Quantity{}, err
		}
		q, ok := v.(Quantity)
		if !ok {
			return Quantity{}, ValueErrorf("%s must return a number, returned %s", f.FuncName(), article(v.Type()))
		}
		return q, nil
	}
	q, err := call(probe)
	if err != nil {
		return nil, units.Dimensionless, err
	}
	out := q.Dim
	return func(x float64) (float64, error) {
		q, err := call(x)
		if err != nil {
			return 0, err
		}
		if q.Dim != out {
			return 0, UnitErrorf("%s returned %s at one input and %s at another", f.FuncName(), out.Describe(), q.Dim.Describe())
		}
		return q.V, nil
	}, out, nil
}
