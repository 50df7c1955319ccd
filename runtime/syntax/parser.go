package syntax

import "fmt"

// maxNest bounds the nesting of brackets and prefix operators, so that no
// input can exhaust the stack.
const maxNest = 300

// bailout is the panic value that ends a parse early (too many errors, too
// deep); it is recovered at the entry points.
type bailout struct{}

// Parse parses a cell or script; filename is used in error positions
// ("cell[3]"). It always returns a *File, possibly partial, with BadExpr and
// BadStmt placeholders where parsing failed, and an ErrorList (at most
// MaxErrors errors, one per line, in source order) as error, or nil.
func Parse(filename, src string) (f *File, err error) {
	var p parser
	f = &File{Name: filename, Src: src}
	defer func() {
		p.recover(recover())
		err = p.errs.Err()
	}()
	p.init(filename, src)
	p.parseFile(f)
	return f, nil
}

// ParseExpr parses a single expression, such as the text before the cursor
// when completing. It always returns an Expr (a BadExpr when nothing could
// be parsed) and an ErrorList or nil, as Parse does.
func ParseExpr(src string) (x Expr, err error) {
	var p parser
	defer func() {
		p.recover(recover())
		if x == nil {
			start, end := Pos{Line: 1, Col: 1}, p.tok.Pos // end: where it stopped
			if !end.IsValid() {
				end = start
			}
			x = &BadExpr{From: start, To: end}
		}
		err = p.errs.Err()
	}()
	p.init("", src)
	p.skipNewlines()
	x = p.parseExpr()
	p.skipNewlines()
	if p.tok.Tok != EOF {
		p.errorAt(p.tok.Pos, fmt.Sprintf("unexpected %s after the expression; give one expression only", describe(p.tok)))
	}
	return x, nil
}

// A parser reads one source text. Tokens come from the scanner through a
// filter that drops the line breaks that do not end a statement.
type parser struct {
	file string
	src  string
	sc   scanner
	errs ErrorList

	tok     Item    // current token
	la      [3]Item // tokens after tok, read ahead
	nla     int     // number of tokens in la
	prevEnd Pos     // end of the last token consumed
	depth   int     // brackets open among the tokens read so far
	last    Token   // last token let through the filter
	nest    int     // current nesting, bounded by maxNest
	nodes   nodeSlabs
}

func (p *parser) init(file, src string) {
	p.file, p.src = file, src
	p.last = NEWLINE // drops leading blank lines
	p.prevEnd = Pos{Line: 1, Col: 1}
	p.sc.init(src, p.errorAt)
	p.read(&p.tok)
}

// recover turns a panic into the end of the parse: a bailout is expected,
// anything else is a bug reported as an internal error, never a crash.
func (p *parser) recover(r any) {
	if r != nil {
		if _, ok := r.(bailout); !ok {
			p.errs.Add(p.file, p.tok.Pos, fmt.Sprintf("internal error in the parser: %v; please report the input that caused it", r))
		}
	}
	p.errs.RemoveMultiples()
}

// read returns the next token that matters to the grammar: a line break
// inside brackets, after a token that needs more, or after another line
// break is dropped. The token is read into it.
func (p *parser) read(it *Item) {
	for {
		p.sc.scan(it)
		switch it.Tok {
		case NEWLINE:
			if p.depth > 0 || p.last == NEWLINE || continues(p.last) {
				continue
			}
		case LPAREN, LBRACK:
			p.depth++
		case RPAREN, RBRACK:
			if p.depth > 0 {
				p.depth--
			}
		}
		p.last = it.Tok
		return
	}
}

// continues reports whether a line ending in tok goes on on the next line.
func continues(tok Token) bool {
	switch tok {
	case ADD, SUB, MUL, QUO, POW, EQL, NEQ, LSS, LEQ, GTR, GEQ,
		ASSIGN, COMMA, IN, THEN, ELSE, IF, NOT, AND, OR:
		return true
	}
	return false
}

// peek returns the k-th token after the current one (k is 1 to 3).
func (p *parser) peek(k int) Item {
	for p.nla < k {
		p.read(&p.la[p.nla])
		p.nla++
	}
	return p.la[k-1]
}

// next consumes the current token.
func (p *parser) next() {
	p.prevEnd = p.tok.End
	if p.nla == 0 {
		p.read(&p.tok)
		return
	}
	p.tok = p.la[0]
	copy(p.la[:], p.la[1:p.nla])
	p.nla--
}

func (p *parser) skipNewlines() {
	for p.tok.Tok == NEWLINE {
		p.next()
	}
}

// errorAt records an error. Only the first error of a line is kept (the
// others are nearly always its echoes), and the parse stops at MaxErrors.
func (p *parser) errorAt(pos Pos, msg string) {
	if n := len(p.errs); n > 0 && p.errs[n-1].Pos.Line == pos.Line {
		return
	}
	p.errs.Add(p.file, pos, msg)
	if len(p.errs) >= MaxErrors {
		panic(bailout{})
	}
}

// errorExpected reports that what was expected at the current token,
// followed by a hint on how to fix it if there is one.
func (p *parser) errorExpected(what, hint string) {
	msg := "expected " + what + ", found " + describe(p.tok)
	if hint != "" {
		msg += "; " + hint
	}
	p.errorAt(p.tok.Pos, msg)
}

// describe names a token as an error message shows it: "name tau",
// "number 20", "')'", "newline".
func describe(it Item) string {
	switch it.Tok {
	case IDENT:
		return "name " + it.Lit
	case NUMBER:
		return "number " + it.Lit
	case STRING:
		return "string " + shorten(it.Lit)
	case ILLEGAL:
		return fmt.Sprintf("illegal text %q", shorten(it.Lit))
	}
	if it.Tok >= AND {
		return "keyword '" + it.Tok.String() + "'"
	}
	return it.Tok.String()
}

// shorten cuts s to about 20 characters for a message.
func shorten(s string) string {
	n := 0
	for i := range s {
		if n == 20 {
			return s[:i] + "…"
		}
		n++
	}
	return s
}

// expectClose consumes the closing bracket tok. If it is missing, it
// reports an error and returns a position one character before the end of
// the text consumed, so that the node's End is where the parse stopped
// (for a multi-byte last character that position is inside it; only End
// is meaningful then).
func (p *parser) expectClose(tok Token) Pos {
	if p.tok.Tok == tok {
		pos := p.tok.Pos
		p.next()
		return pos
	}
	p.errorExpected(tok.String(), "")
	return Pos{Offset: p.prevEnd.Offset - 1, Line: p.prevEnd.Line, Col: p.prevEnd.Col - 1}
}

// enter and leave bound the nesting depth.
func (p *parser) enter() {
	p.nest++
	if p.nest > maxNest {
		p.errs.Add(p.file, p.tok.Pos, fmt.Sprintf("expression nested too deeply (more than %d levels); split it into named parts", maxNest))
		panic(bailout{})
	}
}

func (p *parser) leave() { p.nest-- }

// ---- statements ----

func (p *parser) parseFile(f *File) {
	for p.tok.Tok != EOF {
		if p.tok.Tok == NEWLINE {
			p.next()
			continue
		}
		f.Stmts = append(f.Stmts, p.parseStmt())
		p.endStmt()
	}
}

// endStmt checks that the statement ends here and skips to the next line
// if it does not.
func (p *parser) endStmt() {
	var msg string
	switch p.tok.Tok {
	case NEWLINE, EOF:
		return
	case RPAREN, RBRACK:
		msg = fmt.Sprintf("unexpected %s; no bracket is open here, remove it", p.tok.Tok)
	case ASSIGN:
		msg = "cannot bind to this expression; only a name can be bound, as in x = 1"
	case SEMICOLON:
		msg = "unexpected ';'; put each statement on its own line"
	default:
		msg = fmt.Sprintf("unexpected %s after the end of the statement; put each statement on its own line", describe(p.tok))
	}
	p.errorAt(p.tok.Pos, msg)
	// Start afresh on the next line: a bracket left open by the bad
	// statement must not swallow the rest of the cell.
	p.depth = 0
	for p.tok.Tok != NEWLINE && p.tok.Tok != EOF {
		p.next()
	}
}

func (p *parser) parseStmt() Stmt {
	switch p.tok.Tok {
	case FORMULA:
		return p.parseFormula()
	case IDENT:
		if p.peek(1).Tok == ASSIGN {
			name := p.parseIdent("")
			p.next()
			s := p.nodes.binds.new()
			s.Name, s.Value = name, p.parseExpr()
			return s
		}
	}
	x := p.parseExpr()
	if bad, ok := x.(*BadExpr); ok {
		return &BadStmt{From: bad.From, To: bad.To}
	}
	return &ExprStmt{X: x}
}

// parseFormula parses formula name(vars; params) = body.
func (p *parser) parseFormula() Stmt {
	s := &FormulaStmt{Formula: p.tok.Pos}
	p.next()
	s.Name = p.parseIdent("a name after 'formula'")
	if p.tok.Tok != LPAREN {
		p.errorExpected("'('", "a formula lists its variables, then its parameters after ';': formula f(x; a, b) = a*x + b")
		s.Body = p.badHere()
		return s
	}
	p.next()
	s.Vars = p.identList()
	if p.tok.Tok == SEMICOLON {
		p.next()
		s.Params = p.identList()
	}
	p.expectClose(RPAREN)
	if p.tok.Tok != ASSIGN {
		p.errorExpected("'='", "give the formula's body after '=': formula f(x; a) = a*x")
		s.Body = p.badHere()
		return s
	}
	p.next()
	s.Body = p.parseExpr()
	return s
}

// identList parses [IDENT {"," IDENT}].
func (p *parser) identList() []*Ident {
	if p.tok.Tok != IDENT {
		return nil
	}
	list := []*Ident{p.parseIdent("")}
	for p.tok.Tok == COMMA {
		p.next()
		list = append(list, p.parseIdent("a name after ','"))
	}
	return list
}

// parseIdent parses a name; if there is none it reports that what was
// expected and returns an empty name at the current position.
func (p *parser) parseIdent(what string) *Ident {
	if p.tok.Tok == IDENT {
		id := p.newIdent(p.tok.Pos, p.tok.Lit)
		p.next()
		return id
	}
	p.errorExpected(what, "")
	return p.newIdent(p.tok.Pos, "")
}

// badHere returns an empty placeholder where an expression is missing.
func (p *parser) badHere() *BadExpr {
	return &BadExpr{From: p.tok.Pos, To: p.tok.Pos}
}
