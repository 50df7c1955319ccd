package stdlib

import (
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
)

// A language test file (testdata/*.txt) holds chunks, each starting with a
// line "-- name". After the source come expectation lines:
//
//	=> TEXT         the cell's result shows as TEXT (exactly)
//	~> TEXT         the cell's result's plain text contains TEXT
//	!! TEXT         the cell fails with a message containing TEXT
//	## MIME         the result's display has an output of that MIME type
//
// Chunks of one file run in one session, in order, so later chunks see
// earlier bindings. Reference values in chunks name their source in a
// comment line of the chunk.
func TestLanguageFiles(t *testing.T) {
	files, err := filepath.Glob("testdata/*.txt")
	if err != nil {
		t.Fatal(err)
	}
	for _, path := range files {
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		s := newTestSession()
		for _, ch := range splitChunks(string(data)) {
			t.Run(filepath.Base(path)+"/"+ch.name, func(t *testing.T) { ch.check(t, s) })
		}
	}
}

func newTestSession() *runtime.Session {
	reg := runtime.NewRegistry()
	Register(reg)
	return runtime.NewSession(reg)
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
			if len(line) >= 3 && strings.Contains("=> ~> !! ## ", line[:3]) && line[2] == ' ' {
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

type discard struct{}

func (discard) Display(display.Bundle, string, bool) {}
func (discard) Stream(string, string)                {}

func (ch chunk) check(t *testing.T, s *runtime.Session) {
	res, err := s.Execute(context.Background(), "cell", ch.src, discard{})
	if len(ch.want) == 0 {
		t.Fatal("chunk has no expectation")
	}
	for _, w := range ch.want {
		kind, text := w[:2], w[3:]
		if kind == "!!" {
			var re *runtime.Error
			if err == nil || !errors.As(err, &re) || !strings.Contains(err.Error(), text) {
				t.Errorf("error %v, want one containing %q", err, text)
			}
			continue
		}
		if err != nil {
			t.Fatalf("unexpected error: %v", err)
		}
		got := ""
		if res.Value != nil {
			got = res.Value.String()
		}
		switch kind {
		case "=>":
			if got != text {
				t.Errorf("result %q, want %q", got, text)
			}
		case "~>":
			if !strings.Contains(got, text) {
				t.Errorf("result %q does not contain %q", got, text)
			}
		case "##":
			bs, err := runtime.Show(res.Value)
			if err != nil {
				t.Fatalf("Show: %v", err)
			}
			found := false
			for _, b := range bs {
				_, ok := b.Data[text]
				found = found || ok
			}
			if !found {
				t.Errorf("no %s output among %d bundles", text, len(bs))
			}
		}
	}
}
