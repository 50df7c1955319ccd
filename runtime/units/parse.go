package units

import (
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Error is a unit that cannot be parsed. Offset is the byte offset in Text
// of the part at fault, so that a caller can point at it; Suggestion, when
// not empty, is a known spelling close to an unknown name.
type Error struct {
	Text       string
	Offset     int
	Msg        string
	Suggestion string
}

// Error returns the message prefixed with the package name.
func (e *Error) Error() string { return "units: " + e.Msg }

// Parse reads a unit: a name with an optional prefix ("ms", "uA", "MOhm"),
// raised to an optional integer power ("cm^2", "s^-1", or "cm²" in
// superscripts), such atoms joined
// with "/" and "*" (or "·") from left to right, so that "mV/ms/cm" is
// mV·ms⁻¹·cm⁻¹, and optionally a leading "1/" as in "1/ms". Spaces around
// operators are ignored. A power applies to the prefixed atom: "cm^2" is
// 10⁻⁴ m². The text "1" alone is the dimensionless unit.
//
// The degree Celsius ("degC", "°C") is accepted only on its own, since it
// names a point on a scale rather than an amount: a temperature of 6.3 °C is
// stored as 279.45 K. Write temperature differences and rates in K ("K/s").
//
// On failure the error is an *Error whose message says what is wrong and
// suggests a close spelling for an unknown name.
func Parse(text string) (Unit, error) {
	if a, ok := atoms[text]; ok { // the common case: a single name
		return a.unit(), nil
	}
	p := parser{text: text}
	return p.parse()
}

// parser holds the state of one Parse call.
type parser struct {
	text string
	pos  int // byte offset of the next rune
	sym  strings.Builder
	mant float64
	p10  int
	dim  Dim
}

func (p *parser) fail(off int, msg string) (Unit, error) {
	return Unit{}, &Error{Text: p.text, Offset: off, Msg: msg}
}

func (p *parser) parse() (Unit, error) {
	p.skipSpace()
	if p.pos == len(p.text) {
		return p.fail(0, "empty unit; write a unit such as ms, mV or uA/cm^2, or 1 for a plain number")
	}
	if u, err, done := p.affineInCompound(); done {
		return u, err
	}
	p.mant = 1
	if p.text[p.pos] == '1' && p.onlyOne() {
		p.pos++
		p.sym.WriteByte('1')
		p.skipSpace()
		if p.pos == len(p.text) {
			return Unit{Symbol: "1", Scale: 1}, nil
		}
		if p.text[p.pos] != '/' {
			return p.fail(p.pos, "expected / after the leading 1 in "+strconv.Quote(p.text)+"; write 1/ms for a rate")
		}
	} else if err := p.term(1); err != nil {
		return Unit{}, err
	}
	for {
		p.skipSpace()
		if p.pos == len(p.text) {
			return p.result()
		}
		sign, ok := p.operator()
		if !ok {
			return p.unexpected()
		}
		p.skipSpace()
		if p.pos == len(p.text) {
			return p.fail(p.pos, "unit "+strconv.Quote(p.text)+" ends after an operator; write a unit after it, as in mV/ms")
		}
		if err := p.term(sign); err != nil {
			return Unit{}, err
		}
	}
}

// affineInCompound reports a degree Celsius that is not alone (Parse has
// already accepted it alone). It is checked first so that "1 degC/s" gets
// the reason rather than a complaint about the syntax.
func (p *parser) affineInCompound() (Unit, error, bool) {
	for _, s := range [...]string{"degC", "°C", "\u2103"} {
		if i := strings.Index(p.text, s); i >= 0 {
			if strings.TrimSpace(p.text) == s {
				u, _ := Lookup(s)
				return u, nil, true
			}
			u, err := p.fail(i, "°C cannot be part of a compound unit such as "+strconv.Quote(p.text)+
				": it is an affine scale (0 °C = 273.15 K), not a multiple of the kelvin; "+
				"write temperature differences and rates in K, as in K/s")
			return u, err, true
		}
	}
	return Unit{}, nil, false
}

// onlyOne reports whether the digit at pos is a lone "1", not "10" or "1.5".
func (p *parser) onlyOne() bool {
	next := p.pos + 1
	return next == len(p.text) || !isDigit(p.text[next]) && p.text[next] != '.'
}

// operator reads "*", "·", "⋅" (sign +1) or "/" (sign -1).
func (p *parser) operator() (int, bool) {
	r, n := utf8.DecodeRuneInString(p.text[p.pos:])
	switch r {
	case '*', '·', '⋅':
		p.pos += n
		p.sym.WriteString("·")
		return 1, true
	case '/':
		p.pos += n
		p.sym.WriteByte('/')
		return -1, true
	}
	return 0, false
}

// term reads an atom with an optional exponent and folds it in with sign.
func (p *parser) term(sign int) error {
	start := p.pos
	for p.pos < len(p.text) {
		r, n := utf8.DecodeRuneInString(p.text[p.pos:])
		if !isAtomRune(r) {
			break
		}
		p.pos += n
	}
	if p.pos == start {
		_, err := p.unexpected()
		return err
	}
	name := p.text[start:p.pos]
	a, ok := atoms[name]
	if !ok {
		return p.unknown(start, name)
	}
	exp, err := p.exponent()
	if err != nil {
		return err
	}
	p.sym.WriteString(a.sym)
	if exp != 1 {
		p.sym.WriteByte('^')
		p.sym.WriteString(strconv.Itoa(exp))
	}
	d, err := a.dim.Pow(exp * sign)
	if err == nil {
		p.dim, err = p.dim.MulChecked(d)
	}
	if err != nil {
		return &Error{Text: p.text, Offset: start, Msg: strings.TrimPrefix(err.Error(), "units: ")}
	}
	p.mant *= math.Pow(a.mant, float64(exp*sign))
	p.p10 += a.p10 * exp * sign
	return nil
}

// exponent reads an optional power: "^n" with an optional sign and spaces
// around the caret ("cm ^ 2"), or superscript digits as pasted from a paper
// ("cm²", "s⁻¹"). Without one the power is 1.
func (p *parser) exponent() (int, error) {
	back := p.pos
	p.skipSpace()
	if p.pos < len(p.text) && p.text[p.pos] == '^' {
		return p.caretPower()
	}
	p.pos = back
	if r, _ := utf8.DecodeRuneInString(p.text[p.pos:]); r == '⁻' || r == '⁺' || superDigit(r) >= 0 {
		return p.superPower()
	}
	return 1, nil
}

func (p *parser) caretPower() (int, error) {
	at := p.pos
	p.pos++
	p.skipSpace()
	neg := false
	if p.pos < len(p.text) && (p.text[p.pos] == '-' || p.text[p.pos] == '+') {
		neg = p.text[p.pos] == '-'
		p.pos++
	}
	start := p.pos
	for p.pos < len(p.text) && isDigit(p.text[p.pos]) {
		p.pos++
	}
	if p.pos == start {
		return 0, &Error{Text: p.text, Offset: at, Msg: "expected an integer after ^ in " + strconv.Quote(p.text) + ", as in cm^2 or s^-1"}
	}
	n, err := strconv.Atoi(p.text[start:p.pos])
	if err != nil || n > 127 {
		return 0, p.tooLarge(start, p.text[start:p.pos])
	}
	if neg {
		n = -n
	}
	return n, nil
}

func (p *parser) superPower() (int, error) {
	start := p.pos
	r, size := utf8.DecodeRuneInString(p.text[p.pos:])
	neg := r == '⁻'
	if r == '⁻' || r == '⁺' {
		p.pos += size
	}
	n, digits := 0, 0
	for p.pos < len(p.text) {
		r, size := utf8.DecodeRuneInString(p.text[p.pos:])
		v := superDigit(r)
		if v < 0 {
			break
		}
		p.pos += size
		if digits++; n <= 127 {
			n = 10*n + v
		}
	}
	if digits == 0 {
		return 0, &Error{Text: p.text, Offset: start, Msg: "expected superscript digits after the superscript sign in " +
			strconv.Quote(p.text) + ", or write the power as s^-1"}
	}
	if n > 127 {
		return 0, p.tooLarge(start, p.text[start:p.pos])
	}
	if neg {
		n = -n
	}
	return n, nil
}

// superDigit returns the value of a superscript digit, or -1.
func superDigit(r rune) int {
	switch {
	case r == '⁰':
		return 0
	case r == '¹':
		return 1
	case r == '²':
		return 2
	case r == '³':
		return 3
	case r >= '⁴' && r <= '⁹':
		return int(r-'⁴') + 4
	}
	return -1
}

func (p *parser) tooLarge(off int, exp string) error {
	return &Error{Text: p.text, Offset: off, Msg: "exponent " + exp + " in " + strconv.Quote(p.text) +
		" is too large; an exponent must lie between -127 and 127"}
}

// result finishes the unit, checking that the scale is a usable float64.
func (p *parser) result() (Unit, error) {
	scale := p.mant * math.Pow10(p.p10)
	if scale == 0 || math.IsInf(scale, 0) || math.IsNaN(scale) {
		return p.fail(0, "the scale of "+strconv.Quote(p.text)+" is beyond the range of float64; use smaller prefixes or powers")
	}
	return Unit{Symbol: p.sym.String(), Scale: scale, Dim: p.dim}, nil
}

// unexpected reports the rune at pos, which starts no term or operator.
func (p *parser) unexpected() (Unit, error) {
	r, _ := utf8.DecodeRuneInString(p.text[p.pos:])
	if isAtomRune(r) {
		return p.fail(p.pos, "missing operator before "+strconv.Quote(p.text[p.pos:])+" in "+strconv.Quote(p.text)+
			"; join units with * or /, as in mV*ms")
	}
	if isDigit(byte(r)) || r == '.' || r == '-' || r == '+' {
		return p.fail(p.pos, "unexpected number in "+strconv.Quote(p.text)+
			"; a unit has no numeric factor (only a leading 1/ is allowed) and exponents follow ^, as in cm^2")
	}
	return p.fail(p.pos, "unexpected "+strconv.QuoteRune(r)+" in "+strconv.Quote(p.text)+
		"; a unit is names such as mV joined by * and /, with powers such as cm^2")
}

// unknown reports a name that is no unit, with a suggestion when one is close.
func (p *parser) unknown(off int, name string) error {
	e := &Error{Text: p.text, Offset: off}
	where := ""
	if strings.TrimSpace(p.text) != name {
		where = " in " + p.text
	}
	if pr, ok := prefixOnly[name]; ok {
		e.Msg = name + " is the prefix " + pr.name + ", not a unit" + where + "; put a unit after it, as in " + pr.spell + "s"
		return e
	}
	e.Suggestion = suggest(name)
	if e.Suggestion != "" {
		e.Msg = "unknown unit " + name + where + "; did you mean " + e.Suggestion + "?"
	} else {
		e.Msg = "unknown unit " + name + where + "; write a unit such as ms, mV, nA, uS or uA/cm^2"
	}
	return e
}

func (p *parser) skipSpace() {
	for p.pos < len(p.text) {
		r, n := utf8.DecodeRuneInString(p.text[p.pos:])
		if !unicode.IsSpace(r) {
			return
		}
		p.pos += n
	}
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// isAtomRune reports whether r may be part of a unit name: a letter (which
// covers µ, μ and Ω) or the degree sign.
func isAtomRune(r rune) bool { return unicode.IsLetter(r) || r == '°' || r == '\u2103' }
