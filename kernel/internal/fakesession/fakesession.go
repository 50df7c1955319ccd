// Package fakesession is a tiny stand-in language for testing the kernel.
// Each line of a cell is one statement:
//
//	sleep S        wait S seconds, checking the context every millisecond
//	print TEXT     write TEXT and a newline to stdout (eprint: stderr)
//	display TEXT   show TEXT as display_data
//	show ID TEXT   show TEXT with display id ID
//	update ID TEXT replace the display with id ID
//	clear          clear the output (wait false)
//	fail TEXT      stop with an error named FakeError
//	panic          panic inside the session
//	anything else  becomes the cell's result, echoed as text/plain
package fakesession

import (
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"
	"time"
	"unicode"

	"github.com/loligo-lab/loligo/kernel"
)

// Session is the fake language; the zero value is ready.
type Session struct{}

var _ kernel.Session = Session{}

// New returns a Session as a kernel.Session.
func New() kernel.Session { return Session{} }

// FakeError is the error of a `fail` statement.
type FakeError struct {
	Msg  string
	Line int
}

func (e *FakeError) Error() string { return e.Msg }
func (e *FakeError) Name() string  { return "FakeError" }
func (e *FakeError) Traceback() []string {
	return []string{fmt.Sprintf("line %d: fail %s", e.Line, e.Msg), "     ^", "FakeError: " + e.Msg}
}

// Execute runs each line in turn.
func (Session) Execute(ctx context.Context, code string, out kernel.Output) (*kernel.Bundle, error) {
	var result *kernel.Bundle
	for i, line := range strings.Split(code, "\n") {
		line = strings.TrimSpace(line)
		if line == "" {
			continue
		}
		cmd, arg, _ := strings.Cut(line, " ")
		result = nil
		switch cmd {
		case "sleep":
			if err := sleep(ctx, arg); err != nil {
				return nil, err
			}
		case "print":
			out.Stream("stdout", arg+"\n")
		case "eprint":
			out.Stream("stderr", arg+"\n")
		case "display":
			out.Display(text(arg), "", false)
		case "show", "update":
			id, txt, _ := strings.Cut(arg, " ")
			out.Display(text(txt), id, cmd == "update")
		case "clear":
			out.ClearOutput(false)
		case "fail":
			return nil, &FakeError{Msg: arg, Line: i + 1}
		case "panic":
			panic("fake panic on request")
		default:
			b := text(line)
			result = &b
		}
	}
	return result, nil
}

func text(s string) kernel.Bundle {
	return kernel.Bundle{Data: map[string]any{"text/plain": s}, Metadata: map[string]any{}}
}

// sleep waits, checking ctx every millisecond, as a simulation loop would.
func sleep(ctx context.Context, arg string) error {
	sec, err := strconv.ParseFloat(arg, 64)
	if err != nil || sec < 0 {
		return errors.New("fakesession: sleep needs seconds, e.g. sleep 0.5")
	}
	end := time.Now().Add(time.Duration(sec * float64(time.Second)))
	for time.Now().Before(end) {
		if err := ctx.Err(); err != nil {
			return err
		}
		time.Sleep(time.Millisecond)
	}
	return nil
}

var words = []string{"clear", "display", "eprint", "fail", "panic", "print", "show", "sleep", "update"}

// wordAt returns the identifier around cursor (code points) and its range.
func wordAt(code string, cursor int) (string, int, int) {
	r := []rune(code)
	start, end := cursor, cursor
	for start > 0 && unicode.IsLetter(r[start-1]) {
		start--
	}
	for end < len(r) && unicode.IsLetter(r[end]) {
		end++
	}
	return string(r[start:end]), start, end
}

// Complete offers the statement words starting with the word before cursor.
func (Session) Complete(code string, cursor int) ([]string, int, int) {
	r := []rune(code)
	start := cursor
	for start > 0 && unicode.IsLetter(r[start-1]) {
		start--
	}
	prefix := string(r[start:cursor])
	var m []string
	for _, w := range words {
		if strings.HasPrefix(w, prefix) {
			m = append(m, w)
		}
	}
	return m, start, cursor
}

// Inspect documents the statement word at cursor.
func (Session) Inspect(code string, cursor int, detail int) (bool, *kernel.Bundle) {
	w, _, _ := wordAt(code, cursor)
	for _, x := range words {
		if x == w {
			doc := w + ": a fakesession statement"
			if detail > 0 {
				doc += " (detail 1)"
			}
			b := text(doc)
			return true, &b
		}
	}
	return false, nil
}

// IsComplete: a trailing backslash continues the cell; a leading '}' is invalid.
func (Session) IsComplete(code string) (string, string) {
	switch {
	case strings.HasPrefix(code, "}"):
		return "invalid", ""
	case strings.HasSuffix(code, "\\"):
		return "incomplete", "  "
	}
	return "complete", ""
}

// Info describes the fake language.
func (Session) Info() kernel.LanguageInfo {
	return kernel.LanguageInfo{Name: "fakesession", Version: "0.1", MIMEType: "text/x-fakesession",
		FileExtension: ".fake", Banner: "fakesession: a test language for the loligo kernel",
		HelpLinks: []kernel.HelpLink{{Text: "Loligo", URL: "https://example.invalid/loligo"}}}
}
