package display

import (
	"fmt"
	"html"
	"strings"
)

// Param is one row of a model card's parameter table. Symbol is LaTeX
// (`\tau_m`); Value is in Unit; Note is a description or the source of the
// value.
type Param struct {
	Name   string
	Symbol string
	Value  float64
	Unit   string
	Note   string
}

// Card is a model card or a fit summary: a title, a short description,
// equations as LaTeX strings (without delimiters), a parameter table and a
// source citation line. Digits is the significant digits of parameter
// values (0 means DefaultDigits).
type Card struct {
	Title       string
	Description string
	Equations   []string
	Params      []Param
	Source      string
	Digits      int
}

// Validate reports a card without a title, or a parameter without a name.
func (c *Card) Validate() error {
	if c == nil {
		return fmt.Errorf("display: card is nil; build a display.Card with a title")
	}
	if strings.TrimSpace(c.Title) == "" {
		return fmt.Errorf("display: card has no title; give the model or fit a name")
	}
	for i, p := range c.Params {
		if p.Name == "" {
			return fmt.Errorf("display: card %q: parameter %d has no name; name every parameter", c.Title, i+1)
		}
	}
	return nil
}

// Text renders the card as plain text, equations in readable Unicode.
func (c *Card) Text() (string, error) {
	if err := c.Validate(); err != nil {
		return "", err
	}
	var b strings.Builder
	b.WriteString(c.Title + "\n")
	if c.Description != "" {
		b.WriteString(c.Description + "\n")
	}
	for _, eq := range c.Equations {
		b.WriteString("    " + latexText(eq) + "\n")
	}
	if len(c.Params) > 0 {
		t, _ := c.paramTable(func(s string) string { return latexText(s) }).Text()
		t = t[:strings.LastIndex(t, "\n")] // the size footer says nothing here
		b.WriteString(t + "\n")
	}
	if c.Source != "" {
		b.WriteString("Source: " + c.Source + "\n")
	}
	return strings.TrimRight(b.String(), "\n"), nil
}

// paramTable is the parameter table; sym renders a LaTeX symbol.
func (c *Card) paramTable(sym func(string) string) *Table {
	n := len(c.Params)
	names, syms, units, notes := make([]string, n), make([]string, n), make([]string, n), make([]string, n)
	for i, p := range c.Params {
		names[i], syms[i], units[i], notes[i] = p.Name, sym(p.Symbol), p.Unit, p.Note
	}
	t := &Table{Head: n, Tail: 1}
	t.Columns = []Column{Texts("parameter", names), Texts("symbol", syms)}
	// One precision for all values would make 0.1 mV and 1e-9 F unreadable,
	// so each value is formatted alone.
	vals := make([]string, n)
	for i, p := range c.Params {
		vals[i] = strings.ReplaceAll(FormatNumber(p.Value, c.Digits), "−", "-")
	}
	t.Columns = append(t.Columns, Texts("value", vals), Texts("unit", units), Texts("note", notes))
	return t
}

// Markdown renders the card as Markdown with each equation in a $$ … $$
// display block, for front ends that typeset LaTeX.
func (c *Card) Markdown() (string, error) {
	if err := c.Validate(); err != nil {
		return "", err
	}
	var b strings.Builder
	b.WriteString("**" + mdEscape(c.Title) + "**\n\n")
	if c.Description != "" {
		b.WriteString(mdEscape(c.Description) + "\n\n")
	}
	for _, eq := range c.Equations {
		b.WriteString("$$ " + eq + " $$\n\n")
	}
	if len(c.Params) > 0 {
		b.WriteString("| parameter | symbol | value | unit | note |\n|---|---|---:|---|---|\n")
		for _, p := range c.Params {
			sym := ""
			if p.Symbol != "" {
				sym = "$" + p.Symbol + "$"
			}
			fmt.Fprintf(&b, "| %s | %s | %s | %s | %s |\n", mdCell(p.Name), sym, FormatNumber(p.Value, c.Digits), mdCell(p.Unit), mdCell(p.Note))
		}
		b.WriteString("\n")
	}
	if c.Source != "" {
		b.WriteString("*Source:* " + mdEscape(c.Source) + "\n")
	}
	return strings.TrimRight(b.String(), "\n") + "\n", nil
}

// mdEscape keeps Markdown from reading our text as markup.
func mdEscape(s string) string {
	return strings.NewReplacer(`\`, `\\`, "*", `\*`, "_", `\_`, "`", "\\`", "|", `\|`, "<", "&lt;").Replace(s)
}

func mdCell(s string) string { return mdEscape(strings.ReplaceAll(s, "\n", " ")) }

// HTML renders the card as an HTML fragment with inline styles only. Each
// equation is shown as readable HTML (Greek letters, sub- and superscripts,
// fractions as a/b); its LaTeX follows inside \( … \) in a collapsed
// details element, which front ends with MathJax typeset and others show
// as source.
func (c *Card) HTML() (string, error) {
	if err := c.Validate(); err != nil {
		return "", err
	}
	var b strings.Builder
	b.WriteString(`<div class="loligo-card" style="border-left:3px solid ` + hexColour(Palette[0]) + `;padding:0.3em 0.9em;margin:0.3em 0">` + "\n")
	b.WriteString(`<div style="font-weight:600;font-size:1.05em">` + html.EscapeString(c.Title) + "</div>\n")
	if c.Description != "" {
		b.WriteString(`<div style="margin:0.2em 0 0.4em 0">` + html.EscapeString(c.Description) + "</div>\n")
	}
	for _, eq := range c.Equations {
		b.WriteString(`<div style="margin:0.3em 0 0.3em 1.2em;font-family:serif;font-size:1.08em">` + latexHTML(eq) + "</div>\n")
		b.WriteString(`<details style="margin:0 0 0.3em 1.2em;font-size:0.85em;opacity:0.8"><summary>LaTeX</summary>\(` +
			html.EscapeString(eq) + `\)</details>` + "\n")
	}
	if len(c.Params) > 0 {
		h, _ := c.paramTable(latexHTML).HTML()
		// Symbols are already HTML; the table escaped them once more.
		b.WriteString(unescapeSymbols(h, c.Params) + "\n")
	}
	if c.Source != "" {
		b.WriteString(`<div style="font-size:0.88em;opacity:0.75;margin-top:0.3em">Source: ` + html.EscapeString(c.Source) + "</div>\n")
	}
	b.WriteString("</div>")
	return b.String(), nil
}

// unescapeSymbols undoes the table's escaping of the symbol cells, which
// hold HTML made by latexHTML from escaped text.
func unescapeSymbols(h string, ps []Param) string {
	for _, p := range ps {
		s := latexHTML(p.Symbol)
		if s != "" {
			h = strings.Replace(h, ">"+html.EscapeString(s)+"<", ">"+s+"<", 1)
		}
	}
	return h
}

func hexColour(c interface{ RGBA() (r, g, b, a uint32) }) string {
	r, g, b, _ := c.RGBA()
	return fmt.Sprintf("#%02X%02X%02X", r>>8, g>>8, b>>8)
}

// Bundle returns the card's outputs: text/html, text/markdown and
// text/plain.
func (c *Card) Bundle() (Bundle, error) {
	t, err := c.Text()
	if err != nil {
		return Bundle{}, err
	}
	h, _ := c.HTML()
	m, _ := c.Markdown()
	return Bundle{Data: map[string]any{MIMEText: t, MIMEHTML: h, MIMEMarkdown: m}}, nil
}
