package runtime

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sync/atomic"

	"github.com/loligo-lab/loligo/runtime/syntax"
	"github.com/loligo-lab/loligo/runtime/units"
)

// maxDepth bounds formula calls within calls, so that a formula that calls
// itself fails with a message instead of exhausting the stack.
const maxDepth = 200

// interp evaluates one cell. Its stop flag is set from the context's
// goroutine on cancel and checked at every node, so an interrupt takes
// effect at the next step even inside a long chain of cheap operations;
// slow builtins watch the context themselves.
type interp struct {
	s      *Session
	ctx    context.Context
	stop   atomic.Bool
	file   string
	src    string
	staged map[string]Value // this cell's bindings, committed on success
	order  []string
	frames []map[string]Value // formula arguments, innermost last
	stack  []string
	out    Output
}

var errInterrupted = errors.New("interrupted")

func (in *interp) stmt(st syntax.Stmt) (Value, error) {
	switch st := st.(type) {
	case *syntax.ExprStmt:
		return in.expr(st.X)
	case *syntax.BindStmt:
		v, err := in.expr(st.Value)
		if err != nil {
			return nil, err
		}
		if err := in.checkBindable(st.Name); err != nil {
			return nil, err
		}
		in.bind(st.Name.Name, v)
		return nothing, nil
	case *syntax.FormulaStmt:
		f, err := in.formula(st)
		if err != nil {
			return nil, err
		}
		in.bind(f.Name, f)
		return nothing, nil
	}
	return nil, in.errAt(st, KindSyntax, fmt.Errorf("statement did not parse"))
}

// checkBindable refuses to shadow a builtin, which would make every later
// call of it fail in a confusing way.
func (in *interp) checkBindable(id *syntax.Ident) error {
	if _, ok := in.s.reg.Lookup(id.Name); ok {
		return in.errAt(id, KindName, fmt.Errorf("%s is a builtin and cannot be rebound; choose another name, e.g. my_%s", id.Name, id.Name))
	}
	return nil
}

func (in *interp) bind(name string, v Value) {
	if _, ok := in.staged[name]; !ok {
		in.order = append(in.order, name)
	}
	in.staged[name] = v
}

func (in *interp) formula(st *syntax.FormulaStmt) (*Formula, error) {
	if err := in.checkBindable(st.Name); err != nil {
		return nil, err
	}
	f := &Formula{Name: st.Name.Name, Body: st.Body, File: in.file, Src: in.src, At: st.Formula}
	seen := map[string]bool{}
	for _, group := range [][]*syntax.Ident{st.Vars, st.Params} {
		for _, id := range group {
			if seen[id.Name] {
				return nil, in.errAt(id, KindName, fmt.Errorf("formula %s names %s twice", f.Name, id.Name))
			}
			seen[id.Name] = true
		}
	}
	for _, id := range st.Vars {
		f.Vars = append(f.Vars, id.Name)
	}
	for _, id := range st.Params {
		f.Params = append(f.Params, id.Name)
	}
	return f, nil
}

func (in *interp) expr(e syntax.Expr) (Value, error) {
	if in.stop.Load() {
		return nil, in.errAt(e, KindInterrupted, errInterrupted)
	}
	switch e := e.(type) {
	case *syntax.NumberLit:
		return Num(e.Value), nil
	case *syntax.StringLit:
		return String(e.Value), nil
	case *syntax.BoolLit:
		return Bool(e.Value), nil
	case *syntax.Ident:
		return in.lookup(e)
	case *syntax.ParenExpr:
		return in.expr(e.X)
	case *syntax.ListLit:
		return in.list(e)
	case *syntax.RecordLit:
		return in.record(e)
	case *syntax.UnitExpr:
		return in.withUnit(e)
	case *syntax.InExpr:
		return in.inUnit(e)
	case *syntax.UnaryExpr:
		return in.unary(e)
	case *syntax.BinaryExpr:
		return in.binary(e)
	case *syntax.CondExpr:
		return in.cond(e)
	case *syntax.CallExpr:
		return in.call(e)
	case *syntax.FieldExpr:
		return in.field(e)
	case *syntax.IndexExpr:
		return in.index(e)
	}
	return nil, in.errAt(e, KindSyntax, fmt.Errorf("expression did not parse"))
}

// lookup resolves a name: formula arguments, this cell's bindings, the
// session's bindings, builtins and constants, and last a unit name standing
// alone (1/ms, mV/ms), which means one of that unit.
func (in *interp) lookup(id *syntax.Ident) (Value, error) {
	name := id.Name
	for i := len(in.frames) - 1; i >= 0; i-- {
		if v, ok := in.frames[i][name]; ok {
			return v, nil
		}
	}
	if v, ok := in.staged[name]; ok {
		return v, nil
	}
	if v, ok := in.s.globals[name]; ok {
		return v, nil
	}
	if b, ok := in.s.reg.Lookup(name); ok {
		return b, nil
	}
	if c, ok := in.s.reg.consts[name]; ok {
		return c.v, nil
	}
	if u, ok := units.Lookup(name); ok && u.Offset == 0 {
		return Q(u.Scale, u.Dim), nil
	}
	return nil, in.errAt(id, KindName, in.unknownName(name))
}

func (in *interp) unknownName(name string) error {
	cands := in.s.reg.Names()
	for n := range in.staged {
		cands = append(cands, n)
	}
	for n := range in.s.globals {
		cands = append(cands, n)
	}
	for _, f := range in.frames {
		for n := range f {
			cands = append(cands, n)
		}
	}
	if s := suggest(name, cands); s != "" {
		return fmt.Errorf("unknown name %s; did you mean %s?", name, s)
	}
	return fmt.Errorf("unknown name %s; bind it first, e.g. %s = 1", name, name)
}

func (in *interp) list(e *syntax.ListLit) (Value, error) {
	elems := make([]Value, len(e.Elems))
	for i, x := range e.Elems {
		v, err := in.expr(x)
		if err != nil {
			return nil, err
		}
		elems[i] = v
	}
	l := &List{Elems: elems}
	if vec, err := listToVector(l); err == nil && len(elems) > 0 {
		return vec, nil
	}
	return l, nil
}

// listToVector turns a list of quantities of one dimension into a vector.
func listToVector(l *List) (*Vector, error) {
	v := &Vector{V: make([]float64, len(l.Elems))}
	for i, e := range l.Elems {
		q, ok := e.(Quantity)
		if !ok {
			return nil, fmt.Errorf("element %d is %s, not a number", i, article(e.Type()))
		}
		if i == 0 {
			v.Dim = q.Dim
		} else if q.Dim != v.Dim {
			return nil, UnitErrorf("element %d is %s but element 0 is %s; a vector has one dimension", i, q.Dim.Describe(), v.Dim.Describe())
		}
		v.V[i] = q.V
	}
	return v, nil
}

func (in *interp) record(e *syntax.RecordLit) (Value, error) {
	r := &Record{}
	for _, f := range e.Fields {
		if _, dup := r.Get(f.Name.Name); dup {
			return nil, in.errAt(f.Name, KindName, fmt.Errorf("field %s given twice", f.Name.Name))
		}
		v, err := in.expr(f.Value)
		if err != nil {
			return nil, err
		}
		r.Names = append(r.Names, f.Name.Name)
		r.Values = append(r.Values, v)
	}
	return r, nil
}

// unit resolves a unit's text written at pos. The position is boxed into
// a node only on error: this runs for every number with a unit.
func (in *interp) unit(pos syntax.Pos, text string) (units.Unit, error) {
	u, err := in.s.parseUnit(text)
	if err != nil {
		return u, in.errAt(unitNode{pos, text}, KindUnit, err)
	}
	return u, nil
}

func (in *interp) withUnit(e *syntax.UnitExpr) (Value, error) {
	if n, ok := e.X.(*syntax.NumberLit); ok { // 20 ms: the commonest case, without boxing 20 first
		u, err := in.unit(e.UnitPos, e.Unit)
		if err != nil {
			return nil, err
		}
		return in.finite(e, Q(n.Value*u.Scale+u.Offset, u.Dim))
	}
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	u, err := in.unit(e.UnitPos, e.Unit)
	if err != nil {
		return nil, err
	}
	if l, ok := x.(*List); ok {
		if x, err = listToVector(l); err != nil {
			return nil, in.errAt(e, KindValue, err)
		}
	}
	switch x := x.(type) {
	case Quantity:
		if !x.Dim.IsDimensionless() {
			return nil, in.errAt(unitNode{e.UnitPos, e.Unit}, KindUnit, fmt.Errorf("%s already has a unit; multiply instead: (%s) * 1 %s", x, x, e.Unit))
		}
		return in.finite(e, Q(x.V*u.Scale+u.Offset, u.Dim))
	case *Vector:
		if !x.Dim.IsDimensionless() {
			return nil, in.errAt(unitNode{e.UnitPos, e.Unit}, KindUnit, fmt.Errorf("the vector already has a unit; multiply instead: v * 1 %s", e.Unit))
		}
		out := make([]float64, len(x.V))
		for i, v := range x.V {
			out[i] = v*u.Scale + u.Offset
		}
		return &Vector{V: out, Dim: u.Dim}, nil
	}
	return nil, in.errAt(e, KindUnit, fmt.Errorf("a unit can follow a number, a list or a vector, not %s", article(x.Type())))
}

func (in *interp) inUnit(e *syntax.InExpr) (Value, error) {
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	u, err := in.unit(e.UnitPos, e.Unit)
	if err != nil {
		return nil, err
	}
	var d units.Dim
	switch x := x.(type) {
	case Quantity:
		d = x.Dim
		x.Unit = &u
		if d == u.Dim {
			return x, nil
		}
	case *Vector:
		d = x.Dim
		if d == u.Dim {
			return &Vector{V: x.V, Dim: x.Dim, Unit: &u}, nil
		}
	default:
		return nil, in.errAt(e, KindUnit, fmt.Errorf("only numbers and vectors can be shown in a unit, not %s", article(x.Type())))
	}
	return nil, in.errAt(unitNode{e.UnitPos, e.Unit}, KindUnit, fmt.Errorf("cannot show %s in %s, which is %s", d.Describe(), e.Unit, u.Dim.Describe()))
}

func (in *interp) unary(e *syntax.UnaryExpr) (Value, error) {
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	v, err := unaryOp(e.Op, x)
	if err != nil {
		return nil, in.errAt(e, kindOf(err), err)
	}
	return v, nil
}

func (in *interp) binary(e *syntax.BinaryExpr) (Value, error) {
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	if e.Op == syntax.AND || e.Op == syntax.OR { // short-circuit
		b, ok := x.(Bool)
		if !ok {
			return nil, in.errAt(e.X, KindValue, fmt.Errorf("%s needs true or false on its left, got %s", e.Op, article(x.Type())))
		}
		if (e.Op == syntax.AND && !bool(b)) || (e.Op == syntax.OR && bool(b)) {
			return b, nil
		}
	}
	y, err := in.expr(e.Y)
	if err != nil {
		return nil, err
	}
	v, err := binaryOp(e.Op, x, y)
	if err != nil {
		return nil, in.errAt(opNode{e}, kindOf(err), err)
	}
	return v, nil
}

func (in *interp) cond(e *syntax.CondExpr) (Value, error) {
	c, err := in.expr(e.Cond)
	if err != nil {
		return nil, err
	}
	b, ok := c.(Bool)
	if !ok {
		return nil, in.errAt(e.Cond, KindValue, fmt.Errorf("if needs true or false, got %s", article(c.Type())))
	}
	if b {
		return in.expr(e.Then)
	}
	return in.expr(e.Else)
}

func (in *interp) field(e *syntax.FieldExpr) (Value, error) {
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	f, ok := x.(Fielder)
	if !ok {
		return nil, in.errAt(e.Name, KindName, fmt.Errorf("%s has no fields", article(x.Type())))
	}
	v, err := f.Field(e.Name.Name)
	if err != nil {
		return nil, in.errAt(e.Name, KindName, err)
	}
	return v, nil
}

func (in *interp) index(e *syntax.IndexExpr) (Value, error) {
	x, err := in.expr(e.X)
	if err != nil {
		return nil, err
	}
	i, err := in.expr(e.Index)
	if err != nil {
		return nil, err
	}
	v, err := indexValue(x, i)
	if err != nil {
		return nil, in.errAt(e.Index, kindOf(err), err)
	}
	return v, nil
}

// finite rejects a non-finite result made from finite operands (overflow).
func (in *interp) finite(n syntax.Node, q Quantity) (Value, error) {
	if math.IsInf(q.V, 0) {
		return nil, in.errAt(n, KindValue, fmt.Errorf("number overflows: the result is larger than %g in SI units", math.MaxFloat64))
	}
	return q, nil
}

// errAt attaches a position to err, unless it already has one.
func (in *interp) errAt(n syntax.Node, kind string, err error) error {
	var re *Error
	if errors.As(err, &re) {
		return err
	}
	if k := kindOf(err); k != KindValue {
		kind = k
	}
	return &Error{Kind: kind, File: in.file, Pos: n.Pos(), Msg: err.Error(), Src: in.src, Err: err}
}

// unitNode gives a unit's text a position for errors.
type unitNode struct {
	at   syntax.Pos
	text string
}

func (u unitNode) Pos() syntax.Pos { return u.at }
func (u unitNode) End() syntax.Pos { return u.at }

// opNode points an operator error at the operator.
type opNode struct{ e *syntax.BinaryExpr }

func (o opNode) Pos() syntax.Pos { return o.e.OpPos }
func (o opNode) End() syntax.Pos { return o.e.OpPos }

func nodeText(src string, n syntax.Node) string {
	p, e := n.Pos().Offset, n.End().Offset
	if p < 0 || e > len(src) || p >= e {
		return "it"
	}
	return src[p:e]
}

// Nothing is the value of a statement that shows nothing (a binding, print).
type Nothing struct{}

var nothing Value = Nothing{}

// Type implements Value.
func (Nothing) Type() string { return "nothing" }

// String is empty.
func (Nothing) String() string { return "" }
