// Package display builds the MIME bundles that Loligo shows: tables, figures,
// model cards and progress, each rendered as the formats a notebook front end
// or a plain-text console can show. It is a leaf: it imports nothing of
// Loligo's, so any layer may use it.
package display

import "encoding/json"

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
