package runtime

import (
	"errors"
	"fmt"
	"strings"

	"github.com/loligo-lab/loligo/runtime/syntax"
)

// Error kinds, shown as the error's name in notebooks.
const (
	KindSyntax      = "SyntaxError"
	KindName        = "NameError"
	KindUnit        = "UnitError"
	KindArgument    = "ArgumentError"
	KindValue       = "ValueError"
	KindInterrupted = "Interrupted"
	KindInternal    = "InternalError"
)

// Error is an error of a cell: where it happened, what happened, and the
// call chain of formulas it went through.
type Error struct {
	Kind  string
	File  string
	Pos   syntax.Pos
	Msg   string
	Src   string   // the cell's source, for the caret line
	Stack []string // "in formula sat at cell[2]:1:9", innermost first
	Err   error    // the underlying error, if any (context.Canceled on interrupt)
}

// Error returns "FILE:LINE:COL: message".
func (e *Error) Error() string {
	if e.Pos.IsValid() {
		return fmt.Sprintf("%s:%d:%d: %s", e.File, e.Pos.Line, e.Pos.Col, e.Msg)
	}
	return e.Msg
}

// Unwrap gives the underlying error.
func (e *Error) Unwrap() error { return e.Err }

// Name is the error's kind, for the Jupyter error message's ename.
func (e *Error) Name() string { return e.Kind }

// Traceback is the message, the source line and a caret under the column,
// then the formula call chain.
func (e *Error) Traceback() []string {
	lines := []string{e.Error()}
	if src, ok := sourceLine(e.Src, e.Pos.Line); ok {
		lines = append(lines, "    "+src, "    "+caretPad(src, e.Pos.Col)+"^")
	}
	return append(lines, e.Stack...)
}

// Format is the whole traceback as one text.
func (e *Error) Format() string { return strings.Join(e.Traceback(), "\n") }

func sourceLine(src string, line int) (string, bool) {
	if line < 1 || src == "" {
		return "", false
	}
	lines := strings.Split(src, "\n")
	if line > len(lines) {
		return "", false
	}
	return strings.TrimRight(lines[line-1], "\r"), true
}

// caretPad is the run of spaces (tabs kept as tabs) that puts a caret under
// column col of line.
func caretPad(line string, col int) string {
	var b strings.Builder
	i := 1
	for _, r := range line {
		if i >= col {
			break
		}
		if r == '\t' {
			b.WriteByte('\t')
		} else {
			b.WriteByte(' ')
		}
		i++
	}
	for ; i < col; i++ {
		b.WriteByte(' ')
	}
	return b.String()
}

// kindError is a plain error that says what kind of error it is; builtins
// may return one to set the kind (ArgumentErrorf, ValueErrorf, UnitErrorf).
type kindError struct {
	kind string
	msg  string
}

func (e *kindError) Error() string { return e.msg }

// ArgumentErrorf returns an error about a call's arguments.
func ArgumentErrorf(format string, args ...any) error {
	return &kindError{KindArgument, fmt.Sprintf(format, args...)}
}

// ValueErrorf returns an error about a value that is out of range or malformed.
func ValueErrorf(format string, args ...any) error {
	return &kindError{KindValue, fmt.Sprintf(format, args...)}
}

// UnitErrorf returns an error about units or dimensions.
func UnitErrorf(format string, args ...any) error {
	return &kindError{KindUnit, fmt.Sprintf(format, args...)}
}

// kindOf finds the kind of err, ValueError by default.
func kindOf(err error) string {
	var ke *kindError
	if errors.As(err, &ke) {
		return ke.kind
	}
	var re *Error
	if errors.As(err, &re) {
		return re.Kind
	}
	return KindValue
}

// suggest returns the candidate closest to name by edit distance, or "" if
// none is close enough to be a likely typo.
func suggest(name string, candidates []string) string {
	best, bestD := "", 1<<30
	for _, c := range candidates {
		if c == name {
			continue
		}
		d := editDistance(strings.ToLower(name), strings.ToLower(c))
		if d < bestD || (d == bestD && c < best) {
			best, bestD = c, d
		}
	}
	// One edit in three characters is a likely typo; a name of three
	// characters or fewer gets one edit (so fit does not suggest at).
	n := len([]rune(name))
	limit := 1 + n/3
	if n <= 3 {
		limit = 1
	}
	if bestD <= limit {
		return best
	}
	return ""
}

// editDistance is the optimal-string-alignment distance counted in code
// points: insertions, deletions, substitutions and swaps of two adjacent
// characters (tua → tau) each cost one.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	d := make([][]int, len(ra)+1)
	for i := range d {
		d[i] = make([]int, len(rb)+1)
		d[i][0] = i
	}
	for j := range d[0] {
		d[0][j] = j
	}
	for i := 1; i <= len(ra); i++ {
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			d[i][j] = min(d[i-1][j]+1, d[i][j-1]+1, d[i-1][j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				d[i][j] = min(d[i][j], d[i-2][j-2]+1)
			}
		}
	}
	return d[len(ra)][len(rb)]
}
