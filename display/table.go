package display

import (
	"fmt"
	"math"
	"strings"
)

// ColumnKind says whether a column holds numbers or text.
type ColumnKind int

const (
	// NumberColumn holds float64 values in Column.Numbers.
	NumberColumn ColumnKind = iota
	// TextColumn holds strings in Column.Texts.
	TextColumn
)

// Column is one column of a Table. A NumberColumn reads Numbers, a
// TextColumn reads Texts; the other slice is ignored. Unit is shown in the
// header as "rate (Hz)"; Digits is the count of significant digits of the
// column's largest magnitude (0 means DefaultDigits), and every row of the
// column shares the resulting number of decimals. Number columns with the
// same non-empty Group hold the same quantity (measured, model and residual
// rates, say) and share one format, computed over all their values with the
// largest Digits among them, so that their decimals line up and their
// arithmetic reads right; text columns ignore Group.
type Column struct {
	Name    string
	Unit    string
	Kind    ColumnKind
	Numbers []float64
	Texts   []string
	Digits  int
	Group   string
}

// Numbers returns a number column; xs is used, not copied.
func Numbers(name, unit string, xs []float64) Column {
	return Column{Name: name, Unit: unit, Kind: NumberColumn, Numbers: xs}
}

// Texts returns a text column; xs is used, not copied.
func Texts(name string, xs []string) Column {
	return Column{Name: name, Kind: TextColumn, Texts: xs}
}

// Header is the column's heading: the name, then the unit in parentheses.
func (c Column) Header() string {
	if c.Unit == "" {
		return c.Name
	}
	return c.Name + " (" + c.Unit + ")"
}

// Len is the column's number of rows.
func (c Column) Len() int {
	if c.Kind == TextColumn {
		return len(c.Texts)
	}
	return len(c.Numbers)
}

// DefaultHead and DefaultTail are the rows a long table shows in its bundle
// before and after the cut; the CSV form always has every row.
const (
	DefaultHead = 20
	DefaultTail = 5
)

// MinCut is the fewest rows a bundle leaves out: a table that would hide
// this many rows or fewer is shown whole, since a cut line standing for a
// handful of rows saves little room and hides data the reader wanted.
const MinCut = 10

// DefaultSaveHint is what the cut line of a long table tells the reader.
const DefaultSaveHint = `write(table, "file.csv") saves all`

// Table is a titled table of named columns, all of the same length. Head
// and Tail are the rows shown before and after the cut when the table is
// longer than Head+Tail+MinCut (0 means DefaultHead and DefaultTail); SaveHint is
// the advice on the cut line ("" means DefaultSaveHint); Note is an
// optional line under the table (a source, a caveat). The renderers never
// modify the table.
type Table struct {
	Title    string
	Columns  []Column
	Note     string
	Head     int
	Tail     int
	SaveHint string
}

// Rows is the number of rows (that of the first column; Validate checks
// that all agree).
func (t *Table) Rows() int {
	if t == nil || len(t.Columns) == 0 {
		return 0
	}
	return t.Columns[0].Len()
}

// Validate reports what is wrong with the table's shape: no columns,
// unnamed or repeated column names, or columns of different lengths.
func (t *Table) Validate() error {
	if t == nil {
		return fmt.Errorf("display: table is nil; build a display.Table with at least one column")
	}
	if len(t.Columns) == 0 {
		return fmt.Errorf("display: table %q has no columns; add at least one column", t.Title)
	}
	seen := make(map[string]bool, len(t.Columns))
	n := t.Columns[0].Len()
	for i, c := range t.Columns {
		switch {
		case c.Name == "":
			return fmt.Errorf("display: table %q: column %d has no name; give every column a name", t.Title, i+1)
		case seen[c.Name]:
			return fmt.Errorf("display: table %q: column name %q appears twice; column names must be unique", t.Title, c.Name)
		case c.Kind != NumberColumn && c.Kind != TextColumn:
			return fmt.Errorf("display: table %q: column %q has unknown kind %d; use NumberColumn or TextColumn", t.Title, c.Name, c.Kind)
		case c.Len() != n:
			return fmt.Errorf("display: table %q: column %q has %d rows but column %q has %d; give every column the same number of rows",
				t.Title, c.Name, c.Len(), t.Columns[0].Name, n)
		}
		seen[c.Name] = true
	}
	return nil
}

// NaNCount is the number of NaN values in all number columns.
func (t *Table) NaNCount() int {
	n := 0
	for _, c := range t.Columns {
		if c.Kind != NumberColumn {
			continue
		}
		for _, x := range c.Numbers {
			if math.IsNaN(x) {
				n++
			}
		}
	}
	return n
}

// shownRows returns the row indices shown in a bundle and the number of rows
// cut between the head and the tail (0 if none are). Rows are cut only when
// more than MinCut would be.
func (t *Table) shownRows() (head, tail []int, cut int) {
	n := t.Rows()
	h, tl := t.Head, t.Tail
	if h <= 0 {
		h = DefaultHead
	}
	if tl <= 0 {
		tl = DefaultTail
	}
	if n <= h+tl+MinCut {
		h, tl = n, 0
	}
	for i := range h {
		head = append(head, i)
	}
	for i := n - tl; i < n; i++ {
		tail = append(tail, i)
	}
	return head, tail, n - h - tl
}

// cutLine is the line standing for rows left out of a bundle.
func (t *Table) cutLine(cut int) string {
	hint := t.SaveHint
	if hint == "" {
		hint = DefaultSaveHint
	}
	return fmt.Sprintf("… %s (%s)", plural(cut, "more row", "more rows"), hint)
}

// footer is the line under a rendered table: its size and NaN count.
func (t *Table) footer() string {
	s := plural(t.Rows(), "row", "rows") + " × " + plural(len(t.Columns), "column", "columns")
	if n := t.NaNCount(); n > 0 {
		s += "; " + plural(n, "value is NaN (missing)", "values are NaN (missing)")
	}
	return s
}

// formats returns the number format of each number column, computed over
// all its rows, or over all rows of all columns of its Group.
func (t *Table) formats() []numberFormat {
	out := make([]numberFormat, len(t.Columns))
	type group struct {
		m      magnitudes
		digits int
	}
	groups := map[string]*group{}
	for _, c := range t.Columns {
		if c.Kind != NumberColumn || c.Group == "" {
			continue
		}
		g := groups[c.Group]
		if g == nil {
			g = &group{m: newMagnitudes()}
			groups[c.Group] = g
		}
		g.m.add(c.Numbers)
		g.digits = max(g.digits, c.Digits)
	}
	for j, c := range t.Columns {
		switch {
		case c.Kind != NumberColumn:
		case c.Group != "":
			out[j] = groups[c.Group].m.format(groups[c.Group].digits)
		default:
			out[j] = columnFormat(c.Numbers, c.Digits)
		}
	}
	return out
}

// cells formats the given rows of every column: cells[col][k] is row rows[k].
// Each number column is formatted with one precision computed over all of
// its rows (and those of its Group), so that the shown rows agree with the
// ones left out.
func (t *Table) cells(rows []int, nan, inf string) [][]string {
	out := make([][]string, len(t.Columns))
	fs := t.formats()
	for j, c := range t.Columns {
		col := make([]string, len(rows))
		if c.Kind == TextColumn {
			for k, i := range rows {
				col[k] = c.Texts[i]
			}
		} else {
			f := fs[j]
			for k, i := range rows {
				col[k] = f.format(c.Numbers[i], nan, inf)
			}
		}
		out[j] = col
	}
	return out
}

// Text renders the table as aligned plain text: number columns right
// aligned, text columns left aligned, NaN shown as "NaN", a cut line for a
// long table and a footer with its size and NaN count.
func (t *Table) Text() (string, error) {
	if err := t.Validate(); err != nil {
		return "", err
	}
	head, tail, cut := t.shownRows()
	rows := append(append([]int(nil), head...), tail...)
	cells := t.cells(rows, "NaN", "Inf")
	widths := make([]int, len(t.Columns))
	for j, c := range t.Columns {
		widths[j] = textWidth(c.Header())
		for _, s := range cells[j] {
			widths[j] = max(widths[j], textWidth(s))
		}
	}
	var b strings.Builder
	if t.Title != "" {
		b.WriteString(t.Title + "\n")
	}
	line := func(get func(j int) string) {
		for j, c := range t.Columns {
			if j > 0 {
				b.WriteString("  ")
			}
			b.WriteString(padWidth(get(j), widths[j], c.Kind == NumberColumn))
		}
		trimmed := strings.TrimRight(b.String(), " ") // no trailing blanks
		b.Reset()
		b.WriteString(trimmed + "\n")
	}
	line(func(j int) string { return t.Columns[j].Header() })
	line(func(j int) string { return strings.Repeat("-", widths[j]) })
	for k := range rows {
		if k == len(head) && cut > 0 {
			b.WriteString(t.cutLine(cut) + "\n")
		}
		line(func(j int) string { return cells[j][k] })
	}
	b.WriteString(t.footer())
	if t.Note != "" {
		b.WriteString("\n" + t.Note)
	}
	return b.String(), nil
}
