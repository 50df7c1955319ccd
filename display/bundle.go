package display

import (
	"encoding/json"
	"fmt"
)

// Common MIME types.
const (
	MIMEText     = "text/plain"
	MIMEHTML     = "text/html"
	MIMEMarkdown = "text/markdown"
	MIMESVG      = "image/svg+xml"
	MIMEPNG      = "image/png"
	MIMEJSON     = "application/json"
	MIMECSV      = "text/csv"
)

// Bundle is one output: the same content in several formats, keyed by MIME
// type. Data values are strings, except MIMEJSON whose value is
// json.RawMessage. Metadata is keyed by MIME type too (a figure's width and
// height under its image type), as the Jupyter display_data message wants.
// Every bundle has a MIMEText entry.
type Bundle struct {
	Data     map[string]any
	Metadata map[string]any
}

// Text returns a bundle holding only plain text.
func Text(s string) Bundle {
	return Bundle{Data: map[string]any{MIMEText: s}}
}

// PlainText returns the bundle's text/plain form ("" if it has none).
func (b Bundle) PlainText() string {
	s, _ := b.Data[MIMEText].(string)
	return s
}

// With returns b with data added under mime; b's maps are copied, not shared.
func (b Bundle) With(mime string, data any) Bundle {
	out := Bundle{Data: make(map[string]any, len(b.Data)+1), Metadata: b.Metadata}
	for k, v := range b.Data {
		out.Data[k] = v
	}
	out.Data[mime] = data
	return out
}

// JSON returns v marshalled for a MIMEJSON entry.
func JSON(v any) (json.RawMessage, error) {
	return json.Marshal(v)
}

// Bundler is implemented by every displayable value of this package (Table,
// Figure, Card, Progress): it returns the value's bundle or an error that
// says what is wrong with its data.
type Bundler interface {
	Bundle() (Bundle, error)
}

// Bundles returns one bundle per item, in order: a value that is a table and
// a figure at once is shown as two outputs with Bundles(table, figure). The
// first error stops it and names the item's position.
func Bundles(items ...Bundler) ([]Bundle, error) {
	out := make([]Bundle, 0, len(items))
	for i, it := range items {
		if it == nil {
			return nil, fmt.Errorf("display: output %d is nil; pass a table, figure, card or progress", i+1)
		}
		b, err := it.Bundle()
		if err != nil {
			return nil, err
		}
		out = append(out, b)
	}
	return out, nil
}

// TableAndFigure returns the two outputs of a value that is both a table and
// a figure: the table's bundle first, then the figure's.
func TableAndFigure(t *Table, f *Figure) ([]Bundle, error) {
	return Bundles(t, f)
}
