package display

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// demoTable is invented data: firing rates of five made-up cells.
func demoTable() *Table {
	return &Table{
		Title: "Rates of five invented cells",
		Columns: []Column{
			Texts("cell", []string{"a1", "a2", "b1", "b2", "c<1>"}),
			Numbers("I", "nA", []float64{0.1, 0.2, 0.3, 0.4, 0.5}),
			Numbers("rate", "Hz", []float64{0, 12.5, 31.25, math.NaN(), 104.0625}),
			Numbers("CV", "", []float64{math.NaN(), 0.81234, 0.5, 0.25, -0.00001}),
		},
		Note: "Invented demo data.",
	}
}

func longTable(n int) *Table {
	idx, v := make([]float64, n), make([]float64, n)
	for i := range n {
		idx[i] = float64(i + 1)
		v[i] = -70 + 0.01*float64(i)
	}
	return &Table{Title: "Long invented table", Columns: []Column{Numbers("step", "", idx), Numbers("V", "mV", v)}}
}

func TestTableGolden(t *testing.T) {
	cases := []struct {
		name string
		tab  *Table
	}{
		{"small", demoTable()},
		{"long", longTable(1000)},
	}
	for _, c := range cases {
		txt, err := c.tab.Text()
		if err != nil {
			t.Fatal(err)
		}
		h, err := c.tab.HTML()
		if err != nil {
			t.Fatal(err)
		}
		golden(t, "table_"+c.name+".txt.golden", txt)
		golden(t, "table_"+c.name+".html.golden", h)
	}
}

// TestTableCutLine checks which rows a long table shows: the first
// DefaultHead and last DefaultTail rows with a cut line between, unless the
// cut would hide MinCut rows or fewer, when every row is shown (a 30-row
// PSTH used to print "… 5 more rows"). The counts are plain arithmetic on
// 20 + 5 shown rows.
func TestTableCutLine(t *testing.T) {
	t.Parallel()
	cases := []struct {
		rows, shown int
		cut         string // the cut line, "" for none
	}{
		{1000, 25, `… 975 more rows (write(table, "file.csv") saves all)`},
		{36, 25, `… 11 more rows (write(table, "file.csv") saves all)`},
		{35, 35, ""}, // 10 would be hidden: show them
		{30, 30, ""},
		{25, 25, ""},
		{3, 3, ""},
	}
	for _, c := range cases {
		txt, err := longTable(c.rows).Text()
		if err != nil {
			t.Fatal(err)
		}
		lines := 1 + 2 + c.shown + 1 // title, header, rule, rows, footer
		if c.cut != "" {
			lines++
			if !strings.Contains(txt, c.cut) {
				t.Errorf("%d rows: cut line %q missing:\n%s", c.rows, c.cut, txt)
			}
		} else if strings.Contains(txt, "more row") {
			t.Errorf("%d rows: a cut line although only %d rows would be hidden:\n%s", c.rows, c.rows-25, txt)
		}
		if n := strings.Count(txt, "\n") + 1; n != lines {
			t.Errorf("%d rows: text has %d lines, want %d", c.rows, n, lines)
		}
	}
}

func TestColumnFormat(t *testing.T) {
	cases := []struct {
		name string
		xs   []float64
		want []string
	}{
		// Four significant digits at the largest magnitude, common decimals
		// (common practice for tables of measurements).
		{"rates", []float64{12.3456, 3.1, 0.5}, []string{"12.35", "3.10", "0.50"}},
		{"whole", []float64{1, 20, 300}, []string{"1", "20", "300"}},
		{"large", []float64{1.5e7 + 0.5, 2.25e6}, []string{"1.500e+07", "2.250e+06"}},
		{"whole large", []float64{15000000, 2}, []string{"15000000", "2"}},
		{"tiny", []float64{1e-9, 2.5e-10}, []string{"1.000e-09", "2.500e-10"}},
		{"negzero", []float64{-0.00001, 12.5}, []string{"-1.000e-05", "1.250e+01"}},
		{"mV", []float64{-70.123, -65, 30.5}, []string{"-70.12", "-65.00", "30.50"}},
		{"rounds to zero", []float64{-0.001, 100.5}, []string{"-1.000e-03", "1.005e+02"}},
	}
	for _, c := range cases {
		f := columnFormat(c.xs, 0)
		for i, x := range c.xs {
			if got := f.format(x, "NaN", "Inf"); got != c.want[i] {
				t.Errorf("%s: %v formatted %q, want %q", c.name, x, got, c.want[i])
			}
		}
	}
}

// TestColumnGroup checks that number columns of one Group share decimals,
// so that measured − model = residual reads right to the last shown digit
// (four significant digits at the group's largest magnitude, common
// practice for tables of measurements), while other columns keep their own.
// The invented values: 120.5 − 7.891 = 112.609.
func TestColumnGroup(t *testing.T) {
	t.Parallel()
	cols := func(group string, digits int) []Column {
		return []Column{
			{Name: "measured", Kind: NumberColumn, Numbers: []float64{120.5, 3}, Group: group},
			{Name: "model", Kind: NumberColumn, Numbers: []float64{7.891, 2.25}, Group: group, Digits: digits},
			{Name: "residual", Kind: NumberColumn, Numbers: []float64{112.609, 0.75}, Group: group},
			{Name: "weight", Kind: NumberColumn, Numbers: []float64{0.123456, 1}},
		}
	}
	cases := []struct {
		name string
		cols []Column
		want [][]string // want[col][row]
	}{
		{"no group: own decimals", cols("", 0), [][]string{{"120.5", "3.0"}, {"7.891", "2.250"}, {"112.6", "0.8"}, {"0.123", "1.000"}}},
		{"one group: shared decimals", cols("rate", 0), [][]string{{"120.5", "3.0"}, {"7.9", "2.2"}, {"112.6", "0.8"}, {"0.123", "1.000"}}},
		{"largest Digits of the group", cols("rate", 5), [][]string{{"120.50", "3.00"}, {"7.89", "2.25"}, {"112.61", "0.75"}, {"0.123", "1.000"}}},
		{"a group of one", cols("x", 0)[3:], [][]string{{"0.123", "1.000"}}},
	}
	for _, c := range cases {
		tab := &Table{Columns: c.cols}
		got := tab.cells([]int{0, 1}, "NaN", "Inf")
		for j := range c.want {
			for k := range c.want[j] {
				if got[j][k] != c.want[j][k] {
					t.Errorf("%s: %s row %d = %q, want %q", c.name, c.cols[j].Name, k, got[j][k], c.want[j][k])
				}
			}
		}
	}
}

func TestFormatNumber(t *testing.T) {
	cases := []struct {
		x    float64
		want string
	}{
		{100001, "100,001"}, {-75.234, "−75.23"}, {41.9, "41.9"}, {0, "0"},
		{1e-6, "1e−6"}, {2.5e12, "2.5e12"}, {math.NaN(), "NaN"}, {math.Inf(-1), "−∞"},
		{0.000123456, "0.0001235"},
	}
	for _, c := range cases {
		if got := FormatNumber(c.x, 0); got != c.want {
			t.Errorf("FormatNumber(%v) = %q, want %q", c.x, got, c.want)
		}
	}
}

// TestTableCSV reads the CSV back with the standard library's RFC 4180
// reader and strconv: every value must come back bit for bit.
func TestTableCSV(t *testing.T) {
	tab := longTable(300)
	tab.Columns[1].Numbers[7] = math.NaN()
	tab.Columns[1].Numbers[8] = math.Inf(-1)
	tab.Columns[1].Numbers[9] = 1.0 / 3
	dir := t.TempDir()
	path := filepath.Join(dir, "rows.csv")
	if err := tab.WriteCSV(path); err != nil {
		t.Fatal(err)
	}
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	recs, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != 301 || recs[0][1] != "V (mV)" {
		t.Fatalf("got %d records, header %v; want 301 and V (mV)", len(recs), recs[0])
	}
	for i, r := range recs[1:] {
		got, err := strconv.ParseFloat(r[1], 64)
		want := tab.Columns[1].Numbers[i]
		if err != nil || !(got == want || math.IsNaN(got) && math.IsNaN(want)) {
			t.Errorf("row %d: %q reads back as %v, want %v", i, r[1], got, want)
		}
	}
}

func TestTableJSON(t *testing.T) {
	raw, err := demoTable().JSON()
	if err != nil {
		t.Fatal(err)
	}
	var v struct {
		Order   []string
		Units   map[string]string
		Columns map[string][]any
		Rows    int
	}
	if err := json.Unmarshal(raw, &v); err != nil { // RFC 8259 has no NaN: must be null
		t.Fatalf("invalid JSON: %v\n%s", err, raw)
	}
	if v.Rows != 5 || v.Units["rate"] != "Hz" || v.Columns["rate"][3] != nil || v.Columns["rate"][1] != 12.5 {
		t.Errorf("unexpected JSON: %s", raw)
	}
}

func TestTableBundle(t *testing.T) {
	b, err := demoTable().Bundle()
	if err != nil {
		t.Fatal(err)
	}
	for _, m := range []string{MIMEText, MIMEHTML, MIMECSV, MIMEJSON} {
		if b.Data[m] == nil {
			t.Errorf("bundle lacks %s", m)
		}
	}
	h := b.Data[MIMEHTML].(string)
	for _, bad := range []string{"<script", "<link", "<style", "class=\"c<1>\""} {
		if strings.Contains(h, bad) {
			t.Errorf("HTML contains %q", bad)
		}
	}
	if !strings.Contains(h, "c&lt;1&gt;") || !strings.Contains(h, "—") {
		t.Errorf("HTML does not escape text or show NaN as —:\n%s", h)
	}
}

func TestTableErrors(t *testing.T) {
	cases := []struct {
		name string
		tab  *Table
		want string
	}{
		{"nil", nil, "table is nil"},
		{"no columns", &Table{Title: "x"}, "has no columns"},
		{"ragged", &Table{Columns: []Column{Numbers("a", "", []float64{1, 2}), Numbers("b", "", []float64{1})}}, `column "b" has 1 rows but column "a" has 2`},
		{"duplicate", &Table{Columns: []Column{Numbers("a", "", nil), Numbers("a", "", nil)}}, "appears twice"},
		{"unnamed", &Table{Columns: []Column{Numbers("", "", nil)}}, "has no name"},
	}
	for _, c := range cases {
		if _, err := c.tab.Bundle(); err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "display: ") {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

func TestSaveErrors(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "plain")
	if err := os.WriteFile(file, nil, 0o644); err != nil {
		t.Fatal(err)
	}
	ro := filepath.Join(dir, "ro")
	if err := os.Mkdir(ro, 0o555); err != nil {
		t.Fatal(err)
	}
	unwritable := filepath.Join(ro, "t.csv")
	if os.Getuid() == 0 {
		unwritable = "/proc/loligo-display-test.csv" // root may write anywhere but /proc
	}
	cases := []struct {
		name, path, want string
	}{
		{"missing folder", filepath.Join(dir, "nope", "t.csv"), "does not exist"},
		{"folder is a file", filepath.Join(file, "t.csv"), "is not a folder"},
		{"unwritable", unwritable, "not writable"},
		{"empty", "", "empty file name"},
	}
	for _, c := range cases {
		err := demoTable().WriteCSV(c.path)
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.name, err, c.want)
		}
	}
	noFiles(t, ro)
}
