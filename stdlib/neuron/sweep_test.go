package neuron

import (
	"context"
	"math"
	"reflect"
	"strings"
	"testing"
)

func hhFactory() Model { return NewHH() }

// TestHHTypeII checks the abrupt onset of repetitive firing of the HH membrane at
// 6.3 °C: near 6.2 µA/cm² (from memory) the steady rate jumps from 0 to a non-zero
// minimum above 40 Hz (Hodgkin's class II excitability; common practice).
func TestHHTypeII(t *testing.T) {
	var amps []float64
	for a := 5.0; a <= 7.5; a += 0.25 {
		amps = append(amps, a*0.01) // µA/cm² → A/m²
	}
	r, err := Sweep(context.Background(), hhFactory, amps, &SweepSettings{Length: 0.5})
	if err != nil {
		t.Fatal(err)
	}
	on := -1
	for i, rate := range r.Rate {
		if rate > 0 {
			on = i
			break
		}
	}
	if on <= 0 {
		t.Fatalf("no onset inside the sweep: rates %v", r.Rate)
	}
	// Bracket from memory: onset between 5.5 and 7 µA/cm².
	if a := amps[on] * 100; a < 5.5 || a > 7 {
		t.Errorf("repetitive firing starts at %g µA/cm², want near 6.2", a)
	}
	if r.Rate[on] <= 40 {
		t.Errorf("rate at onset %g Hz, want a jump above 40 Hz (type II)", r.Rate[on])
	}
	for i := on; i < len(amps); i++ {
		if r.Rate[i] <= 40 {
			t.Errorf("rate at %g µA/cm² is %g Hz, want > 40 Hz above onset", amps[i]*100, r.Rate[i])
		}
	}
}

// TestSweepWorkers checks that a sweep gives bitwise identical results with 1 and 2
// workers (results are written by index) and that the steady rate of a LIF equals
// the closed form (Dayan & Abbott 2001, ch. 5).
func TestSweepWorkers(t *testing.T) {
	amps := []float64{0.1e-9, 0.25e-9, 0.3e-9, 0.5e-9, 1e-9}
	f := func() Model { return NewLIF() }
	var got [2]*SweepResult
	for w := 1; w <= 2; w++ {
		calls := 0
		r, err := Sweep(context.Background(), f, amps, &SweepSettings{Workers: w, Sim: &Settings{Dt: 1e-4}, Progress: func(done, total int) { calls++ }})
		if err != nil {
			t.Fatal(err)
		}
		if calls != len(amps) || r.Finished != len(amps) {
			t.Errorf("%d progress calls, %d finished; want %d", calls, r.Finished, len(amps))
		}
		got[w-1] = r
	}
	if !reflect.DeepEqual(got[0], got[1]) {
		t.Errorf("sweep differs between 1 and 2 workers:\n%+v\n%+v", got[0], got[1])
	}
	m := NewLIF()
	for i, a := range amps {
		want := LIFRate(m.C/m.GL, m.TRef, m.VTh, m.VReset, m.EL+a/m.GL)
		// The inverse mean ISI of an exact periodic train: rounding only.
		checkNear(t, "LIF sweep rate", got[0].Rate[i], want, 1e-9, 1e-9)
	}
}

// TestSweepCancel checks that a cancelled sweep marks unfinished entries NaN.
func TestSweepCancel(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	r, err := Sweep(ctx, hhFactory, []float64{0.05, 0.1}, nil)
	if err == nil || !strings.Contains(err.Error(), "0 of 2") {
		t.Fatalf("err = %v, want a message saying 0 of 2 finished", err)
	}
	if r.Finished != 0 || !math.IsNaN(r.Rate[0]) || !math.IsNaN(r.Rate[1]) {
		t.Errorf("cancelled sweep: %+v", r)
	}
}

// TestRheobase checks the LIF rheobase against the closed form of the first
// threshold crossing of V(t) = V∞ + (V_on − V∞) e^{−t/τ} (Dayan & Abbott 2001,
// ch. 5), I = ((V_th − E_L) − (V_on − E_L) e^{−T/τ}) / ((1 − e^{−T/τ}) R): for a
// long step from rest that is g_L (V_th − E_L) exactly; for a short one, and from
// another initial potential, it is checked against the simulator, which must fire
// just above the amplitude and stay silent just below it.
func TestRheobase(t *testing.T) {
	v0 := func(v float64) func() Model {
		return func() Model { m := NewLIF(); m.V0 = v; return m }
	}
	cases := []struct {
		name    string
		factory func() Model
		length  float64
		want    float64 // NaN: check against the simulator only
	}{
		// (V_th − E_L) g_L = 20 mV · 10 nS = 200 pA; e^{−50} vanishes against 1.
		{"1 s step from rest", func() Model { return NewLIF() }, 1, 200e-12},
		// 200 pA / (1 − e^{−1}) = 316.3953 pA (τ = T = 20 ms).
		{"20 ms step from rest", func() Model { return NewLIF() }, 20e-3, 200e-12 / (1 - math.Exp(-1))},
		{"10 ms step from -60 mV", v0(-60e-3), 10e-3, math.NaN()},
		// Normalised LIF: threshold input 1 for a long step.
		{"normalised LIF", func() Model { return NewNormLIF() }, 1, 1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r, err := Rheobase(context.Background(), c.factory, &RheobaseSettings{Sweep: SweepSettings{Length: c.length}})
			if err != nil {
				t.Fatal(err)
			}
			if !r.Exact || r.Runs != 0 || r.Lo != r.Amplitude || r.Hi != r.Amplitude {
				t.Errorf("LIF rheobase not from the closed form: %+v", r)
			}
			if !math.IsNaN(c.want) {
				// Rounding only: a few operations on exact millivolt differences.
				checkNear(t, "LIF rheobase", r.Amplitude, c.want, 0, 1e-14)
			}
			// The exact integrator against the closed form: 1e-6 relative moves the
			// crossing by about 1e-6·τ, far beyond its rounding.
			sw := SweepSettings{Length: c.length, Window: c.length}
			for _, f := range []struct {
				scale float64
				fires bool
			}{{1 + 1e-6, true}, {1 - 1e-6, false}} {
				tr, err := stepRun(context.Background(), c.factory(), r.Amplitude*f.scale, sw)
				if err != nil {
					t.Fatal(err)
				}
				if got := len(tr.Spikes) > 0; got != f.fires {
					t.Errorf("at %g × rheobase: fires %v, want %v", f.scale, got, f.fires)
				}
			}
		})
	}
}

// TestRheobaseBisection checks the simulated path (Hodgkin–Huxley): the answer
// is the middle of a bracket narrower than RelTol whose top fires and whose bottom
// does not.
func TestRheobaseBisection(t *testing.T) {
	s := &RheobaseSettings{Sweep: SweepSettings{Length: 0.2}, RelTol: 1e-3}
	r, err := Rheobase(context.Background(), hhFactory, s)
	if err != nil {
		t.Fatal(err)
	}
	if r.Exact || r.Amplitude != 0.5*(r.Lo+r.Hi) || r.Hi-r.Lo > 1e-3*r.Hi {
		t.Errorf("bisection result %+v: want the middle of a bracket within 1e-3", r)
	}
	sw, _ := sweepDefaults(hhFactory, &s.Sweep)
	for _, a := range []struct {
		amp   float64
		fires bool
	}{{r.Hi, true}, {r.Lo, false}} {
		tr, err := stepRun(context.Background(), hhFactory(), a.amp, sw)
		if err != nil {
			t.Fatal(err)
		}
		if got := len(tr.Spikes) > 0; got != a.fires {
			t.Errorf("at %g A/m^2: fires %v, want %v", a.amp, got, a.fires)
		}
	}
}

// TestSweepProgressCountsFinished: the progress of an interrupted sweep counts
// the amplitudes finished, not those started and abandoned, so the last report
// equals Finished (the review found an interrupted sweep reporting 18% with
// none finished).
func TestSweepProgressCountsFinished(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	last := 0
	s := &SweepSettings{Length: 0.2, Workers: 2, Progress: func(done, _ int) { last = done; cancel() }}
	r, err := Sweep(ctx, hhFactory, []float64{0.05, 0.06, 0.07, 0.08, 0.09, 0.1}, s)
	if err == nil {
		t.Fatal("a sweep cancelled at its first report ended without error")
	}
	if r.Finished == 0 || last != r.Finished {
		t.Errorf("last progress report %d, finished %d; want them equal and positive", last, r.Finished)
	}
}
