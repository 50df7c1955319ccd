package syntax

import (
	"errors"
	"strings"
	"testing"
)

// FuzzParse checks, on any input, that Parse returns (no panic, no hang),
// reports at most MaxErrors errors with valid positions, never reports an
// internal error, and returns nodes whose spans lie inside the source and
// agree with their offsets.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"x = 20 ms", "f(1,", "if a then b else c"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		file, err := Parse("fz", src)
		if file == nil {
			t.Fatal("Parse returned a nil *File")
		}
		checkErrors(t, src, err)
		if err := checkSpans(src, allNodes(file)); err != nil {
			t.Fatal(err)
		}
		x, err := ParseExpr(src)
		if x == nil {
			t.Fatal("ParseExpr returned a nil Expr")
		}
		checkErrors(t, src, err)
		var nodes []Node
		Inspect(x, func(n Node) bool { nodes = append(nodes, n); return true })
		if err := checkSpans(src, nodes); err != nil {
			t.Fatal(err)
		}
	})
}

// checkErrors checks the error list a parse of src returned.
func checkErrors(t *testing.T, src string, err error) {
	t.Helper()
	if err == nil {
		return
	}
	var list ErrorList
	if !errors.As(err, &list) {
		t.Fatalf("error %v is not an ErrorList", err)
	}
	if list.Len() == 0 || list.Len() > MaxErrors {
		t.Fatalf("%d errors, want 1 to %d", list.Len(), MaxErrors)
	}
	for _, e := range list {
		if strings.Contains(e.Msg, "internal error") {
			t.Fatalf("parser bug on %q: %v", src, e)
		}
		if e.Pos.Offset < 0 || e.Pos.Offset > len(src) || e.Pos != posOf(src, e.Pos.Offset) {
			t.Fatalf("error %v has a bad position %+v", e, e.Pos)
		}
	}
}

// FuzzCompleteness checks that Completeness answers any input with a
// known status, an indent only when incomplete, and agrees with Parse:
// text that parses is complete and text that does not is not.
func FuzzCompleteness(f *testing.F) {
	for _, s := range []string{"", "f(1,", "x)", "if a then b", "\"ab"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		st, indent := Completeness(src)
		_, err := Parse("", src)
		switch {
		case st != Complete && st != Incomplete && st != Invalid:
			t.Fatalf("unknown status %d", st)
		case (err == nil) != (st == Complete):
			t.Fatalf("Completeness(%q) = %v but Parse error = %v", src, st, err)
		case st == Incomplete && (len(indent) < 4 || strings.Trim(indent, " ") != "" || len(indent)%4 != 0):
			t.Fatalf("Completeness(%q) indent %q, want a multiple of four spaces", src, indent)
		case st != Incomplete && indent != "":
			t.Fatalf("Completeness(%q) = %v with indent %q", src, st, indent)
		}
	})
}
