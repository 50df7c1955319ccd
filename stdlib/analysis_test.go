package stdlib

import (
	"math"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/runtime/units"
	"github.com/loligo-lab/loligo/stdlib/neuron"
)

// TestSweepPartial: an interrupted sweep shows the curve of the amplitudes
// finished, and with none finished shows nothing and says so instead of
// pointing at a curve "shown above".
func TestSweepPartial(t *testing.T) {
	m := &Model{spec: hhSpec, n: 1}
	nan := math.NaN()
	cases := []struct {
		name     string
		rate     []float64
		finished int
		curve    bool
		note     string
	}{
		{"none finished", []float64{nan, nan}, 0, false, "no amplitude of 2 finished"},
		{"one finished", []float64{50, nan}, 1, true, "1 of 2 amplitudes finished; the partial curve is shown above"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			res := &neuron.SweepResult{Amplitudes: []float64{0.05, 0.1}, Rate: c.rate, FirstRate: c.rate, Finished: c.finished}
			v, note := sweepPartial(m, res, units.CurrentDensity)
			if (v != nil) != c.curve || !strings.Contains(note, c.note) {
				t.Errorf("partial %v, note %q; want a curve %v and a note with %q", v, note, c.curve, c.note)
			}
		})
	}
}

// TestPSTHColumns: the rate column of a smoothed PSTH says it is smoothed,
// since it stands beside the raw counts (a smoothed rate times the bin width
// is no longer the count).
func TestPSTHColumns(t *testing.T) {
	// Invented spike trains of two neurons over 100 ms.
	p := &SpikePop{trains: [][]float64{{0.01, 0.05}, {0.02}}, duration: 0.1, model: &Model{spec: lifSpec, n: 2}, stim: "invented"}
	cases := []struct {
		name   string
		smooth float64
		want   string
	}{
		{"raw", 0, "rate (Hz)"},
		{"smoothed", 0.01, "smoothed rate (Hz)"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			h, err := p.psth(0.01, c.smooth)
			if err != nil {
				t.Fatal(err)
			}
			bs, err := h.Show()
			if err != nil || len(bs) == 0 {
				t.Fatalf("Show: %v", err)
			}
			txt, _ := bs[0].Data["text/plain"].(string)
			if !strings.Contains(txt, c.want) || (c.smooth == 0 && strings.Contains(txt, "smoothed")) {
				t.Errorf("table text %q; want the column %q", txt, c.want)
			}
		})
	}
}
