package display

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// columnWidth is the width of one decimation column: half a point, so that
// a figure shown at twice its nominal size (high-density screens) still
// has one column per device pixel.
const columnWidth = vg.Length(0.5)

// seriesPlot draws one Series on a panel; it implements plot.Plotter and
// plot.Thumbnailer.
type seriesPlot struct {
	s          Series
	colour     color.NRGBA
	dash       []vg.Length
	logX, logY bool
}

var (
	_ plot.Plotter     = (*seriesPlot)(nil)
	_ plot.Thumbnailer = (*seriesPlot)(nil)
)

func (sp *seriesPlot) lineStyle(width float64) draw.LineStyle {
	return draw.LineStyle{Color: sp.colour, Width: vg.Points(width), Dashes: sp.dash}
}

// Plot implements plot.Plotter.
func (sp *seriesPlot) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	switch sp.s.Kind {
	case Line:
		sp.strokeLine(c, trX, trY, sp.s.X, sp.s.Y, sp.colour)
	case Family:
		n := len(sp.s.Curves)
		for k, ys := range sp.s.Curves {
			f := 0.0
			if n > 1 {
				f = float64(k) / float64(n-1)
			}
			sp.strokeLine(c, trX, trY, sp.s.X, ys, RampColour(f))
		}
	case Points:
		sp.drawPoints(c, trX, trY, p.X.Min, p.X.Max)
	case Steps:
		sp.drawSteps(c, trX, trY)
	case Raster:
		sp.drawRaster(c, trX, trY, p.X.Min, p.X.Max)
	case Band:
		sp.fillBand(c, trX, trY)
	case HLine:
		y := trY(sp.s.Level)
		strokePath(c, sp.refStyle(), [][]vg.Point{{{X: c.Min.X, Y: y}, {X: c.Max.X, Y: y}}})
	case VLine:
		x := trX(sp.s.Level)
		strokePath(c, sp.refStyle(), [][]vg.Point{{{X: x, Y: c.Min.Y}, {X: x, Y: c.Max.Y}}})
	}
}

func (sp *seriesPlot) refStyle() draw.LineStyle {
	return draw.LineStyle{Color: sp.colour, Width: vg.Points(refWidth), Dashes: refDash}
}

// maskLog returns x and y with values that a log axis cannot show replaced
// by NaN (copies only when an axis is logarithmic).
func (sp *seriesPlot) maskLog(xs, ys []float64) ([]float64, []float64) {
	if !sp.logX && !sp.logY {
		return xs, ys
	}
	mx, my := make([]float64, len(xs)), make([]float64, len(ys))
	for i := range xs {
		mx[i], my[i] = xs[i], ys[i]
		if !usable(xs[i], sp.logX) || !usable(ys[i], sp.logY) {
			mx[i] = math.NaN()
		}
	}
	return mx, my
}

// strokeLine draws a decimated line as a single path, broken at gaps.
func (sp *seriesPlot) strokeLine(c draw.Canvas, trX, trY func(float64) vg.Length, xs, ys []float64, clr color.NRGBA) {
	xs, ys = sp.maskLog(xs, ys)
	idx := decimateOnCanvas(c, trX, xs, ys)
	lines := make([][]vg.Point, 0, 1)
	cur := make([]vg.Point, 0, len(idx))
	for _, k := range idx {
		if k == Break {
			lines, cur = appendRun(lines, cur)
			continue
		}
		cur = append(cur, vg.Point{X: trX(xs[k]), Y: trY(ys[k])})
	}
	lines, _ = appendRun(lines, cur)
	sty := sp.lineStyle(lineWidth)
	sty.Color = clr
	strokePath(c, sty, c.ClipLinesXY(lines...))
}

// appendRun moves a finished run of points into lines; the next run starts
// where this one ended in the same backing array.
func appendRun(lines [][]vg.Point, cur []vg.Point) ([][]vg.Point, []vg.Point) {
	if len(cur) > 0 {
		lines = append(lines, cur[:len(cur):len(cur)])
	}
	return lines, cur[len(cur):]
}

// decimateOnCanvas runs Decimate with columns of columnWidth on the canvas.
func decimateOnCanvas(c draw.Canvas, trX func(float64) vg.Length, xs, ys []float64) []int {
	ncol := int((c.Max.X-c.Min.X)/columnWidth) + 2
	col := func(x float64) int { return int(math.Floor(float64((trX(x) - c.Min.X) / columnWidth))) }
	if !nonDecreasing(xs) {
		// Decimation by column needs x in order; an unordered curve (a
		// phase plane) is drawn in full.
		col = func(float64) int { return 0 }
		idx := make([]int, 0, len(xs))
		for i := range xs {
			if usable(xs[i], false) && usable(ys[i], false) {
				idx = append(idx, i)
			} else if len(idx) > 0 && idx[len(idx)-1] != Break {
				idx = append(idx, Break)
			}
		}
		return idx
	}
	return Decimate(make([]int, 0, 4*ncol+8), xs, ys, col)
}

// nonDecreasing reports whether the finite values of xs are in order.
func nonDecreasing(xs []float64) bool {
	last := math.Inf(-1)
	for _, x := range xs {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			continue
		}
		if x < last {
			return false
		}
		last = x
	}
	return true
}

// strokePath draws all lines as one SVG path, so that one series is one
// path element whatever its gaps.
func strokePath(c draw.Canvas, sty draw.LineStyle, lines [][]vg.Point) {
	var path vg.Path
	for _, l := range lines {
		if len(l) < 2 {
			continue
		}
		path.Move(l[0])
		for _, pt := range l[1:] {
			path.Line(pt)
		}
	}
	if len(path) == 0 {
		return
	}
	c.SetLineStyle(sty)
	c.Stroke(path)
}

// Thumbnail implements plot.Thumbnailer: the legend's sample of the series.
func (sp *seriesPlot) Thumbnail(c *draw.Canvas) {
	mid := (c.Min.Y + c.Max.Y) / 2
	switch sp.s.Kind {
	case Points:
		c.DrawGlyph(sp.glyph(), c.Center())
	case Band:
		clr := sp.colour
		clr.A = bandOpacity
		c.FillPolygon(clr, []vg.Point{c.Min, {X: c.Max.X, Y: c.Min.Y}, c.Max, {X: c.Min.X, Y: c.Max.Y}})
	case Raster:
		x := (c.Min.X + c.Max.X) / 2
		c.StrokeLine2(sp.lineStyle(rasterWidth), x, c.Min.Y, x, c.Max.Y)
	case HLine, VLine:
		c.StrokeLine2(sp.refStyle(), c.Min.X, mid, c.Max.X, mid)
	case Family:
		c.StrokeLine2(draw.LineStyle{Color: RampColour(0.5), Width: vg.Points(lineWidth)}, c.Min.X, mid, c.Max.X, mid)
	default:
		c.StrokeLine2(sp.lineStyle(lineWidth), c.Min.X, mid, c.Max.X, mid)
	}
}

func (sp *seriesPlot) glyph() draw.GlyphStyle {
	return draw.GlyphStyle{Color: sp.colour, Radius: vg.Points(pointRadius), Shape: draw.CircleGlyph{}}
}
