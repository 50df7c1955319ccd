package runtime

import (
	"errors"
	"fmt"

	"github.com/loligo-lab/loligo/runtime/syntax"
)

// Calls: evaluating a call's arguments, then applying a builtin (bound and
// checked against its declaration, panics recovered) or a formula (a frame
// of its arguments, a depth bound).

func (in *interp) call(e *syntax.CallExpr) (Value, error) {
	fv, err := in.expr(e.Fun)
	if err != nil {
		return nil, err
	}
	f, ok := fv.(Function)
	if !ok {
		return nil, in.errAt(e.Fun, KindName, fmt.Errorf("%s is %s, not a function", nodeText(in.src, e.Fun), article(fv.Type())))
	}
	args := make([]Arg, len(e.Args))
	for i, a := range e.Args {
		v, err := in.expr(a.Value)
		if err != nil {
			return nil, err
		}
		args[i].Value = v
		if a.Name != nil {
			args[i].Name = a.Name.Name
		}
	}
	v, err := in.apply(f, args)
	if err != nil {
		return nil, in.errAt(e, kindOf(err), err)
	}
	return v, nil
}

// apply calls f; a panic inside a builtin becomes an internal error for
// this cell, never a crash.
func (in *interp) apply(f Function, args []Arg) (v Value, err error) {
	switch f := f.(type) {
	case *Builtin:
		return in.applyBuiltin(f, args)
	case *Formula:
		return in.applyFormula(f, args)
	}
	return nil, fmt.Errorf("%s cannot be called", f.FuncName())
}

func (in *interp) applyBuiltin(b *Builtin, args []Arg) (v Value, err error) {
	if err := b.init(in.s); err != nil {
		return nil, &kindError{KindInternal, err.Error()}
	}
	c := &Call{Ctx: in.ctx, Builtin: b, session: in.s, interp: in, out: in.out}
	if err := b.bind(c, args); err != nil {
		return nil, err
	}
	defer func() {
		if r := recover(); r != nil {
			v, err = nil, &kindError{KindInternal, fmt.Sprintf("internal error in %s: %v (please report it with the cell that caused it)", b.Name, r)}
		}
	}()
	v, err = b.Fn(c)
	if err == nil && v == nil {
		v = nothing
	}
	if err != nil && in.ctx.Err() != nil && kindOf(err) != KindInterrupted {
		return nil, &kindError{KindInterrupted, "interrupted in " + b.Name}
	}
	return v, err
}

func (in *interp) applyFormula(f *Formula, args []Arg) (Value, error) {
	if len(in.frames) >= maxDepth {
		return nil, ValueErrorf("formula %s: calls nested more than %d deep (does it call itself?)", f.Name, maxDepth)
	}
	frame, err := bindFormula(f, args)
	if err != nil {
		return nil, err
	}
	in.frames = append(in.frames, frame)
	defer func() { in.frames = in.frames[:len(in.frames)-1] }()
	v, err := in.expr(f.Body)
	if err != nil {
		var re *Error
		if errors.As(err, &re) && len(re.Stack) < 10 {
			re.Stack = append(re.Stack, fmt.Sprintf("  in formula %s defined at %s:%d:%d", f.Name, f.File, f.At.Line, f.At.Col))
		}
		return nil, err
	}
	return v, nil
}

func bindFormula(f *Formula, args []Arg) (map[string]Value, error) {
	names := f.ArgNames()
	frame := make(map[string]Value, len(names))
	pos := 0
	for _, a := range args {
		name := a.Name
		if name == "" {
			if pos >= len(names) {
				return nil, ArgumentErrorf("formula %s takes %d arguments (%s), got more", f.Name, len(names), f.Head())
			}
			name, pos = names[pos], pos+1
		} else if !contains(names, name) {
			msg := fmt.Sprintf("formula %s has no argument %s", f.Name, name)
			if s := suggest(name, names); s != "" {
				return nil, ArgumentErrorf("%s; did you mean %s?", msg, s)
			}
			return nil, ArgumentErrorf("%s; it is %s", msg, f.Head())
		}
		if _, dup := frame[name]; dup {
			return nil, ArgumentErrorf("formula %s: argument %s given twice", f.Name, name)
		}
		frame[name] = a.Value
	}
	for _, n := range names {
		if _, ok := frame[n]; !ok {
			return nil, ArgumentErrorf("formula %s: missing argument %s; it is %s", f.Name, n, f.Head())
		}
	}
	return frame, nil
}

func contains(xs []string, s string) bool {
	for _, x := range xs {
		if x == s {
			return true
		}
	}
	return false
}
