package main

import (
	"context"
	"fmt"
	"io"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/kernel"
	"github.com/loligo-lab/loligo/runtime"
)

// kernelSession makes a runtime session satisfy the kernel's Session
// interface: code in, MIME bundles out.
type kernelSession struct {
	s     *runtime.Session
	cells int
	// showEach shows every expression statement of a cell, not only the
	// last (scripts run as notebooks).
	showEach bool
	// progress, if set, receives progress as terminal lines instead of
	// in-place displays (notebooks run with no front end).
	progress io.Writer
}

var _ kernel.Session = (*kernelSession)(nil)

func newKernelSession() kernel.Session { return &kernelSession{s: newSession()} }

// Execute runs a cell. A value with several bundles (a table and a figure)
// shows all but the last as display outputs and the last as the result.
func (k *kernelSession) Execute(ctx context.Context, code string, out kernel.Output) (*kernel.Bundle, error) {
	k.cells++
	name := fmt.Sprintf("cell[%d]", k.cells)
	var rout runtime.Output = kernelOutput{out}
	if k.progress != nil {
		rout = lineOutput{kernelOutput{out}, k.progress}
	}
	if k.showEach {
		return nil, k.s.Run(ctx, name, code, rout)
	}
	res, err := k.s.Execute(ctx, name, code, rout)
	if err != nil {
		return nil, err
	}
	if res.Value == nil {
		return nil, nil
	}
	bs, err := runtime.Show(res.Value)
	if err != nil || len(bs) == 0 {
		return nil, err
	}
	for _, b := range bs[:len(bs)-1] {
		out.Display(toKernel(b), "", false)
	}
	last := toKernel(bs[len(bs)-1])
	return &last, nil
}

func (k *kernelSession) Complete(code string, cursor int) ([]string, int, int) {
	c := k.s.Complete(code, cursor)
	return c.Matches, c.Start, c.End
}

func (k *kernelSession) Inspect(code string, cursor int, detail int) (bool, *kernel.Bundle) {
	text, ok := k.s.Inspect(code, cursor)
	if !ok {
		return false, nil
	}
	b := toKernel(display.Text(text))
	return true, &b
}

func (k *kernelSession) IsComplete(code string) (string, string) { return k.s.IsComplete(code) }

func (k *kernelSession) Info() kernel.LanguageInfo {
	return kernel.LanguageInfo{
		Name: "loligo", Version: version, MIMEType: "text/x-loligo", FileExtension: ".loligo",
		Banner: "Loligo " + version + " — neural modelling with units on every number. help() lists the builtins. Research use only; not for clinical or diagnostic use.",
		HelpLinks: []kernel.HelpLink{
			{Text: "Loligo language tour", URL: "https://github.com/loligo-lab/loligo#a-short-tour-of-the-language"},
		},
	}
}

func toKernel(b display.Bundle) kernel.Bundle {
	return kernel.Bundle{Data: b.Data, Metadata: b.Metadata}
}

// kernelOutput passes a cell's outputs to the kernel as they happen.
type kernelOutput struct{ out kernel.Output }

func (o kernelOutput) Display(b display.Bundle, id string, update bool) {
	o.out.Display(toKernel(b), id, update)
}
func (o kernelOutput) Stream(name, text string) { o.out.Stream(name, text) }
func (o kernelOutput) ClearOutput(wait bool)    { o.out.ClearOutput(wait) }

// lineOutput is a kernelOutput whose progress goes to a terminal.
type lineOutput struct {
	kernelOutput
	w io.Writer
}

func (o lineOutput) ProgressLine(text string, final bool) { progressLine(o.w, text, final) }
