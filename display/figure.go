package display

import (
	"fmt"
	"math"
)

// SeriesKind is the way a series is drawn.
type SeriesKind int

const (
	// Line joins (X[i], Y[i]) in order; a non-finite value breaks the line.
	// Long lines are reduced by min/max decimation (see Decimate).
	Line SeriesKind = iota
	// Points marks each (X[i], Y[i]) with a dot and, if YErr is set, a
	// vertical error bar from Y[i]−YErr[i] to Y[i]+YErr[i].
	Points
	// Steps draws stairs, as for a histogram (PSTH, ISI histogram): with
	// len(X) == len(Y)+1, X are bin edges and Y[i] the height of bin i;
	// with len(X) == len(Y), each Y[i] holds from X[i] to X[i+1].
	Steps
	// Raster draws a short vertical tick at (X[i], Y[i]) for each event:
	// X spike times, Y neuron indices.
	Raster
	// Band shades the region between Lo[i] and Hi[i] at X[i] (a confidence
	// band); Y is not used.
	Band
	// HLine is a horizontal reference line at y = Level.
	HLine
	// VLine is a vertical reference line at x = Level.
	VLine
	// Family draws one line per element of Curves, all against X, coloured
	// along the ramp from RampStart to RampEnd.
	Family
)

var kindNames = [...]string{"line", "points", "steps", "raster", "band", "horizontal line", "vertical line", "family"}

func (k SeriesKind) String() string {
	if k < 0 || int(k) >= len(kindNames) {
		return fmt.Sprintf("kind %d", int(k))
	}
	return kindNames[k]
}

// Series is one data set of a panel; which fields are read depends on Kind
// (see the SeriesKind constants). Name is shown in the legend and the text
// description. Colour 0 takes the next colour of the Palette in order;
// Colour k > 0 asks for Palette[(k−1) mod len(Palette)]. The figure never
// modifies the slices.
type Series struct {
	Kind   SeriesKind
	Name   string
	X, Y   []float64
	YErr   []float64
	Lo, Hi []float64
	Curves [][]float64
	Level  float64
	Colour int
}

// Panel is one plot area with its own y axis. Labels carry their units,
// as in "V (mV)"; LogX and LogY ask for logarithmic axes (values ≤ 0 are
// then skipped and counted). Height is the panel's share of the figure
// height relative to the other panels (0 means 1): a stimulus panel of
// Height 0.35 under a voltage panel of Height 1. NoLegend hides the legend,
// which is otherwise shown when a panel has two or more series and any of
// them is named. XFrom and XTo, when XFrom < XTo (and both are positive on
// a log axis), fix the x range whatever the data, in the units of the data:
// a raster over its whole run, from 0 to the duration, rather than from the
// first spike to the last; data outside are clipped. Otherwise (both 0, the
// default) the range is that of the data.
type Panel struct {
	XLabel, YLabel string
	LogX, LogY     bool
	Height         float64
	NoLegend       bool
	XFrom, XTo     float64
	Series         []Series
}

// Figure is one or more panels stacked top to bottom. SharedX gives all
// panels the same x range and shows x tick labels and the x label only
// under the bottom panel. Width and Height are in points (1/72 inch; the
// bundle reports them as the display size): 0 means DefaultWidth, and a
// height of 80 pt plus 240 pt per unit of panel height.
type Figure struct {
	Title   string
	Panels  []Panel
	SharedX bool
	Width   float64
	Height  float64
}

// DefaultWidth is the width of a figure in points unless asked otherwise.
const DefaultWidth = 560

// size returns the figure's width and height in points.
func (f *Figure) size() (w, h float64) {
	w, h = f.Width, f.Height
	if w <= 0 {
		w = DefaultWidth
	}
	if h <= 0 {
		sum := 0.0
		for _, p := range f.Panels {
			sum += p.weight()
		}
		h = min(80+240*sum, 1600)
	}
	return w, h
}

func (p Panel) weight() float64 {
	if p.Height > 0 && !math.IsInf(p.Height, 0) {
		return p.Height
	}
	return 1
}

// seriesStats is what a series contributes to its panel's ranges and to the
// text description.
type seriesStats struct {
	points  int // finite points drawn (events for a raster)
	skipped int // non-finite values, or values ≤ 0 on a log axis
	xmin    float64
	xmax    float64
	ymin    float64
	ymax    float64
}

func newStats() seriesStats {
	return seriesStats{xmin: math.Inf(1), xmax: math.Inf(-1), ymin: math.Inf(1), ymax: math.Inf(-1)}
}

// addX and addY widen the ranges by a finite value (plain comparisons:
// math.Min's NaN handling is not needed and costs a third of a 1 M trace).
func (s *seriesStats) addX(x float64) {
	if x < s.xmin {
		s.xmin = x
	}
	if x > s.xmax {
		s.xmax = x
	}
}

func (s *seriesStats) addY(y float64) {
	if y < s.ymin {
		s.ymin = y
	}
	if y > s.ymax {
		s.ymax = y
	}
}

// usable reports whether v can be drawn on an axis (finite, and positive
// on a log axis).
func usable(v float64, log bool) bool {
	return !math.IsNaN(v) && !math.IsInf(v, 0) && (!log || v > 0)
}

// Validate reports what is wrong with the figure: no panels, a panel
// without series or without any drawable value, series of mismatched
// lengths, empty series, or a reference line that cannot be drawn.
func (f *Figure) Validate() error {
	_, err := f.stats()
	return err
}

// stats checks the figure and returns the statistics of every series,
// stats[panel][series].
func (f *Figure) stats() ([][]seriesStats, error) {
	if f == nil {
		return nil, fmt.Errorf("display: figure is nil; build a display.Figure with at least one panel")
	}
	if len(f.Panels) == 0 {
		return nil, fmt.Errorf("display: figure %q has no panels; add a panel with at least one series", f.Title)
	}
	out := make([][]seriesStats, len(f.Panels))
	for i, p := range f.Panels {
		if len(p.Series) == 0 {
			return nil, fmt.Errorf("display: figure %q: panel %d has no series; add a line, points or another series, or remove the panel", f.Title, i+1)
		}
		drawable := false
		for j, s := range p.Series {
			st, err := s.stats(p.LogX, p.LogY)
			if err != nil {
				return nil, fmt.Errorf("display: figure %q: panel %d, series %d%s: %v", f.Title, i+1, j+1, quoteName(s.Name), err)
			}
			out[i] = append(out[i], st)
			drawable = drawable || (st.points > 0 && s.Kind != HLine && s.Kind != VLine)
		}
		if !drawable {
			return nil, fmt.Errorf("display: figure %q: panel %d has nothing to draw: %s; check the data (for example a simulation that diverged)", f.Title, i+1, whyEmpty(p, out[i]))
		}
	}
	return out, nil
}

func quoteName(name string) string {
	if name == "" {
		return ""
	}
	return fmt.Sprintf(" (%q)", name)
}

// whyEmpty explains why a panel has no drawable value.
func whyEmpty(p Panel, st []seriesStats) string {
	skipped := 0
	for _, s := range st {
		skipped += s.skipped
	}
	if skipped == 0 {
		return "it holds only reference lines; add a data series"
	}
	what := "NaN or infinite"
	if p.LogX || p.LogY {
		what += ", or not positive on a log axis"
	}
	return fmt.Sprintf("all %s values are %s", FormatCount(skipped), what)
}
