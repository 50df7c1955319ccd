package syntax

import "fmt"

// parseExpr parses expr = "if" expr "then" expr "else" expr | or.
func (p *parser) parseExpr() Expr {
	p.enter()
	defer p.leave()
	if p.tok.Tok == IF {
		return p.parseCond()
	}
	x, _ := p.parseBinary(precOr)
	return x
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

// Binding strengths of the binary operators, weakest first, for the
// precedence-climbing loop of parseBinary. NOT is a prefix between and
// and the comparisons; IN is a postfix between the comparisons and the
// sums. A strength of 0 means "not a binary operator".
const (
	precOr    = 1
	precAnd   = 2
	precNot   = 3 // operand of not and right operand of and
	precCmp   = 4
	precIn    = 5
	precSum   = 6
	precTerm  = 7
	precUnary = 8 // operand of * and /: no binary operator at all
	precAny   = 9 // no limit on the operator that may follow
)

var binaryPrec = [...]int8{
	OR: precOr, AND: precAnd,
	EQL: precCmp, NEQ: precCmp, LSS: precCmp, LEQ: precCmp, GTR: precCmp, GEQ: precCmp,
	IN:  precIn,
	ADD: precSum, SUB: precSum,
	MUL: precTerm, QUO: precTerm,
}

func opPrec(tok Token) int {
	if tok >= 0 && int(tok) < len(binaryPrec) {
		return int(binaryPrec[tok])
	}
	return 0
}

// parseBinary parses the operators that bind at least as tightly as prec,
// in one loop instead of one function per level; the trees are those of
// the grammar
//
//	or   = and {"or" and}
//	and  = not {"and" not}
//	not  = "not" not | cmp
//	cmp  = conv [cmpop conv]        (comparisons do not chain)
//	conv = sum ["in" UNIT]
//	sum  = term {("+" | "-") term}
//	term = unary {("*" | "/") unary}
//
// It also returns the strongest operator that may still follow: after
// x in UNIT only a comparison or weaker, after a comparison only and or
// or. The limit passes to the enclosing levels, so that x in mV + 1
// stops at '+' there too, as the grammar above does.
func (p *parser) parseBinary(prec int) (Expr, int) {
	x, limit := p.parseOperand(prec)
	for {
		op := p.tok.Tok
		oprec := opPrec(op)
		if oprec == 0 || oprec < prec || oprec > limit {
			return x, limit
		}
		pos := p.tok.Pos
		switch oprec {
		case precIn:
			x = p.parseIn(x)
			limit = precCmp
			continue
		case precCmp:
			p.next()
			y, _ := p.parseBinary(precIn)
			x = p.newBinary(x, pos, op, y)
			p.noChain()
			limit = precNot
			continue
		}
		p.next()
		y, l := p.parseBinary(oprec + 1)
		x = p.newBinary(x, pos, op, y)
		limit = min(limit, l)
	}
}

// parseOperand parses the first operand of parseBinary: a not-expression
// where one may stand, else a unary expression.
func (p *parser) parseOperand(prec int) (Expr, int) {
	if prec > precNot || p.tok.Tok != NOT {
		return p.parseUnary(), precAny
	}
	p.enter()
	defer p.leave()
	pos := p.tok.Pos
	p.next()
	x, limit := p.parseBinary(precNot)
	return &UnaryExpr{OpPos: pos, Op: NOT, X: x}, limit
}

// noChain reports a second comparison after a first one and parses its
// operand only to carry on after the error.
func (p *parser) noChain() {
	if isComparison(p.tok.Tok) {
		p.errorAt(p.tok.Pos, "comparisons do not chain; use and, as in a < b and b < c")
		p.next()
		p.parseBinary(precIn)
	}
}

func isComparison(tok Token) bool { return tok >= EQL && tok <= GEQ }

// parseIn parses "in" UNIT after x.
func (p *parser) parseIn(x Expr) Expr {
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
	u := p.nodes.unaries.new()
	*u = UnaryExpr{OpPos: pos, Op: SUB, X: x}
	return u
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
	return p.newBinary(x, pos, POW, p.parseUnary())
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
	u := p.nodes.units.new()
	*u = UnitExpr{X: x, UnitPos: pos, Unit: unit}
	x = u
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
