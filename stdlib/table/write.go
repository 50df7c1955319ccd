package table

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// WriteCSV writes the table as CSV: the comments as "# text" lines, a header
// of "name (unit)" cells (bare names for no unit), then the rows. Numbers are
// written in the shortest form that reads back exactly; NaN is an empty cell.
// Cells are quoted when they contain a comma, quote or line break, start with
// # or a space, or end with a space. ReadCSV reads the output back to an equal
// table.
func (t *Table) WriteCSV(w io.Writer) error {
	bw := bufio.NewWriter(w)
	for _, c := range t.Comments {
		if strings.ContainsAny(c, "\r\n") {
			return fmt.Errorf("table: comment %q contains a line break; split it into several comments", c)
		}
		bw.WriteString("# " + c + "\n")
	}
	row := make([]string, len(t.cols))
	for j := range t.cols {
		h, err := headerCell(t.cols[j].Name, t.cols[j].Unit)
		if err != nil {
			return err
		}
		row[j] = h
	}
	writeRow(bw, row)
	for i := 0; i < t.n; i++ {
		for j := range t.cols {
			row[j] = t.cols[j].cell(i)
		}
		writeRow(bw, row)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("table: cannot write the table: %w", err)
	}
	return nil
}

// headerCell returns a header cell that SplitHeader reads back as exactly
// (name, unit), trying the plain forms first.
func headerCell(name, unit string) (string, error) {
	for _, h := range []string{name, name + " (" + unit + ")", name + " [" + unit + "]"} {
		if n, u := SplitHeader(h); n == name && u == unit {
			return h, nil
		}
	}
	return "", fmt.Errorf("table: column %q has unit %q, which cannot be written in a header; remove unbalanced brackets from the unit", name, unit)
}

// cell formats row i of the column.
func (c *Column) cell(i int) string {
	if c.Kind == String {
		return c.Strings[i]
	}
	v := c.Floats[i]
	if math.IsNaN(v) {
		return ""
	}
	return strconv.FormatFloat(v, 'g', -1, 64)
}

// writeRow writes one CSV line. A line that would be empty (one empty cell) is
// written as "" so that readers do not skip it.
func writeRow(w *bufio.Writer, row []string) {
	if len(row) == 1 && row[0] == "" {
		w.WriteString("\"\"\n")
		return
	}
	for j, c := range row {
		if j > 0 {
			w.WriteByte(',')
		}
		if needsQuotes(c) {
			c = `"` + strings.ReplaceAll(c, `"`, `""`) + `"`
		}
		w.WriteString(c)
	}
	w.WriteByte('\n')
}

func needsQuotes(c string) bool {
	return c != "" && (strings.ContainsAny(c, ",\"\r\n") || c[0] == '#' || c[0] == ' ' || c[len(c)-1] == ' ' || c[0] == '\t')
}

// WriteFile writes the table as CSV to path atomically: it writes a temporary
// file in the same folder and renames it over path only when everything has
// been written, so a failed write never leaves a partial file. The folder must
// exist. The file gets mode 0644.
func (t *Table) WriteFile(path string) error {
	return writeAtomic(path, t.WriteCSV)
}

// writeAtomic runs write into a temporary file next to path and renames it.
func writeAtomic(path string, write func(io.Writer) error) (err error) {
	dir := filepath.Dir(path)
	if st, serr := os.Stat(dir); serr != nil || !st.IsDir() {
		return fmt.Errorf("table: folder %q does not exist; create it first or choose another path", dir)
	}
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("table: cannot create a file in %q: %w", dir, err)
	}
	defer func() {
		if err != nil {
			f.Close()
			os.Remove(f.Name())
		}
	}()
	if err = write(f); err != nil {
		return err
	}
	if err = errors.Join(f.Sync(), f.Chmod(0o644)); err != nil {
		return fmt.Errorf("table: cannot finish writing %q: %w", path, err)
	}
	if err = f.Close(); err != nil {
		return fmt.Errorf("table: cannot finish writing %q: %w", path, err)
	}
	if err = os.Rename(f.Name(), path); err != nil {
		return fmt.Errorf("table: cannot replace %q: %w", path, err)
	}
	return nil
}
