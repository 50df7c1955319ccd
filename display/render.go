package display

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// panelGap is the vertical space between stacked panels, in points.
const panelGap = vg.Length(6)

// textStyle is the style of all figure text at a size.
func textStyle(size float64, bold bool) text.Style {
	return text.Style{Color: Ink, Font: textFont(size, bold), Handler: plot.DefaultTextHandler}
}

// styleAxis gives an axis our look.
func styleAxis(a *plot.Axis, label string, log bool) {
	a.Label.Text = label
	// Keep gonum's alignment and rotation of each text; set colour and font.
	a.Label.TextStyle.Color, a.Label.TextStyle.Font = Ink, textFont(labelSize, false)
	a.LineStyle = draw.LineStyle{Color: Ink, Width: vg.Points(axisWidth)}
	a.Tick.LineStyle = draw.LineStyle{Color: Ink, Width: vg.Points(axisWidth)}
	a.Tick.Label.Color, a.Tick.Label.Font = Ink, textFont(tickFontSize, false)
	a.Padding = vg.Points(3)
	a.Tick.Marker = cleanTicks{niceTicks{}}
	if log {
		a.Scale = plot.LogScale{}
		a.Tick.Marker = plot.LogTicks{Prec: -1}
	}
}

// buildPlots turns the figure's panels into gonum plots with their ranges
// set; st comes from f.stats.
func (f *Figure) buildPlots(st [][]seriesStats) []*plot.Plot {
	plots := make([]*plot.Plot, len(f.Panels))
	w, h := f.size()
	total := 0.0
	for _, pn := range f.Panels {
		total += pn.weight()
	}
	auto := 0 // colours run on across panels: a stimulus beneath a trace gets its own
	for i, pn := range f.Panels {
		p := plot.New()
		p.BackgroundColor = nil // transparent: the page shows through
		styleAxis(&p.X, pn.XLabel, pn.LogX)
		styleAxis(&p.Y, pn.YLabel, pn.LogY)
		if !pn.LogX {
			p.X.Tick.Marker = ticksFor(w-80, 0) // less the y axis and margins
		}
		if !pn.LogY {
			p.Y.Tick.Marker = ticksFor((h-80)*pn.weight()/total, 0) // less title and x axis
		}
		_, _, y0, y1 := panelRange(st[i])
		x0, x1 := f.xSpan(i, st)
		if f.SharedX && i < len(f.Panels)-1 {
			p.X.Label.Text = ""
			p.X.Tick.Marker = blankTicks{p.X.Tick.Marker}
		}
		if pn.rasterOnly() && !pn.LogY {
			// Whole rows of neurons: ticks on indices only, and 0.7 of a
			// row more at each end, so that the outer rows of events (which
			// reach ±0.4 of their index) keep clear of the axes, and no
			// tick is labelled with an index past the last row.
			p.Y.Tick.Marker = ticksFor((h-80)*pn.weight()/total, 1)
			y0, y1 = y0-0.7, y1+0.7
		} else if !pn.LogY {
			m := 0.04 * (y1 - y0) // keep peaks off the frame
			y0, y1 = y0-m, y1+m
		}
		p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = x0, x1, y0, y1
		auto = f.addSeries(p, pn, auto)
		p.Legend.Left = legendLeft(pn, x0, x1, y0, y1)
		plots[i] = p
	}
	return plots
}

// xSpan is the x range of panel i: its XFrom to XTo when set, else that
// of its data; under SharedX the union of every panel's range.
func (f *Figure) xSpan(i int, st [][]seriesStats) (x0, x1 float64) {
	if !f.SharedX {
		return f.Panels[i].xSpan(st[i])
	}
	x0, x1 = math.Inf(1), math.Inf(-1)
	for k, pn := range f.Panels {
		a, b := pn.xSpan(st[k])
		x0, x1 = math.Min(x0, a), math.Max(x1, b)
	}
	return x0, x1
}

// xSpan is the panel's own x range (see Panel.XFrom).
func (p Panel) xSpan(st []seriesStats) (x0, x1 float64) {
	if p.fixedX() {
		return p.XFrom, p.XTo
	}
	x0, x1, _, _ = panelRange(st)
	return x0, x1
}

// fixedX reports whether XFrom and XTo set the panel's x range.
func (p Panel) fixedX() bool {
	return usable(p.XFrom, p.LogX) && usable(p.XTo, p.LogX) && p.XFrom < p.XTo
}

// rasterOnly reports whether every data series of the panel is a raster,
// so that its y axis counts neurons.
func (p Panel) rasterOnly() bool {
	n := 0
	for _, s := range p.Series {
		switch s.Kind {
		case Raster:
			n++
		case HLine, VLine:
		default:
			return false
		}
	}
	return n > 0
}

// addSeries adds the panel's series in order, with colours and a legend;
// auto is the number of automatic colours used so far, and the new count
// is returned.
func (f *Figure) addSeries(p *plot.Plot, pn Panel, auto int) int {
	p.Legend.TextStyle = textStyle(tickFontSize, false)
	p.Legend.Top = true
	p.Legend.ThumbnailWidth = vg.Points(18)
	named := false
	for _, s := range pn.Series {
		sp := &seriesPlot{s: s, logX: pn.LogX, logY: pn.LogY}
		switch {
		case s.Colour > 0:
			sp.colour = Palette[(s.Colour-1)%len(Palette)]
		case s.Kind == HLine || s.Kind == VLine:
			sp.colour = Ink
		case s.Kind != Family:
			sp.colour, sp.dash = seriesColour(auto)
			auto++
		}
		p.Add(sp)
		if s.Name != "" {
			named = true
			p.Legend.Add(s.Name, sp)
		}
	}
	if !named || len(pn.Series) < 2 || pn.NoLegend {
		p.Legend = plot.NewLegend() // an empty legend draws nothing
	}
	return auto
}

// legendLeft says whether the legend should sit top left rather than top
// right: where fewer data points lie in the top quarter of the panel on
// that side (an f–I curve rises to the right, so its legend goes left).
func legendLeft(pn Panel, x0, x1, y0, y1 float64) bool {
	xm, yq := (x0+x1)/2, y0+0.6*(y1-y0)
	left, right := 0, 0
	for _, s := range pn.Series {
		n := len(s.X)
		if len(s.Y) < n {
			n = len(s.Y)
		}
		step := max(1, n/2000) // a sample is enough for long lines
		for i := 0; i < n; i += step {
			if s.Y[i] < yq || math.IsNaN(s.X[i]) {
				continue
			}
			if s.X[i] < xm {
				left++
			} else {
				right++
			}
		}
	}
	return left < right
}

// draw renders the figure on a canvas of the figure's size.
func (f *Figure) draw(cv vg.Canvas, w, h float64, plots []*plot.Plot) {
	dc := draw.NewCanvas(cv, vg.Points(w), vg.Points(h))
	for i, c := range f.layout(dc, plots, true) {
		plots[i].Draw(c)
	}
}

// layout returns each panel's canvas, drawing the title when asked.
func (f *Figure) layout(dc draw.Canvas, plots []*plot.Plot, drawTitle bool) []draw.Canvas {
	area := draw.Crop(dc, vg.Points(4), -vg.Points(8), vg.Points(4), -vg.Points(6))
	if f.Title != "" {
		ts, lines := fitTitle(f.Title, area.Max.X-area.Min.X)
		for _, l := range lines {
			if drawTitle {
				dc.FillText(ts, vg.Point{X: area.Center().X, Y: area.Max.Y}, l)
			}
			area.Max.Y -= ts.Rectangle(l).Size().Y
		}
		area.Max.Y -= vg.Points(6)
	}
	return f.panelCanvases(area, plots)
}

// fitTitle breaks a title into lines no wider than width, at spaces, and
// returns them with their style: a long title wraps rather than running
// off both edges; a word too long for a line makes the font smaller, down
// to minTitleSize, below which the line is left to overflow.
func fitTitle(title string, width vg.Length) (text.Style, []string) {
	const minTitleSize = 8
	for size := float64(titleSize); ; size-- {
		ts := textStyle(size, true)
		ts.XAlign, ts.YAlign = draw.XCenter, draw.YTop
		lines := wrapWords(title, func(s string) bool { return ts.Width(s) <= width })
		fits := true
		for _, l := range lines {
			fits = fits && ts.Width(l) <= width
		}
		if fits || size <= minTitleSize {
			return ts, lines
		}
	}
}

// wrapWords splits s at spaces into lines, each as long as fits allows
// (a single word that does not fit gets a line of its own).
func wrapWords(s string, fits func(string) bool) []string {
	var lines []string
	cur := ""
	for _, w := range strings.Fields(s) {
		switch {
		case cur == "":
			cur = w
		case fits(cur + " " + w):
			cur += " " + w
		default:
			lines = append(lines, cur)
			cur = w
		}
	}
	return append(lines, cur)
}

// panelCanvases slices area into one canvas per panel, by panel height,
// and crops them so that all data areas share their left and right edges.
func (f *Figure) panelCanvases(area draw.Canvas, plots []*plot.Plot) []draw.Canvas {
	total := 0.0
	for _, pn := range f.Panels {
		total += pn.weight()
	}
	avail := area.Max.Y - area.Min.Y - panelGap*vg.Length(len(plots)-1)
	cs := make([]draw.Canvas, len(plots))
	top := area.Max.Y
	for i, pn := range f.Panels {
		hgt := avail * vg.Length(pn.weight()/total)
		cs[i] = draw.Canvas{Canvas: area.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: area.Min.X, Y: top - hgt}, Max: vg.Point{X: area.Max.X, Y: top}}}
		top -= hgt + panelGap
	}
	var left, right vg.Length
	for i, p := range plots {
		d := p.DataCanvas(cs[i])
		left = max(left, d.Min.X-cs[i].Min.X)
		right = max(right, cs[i].Max.X-d.Max.X)
	}
	for i, p := range plots {
		d := p.DataCanvas(cs[i])
		cs[i] = draw.Crop(cs[i], left-(d.Min.X-cs[i].Min.X), -(right - (cs[i].Max.X - d.Max.X)), 0, 0)
	}
	return cs
}

// WriteSVG renders the figure as SVG to w. The output depends only on the
// figure (fonts are the ones bundled with gonum/plot and not embedded), so
// the same figure gives the same bytes.
func (f *Figure) WriteSVG(w io.Writer) error {
	st, err := f.stats()
	if err != nil {
		return err
	}
	wd, ht := f.size()
	cv := vgsvg.New(vg.Points(wd), vg.Points(ht))
	f.draw(cv, wd, ht, f.buildPlots(st))
	var buf bytes.Buffer
	if _, err := cv.WriteTo(&buf); err != nil {
		return fmt.Errorf("display: rendering SVG: %v", err)
	}
	_, err = w.Write(cleanSVG(buf.Bytes()))
	return err
}

// cleanSVG replaces the back end's banner comment with our own line.
func cleanSVG(b []byte) []byte {
	start := bytes.Index(b, []byte("<!--"))
	end := bytes.Index(b, []byte("-->"))
	if start < 0 || end < start || start > 64 {
		return b
	}
	return append(append(append([]byte{}, b[:start]...), "<!-- Loligo figure -->"...), b[end+3:]...)
}

// SVG returns the figure as an SVG document.
func (f *Figure) SVG() (string, error) {
	var b strings.Builder
	if err := f.WriteSVG(&b); err != nil {
		return "", err
	}
	return b.String(), nil
}

// PNGDPI is the resolution of PNG output: 144 dots per inch, twice the
// nominal size, sharp on high-density screens.
const PNGDPI = 144

// WritePNG renders the figure as a PNG image with a transparent background
// at PNGDPI to w.
func (f *Figure) WritePNG(w io.Writer) error {
	st, err := f.stats()
	if err != nil {
		return err
	}
	wd, ht := f.size()
	cv := vgimg.NewWith(vgimg.UseWH(vg.Points(wd), vg.Points(ht)), vgimg.UseDPI(PNGDPI), vgimg.UseBackgroundColor(transparent))
	f.draw(cv, wd, ht, f.buildPlots(st))
	if _, err := (vgimg.PngCanvas{Canvas: cv}).WriteTo(w); err != nil {
		return fmt.Errorf("display: rendering PNG: %v", err)
	}
	return nil
}

// SaveSVG writes the figure as SVG at path, atomically (temporary file in
// the same folder, then rename). The folder must exist and be writable.
func (f *Figure) SaveSVG(path string) error { return writeFileAtomic(path, f.WriteSVG) }

// SavePNG writes the figure as PNG at path, atomically.
func (f *Figure) SavePNG(path string) error { return writeFileAtomic(path, f.WritePNG) }

// Save writes the figure in the format its extension names: .svg or .png.
func (f *Figure) Save(path string) error {
	switch strings.ToLower(filepath.Ext(path)) {
	case ".svg":
		return f.SaveSVG(path)
	case ".png":
		return f.SavePNG(path)
	}
	return fmt.Errorf("display: cannot save a figure as %q: unknown extension %q; use .svg or .png", path, filepath.Ext(path))
}

// Bundle returns the figure's output: image/svg+xml, a text/plain
// description (see Summary) and metadata giving the SVG's display width
// and height in points. It has no text/html entry.
func (f *Figure) Bundle() (Bundle, error) {
	svg, err := f.SVG()
	if err != nil {
		return Bundle{}, err
	}
	w, h := f.size()
	return Bundle{
		Data:     map[string]any{MIMESVG: svg, MIMEText: f.Summary()},
		Metadata: map[string]any{MIMESVG: map[string]any{"width": w, "height": h}},
	}, nil
}
