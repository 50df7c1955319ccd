package stdlib

import (
	"context"
	"encoding/xml"
	"errors"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
)

// near reports whether got is within abs or rel·|want| of want: the one
// tolerance helper of this package's binding tests.
func near(got, want, abs, rel float64) bool {
	return math.Abs(got-want) <= max(abs, rel*math.Abs(want))
}

// record collects a session's outputs.
type record struct {
	shown   []shown
	streams []string
	lines   []string // terminal progress lines, when used as a terminal
}

type shown struct {
	b      display.Bundle
	id     string
	update bool
}

func (r *record) Display(b display.Bundle, id string, update bool) {
	r.shown = append(r.shown, shown{b, id, update})
}
func (r *record) Stream(name, text string) { r.streams = append(r.streams, name+": "+text) }

// terminal is a record that takes progress as lines, like `loligo run`.
type terminal struct{ record }

func (t *terminal) ProgressLine(text string, final bool) { t.lines = append(t.lines, text) }

// eval runs src in a fresh session with the registry given (nil = ours).
func eval(t *testing.T, reg *runtime.Registry, out runtime.Output, src string) (runtime.Value, error) {
	t.Helper()
	if reg == nil {
		reg = runtime.NewRegistry()
		Register(reg)
	}
	res, err := runtime.NewSession(reg).Execute(context.Background(), "test", src, out)
	if err != nil {
		return nil, err
	}
	return res.Value, nil
}

// svgSeries parses an SVG as XML and counts the palette colours in its
// path styles (each automatically coloured series has its own; display's
// SVG writes them as #RRGGBB, ±2 per channel for translucent fills) and
// collects its texts.
func svgSeries(t *testing.T, svg string) (int, []string) {
	t.Helper()
	d := xml.NewDecoder(strings.NewReader(svg))
	var styles, texts []string
	inText := false
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			inText = e.Name.Local == "text"
			for _, a := range e.Attr {
				if e.Name.Local == "path" && a.Name.Local == "style" {
					styles = append(styles, a.Value)
				}
			}
		case xml.CharData:
			if inText {
				texts = append(texts, string(e))
			}
		case xml.EndElement:
			inText = false
		}
	}
	hexRe := regexp.MustCompile(`#([0-9A-Fa-f]{2})([0-9A-Fa-f]{2})([0-9A-Fa-f]{2})`)
	n := 0
	for _, p := range display.Palette {
		found := false
		for _, st := range styles {
			for _, m := range hexRe.FindAllStringSubmatch(st, -1) {
				ok := true
				for k, want := range []uint8{p.R, p.G, p.B} {
					v, _ := strconv.ParseUint(m[k+1], 16, 8)
					ok = ok && near(float64(v), float64(want), 2, 0) // translucent fills are un-premultiplied with truncation
				}
				found = found || ok
			}
		}
		if found {
			n++
		}
	}
	return n, texts
}

func TestPlotSVG(t *testing.T) {
	const steps = `steps = read("../examples/data/l5-steps.csv")
`
	cases := []struct {
		name   string
		src    string
		series int      // distinct series colours expected in the SVG
		labels []string // texts that must appear
	}{
		// two dimensionless functions share one panel: two colours, a legend of both
		{"functions overlaid", `plot(exp, sqrt, over = span(0, 1, n = 50))`, 2, []string{"exp", "sqrt"}},
		// rate (with rate_se as its error bars) and trials against current: two panels,
		// colours run on across panels; axis labels carry the header units
		{"table", steps + `plot(steps)`, 2, []string{"current (pA)", "rate (Hz)", "trials"}},
		// two vectors of the same dimension overlay in one panel
		{"vectors", steps + `plot(steps.rate, steps.rate_se)`, 2, nil},
		// a histogram is one steps series
		{"histogram", `histogram([2, 3, 3, 5, 8] ms, bins = 3, name = "ISI")`, 1, []string{"ISI (ms)", "count"}},
		// two stacked panels of different dimension, one series each
		{"stacked", steps + `plot(steps.rate, steps.current)`, 2, []string{"y (Hz)", "y (pA)"}},
		// names given for the axes replace x and y and keep the units
		{"named points", steps + `plot(x = steps.current, y = steps.rate, x_name = "step", y_name = "firing")`, 1,
			[]string{"step (pA)", "firing (Hz)"}},
		{"named scatter", steps + `scatter(steps.current, steps.rate, x_name = "step", y_name = "firing")`, 1,
			[]string{"step (pA)", "firing (Hz)"}},
		{"named curve", `plot(curve([1, 2, 3], [4, 5, 6] Hz, x_name = "repeats", y_name = "firing"))`, 1,
			[]string{"repeats", "firing (Hz)"}},
	}
	for _, c := range cases {
		v, err := eval(t, nil, &record{}, c.src)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		bs, err := runtime.Show(v)
		if err != nil || len(bs) != 1 {
			t.Fatalf("%s: Show gave %d bundles, %v", c.name, len(bs), err)
		}
		if _, ok := bs[0].Data[display.MIMEHTML]; ok {
			t.Errorf("%s: a figure must not carry text/html (front ends would hide the SVG)", c.name)
		}
		svg, ok := bs[0].Data[display.MIMESVG].(string)
		if !ok {
			t.Fatalf("%s: no image/svg+xml string in %v", c.name, bs[0].Data)
		}
		n, texts := svgSeries(t, svg)
		if n != c.series {
			t.Errorf("%s: %d series colours in the SVG, want %d", c.name, n, c.series)
		}
		all := strings.Join(texts, "\n")
		for _, l := range c.labels {
			if !strings.Contains(all, l) {
				t.Errorf("%s: label %q not in the SVG texts %q", c.name, l, texts)
			}
		}
	}
}

// TestIndexHint checks that vectors of one length stacked against their
// index (probably meant as y against x) get a hint naming scatter, and that
// an overlay in one panel or points against x get none. The hint is our own
// wording; the check is only that it appears exactly when it should.
func TestIndexHint(t *testing.T) {
	const steps = `steps = read("../examples/data/l5-steps.csv")
`
	cases := []struct {
		name, src string
		hint      bool
	}{
		{"stacked of one length", `plot(steps.current, steps.rate)`, true},
		{"overlaid in one panel", `plot(steps.rate, steps.rate_se)`, false},
		{"points against x", `plot(x = steps.current, y = steps.rate)`, false},
		{"different lengths", `plot(steps.rate, [1, 2] pA)`, false},
	}
	for _, c := range cases {
		r := &record{}
		if _, err := eval(t, nil, r, steps+c.src); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		got := strings.Contains(strings.Join(r.streams, ""), "scatter(x, y)")
		if got != c.hint {
			t.Errorf("%s: hint shown %v, want %v (streams %q)", c.name, got, c.hint, r.streams)
		}
	}
}

func TestSaveFigure(t *testing.T) {
	dir := t.TempDir()
	for _, ext := range []string{".svg", ".png"} {
		path := filepath.Join(dir, "f"+ext)
		if _, err := eval(t, nil, &record{}, `save(plot(exp, over = span(0, 1, n = 20)), "`+path+`")`); err != nil {
			t.Fatalf("save %s: %v", ext, err)
		}
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		// file signatures: PNG (ISO/IEC 15948 §5.2) and SVG's root element (SVG 1.1 §5.1)
		if ext == ".png" && !strings.HasPrefix(string(data), "\x89PNG\r\n\x1a\n") {
			t.Errorf("saved PNG lacks the PNG signature")
		}
		if ext == ".svg" && !strings.Contains(string(data), "<svg") {
			t.Errorf("saved SVG has no svg element")
		}
	}
	// an error leaves nothing behind: unknown extension, missing folder
	bad := []struct{ path, msg string }{
		{filepath.Join(dir, "g.pdf"), "end the name in .svg or .png"},
		{filepath.Join(dir, "missing", "g.svg"), "does not exist"},
	}
	for _, b := range bad {
		_, err := eval(t, nil, &record{}, `save(plot(exp, over = span(0, 1, n = 20)), "`+b.path+`")`)
		if err == nil || !strings.Contains(err.Error(), b.msg) {
			t.Errorf("save %s: error %v, want one containing %q", b.path, err, b.msg)
		}
		if _, serr := os.Stat(b.path); !errors.Is(serr, os.ErrNotExist) {
			t.Errorf("save %s failed but left a file", b.path)
		}
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("the folder holds %d entries, want the 2 saved files (no temporary leftovers)", len(ents))
	}
}

// TestSaveKeepsTitle checks that plot() without title = keeps a trace's
// automatic title (model and stimulus), also in the saved file, and that an
// explicit title replaces it. The title is our own wording (stdlib/simulate.go),
// so the reference is the trace's figure itself, not an outside source.
func TestSaveKeepsTitle(t *testing.T) {
	dir := t.TempDir()
	const tr = `tr = simulate(lif(), step(300 pA, start = 10 ms, stop = 90 ms), duration = 100 ms)
`
	const auto = "Leaky integrate-and-fire: step 300 pA from 10 ms to 90 ms"
	cases := []struct{ name, call, want string }{
		{"automatic", `plot(tr)`, auto},
		{"two of the same", `plot(tr, tr)`, auto},
		{"explicit", `plot(tr, title = "mine")`, "mine"},
	}
	for i, c := range cases {
		path := filepath.Join(dir, strconv.Itoa(i)+".svg")
		if _, err := eval(t, nil, &record{}, tr+`save(`+c.call+`, "`+path+`")`); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		_, texts := svgSeries(t, string(data))
		if !slices.Contains(texts, c.want) {
			t.Errorf("%s: saved SVG texts %q lack the title %q", c.name, texts, c.want)
		}
	}
}

func TestHistogramRule(t *testing.T) {
	// numpy.histogram documentation (NumPy reference): equal bins over
	// [min, max], half-open but the last, which is closed.
	cases := []struct {
		xs     []float64
		bins   int
		counts []float64
	}{
		{[]float64{0, 1, 2, 3}, 3, []float64{1, 1, 2}},
		{[]float64{1, 2, 1}, 2, []float64{2, 1}},
		// 0.1·k sit on edges that are not exact in binary: each goes to the bin whose edge it reaches
		{[]float64{0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1}, 10, []float64{1, 1, 1, 1, 1, 1, 1, 1, 1, 2}},
		// non-finite values are skipped (common practice)
		{[]float64{math.NaN(), 5, math.Inf(1), 5}, 1, []float64{2}},
	}
	for _, c := range cases {
		_, got, _ := histogram(c.xs, c.bins)
		for i := range c.counts {
			if i >= len(got) || got[i] != c.counts[i] { // counts are whole numbers: exact
				t.Errorf("histogram(%v, %d) = %v, want %v", c.xs, c.bins, got, c.counts)
				break
			}
		}
	}
}

// BenchmarkReadPlotShow reads the invented trace, plots it and renders the SVG.
func BenchmarkReadPlotShow(b *testing.B) {
	reg := runtime.NewRegistry()
	Register(reg)
	s := runtime.NewSession(reg)
	for b.Loop() {
		res, err := s.Execute(context.Background(), "bench", `plot(read("../examples/data/trace.csv"))`, &record{})
		if err != nil {
			b.Fatal(err)
		}
		if _, err := runtime.Show(res.Value); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkHistogram bins 100,000 values into 30 bins.
func BenchmarkHistogram(b *testing.B) {
	xs := make([]float64, 100000)
	for i := range xs {
		xs[i] = math.Sin(float64(i))
	}
	for b.Loop() {
		histogram(xs, 30)
	}
}
