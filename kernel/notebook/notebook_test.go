package notebook

import (
	"bytes"
	"context"
	"encoding/xml"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/kernel"
)

// echoSession is a stand-in language: "print X" streams X, "show X"
// displays X with id d1, "update X" updates d1, "clear" clears, "fail"
// fails, anything else is its own result.
type echoSession struct{}

type failure struct{}

func (failure) Error() string                                       { return "cell:1:1: it failed" }
func (failure) Name() string                                        { return "ValueError" }
func (failure) Traceback() []string                                 { return []string{"cell:1:1: it failed", "    fail", "    ^"} }
func text(s string) kernel.Bundle                                   { return kernel.Bundle{Data: map[string]any{"text/plain": s}} }
func (echoSession) Info() kernel.LanguageInfo                       { return kernel.LanguageInfo{Name: "echo"} }
func (echoSession) Complete(string, int) ([]string, int, int)       { return nil, 0, 0 }
func (echoSession) Inspect(string, int, int) (bool, *kernel.Bundle) { return false, nil }
func (echoSession) IsComplete(string) (string, string)              { return "complete", "" }

func (echoSession) Execute(ctx context.Context, code string, out kernel.Output) (*kernel.Bundle, error) {
	var last *kernel.Bundle
	for _, line := range strings.Split(code, "\n") {
		cmd, arg, _ := strings.Cut(line, " ")
		switch cmd {
		case "print":
			out.Stream("stdout", arg+"\n")
		case "show":
			out.Display(text(arg), "d1", false)
		case "update":
			out.Display(text(arg), "d1", true)
		case "clear":
			out.ClearOutput(false)
		case "fail":
			return nil, failure{}
		default:
			b := text(line)
			last = &b
		}
	}
	return last, nil
}

func TestExecuteCollectsOutputsAsAFrontEndWould(t *testing.T) {
	nb := New("loligo", "Loligo", "loligo", ".loligo")
	nb.AddCell("markdown", "# Title")
	nb.AddCell("code", "print a\nprint b\nshow old\nupdate new\n42")
	nb.AddCell("code", "show x\nclear\nprint after")
	nb.AddCell("code", "fail")
	nb.AddCell("code", "never")
	res := Execute(context.Background(), nb, echoSession{}, nil)
	if res.Failed != 3 || res.Ran != 3 {
		t.Fatalf("ran %d, failed at %d; want 3 and 3", res.Ran, res.Failed)
	}
	c := nb.Cells[1]
	if len(c.Outputs) != 3 || c.Outputs[0].Text != "a\nb\n" || c.Outputs[1].Data["text/plain"] != "new" ||
		c.Outputs[2].Type != "execute_result" || *c.Outputs[2].ExecutionCount != 1 {
		t.Errorf("cell 1 outputs: %+v", c.Outputs)
	}
	if o := nb.Cells[2].Outputs; len(o) != 1 || o[0].Text != "after\n" {
		t.Errorf("clear_output not applied: %+v", o)
	}
	if o := nb.Cells[3].Outputs; len(o) != 1 || o[0].EName != "ValueError" || len(o[0].Traceback) != 3 {
		t.Errorf("error output: %+v", o)
	}
	if nb.Cells[4].ExecutionCount != nil {
		t.Error("a cell after the failure ran")
	}
	var dummy kernel.ErrorDetail
	if !errors.As(res.Err, &dummy) {
		t.Error("the run's error lost its detail")
	}
}

// TestWrittenNotebookIsValid checks our output against the nbformat schema
// with Debian's python3-nbformat (the reference implementation of the
// format), when it is installed; CI installs it.
func TestWrittenNotebookIsValid(t *testing.T) {
	nb := New("loligo", "Loligo", "loligo", ".loligo")
	nb.AddCell("markdown", "Some *text*.")
	nb.AddCell("code", "print a\nshow fig\n1")
	nb.AddCell("code", "fail")
	Execute(context.Background(), nb, echoSession{}, &Settings{KeepGoing: true})
	path := filepath.Join(t.TempDir(), "out.ipynb")
	if err := nb.WriteFile(path); err != nil {
		t.Fatal(err)
	}
	back, err := ReadFile(path)
	if err != nil || len(back.Cells) != 3 || back.Cells[1].Source != "print a\nshow fig\n1" {
		t.Fatalf("read back: %v %+v", err, back)
	}
	py := os.Getenv("LOLIGO_PYTHON")
	if py == "" {
		py = "python3"
	}
	script := "import nbformat,sys; nbformat.validate(nbformat.read(sys.argv[1], as_version=4)); print('valid')"
	out, err := exec.Command(py, "-c", script, path).CombinedOutput()
	if err != nil {
		if strings.Contains(string(out), "No module named") && os.Getenv("LOLIGO_REQUIRE_JUPYTER") != "1" {
			t.Skip("python3-nbformat is not installed; CI installs it")
		}
		t.Fatalf("nbformat rejects our notebook: %v\n%s", err, out)
	}
}

func TestReadRejects(t *testing.T) {
	cases := map[string]string{
		"not json":     "{",
		"old format":   `{"nbformat": 3, "nbformat_minor": 0, "cells": [], "metadata": {}}`,
		"unknown cell": `{"nbformat": 4, "nbformat_minor": 5, "metadata": {}, "cells": [{"cell_type": "sketch", "source": ""}]}`,
	}
	for name, src := range cases {
		if _, err := Read(strings.NewReader(src)); err == nil || !strings.HasPrefix(err.Error(), "notebook: ") {
			t.Errorf("%s: got %v", name, err)
		}
	}
}

func TestReportIsSelfContainedXHTMLish(t *testing.T) {
	nb := New("loligo", "Loligo", "loligo", ".loligo")
	nb.AddCell("markdown", "## Results\n\n- rate of `tau_m` **fast**\n- <script>x</script>")
	c := nb.AddCell("code", "x < 1")
	c.Outputs = []*Output{{Type: "display_data", Data: map[string]any{
		"image/svg+xml": `<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"></svg>`,
		"text/plain":    "Figure"}}}
	var b bytes.Buffer
	if err := Report(&b, nb, "Run & report", "invented data"); err != nil {
		t.Fatal(err)
	}
	page := b.String()
	for _, bad := range []string{"<script", "<?xml", "http://cdn", "<link"} {
		if strings.Contains(page, bad) {
			t.Errorf("report contains %q", bad)
		}
	}
	for _, want := range []string{"<h2>Results</h2>", "<code>tau_m</code>", "<strong>fast</strong>", "&lt;script&gt;", "x &lt; 1", "<svg"} {
		if !strings.Contains(page, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	// The page must at least be well-formed enough for an XML tokenizer to
	// walk it without error (HTML5 void tags aside, which we avoid).
	dec := xml.NewDecoder(strings.NewReader(strings.Replace(page, "<!DOCTYPE html>", "", 1)))
	dec.Strict = false
	for {
		if _, err := dec.Token(); err != nil {
			if err.Error() != "EOF" {
				t.Errorf("report does not tokenize: %v", err)
			}
			break
		}
	}
}

func TestFromScriptSplitsCells(t *testing.T) {
	nb := New("loligo", "Loligo", "loligo", ".loligo")
	FromScript("a = 1\n#-- Second part\nb = 2\n\n#--\nc = 3\n", nb)
	var kinds []string
	for _, c := range nb.Cells {
		kinds = append(kinds, c.Type+":"+string(c.Source))
	}
	want := "code:a = 1|markdown:## Second part|code:b = 2|code:c = 3"
	if got := strings.Join(kinds, "|"); got != want {
		t.Errorf("got %s, want %s", got, want)
	}
}
