package syntax

import (
	"errors"
	"fmt"
	"os"
	"strings"
	"testing"
)

// An errorChunk is one case of testdata/errors.txt.
type errorChunk struct {
	name, src string
	line      int // line of the "-- " marker, for messages
	wants     []wantError
}

type wantError struct {
	line, col int
	fragment  string
}

// readErrorChunks reads the error-test format: chunks separated by a line
// "-- NAME", each chunk's source followed by "want LINE:COL: FRAGMENT"
// lines. Lines before the first chunk are commentary.
func readErrorChunks(t *testing.T, path string) []errorChunk {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var chunks []errorChunk
	var src []string
	flush := func() {
		if n := len(chunks); n > 0 {
			chunks[n-1].src = strings.Join(src, "\n")
		}
		src = nil
	}
	for i, line := range strings.Split(strings.TrimSuffix(string(data), "\n"), "\n") {
		switch {
		case strings.HasPrefix(line, "-- "):
			flush()
			chunks = append(chunks, errorChunk{name: line[3:], line: i + 1})
		case len(chunks) == 0:
		case strings.HasPrefix(line, "want "):
			var w wantError
			var rest string
			if _, err := fmt.Sscanf(line, "want %d:%d:", &w.line, &w.col); err != nil {
				t.Fatalf("%s:%d: bad want line %q: %v", path, i+1, line, err)
			}
			_, rest, _ = strings.Cut(line[len("want "):], ": ")
			w.fragment = rest
			c := &chunks[len(chunks)-1]
			c.wants = append(c.wants, w)
		default:
			src = append(src, line)
		}
	}
	flush()
	return chunks
}

func TestErrorFile(t *testing.T) {
	t.Parallel()
	chunks := readErrorChunks(t, "testdata/errors.txt")
	if len(chunks) < 20 {
		t.Fatalf("only %d chunks read from testdata/errors.txt", len(chunks))
	}
	for _, c := range chunks {
		t.Run(c.name, func(t *testing.T) {
			_, err := Parse("e", c.src)
			var list ErrorList
			if err != nil && !errors.As(err, &list) {
				t.Fatalf("error %v is not an ErrorList", err)
			}
			if len(c.wants) == 0 && err != nil {
				t.Fatalf("errors.txt:%d: unexpected error: %v", c.line, err)
			}
			for _, w := range c.wants {
				if !hasError(list, w) {
					t.Errorf("errors.txt:%d: want %d:%d: %s\ngot:\n%s", c.line, w.line, w.col, w.fragment, listText(list))
				}
			}
		})
	}
}

func hasError(list ErrorList, w wantError) bool {
	for _, e := range list {
		if e.Pos.Line == w.line && e.Pos.Col == w.col && strings.Contains(e.Msg, w.fragment) {
			return true
		}
	}
	return false
}

func listText(list ErrorList) string {
	var b strings.Builder
	for _, e := range list {
		b.WriteString("\t" + e.Error() + "\n")
	}
	return b.String()
}

func TestErrorList(t *testing.T) {
	t.Parallel()
	var l ErrorList
	if l.Err() != nil {
		t.Fatal("empty list: Err() != nil")
	}
	l.Add("c", Pos{Offset: 9, Line: 2, Col: 3}, "second")
	l.Add("c", Pos{Offset: 1, Line: 1, Col: 2}, "first")
	l.Add("c", Pos{Offset: 11, Line: 2, Col: 5}, "same line")
	l.RemoveMultiples()
	if l.Len() != 2 || l[0].Msg != "first" || l[1].Msg != "second" {
		t.Fatalf("after RemoveMultiples: %v", l)
	}
	// The "FILE:LINE:COL: msg" form is the GNU Coding Standards' format
	// for compiler messages (section 4.4), which editors jump to.
	if got, want := l[0].Error(), "c:1:2: first"; got != want {
		t.Errorf("Error() = %q, want %q", got, want)
	}
	if got, want := l.Err().Error(), "c:1:2: first (and 1 more errors)"; got != want {
		t.Errorf("list Error() = %q, want %q", got, want)
	}
	for i := 0; i < 20; i++ {
		l.Add("c", Pos{Offset: 100 + i, Line: 10 + i, Col: 1}, "more")
	}
	if l.Len() != MaxErrors {
		t.Errorf("Len() = %d after 22 adds, want the cap %d", l.Len(), MaxErrors)
	}
}

func TestErrorsBounded(t *testing.T) {
	t.Parallel()
	src := strings.Repeat("x = )\n", 100)
	_, err := Parse("c", src)
	var list ErrorList
	if !errors.As(err, &list) || list.Len() != MaxErrors {
		t.Fatalf("100 bad lines gave %v, want %d errors", err, MaxErrors)
	}
}
