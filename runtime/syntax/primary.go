package syntax

import (
	"errors"
	"fmt"
	"strconv"
)

// parsePrimary parses a literal, a name, a list, a record or a
// parenthesised expression.
func (p *parser) parsePrimary() Expr {
	it := p.tok
	switch it.Tok {
	case IDENT:
		return p.parseIdent("")
	case NUMBER:
		p.next()
		return p.number(&it)
	case STRING:
		p.next()
		return &StringLit{ValuePos: it.Pos, Raw: it.Lit, Value: unquote(it.Lit)}
	case TRUE, FALSE:
		p.next()
		return &BoolLit{ValuePos: it.Pos, Value: it.Tok == TRUE}
	case LBRACK:
		return p.parseList()
	case LPAREN:
		return p.parseParen()
	case IF:
		p.errorAt(it.Pos, "expected expression, found keyword 'if'; an if used as an operand goes in parentheses: (if c then a else b)")
	case ILLEGAL:
		p.errorExpected("expression", "") // the scanner has said what is wrong
	default:
		p.errorExpected("expression", "")
	}
	switch it.Tok {
	case RPAREN, RBRACK, COMMA, NEWLINE, EOF, IF:
		// Left for the enclosing construct, which knows what to do with it.
		return p.badHere()
	}
	p.next()
	return &BadExpr{From: it.Pos, To: it.End}
}

// number makes the literal of a scanned NUMBER.
func (p *parser) number(it *Item) *NumberLit {
	x := p.nodes.numbers.new()
	*x = NumberLit{ValuePos: it.Pos, Raw: it.Lit}
	if v, ok := fastFloat(it.Lit); ok {
		x.Value = v
		return x
	}
	v, err := strconv.ParseFloat(it.Lit, 64)
	if errors.Is(err, strconv.ErrRange) {
		p.errorAt(it.Pos, fmt.Sprintf("number %s is out of range; numbers must be below about 1.8e308, so use a larger unit", shorten(it.Lit)))
	} else if err != nil {
		p.errorAt(it.Pos, fmt.Sprintf("malformed number %s; write numbers like 20, 1.5 or 2e-3", shorten(it.Lit)))
	}
	x.Value = v
	return x
}

// parseCall parses the arguments of a call of fun, at '('.
func (p *parser) parseCall(fun Expr) Expr {
	c := p.nodes.calls.new()
	c.Fun, c.Lparen = fun, p.tok.Pos
	p.next()
	named := false
	base := len(p.nodes.argStack)
	for p.tok.Tok != RPAREN && p.tok.Tok != EOF {
		a := p.parseArg()
		if a.Name != nil {
			named = true
		} else if named {
			p.errorAt(a.Value.Pos(), "positional argument after named argument; put positional arguments first")
		}
		p.nodes.argStack = append(p.nodes.argStack, a)
		if p.tok.Tok != COMMA {
			break
		}
		p.next()
	}
	c.Args = p.nodes.argLists.take(p.nodes.argStack[base:])
	clear(p.nodes.argStack[base:]) // drop the pointers for the collector
	p.nodes.argStack = p.nodes.argStack[:base]
	if p.tok.Tok != RPAREN && p.tok.Tok != EOF {
		p.errorExpected("',' or ')'", "separate arguments with ','")
	}
	c.Rparen = p.expectClose(RPAREN)
	return c
}

// parseArg parses [IDENT "="] expr.
func (p *parser) parseArg() *Arg {
	if p.tok.Tok == IDENT && p.peek(1).Tok == ASSIGN {
		name := p.parseIdent("")
		p.next()
		a := p.nodes.args.new()
		a.Name, a.Value = name, p.parseExpr()
		return a
	}
	a := p.nodes.args.new()
	a.Value = p.parseExpr()
	return a
}

// parseList parses "[" [exprs] "]".
func (p *parser) parseList() Expr {
	l := &ListLit{Lbrack: p.tok.Pos}
	p.next()
	base := len(p.nodes.exprStack)
	for p.tok.Tok != RBRACK && p.tok.Tok != EOF {
		x := p.parseExpr()
		p.nodes.exprStack = append(p.nodes.exprStack, x)
		if p.tok.Tok != COMMA {
			break
		}
		p.next()
	}
	l.Elems = p.nodes.exprLists.take(p.nodes.exprStack[base:])
	clear(p.nodes.exprStack[base:])
	p.nodes.exprStack = p.nodes.exprStack[:base]
	if p.tok.Tok != RBRACK && p.tok.Tok != EOF {
		p.errorExpected("',' or ']'", "separate list elements with ','")
	}
	l.Rbrack = p.expectClose(RBRACK)
	return l
}

// parseParen parses "(" ")", a record or "(" expr ")".
func (p *parser) parseParen() Expr {
	lp := p.tok.Pos
	p.next()
	if p.tok.Tok == RPAREN || p.tok.Tok == IDENT && p.peek(1).Tok == ASSIGN {
		return p.parseRecord(lp)
	}
	x := p.parseExpr()
	if p.tok.Tok == COMMA {
		p.errorExpected("')'", "a record needs names, as in (a = 1, b = 2), and a list uses brackets, as in [1, 2]")
	}
	e := p.nodes.parens.new()
	e.Lparen, e.X = lp, x
	e.Rparen = p.expectClose(RPAREN)
	return e
}

// parseRecord parses the fields of a record after its '(' at lp.
func (p *parser) parseRecord(lp Pos) Expr {
	r := &RecordLit{Lparen: lp}
	for p.tok.Tok != RPAREN && p.tok.Tok != EOF {
		if p.tok.Tok != IDENT || p.peek(1).Tok != ASSIGN {
			p.errorExpected("a field name", "every field of a record is written name = value")
			break
		}
		name := p.parseIdent("")
		p.next()
		r.Fields = append(r.Fields, &Field{Name: name, Value: p.parseExpr()})
		if p.tok.Tok != COMMA {
			break
		}
		p.next()
	}
	if p.tok.Tok != RPAREN && p.tok.Tok != EOF {
		p.errorExpected("',' or ')'", "separate record fields with ','")
	}
	r.Rparen = p.expectClose(RPAREN)
	return r
}
