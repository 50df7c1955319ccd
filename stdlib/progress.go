package stdlib

import (
	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
)

// progressFor returns a progress report for a long builtin call (a sweep, a
// population, a long simulation): label names the task, total is the number
// of units of work (≤ 0 when unknown). In a notebook the report is one
// display_data output replaced in place by update_display_data messages
// with the same display id; on a terminal runner it is one line rewritten
// in place. End it with Done, or Interrupted when c.Ctx stopped the work.
func progressFor(c *runtime.Call, label string, total float64) *display.Progress {
	return display.NewProgress(label, total, callSink{c: c})
}

// callSink adapts a call's outputs to display.Sink. Each report goes out in
// the one form the output shows: a terminal gets lines (it would print every
// in-place update as a new output), a notebook gets bundles (a line on
// stderr would pile up under the cell).
type callSink struct{ c *runtime.Call }

var _ display.Sink = callSink{}

// Display implements display.Sink.
func (s callSink) Display(b display.Bundle, id string, update bool) {
	if s.c == nil || s.c.Terminal() {
		return
	}
	s.c.Display(b, id, update)
}

// Line implements display.Sink.
func (s callSink) Line(text string, final bool) {
	if s.c == nil || !s.c.Terminal() {
		return
	}
	s.c.ProgressLine(text, final)
}
