package runtime

import (
	"fmt"
	"math"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime/units"
)

// maxSpan bounds the length of a span, so that a typo in a step cannot
// exhaust memory.
const maxSpan = 50_000_000

func registerCore(r *Registry) {
	r.Const("pi", Num(math.Pi), "π, the ratio of a circle's circumference to its diameter.")
	r.Register(
		elementwise("exp", "e raised to x, element-wise; x must be dimensionless.", math.Exp),
		elementwise("log", "The natural logarithm of x, element-wise; x must be dimensionless and positive.", math.Log),
		elementwise("log10", "The base-10 logarithm of x, element-wise; x must be dimensionless and positive.", math.Log10),
		elementwise("sin", "The sine of x (radians), element-wise.", math.Sin),
		elementwise("cos", "The cosine of x (radians), element-wise.", math.Cos),
		elementwise("tan", "The tangent of x (radians), element-wise.", math.Tan),
		keepUnit("abs", "The absolute value of x, element-wise, in x's unit.", math.Abs),
		keepUnit("floor", "The largest whole number of x's unit not above x, element-wise (in SI units).", math.Floor),
		keepUnit("ceil", "The smallest whole number not below x, element-wise (in SI units).", math.Ceil),
		keepUnit("round", "x rounded to the nearest whole number, halves away from zero, element-wise (in SI units).", math.Round),
		sqrtBuiltin(),
		reduce("sum", "The sum of the elements of x (compensated summation), in x's unit.", sumOf),
		reduce("mean", "The arithmetic mean of the elements of x, in x's unit.", meanOf),
		reduce("min", "The smallest element of x; NaN if any element is NaN.", minOf),
		reduce("max", "The largest element of x; NaN if any element is NaN.", maxOf),
		reduce("std", "The sample standard deviation of x (n − 1 in the denominator), in x's unit.", stdOf),
		spanBuiltin(), lenBuiltin(), helpBuiltin(r), seedBuiltin(), printBuiltin(), showBuiltin(), assertBuiltin(), clearBuiltin(),
	)
}

// mapFloats applies f to every element of a number or vector.
func mapFloats(v Value, dim units.Dim, f func(float64) float64) Value {
	switch x := v.(type) {
	case Quantity:
		return Q(f(x.V), dim)
	case *Vector:
		out := make([]float64, len(x.V))
		for i, e := range x.V {
			out[i] = f(e)
		}
		return &Vector{V: out, Dim: dim}
	}
	return v
}

func elementwise(name, doc string, f func(float64) float64) *Builtin {
	return &Builtin{
		Name: name, Category: "math", Doc: doc, Returns: "a number or vector, dimensionless",
		Params: []Param{{Name: "x", Kind: KindNumbers, Dimensionless: true}},
		Fn: func(c *Call) (Value, error) {
			return checkDomain(name, mapFloats(c.Value("x"), units.Dimensionless, f))
		},
	}
}

func keepUnit(name, doc string, f func(float64) float64) *Builtin {
	return &Builtin{
		Name: name, Category: "math", Doc: doc, Returns: "a number or vector in x's unit",
		Params: []Param{{Name: "x", Kind: KindNumbers}},
		Fn: func(c *Call) (Value, error) {
			_, d := c.Floats("x")
			return mapFloats(c.Value("x"), d, f), nil
		},
	}
}

// checkDomain turns NaN or Inf made from finite input (log of a negative
// number, exp overflow) into an error naming the function.
func checkDomain(name string, v Value) (Value, error) {
	xs, _ := floatsOf(v)
	for _, x := range xs {
		if math.IsNaN(x) {
			return nil, ValueErrorf("%s: argument outside its domain (the result is not a real number)", name)
		}
		if math.IsInf(x, 0) {
			return nil, ValueErrorf("%s: the result overflows or is infinite (argument at a pole or out of range)", name)
		}
	}
	return v, nil
}

func floatsOf(v Value) ([]float64, units.Dim) {
	switch x := v.(type) {
	case Quantity:
		return []float64{x.V}, x.Dim
	case *Vector:
		return x.V, x.Dim
	}
	return nil, units.Dimensionless
}

func sqrtBuiltin() *Builtin {
	return &Builtin{
		Name: "sqrt", Category: "math", Returns: "a number or vector",
		Doc:    "The square root of x, element-wise. x may carry a unit whose exponents are all even (sqrt(4 mV^2) is 2 mV); x must not be negative.",
		Params: []Param{{Name: "x", Kind: KindNumbers}},
		Fn: func(c *Call) (Value, error) {
			_, d := c.Floats("x")
			var half units.Dim
			for i, e := range d {
				if e%2 != 0 {
					return nil, UnitErrorf("sqrt: %s has no square root in SI units (an exponent is odd)", d.Describe())
				}
				half[i] = e / 2
			}
			return checkDomain("sqrt", mapFloats(c.Value("x"), half, math.Sqrt))
		},
	}
}

func reduce(name, doc string, f func([]float64) float64) *Builtin {
	return &Builtin{
		Name: name, Category: "math", Doc: doc, Returns: "a number in x's unit",
		Params: []Param{{Name: "x", Kind: KindNumbers, Doc: "a vector, or a list of numbers of one dimension"}},
		Fn: func(c *Call) (Value, error) {
			xs, d := c.Floats("x")
			if len(xs) == 0 {
				return nil, ValueErrorf("%s of an empty vector is undefined", name)
			}
			if name == "std" && len(xs) < 2 {
				return nil, ValueErrorf("std needs at least 2 elements, got %d", len(xs))
			}
			return Q(f(xs), d), nil
		},
	}
}

// sumOf adds with Neumaier's compensated summation, so that long sums of
// mixed magnitudes keep their digits.
func sumOf(xs []float64) float64 {
	s, comp := 0.0, 0.0
	for _, x := range xs {
		t := s + x
		if math.Abs(s) >= math.Abs(x) {
			comp += (s - t) + x
		} else {
			comp += (x - t) + s
		}
		s = t
	}
	return s + comp
}

func meanOf(xs []float64) float64 { return sumOf(xs) / float64(len(xs)) }

func minOf(xs []float64) float64 {
	m := xs[0]
	for _, x := range xs {
		if math.IsNaN(x) {
			return x
		}
		m = math.Min(m, x)
	}
	return m
}

func maxOf(xs []float64) float64 {
	m := xs[0]
	for _, x := range xs {
		if math.IsNaN(x) {
			return x
		}
		m = math.Max(m, x)
	}
	return m
}

// stdOf is the two-pass sample standard deviation, stable for data with a
// large mean.
func stdOf(xs []float64) float64 {
	m := meanOf(xs)
	d := make([]float64, len(xs))
	for i, x := range xs {
		d[i] = (x - m) * (x - m)
	}
	return math.Sqrt(sumOf(d) / float64(len(xs)-1))
}

func spanBuiltin() *Builtin {
	return &Builtin{
		Name: "span", Category: "math", Returns: "a vector",
		Doc: "Evenly spaced values from `from` to `to`, both included: give either the step `by` or the number of points `n`. " +
			"With by, the last value is `to` when it falls on the grid (within a millionth of a step), else the last grid point before it. " +
			"A unit written after the call applies to dimensionless values: span(0, 20, by = 0.5) uA/cm^2.",
		Params: []Param{
			{Name: "from", Kind: KindNumber}, {Name: "to", Kind: KindNumber},
			{Name: "by", Kind: KindNumber, Optional: true, Doc: "the step, same dimension as from"},
			{Name: "n", Kind: KindNumber, Optional: true, Dimensionless: true, Doc: "the number of points, at least 2"},
		},
		Fn: spanFn,
	}
}

func spanFn(c *Call) (Value, error) {
	from, to := c.Quantity("from"), c.Quantity("to")
	if from.Dim != to.Dim {
		return nil, UnitErrorf("span: from is %s but to is %s", from.Dim.Describe(), to.Dim.Describe())
	}
	if c.Has("by") == c.Has("n") {
		return nil, ArgumentErrorf("span: give exactly one of by (the step) or n (the number of points)")
	}
	if math.IsNaN(from.V) || math.IsNaN(to.V) || math.IsInf(from.V, 0) || math.IsInf(to.V, 0) {
		return nil, ValueErrorf("span: from and to must be finite")
	}
	if c.Has("n") {
		n, err := c.Int("n", 2, maxSpan)
		if err != nil {
			return nil, err
		}
		out := make([]float64, n)
		for i := range out {
			out[i] = from.V + (to.V-from.V)*float64(i)/float64(n-1)
		}
		out[n-1] = to.V
		return &Vector{V: out, Dim: from.Dim}, nil
	}
	by := c.Quantity("by")
	if by.Dim != from.Dim {
		return nil, UnitErrorf("span: by is %s but from is %s", by.Dim.Describe(), from.Dim.Describe())
	}
	if by.V == 0 || math.IsNaN(by.V) || (to.V-from.V)/by.V < 0 {
		return nil, ValueErrorf("span: the step %s does not lead from %s to %s", by, from, to)
	}
	steps := math.Floor((to.V-from.V)/by.V + 1e-6)
	if steps+1 > maxSpan {
		return nil, ValueErrorf("span: %.0f points is more than the limit of %d; use a larger step", steps+1, maxSpan)
	}
	out := make([]float64, int(steps)+1)
	for i := range out {
		out[i] = from.V + by.V*float64(i)
	}
	if math.Abs(out[len(out)-1]-to.V) <= 1e-6*math.Abs(by.V) {
		out[len(out)-1] = to.V
	}
	return &Vector{V: out, Dim: from.Dim}, nil
}

// Lener is implemented by values with a length (tables, traces).
type Lener interface{ Len() int }

func lenBuiltin() *Builtin {
	return &Builtin{
		Name: "len", Category: "math", Returns: "a whole number",
		Doc:    "The number of elements of a vector, list, record, string (in characters) or mask, or the number of rows of a table.",
		Params: []Param{{Name: "x", Kind: KindAny}},
		Fn: func(c *Call) (Value, error) {
			switch x := c.Value("x").(type) {
			case *List:
				return Num(float64(len(x.Elems))), nil
			case *Record:
				return Num(float64(len(x.Names))), nil
			case String:
				return Num(float64(len([]rune(string(x))))), nil
			case *Mask:
				return Num(float64(len(x.B))), nil
			case Quantity:
				return Num(1), nil
			case Lener:
				return Num(float64(x.Len())), nil
			}
			return nil, ArgumentErrorf("len: %s has no length", article(c.Value("x").Type()))
		},
	}
}

func seedBuiltin() *Builtin {
	return &Builtin{
		Name: "seed", Category: "session", Returns: "nothing",
		Doc:    "Resets the session's random source to a whole-number seed, so that every later random draw (noise, drawn populations, seeded parameters) repeats exactly. A new session starts as if seed(1) had run.",
		Params: []Param{{Name: "n", Kind: KindNumber, Dimensionless: true}},
		Fn: func(c *Call) (Value, error) {
			n, err := c.Int("n", 0, 1<<53)
			if err != nil {
				return nil, err
			}
			c.session.Seed(uint64(n))
			return nothing, nil
		},
	}
}

func printBuiltin() *Builtin {
	return &Builtin{
		Name: "print", Category: "session", Returns: "nothing",
		Doc:    "Writes the plain-text form of each value to the cell's output, separated by spaces, then a newline. Strings are written without quotes.",
		Params: []Param{{Name: "values", Kind: KindAny, Rest: true}},
		Fn: func(c *Call) (Value, error) {
			parts := make([]string, len(c.Rest()))
			for i, v := range c.Rest() {
				if s, ok := v.(String); ok {
					parts[i] = string(s)
				} else {
					parts[i] = v.String()
				}
			}
			c.Print(strings.Join(parts, " ") + "\n")
			return nothing, nil
		},
	}
}

func showBuiltin() *Builtin {
	return &Builtin{
		Name: "show", Category: "session", Returns: "nothing",
		Doc:    "Shows each value as its own rich output now, as the last expression of a cell would be shown. Use it to show several results from one cell.",
		Params: []Param{{Name: "values", Kind: KindAny, Rest: true}},
		Fn: func(c *Call) (Value, error) {
			for _, v := range c.Rest() {
				bs, err := Show(v)
				if err != nil {
					return nil, err
				}
				for _, b := range bs {
					c.Display(b, "", false)
				}
			}
			return nothing, nil
		},
	}
}

func assertBuiltin() *Builtin {
	return &Builtin{
		Name: "assert", Category: "session", Returns: "nothing",
		Doc:    "Fails the cell with the message unless cond is true. Notebooks use it to check a result stays what it was (a regression guard).",
		Params: []Param{{Name: "cond", Kind: KindBool}, {Name: "message", Kind: KindString, Default: `"assertion failed"`}},
		Fn: func(c *Call) (Value, error) {
			if !c.Bool("cond") {
				return nil, ValueErrorf("%s", c.Str("message"))
			}
			return nothing, nil
		},
	}
}

// Doc is a text value (help, a language reference page); it shows as plain
// text and as Markdown.
type Doc struct{ Title, Text string }

// Type implements Value.
func (Doc) Type() string { return "help text" }

// String is the text.
func (d Doc) String() string { return d.Text }

// Show implements Shower.
func (d Doc) Show() ([]display.Bundle, error) {
	md := "#### " + d.Title + "\n\n```\n" + d.Text + "\n```\n"
	return []display.Bundle{display.Text(d.Text).With(display.MIMEMarkdown, md)}, nil
}

func helpBuiltin(r *Registry) *Builtin {
	return &Builtin{
		Name: "help", Category: "session", Returns: "help text",
		Doc:    "Shows the declaration of a builtin or formula: its signature with units and defaults, what it does, its parameters and the published source it follows. help() with no argument lists every builtin by category.",
		Params: []Param{{Name: "f", Kind: KindAny, Optional: true}},
		Fn: func(c *Call) (Value, error) {
			switch f := c.Value("f").(type) {
			case nil:
				return Doc{"Builtins", overview(r)}, nil
			case *Builtin:
				return Doc{f.Name, f.Help()}, nil
			case *Formula:
				return Doc{f.Name, f.String() + "\n\nvariables: " + strings.Join(f.Vars, ", ") + "\nparameters: " + strings.Join(f.Params, ", ") + "\n"}, nil
			case Helper:
				return Doc{c.Value("f").Type(), f.Help()}, nil
			default:
				return Doc{f.Type(), fmt.Sprintf("%s: %s", f.Type(), f.String())}, nil
			}
		},
	}
}

// Helper is implemented by values with a help text of their own (models).
type Helper interface{ Help() string }

func overview(r *Registry) string {
	var b strings.Builder
	cat, width := "", 0
	for _, f := range r.Builtins() {
		width = max(width, len(f.Name))
	}
	for _, f := range r.Builtins() {
		if f.Category != cat {
			cat = f.Category
			fmt.Fprintf(&b, "\n%s:\n", cat)
		}
		doc := f.Doc
		if i := strings.Index(doc, ". "); i > 0 {
			doc = doc[:i+1]
		}
		fmt.Fprintf(&b, "  %-*s  %s\n", width, f.Name, doc)
	}
	b.WriteString("\nhelp(name) shows one in full.\n")
	return strings.TrimLeft(b.String(), "\n")
}

// Clearer is implemented by outputs that can clear what a cell has shown
// so far (a notebook front end can; a log cannot).
type Clearer interface{ ClearOutput(wait bool) }

func clearBuiltin() *Builtin {
	return &Builtin{
		Name: "clear", Category: "session", Returns: "nothing",
		Doc:    "Clears what this cell has shown so far. With wait = true the old output stays until the next output replaces it, which avoids flicker when a loop of cells redraws a figure.",
		Params: []Param{{Name: "wait", Kind: KindBool, Default: "false"}},
		Fn: func(c *Call) (Value, error) {
			if cl, ok := c.out.(Clearer); ok {
				cl.ClearOutput(c.Bool("wait"))
			}
			return nothing, nil
		},
	}
}
