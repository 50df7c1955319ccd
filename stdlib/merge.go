package stdlib

import (
	"fmt"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime/units"
)

// mergeFigures overlays the series of panels with the same axis labels and
// stacks the others, in the order they come. Series joining a panel from
// another figure take the next colour, and repeated names are numbered. The
// merged figure keeps the figures' title when they all have the same one.
func mergeFigures(figs []*display.Figure) *display.Figure {
	if len(figs) == 1 {
		f := *figs[0]
		f.Panels = append([]display.Panel(nil), f.Panels...)
		return &f
	}
	out := &display.Figure{SharedX: true, Title: commonTitle(figs)}
	xlabel := ""
	for fi, f := range figs {
		for _, p := range f.Panels {
			if p.XLabel != "" {
				if xlabel != "" && p.XLabel != xlabel {
					out.SharedX = false
				}
				xlabel = p.XLabel
			}
			j, fx, fy := panelIndex(out.Panels, p)
			if j < 0 {
				q := p
				q.Series = append([]display.Series(nil), p.Series...)
				out.Panels = append(out.Panels, q)
				continue
			}
			dst := &out.Panels[j]
			dst.NoLegend = dst.NoLegend && p.NoLegend
			for _, s := range p.Series {
				if fi > 0 && s.Kind != display.HLine && s.Kind != display.VLine {
					s.Colour = 0
				}
				s.Name = uniqueName(dst.Series, s.Name, len(dst.Series)+1)
				dst.Series = append(dst.Series, rescale(s, fx, fy))
			}
			dst.NoLegend = false
		}
	}
	return out
}

// commonTitle returns the title all figs share, or "" when they differ.
func commonTitle(figs []*display.Figure) string {
	for _, f := range figs[1:] {
		if f.Title != figs[0].Title {
			return ""
		}
	}
	return figs[0].Title
}

// panelIndex finds the panel of ps that p overlays: the same quantities on
// both axes, possibly in other units ("I (pA)" and "I (nA)"). fx and fy
// convert p's data into that panel's units.
func panelIndex(ps []display.Panel, p display.Panel) (i int, fx, fy float64) {
	for i, q := range ps {
		fx, okx := labelScale(q.XLabel, p.XLabel)
		fy, oky := labelScale(q.YLabel, p.YLabel)
		if okx && oky {
			return i, fx, fy
		}
	}
	return -1, 1, 1
}

// labelScale says whether axis labels dst and src name the same quantity
// and gives the factor from src's unit to dst's: 1000 from "I (nA)" to
// "I (pA)". Labels are "name (unit)" as stdlib.Label writes them.
func labelScale(dst, src string) (float64, bool) {
	if dst == src {
		return 1, true
	}
	dn, du, ok1 := splitLabel(dst)
	sn, su, ok2 := splitLabel(src)
	if !ok1 || !ok2 || dn != sn {
		return 0, false
	}
	a, err1 := units.Parse(du)
	b, err2 := units.Parse(su)
	if err1 != nil || err2 != nil || a.Dim != b.Dim || a.Offset != 0 || b.Offset != 0 {
		return 0, false
	}
	return b.Scale / a.Scale, true
}

func splitLabel(l string) (name, unit string, ok bool) {
	i := strings.LastIndex(l, " (")
	if i < 0 || !strings.HasSuffix(l, ")") {
		return "", "", false
	}
	return l[:i], l[i+2 : len(l)-1], true
}

// rescale returns s with its data multiplied into another unit; the input
// slices are not modified.
func rescale(s display.Series, fx, fy float64) display.Series {
	if fx == 1 && fy == 1 {
		return s
	}
	scale := func(v []float64, f float64) []float64 {
		if v == nil || f == 1 {
			return v
		}
		out := make([]float64, len(v))
		for i, x := range v {
			out[i] = x * f
		}
		return out
	}
	s.X, s.Y, s.YErr, s.Lo, s.Hi = scale(s.X, fx), scale(s.Y, fy), scale(s.YErr, fy), scale(s.Lo, fy), scale(s.Hi, fy)
	if s.Curves != nil {
		cs := make([][]float64, len(s.Curves))
		for i, c := range s.Curves {
			cs[i] = scale(c, fy)
		}
		s.Curves = cs
	}
	switch s.Kind {
	case display.HLine:
		s.Level *= fy
	case display.VLine:
		s.Level *= fx
	}
	return s
}

func uniqueName(ss []display.Series, name string, n int) string {
	if name == "" {
		return fmt.Sprintf("series %d", n)
	}
	for _, s := range ss {
		if s.Name == name {
			return fmt.Sprintf("%s (%d)", name, n)
		}
	}
	return name
}
