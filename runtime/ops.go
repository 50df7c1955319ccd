package runtime

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/runtime/syntax"
	"github.com/loligo-lab/loligo/runtime/units"
)

// operand is a number or a vector seen uniformly by the arithmetic: a
// scalar is a vector of length one that broadcasts.
type operand struct {
	v      []float64
	dim    units.Dim
	scalar bool
}

func asOperand(x Value) (operand, bool) {
	switch x := x.(type) {
	case Quantity:
		return operand{v: []float64{x.V}, dim: x.Dim, scalar: true}, true
	case *Vector:
		return operand{v: x.V, dim: x.Dim}, true
	}
	return operand{}, false
}

func unaryOp(op syntax.Token, x Value) (Value, error) {
	switch op {
	case syntax.SUB:
		switch x := x.(type) {
		case Quantity:
			return Quantity{V: -x.V, Dim: x.Dim, Unit: x.Unit}, nil
		case *Vector:
			out := make([]float64, len(x.V))
			for i, v := range x.V {
				out[i] = -v
			}
			return &Vector{V: out, Dim: x.Dim, Unit: x.Unit}, nil
		}
		return nil, ValueErrorf("cannot negate %s", article(x.Type()))
	case syntax.NOT:
		switch x := x.(type) {
		case Bool:
			return !x, nil
		case *Mask:
			out := make([]bool, len(x.B))
			for i, b := range x.B {
				out[i] = !b
			}
			return &Mask{B: out}, nil
		}
		return nil, ValueErrorf("not needs true or false, got %s", article(x.Type()))
	}
	return nil, fmt.Errorf("unknown unary operator %s", op)
}

// Operand is implemented by value kinds of domain packages that take part
// in arithmetic (a sum of stimuli, a scaled stimulus). op is one of
// "+", "-", "*", "/"; right is true when the value is the right operand.
// Return ok = false to decline, and the usual error follows.
type Operand interface {
	Operate(op string, other Value, right bool) (v Value, ok bool, err error)
}

var opSymbols = map[syntax.Token]string{syntax.ADD: "+", syntax.SUB: "-", syntax.MUL: "*", syntax.QUO: "/"}

func binaryOp(op syntax.Token, x, y Value) (Value, error) {
	if sym, ok := opSymbols[op]; ok {
		if v, ok, err := operate(sym, x, y); ok || err != nil {
			return v, err
		}
	}
	if a, ok := x.(Quantity); ok {
		if b, ok := y.(Quantity); ok {
			return scalar(op, a, b)
		}
	}
	if a, ok := asOperand(x); ok {
		if b, ok := asOperand(y); ok {
			return numeric(op, a, b)
		}
	}
	switch op {
	case syntax.AND, syntax.OR:
		return logic(op, x, y)
	case syntax.EQL, syntax.NEQ:
		return equality(op, x, y)
	case syntax.ADD:
		if s, ok := x.(String); ok {
			if t, ok := y.(String); ok {
				return s + t, nil
			}
		}
	}
	return nil, ValueErrorf("cannot apply %s to %s and %s", op, article(x.Type()), article(y.Type()))
}

func operate(sym string, x, y Value) (Value, bool, error) {
	if o, ok := x.(Operand); ok {
		if v, ok, err := o.Operate(sym, y, false); ok || err != nil {
			return v, ok, err
		}
	}
	if o, ok := y.(Operand); ok {
		return o.Operate(sym, x, true)
	}
	return nil, false, nil
}

// scalar is numeric for two quantities without the slices: the common case
// of a cell's arithmetic, with no allocation but the result's. Anything it
// does not do directly (comparisons, powers, every error) goes to numeric.
func scalar(op syntax.Token, a, b Quantity) (Value, error) {
	var (
		r   float64
		d   = a.Dim
		ok  bool
		err error
	)
	switch op {
	case syntax.ADD:
		r, ok = a.V+b.V, a.Dim == b.Dim
	case syntax.SUB:
		r, ok = a.V-b.V, a.Dim == b.Dim
	case syntax.MUL:
		d, err = a.Dim.MulChecked(b.Dim)
		r, ok = a.V*b.V, err == nil
	case syntax.QUO:
		d, err = a.Dim.DivChecked(b.Dim)
		ok = err == nil && b.V != 0
		if ok {
			r = a.V / b.V
		}
	}
	if !ok || math.IsInf(r, 0) && !math.IsInf(a.V, 0) && !math.IsInf(b.V, 0) {
		one := func(q Quantity) operand { return operand{v: []float64{q.V}, dim: q.Dim, scalar: true} }
		return numeric(op, one(a), one(b))
	}
	return Q(r, d), nil
}

func numeric(op syntax.Token, a, b operand) (Value, error) {
	n, err := broadcastLen(a, b)
	if err != nil {
		return nil, err
	}
	switch op {
	case syntax.ADD, syntax.SUB:
		if a.dim != b.dim {
			verb := map[syntax.Token]string{syntax.ADD: "add", syntax.SUB: "subtract"}[op]
			prep := map[syntax.Token]string{syntax.ADD: "to", syntax.SUB: "from"}[op]
			first, second := a, b // "add a to b"
			if op == syntax.SUB {
				first, second = b, a // "subtract b from a"
			}
			return nil, UnitErrorf("cannot %s %s %s %s", verb, first.dim.Describe(), prep, second.dim.Describe())
		}
		sign := 1.0
		if op == syntax.SUB {
			sign = -1
		}
		return combine(a, b, n, a.dim, func(x, y float64) float64 { return x + sign*y })
	case syntax.MUL:
		d, err := a.dim.MulChecked(b.dim)
		if err != nil {
			return nil, UnitErrorf("%s", strings.TrimPrefix(err.Error(), "units: "))
		}
		return combine(a, b, n, d, func(x, y float64) float64 { return x * y })
	case syntax.QUO:
		for i, y := range b.v {
			if y == 0 {
				return nil, ValueErrorf("division by zero%s", where(b, i))
			}
		}
		d, err := a.dim.DivChecked(b.dim)
		if err != nil {
			return nil, UnitErrorf("%s", strings.TrimPrefix(err.Error(), "units: "))
		}
		return combine(a, b, n, d, func(x, y float64) float64 { return x / y })
	case syntax.POW:
		return power(a, b, n)
	case syntax.EQL, syntax.NEQ, syntax.LSS, syntax.LEQ, syntax.GTR, syntax.GEQ:
		return compare(op, a, b, n)
	}
	return nil, ValueErrorf("cannot apply %s to numbers", op)
}

func where(o operand, i int) string {
	if o.scalar {
		return ""
	}
	return fmt.Sprintf(" (element %d of the divisor is 0)", i)
}

func broadcastLen(a, b operand) (int, error) {
	switch {
	case a.scalar && b.scalar:
		return 1, nil
	case a.scalar:
		return len(b.v), nil
	case b.scalar:
		return len(a.v), nil
	case len(a.v) != len(b.v):
		return 0, ValueErrorf("vectors of different lengths: %d and %d elements", len(a.v), len(b.v))
	}
	return len(a.v), nil
}

func at(o operand, i int) float64 {
	if o.scalar {
		return o.v[0]
	}
	return o.v[i]
}

// combine applies f element-wise and rejects overflow: a non-finite result
// from finite operands.
func combine(a, b operand, n int, dim units.Dim, f func(x, y float64) float64) (Value, error) {
	out := make([]float64, n)
	for i := range out {
		x, y := at(a, i), at(b, i)
		r := f(x, y)
		if math.IsInf(r, 0) && !math.IsInf(x, 0) && !math.IsInf(y, 0) {
			return nil, ValueErrorf("number overflows (result beyond ±%g in SI units)", math.MaxFloat64)
		}
		out[i] = r
	}
	if a.scalar && b.scalar {
		return Q(out[0], dim), nil
	}
	return &Vector{V: out, Dim: dim}, nil
}

func power(a, b operand, n int) (Value, error) {
	if !b.dim.IsDimensionless() {
		return nil, UnitErrorf("an exponent must be dimensionless, got %s", b.dim.Describe())
	}
	dim := units.Dimensionless
	if !a.dim.IsDimensionless() {
		if !b.scalar || b.v[0] != math.Trunc(b.v[0]) || math.Abs(b.v[0]) > 64 {
			return nil, UnitErrorf("%s can only be raised to a whole-number power (use sqrt for square roots)", a.dim.Describe())
		}
		d, err := a.dim.Pow(int(b.v[0]))
		if err != nil {
			return nil, UnitErrorf("%v", err)
		}
		dim = d
	}
	for i := 0; i < n; i++ {
		x, y := at(a, i), at(b, i)
		if x == 0 && y < 0 {
			return nil, ValueErrorf("division by zero: 0 raised to a negative power")
		}
		if x < 0 && y != math.Trunc(y) {
			return nil, ValueErrorf("a negative number raised to a fractional power has no real value")
		}
	}
	return combine(a, b, n, dim, math.Pow)
}

func compare(op syntax.Token, a, b operand, n int) (Value, error) {
	if a.dim != b.dim {
		return nil, UnitErrorf("cannot compare %s with %s", a.dim.Describe(), b.dim.Describe())
	}
	out := make([]bool, n)
	for i := range out {
		x, y := at(a, i), at(b, i)
		switch op {
		case syntax.EQL:
			out[i] = x == y
		case syntax.NEQ:
			out[i] = x != y
		case syntax.LSS:
			out[i] = x < y
		case syntax.LEQ:
			out[i] = x <= y
		case syntax.GTR:
			out[i] = x > y
		case syntax.GEQ:
			out[i] = x >= y
		}
	}
	if a.scalar && b.scalar {
		return Bool(out[0]), nil
	}
	return &Mask{B: out}, nil
}

func logic(op syntax.Token, x, y Value) (Value, error) {
	if a, ok := x.(Bool); ok {
		if b, ok := y.(Bool); ok {
			if op == syntax.AND {
				return a && b, nil
			}
			return a || b, nil
		}
	}
	ma, okA := x.(*Mask)
	mb, okB := y.(*Mask)
	if !okA || !okB {
		return nil, ValueErrorf("%s needs true/false values or masks, got %s and %s", op, article(x.Type()), article(y.Type()))
	}
	if len(ma.B) != len(mb.B) {
		return nil, ValueErrorf("masks of different lengths: %d and %d", len(ma.B), len(mb.B))
	}
	out := make([]bool, len(ma.B))
	for i := range out {
		if op == syntax.AND {
			out[i] = ma.B[i] && mb.B[i]
		} else {
			out[i] = ma.B[i] || mb.B[i]
		}
	}
	return &Mask{B: out}, nil
}

func equality(op syntax.Token, x, y Value) (Value, error) {
	var eq bool
	switch a := x.(type) {
	case Bool:
		b, ok := y.(Bool)
		eq = ok && a == b
	case String:
		b, ok := y.(String)
		eq = ok && a == b
	default:
		return nil, ValueErrorf("cannot compare %s with %s", article(x.Type()), article(y.Type()))
	}
	if op == syntax.NEQ {
		eq = !eq
	}
	return Bool(eq), nil
}

// indexValue is x[i]: 0-based positions (negative count from the end) or a
// mask of the same length that selects elements.
func indexValue(x, i Value) (Value, error) {
	if ix, ok := x.(Indexer); ok {
		return ix.Index(i)
	}
	switch x := x.(type) {
	case *Vector:
		if m, ok := i.(*Mask); ok {
			if len(m.B) != len(x.V) {
				return nil, ValueErrorf("mask has %d elements but the vector has %d", len(m.B), len(x.V))
			}
			out := make([]float64, 0, m.Count())
			for j, keep := range m.B {
				if keep {
					out = append(out, x.V[j])
				}
			}
			return &Vector{V: out, Dim: x.Dim, Unit: x.Unit}, nil
		}
		k, err := position(i, len(x.V))
		if err != nil {
			return nil, err
		}
		return Quantity{V: x.V[k], Dim: x.Dim, Unit: x.Unit}, nil
	case *List:
		k, err := position(i, len(x.Elems))
		if err != nil {
			return nil, err
		}
		return x.Elems[k], nil
	}
	return nil, ValueErrorf("%s cannot be indexed", article(x.Type()))
}

func position(i Value, n int) (int, error) {
	q, ok := i.(Quantity)
	if !ok || !q.Dim.IsDimensionless() || q.V != math.Trunc(q.V) {
		return 0, ValueErrorf("an index must be a whole number (from 0) or a mask, got %s", i)
	}
	k := int(q.V)
	if q.V < 0 {
		k = n + int(q.V)
	}
	if math.Abs(q.V) > float64(n) || k < 0 || k >= n {
		return 0, ValueErrorf("index %s is out of range: there are %d elements (0 to %d, or -1 for the last)", i, n, n-1)
	}
	return k, nil
}
