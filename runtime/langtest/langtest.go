// Package langtest runs language test files: cells of the modelling
// language with the results or errors they must give. The runtime and the
// standard library's bindings keep their language tests in such files.
//
// A file holds chunks, each starting with a line "-- name". After a chunk's
// source come expectation lines:
//
//	=> TEXT         the cell's result shows as TEXT (exactly)
//	~> TEXT         the cell's result's plain text contains TEXT
//	!! TEXT         the cell fails with a message containing TEXT
//	                (write "!! 3:7: message" to check the position too)
//	?? NAME         after the cell, NAME is not bound (a failed cell binds nothing)
//	## MIME         the result's display has an output of that MIME type
//
// The chunks of one file run in order in one session, so later chunks see
// earlier bindings. Reference values name their source in a comment line of
// the chunk.
package langtest

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
)

// Run runs every file matching glob, each in a fresh session from
// newSession, as subtests named file/chunk.
func Run(t *testing.T, glob string, newSession func() *runtime.Session) {
	t.Helper()
	files, err := filepath.Glob(glob)
	if err != nil || len(files) == 0 {
		t.Fatalf("no language test files match %s: %v", glob, err)
	}
	for _, path := range files {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		s := newSession()
		for _, ch := range split(string(data)) {
			t.Run(filepath.Base(path)+"/"+ch.name, func(t *testing.T) { ch.check(t, s) })
		}
	}
}

type chunk struct {
	name, src string
	want      []string
}

var marks = []string{"=> ", "~> ", "!! ", "?? ", "## "}

func isMark(line string) bool {
	for _, m := range marks {
		if strings.HasPrefix(line, m) || line == strings.TrimSpace(m) {
			return true
		}
	}
	return false
}

func split(text string) []chunk {
	var out []chunk
	for _, part := range strings.Split("\n"+text, "\n-- ")[1:] {
		name, body, _ := strings.Cut(part, "\n")
		ch := chunk{name: strings.TrimSpace(name)}
		var src []string
		for _, line := range strings.Split(body, "\n") {
			if isMark(line) {
				ch.want = append(ch.want, line+" ")
			} else if len(ch.want) == 0 {
				src = append(src, line)
			}
		}
		ch.src = strings.TrimRight(strings.Join(src, "\n"), "\n")
		out = append(out, ch)
	}
	return out
}

type discard struct{}

func (discard) Display(display.Bundle, string, bool) {}
func (discard) Stream(string, string)                {}

func (ch chunk) check(t *testing.T, s *runtime.Session) {
	for _, f := range ch.failures(s) {
		t.Error(f)
	}
}

// failures runs the chunk and lists every expectation it does not meet.
func (ch chunk) failures(s *runtime.Session) []string {
	res, err := s.Execute(context.Background(), "cell", ch.src, discard{})
	if len(ch.want) == 0 {
		return []string{"chunk has no expectation"}
	}
	var out []string
	for _, w := range ch.want {
		kind, text := w[:2], strings.TrimSuffix(w[3:], " ")
		switch {
		case kind == "!!":
			var re *runtime.Error
			if err == nil || !errors.As(err, &re) || !strings.Contains(err.Error(), text) {
				out = append(out, fmt.Sprintf("error %v, want a *runtime.Error containing %q", err, text))
			}
		case kind == "??":
			if _, ok := s.Lookup(text); ok {
				out = append(out, fmt.Sprintf("%s is bound after the cell", text))
			}
		case err != nil:
			return append(out, fmt.Sprintf("unexpected error: %v", err))
		default:
			if f := checkResult(kind, text, res.Value); f != "" {
				out = append(out, f)
			}
		}
	}
	return out
}

func checkResult(kind, text string, v runtime.Value) string {
	got := ""
	if v != nil {
		got = v.String()
	}
	switch kind {
	case "=>":
		if got != text {
			return fmt.Sprintf("result %q, want %q", got, text)
		}
	case "~>":
		if !strings.Contains(got, text) {
			return fmt.Sprintf("result %q does not contain %q", got, text)
		}
	case "##":
		if v == nil {
			return "no result to show"
		}
		bs, err := runtime.Show(v)
		if err != nil {
			return fmt.Sprintf("Show: %v", err)
		}
		for _, b := range bs {
			if _, ok := b.Data[text]; ok {
				return ""
			}
		}
		return fmt.Sprintf("no %s output among %d bundles", text, len(bs))
	}
	return ""
}
