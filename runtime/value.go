package runtime

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime/units"
)

// Value is any value of the language. The core kinds are defined in this
// package; domain packages add their own (models, traces, tables, fits,
// figures) by implementing Value and, as they need, the optional interfaces
// below. The runtime never needs to know them.
type Value interface {
	// Type names the kind for messages: "quantity", "vector", "trace".
	Type() string
	// String is the short plain-text form, used in messages and consoles.
	String() string
}

// Shower is implemented by values with a rich display. A value that is a
// table and a figure at once returns two bundles; each becomes one output.
type Shower interface {
	Show() ([]display.Bundle, error)
}

// Fielder is implemented by values with named fields (r.v, fit.params).
// FieldNames drives completion after a dot.
type Fielder interface {
	Field(name string) (Value, error)
	FieldNames() []string
}

// Indexer is implemented by values that can be indexed (x[i] or x[mask]).
type Indexer interface {
	Index(i Value) (Value, error)
}

// Quantity is a number with a dimension, stored in SI base units. Unit, when
// set, is the unit the value was asked to be shown in (x in mV); it affects
// display only.
type Quantity struct {
	V    float64
	Dim  units.Dim
	Unit *units.Unit
}

// Num returns a dimensionless quantity.
func Num(v float64) Quantity { return Quantity{V: v} }

// Q returns a quantity of value v (SI) and dimension d.
func Q(v float64, d units.Dim) Quantity { return Quantity{V: v, Dim: d} }

// Type implements Value.
func (Quantity) Type() string { return "quantity" }

// String shows the quantity in a readable unit.
func (q Quantity) String() string {
	if q.Unit != nil {
		return units.FormatIn(q.V, *q.Unit)
	}
	return units.Format(q.V, q.Dim)
}

// Vector is a sequence of numbers sharing one dimension, stored in SI base
// units. It is never modified after creation: operations make new vectors,
// so a vector may be shared freely.
type Vector struct {
	V    []float64
	Dim  units.Dim
	Unit *units.Unit
}

// Type implements Value.
func (*Vector) Type() string { return "vector" }

// String shows up to 10 elements in one common unit.
func (v *Vector) String() string { return formatVector(v, 10) }

// Len is the number of elements.
func (v *Vector) Len() int { return len(v.V) }

// displayUnit is the one unit every element of v is shown in.
func (v *Vector) displayUnit() units.Unit {
	if v.Unit != nil {
		return *v.Unit
	}
	return ChooseUnit(v.V, v.Dim)
}

// ChooseUnit picks one display unit for a set of values: the one that puts
// the largest finite magnitude in [1, 1000), so that [0, 0.5, 1] ms reads
// as such rather than in µs.
func ChooseUnit(si []float64, d units.Dim) units.Unit {
	m := 0.0
	for _, x := range si {
		if a := math.Abs(x); a > m && !math.IsInf(a, 0) {
			m = a
		}
	}
	return units.Choose([]float64{m}, d)
}

func formatVector(v *Vector, max int) string {
	u := v.displayUnit()
	var b strings.Builder
	b.WriteByte('[')
	for i, x := range v.V {
		if i == max && len(v.V) > max+1 {
			fmt.Fprintf(&b, ", … %d more", len(v.V)-max)
			break
		}
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(units.FormatNumber((x - u.Offset) / u.Scale))
	}
	b.WriteByte(']')
	if !v.Dim.IsDimensionless() || u.Symbol != "" {
		b.WriteByte(' ')
		b.WriteString(u.Symbol)
	}
	return b.String()
}

// Mask is a vector of booleans, the result of comparing vectors; it selects
// elements or rows (x[x > 0 mV]).
type Mask struct{ B []bool }

// Type implements Value.
func (*Mask) Type() string { return "mask" }

// String lists up to 10 elements.
func (m *Mask) String() string {
	var b strings.Builder
	b.WriteByte('[')
	for i, x := range m.B {
		if i == 10 && len(m.B) > 11 {
			fmt.Fprintf(&b, ", … %d more", len(m.B)-10)
			break
		}
		if i > 0 {
			b.WriteString(", ")
		}
		fmt.Fprint(&b, x)
	}
	b.WriteByte(']')
	return b.String()
}

// Count is the number of true elements.
func (m *Mask) Count() int {
	n := 0
	for _, x := range m.B {
		if x {
			n++
		}
	}
	return n
}

// String is a text value.
type String string

// Type implements Value.
func (String) Type() string { return "string" }

// String quotes the text as the language writes it.
func (s String) String() string { return quote(string(s)) }

func quote(s string) string {
	r := strings.NewReplacer(`\`, `\\`, `"`, `\"`, "\n", `\n`, "\t", `\t`)
	return `"` + r.Replace(s) + `"`
}

// Bool is true or false.
type Bool bool

// Type implements Value.
func (Bool) Type() string { return "bool" }

// String is "true" or "false".
func (b Bool) String() string {
	if b {
		return "true"
	}
	return "false"
}

// List is an ordered sequence of values of any kinds.
type List struct{ Elems []Value }

// Type implements Value.
func (*List) Type() string { return "list" }

// String lists the elements.
func (l *List) String() string {
	parts := make([]string, len(l.Elems))
	for i, e := range l.Elems {
		parts[i] = e.String()
	}
	return "[" + strings.Join(parts, ", ") + "]"
}

// Record is a set of named values in the order they were written.
type Record struct {
	Names  []string
	Values []Value
}

// Type implements Value.
func (*Record) Type() string { return "record" }

// String writes the record as the language does.
func (r *Record) String() string {
	parts := make([]string, len(r.Names))
	for i, n := range r.Names {
		parts[i] = n + " = " + r.Values[i].String()
	}
	return "(" + strings.Join(parts, ", ") + ")"
}

// Get returns the value of field name.
func (r *Record) Get(name string) (Value, bool) {
	for i, n := range r.Names {
		if n == name {
			return r.Values[i], true
		}
	}
	return nil, false
}

// Field implements Fielder.
func (r *Record) Field(name string) (Value, error) {
	if v, ok := r.Get(name); ok {
		return v, nil
	}
	return nil, noField(r, name, r.Names)
}

// FieldNames implements Fielder.
func (r *Record) FieldNames() []string { return r.Names }

// noField is the error for a missing field, with a suggestion.
func noField(v Value, name string, names []string) error {
	msg := fmt.Sprintf("%s has no field %s", article(v.Type()), name)
	if s := suggest(name, names); s != "" {
		return fmt.Errorf("%s; did you mean %s?", msg, s)
	}
	if len(names) > 0 {
		return fmt.Errorf("%s; its fields are %s", msg, strings.Join(names, ", "))
	}
	return fmt.Errorf("%s", msg)
}

// article returns "a x" or "an x".
func article(s string) string {
	if s != "" && strings.ContainsRune("aeiou", rune(s[0])) {
		return "an " + s
	}
	return "a " + s
}

var (
	_ Value   = Quantity{}
	_ Value   = (*Vector)(nil)
	_ Fielder = (*Record)(nil)
)
