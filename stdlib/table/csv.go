package table

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// ReadCSV reads a comma-separated table with one header line. Lines starting
// with # (outside quoted cells) are comments, kept in Comments. A column is a
// number column if its header has a unit or its first cell that is neither
// empty nor NA reads as a number; otherwise it is a text column. In a number
// column, empty cells and NA are NaN and any other unreadable cell is an error
// naming its line and column. A leading UTF-8 byte-order mark is ignored.
func ReadCSV(r io.Reader) (*Table, error) {
	raw, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("table: cannot read the input: %w", err)
	}
	data, comments := splitComments(bytes.TrimPrefix(raw, []byte("\ufeff")))
	cr := csv.NewReader(bytes.NewReader(data))
	cr.FieldsPerRecord = -1
	header, err := cr.Read()
	if err == io.EOF {
		return nil, errors.New("table: the input has no header line; the first line that is not a # comment must name the columns")
	}
	if err != nil {
		return nil, csvError(err)
	}
	names, units, err := parseHeader(header, cr)
	if err != nil {
		return nil, err
	}
	cells, lines, err := readRows(cr, len(names))
	if err != nil {
		return nil, err
	}
	t := &Table{Comments: comments}
	for j := range names {
		c, err := buildColumn(names[j], units[j], cells, lines, j)
		if err != nil {
			return nil, err
		}
		t.cols = append(t.cols, c)
	}
	t.n = len(cells)
	return t, nil
}

// splitComments blanks every line that starts with # outside a quoted cell,
// keeping the newline so that line numbers stay right, and returns the
// comments' text (after the #, trimmed).
func splitComments(b []byte) ([]byte, []string) {
	out := make([]byte, 0, len(b))
	var comments []string
	inQuote := false
	for len(b) > 0 {
		line, rest, found := bytes.Cut(b, []byte("\n"))
		if !inQuote && len(line) > 0 && line[0] == '#' {
			comments = append(comments, strings.TrimSpace(string(line[1:])))
		} else {
			out = append(out, line...)
			inQuote = inQuote != (bytes.Count(line, []byte(`"`))%2 == 1)
		}
		if found {
			out = append(out, '\n')
		}
		b = rest
	}
	return out, comments
}

// csvError rewords an encoding/csv error with its line and column.
func csvError(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return fmt.Errorf("table: line %d, character %d: %v; put quotes around cells that contain commas or quotes, and double the quotes inside", pe.Line, pe.Column, pe.Err)
	}
	return fmt.Errorf("table: %w", err)
}

// parseHeader splits each header cell into name and unit and checks the names.
func parseHeader(header []string, cr *csv.Reader) (names, units []string, err error) {
	line, _ := cr.FieldPos(0)
	seen := map[string]int{}
	for j, cell := range header {
		name, unit := SplitHeader(cell)
		if name == "" {
			return nil, nil, fmt.Errorf("table: line %d, column %d has no name (header cell %q); give every column a name such as \"rate (Hz)\"", line, j+1, cell)
		}
		if k, dup := seen[name]; dup {
			return nil, nil, fmt.Errorf("table: line %d: column name %q appears twice (columns %d and %d); rename one", line, name, k+1, j+1)
		}
		seen[name] = j
		names, units = append(names, name), append(units, unit)
	}
	return names, units, nil
}

// SplitHeader splits a header cell such as "current (pA)" or "rate [Hz]" into
// name and unit. The unit is the text inside the last bracket pair when that
// pair closes the cell; brackets may nest inside it. Both parts are trimmed.
// A cell without a closing bracket at the end is a bare name with unit "".
func SplitHeader(cell string) (name, unit string) {
	s := strings.TrimSpace(cell)
	if s == "" {
		return "", ""
	}
	var open byte
	switch s[len(s)-1] {
	case ')':
		open = '('
	case ']':
		open = '['
	default:
		return s, ""
	}
	closeB, depth := s[len(s)-1], 0
	for i := len(s) - 1; i >= 0; i-- {
		switch s[i] {
		case closeB:
			depth++
		case open:
			depth--
		}
		if depth == 0 {
			return strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+1 : len(s)-1])
		}
	}
	return s, ""
}

// readRows reads all data rows, checking their width, and returns the cells
// and each row's line number.
func readRows(cr *csv.Reader, width int) ([][]string, []int, error) {
	var cells [][]string
	var lines []int
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return cells, lines, nil
		}
		if err != nil {
			return nil, nil, csvError(err)
		}
		line, _ := cr.FieldPos(0)
		if len(rec) != width {
			return nil, nil, fmt.Errorf("table: line %d has %d cells but the header has %d; add the missing cells (leave them empty for missing values) or remove the extra ones", line, len(rec), width)
		}
		cells, lines = append(cells, rec), append(lines, line)
	}
}

// missing reports whether a cell is a missing value.
func missing(cell string) bool {
	c := strings.TrimSpace(cell)
	return c == "" || c == "NA"
}

// buildColumn makes column j from the cells, deciding its kind.
func buildColumn(name, unit string, cells [][]string, lines []int, j int) (Column, error) {
	numeric := unit != ""
	if !numeric {
		numeric = true
		for _, row := range cells {
			if !missing(row[j]) {
				_, err := strconv.ParseFloat(strings.TrimSpace(row[j]), 64)
				numeric = err == nil
				break
			}
		}
	}
	if !numeric {
		c := Column{Name: name, Kind: String, Strings: make([]string, len(cells))}
		for i, row := range cells {
			c.Strings[i] = row[j]
		}
		return c, nil
	}
	c := Column{Name: name, Unit: unit, Kind: Float, Floats: make([]float64, len(cells))}
	for i, row := range cells {
		v, err := parseNumber(row[j])
		if err != nil {
			return Column{}, fmt.Errorf("table: line %d, column %s: cannot read %q as a number; write a plain number such as 12.5, or leave the cell empty (or NA) for a missing value", lines[i], name, row[j])
		}
		c.Floats[i] = v
	}
	return c, nil
}

// parseNumber reads a number cell; empty and NA are NaN.
func parseNumber(cell string) (float64, error) {
	if missing(cell) {
		return math.NaN(), nil
	}
	return strconv.ParseFloat(strings.TrimSpace(cell), 64)
}
