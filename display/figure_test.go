package display

import (
	"bytes"
	"encoding/xml"
	"image/color"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

// demoTrace is an invented membrane trace: n samples at 0.01 ms, a slow
// wave, seeded noise and a spike every 97 ms.
func demoTrace(n int) (t, v []float64) {
	rng := rand.New(rand.NewPCG(1, 2))
	t, v = make([]float64, n), make([]float64, n)
	for i := range n {
		t[i] = float64(i) * 0.01
		v[i] = -65 + 8*math.Sin(t[i]/15) + 0.5*rng.NormFloat64() + 100*math.Exp(-3*math.Mod(t[i], 97))
	}
	return t, v
}

// svgInfo is what a test reads back from an SVG with encoding/xml.
type svgInfo struct {
	texts  []string
	styles []string
	paths  []string
}

func parseSVG(t *testing.T, svg string) svgInfo {
	t.Helper()
	var info svgInfo
	d := xml.NewDecoder(strings.NewReader(svg))
	var inText bool
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
			if e.Name.Local == "path" {
				for _, a := range e.Attr {
					switch a.Name.Local {
					case "style":
						info.styles = append(info.styles, a.Value)
					case "d":
						info.paths = append(info.paths, a.Value)
					}
				}
			}
		case xml.CharData:
			if inText {
				info.texts = append(info.texts, string(e))
			}
		case xml.EndElement:
			inText = false
		}
	}
	return info
}

// seriesColours counts the palette colours that appear in path styles:
// each automatically coloured series has its own. A channel may be off by
// up to 2 because the SVG back end un-premultiplies a translucent fill
// (a band) with integer truncation.
func (s svgInfo) seriesColours() int {
	hexRe := regexp.MustCompile(`#([0-9A-F]{2})([0-9A-F]{2})([0-9A-F]{2})`)
	var seen []color.NRGBA
	for _, st := range s.styles {
		for _, m := range hexRe.FindAllStringSubmatch(st, -1) {
			var c [3]uint8
			for k := range 3 {
				v, _ := strconv.ParseUint(m[k+1], 16, 8)
				c[k] = uint8(v)
			}
			seen = append(seen, color.NRGBA{c[0], c[1], c[2], 0xFF})
		}
	}
	n := 0
	for _, p := range Palette {
		for _, c := range seen {
			if absDiff(c.R, p.R) <= 2 && absDiff(c.G, p.G) <= 2 && absDiff(c.B, p.B) <= 2 {
				n++
				break
			}
		}
	}
	return n
}

func absDiff(a, b uint8) int { return max(int(a)-int(b), int(b)-int(a)) }

func TestFigureSVG(t *testing.T) {
	tm, v := demoTrace(20001)
	cases := []struct {
		name   string
		fig    *Figure
		series int
		labels []string
	}{
		{"one line", &Figure{Panels: []Panel{{XLabel: "time (ms)", YLabel: "V (mV)", Series: []Series{{Kind: Line, X: tm, Y: v}}}}}, 1, []string{"time (ms)", "V (mV)"}},
		{"mixed kinds", &Figure{Title: "Invented", Panels: []Panel{{XLabel: "I (nA)", YLabel: "rate (Hz)", Series: []Series{
			{Kind: Points, Name: "trials", X: []float64{1, 2, 3}, Y: []float64{4, 9, 15}, YErr: []float64{1, 1, 2}},
			{Kind: Steps, Name: "PSTH", X: []float64{0, 1, 2, 3, 4}, Y: []float64{1, 3, 2, 5}},
			{Kind: Band, Name: "95% band", X: []float64{0, 2, 4}, Lo: []float64{0, 1, 2}, Hi: []float64{2, 4, 6}},
			{Kind: VLine, Name: "rheobase", Level: 0.5},
		}}}}, 3, []string{"I (nA)", "rate (Hz)", "Invented", "trials", "PSTH", "rheobase"}},
		{"stacked", &Figure{SharedX: true, Panels: []Panel{
			{YLabel: "V (mV)", Series: []Series{{Kind: Line, X: tm, Y: v}}},
			{XLabel: "time (ms)", YLabel: "neuron", Height: 0.4, Series: []Series{{Kind: Raster, X: []float64{1, 50, 120}, Y: []float64{0, 1, 2}}}},
		}}, 2, []string{"time (ms)", "V (mV)", "neuron"}},
		{"log axes", &Figure{Panels: []Panel{{XLabel: "f (Hz)", YLabel: "power", LogX: true, LogY: true, Series: []Series{
			{Kind: Line, X: []float64{0, 1, 10, 100}, Y: []float64{5, 1, 0.1, 0.01}}}}}}, 1, []string{"f (Hz)", "power"}},
	}
	for _, c := range cases {
		svg, err := c.fig.SVG()
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		info := parseSVG(t, svg)
		if got := info.seriesColours(); got != c.series {
			t.Errorf("%s: %d series colours in SVG, want %d", c.name, got, c.series)
		}
		all := strings.Join(info.texts, "\n")
		for _, l := range c.labels {
			if !strings.Contains(all, l) {
				t.Errorf("%s: text %q missing from SVG", c.name, l)
			}
		}
		again, _ := c.fig.SVG()
		if again != svg {
			t.Errorf("%s: two renderings differ; output must be deterministic", c.name)
		}
	}
}

func TestFigureBundle(t *testing.T) {
	tm, v := demoTrace(1001)
	f := &Figure{Panels: []Panel{{XLabel: "time (ms)", YLabel: "V (mV)", Series: []Series{{Kind: Line, X: tm, Y: v}}}}}
	b, err := f.Bundle()
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := b.Data[MIMEHTML]; ok {
		t.Error("a figure's bundle must have no text/html entry")
	}
	md := b.Metadata[MIMESVG].(map[string]any)
	if md["width"] != float64(DefaultWidth) || md["height"] != float64(320) {
		t.Errorf("metadata %v, want width 560 and height 320", md)
	}
	if !strings.HasPrefix(b.PlainText(), "Figure: V (mV) vs time (ms), 1 line (1,001 points, min ") {
		t.Errorf("text/plain is %q", b.PlainText())
	}
}

// TestFigureSummaryGolden pins the plain-text description of a figure with
// gaps, several kinds and two panels.
func TestFigureSummaryGolden(t *testing.T) {
	tm, v := demoTrace(100001)
	v[10], v[20] = math.NaN(), math.Inf(1)
	stim := make([]float64, len(tm))
	for i := range stim {
		if tm[i] >= 100 && tm[i] < 600 {
			stim[i] = 0.25
		}
	}
	f := &Figure{Title: "Invented demo cell", SharedX: true, Panels: []Panel{
		{YLabel: "V (mV)", Series: []Series{{Kind: Line, Name: "V", X: tm, Y: v}, {Kind: HLine, Name: "threshold", Level: -50}}},
		{XLabel: "time (ms)", YLabel: "I (nA)", Height: 0.35, Series: []Series{{Kind: Line, X: tm, Y: stim}}},
	}}
	golden(t, "figure_summary.txt.golden", f.Summary()+"\n")
	fam := &Figure{Panels: []Panel{{XLabel: "I (nA)", YLabel: "rate (Hz)", Series: []Series{
		{Kind: Family, Name: "f–I", X: []float64{0, 1, 2}, Curves: [][]float64{{0, 1, 2}, {0, 2, 4}, {0, 3, 6}}}}}}}
	golden(t, "figure_family.txt.golden", fam.Summary()+"\n")
}

func TestFigureErrors(t *testing.T) {
	nan := []float64{math.NaN(), math.NaN(), math.Inf(1)}
	cases := []struct {
		name string
		fig  *Figure
		want string
	}{
		{"nil", nil, "figure is nil"},
		{"no panels", &Figure{}, "has no panels"},
		{"no series", &Figure{Panels: []Panel{{}}}, "panel 1 has no series"},
		{"empty trace", &Figure{Panels: []Panel{{Series: []Series{{Kind: Line}}}}}, "the line is empty"},
		{"ragged", &Figure{Panels: []Panel{{Series: []Series{{Kind: Line, Name: "V", X: []float64{1, 2}, Y: []float64{1}}}}}}, `series 1 ("V"): X has 2 values but Y has 1`},
		{"all NaN", &Figure{Panels: []Panel{{Series: []Series{{Kind: Line, X: []float64{1, 2, 3}, Y: nan}}}}}, "all 3 values are NaN or infinite"},
		{"log of negatives", &Figure{Panels: []Panel{{LogY: true, Series: []Series{{Kind: Line, X: []float64{1, 2}, Y: []float64{-1, 0}}}}}}, "not positive on a log axis"},
		{"only references", &Figure{Panels: []Panel{{Series: []Series{{Kind: HLine, Level: 1}}}}}, "only reference lines"},
		{"bad level", &Figure{Panels: []Panel{{Series: []Series{{Kind: Line, X: []float64{1}, Y: []float64{1}}, {Kind: VLine, Level: math.NaN()}}}}}, "reference line level"},
		{"bad kind", &Figure{Panels: []Panel{{Series: []Series{{Kind: 99}}}}}, "unknown series kind 99"},
		{"steps shape", &Figure{Panels: []Panel{{Series: []Series{{Kind: Steps, X: []float64{1, 2, 3, 4}, Y: []float64{1, 2}}}}}}, "bin edges"},
	}
	for _, c := range cases {
		_, err := c.fig.Bundle()
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "display: ") {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
		if s := c.fig.Summary(); s == "" {
			t.Errorf("%s: empty summary", c.name)
		}
	}
}

func TestFigureSave(t *testing.T) {
	dir := t.TempDir()
	good := &Figure{Panels: []Panel{{Series: []Series{{Kind: Line, X: []float64{0, 1}, Y: []float64{0, 1}}}}}}
	bad := &Figure{Panels: []Panel{{}}}
	for _, name := range []string{"a.svg", "a.png"} {
		if err := good.Save(filepath.Join(dir, name)); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
	b, _ := os.ReadFile(filepath.Join(dir, "a.png"))
	if !bytes.HasPrefix(b, []byte("\x89PNG\r\n\x1a\n")) { // PNG signature, ISO/IEC 15948 §5.2
		t.Error("a.png does not start with the PNG signature")
	}
	empty := t.TempDir()
	for _, p := range []string{filepath.Join(empty, "x.svg"), filepath.Join(empty, "x.png")} {
		if err := bad.Save(p); err == nil {
			t.Errorf("saving an invalid figure to %s succeeded", p)
		}
	}
	noFiles(t, empty) // a failed render leaves no file, not even a temporary one
	if err := good.Save(filepath.Join(dir, "missing", "x.svg")); err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Errorf("missing folder: %v", err)
	}
	if err := good.Save(filepath.Join(dir, "x.pdf")); err == nil || !strings.Contains(err.Error(), "use .svg or .png") {
		t.Errorf("unknown extension: %v", err)
	}
}

// TestMillionSampleTrace renders a 1 M-sample trace and checks the SVG
// stays small and that, at the figure's own resolution, every column of
// the drawn line reaches exactly the lowest and highest sample of the full
// data in that column (so no extremum is lost).
func TestMillionSampleTrace(t *testing.T) {
	if testing.Short() {
		t.Skip("renders a million samples")
	}
	tm, v := demoTrace(1_000_000)
	v[123456] = math.NaN() // one gap
	f := &Figure{Panels: []Panel{{XLabel: "time (ms)", YLabel: "V (mV)", Series: []Series{{Kind: Line, X: tm, Y: v}}}}}
	svg, err := f.SVG()
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("1 M-sample trace: SVG of %d bytes", len(svg))
	if len(svg) > 200_000 {
		t.Errorf("SVG is %d bytes, want at most 200 KB", len(svg))
	}
	// Rebuild the data canvas the renderer used.
	st, _ := f.stats()
	plots := f.buildPlots(st)
	wd, ht := f.size()
	dc := draw.NewCanvas(vgsvg.New(vg.Points(wd), vg.Points(ht)), vg.Points(wd), vg.Points(ht))
	c := plots[0].DataCanvas(f.layout(dc, plots, false)[0])
	trX, _ := plots[0].Transforms(&c)
	col := func(x float64) int { return int(math.Floor(float64((trX(x) - c.Min.X) / columnWidth))) }
	idx := decimateOnCanvas(c, trX, tm, v)

	type ext struct{ lo, hi float64 }
	extremes := func(keep func(i int) bool, each func(func(i int))) map[int]ext {
		m := map[int]ext{}
		each(func(i int) {
			if !keep(i) {
				return
			}
			k, y := col(tm[i]), v[i]
			e, ok := m[k]
			if !ok {
				e = ext{y, y}
			}
			m[k] = ext{math.Min(e.lo, y), math.Max(e.hi, y)}
		})
		return m
	}
	finite := func(i int) bool { return !math.IsNaN(v[i]) }
	full := extremes(finite, func(g func(int)) {
		for i := range tm {
			g(i)
		}
	})
	kept := extremes(func(i int) bool { return i >= 0 && finite(i) }, func(g func(int)) {
		for _, i := range idx {
			g(i)
		}
	})
	if len(full) != len(kept) {
		t.Fatalf("decimated line covers %d columns, full data %d", len(kept), len(full))
	}
	for k, e := range full {
		if kept[k] != e {
			t.Errorf("column %d: decimated extremes %v, full data %v", k, kept[k], e)
		}
	}
	// The SVG path of the trace has one vertex per kept sample.
	info := parseSVG(t, svg)
	hex := hexColour(Palette[0])
	for i, s := range info.styles {
		if strings.Contains(s, "stroke:"+hex) {
			got := len(regexp.MustCompile(`[ML]`).FindAllString(info.paths[i], -1))
			want := len(idx)
			for _, k := range idx {
				if k == Break {
					want--
				}
			}
			if got != want || got > 4*len(full) {
				t.Errorf("trace path has %d vertices, want %d (≤ 4 per column)", got, want)
			}
		}
	}
}
