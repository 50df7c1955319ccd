package display

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
)

// Tick placement on linear axes. Labelled ticks sit on whole multiples of
// a step of 1, 2 or 5 times a power of ten, chosen so that an axis carries
// about as many labels as asked (the "nice numbers" of P. S. Heckbert,
// Graphics Gems, 1990): an axis from 30.74 to 480 gets 100, 200, 300, 400,
// never 50, 250, 450. Unlabelled minor ticks split each step into five
// (four for a step of 2).
const (
	tickTarget  = 6  // labels on an axis of ordinary length
	tickSpacing = 40 // points an axis needs per label; shorter axes get fewer
)

// niceTicks implements plot.Ticker with nice steps. Target is the number
// of labels aimed at (0 means tickTarget; at least 2). A minStep above zero
// is the smallest step allowed: 1 on an axis of neuron indices, so that no
// tick falls between two rows.
type niceTicks struct {
	target  int
	minStep float64
}

// ticksFor returns the ticker for an axis of the given length in points.
func ticksFor(length float64, minStep float64) plot.Ticker {
	n := min(max(int(math.Round(length/tickSpacing)), 3), tickTarget)
	return cleanTicks{niceTicks{target: n, minStep: minStep}}
}

var _ plot.Ticker = niceTicks{}

// Ticks implements plot.Ticker.
func (n niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || math.IsInf(hi-lo, 0) {
		return []plot.Tick{{Value: lo, Label: "x"}} // a label, rewritten by cleanTicks
	}
	target := n.target
	if target <= 0 {
		target = tickTarget
	}
	step, minors := niceStep((hi-lo)/float64(max(target, 2)-1), n.minStep)
	var ts []plot.Tick
	minor := step / float64(minors)
	first := math.Ceil(lo/minor - 1e-9)
	last := math.Floor(hi/minor + 1e-9)
	if last-first > 1e4 { // cannot happen for a finite range and ~6 steps; a guard
		return []plot.Tick{{Value: lo, Label: "x"}, {Value: hi, Label: "x"}}
	}
	for k := first; k <= last; k++ {
		t := plot.Tick{Value: k * minor}
		if math.Mod(k, float64(minors)) == 0 {
			t.Value = (k / float64(minors)) * step // exact multiple of the step
			t.Label = "x"
		}
		ts = append(ts, t)
	}
	return ts
}

// niceStep rounds raw to the nearest of 1, 2 and 5 times a power of ten
// (Heckbert's rounding: below 1.5 → 1, below 3 → 2, below 7 → 5, else 10)
// and returns it with the number of minor intervals per step; the step is
// at least minStep.
func niceStep(raw, minStep float64) (step float64, minors int) {
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	f := raw / p
	switch {
	case f < 1.5:
		step, minors = p, 5
	case f < 3:
		step, minors = 2*p, 4
	case f < 7:
		step, minors = 5*p, 5
	default:
		step, minors = 10*p, 5
	}
	if minStep > 0 && step < minStep {
		return minStep, 1
	}
	if minStep > 0 && step/float64(minors) < minStep {
		minors = max(1, int(step/minStep)) // no minor tick between two rows
	}
	return step, minors
}

// cleanTicks labels ticks with just the decimals their spacing needs
// ("−25", "0.5", not "−25.00") and a true minus sign, as in the captions.
type cleanTicks struct{ plot.Ticker }

func (c cleanTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := c.Ticker.Ticks(lo, hi)
	step := math.Inf(1)
	prev := math.NaN()
	for _, t := range ts {
		if t.Label == "" {
			continue
		}
		if !math.IsNaN(prev) {
			step = math.Min(step, t.Value-prev)
		}
		prev = t.Value
	}
	dec := 0
	if step > 0 && !math.IsInf(step, 0) {
		dec = max(0, int(math.Ceil(-math.Log10(step)-1e-9)))
	}
	for i, t := range ts {
		if t.Label != "" {
			l := strconv.FormatFloat(t.Value, 'f', dec, 64)
			if l == "-"+strconv.FormatFloat(0, 'f', dec, 64) {
				l = l[1:] // no "−0"
			}
			ts[i].Label = strings.Replace(l, "-", "−", 1)
		}
	}
	return ts
}

// blankTicks keeps a ticker's marks but drops their labels (upper panels
// of a shared x axis).
type blankTicks struct{ plot.Ticker }

func (b blankTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := b.Ticker.Ticks(lo, hi)
	for i := range ts {
		ts[i].Label = ""
	}
	return ts
}
