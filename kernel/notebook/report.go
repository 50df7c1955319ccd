package notebook

import (
	"fmt"
	"html"
	"io"
	"regexp"
	"strings"
)

// mimeOrder is the preference among an output's formats for the report:
// figures first, then rich text, then plain text.
var mimeOrder = []string{"image/svg+xml", "image/png", "text/html", "text/markdown", "text/plain"}

// Report writes the executed notebook as one self-contained HTML page: no
// scripts, no external files; figures are inline SVG or data URIs. title is
// the page title; note is a line shown under it (e.g. how it was run).
func Report(w io.Writer, nb *Notebook, title, note string) error {
	var b strings.Builder
	b.WriteString("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
	fmt.Fprintf(&b, "<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n<main>\n", html.EscapeString(title), reportCSS)
	fmt.Fprintf(&b, "<header><h1>%s</h1><p class=\"note\">%s</p></header>\n", html.EscapeString(title), html.EscapeString(note))
	for _, c := range nb.Cells {
		switch c.Type {
		case "markdown":
			fmt.Fprintf(&b, "<section class=\"prose\">%s</section>\n", Markdown(string(c.Source)))
		case "code":
			writeCode(&b, c)
		}
	}
	b.WriteString("</main>\n</body>\n</html>\n")
	_, err := io.WriteString(w, b.String())
	return err
}

func writeCode(b *strings.Builder, c *Cell) {
	count := " "
	if c.ExecutionCount != nil {
		count = fmt.Sprint(*c.ExecutionCount)
	}
	fmt.Fprintf(b, "<section class=\"cell\"><div class=\"in\"><span class=\"n\">%s</span><pre>%s</pre></div>\n",
		count, html.EscapeString(string(c.Source)))
	for _, o := range c.Outputs {
		b.WriteString("<div class=\"out\">")
		switch o.Type {
		case "stream":
			fmt.Fprintf(b, "<pre class=\"%s\">%s</pre>", html.EscapeString(o.Name), html.EscapeString(string(o.Text)))
		case "error":
			fmt.Fprintf(b, "<pre class=\"error\">%s</pre>", html.EscapeString(strings.Join(o.Traceback, "\n")))
		default:
			writeData(b, o.Data)
		}
		b.WriteString("</div>\n")
	}
	b.WriteString("</section>\n")
}

func writeData(b *strings.Builder, data map[string]any) {
	for _, mime := range mimeOrder {
		v, ok := data[mime].(string)
		if !ok {
			if lines, isList := data[mime].([]any); isList {
				v, ok = joinLines(lines), true
			}
		}
		if !ok {
			continue
		}
		switch mime {
		case "image/svg+xml":
			b.WriteString("<figure>" + stripXMLDecl(v) + "</figure>")
		case "image/png":
			fmt.Fprintf(b, "<figure><img alt=\"figure\" src=\"data:image/png;base64,%s\"></figure>", strings.TrimSpace(v))
		case "text/html":
			b.WriteString(v)
		case "text/markdown":
			b.WriteString(Markdown(v))
		default:
			fmt.Fprintf(b, "<pre>%s</pre>", html.EscapeString(v))
		}
		return
	}
}

func joinLines(lines []any) string {
	var s strings.Builder
	for _, l := range lines {
		if t, ok := l.(string); ok {
			s.WriteString(t)
		}
	}
	return s.String()
}

var xmlDecl = regexp.MustCompile(`^\s*<\?xml[^>]*\?>\s*(<!DOCTYPE[^>]*>\s*)?`)

// stripXMLDecl removes the XML prologue, which is not allowed inside HTML.
func stripXMLDecl(svg string) string { return xmlDecl.ReplaceAllString(svg, "") }

// reportCSS is the report's own look: one readable column, quiet code cells,
// outputs set off by a left rule. It reads in light and dark modes.
const reportCSS = `
:root{color-scheme:light dark;--fg:#1d2430;--bg:#fbfbf8;--muted:#5d6775;--rule:#d5d9de;--code:#f1f2ee;--err:#a3262a}
@media (prefers-color-scheme:dark){:root{--fg:#e4e6ea;--bg:#16191e;--muted:#9aa3ae;--rule:#39404a;--code:#1f242b;--err:#f08a8c}}
body{margin:0;background:var(--bg);color:var(--fg);font:16px/1.5 system-ui,sans-serif}
main{max-width:60rem;margin:0 auto;padding:2rem 1.25rem 4rem}
header h1{margin:0 0 .25rem;font-size:1.6rem}
.note{margin:0 0 2rem;color:var(--muted);font-size:.9rem}
.cell{margin:1.25rem 0}
.in{display:flex;gap:.75rem;align-items:flex-start}
.n{min-width:2rem;text-align:right;color:var(--muted);font:12px/2 ui-monospace,monospace}
pre{margin:0;padding:.5rem .75rem;overflow-x:auto;font:13px/1.45 ui-monospace,monospace;white-space:pre-wrap}
.in pre{flex:1;background:var(--code);border-radius:4px}
.out{margin:.5rem 0 0 2.75rem;padding-left:.75rem;border-left:3px solid var(--rule);overflow-x:auto}
.out .stderr{color:var(--muted)}
.out .error{color:var(--err)}
figure{margin:.25rem 0}
figure svg,figure img{max-width:100%;height:auto}
table{border-collapse:collapse;font-size:.9rem}
th,td{padding:.2rem .6rem;border-bottom:1px solid var(--rule);text-align:right}
.prose h1,.prose h2,.prose h3{margin:1.5rem 0 .5rem}
.prose code{background:var(--code);padding:0 .2rem;border-radius:3px}
`
