package table

import (
	"bytes"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// near reports whether got is within abs or rel·|want| of want; NaN matches NaN.
// It is the one tolerance helper of this package's tests.
func near(got, want, abs, rel float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	if got == want {
		return true
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

// TestSplitHeader checks the header convention "name (unit)" / "name [unit]".
// The bracket notation for units follows the habit of SI practice for table
// headings (BIPM SI Brochure, 9th ed., 2019, sec. 5.4.6 on quantity/unit
// labels — common practice).
func TestSplitHeader(t *testing.T) {
	t.Parallel()
	cases := []struct{ cell, name, unit string }{
		{"current (pA)", "current", "pA"},
		{"rate [Hz]", "rate", "Hz"},
		{"  v  ( mV ) ", "v", "mV"},
		{"g (mS/(cm^2))", "g", "mS/(cm^2)"},
		{"time", "time", ""},
		{"a (b) (c)", "a (b)", "c"},
		{"x [", "x [", ""},
		{"x)", "x)", ""},
		{"(pA)", "", "pA"},
		{"", "", ""},
	}
	for _, c := range cases {
		if n, u := SplitHeader(c.cell); n != c.name || u != c.unit {
			t.Errorf("SplitHeader(%q) = %q, %q; want %q, %q", c.cell, n, u, c.name, c.unit)
		}
	}
}

// sample is invented demo data for the tests. It uses RFC 4180 features:
// CRLF line ends (sec. 2.1), a quoted field with a comma and a doubled quote
// (sec. 2.6, 2.7) and a quoted line break (sec. 2.6).
const sample = "\ufeff# invented demo data, not a recording\r\n" +
	"time (s),current [pA],label,rate\r\n" +
	"0,10,\"a, \"\"b\"\"\",1.5\r\n" +
	"# a comment between rows\r\n" +
	"0.5,NA,\"two\nlines\",\r\n" +
	"1, 2.5e1 ,c,-3\r\n"

// TestReadCSV checks kinds, units, missing values and comments.
func TestReadCSV(t *testing.T) {
	t.Parallel()
	tab, err := ReadCSV(strings.NewReader(sample))
	if err != nil {
		t.Fatal(err)
	}
	if tab.Len() != 3 || strings.Join(tab.Names(), "|") != "time|current|label|rate" {
		t.Fatalf("len %d, names %v", tab.Len(), tab.Names())
	}
	want := []struct {
		name, unit string
		vals       []float64
	}{
		{"time", "s", []float64{0, 0.5, 1}},
		{"current", "pA", []float64{10, math.NaN(), 25}},
		{"rate", "", []float64{1.5, math.NaN(), -3}},
	}
	for _, w := range want {
		v, u, err := tab.Floats(w.name)
		if err != nil || u != w.unit {
			t.Fatalf("%s: unit %q, err %v", w.name, u, err)
		}
		for i := range w.vals {
			if !near(v[i], w.vals[i], 0, 0) { // decimal literals parse exactly to the same float64
				t.Errorf("%s[%d] = %v, want %v", w.name, i, v[i], w.vals[i])
			}
		}
	}
	lab, _ := tab.Column("label")
	if lab.Kind != String || lab.Strings[0] != `a, "b"` || lab.Strings[1] != "two\nlines" {
		t.Errorf("label column %+v", lab)
	}
	if len(tab.Comments) != 2 || tab.Comments[0] != "invented demo data, not a recording" {
		t.Errorf("comments %q", tab.Comments)
	}
}

// TestReadErrors checks that bad input gives errors naming line and column.
func TestReadErrors(t *testing.T) {
	t.Parallel()
	cases := []struct{ name, in, want string }{
		{"bad number", "# invented\nt (s),rate\n0,1\n1,2\n2,3\n3,4\n4,12..5\n", `table: line 7, column rate: cannot read "12..5" as a number`},
		{"unit forces numbers", "x (mV)\nabc\n", `line 2, column x: cannot read "abc"`},
		{"short row", "a,b\n1\n", "line 2 has 1 cells but the header has 2"},
		{"no header", "# only a comment\n", "no header line"},
		{"empty input", "", "no header line"},
		{"duplicate", "a (s),a\n1,2\n", `column name "a" appears twice (columns 1 and 2)`},
		{"nameless", "a,(pA)\n1,2\n", "line 1, column 2 has no name"},
		{"bare quote", "a,b\n1,x\"y\n", "line 2"},
	}
	for _, c := range cases {
		_, err := ReadCSV(strings.NewReader(c.in))
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "table: ") {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

// TestColumnErrors checks the close-match suggestion (edit distance with
// swaps, Damerau 1964) and the list of columns when nothing is close.
func TestColumnErrors(t *testing.T) {
	t.Parallel()
	tab := New()
	_ = tab.AddFloats("rate", "Hz", []float64{1, 2})
	_ = tab.AddFloats("time", "s", []float64{0, 1})
	_ = tab.AddStrings("label", []string{"a", "b"})
	cases := []struct{ name, want string }{
		{"rat", `table: no column "rat"; did you mean "rate"?`},
		{"Time", `table: no column "Time"; did you mean "time"?`},
		{"lable", `table: no column "lable"; did you mean "label"?`},
		{"voltage", `table: no column "voltage"; the columns are "rate", "time", "label"`},
	}
	for _, c := range cases {
		if _, err := tab.Column(c.name); err == nil || err.Error() != c.want {
			t.Errorf("Column(%q): %v, want %q", c.name, err, c.want)
		}
	}
	if _, _, err := tab.Floats("label"); err == nil || !strings.Contains(err.Error(), "holds text") {
		t.Errorf("Floats(label): %v", err)
	}
	if err := tab.AddFloats("x", "", []float64{1}); err == nil || !strings.Contains(err.Error(), "has 1 rows but the table has 2") {
		t.Errorf("AddFloats short: %v", err)
	}
	if err := tab.AddFloats("rate", "", []float64{1, 2}); err == nil || !strings.Contains(err.Error(), "already") {
		t.Errorf("AddFloats duplicate: %v", err)
	}
}

// TestEditDistance checks the textbook example kitten → sitting = 3
// (Levenshtein distance, common practice), a swap counting as one edit
// (Damerau 1964), the restricted form giving 3, not 2, for ca → abc (the
// usual illustration of optimal string alignment, common practice) and
// trivial cases.
func TestEditDistance(t *testing.T) {
	t.Parallel()
	cases := []struct {
		a, b string
		d    int
	}{{"kitten", "sitting", 3}, {"", "abc", 3}, {"flaw", "lawn", 2}, {"same", "same", 0}, {"lable", "label", 1}, {"ca", "abc", 3}}
	for _, c := range cases {
		if d := editDistance(c.a, c.b); d != c.d {
			t.Errorf("editDistance(%q, %q) = %d, want %d", c.a, c.b, d, c.d)
		}
	}
}

// equalTables reports the first difference between two tables, or "".
func equalTables(a, b *Table) string {
	if a.Len() != b.Len() || strings.Join(a.Names(), "\x00") != strings.Join(b.Names(), "\x00") {
		return "shape or names differ"
	}
	if strings.Join(a.Comments, "\x00") != strings.Join(b.Comments, "\x00") {
		return "comments differ"
	}
	for j := range a.cols {
		ca, cb := &a.cols[j], &b.cols[j]
		if ca.Kind != cb.Kind || ca.Unit != cb.Unit {
			return "kind or unit of " + ca.Name + " differ"
		}
		for i := 0; i < a.n; i++ {
			if ca.Kind == String && ca.Strings[i] != cb.Strings[i] ||
				ca.Kind == Float && !near(cb.Floats[i], ca.Floats[i], 0, 0) && math.Float64bits(ca.Floats[i]) != math.Float64bits(cb.Floats[i]) {
				return "row values of " + ca.Name + " differ"
			}
		}
	}
	return ""
}

// TestRoundTrip checks write → read gives back an equal table, values bit for
// bit (shortest round-trip formatting, strconv docs), including awkward cells.
func TestRoundTrip(t *testing.T) {
	t.Parallel()
	tab := New()
	tab.Comments = []string{"invented values for a round trip"}
	_ = tab.AddFloats("t", "s", []float64{0, 1e-300, math.Inf(1), math.NaN(), 0.1 + 0.2})
	_ = tab.AddFloats("f(x)", "", []float64{1, 2, 3, 4, 5})
	_ = tab.AddFloats("g", "mS/(cm^2)", []float64{-1, -2, -3, -4, -5})
	_ = tab.AddStrings("#note", []string{"#x", " lead", "a,b", "q\"q", "line\nbreak"})
	var buf bytes.Buffer
	if err := tab.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	back, err := ReadCSV(&buf)
	if err != nil {
		t.Fatalf("%v\n%s", err, buf.String())
	}
	if d := equalTables(tab, back); d != "" {
		t.Errorf("round trip: %s\n%s", d, buf.String())
	}
}

// TestFilterSelect checks row filtering and column selection, and that the
// source table is unchanged.
func TestFilterSelect(t *testing.T) {
	t.Parallel()
	tab := New()
	_ = tab.AddFloats("a", "s", []float64{1, 2, 3})
	_ = tab.AddStrings("b", []string{"x", "y", "z"})
	f, err := tab.Filter([]bool{true, false, true})
	if err != nil || f.Len() != 2 {
		t.Fatalf("Filter: %v, len %d", err, f.Len())
	}
	a, _, _ := f.Floats("a")
	b, _ := f.Column("b")
	if a[0] != 1 || a[1] != 3 || b.Strings[1] != "z" {
		t.Errorf("filtered %v %v", a, b.Strings)
	}
	s, err := tab.Select("b")
	if err != nil || strings.Join(s.Names(), ",") != "b" || s.Len() != 3 {
		t.Errorf("Select: %v %v", err, s.Names())
	}
	if _, err := tab.Filter([]bool{true}); err == nil || !strings.Contains(err.Error(), "1 entries but the table has 3 rows") {
		t.Errorf("short mask: %v", err)
	}
	if _, err := tab.Select("a", "a"); err == nil || !strings.Contains(err.Error(), "twice") {
		t.Errorf("repeat select: %v", err)
	}
	a2, _, _ := tab.Floats("a")
	a2[0] = 99 // a copy: must not reach the table
	if a3, _, _ := tab.Floats("a"); a3[0] != 1 {
		t.Error("Floats returned the table's own storage")
	}
}

// TestWriteFile checks the atomic write: the file appears complete, a failing
// write leaves the old file untouched and no temporary file behind, and a
// missing folder is an error.
func TestWriteFile(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	path := filepath.Join(dir, "out.csv")
	tab := New()
	_ = tab.AddFloats("rate", "Hz", []float64{1, 2})
	if err := tab.WriteFile(path); err != nil {
		t.Fatal(err)
	}
	got, _ := os.ReadFile(path)
	if string(got) != "rate (Hz)\n1\n2\n" {
		t.Errorf("file = %q", got)
	}
	boom := errors.New("disk full")
	err := writeAtomic(path, func(w io.Writer) error {
		io.WriteString(w, "partial")
		return boom
	})
	if !errors.Is(err, boom) {
		t.Errorf("failing write: %v", err)
	}
	if again, _ := os.ReadFile(path); string(again) != string(got) {
		t.Errorf("failed write changed the file to %q", again)
	}
	os.Mkdir(filepath.Join(dir, "adir"), 0o755)
	if err := tab.WriteFile(filepath.Join(dir, "adir")); err == nil {
		t.Error("writing over a folder succeeded")
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 2 {
		t.Errorf("folder holds %d entries, want out.csv and adir only (no temporary files)", len(ents))
	}
	err = tab.WriteFile(filepath.Join(dir, "missing", "x.csv"))
	if err == nil || !strings.Contains(err.Error(), "does not exist; create it first") {
		t.Errorf("missing folder: %v", err)
	}
}
