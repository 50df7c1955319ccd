// Package table holds column tables: named columns of float64 values with a
// unit each, or of strings, read from and written to CSV.
//
// A header cell names a column and may carry its unit in parentheses or square
// brackets at the end:
//
//	header cell        name       unit
//	current (pA)       current    pA
//	rate [Hz]          rate       Hz
//	g (mS/(cm^2))      g          mS/(cm^2)
//	label              label      (none)
//
// The unit is kept as text; resolving it is the caller's business. Lines
// starting with # are comments (our invented demo data uses one to say it is
// invented); they are kept in Table.Comments and written back at the top.
// Empty cells and NA are missing values, NaN in a number column.
//
// A table is immutable through its methods: Filter and Select return new
// tables, and Column returns copies.
package table

import (
	"fmt"
	"math"
	"strings"
)

// Kind says what a column holds.
type Kind int

const (
	// Float columns hold float64 values with a unit.
	Float Kind = iota
	// String columns hold text.
	String
)

// Column is one named column. Exactly one of Floats and Strings is used,
// according to Kind; Unit is empty for string columns and unitless numbers.
type Column struct {
	Name    string
	Unit    string
	Kind    Kind
	Floats  []float64
	Strings []string
}

// len returns the number of rows of the column.
func (c *Column) len() int {
	if c.Kind == String {
		return len(c.Strings)
	}
	return len(c.Floats)
}

// clone returns a deep copy of c, or of the rows picked by keep when not nil.
func (c *Column) clone(keep []bool) Column {
	out := Column{Name: c.Name, Unit: c.Unit, Kind: c.Kind}
	if c.Kind == String {
		out.Strings = pick(c.Strings, keep)
	} else {
		out.Floats = pick(c.Floats, keep)
	}
	return out
}

// pick copies the entries of v where keep is true (all of them if keep is nil).
func pick[T any](v []T, keep []bool) []T {
	out := make([]T, 0, len(v))
	for i, x := range v {
		if keep == nil || keep[i] {
			out = append(out, x)
		}
	}
	return out
}

// Table is a list of columns of equal length. Comments are free text lines
// kept with the table (written as "# text" at the top of a CSV file).
type Table struct {
	cols     []Column
	n        int
	Comments []string
}

// New returns an empty table with no columns and no rows.
func New() *Table { return &Table{} }

// Len returns the number of rows.
func (t *Table) Len() int { return t.n }

// Names returns the column names in order.
func (t *Table) Names() []string {
	out := make([]string, len(t.cols))
	for i := range t.cols {
		out[i] = t.cols[i].Name
	}
	return out
}

// AddFloats appends a number column, copying v. The first column sets the
// number of rows; later columns must match it.
func (t *Table) AddFloats(name, unit string, v []float64) error {
	return t.add(Column{Name: name, Unit: unit, Kind: Float, Floats: append([]float64{}, v...)})
}

// AddStrings appends a text column, copying v.
func (t *Table) AddStrings(name string, v []string) error {
	return t.add(Column{Name: name, Kind: String, Strings: append([]string{}, v...)})
}

// add checks the name and length of c and appends it.
func (t *Table) add(c Column) error {
	switch {
	case strings.TrimSpace(c.Name) == "" || c.Name != strings.TrimSpace(c.Name):
		return fmt.Errorf("table: column name %q must be non-empty without surrounding spaces; give a plain name such as \"rate\"", c.Name)
	case t.index(c.Name) >= 0:
		return fmt.Errorf("table: there is already a column %q; choose another name", c.Name)
	case len(t.cols) > 0 && c.len() != t.n:
		return fmt.Errorf("table: column %q has %d rows but the table has %d; give one value per row", c.Name, c.len(), t.n)
	}
	t.cols = append(t.cols, c)
	t.n = c.len()
	return nil
}

// index returns the position of the named column, or −1.
func (t *Table) index(name string) int {
	for i := range t.cols {
		if t.cols[i].Name == name {
			return i
		}
	}
	return -1
}

// Column returns a copy of the named column. For an unknown name the error
// suggests the closest existing name.
func (t *Table) Column(name string) (Column, error) {
	i := t.index(name)
	if i < 0 {
		return Column{}, t.noColumn(name)
	}
	return t.cols[i].clone(nil), nil
}

// Floats returns a copy of the values and the unit of a number column.
func (t *Table) Floats(name string) ([]float64, string, error) {
	c, err := t.Column(name)
	if err != nil {
		return nil, "", err
	}
	if c.Kind != Float {
		return nil, "", fmt.Errorf("table: column %q holds text, not numbers; pick a number column", name)
	}
	return c.Floats, c.Unit, nil
}

// noColumn builds the error for an unknown column name.
func (t *Table) noColumn(name string) error {
	if s, ok := closest(name, t.Names()); ok {
		return fmt.Errorf("table: no column %q; did you mean %q?", name, s)
	}
	if len(t.cols) == 0 {
		return fmt.Errorf("table: no column %q; the table has no columns", name)
	}
	return fmt.Errorf("table: no column %q; the columns are %s", name, quoteList(t.Names()))
}

func quoteList(names []string) string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = fmt.Sprintf("%q", n)
	}
	return strings.Join(q, ", ")
}

// Filter returns a new table with the rows where mask is true.
func (t *Table) Filter(mask []bool) (*Table, error) {
	if len(mask) != t.n {
		return nil, fmt.Errorf("table: filter mask has %d entries but the table has %d rows; give one true/false per row", len(mask), t.n)
	}
	out := &Table{Comments: append([]string(nil), t.Comments...)}
	for i := range t.cols {
		out.cols = append(out.cols, t.cols[i].clone(mask))
	}
	for _, m := range mask {
		if m {
			out.n++
		}
	}
	return out, nil
}

// Select returns a new table with the named columns, in the order given.
func (t *Table) Select(names ...string) (*Table, error) {
	out := &Table{Comments: append([]string(nil), t.Comments...)}
	for _, name := range names {
		i := t.index(name)
		if i < 0 {
			return nil, t.noColumn(name)
		}
		if out.index(name) >= 0 {
			return nil, fmt.Errorf("table: column %q is selected twice; list each column once", name)
		}
		out.cols = append(out.cols, t.cols[i].clone(nil))
	}
	if len(out.cols) > 0 {
		out.n = t.n
	}
	return out, nil
}

// closest returns the name nearest to s by edit distance when it is close
// enough to be a likely typo: a case-insensitive match, or at most one edit per
// three characters (at least one).
func closest(s string, names []string) (string, bool) {
	best, bestD := "", math.MaxInt
	for _, n := range names {
		if strings.EqualFold(n, s) {
			return n, true
		}
		if d := editDistance(s, n); d < bestD {
			best, bestD = n, d
		}
	}
	limit := max(1, len([]rune(s))/3)
	return best, bestD <= limit
}

// editDistance is the optimal-string-alignment distance between a and b, in
// runes: Levenshtein's insertions, deletions and substitutions plus swaps of
// two neighbouring characters (Damerau 1964), the commonest typing slips.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	pp, prev, cur := make([]int, len(rb)+1), make([]int, len(rb)+1), make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				cur[j] = min(cur[j], pp[j-2]+1)
			}
		}
		pp, prev, cur = prev, cur, pp
	}
	return prev[len(rb)]
}
