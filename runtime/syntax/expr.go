package syntax

import "fmt"

// parseExpr parses expr = "if" expr "then" expr "else" expr | or.
func (p *parser) parseExpr() Expr {
	p.enter()
	defer p.leave()
	if p.tok.Tok == IF {
		return p.parseCond()
	}
	return p.parseOr()
}

func (p *parser) parseCond() Expr {
	e := &CondExpr{If: p.tok.Pos}
	p.next()
	e.Cond = p.parseExpr()
	p.skipNewlineBefore(THEN)
	if p.tok.Tok != THEN {
		p.errorExpected("'then'", "write if c then a else b")
		e.Then = p.badHere()
		e.Else = e.Then
		return e
	}
	p.next()
	e.Then = p.parseExpr()
	p.skipNewlineBefore(ELSE)
	if p.tok.Tok != ELSE {
		p.errorExpected("'else'", "an if needs both branches: if c then a else b")
		e.Else = p.badHere()
		return e
	}
	p.next()
	e.Else = p.parseExpr()
	return e
}

// skipNewlineBefore skips a line break followed by tok, so that the
// branches of an if may start their lines with then and else (a cell that
// ends before its else is incomplete, and the else may come next).
func (p *parser) skipNewlineBefore(tok Token) {
	if p.tok.Tok == NEWLINE && p.peek(1).Tok == tok {
		p.next()
	}
}

func (p *parser) parseOr() Expr {
	x := p.parseAnd()
	for p.tok.Tok == OR {
		pos := p.tok.Pos
		p.next()
		x = &BinaryExpr{X: x, OpPos: pos, Op: OR, Y: p.parseAnd()}
	}
	return x
}

func (p *parser) parseAnd() Expr {
	x := p.parseNot()
	for p.tok.Tok == AND {
		pos := p.tok.Pos
		p.next()
		x = &BinaryExpr{X: x, OpPos: pos, Op: AND, Y: p.parseNot()}
	}
	return x
}

func (p *parser) parseNot() Expr {
	if p.tok.Tok != NOT {
		return p.parseCmp()
	}
	p.enter()
	defer p.leave()
	pos := p.tok.Pos
	p.next()
	return &UnaryExpr{OpPos: pos, Op: NOT, X: p.parseNot()}
}

func isComparison(tok Token) bool { return tok >= EQL && tok <= GEQ }

// parseCmp parses conv [cmpop conv]; comparisons do not chain.
func (p *parser) parseCmp() Expr {
	x := p.parseConv()
	if !isComparison(p.tok.Tok) {
		return x
	}
	pos, op := p.tok.Pos, p.tok.Tok
	p.next()
	x = &BinaryExpr{X: x, OpPos: pos, Op: op, Y: p.parseConv()}
	if isComparison(p.tok.Tok) {
		p.errorAt(p.tok.Pos, "comparisons do not chain; use and, as in a < b and b < c")
		p.next()
		p.parseConv() // parsed only to carry on after the error
	}
	return x
}

// parseConv parses sum ["in" UNIT].
func (p *parser) parseConv() Expr {
	x := p.parseSum()
	if p.tok.Tok != IN {
		return x
	}
	e := &InExpr{X: x, In: p.tok.Pos}
	p.next()
	if p.tok.Tok != IDENT {
		// An empty unit just after 'in' keeps the tree useful for completion.
		p.errorExpected("a unit after 'in'", "write x in mV")
		e.UnitPos = p.prevEnd
		return e
	}
	e.UnitPos, e.Unit = p.parseUnit()
	return e
}

func (p *parser) parseSum() Expr {
	x := p.parseTerm()
	for p.tok.Tok == ADD || p.tok.Tok == SUB {
		pos, op := p.tok.Pos, p.tok.Tok
		p.next()
		x = &BinaryExpr{X: x, OpPos: pos, Op: op, Y: p.parseTerm()}
	}
	return x
}

func (p *parser) parseTerm() Expr {
	x := p.parseUnary()
	for p.tok.Tok == MUL || p.tok.Tok == QUO {
		pos, op := p.tok.Pos, p.tok.Tok
		p.next()
		x = &BinaryExpr{X: x, OpPos: pos, Op: op, Y: p.parseUnary()}
	}
	return x
}

// parseUnary parses "-" unary | "+" unary | power; unary plus is dropped.
func (p *parser) parseUnary() Expr {
	if p.tok.Tok != SUB && p.tok.Tok != ADD {
		return p.parsePower()
	}
	p.enter()
	defer p.leave()
	pos, op := p.tok.Pos, p.tok.Tok
	p.next()
	x := p.parseUnary()
	if op == ADD {
		return x
	}
	return &UnaryExpr{OpPos: pos, Op: SUB, X: x}
}

// parsePower parses postfix ["^" unary], so that -2^2 is -(2^2), 2^-1 is
// allowed and 2^3^2 is 2^(3^2).
func (p *parser) parsePower() Expr {
	x := p.parsePostfix()
	if p.tok.Tok != POW {
		return x
	}
	p.enter()
	defer p.leave()
	pos := p.tok.Pos
	p.next()
	return &BinaryExpr{X: x, OpPos: pos, Op: POW, Y: p.parseUnary()}
}

// parsePostfix parses primary { call | field | index } [UNIT].
func (p *parser) parsePostfix() Expr {
	x := p.parsePrimary()
	for {
		switch p.tok.Tok {
		case LPAREN:
			x = p.parseCall(x)
		case PERIOD:
			p.next()
			x = &FieldExpr{X: x, Name: p.parseIdent("a field name after '.'")}
		case LBRACK:
			lb := p.tok.Pos
			p.next()
			idx := p.parseExpr()
			x = &IndexExpr{X: x, Lbrack: lb, Index: idx, Rbrack: p.expectClose(RBRACK)}
		default:
			return p.parseUnitSuffix(x)
		}
	}
}

// parseUnitSuffix parses the unit that may follow a value on its line.
func (p *parser) parseUnitSuffix(x Expr) Expr {
	if p.tok.Tok != IDENT || p.tok.Pos.Line != p.prevEnd.Line {
		return x
	}
	pos, unit := p.parseUnit()
	x = &UnitExpr{X: x, UnitPos: pos, Unit: unit}
	if p.tok.Tok == IDENT && p.tok.Pos.Line == p.prevEnd.Line {
		p.errorAt(p.tok.Pos, fmt.Sprintf("unexpected name %s after a unit; write compound units without spaces, e.g. mV/ms", p.tok.Lit))
		p.next()
	}
	return x
}

// parseUnit parses UNIT = uatom {("/" | "*") uatom} at an IDENT, with no
// blank between its tokens, and returns its position and source text.
func (p *parser) parseUnit() (Pos, string) {
	start := p.tok.Pos
	end := p.tok.End
	p.next()
	end = p.unitExponent(end)
	for (p.tok.Tok == QUO || p.tok.Tok == MUL) && p.tok.Pos.Offset == end.Offset {
		atom := p.peek(1)
		if atom.Tok != IDENT || atom.Pos.Offset != p.tok.End.Offset {
			break
		}
		p.next()
		p.next()
		end = p.unitExponent(atom.End)
	}
	return start, p.src[start.Offset:end.Offset]
}

// unitExponent parses the optional "^" ["-"] INTEGER right after a unit
// atom ending at end, and returns the new end.
func (p *parser) unitExponent(end Pos) Pos {
	if p.tok.Tok != POW || p.tok.Pos.Offset != end.Offset {
		return end
	}
	a := p.peek(1)
	if a.Tok == SUB && a.Pos.Offset == p.tok.End.Offset {
		b := p.peek(2)
		if !isInteger(b) || b.Pos.Offset != a.End.Offset {
			return end
		}
		p.next()
		p.next()
		p.next()
		return b.End
	}
	if !isInteger(a) || a.Pos.Offset != p.tok.End.Offset {
		return end
	}
	p.next()
	p.next()
	return a.End
}

// isInteger reports whether it is a NUMBER made of digits only.
func isInteger(it Item) bool {
	if it.Tok != NUMBER {
		return false
	}
	for i := 0; i < len(it.Lit); i++ {
		if !isDigit(rune(it.Lit[i])) {
			return false
		}
	}
	return true
}
