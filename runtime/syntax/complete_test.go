package syntax

import "testing"

func TestCompleteness(t *testing.T) {
	t.Parallel()
	// The three statuses and the indent hint are those of the Jupyter
	// messaging protocol's is_complete_reply (jupyter-client
	// documentation, "Code completeness"): "complete", "incomplete" with
	// an indent string, "invalid".
	cases := []struct {
		name, src string
		st        Status
		indent    string
	}{
		{"empty", "", Complete, ""},
		{"blank", "  \n# note\n", Complete, ""},
		{"simple", "x = 20 ms", Complete, ""},
		{"multi-line done", "f(1,\n  2)", Complete, ""},
		{"open paren", "f(1,", Incomplete, "    "},
		{"two open", "f(g(1,", Incomplete, "        "},
		{"open bracket newline", "xs = [1, 2,\n", Incomplete, "    "},
		{"trailing plus", "x = 1 +", Incomplete, "    "},
		{"trailing assign", "x =", Incomplete, "    "},
		{"trailing comma in list", "[1,", Incomplete, "    "},
		{"trailing in", "v in", Incomplete, "    "},
		{"trailing and", "a and", Incomplete, "    "},
		{"trailing not", "not", Incomplete, "    "},
		{"if then no else", "if a then b", Incomplete, "    "},
		{"if then no else newline", "y = if a then b\n", Incomplete, "    "},
		{"if else done", "if a then b\nelse c", Complete, ""},
		{"formula head", "formula f(x; a) =", Incomplete, "    "},
		{"stray close", "x = 1)", Invalid, ""},
		{"stray close first", ") + (", Invalid, ""},
		{"unterminated string", `s = "abc`, Invalid, ""},
		{"illegal char", "x = 3 @", Invalid, ""},
		{"error before open", "x = 1 2 + (", Invalid, ""},
		{"number out of range", "1e999 +", Invalid, ""},
		{"bad utf-8", "x = \xff", Invalid, ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			st, ind := Completeness(tc.src)
			if st != tc.st || ind != tc.indent {
				t.Errorf("Completeness(%q) = %v %q, want %v %q", tc.src, st, ind, tc.st, tc.indent)
			}
		})
	}
	for st, want := range map[Status]string{Complete: "complete", Incomplete: "incomplete", Invalid: "invalid"} {
		if st.String() != want {
			t.Errorf("Status(%d).String() = %q, want %q", st, st.String(), want)
		}
	}
}
