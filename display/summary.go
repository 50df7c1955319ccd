package display

import (
	"fmt"
	"strings"
)

// kindWords are the singular and plural nouns of each series kind in
// descriptions.
var kindWords = [...][2]string{
	Line:   {"line", "lines"},
	Points: {"set of points", "sets of points"},
	Steps:  {"histogram", "histograms"},
	Raster: {"raster", "rasters"},
	Band:   {"band", "bands"},
	HLine:  {"horizontal reference line", "horizontal reference lines"},
	VLine:  {"vertical reference line", "vertical reference lines"},
	Family: {"family of curves", "families of curves"},
}

// Summary is the figure's plain-text description for consoles and screen
// readers: the title, each panel's axes, its series by kind with their
// names, number of points and y extremes, the axis ranges, and how many
// values were skipped because they were not finite (or not positive on a
// log axis). For a figure that does not validate it returns the error
// text, so it never fails.
func (f *Figure) Summary() string {
	st, err := f.stats()
	if err != nil {
		return err.Error()
	}
	var b strings.Builder
	b.WriteString("Figure")
	if f.Title != "" {
		fmt.Fprintf(&b, " %q", f.Title)
	}
	if len(f.Panels) == 1 {
		b.WriteString(": " + f.panelSummary(0, st[0]))
		return b.String()
	}
	fmt.Fprintf(&b, ": %d panels", len(f.Panels))
	if f.SharedX {
		b.WriteString(" sharing one x axis")
	}
	for i := range f.Panels {
		fmt.Fprintf(&b, "\n  panel %d: %s", i+1, strings.ReplaceAll(f.panelSummary(i, st[i]), "\n", "\n  "))
	}
	return b.String()
}

// panelSummary describes one panel: axes, series, ranges and skipped values.
func (f *Figure) panelSummary(i int, st []seriesStats) string {
	pn := f.Panels[i]
	var b strings.Builder
	xl := pn.XLabel
	if f.SharedX && xl == "" {
		xl = f.Panels[len(f.Panels)-1].XLabel
	}
	b.WriteString(axisName(pn.YLabel, "y") + " vs " + axisName(xl, "x"))
	for k := range kindWords {
		if d := kindSummary(pn, st, SeriesKind(k)); d != "" {
			b.WriteString(", " + d)
		}
	}
	x0, x1, y0, y1 := panelRange(st)
	if pn.fixedX() {
		x0, x1 = pn.XFrom, pn.XTo
	}
	fmt.Fprintf(&b, "\n  x from %s to %s%s; y from %s to %s%s", FormatNumber(x0, 0), FormatNumber(x1, 0), logNote(pn.LogX),
		FormatNumber(y0, 0), FormatNumber(y1, 0), logNote(pn.LogY))
	skipped := 0
	for _, s := range st {
		skipped += s.skipped
	}
	if skipped > 0 {
		what := "non-finite"
		if pn.LogX || pn.LogY {
			what = "non-finite or non-positive (log axis)"
		}
		fmt.Fprintf(&b, "\n  %s %s skipped", plural(skipped, what+" value", what+" values"), map[bool]string{true: "was", false: "were"}[skipped == 1])
	}
	return b.String()
}

func axisName(label, fallback string) string {
	if label == "" {
		return fallback
	}
	return label
}

func logNote(log bool) string {
	if log {
		return " (log)"
	}
	return ""
}

// kindSummary describes the panel's series of one kind ("" if none):
// "1 line (100,001 points, min −75.2, max 41.9)".
func kindSummary(pn Panel, st []seriesStats, kind SeriesKind) string {
	var parts []string
	for j, s := range pn.Series {
		if s.Kind != kind {
			continue
		}
		d := seriesDetail(s, st[j])
		if s.Name != "" {
			d = fmt.Sprintf("%q: %s", s.Name, d)
		}
		parts = append(parts, d)
	}
	if len(parts) == 0 {
		return ""
	}
	w := kindWords[kind]
	return plural(len(parts), w[0], w[1]) + " (" + strings.Join(parts, "; ") + ")"
}

// seriesDetail is the parenthesised detail of one series.
func seriesDetail(s Series, st seriesStats) string {
	switch s.Kind {
	case HLine:
		return "at y = " + FormatNumber(s.Level, 0)
	case VLine:
		return "at x = " + FormatNumber(s.Level, 0)
	case Raster:
		return plural(st.points, "event", "events")
	}
	var pre string
	if s.Kind == Family {
		pre = plural(len(s.Curves), "curve", "curves") + ", "
	}
	if st.points == 0 {
		return pre + "no finite points"
	}
	return fmt.Sprintf("%s%s, min %s, max %s", pre, plural(st.points, "point", "points"), FormatNumber(st.ymin, 0), FormatNumber(st.ymax, 0))
}
