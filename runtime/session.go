package runtime

import (
	"context"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"sync"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime/syntax"
	"github.com/loligo-lab/loligo/runtime/units"
)

// DefaultSeed seeds a new session's random source, so that two fresh
// sessions draw the same numbers; seed(n) changes it.
const DefaultSeed = 1

// Output receives what a cell shows while it runs.
type Output interface {
	// Display shows a bundle as an output; a non-empty id names it so that
	// a later call with update = true replaces it in place.
	Display(b display.Bundle, id string, update bool)
	// Stream writes text to "stdout" or "stderr".
	Stream(name, text string)
}

// Session is a notebook's state: its bindings, its random source and its
// count of executed cells. Execute, Complete, Inspect and IsComplete may be
// called from one goroutine at a time; a running cell is stopped by
// cancelling the context given to Execute, from any goroutine.
type Session struct {
	reg     *Registry
	globals map[string]Value
	rng     *rand.Rand
	count   int

	unitMu    sync.Mutex
	unitCache map[string]units.Unit
}

// NewSession starts an empty session over the builtins of reg.
func NewSession(reg *Registry) *Session {
	s := &Session{reg: reg, globals: map[string]Value{}, unitCache: map[string]units.Unit{}}
	s.Seed(DefaultSeed)
	return s
}

// Seed resets the session's random source.
func (s *Session) Seed(n uint64) { s.rng = rand.New(rand.NewPCG(n, 0x6c6f6c69676f)) }

// Registry is the session's builtins.
func (s *Session) Registry() *Registry { return s.reg }

// Lookup returns a binding of the session.
func (s *Session) Lookup(name string) (Value, bool) {
	v, ok := s.globals[name]
	return v, ok
}

// Bindings lists the session's binding names, sorted.
func (s *Session) Bindings() []string {
	out := make([]string, 0, len(s.globals))
	for n := range s.globals {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// Result is what a cell gives back: the value of its last expression (nil
// when the cell ends with a binding or shows nothing).
type Result struct {
	Value Value
}

// Execute parses and evaluates one cell named name (used in positions,
// e.g. "cell[3]"). The cell is all or nothing: its bindings reach the
// session only if every statement succeeds, so a failed cell leaves the
// session as it was. The error, if any, is an *Error.
func (s *Session) Execute(ctx context.Context, name, src string, out Output) (*Result, error) {
	return s.execute(ctx, name, src, out, false)
}

// Run evaluates a whole script as Execute does a cell, but shows the value
// of every expression statement on out as it is reached, not only the
// last one; it returns no result of its own.
func (s *Session) Run(ctx context.Context, name, src string, out Output) error {
	_, err := s.execute(ctx, name, src, out, true)
	return err
}

func (s *Session) execute(ctx context.Context, name, src string, out Output, showEach bool) (*Result, error) {
	file, err := syntax.Parse(name, src)
	if err != nil {
		return nil, syntaxError(name, src, err)
	}
	in := &interp{s: s, ctx: ctx, file: name, src: src, staged: map[string]Value{}, out: out}
	stop := context.AfterFunc(ctx, func() { in.stop.Store(true) })
	defer stop()
	if ctx.Err() != nil {
		in.stop.Store(true)
	}
	var last Value = nothing
	for _, st := range file.Stmts {
		v, err := in.stmt(st)
		if err != nil {
			return nil, err
		}
		if showEach && out != nil {
			if err := showOn(out, v); err != nil {
				return nil, in.errAt(st, KindValue, err)
			}
			v = nothing
		}
		last = v
	}
	for _, n := range in.order {
		s.globals[n] = in.staged[n]
	}
	s.count++
	if _, ok := last.(Nothing); ok {
		return &Result{}, nil
	}
	return &Result{Value: last}, nil
}

// showOn displays v on out unless it is nothing.
func showOn(out Output, v Value) error {
	if _, ok := v.(Nothing); ok {
		return nil
	}
	bs, err := Show(v)
	if err != nil {
		return err
	}
	for _, b := range bs {
		out.Display(b, "", false)
	}
	return nil
}

// Count is the number of cells that ran to completion.
func (s *Session) Count() int { return s.count }

// syntaxError turns the parser's error list into one *Error whose message
// holds every problem found (up to the parser's limit).
func syntaxError(name, src string, err error) error {
	var list syntax.ErrorList
	if !errors.As(err, &list) || len(list) == 0 {
		return &Error{Kind: KindSyntax, File: name, Msg: err.Error(), Src: src, Err: err}
	}
	first := list[0]
	e := &Error{Kind: KindSyntax, File: name, Pos: first.Pos, Msg: first.Msg, Src: src, Err: err}
	for _, more := range list[1:] {
		e.Stack = append(e.Stack, more.Error())
	}
	return e
}

// parseUnit resolves a unit's text, with a cache: the same few units are
// written over and over.
func (s *Session) parseUnit(text string) (units.Unit, error) {
	s.unitMu.Lock()
	u, ok := s.unitCache[text]
	s.unitMu.Unlock()
	if ok {
		return u, nil
	}
	u, err := units.Parse(text)
	if err != nil {
		return u, errors.New(strings.TrimPrefix(err.Error(), "units: "))
	}
	s.unitMu.Lock()
	s.unitCache[text] = u
	s.unitMu.Unlock()
	return u, nil
}

// evalConst evaluates a constant expression (a default in a declaration).
func (s *Session) evalConst(src string) (Value, error) {
	e, err := syntax.ParseExpr(src)
	if err != nil {
		return nil, err
	}
	in := &interp{s: s, ctx: context.Background(), file: "default", src: src, staged: map[string]Value{}}
	return in.expr(e)
}

// Show returns the bundles that display v: its own rich display if it has
// one, else plain text (and JSON for numbers).
func Show(v Value) ([]display.Bundle, error) {
	if sh, ok := v.(Shower); ok {
		return sh.Show()
	}
	b := display.Text(v.String())
	switch x := v.(type) {
	case Quantity:
		u := units.Choose([]float64{x.V}, x.Dim)
		if x.Unit != nil {
			u = *x.Unit
		}
		j, err := display.JSON(map[string]any{"value": jsonNum((x.V - u.Offset) / u.Scale), "unit": u.Symbol, "si": jsonNum(x.V)})
		if err == nil {
			b = b.With(display.MIMEJSON, j)
		}
	case *Vector:
		b = display.Text(vectorText(x))
	}
	return []display.Bundle{b}, nil
}

// vectorText shows a short vector whole and a long one as a summary.
func vectorText(v *Vector) string {
	if len(v.V) <= 20 {
		return formatVector(v, 20)
	}
	lo, hi := v.V[0], v.V[0]
	for _, x := range v.V {
		lo, hi = min(lo, x), max(hi, x)
	}
	u := v.displayUnit()
	f := func(x float64) string { return units.FormatIn(x, u) }
	return fmt.Sprintf("%s\nvector of %d values from %s to %s", formatVector(v, 8), len(v.V), f(lo), f(hi))
}

// jsonNum keeps NaN and infinities out of JSON, which cannot hold them.
func jsonNum(x float64) any {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return fmt.Sprint(x)
	}
	return x
}

// Describe is a one-line description of a binding for inspection.
func Describe(name string, v Value) string {
	s := v.String()
	if r := []rune(s); len(r) > 200 { // cut at a character, not inside one
		s = string(r[:200]) + "…"
	}
	return fmt.Sprintf("%s: %s = %s", name, v.Type(), strings.TrimSpace(s))
}
