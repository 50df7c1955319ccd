package display

import (
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
)

// TestNiceTicks checks the labelled ticks against the "nice numbers" rule
// of P. S. Heckbert, "Nice numbers for graph labels", Graphics Gems (1990):
// the step is the raw spacing (range / (labels − 1)) rounded to 1, 2 or 5
// times a power of ten, and labels sit on whole multiples of it. The
// arithmetic of each case is in its comment.
func TestNiceTicks(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name    string
		lo, hi  float64
		target  int
		minStep float64
		want    []string
	}{
		{"raster from the first spike", 30.74, 480, 6, 0, []string{"100", "200", "300", "400"}},    // 449/5 = 90 → 100
		{"whole run", 0, 500, 6, 0, []string{"0", "100", "200", "300", "400", "500"}},              // 500/5 = 100
		{"membrane potential", -75, 43, 6, 0, []string{"−60", "−40", "−20", "0", "20", "40"}},      // 118/5 = 23.6 → 20
		{"short panel", -75, 43, 3, 0, []string{"−50", "0"}},                                       // 118/2 = 59 → 50
		{"small current", 0, 0.25, 6, 0, []string{"0.00", "0.05", "0.10", "0.15", "0.20", "0.25"}}, // 0.05
		{"neuron rows", -0.7, 2.7, 6, 1, []string{"0", "1", "2"}},                                  // 0.68 → 0.5, raised to 1
		{"many rows", -0.7, 99.7, 6, 1, []string{"0", "20", "40", "60", "80"}},                     // 20.1 → 20
	}
	for _, c := range cases {
		var got []string
		for _, tk := range (cleanTicks{niceTicks{target: c.target, minStep: c.minStep}}).Ticks(c.lo, c.hi) {
			if tk.Value < c.lo || tk.Value > c.hi {
				t.Errorf("%s: tick at %g outside [%g, %g]", c.name, tk.Value, c.lo, c.hi)
			}
			if c.minStep > 0 && tk.Value != math.Trunc(tk.Value) {
				t.Errorf("%s: tick at %g between two rows", c.name, tk.Value)
			}
			if tk.Label != "" {
				got = append(got, tk.Label)
			}
		}
		if !slices.Equal(got, c.want) {
			t.Errorf("%s: labels %q, want %q", c.name, got, c.want)
		}
	}
}

// TestTitleWraps checks that a title wider than the figure is broken at
// spaces into lines that fit, keeping every word, instead of running off
// both edges.
func TestTitleWraps(t *testing.T) {
	t.Parallel()
	title := "Leaky integrate-and-fire population: step 0.3 nA from 100 ms to 400 ms, 20 neurons with an invented spread of thresholds"
	width := vg.Points(DefaultWidth - 8)
	ts, lines := fitTitle(title, width)
	if len(lines) < 2 {
		t.Fatalf("title not wrapped: %q", lines)
	}
	for _, l := range lines {
		if w := ts.Width(l); w > width {
			t.Errorf("line %q is %v wide, more than %v", l, w, width)
		}
	}
	if strings.Join(lines, " ") != title {
		t.Errorf("wrapped lines %q lose words of %q", lines, title)
	}
	f := &Figure{Title: title, Panels: []Panel{{Series: []Series{{Kind: Line, X: []float64{0, 1}, Y: []float64{0, 1}}}}}}
	svg, err := f.SVG()
	if err != nil {
		t.Fatal(err)
	}
	texts := strings.Join(parseSVG(t, svg).texts, "\n")
	for _, l := range lines {
		if !strings.Contains(texts, l) {
			t.Errorf("title line %q missing from the SVG", l)
		}
	}
	if ts, lines := fitTitle("Short", width); len(lines) != 1 || ts.Font.Size != vg.Points(titleSize) {
		t.Errorf("a short title must stay on one line at full size, got %q at %v", lines, ts.Font.Size)
	}
}

// TestRasterPanel checks a raster over a whole run: XFrom and XTo give the
// x axis from 0 to the duration though the first spike comes at 30.74 ms,
// events outside are not drawn, the y axis is padded so that the outer
// rows of events (±0.4 of a row) keep clear of the axes, and its ticks sit
// on neuron indices.
func TestRasterPanel(t *testing.T) {
	t.Parallel()
	x := []float64{30.74, 120, 250, 480, 510}
	y := []float64{0, 1, 2, 3, 3}
	f := &Figure{Panels: []Panel{{XLabel: "time (ms)", YLabel: "neuron", XFrom: 0, XTo: 500,
		Series: []Series{{Kind: Raster, Name: "spikes", X: x, Y: y}}}}}
	st, err := f.stats()
	if err != nil {
		t.Fatal(err)
	}
	p := f.buildPlots(st)[0]
	if p.X.Min != 0 || p.X.Max != 500 {
		t.Errorf("x axis from %g to %g, want 0 to 500", p.X.Min, p.X.Max)
	}
	if p.Y.Min > -0.4-0.2 || p.Y.Max < 3.4+0.2 {
		t.Errorf("y axis from %g to %g leaves under 0.2 row between the outer events (−0.4, 3.4) and the axes", p.Y.Min, p.Y.Max)
	}
	for _, tk := range p.Y.Tick.Marker.Ticks(p.Y.Min, p.Y.Max) {
		if tk.Value != math.Trunc(tk.Value) || tk.Value < 0 || tk.Value > 3 {
			t.Errorf("y tick at %g is not a neuron index in 0…3", tk.Value)
		}
	}
	if !strings.Contains(f.Summary(), "x from 0 to 500") {
		t.Errorf("summary does not give the fixed x range: %s", f.Summary())
	}
	svg, err := f.SVG()
	if err != nil {
		t.Fatal(err)
	}
	info := parseSVG(t, svg)
	moves := -1
	for k, s := range info.styles {
		if strings.Contains(s, "stroke-width:0.9") && strings.Count(info.paths[k], "M") > moves {
			moves = strings.Count(info.paths[k], "M")
		}
	}
	if moves != 4 {
		t.Errorf("raster path has %d ticks, want 4 (the event at 510 ms lies past XTo)", moves)
	}
}
