package display

import (
	"strings"
	"sync"
	"testing"
	"time"
)

// fakeClock is a clock the test advances by hand.
type fakeClock struct{ t time.Time }

func (c *fakeClock) now() time.Time       { return c.t }
func (c *fakeClock) step(d time.Duration) { c.t = c.t.Add(d) }

// recordSink records what a Progress reports.
type recordSink struct {
	mu      sync.Mutex
	ids     []string
	updates []bool
	texts   []string
	lines   []string
	finals  []bool
}

func (s *recordSink) Display(b Bundle, id string, update bool) {
	s.mu.Lock()
	defer s.mu.Unlock()
	s.ids, s.updates, s.texts = append(s.ids, id), append(s.updates, update), append(s.texts, b.PlainText())
}

func (s *recordSink) Line(text string, final bool) {
	s.mu.Lock()
	defer s.mu.Unlock()
	s.lines, s.finals = append(s.lines, text), append(s.finals, final)
}

func newTestProgress(total float64) (*Progress, *recordSink, *fakeClock) {
	sink := &recordSink{}
	clk := &fakeClock{t: time.Date(2024, 1, 1, 0, 0, 0, 0, time.UTC)}
	p := NewProgress("sweep", total, sink)
	p.Clock = clk.now
	return p, sink, clk
}

// TestProgressThrottle: 1,000 steps 1 ms apart last 1 s; at most one
// report per 100 ms gives the first, ten in between and the final one.
func TestProgressThrottle(t *testing.T) {
	p, sink, clk := newTestProgress(1000)
	for i := 1; i <= 1000; i++ {
		clk.step(time.Millisecond)
		p.Set(float64(i))
	}
	p.Done()
	n := len(sink.ids)
	if n < 3 || n > 12 {
		t.Fatalf("%d reports for 1 s of work, want between 3 and 12", n)
	}
	if sink.updates[0] || !sink.updates[n-1] {
		t.Error("the first report must be a display and the later ones updates")
	}
	for _, id := range sink.ids {
		if id != sink.ids[0] || id == "" {
			t.Fatal("display id is not stable")
		}
	}
	if got := sink.texts[n-1]; got != "sweep: done in 1 s" {
		t.Errorf("final text %q", got)
	}
	if !sink.finals[n-1] || sink.finals[0] {
		t.Error("only the last line is final")
	}
}

func TestProgressStates(t *testing.T) {
	cases := []struct {
		name  string
		total float64
		run   func(p *Progress, clk *fakeClock)
		want  string
	}{
		{"done", 10, func(p *Progress, clk *fakeClock) { p.Start(); clk.step(3200 * time.Millisecond); p.Set(10); p.Done() }, "sweep: done in 3.2 s"},
		{"interrupted", 10, func(p *Progress, clk *fakeClock) { p.Set(6); p.Interrupted() }, "sweep: interrupted at 60% (6/10 done)"},
		{"unknown total", 0, func(p *Progress, clk *fakeClock) { p.Start(); clk.step(2 * time.Second); p.Set(5) }, "sweep: 5 done, 2 s elapsed"},
		{"eta", 100, func(p *Progress, clk *fakeClock) { p.Start(); clk.step(time.Second); p.Set(25) }, "sweep [#####···············]  25% (25/100), 1 s elapsed, about 3 s left"},
	}
	for _, c := range cases {
		p, sink, clk := newTestProgress(c.total)
		c.run(p, clk)
		if got := sink.texts[len(sink.texts)-1]; got != c.want {
			t.Errorf("%s: %q, want %q", c.name, got, c.want)
		}
	}
}

func TestTerminalSink(t *testing.T) {
	var b strings.Builder
	ts := &TerminalSink{W: &b}
	ts.Line("long line", false)
	ts.Line("short", false)
	ts.Line("end", true)
	if got := b.String(); got != "\rlong line\rshort    \rend  \n" {
		t.Errorf("terminal output %q", got)
	}
}
