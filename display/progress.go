package display

import (
	"fmt"
	"html"
	"math"
	"strings"
	"sync"
	"time"

	"github.com/google/uuid"
)

// Sink receives what a Progress reports. Display shows a bundle as a
// display_data output (update false) or replaces the output with that id in
// place (update true, an update_display_data message). Line gets the same
// state as one line of text for a terminal; final is true for the last
// line. A sink may ignore either form: the kernel publishes bundles, a
// console runner prints lines.
type Sink interface {
	Display(b Bundle, id string, update bool)
	Line(text string, final bool)
}

// DefaultInterval is the least time between two reports of a Progress:
// at most ten updates a second, enough to look live without flooding the
// front end.
const DefaultInterval = 100 * time.Millisecond

// Progress reports how far a long computation has come, updating one
// output in place. Create it with NewProgress, call Set or Add as work is
// done (safe from any goroutine), and end with Done or Interrupted. The
// first and the final report always go out; reports in between at most
// once per Interval (0 means DefaultInterval). Clock, when set before the
// first report, replaces time.Now (tests inject a fake clock). ID is the
// stable display_id of the output (a random UUID by default).
type Progress struct {
	Label    string
	Total    float64
	ID       string
	Interval time.Duration
	Clock    func() time.Time

	mu       sync.Mutex
	sink     Sink
	done     float64
	start    time.Time
	last     time.Time
	reported bool
	finished bool
	final    string
}

var _ Bundler = (*Progress)(nil)

// NewProgress returns a progress for a task of total units (steps, trials;
// total ≤ 0 means unknown) reporting to sink (nil reports nowhere).
func NewProgress(label string, total float64, sink Sink) *Progress {
	return &Progress{Label: label, Total: total, ID: uuid.NewString(), sink: sink}
}

func (p *Progress) now() time.Time {
	if p.Clock != nil {
		return p.Clock()
	}
	return time.Now()
}

// Start shows the progress at zero and starts the clock; Set and Add call
// it if it was not called.
func (p *Progress) Start() {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.startLocked()
}

func (p *Progress) startLocked() {
	if p.reported {
		return
	}
	p.start = p.now()
	p.emit(false)
}

// Set records that done units are complete and reports if the throttle
// allows. Values are clamped to [0, Total]; calls after Done are ignored.
func (p *Progress) Set(done float64) {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.finished || math.IsNaN(done) {
		return
	}
	p.startLocked()
	p.done = max(done, 0)
	if p.Total > 0 {
		p.done = min(p.done, p.Total)
	}
	iv := p.Interval
	if iv <= 0 {
		iv = DefaultInterval
	}
	if p.now().Sub(p.last) >= iv {
		p.emit(false)
	}
}

// Add records n more units done (see Set).
func (p *Progress) Add(n float64) {
	p.mu.Lock()
	d := p.done + n
	p.mu.Unlock()
	p.Set(d)
}

// Done reports the final state "done in 3.2 s"; it always goes out once.
func (p *Progress) Done() {
	p.finish(func(el time.Duration) string { return "done in " + formatDuration(el) })
}

// Interrupted reports the final state of a stopped task: "interrupted at
// 60% (6/10 done)", or "interrupted (5 done)" if Total is unknown. Whether
// the finished part is kept is the caller's to say: some work keeps it (a
// sweep shows its partial curve), some cannot (one long simulation).
func (p *Progress) Interrupted() {
	p.finish(func(time.Duration) string {
		if p.Total > 0 {
			return fmt.Sprintf("interrupted at %.0f%% (%s/%s done)", 100*p.done/p.Total, FormatNumber(p.done, 0), FormatNumber(p.Total, 0))
		}
		return fmt.Sprintf("interrupted (%s done)", FormatNumber(p.done, 0))
	})
}

func (p *Progress) finish(state func(time.Duration) string) {
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.finished {
		return
	}
	p.startLocked()
	p.finished = true
	p.final = state(p.now().Sub(p.start))
	p.emit(true)
}

// emit sends the current state to the sink; the first call displays, the
// later ones update in place.
func (p *Progress) emit(final bool) {
	update := p.reported
	p.reported = true
	p.last = p.now()
	if p.sink == nil {
		return
	}
	p.sink.Display(p.bundleLocked(), p.ID, update)
	p.sink.Line(p.textLocked(), final)
}

// Bundle returns the current state as a bundle (text/plain and text/html).
func (p *Progress) Bundle() (Bundle, error) {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.bundleLocked(), nil
}

// Text returns the current state as one line: "label  45% (450/1,000)
// 1.2 s, about 1.5 s left".
func (p *Progress) Text() string {
	p.mu.Lock()
	defer p.mu.Unlock()
	return p.textLocked()
}

func (p *Progress) bundleLocked() Bundle {
	return Bundle{Data: map[string]any{MIMEText: p.textLocked(), MIMEHTML: p.htmlLocked()}}
}

// fraction is the part done in [0, 1], or −1 if the total is unknown.
func (p *Progress) fraction() float64 {
	if p.Total <= 0 {
		return -1
	}
	return p.done / p.Total
}

func (p *Progress) textLocked() string {
	label := p.Label
	if label == "" {
		label = "working"
	}
	if p.finished {
		return label + ": " + p.final
	}
	el := p.now().Sub(p.start)
	f := p.fraction()
	if f < 0 {
		return fmt.Sprintf("%s: %s done, %s elapsed", label, FormatNumber(p.done, 0), formatDuration(el))
	}
	s := fmt.Sprintf("%s %s %3.0f%% (%s/%s), %s elapsed", label, bar(f, 20), 100*f,
		FormatNumber(p.done, 0), FormatNumber(p.Total, 0), formatDuration(el))
	if f > 0 && f < 1 {
		eta := time.Duration(float64(el) * (1 - f) / f)
		s += ", about " + formatDuration(eta) + " left"
	}
	return s
}

// bar draws a text bar of width cells: [######······].
func bar(f float64, width int) string {
	n := int(math.Round(f * float64(width)))
	return "[" + strings.Repeat("#", n) + strings.Repeat("·", width-n) + "]"
}

func (p *Progress) htmlLocked() string {
	f := p.fraction()
	if p.finished || f < 0 {
		return `<div class="loligo-progress" style="font-size:0.92em">` + html.EscapeString(p.textLocked()) + "</div>"
	}
	label := p.Label
	if label == "" {
		label = "working"
	}
	rest := strings.TrimPrefix(p.textLocked(), label+" "+bar(f, 20)+" ")
	return fmt.Sprintf(`<div class="loligo-progress" style="font-size:0.92em;display:flex;align-items:center;gap:0.6em">`+
		`<span>%s</span><span style="display:inline-block;width:12em;height:0.6em;border:1px solid rgba(128,128,128,0.6);border-radius:0.3em;overflow:hidden">`+
		`<span style="display:block;height:100%%;width:%.1f%%;background:%s"></span></span><span>%s</span></div>`,
		html.EscapeString(label), 100*f, hexColour(Palette[0]), html.EscapeString(rest))
}

// formatDuration shows a duration to about two significant digits:
// "0.35 s", "3.2 s", "42 s", "2 min 5 s", "1 h 3 min".
func formatDuration(d time.Duration) string {
	s := d.Seconds()
	switch {
	case s < 0.01:
		return "under 0.01 s" // below what a person can perceive anyway
	case s < 10:
		return FormatNumber(s, 2) + " s"
	case s < 60:
		return fmt.Sprintf("%.0f s", s)
	case s < 3600:
		return fmt.Sprintf("%d min %d s", int(s)/60, int(s)%60)
	}
	return fmt.Sprintf("%d h %d min", int(s)/3600, int(s)%3600/60)
}

// TerminalSink is a Sink for consoles: it ignores bundles and writes each
// line over the previous one with a carriage return, ending the final one
// with a newline. Write errors are ignored: progress is a courtesy.
type TerminalSink struct {
	W     interface{ Write([]byte) (int, error) }
	width int
}

var _ Sink = (*TerminalSink)(nil)

// Display implements Sink; a terminal shows no bundles.
func (t *TerminalSink) Display(Bundle, string, bool) {}

// Line implements Sink.
func (t *TerminalSink) Line(text string, final bool) {
	n := textWidth(text)
	pad := strings.Repeat(" ", max(t.width-n, 0)) // clear the rest of a longer previous line
	t.width = n
	end := ""
	if final {
		end, t.width = "\n", 0
	}
	fmt.Fprint(t.W, "\r"+text+pad+end)
}
