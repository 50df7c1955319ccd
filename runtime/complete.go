package runtime

import (
	"fmt"
	"sort"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/loligo-lab/loligo/runtime/syntax"
	"github.com/loligo-lab/loligo/runtime/units"
)

// Completion is the answer to a completion request: the candidates and the
// range of the code they replace, in code points (as the Jupyter protocol
// counts cursor positions).
type Completion struct {
	Matches    []string
	Start, End int
}

// Complete proposes what may be typed at cursor (in code points): field
// names after a dot, units after a number or "in", the named arguments of
// the call the cursor is in, then bindings, builtins and keywords.
func (s *Session) Complete(code string, cursor int) Completion {
	off := byteOffset(code, cursor)
	start := off
	for start > 0 {
		r, n := utf8.DecodeLastRuneInString(code[:start])
		if !isIdentRune(r) {
			break
		}
		start -= n
	}
	prefix := code[start:off]
	before := code[:start]
	var cands []string
	switch {
	case strings.HasSuffix(before, "."):
		cands = s.fieldCandidates(before[:len(before)-1])
	case s.unitPosition(before):
		cands = units.Names()
	default:
		cands = append(s.argCandidates(before), s.nameCandidates()...)
	}
	return Completion{Matches: filterPrefix(cands, prefix), Start: utf8.RuneCountInString(code[:start]), End: cursor}
}

func isIdentRune(r rune) bool {
	return r == '_' || r == '°' || unicode.IsLetter(r) || unicode.IsDigit(r)
}

func byteOffset(s string, runes int) int {
	if runes <= 0 {
		return 0
	}
	i := 0
	for off := range s {
		if i == runes {
			return off
		}
		i++
	}
	return len(s)
}

func filterPrefix(cands []string, prefix string) []string {
	seen := map[string]bool{}
	out := []string{}
	for _, c := range cands {
		if strings.HasPrefix(c, prefix) && !seen[c] {
			seen[c] = true
			out = append(out, c)
		}
	}
	return out
}

// fieldCandidates resolves a dotted chain of names (r.fit.) without
// evaluating calls, so that completion never runs a simulation.
func (s *Session) fieldCandidates(chain string) []string {
	v := s.resolveChain(chain)
	if f, ok := v.(Fielder); ok {
		names := append([]string{}, f.FieldNames()...)
		sort.Strings(names)
		return names
	}
	return nil
}

func (s *Session) resolveChain(chain string) Value {
	i := len(chain)
	for i > 0 {
		r, n := utf8.DecodeLastRuneInString(chain[:i])
		if !isIdentRune(r) && r != '.' {
			break
		}
		i -= n
	}
	parts := strings.Split(chain[i:], ".")
	if len(parts) == 0 || parts[0] == "" {
		return nil
	}
	v, ok := s.globals[parts[0]]
	if !ok {
		return nil
	}
	for _, p := range parts[1:] {
		f, ok := v.(Fielder)
		if !ok {
			return nil
		}
		var err error
		if v, err = f.Field(p); err != nil {
			return nil
		}
	}
	return v
}

// unitPosition reports whether a unit is expected next: right after a
// number, after "in", or inside a compound unit (mV/).
func (s *Session) unitPosition(before string) bool {
	items := syntax.Scan(before)
	for len(items) > 0 && items[len(items)-1].Tok == syntax.EOF {
		items = items[:len(items)-1]
	}
	if len(items) == 0 {
		return false
	}
	last := items[len(items)-1]
	switch last.Tok {
	case syntax.NUMBER:
		return true
	case syntax.IN:
		return true
	case syntax.QUO, syntax.MUL:
		if len(items) >= 3 && last.End.Offset == len(before) {
			prev, prev2 := items[len(items)-2], items[len(items)-3]
			return prev.Tok == syntax.IDENT && prev.End == last.Pos && prev2.Tok == syntax.NUMBER
		}
	}
	return false
}

// argCandidates gives "name" for each parameter of the call the text ends
// inside, when the cursor is where an argument starts.
func (s *Session) argCandidates(before string) []string {
	items := syntax.Scan(before)
	depth := 0
	for i := len(items) - 1; i >= 0; i-- {
		switch items[i].Tok {
		case syntax.RPAREN, syntax.RBRACK:
			depth++
		case syntax.LBRACK:
			depth--
		case syntax.LPAREN:
			if depth > 0 {
				depth--
				continue
			}
			if i > 0 && items[i-1].Tok == syntax.IDENT {
				return s.paramNames(items[i-1].Lit)
			}
			return nil
		}
		if depth < 0 {
			return nil
		}
	}
	return nil
}

func (s *Session) paramNames(fn string) []string {
	if b, ok := s.reg.Lookup(fn); ok {
		var out []string
		for _, p := range b.Params {
			if !p.Rest {
				out = append(out, p.Name)
			}
		}
		return out
	}
	if f, ok := s.globals[fn].(*Formula); ok {
		return f.ArgNames()
	}
	return nil
}

func (s *Session) nameCandidates() []string {
	out := s.Bindings()
	out = append(out, s.reg.Names()...)
	kw := make([]string, 0, len(syntax.Keywords))
	for k := range syntax.Keywords {
		kw = append(kw, k)
	}
	sort.Strings(kw)
	return append(out, kw...)
}

// Inspect returns the declaration text of what is under the cursor (or of
// the call the cursor is in): a builtin's help, a binding's kind and value,
// a unit's meaning. found is false when there is nothing to say.
func (s *Session) Inspect(code string, cursor int) (text string, found bool) {
	off := byteOffset(code, cursor)
	start, end := off, off
	for start > 0 {
		r, n := utf8.DecodeLastRuneInString(code[:start])
		if !isIdentRune(r) && r != '.' {
			break
		}
		start -= n
	}
	for end < len(code) {
		r, n := utf8.DecodeRuneInString(code[end:])
		if !isIdentRune(r) {
			break
		}
		end += n
	}
	word := strings.Trim(code[start:end], ".")
	if word == "" {
		if fn := s.enclosingCall(code[:off]); fn != "" {
			word = fn
		}
	}
	if word == "" {
		return "", false
	}
	return s.describeName(word)
}

func (s *Session) enclosingCall(before string) string {
	items := syntax.Scan(before)
	depth := 0
	for i := len(items) - 1; i > 0; i-- {
		switch items[i].Tok {
		case syntax.RPAREN:
			depth++
		case syntax.LPAREN:
			if depth == 0 {
				if items[i-1].Tok == syntax.IDENT {
					return items[i-1].Lit
				}
				return ""
			}
			depth--
		}
	}
	return ""
}

func (s *Session) describeName(word string) (string, bool) {
	if strings.Contains(word, ".") {
		if v := s.resolveChain(word); v != nil {
			return Describe(word, v), true
		}
		return "", false
	}
	if b, ok := s.reg.Lookup(word); ok {
		return b.Help(), true
	}
	if c, ok := s.reg.consts[word]; ok {
		return fmt.Sprintf("%s = %s\n\n%s", word, c.v, c.doc), true
	}
	if v, ok := s.globals[word]; ok {
		text := Describe(word, v)
		if h, ok := v.(Helper); ok {
			text += "\n\n" + h.Help()
		}
		return text, true
	}
	if u, ok := units.Lookup(word); ok {
		return fmt.Sprintf("unit %s: %s; 1 %s = %s", word, u.Dim.Describe(), word, units.Format(u.Scale+u.Offset, u.Dim)), true
	}
	return "", false
}

// IsComplete says whether code is a finished cell: "complete",
// "incomplete" (with an indent for the next line) or "invalid".
func (s *Session) IsComplete(code string) (status, indent string) {
	st, ind := syntax.Completeness(code)
	switch st {
	case syntax.Complete:
		return "complete", ""
	case syntax.Incomplete:
		return "incomplete", ind
	}
	return "invalid", ""
}
