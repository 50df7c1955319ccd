// Package syntax holds the scanner, parser and abstract syntax tree of the
// Loligo modelling language. It knows nothing of units, values or
// evaluation: a unit written after a number is kept as its source text and
// resolved by the runtime.
//
// Every node reports the span of source it came from, so that errors can
// point at the exact line and column.
package syntax

// Pos is a position in a source text: a byte offset and the 1-based line and
// column (columns count Unicode code points, as an editor shows them). The
// zero Pos is "no position".
type Pos struct {
	Offset int // byte offset, from 0
	Line   int // from 1
	Col    int // from 1, in code points
}

// IsValid reports whether p is a real position.
func (p Pos) IsValid() bool { return p.Line > 0 }

// Node is any node of the tree.
type Node interface {
	Pos() Pos // first character of the node
	End() Pos // first character after the node
}

// Expr is an expression node.
type Expr interface {
	Node
	exprNode()
}

// Stmt is a statement node.
type Stmt interface {
	Node
	stmtNode()
}

// File is a parsed cell or script.
type File struct {
	Name  string // file name used in positions ("cell[3]", "fit.loligo")
	Src   string // the source text, kept for error carets
	Stmts []Stmt
}

// ---- expressions ----

type (
	// Ident is a name: a binding, a builtin, a field or argument name.
	Ident struct {
		NamePos Pos
		Name    string
	}

	// NumberLit is a number as written ("20", "1.5e-3"); Value is its value.
	NumberLit struct {
		ValuePos Pos
		Raw      string
		Value    float64
	}

	// StringLit is a double-quoted string; Value has escapes resolved.
	StringLit struct {
		ValuePos Pos
		Raw      string
		Value    string
	}

	// BoolLit is true or false.
	BoolLit struct {
		ValuePos Pos
		Value    bool
	}

	// ListLit is [a, b, c].
	ListLit struct {
		Lbrack Pos
		Elems  []Expr
		Rbrack Pos
	}

	// RecordLit is (a = 1, b = 2 ms). The empty record is written ().
	RecordLit struct {
		Lparen Pos
		Fields []*Field
		Rparen Pos
	}

	// Field is one name = value pair of a record literal.
	Field struct {
		Name  *Ident
		Value Expr
	}

	// ParenExpr is (x).
	ParenExpr struct {
		Lparen Pos
		X      Expr
		Rparen Pos
	}

	// UnitExpr is a value followed by a unit: 20 ms, [1, 2] pA,
	// span(0, 1, n = 5) uA/cm^2. Unit is the unit's source text with no
	// spaces ("uA/cm^2"); the runtime resolves it.
	UnitExpr struct {
		X       Expr
		UnitPos Pos
		Unit    string
	}

	// InExpr is x in UNIT: the value of x, shown in that unit.
	InExpr struct {
		X       Expr
		In      Pos // position of the keyword
		UnitPos Pos
		Unit    string
	}

	// CallExpr is f(a, b, name = c).
	CallExpr struct {
		Fun    Expr
		Lparen Pos
		Args   []*Arg
		Rparen Pos
	}

	// Arg is one argument of a call; Name is nil for a positional argument.
	Arg struct {
		Name  *Ident
		Value Expr
	}

	// FieldExpr is x.name.
	FieldExpr struct {
		X    Expr
		Name *Ident
	}

	// IndexExpr is x[i]: an element of a list or vector, or the rows of a
	// table or elements of a vector where a condition holds.
	IndexExpr struct {
		X      Expr
		Lbrack Pos
		Index  Expr
		Rbrack Pos
	}

	// UnaryExpr is -x or not x.
	UnaryExpr struct {
		OpPos Pos
		Op    Token // SUB or NOT
		X     Expr
	}

	// BinaryExpr is x op y for arithmetic, comparison and boolean operators.
	BinaryExpr struct {
		X     Expr
		OpPos Pos
		Op    Token
		Y     Expr
	}

	// CondExpr is if c then a else b.
	CondExpr struct {
		If   Pos
		Cond Expr
		Then Expr
		Else Expr
	}

	// BadExpr stands in for an expression that did not parse.
	BadExpr struct {
		From, To Pos
	}
)

// ---- statements ----

type (
	// ExprStmt is an expression on its own; the last one of a cell is shown.
	ExprStmt struct {
		X Expr
	}

	// BindStmt is name = value.
	BindStmt struct {
		Name  *Ident
		Value Expr
	}

	// FormulaStmt is formula name(x, y; p1, p2) = body. Vars are the
	// independent variables (before ';'), Params the parameters a fit may
	// vary (after ';'); either list may be empty.
	FormulaStmt struct {
		Formula Pos
		Name    *Ident
		Vars    []*Ident
		Params  []*Ident
		Body    Expr
	}

	// BadStmt stands in for a statement that did not parse.
	BadStmt struct {
		From, To Pos
	}
)

func (x *Ident) Pos() Pos      { return x.NamePos }
func (x *NumberLit) Pos() Pos  { return x.ValuePos }
func (x *StringLit) Pos() Pos  { return x.ValuePos }
func (x *BoolLit) Pos() Pos    { return x.ValuePos }
func (x *ListLit) Pos() Pos    { return x.Lbrack }
func (x *RecordLit) Pos() Pos  { return x.Lparen }
func (x *ParenExpr) Pos() Pos  { return x.Lparen }
func (x *UnitExpr) Pos() Pos   { return x.X.Pos() }
func (x *InExpr) Pos() Pos     { return x.X.Pos() }
func (x *CallExpr) Pos() Pos   { return x.Fun.Pos() }
func (x *FieldExpr) Pos() Pos  { return x.X.Pos() }
func (x *IndexExpr) Pos() Pos  { return x.X.Pos() }
func (x *UnaryExpr) Pos() Pos  { return x.OpPos }
func (x *BinaryExpr) Pos() Pos { return x.X.Pos() }
func (x *CondExpr) Pos() Pos   { return x.If }
func (x *BadExpr) Pos() Pos    { return x.From }

func (x *Ident) End() Pos     { return advance(x.NamePos, x.Name) }
func (x *NumberLit) End() Pos { return advance(x.ValuePos, x.Raw) }
func (x *StringLit) End() Pos { return advance(x.ValuePos, x.Raw) }
func (x *BoolLit) End() Pos {
	if x.Value {
		return advance(x.ValuePos, "true")
	}
	return advance(x.ValuePos, "false")
}
func (x *ListLit) End() Pos    { return advance(x.Rbrack, "]") }
func (x *RecordLit) End() Pos  { return advance(x.Rparen, ")") }
func (x *ParenExpr) End() Pos  { return advance(x.Rparen, ")") }
func (x *UnitExpr) End() Pos   { return advance(x.UnitPos, x.Unit) }
func (x *InExpr) End() Pos     { return advance(x.UnitPos, x.Unit) }
func (x *CallExpr) End() Pos   { return advance(x.Rparen, ")") }
func (x *FieldExpr) End() Pos  { return x.Name.End() }
func (x *IndexExpr) End() Pos  { return advance(x.Rbrack, "]") }
func (x *UnaryExpr) End() Pos  { return x.X.End() }
func (x *BinaryExpr) End() Pos { return x.Y.End() }
func (x *CondExpr) End() Pos   { return x.Else.End() }
func (x *BadExpr) End() Pos    { return x.To }

func (s *ExprStmt) Pos() Pos    { return s.X.Pos() }
func (s *BindStmt) Pos() Pos    { return s.Name.Pos() }
func (s *FormulaStmt) Pos() Pos { return s.Formula }
func (s *BadStmt) Pos() Pos     { return s.From }

func (s *ExprStmt) End() Pos    { return s.X.End() }
func (s *BindStmt) End() Pos    { return s.Value.End() }
func (s *FormulaStmt) End() Pos { return s.Body.End() }
func (s *BadStmt) End() Pos     { return s.To }

func (*Ident) exprNode()      {}
func (*NumberLit) exprNode()  {}
func (*StringLit) exprNode()  {}
func (*BoolLit) exprNode()    {}
func (*ListLit) exprNode()    {}
func (*RecordLit) exprNode()  {}
func (*ParenExpr) exprNode()  {}
func (*UnitExpr) exprNode()   {}
func (*InExpr) exprNode()     {}
func (*CallExpr) exprNode()   {}
func (*FieldExpr) exprNode()  {}
func (*IndexExpr) exprNode()  {}
func (*UnaryExpr) exprNode()  {}
func (*BinaryExpr) exprNode() {}
func (*CondExpr) exprNode()   {}
func (*BadExpr) exprNode()    {}

func (*ExprStmt) stmtNode()    {}
func (*BindStmt) stmtNode()    {}
func (*FormulaStmt) stmtNode() {}
func (*BadStmt) stmtNode()     {}

// advance returns the position just after text that starts at p and holds
// no newline (true of every token the End methods are used with).
func advance(p Pos, text string) Pos {
	n := 0
	for range text {
		n++
	}
	return Pos{Offset: p.Offset + len(text), Line: p.Line, Col: p.Col + n}
}
