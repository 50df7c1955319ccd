package stdlib

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/table"
)

// TableValue is a table of the language: named columns of numbers, each
// with a unit, or of text. Values are kept as written in each column's unit
// (100 in a pA column); fields give them as vectors in SI with their
// dimension. A TableValue is never modified: filtering makes a new one.
type TableValue struct {
	t     *table.Table
	units []units.Unit // per column; the zero Unit for text columns
	Title string       // shown above the table; the file name for read()
}

var (
	_ runtime.Shower  = (*TableValue)(nil)
	_ runtime.Fielder = (*TableValue)(nil)
	_ runtime.Indexer = (*TableValue)(nil)
	_ runtime.Lener   = (*TableValue)(nil)
	_ runtime.Helper  = (*TableValue)(nil)
	_ Plottable       = (*TableValue)(nil)
)

// NewTableValue wraps t, resolving each number column's unit text ("pA",
// "mS/cm^2"; empty means dimensionless) with runtime/units. The error names
// the column whose unit is unknown. t must not be modified afterwards.
func NewTableValue(t *table.Table) (*TableValue, error) {
	tv := &TableValue{t: t, units: make([]units.Unit, len(t.Names()))}
	for i, name := range t.Names() {
		col, _ := t.Column(name)
		if col.Kind != table.Float {
			continue
		}
		u, err := columnUnit(col.Unit)
		if err != nil {
			return nil, columnUnitError(name, col.Unit, err)
		}
		tv.units[i] = u
	}
	return tv, nil
}

// angleUnits are header units of angles. Angles are plain numbers in the
// language (the SI treats the radian as dimensionless), so such a column
// goes without a unit rather than with a near miss such as degC.
var angleUnits = map[string]bool{"deg": true, "degree": true, "degrees": true, "°": true,
	"rad": true, "radian": true, "radians": true}

// columnUnitError says what is wrong with a header's unit and how to write it:
// a physical unit, or nothing for a dimensionless column.
func columnUnitError(name, unit string, err error) error {
	if angleUnits[strings.ToLower(strings.TrimSpace(unit))] {
		return runtime.UnitErrorf("table: column %q: angles are dimensionless numbers and take no unit; "+
			"write the header as %q and keep the values as they are (the column name can say degrees, e.g. %q)", name, name, name+"_deg")
	}
	return runtime.UnitErrorf("table: column %q: %v; write a unit such as pA, mV or Hz in the header, e.g. %q, "+
		"or no unit for a dimensionless column (a count, an angle, a ratio), e.g. %q", name, err, name+" (pA)", name)
}

func columnUnit(text string) (units.Unit, error) {
	if text == "" || text == "1" {
		return units.Unit{Scale: 1}, nil
	}
	return units.Parse(text)
}

// Table returns the underlying table (not to be modified).
func (tv *TableValue) Table() *table.Table { return tv.t }

// Type implements runtime.Value.
func (*TableValue) Type() string { return "table" }

// String is a one-line summary: "table l5-steps.csv: 12 rows × 3 columns
// (current (pA), rate (Hz), rate_se (Hz))".
func (tv *TableValue) String() string {
	heads := make([]string, len(tv.units))
	for i, name := range tv.t.Names() {
		heads[i] = Label(name, tv.units[i])
	}
	title := ""
	if tv.Title != "" {
		title = " " + tv.Title
	}
	return fmt.Sprintf("table%s: %s × %s (%s)", title, plural(tv.t.Len(), "row"),
		plural(len(heads), "column"), strings.Join(heads, ", "))
}

func plural(n int, word string) string {
	if n == 1 {
		return "1 " + word
	}
	return display.FormatCount(n) + " " + word + "s"
}

// Len implements runtime.Lener: the number of rows.
func (tv *TableValue) Len() int { return tv.t.Len() }

// FieldNames implements runtime.Fielder: the column names.
func (tv *TableValue) FieldNames() []string { return tv.t.Names() }

// Field implements runtime.Fielder: a number column as a vector in SI (shown
// in the column's unit), a text column as a list of strings.
func (tv *TableValue) Field(name string) (runtime.Value, error) {
	col, err := tv.t.Column(name)
	if err != nil {
		return nil, runtime.ValueErrorf("%s", strings.Replace(err.Error(), "table: no column", "table has no column", 1))
	}
	return tv.columnValue(col, tv.index(name)), nil
}

func (tv *TableValue) index(name string) int {
	for i, n := range tv.t.Names() {
		if n == name {
			return i
		}
	}
	return -1
}

func (tv *TableValue) columnValue(col table.Column, i int) runtime.Value {
	if col.Kind != table.Float {
		l := &runtime.List{Elems: make([]runtime.Value, len(col.Strings))}
		for j, s := range col.Strings {
			l.Elems[j] = runtime.String(s)
		}
		return l
	}
	u := tv.units[i]
	si := col.Floats // a copy: convert in place
	for j, x := range si {
		si[j] = u.ToSI(x)
	}
	v := &runtime.Vector{V: si, Dim: u.Dim}
	if u.Symbol != "" {
		v.Unit = &u
	}
	return v
}

// Index implements runtime.Indexer: a mask of one element per row keeps
// those rows (steps[steps.current > 100 pA]); a whole number gives one row
// as a record (negative counts from the end); a string gives that column.
func (tv *TableValue) Index(i runtime.Value) (runtime.Value, error) {
	switch x := i.(type) {
	case *runtime.Mask:
		if len(x.B) != tv.t.Len() {
			return nil, runtime.ValueErrorf("table: the mask has %d elements but the table has %s; build the mask from a column of this table, e.g. t[t.current > 100 pA]",
				len(x.B), plural(tv.t.Len(), "row"))
		}
		ft, err := tv.t.Filter(x.B)
		if err != nil {
			return nil, runtime.ValueErrorf("%v", err)
		}
		return &TableValue{t: ft, units: tv.units, Title: tv.Title}, nil
	case runtime.String:
		return tv.Field(string(x))
	case runtime.Quantity:
		return tv.row(x)
	}
	return nil, runtime.ValueErrorf("table: index a table with a mask (t[t.rate > 10 Hz]), a row number (t[0]) or a column name (t[\"rate\"]), not %s", i.Type())
}

func (tv *TableValue) row(q runtime.Quantity) (runtime.Value, error) {
	n := tv.t.Len()
	k := int(q.V)
	if !q.Dim.IsDimensionless() || q.V != math.Trunc(q.V) || q.V >= float64(n) || q.V < -float64(n) {
		return nil, runtime.ValueErrorf("table: row %s does not exist; rows are numbered 0 to %d (or −1 for the last)", q, n-1)
	}
	if k < 0 {
		k += n
	}
	rec := &runtime.Record{}
	for i, name := range tv.t.Names() {
		col, _ := tv.t.Column(name)
		rec.Names = append(rec.Names, name)
		if col.Kind != table.Float {
			rec.Values = append(rec.Values, runtime.String(col.Strings[k]))
			continue
		}
		u := tv.units[i]
		v := runtime.Q(u.ToSI(col.Floats[k]), u.Dim)
		if u.Symbol != "" {
			v.Unit = &u
		}
		rec.Values = append(rec.Values, v)
	}
	return rec, nil
}

// Display returns the table as display data: units in the headers, the
// table's comments as its note.
func (tv *TableValue) Display() *display.Table {
	dt := &display.Table{Title: tv.Title, Note: strings.Join(tv.t.Comments, " ")}
	for i, name := range tv.t.Names() {
		col, _ := tv.t.Column(name)
		if col.Kind != table.Float {
			dt.Columns = append(dt.Columns, display.Texts(name, col.Strings))
			continue
		}
		dt.Columns = append(dt.Columns, display.Numbers(name, tv.units[i].Symbol, col.Floats))
	}
	return dt
}

// Show implements runtime.Shower: an HTML, aligned-text, CSV and JSON table,
// long tables cut with a row count.
func (tv *TableValue) Show() ([]display.Bundle, error) {
	if len(tv.t.Names()) == 0 {
		return []display.Bundle{display.Text(tv.String())}, nil
	}
	b, err := tv.Display().Bundle()
	if err != nil {
		return nil, err
	}
	return []display.Bundle{b}, nil
}

// Help implements runtime.Helper.
func (tv *TableValue) Help() string {
	return tv.String() + "\n\nColumns are fields (t." + firstOr(tv.t.Names(), "name") +
		"); t[mask] keeps rows, t[0] is the first row, len(t) counts rows, write(t, \"file.csv\") saves it and plot(t) draws it."
}

func firstOr(names []string, def string) string {
	if len(names) > 0 {
		return names[0]
	}
	return def
}

// readTable reads a CSV file into a table value. Unknown header units are
// reported with the column and the header's line number.
func readTable(path string) (*TableValue, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fileError("read", path, err)
	}
	t, err := table.ReadCSV(bytes.NewReader(data))
	if err != nil {
		return nil, runtime.ValueErrorf("read: %s: %s", path, strings.TrimPrefix(err.Error(), "table: "))
	}
	tv, err := NewTableValue(t)
	if err != nil {
		return nil, runtime.UnitErrorf("read: %s line %d: %s", path, headerLine(data),
			strings.TrimPrefix(err.Error(), "table: "))
	}
	tv.Title = filepath.Base(path)
	return tv, nil
}

// headerLine is the 1-based number of the first line that is neither empty
// nor a comment: the header of a CSV file.
func headerLine(data []byte) int {
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(nil, len(data)+1)
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(strings.TrimPrefix(sc.Text(), "\uFEFF"))
		if line != "" && !strings.HasPrefix(line, "#") {
			return n
		}
	}
	return 1
}

// fileError turns an OS error into one that says what to do.
func fileError(verb, path string, err error) error {
	dir := filepath.Dir(path)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		if _, derr := os.Stat(dir); derr != nil {
			return runtime.ValueErrorf("%s: the folder %q does not exist; create it first or give another path", verb, dir)
		}
		wd, _ := os.Getwd()
		return runtime.ValueErrorf("%s: no file %q (paths are relative to %s); check the name", verb, path, wd)
	case errors.Is(err, fs.ErrPermission):
		return runtime.ValueErrorf("%s: no permission to use %q; choose a folder you can write to, such as /tmp", verb, path)
	}
	return runtime.ValueErrorf("%s: %s: %v", verb, path, err)
}

// writeTable writes tv to path as CSV, atomically.
func writeTable(tv *TableValue, path string) error {
	if !strings.EqualFold(filepath.Ext(path), ".csv") {
		return runtime.ValueErrorf("write: tables are written as CSV; give a path ending in .csv, not %q", path)
	}
	if err := checkFolder("write", path); err != nil {
		return err
	}
	if err := tv.t.WriteFile(path); err != nil {
		return runtime.ValueErrorf("write: %s: %s", path, strings.TrimPrefix(err.Error(), "table: "))
	}
	return nil
}

// checkFolder reports a missing or non-folder parent of path before a write.
func checkFolder(verb, path string) error {
	dir := filepath.Dir(path)
	st, err := os.Stat(dir)
	if err != nil {
		return runtime.ValueErrorf("%s: the folder %q does not exist; create it first or write somewhere else", verb, dir)
	}
	if !st.IsDir() {
		return runtime.ValueErrorf("%s: %q is not a folder; give a path inside a folder", verb, dir)
	}
	return nil
}

// tableFromRecord builds a table from (name = vector, …): vectors keep the
// unit they are shown in, lists of strings become text columns.
func tableFromRecord(r *runtime.Record) (*TableValue, error) {
	t := table.New()
	for i, name := range r.Names {
		if err := addColumn(t, name, r.Values[i]); err != nil {
			return nil, err
		}
	}
	return NewTableValue(t)
}

func addColumn(t *table.Table, name string, v runtime.Value) error {
	var err error
	switch x := v.(type) {
	case runtime.Quantity:
		return addColumn(t, name, &runtime.Vector{V: []float64{x.V}, Dim: x.Dim, Unit: x.Unit})
	case *runtime.Vector:
		u := runtime.ChooseUnit(x.V, x.Dim)
		if x.Unit != nil {
			u = *x.Unit
		}
		vals := make([]float64, len(x.V))
		for j, s := range x.V {
			vals[j] = u.FromSI(s)
		}
		err = t.AddFloats(name, u.Symbol, vals)
	case *runtime.List:
		ss := make([]string, len(x.Elems))
		for j, e := range x.Elems {
			s, ok := e.(runtime.String)
			if !ok {
				return runtime.ValueErrorf("table: column %s mixes text and %s; a list column must hold strings only", name, e.Type())
			}
			ss[j] = string(s)
		}
		err = t.AddStrings(name, ss)
	default:
		return runtime.ArgumentErrorf("table: column %s must be a vector or a list of strings, got %s", name, v.Type())
	}
	if err != nil {
		return runtime.ValueErrorf("table: column %s: %s; give every column the same number of values",
			name, strings.TrimPrefix(err.Error(), "table: "))
	}
	return nil
}

// lineRows is the number of rows above which a table column without error
// bars is drawn as a line rather than as points.
const lineRows = 50

// Figure implements Plottable: the first number column is the x axis and
// every other number column is drawn against it as points (a line for
// more than lineRows rows), one panel per column; a column named like another with _se, _sd or _err after it gives
// that column's error bars.
func (tv *TableValue) Figure() (*display.Figure, error) {
	var nums []int
	for i, name := range tv.t.Names() {
		if col, _ := tv.t.Column(name); col.Kind == table.Float {
			nums = append(nums, i)
		}
	}
	if len(nums) < 2 {
		return nil, runtime.ValueErrorf("plot: a table needs two number columns to draw (x, then y); this one has %d", len(nums))
	}
	names := tv.t.Names()
	x := tv.axis(names[nums[0]], nums[0])
	errOf := map[string]int{} // column → its error column
	isErr := map[int]bool{}
	for _, i := range nums[1:] {
		if base, ok := errBase(names[i]); ok && tv.index(base) >= 0 {
			errOf[base], isErr[i] = i, true
		}
	}
	f := &display.Figure{Title: tv.Title, SharedX: true}
	for _, i := range nums[1:] {
		if isErr[i] {
			continue
		}
		y := tv.axis(names[i], i)
		s := display.Series{Kind: display.Points, Name: names[i], X: x.Data, Y: y.Data}
		if _, hasErr := errOf[names[i]]; !hasErr && tv.t.Len() > lineRows {
			s.Kind = display.Line // a sampled signal (a trace), not a handful of measurements
		}
		if j, ok := errOf[names[i]]; ok {
			s.YErr = AxisIn(names[j], tv.siOf(j), y.Unit).Data
		}
		f.Panels = append(f.Panels, display.Panel{XLabel: x.Label, YLabel: y.Label, Series: []display.Series{s}})
	}
	return f, nil
}

// errBase returns "rate" for "rate_se", "rate_sd" or "rate_err".
func errBase(name string) (string, bool) {
	for _, suf := range []string{"_se", "_sd", "_err"} {
		if base, ok := strings.CutSuffix(name, suf); ok && base != "" {
			return base, true
		}
	}
	return "", false
}

func (tv *TableValue) siOf(i int) []float64 {
	col, _ := tv.t.Column(tv.t.Names()[i])
	u := tv.units[i]
	for j, v := range col.Floats {
		col.Floats[j] = u.ToSI(v)
	}
	return col.Floats
}

// axis keeps the column's own unit for its axis.
func (tv *TableValue) axis(name string, i int) Axis {
	return AxisIn(name, tv.siOf(i), tv.units[i])
}

func init() { domains = append(domains, registerTables) }

func registerTables(reg *runtime.Registry) {
	reg.Register(&runtime.Builtin{
		Name: "read", Category: "data", Returns: "a table",
		Doc: "Reads a CSV file into a table. The path is relative to the working directory. The first line that is not a comment " +
			"(# …) is the header; a header cell may carry its unit in brackets at the end, as in current (pA) or rate [Hz], and " +
			"that column's values are then quantities in that unit. Empty cells and NA are missing values (NaN). Comment lines are kept " +
			"and shown under the table.",
		Params: []runtime.Param{{Name: "path", Kind: runtime.KindString, Doc: "the CSV file, e.g. \"data/steps.csv\""}},
		Source: "CSV as in RFC 4180 (Shafranovich 2005); units as in the SI Brochure, 9th edition (BIPM 2019)",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			return readTable(c.Str("path"))
		},
	})
	reg.Register(&runtime.Builtin{
		Name: "write", Category: "data", Returns: "the path written",
		Doc: "Writes a table to a CSV file with every row, units in the headers (current (pA)) and numbers that read back exactly. " +
			"The file is written to a temporary file in the same folder and renamed into place, so a failure never leaves half a file. " +
			"The folder must exist.",
		Params: []runtime.Param{
			{Name: "table", Kind: runtime.KindAny, Doc: "a table (from read, table, or a filtered table)"},
			{Name: "path", Kind: runtime.KindString, Doc: "where to write, ending in .csv"},
		},
		Source: "CSV as in RFC 4180 (Shafranovich 2005)",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			tv, ok := c.Value("table").(*TableValue)
			if !ok {
				return nil, runtime.ArgumentErrorf("write: the first argument must be a table, got %s; build one with table((name = vector, …)) or read(\"file.csv\")", c.Value("table").Type())
			}
			if err := writeTable(tv, c.Str("path")); err != nil {
				return nil, err
			}
			return runtime.String(c.Str("path")), nil
		},
	})
	reg.Register(&runtime.Builtin{
		Name: "table", Category: "data", Returns: "a table",
		Doc: "Builds a table from a record of columns: table((current = [50, 100, 150] pA, rate = [2, 9, 21] Hz)). " +
			"Each field is a column; vectors keep their units (the unit they are shown in), lists of strings become text columns. " +
			"All columns must have the same length.",
		Params: []runtime.Param{
			{Name: "columns", Kind: runtime.KindRecord, Doc: "(name = vector, …)"},
			{Name: "title", Kind: runtime.KindString, Default: `""`, Doc: "shown above the table"},
		},
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			tv, err := tableFromRecord(c.Value("columns").(*runtime.Record))
			if err != nil {
				return nil, err
			}
			tv.Title = c.Str("title")
			return tv, nil
		},
	})
}
