package notebook

import (
	"context"
	"errors"
	"strings"

	"github.com/loligo-lab/loligo/kernel"
)

// Settings configure Execute. The zero value runs every code cell and stops
// at the first error.
type Settings struct {
	// KeepGoing runs the remaining cells after a failed one.
	KeepGoing bool
	// Progress, if set, is called before each code cell with its index
	// (from 0) among the code cells and their number.
	Progress func(done, total int)
	// Stream, if set, also receives every stream output as it happens (so a
	// terminal shows a cell's prints and warnings while it runs).
	Stream func(name, text string)
}

// Result says how a run went.
type Result struct {
	Ran    int // code cells run
	Failed int // index in nb.Cells of the first failed cell, or -1
	Err    error
}

// Execute runs the notebook's code cells in order in session, replacing
// their outputs and execution counts, as a front end would. Markdown and raw
// cells are kept as they are. An error is recorded as the cell's error
// output; unless s.KeepGoing, the cells after it are left not run (their
// old outputs cleared).
func Execute(ctx context.Context, nb *Notebook, session kernel.Session, s *Settings) Result {
	if s == nil {
		s = &Settings{}
	}
	res := Result{Failed: -1}
	total := 0
	for _, c := range nb.Cells {
		if c.Type == "code" {
			total++
			c.Outputs, c.ExecutionCount = []*Output{}, nil
		}
	}
	for i, c := range nb.Cells {
		if c.Type != "code" || (res.Failed >= 0 && !s.KeepGoing) {
			continue
		}
		if s.Progress != nil {
			s.Progress(res.Ran, total)
		}
		res.Ran++
		n := res.Ran
		c.ExecutionCount = &n
		rec := &recorder{cell: c, stream: s.Stream}
		result, err := session.Execute(ctx, string(c.Source), rec)
		if err != nil {
			c.Outputs = append(c.Outputs, errorOutput(err))
			if res.Failed < 0 {
				res.Failed, res.Err = i, err
			}
			if ctx.Err() != nil {
				break
			}
			continue
		}
		if result != nil {
			c.Outputs = append(c.Outputs, &Output{Type: "execute_result", Data: result.Data,
				Metadata: orEmpty(result.Metadata), ExecutionCount: &n})
		}
	}
	if s.Progress != nil {
		s.Progress(res.Ran, total)
	}
	return res
}

func orEmpty(m map[string]any) map[string]any {
	if m == nil {
		return map[string]any{}
	}
	return m
}

func errorOutput(err error) *Output {
	o := &Output{Type: "error", EName: "Error", EValue: err.Error(), Traceback: []string{err.Error()}}
	var d kernel.ErrorDetail
	if errors.As(err, &d) {
		o.EName, o.Traceback = d.Name(), d.Traceback()
	}
	if errors.Is(err, context.Canceled) {
		o.EName = "Interrupted"
	}
	return o
}

// recorder collects a running cell's outputs the way a front end keeps
// them: consecutive stream text of one name merges, an update replaces the
// output with that display id, a clear empties the list (at once, or before
// the next output when wait is set).
type recorder struct {
	cell      *Cell
	stream    func(name, text string)
	clearNext bool
}

var _ kernel.Output = (*recorder)(nil)

func (r *recorder) pending() {
	if r.clearNext {
		r.cell.Outputs, r.clearNext = []*Output{}, false
	}
}

func (r *recorder) Stream(name, text string) {
	if r.stream != nil {
		r.stream(name, text)
	}
	r.pending()
	outs := r.cell.Outputs
	if n := len(outs); n > 0 && outs[n-1].Type == "stream" && outs[n-1].Name == name {
		outs[n-1].Text += Source(text)
		return
	}
	r.cell.Outputs = append(outs, &Output{Type: "stream", Name: name, Text: Source(text)})
}

func (r *recorder) Display(b kernel.Bundle, id string, update bool) {
	if update {
		for _, o := range r.cell.Outputs {
			if o.displayID == id && id != "" {
				o.Data, o.Metadata = b.Data, orEmpty(b.Metadata)
			}
		}
		return
	}
	r.pending()
	r.cell.Outputs = append(r.cell.Outputs, &Output{Type: "display_data", Data: b.Data,
		Metadata: orEmpty(b.Metadata), displayID: id})
}

func (r *recorder) ClearOutput(wait bool) {
	if wait {
		r.clearNext = true
		return
	}
	r.cell.Outputs = []*Output{}
}

// FromScript makes a notebook of a script: its text is split into cells at
// lines that start with "#--" (the rest of such a line, if any, becomes a
// Markdown heading cell before the code), so a long script reads as a report.
func FromScript(src string, nb *Notebook) {
	var code []string
	flush := func() {
		text := strings.Trim(strings.Join(code, "\n"), "\n")
		if text != "" {
			nb.AddCell("code", text)
		}
		code = code[:0]
	}
	for _, line := range strings.Split(src, "\n") {
		if rest, ok := strings.CutPrefix(line, "#--"); ok {
			flush()
			if md := strings.TrimSpace(rest); md != "" {
				nb.AddCell("markdown", "## "+md)
			}
			continue
		}
		code = append(code, line)
	}
	flush()
}
