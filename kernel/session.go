package kernel

import "context"

// Session is the language a kernel drives. The kernel calls Execute, Complete,
// Inspect and IsComplete from a single goroutine, one call at a time, so an
// implementation needs no locking of its own; Info may be called from any
// goroutine and must be safe for concurrent use.
type Session interface {
	// Execute runs one cell. ctx is cancelled on interrupt. Outputs go to out
	// as they happen. The returned error, if any, is shown as an error reply
	// (ename/evalue/traceback); see ErrorDetail.
	Execute(ctx context.Context, code string, out Output) (result *Bundle, err error)
	// Complete offers completions at cursor; cursor, start and end count
	// Unicode code points, as the protocol says.
	Complete(code string, cursor int) (matches []string, start, end int)
	// Inspect describes the object at cursor; detail is 0 or 1.
	Inspect(code string, cursor int, detail int) (found bool, b *Bundle)
	// IsComplete reports "complete", "incomplete", "invalid" or "unknown",
	// and for "incomplete" the indent of the next line.
	IsComplete(code string) (status string, indent string)
	// Info describes the language.
	Info() LanguageInfo
}

// Output receives what a running cell shows, as it happens. Calls are made
// from the goroutine running Execute.
type Output interface {
	// Stream writes text to "stdout" or "stderr".
	Stream(name, text string)
	// Display shows b as display_data, or as update_display_data when update
	// is true; a non-empty displayID goes into the transient dict so a later
	// update can replace the shown output.
	Display(b Bundle, displayID string, update bool)
	// ClearOutput clears the cell's output, at once or (wait) when the next
	// output arrives.
	ClearOutput(wait bool)
}

// Bundle is a MIME bundle: MIME type to content (strings, or json.RawMessage
// for application/json), with optional per-type metadata.
type Bundle struct {
	Data     map[string]any
	Metadata map[string]any
}

// LanguageInfo describes the session's language for kernel_info_reply.
type LanguageInfo struct {
	Name          string     // language name, e.g. "loligo"
	Version       string     // language version
	MIMEType      string     // MIME type of a script, e.g. "text/x-loligo"
	FileExtension string     // with the dot, e.g. ".loligo"
	Banner        string     // text a front end may show on connect
	HelpLinks     []HelpLink // links a front end may list in its help menu
}

// HelpLink is one entry of kernel_info_reply's help_links.
type HelpLink struct {
	Text string `json:"text"`
	URL  string `json:"url"`
}

// ErrorDetail is what an error returned by Session.Execute may implement to
// set the error reply's ename and traceback lines (with the position caret).
// Other errors get ename "Error" and the message as the traceback; an error
// wrapping context.Canceled gets ename "Interrupted".
type ErrorDetail interface {
	Name() string
	Traceback() []string
}
