package display

import (
	"image/color"
	"math"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// drawPoints marks each point with x in [x0, x1], with its error bar when
// YErr is given.
func (sp *seriesPlot) drawPoints(c draw.Canvas, trX, trY func(float64) vg.Length, x0, x1 float64) {
	s := sp.s
	var bars [][]vg.Point
	for i := range s.X {
		if !sp.inside(s.X[i], s.Y[i], x0, x1) {
			continue
		}
		x := trX(s.X[i])
		if s.YErr != nil && usable(s.YErr[i], false) && s.YErr[i] != 0 {
			e := math.Abs(s.YErr[i])
			lo, hi := s.Y[i]-e, s.Y[i]+e
			if usable(lo, sp.logY) && usable(hi, sp.logY) {
				w := vg.Points(2.5)
				y0, y1 := trY(lo), trY(hi)
				bars = append(bars, []vg.Point{{X: x, Y: y0}, {X: x, Y: y1}},
					[]vg.Point{{X: x - w, Y: y0}, {X: x + w, Y: y0}},
					[]vg.Point{{X: x - w, Y: y1}, {X: x + w, Y: y1}})
			}
		}
	}
	strokePath(c, sp.lineStyle(errBarWidth), c.ClipLinesXY(bars...))
	g := sp.glyph()
	for i := range s.X {
		if sp.inside(s.X[i], s.Y[i], x0, x1) {
			c.DrawGlyph(g, vg.Point{X: trX(s.X[i]), Y: trY(s.Y[i])})
		}
	}
}

// inside reports whether a point can be drawn and lies in the x range
// [x0, x1] (a panel's XFrom and XTo may leave data outside).
func (sp *seriesPlot) inside(x, y, x0, x1 float64) bool {
	return usable(x, sp.logX) && usable(y, sp.logY) && x >= x0 && x <= x1
}

// drawSteps draws stairs; with bin edges the outline starts and ends on
// zero (unless the y axis is logarithmic), as a histogram does.
func (sp *seriesPlot) drawSteps(c draw.Canvas, trX, trY func(float64) vg.Length) {
	s := sp.s
	edges := len(s.X) == len(s.Y)+1
	var lines [][]vg.Point
	var cur []vg.Point
	base := !sp.logY && edges
	for i := range s.Y {
		x0 := s.X[i]
		x1 := x0
		if i+1 < len(s.X) {
			x1 = s.X[i+1]
		}
		if !usable(x0, sp.logX) || !usable(x1, sp.logX) || !usable(s.Y[i], sp.logY) {
			lines, cur = appendRun(lines, cur)
			continue
		}
		y := trY(s.Y[i])
		if len(cur) == 0 && base {
			cur = append(cur, vg.Point{X: trX(x0), Y: trY(0)})
		}
		cur = append(cur, vg.Point{X: trX(x0), Y: y}, vg.Point{X: trX(x1), Y: y})
		if base && (i+1 == len(s.Y) || !usable(s.Y[i+1], sp.logY)) {
			cur = append(cur, vg.Point{X: trX(x1), Y: trY(0)})
		}
	}
	lines, _ = appendRun(lines, cur)
	strokePath(c, sp.lineStyle(lineWidth), c.ClipLinesXY(lines...))
}

// drawRaster draws one tick per event with x in [x0, x1], 0.8 of a row
// high, all in one path.
func (sp *seriesPlot) drawRaster(c draw.Canvas, trX, trY func(float64) vg.Length, x0, x1 float64) {
	s := sp.s
	lines := make([][]vg.Point, 0, len(s.X))
	pts := make([]vg.Point, 0, 2*len(s.X))
	for i := range s.X {
		if !sp.inside(s.X[i], s.Y[i], x0, x1) {
			continue
		}
		x := trX(s.X[i])
		lo, hi := s.Y[i]-0.4, s.Y[i]+0.4
		if sp.logY {
			lo, hi = s.Y[i]*0.9, s.Y[i]*1.1
		}
		pts = append(pts, vg.Point{X: x, Y: trY(lo)}, vg.Point{X: x, Y: trY(hi)})
		lines = append(lines, pts[len(pts)-2:])
	}
	strokePath(c, sp.lineStyle(rasterWidth), lines)
}

// fillBand shades between Lo and Hi, one polygon per run of finite values;
// each edge of a long band is decimated on its own.
func (sp *seriesPlot) fillBand(c draw.Canvas, trX, trY func(float64) vg.Length) {
	s := sp.s
	clr := sp.colour
	clr.A = bandOpacity
	start := -1
	for i := 0; i <= len(s.X); i++ {
		ok := i < len(s.X) && usable(s.X[i], sp.logX) && usable(s.Lo[i], sp.logY) && usable(s.Hi[i], sp.logY)
		switch {
		case ok && start < 0:
			start = i
		case !ok && start >= 0:
			sp.fillRun(c, trX, trY, s.X[start:i], s.Lo[start:i], s.Hi[start:i], clr)
			start = -1
		}
	}
}

func (sp *seriesPlot) fillRun(c draw.Canvas, trX, trY func(float64) vg.Length, xs, lo, hi []float64, clr color.NRGBA) {
	up := decimateOnCanvas(c, trX, xs, hi)
	down := decimateOnCanvas(c, trX, xs, lo)
	poly := make([]vg.Point, 0, len(up)+len(down))
	for _, k := range up {
		poly = append(poly, vg.Point{X: trX(xs[k]), Y: trY(hi[k])})
	}
	for j := len(down) - 1; j >= 0; j-- {
		k := down[j]
		poly = append(poly, vg.Point{X: trX(xs[k]), Y: trY(lo[k])})
	}
	if len(poly) >= 3 {
		c.FillPolygon(clr, poly)
	}
}
