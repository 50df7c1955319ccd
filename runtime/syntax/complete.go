package syntax

import "strings"

// Status says whether a cell's text is finished, for the front end's
// is_complete request.
type Status int

// The answers of Completeness.
const (
	// Complete text can be run as it is (empty text is complete).
	Complete Status = iota
	// Incomplete text needs more: it ends inside an open bracket, after an
	// operator or keyword that needs an operand, or in an if with no else
	// (which may come on the next line).
	Incomplete
	// Invalid text cannot be finished: running it gives an error whatever
	// follows (a stray closing bracket, an unterminated string, an illegal
	// character).
	Invalid
)

// String returns the status as the messaging protocol spells it:
// "complete", "incomplete" or "invalid".
func (s Status) String() string {
	switch s {
	case Complete:
		return "complete"
	case Incomplete:
		return "incomplete"
	case Invalid:
		return "invalid"
	}
	return "unknown"
}

// Completeness says whether src is a finished cell. For Incomplete text
// indent is the suggested indentation of the next line: four spaces per
// open bracket, and at least four; otherwise it is "".
//
// The text is parsed: it is incomplete exactly when its first error comes
// after its last token (the parser wanted more and found a line break or
// the end of the text), and invalid when an error comes earlier, because
// no text added after the end can mend that.
func Completeness(src string) (st Status, indent string) {
	_, err := Parse("", src)
	if err == nil {
		return Complete, ""
	}
	list, ok := err.(ErrorList)
	depth, end := tail(src)
	if !ok || len(list) == 0 || list[0].Pos.Offset < end {
		return Invalid, ""
	}
	return Incomplete, strings.Repeat("    ", max(depth, 1))
}

// tail returns the number of brackets left open at the end of src and the
// offset just after its last token.
func tail(src string) (depth, end int) {
	var s scanner
	s.init(src, nil)
	var it Item
	for {
		s.scan(&it)
		switch it.Tok {
		case EOF:
			return depth, end
		case NEWLINE:
			continue
		case LPAREN, LBRACK:
			depth++
		case RPAREN, RBRACK:
			depth = max(depth-1, 0)
		}
		end = it.End.Offset
	}
}
