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

// TestRheobase checks the LIF rheobase against the closed form g_L (V_th − E_L)
// (Dayan & Abbott 2001, ch. 5): with a 1 s step the firing threshold exceeds it by a
// factor 1 + O(e^{−1 s/τ_m}), negligible here.
func TestRheobase(t *testing.T) {
	m := NewLIF()
	want := m.GL * (m.VTh - m.EL)
	r, err := Rheobase(context.Background(), func() Model { return NewLIF() }, &RheobaseSettings{Sweep: SweepSettings{Sim: &Settings{Dt: 1e-4}}})
	if err != nil {
		t.Fatal(err)
	}
	if !(r.Lo <= want && want <= r.Hi) || r.Hi-r.Lo > 1e-3*r.Hi {
		t.Errorf("bracket [%g, %g] A does not hold %g A within 1e-3", r.Lo, r.Hi, want)
	}
	// The bracket is within the relative tolerance, so the estimate is too.
	checkNear(t, "LIF rheobase", r.Amplitude, want, 0, 1e-3)
}
