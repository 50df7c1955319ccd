package syntax

import (
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"
)

// posOf computes the Pos of byte offset off in src independently of the
// scanner: lines split at '\n', columns count code points (an invalid byte
// counts as one, as utf8.DecodeRuneInString steps over it), and a leading
// byte-order mark takes no column.
func posOf(src string, off int) Pos {
	p := Pos{Offset: off, Line: 1, Col: 1}
	i := 0
	if strings.HasPrefix(src, "\uFEFF") {
		i = 3
	}
	for i < off && i < len(src) {
		r, w := utf8.DecodeRuneInString(src[i:])
		if r == '\n' {
			p.Line++
			p.Col = 1
		} else {
			p.Col++
		}
		i += w
	}
	return p
}

// posTable returns posOf(src, i) for every offset i from 0 to len(src), in
// one pass (the fuzz test checks thousands of nodes per input). An offset
// inside a multi-byte character gets, like posOf, the line and column just
// after that character.
func posTable(src string) []Pos {
	table := make([]Pos, len(src)+1)
	line, col, i := 1, 1, 0
	if strings.HasPrefix(src, "\uFEFF") {
		for ; i < 3; i++ {
			table[i] = Pos{Offset: i, Line: 1, Col: 1}
		}
	}
	for i < len(src) {
		table[i] = Pos{Offset: i, Line: line, Col: col}
		r, w := utf8.DecodeRuneInString(src[i:])
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
		for k := 1; k < w; k++ {
			table[i+k] = Pos{Offset: i + k, Line: line, Col: col}
		}
		i += w
	}
	table[len(src)] = Pos{Offset: len(src), Line: line, Col: col}
	return table
}

func TestPosTable(t *testing.T) {
	t.Parallel()
	for _, src := range []string{"", "a\nbµc\n", "\uFEFFx\xffé", "\n\n"} {
		table := posTable(src)
		for off := range table {
			if table[off] != posOf(src, off) {
				t.Errorf("posTable(%q)[%d] = %+v, posOf = %+v", src, off, table[off], posOf(src, off))
			}
		}
	}
}

// allNodes returns every node of f.
func allNodes(f *File) []Node {
	var out []Node
	for _, s := range f.Stmts {
		Inspect(s, func(n Node) bool {
			out = append(out, n)
			return true
		})
	}
	return out
}

// checkSpans reports any node whose span is not inside src, runs
// backwards, or whose line and column disagree with its offset.
func checkSpans(src string, nodes []Node) error {
	table := posTable(src)
	for _, n := range nodes {
		p, e := n.Pos(), n.End()
		if p.Offset < 0 || e.Offset > len(src) || p.Offset > e.Offset {
			return fmt.Errorf("%s: span %d..%d outside 0..%d or reversed", Format(n), p.Offset, e.Offset, len(src))
		}
		for _, q := range []Pos{p, e} {
			if want := table[q.Offset]; q != want {
				return fmt.Errorf("%s: position %+v, but offset %d is at %d:%d", Format(n), q, q.Offset, want.Line, want.Col)
			}
		}
	}
	return nil
}

func TestPositions(t *testing.T) {
	t.Parallel()
	type span struct {
		text      string
		line, col int
	}
	cases := []struct {
		name string
		src  string
		want []span
	}{
		{"bind unit", "x = 20 ms", []span{{"x", 1, 1}, {"20 ms", 1, 5}, {"20", 1, 5}}},
		{"multi-byte", "µ = \"é\" + τ_m\nΩ2 = °C", []span{
			{`"é"`, 1, 5}, {"τ_m", 1, 11}, {`"é" + τ_m`, 1, 5}, {"Ω2", 2, 1}, {"°C", 2, 6}, {"Ω2 = °C", 2, 1}}},
		{"multi-line call", "r = f(a,\n  n = 3 mV)\nr.v", []span{
			{"f(a,\n  n = 3 mV)", 1, 5}, {"n", 2, 3}, {"3 mV", 2, 7}, {"r.v", 3, 1}, {"v", 3, 3}}},
		{"formula", "formula g(x; k) = k * x", []span{
			{"formula g(x; k) = k * x", 1, 1}, {"g", 1, 9}, {"x", 1, 11}, {"k", 1, 14}, {"k * x", 1, 19}}},
		{"operators", "-a^2 + b and not c", []span{{"-a^2", 1, 1}, {"a^2", 1, 2}, {"not c", 1, 14}, {"-a^2 + b", 1, 1}}},
		{"cond in index", "t[if a then 1 else 2] in mV", []span{
			{"t[if a then 1 else 2] in mV", 1, 1}, {"if a then 1 else 2", 1, 3}, {"t[if a then 1 else 2]", 1, 1}}},
		{"records lists", "(a = [1, 2] pA, b = ())", []span{
			{"(a = [1, 2] pA, b = ())", 1, 1}, {"[1, 2] pA", 1, 6}, {"()", 1, 21}, {"(a", 0, 0}}},
		{"paren bool", "(true)\nfalse", []span{{"(true)", 1, 1}, {"true", 1, 2}, {"false", 2, 1}}},
		{"bom", "\uFEFFx = 1", []span{{"x", 1, 1}, {"1", 1, 5}}},
		{"tab crlf", "\tx = 1\r\n\ty", []span{{"x", 1, 2}, {"y", 2, 2}}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Parse("p", tc.src)
			if err != nil {
				t.Fatal(err)
			}
			nodes := allNodes(f)
			if err := checkSpans(tc.src, nodes); err != nil {
				t.Fatal(err)
			}
			for _, w := range tc.want {
				found := false
				for _, n := range nodes {
					p := n.Pos()
					if tc.src[p.Offset:n.End().Offset] == w.text && p.Line == w.line && p.Col == w.col {
						found = true
					}
				}
				if found != (w.line > 0) { // line 0 marks a span no node may have
					t.Errorf("node %q at %d:%d: found = %v", w.text, w.line, w.col, found)
				}
			}
		})
	}
}

// TestPartialSpans checks the spans of the placeholder and partial nodes
// that a parse with errors returns.
func TestPartialSpans(t *testing.T) {
	t.Parallel()
	for _, src := range []string{
		"f(1, µ", "[1, 2", "(a = 1", "if a then", "x = ", "formula", "formula f(x",
		"r.", "x in", "a[µ", ") ] ,", "\"µµ", "f(é\n\n", "1 + * 2", "x = (µ",
	} {
		f, err := Parse("p", src)
		if err == nil {
			t.Errorf("Parse(%q): no error", src)
		}
		if err := checkSpans(src, allNodes(f)); err != nil {
			t.Errorf("Parse(%q): %v", src, err)
		}
	}
}
