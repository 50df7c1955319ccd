package runtime

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// A language test file holds chunks, each starting with a line "-- name".
// After the source come expectation lines:
//
//	=> TEXT         the cell's result shows as TEXT (exactly)
//	!! L:C: TEXT    the cell fails at line L, column C with a message containing TEXT
//	!! TEXT         the cell fails with a message containing TEXT
//	?? NAME         after the cell (failed or not), NAME is not bound
//
// Chunks run in one session, in order, so later chunks see earlier bindings.
func TestLanguageFiles(t *testing.T) {
	files, err := filepath.Glob("testdata/*.txt")
	if err != nil || len(files) == 0 {
		t.Fatalf("no language test files: %v", err)
	}
	for _, path := range files {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		s := NewSession(NewRegistry())
		for _, ch := range splitChunks(string(data)) {
			t.Run(filepath.Base(path)+"/"+ch.name, func(t *testing.T) { ch.check(t, s) })
		}
	}
}

type chunk struct {
	name, src string
	want      []string
}

func splitChunks(text string) []chunk {
	var out []chunk
	for _, part := range strings.Split("\n"+text, "\n-- ")[1:] {
		name, body, _ := strings.Cut(part, "\n")
		ch := chunk{name: strings.TrimSpace(name)}
		var src []string
		for _, line := range strings.Split(body, "\n") {
			if strings.HasPrefix(line, "=> ") || strings.HasPrefix(line, "!! ") || strings.HasPrefix(line, "?? ") {
				ch.want = append(ch.want, line)
			} else if len(ch.want) == 0 {
				src = append(src, line)
			}
		}
		ch.src = strings.TrimRight(strings.Join(src, "\n"), "\n")
		out = append(out, ch)
	}
	return out
}

func (ch chunk) check(t *testing.T, s *Session) {
	res, err := s.Execute(context.Background(), "cell", ch.src, nil)
	if len(ch.want) == 0 {
		t.Fatal("chunk has no expectation")
	}
	for _, w := range ch.want {
		kind, text := w[:2], w[3:]
		switch kind {
		case "=>":
			if err != nil {
				t.Fatalf("unexpected error: %v", err)
			}
			got := ""
			if res.Value != nil {
				got = res.Value.String()
			}
			if got != text {
				t.Errorf("result %q, want %q", got, text)
			}
		case "!!":
			if err == nil {
				t.Fatalf("no error, want %q (result %v)", text, res.Value)
			}
			var re *Error
			if !errors.As(err, &re) {
				t.Fatalf("error %T is not a *runtime.Error: %v", err, err)
			}
			if !strings.Contains(err.Error(), text) {
				t.Errorf("error %q does not contain %q", err.Error(), text)
			}
		case "??":
			if _, ok := s.Lookup(text); ok {
				t.Errorf("%s is bound after the cell", text)
			}
		}
	}
}
