package display

import (
	"encoding/csv"
	"encoding/json"
	"html"
	"io"
	"math"
	"strconv"
	"strings"
)

// Inline styles of the HTML table. They set no colours of their own: text
// inherits the front end's colour and rules use a half-transparent mid grey,
// so the same table reads on light and dark themes (see theme.go).
const (
	styleTable   = "border-collapse:collapse;font-variant-numeric:tabular-nums;font-size:0.92em;margin:0.3em 0"
	styleCaption = "caption-side:top;text-align:left;font-weight:600;padding:0 0 0.3em 0"
	styleTH      = "padding:0.2em 0.8em;border-bottom:1.5px solid rgba(128,128,128,0.6);font-weight:600;white-space:nowrap"
	styleTD      = "padding:0.15em 0.8em;border-bottom:1px solid rgba(128,128,128,0.18);white-space:nowrap"
	styleCut     = "padding:0.25em 0.8em;font-style:italic;opacity:0.75;text-align:left"
	styleFoot    = "padding:0.3em 0.8em 0 0.8em;font-size:0.88em;opacity:0.75;text-align:left"
)

// HTML renders the table as a self-contained HTML fragment: inline styles
// only, no scripts, no external CSS; NaN shown as "—", a cut row for a long
// table and a footer with its size and NaN count.
func (t *Table) HTML() (string, error) {
	if err := t.Validate(); err != nil {
		return "", err
	}
	head, tail, cut := t.shownRows()
	rows := append(append([]int(nil), head...), tail...)
	cells := t.cells(rows, "—", "∞")
	var b strings.Builder
	b.WriteString(`<table class="loligo-table" style="` + styleTable + `">` + "\n")
	if t.Title != "" {
		b.WriteString(`<caption style="` + styleCaption + `">` + html.EscapeString(t.Title) + "</caption>\n")
	}
	b.WriteString("<thead><tr>")
	for _, c := range t.Columns {
		b.WriteString(`<th style="` + styleTH + ";text-align:" + align(c) + `">` + html.EscapeString(c.Header()) + "</th>")
	}
	b.WriteString("</tr></thead>\n<tbody>\n")
	for k := range rows {
		if k == len(head) && cut > 0 {
			b.WriteString(`<tr><td colspan="` + strconv.Itoa(len(t.Columns)) + `" style="` + styleCut + `">` +
				html.EscapeString(t.cutLine(cut)) + "</td></tr>\n")
		}
		b.WriteString("<tr>")
		for j, c := range t.Columns {
			s := cells[j][k]
			if c.Kind == NumberColumn {
				s = strings.ReplaceAll(s, "-", "−") // a true minus sign reads better
			}
			b.WriteString(`<td style="` + styleTD + ";text-align:" + align(c) + `">` + html.EscapeString(s) + "</td>")
		}
		b.WriteString("</tr>\n")
	}
	b.WriteString("</tbody>\n<tfoot><tr><td colspan=\"" + strconv.Itoa(len(t.Columns)) + `" style="` + styleFoot + `">`)
	b.WriteString(html.EscapeString(strings.Replace(t.footer(), "NaN (missing)", "NaN (missing, shown as —)", 1)))
	if t.Note != "" {
		b.WriteString("<br>" + html.EscapeString(t.Note))
	}
	b.WriteString("</td></tr></tfoot>\n</table>")
	return b.String(), nil
}

func align(c Column) string {
	if c.Kind == NumberColumn {
		return "right"
	}
	return "left"
}

// WriteCSVTo writes every row of the table as CSV (RFC 4180): a header row
// of "name (unit)" headings, numbers in the shortest form that reads back
// exactly, NaN as "NaN" and infinities as "+Inf"/"-Inf".
func (t *Table) WriteCSVTo(w io.Writer) error {
	if err := t.Validate(); err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	rec := make([]string, len(t.Columns))
	for j, c := range t.Columns {
		rec[j] = c.Header()
	}
	if err := cw.Write(rec); err != nil {
		return err
	}
	for i := range t.Rows() {
		for j, c := range t.Columns {
			if c.Kind == TextColumn {
				rec[j] = c.Texts[i]
			} else {
				rec[j] = csvNumber(c.Numbers[i])
			}
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

func csvNumber(x float64) string {
	switch {
	case math.IsInf(x, 1):
		return "+Inf"
	case math.IsInf(x, -1):
		return "-Inf"
	}
	return strconv.FormatFloat(x, 'g', -1, 64) // NaN gives "NaN"
}

// CSV returns the whole table as CSV text (see WriteCSVTo).
func (t *Table) CSV() (string, error) {
	var b strings.Builder
	if err := t.WriteCSVTo(&b); err != nil {
		return "", err
	}
	return b.String(), nil
}

// WriteCSV saves the whole table as CSV at path, atomically: through a
// temporary file in the same folder and a rename, so a failure never
// leaves a half-written file. The folder must exist and be writable.
func (t *Table) WriteCSV(path string) error {
	return writeFileAtomic(path, t.WriteCSVTo)
}

// tableJSON is the application/json form: column names in order, units,
// and one array per column (NaN and infinities become null, as JSON has no
// such numbers).
type tableJSON struct {
	Title   string         `json:"title,omitempty"`
	Order   []string       `json:"order"`
	Units   map[string]any `json:"units"`
	Columns map[string]any `json:"columns"`
	Rows    int            `json:"rows"`
}

// JSON returns the whole table as application/json: {"title", "order":
// column names, "units": name → unit, "columns": name → array, "rows"}.
func (t *Table) JSON() (json.RawMessage, error) {
	if err := t.Validate(); err != nil {
		return nil, err
	}
	v := tableJSON{Title: t.Title, Units: map[string]any{}, Columns: map[string]any{}, Rows: t.Rows()}
	for _, c := range t.Columns {
		v.Order = append(v.Order, c.Name)
		v.Units[c.Name] = c.Unit
		if c.Kind == TextColumn {
			v.Columns[c.Name] = c.Texts
			continue
		}
		col := make([]*float64, len(c.Numbers))
		for i := range c.Numbers {
			if x := c.Numbers[i]; !math.IsNaN(x) && !math.IsInf(x, 0) {
				col[i] = &c.Numbers[i]
			}
		}
		v.Columns[c.Name] = col
	}
	return JSON(v)
}

// Bundle returns the table's outputs: text/plain (aligned), text/html,
// text/csv (every row) and application/json (every row).
func (t *Table) Bundle() (Bundle, error) {
	txt, err := t.Text()
	if err != nil {
		return Bundle{}, err
	}
	h, _ := t.HTML()
	c, err := t.CSV()
	if err != nil {
		return Bundle{}, err
	}
	j, err := t.JSON()
	if err != nil {
		return Bundle{}, err
	}
	return Bundle{Data: map[string]any{MIMEText: txt, MIMEHTML: h, MIMECSV: c, MIMEJSON: j}}, nil
}
