package stdlib

import (
	"context"
	"errors"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
)

// collect keeps the outputs of a cell; onUpdate runs at each in-place
// update (a progress report after some work is done).
type collect struct {
	bundles  []display.Bundle
	onUpdate func()
}

func (c *collect) Display(b display.Bundle, id string, update bool) {
	if !update {
		c.bundles = append(c.bundles, b)
	} else if c.onUpdate != nil {
		c.onUpdate()
	}
}
func (c *collect) Stream(string, string) {}

// TestInterruptedSweepShowsPartialCurve: an interrupt stops the cell (it
// binds nothing and ends as Interrupted) but the amplitudes finished are
// shown, as the language promises for long work.
func TestInterruptedSweepShowsPartialCurve(t *testing.T) {
	s := newTestSession()
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	// Interrupt at the first progress report after some amplitudes are done
	// (reports come after finished amplitudes), whatever the machine's speed.
	out := &collect{onUpdate: cancel}
	_, err := s.Execute(ctx, "cell", "fi = sweep(hh(), amplitude = span(0, 20, by = 0.5) uA/cm^2, duration = 2000 ms)", out)
	var re *runtime.Error
	if !errors.As(err, &re) || re.Kind != runtime.KindInterrupted || !strings.Contains(re.Msg, "amplitudes finished") {
		t.Fatalf("got %v, want an Interrupted error that counts the amplitudes finished", err)
	}
	if _, ok := s.Lookup("fi"); ok {
		t.Error("an interrupted cell bound fi")
	}
	svg := 0
	for _, b := range out.bundles {
		if _, ok := b.Data[display.MIMESVG]; ok {
			svg++
		}
	}
	if svg == 0 {
		t.Error("the partial curve was not shown")
	}
}

// TestLongSimulationShowsProgress: a simulation of millions of steps shows
// a progress output and updates it in place (issue: long work is visible).
func TestLongSimulationShowsProgress(t *testing.T) {
	s := newTestSession()
	updates := 0
	out := &collect{onUpdate: func() { updates++ }}
	if _, err := s.Execute(context.Background(), "cell", "simulate(lif(), step(0.3 nA), duration = 30 s, dt = 0.01 ms, every = 1000)", out); err != nil {
		t.Fatal(err)
	}
	if len(out.bundles) == 0 || updates == 0 {
		t.Errorf("progress shown %d times and updated %d times, want both", len(out.bundles), updates)
	}
}
