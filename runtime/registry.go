package runtime

import (
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/loligo-lab/loligo/runtime/units"
)

// Kind says what sort of value a parameter takes.
type Kind int

// Parameter kinds. KindNumber accepts a quantity; KindNumbers a quantity or a
// vector (or a list of quantities); KindAny accepts anything.
const (
	KindAny Kind = iota
	KindNumber
	KindNumbers
	KindString
	KindBool
	KindFunction
	KindList
	KindRecord
)

var kindNames = [...]string{"any value", "a number", "a number or a vector", "a string",
	"true or false", "a function or formula", "a list", "a record"}

// Param declares one parameter of a builtin.
type Param struct {
	Name string
	Kind Kind
	// Unit gives the expected dimension by a unit spelling ("mV", "uA/cm^2");
	// empty means any dimension for KindNumber(s) unless Dimensionless is set.
	Unit          string
	Dimensionless bool
	// Default is the default in the language's own syntax ("20 ms");
	// empty means the parameter is required unless Optional is set.
	Default  string
	Optional bool
	// Rest collects all remaining positional arguments (plot(a, b, c)).
	Rest bool
	Doc  string
}

// Builtin is the one declaration of a builtin function: it drives the call
// checks, help, completion, inspection and the language reference.
type Builtin struct {
	Name     string
	Category string // "math", "models", "stimuli", …; groups help()
	Params   []Param
	Returns  string // what the result is, one phrase
	Doc      string // one paragraph
	Source   string // the published method or model it implements, if any
	Fn       func(c *Call) (Value, error)

	dims     []*units.Dim // resolved from Params[i].Unit
	defaults []Value      // evaluated Params[i].Default
	once     sync.Once
	initErr  error
}

// Type implements Value: a builtin is a function value.
func (*Builtin) Type() string { return "builtin" }

// String is the signature.
func (b *Builtin) String() string { return b.Signature() }

// Signature is "name(p1, p2 = default, …)" with expected units.
func (b *Builtin) Signature() string {
	parts := make([]string, len(b.Params))
	for i, p := range b.Params {
		s := p.Name
		if p.Rest {
			s = "…" + s
		}
		if p.Unit != "" {
			s += ": " + p.Unit
		}
		if p.Default != "" {
			s += " = " + p.Default
		} else if p.Optional {
			s += " = none"
		}
		parts[i] = s
	}
	return b.Name + "(" + strings.Join(parts, ", ") + ")"
}

// Help is the whole declaration as text: signature, doc, parameters, source.
func (b *Builtin) Help() string {
	var s strings.Builder
	s.WriteString(b.Signature())
	if b.Returns != "" {
		s.WriteString(" → " + b.Returns)
	}
	s.WriteString("\n\n" + b.Doc + "\n")
	if len(b.Params) > 0 {
		s.WriteString("\nParameters:\n")
		for _, p := range b.Params {
			fmt.Fprintf(&s, "  %-12s %s", p.Name, paramKind(b, p))
			if p.Default != "" {
				fmt.Fprintf(&s, ", default %s", p.Default)
			} else if p.Optional {
				s.WriteString(", optional")
			}
			if p.Doc != "" {
				s.WriteString(". " + p.Doc)
			}
			s.WriteByte('\n')
		}
	}
	if b.Source != "" {
		s.WriteString("\nSource: " + b.Source + "\n")
	}
	return s.String()
}

func paramKind(b *Builtin, p Param) string {
	k := kindNames[p.Kind]
	switch {
	case p.Unit != "":
		if u, err := units.Parse(p.Unit); err == nil {
			return k + " in " + u.Dim.Describe()
		}
	case p.Dimensionless:
		return k + ", dimensionless"
	}
	return k
}

// init resolves the units and defaults of the declaration once.
func (b *Builtin) init(s *Session) error {
	b.once.Do(func() {
		b.dims = make([]*units.Dim, len(b.Params))
		b.defaults = make([]Value, len(b.Params))
		for i, p := range b.Params {
			if p.Unit != "" {
				u, err := units.Parse(p.Unit)
				if err != nil {
					b.initErr = fmt.Errorf("builtin %s: parameter %s: %v", b.Name, p.Name, err)
					return
				}
				b.dims[i] = &u.Dim
			} else if p.Dimensionless {
				b.dims[i] = &units.Dimensionless
			}
			if p.Default != "" {
				v, err := s.evalConst(p.Default)
				if err != nil {
					b.initErr = fmt.Errorf("builtin %s: default of %s: %v", b.Name, p.Name, err)
					return
				}
				b.defaults[i] = v
			}
		}
	})
	return b.initErr
}

// Registry holds the builtins of a language instance. Register everything
// before the first session starts; lookups are then read-only and safe from
// many goroutines.
type Registry struct {
	byName map[string]*Builtin
	consts map[string]constant
}

type constant struct {
	v   Value
	doc string
}

// NewRegistry returns a registry holding the core math builtins.
func NewRegistry() *Registry {
	r := &Registry{byName: map[string]*Builtin{}, consts: map[string]constant{}}
	registerCore(r)
	return r
}

// Register adds builtins; it panics on a duplicate name or a declaration
// error, which are programming mistakes.
func (r *Registry) Register(bs ...*Builtin) {
	for _, b := range bs {
		if _, dup := r.byName[b.Name]; dup {
			panic("runtime: builtin " + b.Name + " registered twice")
		}
		if b.Fn == nil || b.Doc == "" {
			panic("runtime: builtin " + b.Name + " needs Fn and Doc")
		}
		r.byName[b.Name] = b
	}
}

// Const adds a named constant (pi).
func (r *Registry) Const(name string, v Value, doc string) {
	r.consts[name] = constant{v, doc}
}

// Lookup finds a builtin by name.
func (r *Registry) Lookup(name string) (*Builtin, bool) {
	b, ok := r.byName[name]
	return b, ok
}

// Names lists the builtins and constants, sorted.
func (r *Registry) Names() []string {
	out := make([]string, 0, len(r.byName)+len(r.consts))
	for n := range r.byName {
		out = append(out, n)
	}
	for n := range r.consts {
		out = append(out, n)
	}
	sort.Strings(out)
	return out
}

// Builtins lists the builtins sorted by category, then name.
func (r *Registry) Builtins() []*Builtin {
	out := make([]*Builtin, 0, len(r.byName))
	for _, b := range r.byName {
		out = append(out, b)
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Category != out[j].Category {
			return out[i].Category < out[j].Category
		}
		return out[i].Name < out[j].Name
	})
	return out
}
