package runtime

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime/units"
)

// Call is one call of a builtin: its arguments, bound and checked against
// the declaration, and the services a builtin may use (the context for
// cancellation, the session's seeded random source, outputs).
type Call struct {
	Ctx     context.Context
	Builtin *Builtin
	session *Session
	args    []Value // by parameter index; nil when not given and no default
	given   []bool  // whether the caller gave it (not a default)
	rest    []Value // the Rest parameter's values
	interp  *interp // for calling function values
	out     Output  // where displays and streams go
}

// Arg is an argument as the caller wrote it, before binding.
type Arg struct {
	Name  string // "" for positional
	Value Value
}

// bind matches args to the declaration: positional in order, named by name,
// defaults for the rest; it checks kinds and dimensions.
func (b *Builtin) bind(c *Call, args []Arg) error {
	n := len(b.Params)
	c.args, c.given = make([]Value, n), make([]bool, n)
	pos := 0
	for _, a := range args {
		i, err := b.slot(a, &pos)
		if err != nil {
			return err
		}
		if i < 0 { // into the Rest parameter
			c.rest = append(c.rest, a.Value)
			continue
		}
		if c.given[i] {
			return ArgumentErrorf("%s: argument %s given twice", b.Name, b.Params[i].Name)
		}
		c.args[i], c.given[i] = a.Value, true
	}
	for i, p := range b.Params {
		if p.Rest {
			continue
		}
		if !c.given[i] {
			if b.defaults[i] == nil && !p.Optional {
				return ArgumentErrorf("%s: missing argument %s (%s); signature: %s",
					b.Name, p.Name, paramKind(b, p), b.Signature())
			}
			c.args[i] = b.defaults[i]
			continue
		}
		v, err := b.check(i, c.args[i])
		if err != nil {
			return err
		}
		c.args[i] = v
	}
	for j, v := range c.rest {
		v, err := b.check(b.restIndex(), v)
		if err != nil {
			return err
		}
		c.rest[j] = v
	}
	return nil
}

// slot finds the parameter index for a; -1 means the Rest parameter.
func (b *Builtin) slot(a Arg, pos *int) (int, error) {
	if a.Name != "" {
		for i, p := range b.Params {
			if p.Name == a.Name && !p.Rest {
				return i, nil
			}
		}
		names := make([]string, len(b.Params))
		for i, p := range b.Params {
			names[i] = p.Name
		}
		msg := fmt.Sprintf("%s has no parameter %s", b.Name, a.Name)
		if s := suggest(a.Name, names); s != "" {
			return 0, ArgumentErrorf("%s; did you mean %s?", msg, s)
		}
		return 0, ArgumentErrorf("%s; signature: %s", msg, b.Signature())
	}
	for *pos < len(b.Params) {
		i := *pos
		if b.Params[i].Rest {
			return -1, nil
		}
		*pos++
		return i, nil
	}
	return 0, ArgumentErrorf("%s takes at most %d arguments; signature: %s",
		b.Name, len(b.Params), b.Signature())
}

func (b *Builtin) restIndex() int {
	for i, p := range b.Params {
		if p.Rest {
			return i
		}
	}
	return -1
}

// check converts and checks one argument against parameter i.
func (b *Builtin) check(i int, v Value) (Value, error) {
	p := b.Params[i]
	if v == nil {
		return nil, nil
	}
	switch p.Kind {
	case KindNumber:
		q, ok := v.(Quantity)
		if !ok {
			return nil, b.kindErr(p, v)
		}
		return q, b.dimCheck(i, q.Dim)
	case KindNumbers:
		switch x := v.(type) {
		case Quantity:
			return x, b.dimCheck(i, x.Dim)
		case *Vector:
			return x, b.dimCheck(i, x.Dim)
		case *List:
			vec, err := listToVector(x)
			if err != nil {
				return nil, ArgumentErrorf("%s: argument %s: %v", b.Name, p.Name, err)
			}
			return vec, b.dimCheck(i, vec.Dim)
		}
		return nil, b.kindErr(p, v)
	case KindString:
		if _, ok := v.(String); !ok {
			return nil, b.kindErr(p, v)
		}
	case KindBool:
		if _, ok := v.(Bool); !ok {
			return nil, b.kindErr(p, v)
		}
	case KindFunction:
		if _, ok := v.(Function); !ok {
			return nil, b.kindErr(p, v)
		}
	case KindList:
		if _, ok := v.(*List); !ok {
			return nil, b.kindErr(p, v)
		}
	case KindRecord:
		if _, ok := v.(*Record); !ok {
			return nil, b.kindErr(p, v)
		}
	}
	return v, nil
}

func (b *Builtin) kindErr(p Param, v Value) error {
	return ArgumentErrorf("%s: argument %s must be %s, got %s", b.Name, p.Name,
		kindNames[p.Kind], article(v.Type()))
}

func (b *Builtin) dimCheck(i int, got units.Dim) error {
	want := b.dims[i]
	if want == nil || *want == got {
		return nil
	}
	p := b.Params[i]
	hint := ""
	if got.IsDimensionless() {
		hint = fmt.Sprintf("; write the unit, e.g. %s", exampleFor(p, *want))
	}
	return UnitErrorf("%s: argument %s must be %s, got %s%s", b.Name, p.Name,
		want.Describe(), got.Describe(), hint)
}

func exampleFor(p Param, want units.Dim) string {
	if p.Default != "" {
		return p.Default
	}
	return "1 " + p.Unit
}

// Has reports whether the argument has a value (given or defaulted).
func (c *Call) Has(name string) bool { return c.args[c.index(name)] != nil }

// Given reports whether the caller wrote the argument.
func (c *Call) Given(name string) bool { return c.given[c.index(name)] }

// Value returns an argument as it is (nil when absent).
func (c *Call) Value(name string) Value { return c.args[c.index(name)] }

// Float returns a KindNumber argument in SI units.
func (c *Call) Float(name string) float64 {
	q, _ := c.args[c.index(name)].(Quantity)
	return q.V
}

// Quantity returns a KindNumber argument.
func (c *Call) Quantity(name string) Quantity {
	q, _ := c.args[c.index(name)].(Quantity)
	return q
}

// Floats returns a KindNumbers argument as SI values and its dimension; a
// single quantity gives a slice of one. The slice must not be modified.
func (c *Call) Floats(name string) ([]float64, units.Dim) {
	switch x := c.args[c.index(name)].(type) {
	case Quantity:
		return []float64{x.V}, x.Dim
	case *Vector:
		return x.V, x.Dim
	}
	return nil, units.Dimensionless
}

// Str returns a KindString argument.
func (c *Call) Str(name string) string {
	s, _ := c.args[c.index(name)].(String)
	return string(s)
}

// Bool returns a KindBool argument.
func (c *Call) Bool(name string) bool {
	b, _ := c.args[c.index(name)].(Bool)
	return bool(b)
}

// Int returns a dimensionless whole-number argument, with an error naming
// it if it is not one or lies outside [lo, hi].
func (c *Call) Int(name string, lo, hi int) (int, error) {
	x := c.Float(name)
	if x != math.Trunc(x) || x < float64(lo) || x > float64(hi) {
		return 0, ArgumentErrorf("%s: %s must be a whole number from %d to %d, got %s",
			c.Builtin.Name, name, lo, hi, units.FormatNumber(x))
	}
	return int(x), nil
}

// Rest returns the values of the Rest parameter.
func (c *Call) Rest() []Value { return c.rest }

// Rand is the session's seeded random source; draws are reproducible for
// the same notebook (see seed()).
func (c *Call) Rand() *rand.Rand { return c.session.rng }

// Seed returns a fresh seed drawn from the session's source, for numerics
// packages that own their own generator.
func (c *Call) Seed() uint64 { return c.session.rng.Uint64() }

// Display shows a bundle now, as its own output; a non-empty id lets a
// later update (update = true) replace it in place.
func (c *Call) Display(b display.Bundle, id string, update bool) {
	if c.out != nil {
		c.out.Display(b, id, update)
	}
}

// Print writes text to the cell's standard output stream.
func (c *Call) Print(text string) {
	if c.out != nil {
		c.out.Stream("stdout", text)
	}
}

// Warn writes text to the cell's standard error stream.
func (c *Call) Warn(text string) {
	if c.out != nil {
		c.out.Stream("stderr", text)
	}
}

// Apply calls a function value (a builtin or a formula) with arguments.
func (c *Call) Apply(f Function, args ...Arg) (Value, error) {
	return c.interp.apply(f, args)
}

// Session is the session the call runs in.
func (c *Call) Session() *Session { return c.session }

func (c *Call) index(name string) int {
	for i, p := range c.Builtin.Params {
		if p.Name == name {
			return i
		}
	}
	panic("runtime: builtin " + c.Builtin.Name + " has no parameter " + name)
}

// LineOutput is implemented by outputs that show progress as lines of text
// (a terminal runner) instead of updating a display in place.
type LineOutput interface {
	ProgressLine(text string, final bool)
}

// Terminal reports whether the cell's output is a terminal: progress should
// then go to ProgressLine, and in-place display updates are not shown.
func (c *Call) Terminal() bool {
	_, ok := c.out.(LineOutput)
	return ok
}

// ProgressLine shows one progress line on a terminal output (a no-op on
// other outputs); final ends the line.
func (c *Call) ProgressLine(text string, final bool) {
	if lo, ok := c.out.(LineOutput); ok {
		lo.ProgressLine(text, final)
	}
}

// Interrupted ends a builtin that an interrupt stopped part-way, when what it
// finished is worth seeing (a sweep at 60%): it shows partial now, as the
// cell's own outputs, and returns the error that ends the cell as
// Interrupted, with note saying what the partial result holds. Like every
// failed cell, the cell then binds nothing.
func (c *Call) Interrupted(partial Value, note string) error {
	if partial != nil {
		if bs, err := Show(partial); err == nil {
			for _, b := range bs {
				c.Display(b, "", false)
			}
		}
	}
	return &kindError{KindInterrupted, c.Builtin.Name + " interrupted: " + note}
}
