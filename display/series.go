package display

import (
	"fmt"
	"math"
)

// stats checks the series' shape and counts its drawable points.
func (s Series) stats(logX, logY bool) (seriesStats, error) {
	st := newStats()
	switch s.Kind {
	case Line, Points, Raster:
		if err := sameLen(s, "Y", len(s.Y)); err != nil {
			return st, err
		}
		if s.Kind == Points && s.YErr != nil && len(s.YErr) != len(s.Y) {
			return st, fmt.Errorf("YErr has %d values but Y has %d; give one error per point or none", len(s.YErr), len(s.Y))
		}
		for i := range s.X {
			lo, hi := s.Y[i], s.Y[i]
			if s.Kind == Points && s.YErr != nil && usable(s.YErr[i], false) {
				lo, hi = s.Y[i]-math.Abs(s.YErr[i]), s.Y[i]+math.Abs(s.YErr[i])
			}
			st.add(s.X[i], lo, hi, logX, logY)
		}
	case Steps:
		return s.stepStats(logX, logY)
	case Band:
		if err := sameLen(s, "Lo", len(s.Lo)); err != nil {
			return st, err
		}
		if err := sameLen(s, "Hi", len(s.Hi)); err != nil {
			return st, err
		}
		for i := range s.X {
			st.add(s.X[i], math.Min(s.Lo[i], s.Hi[i]), math.Max(s.Lo[i], s.Hi[i]), logX, logY)
		}
	case HLine, VLine:
		return s.refStats(logX, logY)
	case Family:
		if len(s.Curves) == 0 {
			return st, fmt.Errorf("a family needs at least one curve in Curves")
		}
		for k, c := range s.Curves {
			if len(c) != len(s.X) || len(c) == 0 {
				return st, fmt.Errorf("curve %d has %d values but X has %d; give every curve one value per x (and at least one)", k+1, len(c), len(s.X))
			}
			for i := range c {
				st.add(s.X[i], c[i], c[i], logX, logY)
			}
		}
	default:
		return st, fmt.Errorf("unknown series kind %d; use one of the display.SeriesKind constants", int(s.Kind))
	}
	return st, nil
}

// add counts one point whose y extent is [lo, hi].
func (st *seriesStats) add(x, lo, hi float64, logX, logY bool) {
	if !usable(x, logX) || !usable(lo, logY) || !usable(hi, logY) {
		st.skipped++
		return
	}
	st.points++
	st.addX(x)
	st.addY(lo)
	st.addY(hi)
}

// sameLen checks that X and another field have the same, non-zero length.
func sameLen(s Series, field string, n int) error {
	if len(s.X) == 0 {
		return fmt.Errorf("the %s is empty; give it at least one point", s.Kind)
	}
	if len(s.X) != n {
		return fmt.Errorf("X has %d values but %s has %d; give them the same length", len(s.X), field, n)
	}
	return nil
}

// stepStats checks stairs: edges (len(X) = len(Y)+1) or left ends.
func (s Series) stepStats(logX, logY bool) (seriesStats, error) {
	st := newStats()
	if len(s.Y) == 0 {
		return st, fmt.Errorf("the steps series is empty; give it at least one bin")
	}
	if len(s.X) != len(s.Y)+1 && len(s.X) != len(s.Y) {
		return st, fmt.Errorf("X has %d values and Y %d; give bin edges (one more x than y) or left ends (as many x as y)", len(s.X), len(s.Y))
	}
	for i := range s.Y {
		st.add(s.X[i], s.Y[i], s.Y[i], logX, logY)
	}
	if len(s.X) > len(s.Y) && usable(s.X[len(s.Y)], logX) {
		st.addX(s.X[len(s.Y)])
	}
	if !logY && st.points > 0 {
		st.addY(0) // bars rest on zero
	}
	return st, nil
}

// refStats checks a reference line's level.
func (s Series) refStats(logX, logY bool) (seriesStats, error) {
	st := newStats()
	log := logY
	if s.Kind == VLine {
		log = logX
	}
	if !usable(s.Level, log) {
		return st, fmt.Errorf("reference line level %v cannot be drawn; give a finite level (positive on a log axis)", s.Level)
	}
	st.points = 1
	if s.Kind == HLine {
		st.addY(s.Level)
	} else {
		st.addX(s.Level)
	}
	return st, nil
}

// panelRange returns the x and y data ranges of a panel from its series
// statistics; an empty or zero-width range is widened so it can be drawn.
func panelRange(st []seriesStats) (xmin, xmax, ymin, ymax float64) {
	all := newStats()
	for _, s := range st {
		if s.points == 0 {
			continue
		}
		if s.xmin <= s.xmax {
			all.addX(s.xmin)
			all.addX(s.xmax)
		}
		if s.ymin <= s.ymax {
			all.addY(s.ymin)
			all.addY(s.ymax)
		}
	}
	xmin, xmax = widen(all.xmin, all.xmax)
	ymin, ymax = widen(all.ymin, all.ymax)
	return xmin, xmax, ymin, ymax
}

// widen gives a range of zero width (one value) or no values a usable span.
func widen(lo, hi float64) (float64, float64) {
	switch {
	case lo > hi:
		return 0, 1
	case lo == hi && lo == 0:
		return -1, 1
	case lo == hi:
		d := math.Abs(lo) * 0.05
		return lo - d, hi + d
	}
	return lo, hi
}
