package syntax

import (
	"math"
	"strings"
	"testing"
)

// within reports whether got is within abs or rel of want (either suffices).
func within(got, want, abs, rel float64) bool {
	if got == want {
		return true
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

// The expected trees follow the grammar in the package's design brief.
// Operator precedence follows common practice in mathematics and in most
// programming languages: '^' binds tighter than unary minus (so -2^2 is
// -(2^2) = -4, as in standard mathematical notation) and is
// right-associative (2^3^2 = 2^(3^2)); '*' '/' bind tighter than '+' '-'.
// Unit spellings (uA/cm^2, s^-1, µs, Ω, °C) follow the SI Brochure, 9th
// edition (BIPM 2019), section 5, written in plain text with '^' for
// exponents and '/' for division.
var parseTests = []struct {
	name, src, want string
}{
	{"empty", "", ""},
	{"blank and comments", "\n  # only a comment\n\n", ""},
	{"number", "20", "20"},
	{"fraction forms", "[.5, 5., 1e-3, 2.5E+4]", "(list .5 5. 1e-3 2.5E+4)"},
	{"string", `"a\"b\\c\n\t\u{3bc}"`, `"a\"b\\c\n\tμ"`},
	{"bools", "[true, false]", "(list true false)"},
	{"bind", "x = 1", "(= x 1)"},
	{"two statements", "x = 1\ny = x", "(= x 1)\n(= y x)"},
	{"sum left assoc", "a - b - c", "(- (- a b) c)"},
	{"term over sum", "a + b * c / d", "(+ a (/ (* b c) d))"},
	{"neg power", "-2^2", "(- (^ 2 2))"},
	{"power right assoc", "2^3^2", "(^ 2 (^ 3 2))"},
	{"power neg exponent", "2^-1", "(^ 2 (- 1))"},
	{"unary plus dropped", "+x", "x"},
	{"double neg", "--x", "(- (- x))"},
	{"cmp below sum", "a + 1 < b * 2", "(< (+ a 1) (* b 2))"},
	{"all comparisons", "[a == b, a != b, a <= b, a >= b, a > b]", "(list (== a b) (!= a b) (<= a b) (>= a b) (> a b))"},
	{"bool precedence", "not a and b or c", "(or (and (not a) b) c)"},
	{"not of cmp", "not a < b", "(not (< a b))"},
	{"cond", "if a > 0 then 1 else 2", "(if (> a 0) 1 2)"},
	{"cond nested", "if a then b else if c then d else e", "(if a b (if c d e))"},
	{"cond in parens", "1 + (if a then 2 else 3)", "(+ 1 (paren (if a 2 3)))"},
	{"unit", "20 ms", "(unit 20 ms)"},
	{"unit adjacent", "20ms", "(unit 20 ms)"},
	{"unit negative", "-65 mV", "(- (unit 65 mV))"},
	{"unit compound", "10 uA/cm^2", "(unit 10 uA/cm^2)"},
	{"unit neg exponent", "1 s^-1", "(unit 1 s^-1)"},
	{"unit product", "3 kg*m/s^2", "(unit 3 kg*m/s^2)"},
	{"unit micro sign", "5 µs + 2 μs", "(+ (unit 5 µs) (unit 2 μs))"},
	{"unit ohm degree", "[1 MΩ, 6.3 °C]", "(list (unit 1 MΩ) (unit 6.3 °C))"},
	{"unit eV not exponent", "1eV", "(unit 1 eV)"},
	{"division by name", "10 mV / tau", "(/ (unit 10 mV) tau)"},
	{"unit then division", "10 mV/ms / 2", "(/ (unit 10 mV/ms) 2)"},
	{"slash not adjacent right", "10 mV/ tau", "(/ (unit 10 mV) tau)"},
	{"unit then power", "(2 ms)^2", "(^ (paren (unit 2 ms)) 2)"},
	{"unit squared", "2 ms^2", "(unit 2 ms^2)"},
	{"fractional exponent is power", "2 ms^2.5", "(^ (unit 2 ms) 2.5)"},
	{"list unit", "[1, 2, 3] pA", "(unit (list 1 2 3) pA)"},
	{"call unit", "span(0, 20, by = 0.5) uA/cm^2", "(unit (call span 0 20 (= by 0.5)) uA/cm^2)"},
	{"in", "x in mV", "(in x mV)"},
	{"in compound", "r.v in mV/ms", "(in (. r v) mV/ms)"},
	{"in below cmp", "a in mV < 3", "(< (in a mV) 3)"},
	{"name unit", "tau ms", "(unit tau ms)"},
	{"call", "f()", "(call f)"},
	{"call args", "simulate(squid, kick, duration = 150 ms)", "(call simulate squid kick (= duration (unit 150 ms)))"},
	{"call trailing comma", "f(a, b,)", "(call f a b)"},
	{"field chain", "r.v.t", "(. (. r v) t)"},
	{"index", "x[i + 1]", "(index x (+ i 1))"},
	{"index cond", "t[t.rate > 10 Hz]", "(index t (> (. t rate) (unit 10 Hz)))"},
	{"postfix chain", "f(x).y[0](z)", "(call (index (. (call f x) y) 0) z)"},
	{"empty record", "()", "(record)"},
	{"record", "(a = 1, b = 2 ms,)", "(record (= a 1) (= b (unit 2 ms)))"},
	{"paren", "(a + b) * c", "(* (paren (+ a b)) c)"},
	{"empty list", "[]", "(list)"},
	{"formula", "formula sat(I; rmax, half, slope) = rmax * logistic((I - half) / slope)",
		"(formula sat (I) (rmax half slope) (* rmax (call logistic (/ (paren (- I half)) slope))))"},
	{"formula no params", "formula sq(x) = x^2", "(formula sq (x) () (^ x 2))"},
	{"formula only params", "formula c(; a) = a", "(formula c () (a) a)"},
	{"formula empty", "formula k() = 1", "(formula k () () 1)"},
	{"multi-line call", "f(1,\n  2,\n  n = 3\n)", "(call f 1 2 (= n 3))"},
	{"multi-line list", "[\n 1,\n 2\n]", "(list 1 2)"},
	{"multi-line record", "p = (\n  a = 1,\n  b = 2\n)", "(= p (record (= a 1) (= b 2)))"},
	{"continued operator", "x = 1 +\n  2", "(= x (+ 1 2))"},
	{"continued assign", "x =\n  2", "(= x 2)"},
	{"continued if", "if a\nthen b\nelse c", "(if a b c)"},
	{"continued then else", "if\n a then\n b else\n c", "(if a b c)"},
	{"continued and", "a and\nb", "(and a b)"},
	{"continued in", "x in\nmV", "(in x mV)"},
	{"newline ends stmt", "a\n-b", "a\n(- b)"},
	{"unit not across lines", "x = 5\nms", "(= x 5)\nms"},
	{"comment after code", "x = 1 # one\n# two\ny = 2", "(= x 1)\n(= y 2)"},
	{"crlf", "x = 1\r\ny = 2\r\n", "(= x 1)\n(= y 2)"},
	{"keywords not names", "a or b", "(or a b)"},
	{"unicode names", "τ_m = 20 ms", "(= τ_m (unit 20 ms))"},
}

func TestParse(t *testing.T) {
	t.Parallel()
	for _, tc := range parseTests {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Parse("t", tc.src)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tc.src, err)
			}
			if got := FormatFile(f); got != tc.want {
				t.Errorf("Parse(%q)\n got %s\nwant %s", tc.src, got, tc.want)
			}
		})
	}
}

func TestParseExpr(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name, src, want string
		ok              bool
	}{
		{"plain", "a + 2 ms", "(+ a (unit 2 ms))", true},
		{"newlines around", "\n a \n", "a", true},
		// Completion parses the text before the cursor: the partial tree
		// must keep the call and its arguments, and the open field.
		{"open call", "simulate(squid, dur", "(call simulate squid dur)", false},
		{"open field", "r.", "(. r )", false},
		{"open in", "x in ", "(in x )", false},
		{"two exprs", "a b c", "(unit a b)", false},
		{"empty", "", "(bad)", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			x, err := ParseExpr(tc.src)
			if (err == nil) != tc.ok {
				t.Errorf("ParseExpr(%q) error = %v, want ok = %v", tc.src, err, tc.ok)
			}
			if got := Format(x); got != tc.want {
				t.Errorf("ParseExpr(%q) = %s, want %s", tc.src, got, tc.want)
			}
		})
	}
}

func TestNumberValues(t *testing.T) {
	t.Parallel()
	// Reference values: decimal literals as defined by IEEE 754-2019
	// section 5.12 (correctly rounded conversion), written here as exact
	// binary64 values. The tolerance is zero: the conversion must be the
	// correctly rounded one, so any difference is a bug.
	cases := []struct {
		src  string
		want float64
	}{
		{"20", 20}, {"1.5", 1.5}, {".5", 0.5}, {"5.", 5}, {"1e-3", 0.001},
		{"2.5E+4", 25000}, {"0.1", 0.1}, {"1.7976931348623157e308", math.MaxFloat64},
		{"4.9e-324", math.SmallestNonzeroFloat64}, {"1e-400", 0},
	}
	for _, tc := range cases {
		x, err := ParseExpr(tc.src)
		if err != nil {
			t.Errorf("ParseExpr(%q): %v", tc.src, err)
			continue
		}
		n, ok := x.(*NumberLit)
		if !ok || !within(n.Value, tc.want, 0, 0) || n.Raw != tc.src {
			t.Errorf("ParseExpr(%q) = %#v, want value %g", tc.src, x, tc.want)
		}
	}
	// IEEE 754 binary64 tops out near 1.8e308, so 1e999 cannot be held.
	if _, err := ParseExpr("1e999"); err == nil || !strings.Contains(err.Error(), "number 1e999 is out of range") {
		t.Errorf("ParseExpr(1e999) error = %v, want out of range", err)
	}
}

func TestNestingBounded(t *testing.T) {
	t.Parallel()
	for _, src := range []string{
		strings.Repeat("(", 400) + "1" + strings.Repeat(")", 400),
		strings.Repeat("[", 5000),
		strings.Repeat("-", 1000) + "1",
		strings.Repeat("not ", 1000) + "a",
		strings.Repeat("2^", 1000) + "2",
		strings.Repeat("if a then ", 1000) + "1",
		strings.Repeat("f(", 1000),
	} {
		_, err := Parse("t", src)
		if err == nil || !strings.Contains(err.Error(), "nested too deeply (more than 300 levels)") {
			t.Errorf("Parse(%.20q...) error = %v, want nesting error", src, err)
		}
	}
	// 299 brackets inside the top-level expression stay within the bound.
	src := strings.Repeat("(", 299) + "1" + strings.Repeat(")", 299)
	if _, err := Parse("t", src); err != nil {
		t.Errorf("299 nested brackets: %v", err)
	}
}
