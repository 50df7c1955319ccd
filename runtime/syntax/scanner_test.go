package syntax

import (
	"strings"
	"testing"
)

// tokens formats the kinds and texts of src's items, "NUMBER:20 IDENT:ms".
func tokens(src string) string {
	var parts []string
	for _, it := range Scan(src) {
		if it.Tok == EOF {
			break
		}
		parts = append(parts, tokName(it.Tok)+":"+it.Lit)
	}
	return strings.Join(parts, " ")
}

func tokName(t Token) string {
	switch t {
	case IDENT:
		return "IDENT"
	case NUMBER:
		return "NUMBER"
	case STRING:
		return "STRING"
	case ILLEGAL:
		return "ILLEGAL"
	case NEWLINE:
		return "NL"
	}
	return "OP"
}

func TestScan(t *testing.T) {
	t.Parallel()
	// Letter categories are those of the Unicode Standard (UCD 15,
	// General_Category): µ U+00B5 and μ U+03BC are Ll, Ω U+03A9 is Lu;
	// ° U+00B0 is So, admitted by our grammar only to start a name.
	cases := []struct{ name, src, want string }{
		{"number then unit", "20ms", "NUMBER:20 IDENT:ms"},
		{"numbers", "1 1.5 .5 5. 1e-3 2.5E+4", "NUMBER:1 NUMBER:1.5 NUMBER:.5 NUMBER:5. NUMBER:1e-3 NUMBER:2.5E+4"},
		{"e not exponent", "1eV 2e+x", "NUMBER:1 IDENT:eV NUMBER:2 IDENT:e OP:+ IDENT:x"},
		{"micro and ohm", "µs μs MΩ °C", "IDENT:µs IDENT:μs IDENT:MΩ IDENT:°C"},
		{"operators", "+-*/^==!=<<=>>==()[],;.", "OP:+ OP:- OP:* OP:/ OP:^ OP:== OP:!= OP:< OP:<= OP:> OP:>= OP:= OP:( OP:) OP:[ OP:] OP:, OP:; OP:."},
		{"keywords", "and or not in if then else true false formula", "OP:and OP:or OP:not OP:in OP:if OP:then OP:else OP:true OP:false OP:formula"},
		{"comments and newlines", "a # c\n\nb", "IDENT:a NL:\n NL:\n IDENT:b"},
		{"string", `"a\"b" x`, `STRING:"a\"b" IDENT:x`},
		{"unterminated", "\"abc\nx", "ILLEGAL:\"abc NL:\n IDENT:x"},
		{"illegal", "a @ b", "IDENT:a ILLEGAL:@ IDENT:b"},
		{"invalid byte", "a\xffb", "IDENT:a ILLEGAL:\xff IDENT:b"},
		{"field", "r.v", "IDENT:r OP:. IDENT:v"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			if got := tokens(tc.src); got != tc.want {
				t.Errorf("Scan(%q)\n got %s\nwant %s", tc.src, got, tc.want)
			}
		})
	}
}

func TestScanKeywordTokens(t *testing.T) {
	t.Parallel()
	for word, tok := range Keywords {
		items := Scan(word)
		if len(items) != 2 || items[0].Tok != tok {
			t.Errorf("Scan(%q) = %v, want %v then EOF", word, items, tok)
		}
	}
}

func TestScanPositions(t *testing.T) {
	t.Parallel()
	src := "µ = 1\n  \"é\" ms"
	items := Scan(src)
	for _, it := range items {
		if it.Pos != posOf(src, it.Pos.Offset) || it.End != posOf(src, it.End.Offset) {
			t.Errorf("item %q at %+v..%+v disagrees with its offsets", it.Lit, it.Pos, it.End)
		}
		if src[it.Pos.Offset:it.End.Offset] != it.Lit {
			t.Errorf("item Lit %q is not its source text", it.Lit)
		}
	}
	last := items[len(items)-1]
	if last.Tok != EOF || last.Pos != (Pos{Offset: len(src), Line: 2, Col: 9}) {
		t.Errorf("last item = %+v, want EOF at 2:9", last)
	}
}

func TestStringValues(t *testing.T) {
	t.Parallel()
	// Expected values written as Go string literals, whose escapes (The Go
	// Programming Language Specification, "String literals") mean the
	// same for \" \\ \n \t; \u{HEX} is our spelling of a code point.
	cases := []struct{ src, want string }{
		{`"plain"`, "plain"},
		{`"q\"q"`, `q"q`},
		{`"b\\s"`, `b\s`},
		{`"l\nt\t"`, "l\nt\t"},
		{`"\u{3bc}\u{1F600}\u{41}"`, "\u03bc\U0001F600A"},
		{`""`, ""},
	}
	for _, tc := range cases {
		x, err := ParseExpr(tc.src)
		s, ok := x.(*StringLit)
		if err != nil || !ok || s.Value != tc.want {
			t.Errorf("ParseExpr(%s) = %#v, %v; want value %q", tc.src, x, err, tc.want)
		}
	}
}
