package notebook

import (
	"html"
	"regexp"
	"strings"
)

// Markdown renders the subset of Markdown that notebook text cells use
// most: headings, paragraphs, bullet and numbered lists, fenced code, block
// math ($$ … $$, kept as text for a typesetter), emphasis, inline code and
// links. Everything is escaped first, so raw HTML in a cell shows as text.
func Markdown(src string) string {
	var b strings.Builder
	lines := strings.Split(strings.ReplaceAll(src, "\r\n", "\n"), "\n")
	var para []string
	list := ""
	flushPara := func() {
		if len(para) > 0 {
			b.WriteString("<p>" + inline(strings.Join(para, " ")) + "</p>\n")
			para = nil
		}
	}
	closeList := func() {
		if list != "" {
			b.WriteString("</" + list + ">\n")
			list = ""
		}
	}
	for i := 0; i < len(lines); i++ {
		line := lines[i]
		trim := strings.TrimSpace(line)
		switch {
		case strings.HasPrefix(trim, "```"):
			flushPara()
			closeList()
			var code []string
			for i++; i < len(lines) && !strings.HasPrefix(strings.TrimSpace(lines[i]), "```"); i++ {
				code = append(code, lines[i])
			}
			b.WriteString("<pre>" + html.EscapeString(strings.Join(code, "\n")) + "</pre>\n")
		case trim == "":
			flushPara()
			closeList()
		case heading.MatchString(trim):
			flushPara()
			closeList()
			m := heading.FindStringSubmatch(trim)
			n := string(rune('0' + len(m[1])))
			b.WriteString("<h" + n + ">" + inline(m[2]) + "</h" + n + ">\n")
		case bullet.MatchString(trim) || numbered.MatchString(trim):
			flushPara()
			kind, re := "ul", bullet
			if numbered.MatchString(trim) {
				kind, re = "ol", numbered
			}
			if list != kind {
				closeList()
				b.WriteString("<" + kind + ">\n")
				list = kind
			}
			b.WriteString("<li>" + inline(re.ReplaceAllString(trim, "")) + "</li>\n")
		default:
			closeList()
			para = append(para, trim)
		}
	}
	flushPara()
	closeList()
	return b.String()
}

var (
	heading  = regexp.MustCompile(`^(#{1,6})\s+(.*)$`)
	bullet   = regexp.MustCompile(`^[-*+]\s+`)
	numbered = regexp.MustCompile(`^\d+[.)]\s+`)
	code     = regexp.MustCompile("`([^`]+)`")
	strong   = regexp.MustCompile(`\*\*([^*]+)\*\*`)
	em       = regexp.MustCompile(`\*([^*]+)\*`) // not _x_: names like tau_m are everywhere here
	link     = regexp.MustCompile(`\[([^\]]+)\]\(([^)\s]+)\)`)
)

// inline renders emphasis, code and links in already-split text.
func inline(s string) string {
	s = html.EscapeString(s)
	var spans []string
	s = code.ReplaceAllStringFunc(s, func(m string) string {
		spans = append(spans, "<code>"+m[1:len(m)-1]+"</code>")
		return "\x00" + string(rune('0'+len(spans)-1)) + "\x00"
	})
	s = strong.ReplaceAllString(s, "<strong>$1</strong>")
	s = em.ReplaceAllString(s, "<em>$1</em>")
	s = link.ReplaceAllStringFunc(s, func(m string) string {
		p := link.FindStringSubmatch(m)
		href := p[2]
		if !strings.HasPrefix(href, "http://") && !strings.HasPrefix(href, "https://") && !strings.HasPrefix(href, "#") {
			return p[1] // no javascript: or file links in a shared report
		}
		return `<a href="` + href + `">` + p[1] + "</a>"
	})
	for i, sp := range spans {
		s = strings.ReplaceAll(s, "\x00"+string(rune('0'+i))+"\x00", sp)
	}
	return s
}
