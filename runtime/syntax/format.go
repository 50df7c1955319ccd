package syntax

import (
	"strconv"
	"strings"
)

// Inspect walks the tree rooted at n in source order, calling f for each
// node; when f returns false the node's children are skipped. Record
// fields and call arguments are not nodes: their names and values are
// visited in turn. Nil nodes are skipped.
func Inspect(n Node, f func(Node) bool) {
	if isNil(n) || !f(n) {
		return
	}
	for _, c := range children(n) {
		Inspect(c, f)
	}
}

// isNil reports whether n is nil or a typed nil pointer.
func isNil(n Node) bool {
	switch x := n.(type) {
	case nil:
		return true
	case *Ident:
		return x == nil
	case *BadExpr:
		return x == nil
	}
	return false
}

// children lists the direct children of n.
func children(n Node) []Node {
	switch x := n.(type) {
	case *ListLit:
		out := make([]Node, 0, len(x.Elems))
		for _, e := range x.Elems {
			out = append(out, e)
		}
		return out
	case *RecordLit:
		out := make([]Node, 0, 2*len(x.Fields))
		for _, fl := range x.Fields {
			out = append(out, fl.Name, fl.Value)
		}
		return out
	case *CallExpr:
		out := []Node{x.Fun}
		for _, a := range x.Args {
			if a.Name != nil {
				out = append(out, a.Name)
			}
			out = append(out, a.Value)
		}
		return out
	case *ParenExpr:
		return []Node{x.X}
	case *UnitExpr:
		return []Node{x.X}
	case *InExpr:
		return []Node{x.X}
	case *FieldExpr:
		return []Node{x.X, x.Name}
	case *IndexExpr:
		return []Node{x.X, x.Index}
	case *UnaryExpr:
		return []Node{x.X}
	case *BinaryExpr:
		return []Node{x.X, x.Y}
	case *CondExpr:
		return []Node{x.Cond, x.Then, x.Else}
	case *ExprStmt:
		return []Node{x.X}
	case *BindStmt:
		return []Node{x.Name, x.Value}
	case *FormulaStmt:
		out := []Node{x.Name}
		for _, v := range x.Vars {
			out = append(out, v)
		}
		for _, v := range x.Params {
			out = append(out, v)
		}
		return append(out, x.Body)
	}
	return nil
}

// opText spells the operators as written.
var opText = map[Token]string{
	ADD: "+", SUB: "-", MUL: "*", QUO: "/", POW: "^",
	EQL: "==", NEQ: "!=", LSS: "<", LEQ: "<=", GTR: ">", GEQ: ">=",
	AND: "and", OR: "or", NOT: "not",
}

// Format prints a node as a compact s-expression, for tests and debugging:
// (+ 1 (unit 20 ms)), (call f x (= n 3)), (bind x 1),
// (formula f (x) (a b) body). Literals print as written.
func Format(n Node) string {
	var b strings.Builder
	format(&b, n)
	return b.String()
}

// FormatFile prints each statement of f with Format, one per line.
func FormatFile(f *File) string {
	parts := make([]string, len(f.Stmts))
	for i, s := range f.Stmts {
		parts[i] = Format(s)
	}
	return strings.Join(parts, "\n")
}

func format(b *strings.Builder, n Node) {
	w := func(parts ...any) {
		b.WriteByte('(')
		for i, p := range parts {
			if i > 0 {
				b.WriteByte(' ')
			}
			switch v := p.(type) {
			case string:
				b.WriteString(v)
			case Node:
				format(b, v)
			}
		}
		b.WriteByte(')')
	}
	switch x := n.(type) {
	case nil:
		b.WriteString("<nil>")
	case *Ident:
		b.WriteString(x.Name)
	case *NumberLit:
		b.WriteString(x.Raw)
	case *StringLit:
		b.WriteString(strconv.Quote(x.Value))
	case *BoolLit:
		b.WriteString(strconv.FormatBool(x.Value))
	case *ListLit:
		w(append([]any{"list"}, exprs(x.Elems)...)...)
	case *RecordLit:
		parts := []any{"record"}
		for _, f := range x.Fields {
			parts = append(parts, &BindStmt{Name: f.Name, Value: f.Value})
		}
		w(parts...)
	case *ParenExpr:
		w("paren", x.X)
	case *UnitExpr:
		w("unit", x.X, x.Unit)
	case *InExpr:
		w("in", x.X, x.Unit)
	case *CallExpr:
		parts := []any{"call", x.Fun}
		for _, a := range x.Args {
			if a.Name != nil {
				parts = append(parts, &BindStmt{Name: a.Name, Value: a.Value})
			} else {
				parts = append(parts, a.Value)
			}
		}
		w(parts...)
	case *FieldExpr:
		w(".", x.X, x.Name)
	case *IndexExpr:
		w("index", x.X, x.Index)
	case *UnaryExpr:
		w(opText[x.Op], x.X)
	case *BinaryExpr:
		w(opText[x.Op], x.X, x.Y)
	case *CondExpr:
		w("if", x.Cond, x.Then, x.Else)
	case *BadExpr:
		b.WriteString("(bad)")
	case *ExprStmt:
		format(b, x.X)
	case *BindStmt:
		w("=", x.Name, x.Value)
	case *FormulaStmt:
		w("formula", x.Name, "("+idents(x.Vars)+")", "("+idents(x.Params)+")", x.Body)
	case *BadStmt:
		b.WriteString("(badstmt)")
	default:
		b.WriteString("(?)")
	}
}

func exprs(list []Expr) []any {
	out := make([]any, len(list))
	for i, e := range list {
		out[i] = e
	}
	return out
}

func idents(list []*Ident) string {
	names := make([]string, len(list))
	for i, id := range list {
		names[i] = id.Name
	}
	return strings.Join(names, " ")
}
