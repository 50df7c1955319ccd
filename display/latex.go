package display

import (
	"html"
	"strings"
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
	"exp": "exp", "ln": "ln", "log": "log", "sin": "sin", "cos": "cos", "tanh": "tanh",
	"max": "max", "min": "min",
	",": " ", ";": " ", ":": " ", "quad": "  ", "qquad": "    ", "!": "", " ": " ",
	"{": "{", "}": "}", "%": "%", "_": "_", "&": "&", "#": "#", "\\": " ", "left": "", "right": "",
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
	var b strings.Builder
	for p.pos < len(p.src) {
		b.WriteString(p.atom())
	}
	return b.String()
}

// latexParser is a small reader of the subset of LaTeX found in model
// equations; anything it does not know is shown as written.
type latexParser struct {
	src  string
	pos  int
	html bool
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
		return p.script(c, p.atom())
	case '-':
		p.pos++
		return "−"
	}
	r := []rune(p.src[p.pos:])[0]
	p.pos += len(string(r))
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
	var b strings.Builder
	for p.pos < len(p.src) && p.src[p.pos] != '}' {
		b.WriteString(p.atom())
	}
	if p.pos < len(p.src) {
		p.pos++
	}
	return b.String()
}

// script renders a subscript or superscript.
func (p *latexParser) script(kind byte, body string) string {
	if p.html {
		if kind == '_' {
			return "<sub>" + body + "</sub>"
		}
		return "<sup>" + body + "</sup>"
	}
	if len([]rune(body)) > 1 && strings.ContainsAny(body, " +−*/·=") {
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
		num, den := p.arg(), p.arg()
		return p.wrap(num) + "/" + p.wrap(den)
	case "sqrt":
		return "√(" + p.arg() + ")"
	case "mathrm", "text", "mathit", "mathbf", "operatorname", "textrm", "mathsf":
		return p.arg()
	}
	if mark, ok := latexAccents[name]; ok {
		return p.arg() + mark
	}
	if s, ok := latexNames[name]; ok {
		return p.esc(s)
	}
	return p.esc("\\" + name)
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
