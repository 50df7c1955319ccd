package syntax

// The cheap construction of nodes: most nodes of a cell are numbers,
// names, units and binary operations, so these come from per-parse slabs
// (one allocation per chunk instead of one per node), and a short decimal
// number gets its value without the general conversion.

// A slab hands out nodes of one type from chunks that double in size, from
// 8 up to 256 nodes, so a one-line cell wastes little and a long cell
// allocates a few chunks. A node keeps its chunk alive, which is harmless:
// the chunk's other nodes belong to the same tree.
type slab[T any] struct {
	free []T
	size int // size of the last chunk
}

// new returns a zeroed node.
func (s *slab[T]) new() *T {
	if len(s.free) == 0 {
		s.size = min(max(2*s.size, 8), 256)
		s.free = make([]T, s.size)
	}
	x := &s.free[0]
	s.free = s.free[1:]
	return x
}

// take returns a copy of src carved from the slab (nil if src is empty),
// its capacity cut to its length so that an append to it cannot reach the
// next slice of the chunk.
func (s *slab[T]) take(src []T) []T {
	if len(src) == 0 {
		return nil
	}
	if len(src) > len(s.free) {
		s.size = min(max(2*s.size, 16), 256)
		s.free = make([]T, max(s.size, len(src)))
	}
	dst := s.free[:len(src):len(src)]
	copy(dst, src)
	s.free = s.free[len(src):]
	return dst
}

// nodeSlabs holds the slabs of the node types met most often, and the
// stacks on which the arguments of calls and the elements of lists are
// gathered (nested calls push above their enclosing call's part) before
// they are carved, at their final length, from argLists and exprLists.
type nodeSlabs struct {
	numbers  slab[NumberLit]
	idents   slab[Ident]
	units    slab[UnitExpr]
	binaries slab[BinaryExpr]
	unaries  slab[UnaryExpr]
	parens   slab[ParenExpr]
	calls    slab[CallExpr]
	binds    slab[BindStmt]
	args     slab[Arg]

	argStack  []*Arg
	exprStack []Expr
	argLists  slab[*Arg]
	exprLists slab[Expr]
}

func (p *parser) newIdent(pos Pos, name string) *Ident {
	x := p.nodes.idents.new()
	x.NamePos, x.Name = pos, name
	return x
}

func (p *parser) newBinary(x Expr, pos Pos, op Token, y Expr) *BinaryExpr {
	b := p.nodes.binaries.new()
	*b = BinaryExpr{X: x, OpPos: pos, Op: op, Y: y}
	return b
}

// exactPow10 holds the powers of ten that a float64 represents exactly.
var exactPow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9,
	1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// fastFloat returns the value of a decimal number written
// digits [. digits] [e [+-] digits] when its digits, taken as an integer m,
// are at most 15 (so m < 2^53 is exact) and its power of ten e is within
// ±22 (so 10^e is exact): then m·10^e and m/10^-e are one correctly rounded
// IEEE 754 operation on exact operands, the very value the general
// conversion returns (W. D. Clinger, "How to read floating point numbers
// accurately", PLDI 1990, the exact fast path). It reports false for any
// other text, which then goes to strconv.ParseFloat.
func fastFloat(s string) (float64, bool) {
	var m uint64
	digits, exp, i := 0, 0, 0
	for ; i < len(s) && isDigit(rune(s[i])); i++ {
		m = m*10 + uint64(s[i]-'0')
		digits++
	}
	if i < len(s) && s[i] == '.' {
		for i++; i < len(s) && isDigit(rune(s[i])); i++ {
			m = m*10 + uint64(s[i]-'0')
			digits++
			exp--
		}
	}
	if digits == 0 || digits > 15 {
		return 0, false
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		e, ok := smallExponent(s[i+1:])
		if !ok {
			return 0, false
		}
		exp += e
		i = len(s)
	}
	switch {
	case i != len(s) || exp < -22 || exp > 22:
		return 0, false
	case exp < 0:
		return float64(m) / exactPow10[-exp], true
	}
	return float64(m) * exactPow10[exp], true
}

// smallExponent parses [+-] digits of at most three digits.
func smallExponent(s string) (int, bool) {
	neg := false
	if len(s) > 0 && (s[0] == '+' || s[0] == '-') {
		neg, s = s[0] == '-', s[1:]
	}
	if len(s) == 0 || len(s) > 3 {
		return 0, false
	}
	e := 0
	for i := 0; i < len(s); i++ {
		if !isDigit(rune(s[i])) {
			return 0, false
		}
		e = e*10 + int(s[i]-'0')
	}
	if neg {
		e = -e
	}
	return e, true
}
