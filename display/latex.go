package display

import (
	"html"
	"strings"
	"unicode/utf8"
)

// latexNames maps LaTeX commands to the Unicode text shown for them when
// an equation is rendered without a typesetter.
var latexNames = map[string]string{
	"alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "varepsilon": "ε",
	"zeta": "ζ", "eta": "η", "theta": "θ", "kappa": "κ", "lambda": "λ", "mu": "μ", "nu": "ν",
	"xi": "ξ", "pi": "π", "rho": "ρ", "sigma": "σ", "tau": "τ", "phi": "φ", "varphi": "φ",
	"chi": "χ", "psi": "ψ", "omega": "ω", "Gamma": "Γ", "Delta": "Δ", "Theta": "Θ",
	"Lambda": "Λ", "Sigma": "Σ", "Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
	"cdot": "·", "times": "×", "le": "≤", "leq": "≤", "ge": "≥", "geq": "≥", "neq": "≠",
	"approx": "≈", "infty": "∞", "sum": "Σ", "int": "∫", "partial": "∂", "pm": "±",
	"to": "→", "rightarrow": "→", "leftarrow": "←", "gets": "←", "prime": "′", "ldots": "…",
	"cdots": "⋯", "in": "∈", "propto": "∝", "sim": "∼", "equiv": "≡", "nabla": "∇",
	",": " ", ";": " ", ":": " ", "quad": "  ", "qquad": "    ", "!": "", " ": " ",
	"{": "{", "}": "}", "%": "%", "_": "_", "&": "&", "#": "#", "\\": " ", "left": "", "right": "",
}

// latexOperators are the function names LaTeX sets upright (\log, \max …);
// they are shown as words, separated by a space from an operand before them.
var latexOperators = map[string]bool{
	"exp": true, "ln": true, "log": true, "lg": true, "sin": true, "cos": true, "tan": true,
	"sinh": true, "cosh": true, "tanh": true, "arcsin": true, "arccos": true, "arctan": true,
	"max": true, "min": true, "sup": true, "inf": true, "lim": true, "det": true, "arg": true,
}

// latexRelations are the commands shown with a space on either side.
var latexRelations = map[string]bool{
	"le": true, "leq": true, "ge": true, "geq": true, "neq": true, "approx": true, "equiv": true,
	"to": true, "rightarrow": true, "leftarrow": true, "gets": true, "in": true, "propto": true,
	"sim": true,
}

// latexAccents maps accent commands to combining marks.
var latexAccents = map[string]string{"dot": "\u0307", "ddot": "\u0308", "bar": "\u0304", "hat": "\u0302", "tilde": "\u0303", "vec": "\u20d7"}

// latexText renders LaTeX as readable plain text: τ_m dV/dt = −(V − E_L).
func latexText(s string) string { return strings.TrimSpace(renderLatex(s, false)) }

// LatexText renders a LaTeX formula as readable plain text (Greek letters,
// sub- and superscripts in Unicode), as model cards show equations in a
// console; doc strings use it too.
func LatexText(s string) string { return latexText(s) }

// latexHTML renders LaTeX as HTML with <sub>, <sup> and Unicode symbols.
func latexHTML(s string) string { return strings.TrimSpace(renderLatex(s, true)) }

func renderLatex(s string, asHTML bool) string {
	p := latexParser{src: s, html: asHTML}
	return p.sequence(func() bool { return false })
}

// latexParser is a small reader of the subset of LaTeX found in model
// equations; anything it does not know is shown as written. operand says
// whether the text emitted last in the current group ends in an operand
// (a letter, digit, closing bracket or script), which makes a following
// + or − binary and separates a following function name by a space.
type latexParser struct {
	src     string
	pos     int
	html    bool
	operand bool
}

// sequence renders atoms until the end of the source or until stop reports
// true, joining them with emit. It starts a fresh operand context, so a
// leading minus in a group or a cell is unary.
func (p *latexParser) sequence(stop func() bool) string {
	var b strings.Builder
	p.operand = false
	for p.pos < len(p.src) && !stop() {
		p.emit(&b, p.atom())
	}
	return b.String()
}

// emit appends piece, dropping its leading spaces after a space or an
// opening bracket (so spaced operators never double the source's own
// spaces), and records whether the result now ends in an operand.
func (p *latexParser) emit(b *strings.Builder, piece string) {
	if strings.HasPrefix(piece, " ") {
		out := b.String()
		if out == "" || strings.HasSuffix(out, " ") || strings.ContainsAny(out[len(out)-1:], "([{") {
			piece = strings.TrimLeft(piece, " ")
		}
	}
	b.WriteString(piece)
	if end := strings.TrimRight(piece, " "); end != "" {
		p.operand = endsInOperand(end, p.html)
	}
}

// endsInOperand reports whether rendered text ends in an operand. In HTML a
// closing </sub> or </sup> ends a script, and the escapes of <, > and &
// are operators.
func endsInOperand(s string, asHTML bool) bool {
	if asHTML {
		if strings.HasSuffix(s, "</sub>") || strings.HasSuffix(s, "</sup>") {
			return true
		}
		for _, e := range []string{"&lt;", "&gt;", "&amp;"} {
			if strings.HasSuffix(s, e) {
				return false
			}
		}
	}
	r, _ := utf8.DecodeLastRuneInString(s)
	return !strings.ContainsRune("([{=<>+−-*/·×±,;:&≤≥≠≈≡→←∈∝∼", r)
}

// atom renders the next unit: a command, a group, a script or a character.
func (p *latexParser) atom() string {
	c := p.src[p.pos]
	switch c {
	case '\\':
		return p.command()
	case '{':
		return p.group()
	case '}':
		p.pos++
		return ""
	case '_', '^':
		p.pos++
		if p.pos >= len(p.src) {
			return ""
		}
		p.operand = false // a script starts its own expression: x^-1
		return p.script(c, p.atom())
	case '-', '+':
		p.pos++
		sign := "+"
		if c == '-' {
			sign = "−"
		}
		if p.operand {
			return " " + sign + " "
		}
		return sign
	case '=', '<', '>':
		p.pos++
		return " " + p.esc(string(c)) + " "
	}
	r, n := utf8.DecodeRuneInString(p.src[p.pos:])
	p.pos += n
	return p.esc(string(r))
}

func (p *latexParser) esc(s string) string {
	if p.html {
		return html.EscapeString(s)
	}
	return s
}

// group renders {…} up to the matching brace.
func (p *latexParser) group() string {
	p.pos++ // '{'
	s := p.sequence(func() bool { return p.src[p.pos] == '}' })
	if p.pos < len(p.src) {
		p.pos++
	}
	return s
}

// script renders a subscript or superscript. In text, a superscript of
// more than one character other than a plain number is parenthesised
// (e^(az), not e^az); a subscript only when it holds an operator, since
// multi-letter subscripts are labels (V_th).
func (p *latexParser) script(kind byte, body string) string {
	if p.html {
		if kind == '_' {
			return "<sub>" + body + "</sub>"
		}
		return "<sup>" + body + "</sup>"
	}
	long := utf8.RuneCountInString(body) > 1
	if long && (strings.ContainsAny(body, " +−*/·=") || kind == '^' && strings.Trim(body, "0123456789.") != "") {
		body = "(" + body + ")"
	}
	return string(kind) + body
}

// command renders \name and its arguments.
func (p *latexParser) command() string {
	p.pos++ // '\'
	start := p.pos
	for p.pos < len(p.src) && isLetter(p.src[p.pos]) {
		p.pos++
	}
	if p.pos == start && p.pos < len(p.src) {
		p.pos++ // a one-character command such as \, or \{
	}
	name := p.src[start:p.pos]
	switch name {
	case "frac":
		return p.fraction()
	case "sqrt":
		return "√(" + p.arg() + ")"
	case "operatorname":
		return p.operator(p.arg())
	case "mathrm", "text", "mathit", "mathbf", "textrm", "mathsf":
		return p.arg()
	case "begin":
		return p.environment(p.arg())
	case "end":
		p.arg() // an \end without its \begin: drop it
		return ""
	}
	if mark, ok := latexAccents[name]; ok {
		return p.arg() + mark
	}
	if latexOperators[name] {
		return p.operator(name)
	}
	if s, ok := latexNames[name]; ok {
		if latexRelations[name] {
			return " " + p.esc(s) + " "
		}
		return p.esc(s)
	}
	return p.esc("\\" + name)
}

// operator renders a function name, after a space when it follows an
// operand: (1/a) log(…), 2 sin x.
func (p *latexParser) operator(name string) string {
	if p.operand {
		return " " + name
	}
	return name
}

// fraction renders \frac{num}{den} as num/den, each part in parentheses
// when it has more than one term, and the whole in parentheses when an
// operand follows at once (\frac{1}{a}\log x reads (1/a) log x, not
// 1/a log x).
func (p *latexParser) fraction() string {
	num, den := p.arg(), p.arg()
	s := p.wrap(num) + "/" + p.wrap(den)
	if p.pos < len(p.src) && startsOperand(p.src[p.pos:]) {
		s = "(" + s + ")"
	}
	return s
}

// startsOperand reports whether source text begins with an operand: a
// letter, digit, bracket or a command that is not a relation or spacing.
func startsOperand(s string) bool {
	c := s[0]
	if c == '\\' {
		n := 1
		for n < len(s) && isLetter(s[n]) {
			n++
		}
		name := s[1:n]
		return name != "" && !latexRelations[name] && !latexNonOperands[name]
	}
	return isLetter(c) || c >= '0' && c <= '9' || c == '(' || c == '{' || c == '['
}

// latexNonOperands are the letter commands, other than relations, that
// cannot start an operand (spacing, binary operators, environment ends).
var latexNonOperands = map[string]bool{
	"quad": true, "qquad": true, "cdot": true, "times": true, "pm": true, "end": true, "right": true,
}

// environment renders \begin{name}…\end{name}. A cases environment
// becomes "value if condition; …"; any other is shown as its body.
func (p *latexParser) environment(name string) string {
	atEnd := func() bool { return strings.HasPrefix(p.src[p.pos:], `\end`) }
	var s string
	if name == "cases" {
		s = p.cases(atEnd)
	} else {
		s = p.sequence(atEnd)
	}
	if atEnd() {
		p.pos += len(`\end`)
		p.arg()
	}
	p.operand = true
	return s
}

// cases renders the rows of a cases environment: cells are separated by
// & and rows by \\; each row reads "value if condition".
func (p *latexParser) cases(atEnd func() bool) string {
	var rows []string
	for p.pos < len(p.src) && !atEnd() {
		value := p.cell(atEnd)
		row := strings.TrimSpace(value)
		if p.pos < len(p.src) && p.src[p.pos] == '&' {
			p.pos++
			if cond := strings.TrimSpace(p.cell(atEnd)); cond != "" {
				row += " if " + cond
			}
		}
		if strings.HasPrefix(p.src[p.pos:], `\\`) {
			p.pos += 2
		}
		if row != "" {
			rows = append(rows, row)
		}
	}
	return strings.Join(rows, "; ")
}

// cell renders one cell of a cases row, up to &, \\ or \end.
func (p *latexParser) cell(atEnd func() bool) string {
	return p.sequence(func() bool {
		return atEnd() || p.src[p.pos] == '&' || strings.HasPrefix(p.src[p.pos:], `\\`)
	})
}

// arg renders the next argument: a braced group or one atom.
func (p *latexParser) arg() string {
	for p.pos < len(p.src) && p.src[p.pos] == ' ' {
		p.pos++
	}
	if p.pos >= len(p.src) {
		return ""
	}
	return p.atom()
}

// wrap puts parentheses around a fraction part of more than one term.
func (p *latexParser) wrap(s string) string {
	if strings.ContainsAny(s, " +−") {
		return "(" + strings.TrimSpace(s) + ")"
	}
	return s
}

func isLetter(c byte) bool { return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' }
