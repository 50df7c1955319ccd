package syntax

import (
	"fmt"
	"sort"
	"strconv"
)

// MaxErrors is the most errors an ErrorList keeps; Add drops the rest, and
// the parser stops early once it has this many, so a hopeless input (a
// binary file pasted into a cell) is answered quickly.
const MaxErrors = 10

// Error is a position plus a message. File may be empty.
type Error struct {
	File string
	Pos  Pos
	Msg  string
}

// Error returns "FILE:LINE:COL: msg", or "LINE:COL: msg" when File is empty.
func (e *Error) Error() string {
	where := strconv.Itoa(e.Pos.Line) + ":" + strconv.Itoa(e.Pos.Col)
	if e.File != "" {
		where = e.File + ":" + where
	}
	return where + ": " + e.Msg
}

// ErrorList is a list of errors in source order once sorted. The zero value
// is an empty list ready to use.
type ErrorList []*Error

// Add appends an error at pos in file; once the list holds MaxErrors errors
// further ones are dropped.
func (l *ErrorList) Add(file string, pos Pos, msg string) {
	if len(*l) >= MaxErrors {
		return
	}
	*l = append(*l, &Error{File: file, Pos: pos, Msg: msg})
}

// Len returns the number of errors in the list.
func (l ErrorList) Len() int { return len(l) }

// Swap exchanges errors i and j (for sort.Interface).
func (l ErrorList) Swap(i, j int) { l[i], l[j] = l[j], l[i] }

// Less orders errors by file, then offset, then message.
func (l ErrorList) Less(i, j int) bool {
	a, b := l[i], l[j]
	if a.File != b.File {
		return a.File < b.File
	}
	if a.Pos.Offset != b.Pos.Offset {
		return a.Pos.Offset < b.Pos.Offset
	}
	return a.Msg < b.Msg
}

// Sort sorts the list into source order. It is stable, so errors at the
// same position keep the order in which they were found.
func (l ErrorList) Sort() { sort.Stable(l) }

// RemoveMultiples sorts the list and keeps only the first error of each
// line: a later error on the same line is almost always a consequence of
// the first.
func (l *ErrorList) RemoveMultiples() {
	l.Sort()
	out := (*l)[:0]
	for i, e := range *l {
		if i > 0 {
			last := out[len(out)-1]
			if last.File == e.File && last.Pos.Line == e.Pos.Line {
				continue
			}
		}
		out = append(out, e)
	}
	for i := len(out); i < len(*l); i++ {
		(*l)[i] = nil // let the dropped errors be collected
	}
	*l = out
}

// Error returns the first error's text and, if there are more, how many.
func (l ErrorList) Error() string {
	switch len(l) {
	case 0:
		return "no errors"
	case 1:
		return l[0].Error()
	}
	return fmt.Sprintf("%s (and %d more errors)", l[0], len(l)-1)
}

// Unwrap returns the errors one by one, for errors.As and errors.Is.
func (l ErrorList) Unwrap() []error {
	out := make([]error, len(l))
	for i, e := range l {
		out[i] = e
	}
	return out
}

// Err returns the list as an error, or nil when it is empty (a nil
// ErrorList stored in an error interface would not compare equal to nil).
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}
