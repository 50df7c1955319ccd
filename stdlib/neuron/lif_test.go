package neuron

import (
	"context"
	"math"
	"testing"
)

// TestLIFClosedForm checks the exact integrator against the closed-form LIF
// interspike interval T = t_ref + τ ln((V∞ − V_reset)/(V∞ − V_th)) (Dayan & Abbott,
// Theoretical Neuroscience, 2001, ch. 5). Spike k (from V0 = V_reset) is at
// τ ln(...) + (k−1)T.
func TestLIFClosedForm(t *testing.T) {
	phys := NewLIF()
	phys.VReset, phys.V0 = -65e-3, -65e-3
	cases := []struct {
		name      string
		m         Model
		in        float64
		tau, tref float64
		vth, vr   float64
		vinf      float64
	}{
		{"normalised 2x threshold", NewNormLIF(), 2, 20e-3, 2e-3, 1, 0, 2},
		{"normalised 1.1x threshold", NewNormLIF(), 1.1, 20e-3, 2e-3, 1, 0, 1.1},
		{"physical 0.3 nA", phys, 0.3e-9, 20e-3, 2e-3, -50e-3, -65e-3, -40e-3},
	}
	for _, c := range cases {
		tr, err := Simulate(context.Background(), Problem{Model: c.m, Input: Constant(c.in), Duration: 1}, &Settings{Dt: 1e-4, Every: 100})
		if err != nil {
			t.Fatal(err)
		}
		rise := c.tau * math.Log((c.vinf-c.vr)/(c.vinf-c.vth))
		period := c.tref + rise
		for k, ts := range tr.Spikes {
			// Exact integration: only rounding remains, ~1e-16 s per spike.
			checkNear(t, c.name+" spike time", ts, rise+float64(k)*period, 1e-12, 0)
		}
		// The count is floor((1 − rise)/period) + 1 spikes in 1 s.
		if want := int(math.Floor((1-rise)/period)) + 1; len(tr.Spikes) != want {
			t.Errorf("%s: %d spikes, want %d", c.name, len(tr.Spikes), want)
		}
		checkNear(t, c.name+" rate", 1/period, LIFRate(c.tau, c.tref, c.vth, c.vr, c.vinf), 0, 1e-15)
	}
}

// TestLIFRateLimits checks the common-practice values: τ_m 20 ms, τ_ref 2 ms give
// ≈ 63 Hz at twice threshold (1/(2 ms + 20 ms·ln 2) = 63.05 Hz), 0 below threshold
// and → 1/τ_ref = 500 Hz for large inputs (Dayan & Abbott 2001, ch. 5).
func TestLIFRateLimits(t *testing.T) {
	cases := []struct {
		vin, want, rel float64
	}{
		{2, 63.05, 1e-3},  // rounded to 4 digits
		{0.9, 0, 0},       // subthreshold
		{1e6, 500, 1e-4},  // 1/(τ_ref + τ/v_in) = 499.995 Hz
		{1e12, 500, 1e-9}, // closer still
	}
	for _, c := range cases {
		checkNear(t, "LIF rate", LIFRate(20e-3, 2e-3, 1, 0, c.vin), c.want, 0, c.rel)
	}
}

// TestLIFStepOffGrid checks that a step switched on between grid points gives the
// first spike at on + τ ln((V∞ − E_L)/(V∞ − V_th)) exactly (closed form, Dayan &
// Abbott 2001, ch. 5): the integrator splits its step at the change time.
func TestLIFStepOffGrid(t *testing.T) {
	m := NewLIF()
	on := 0.0123456789
	in := Step{Amp: 0.4e-9, On: on, Off: 1}
	tr, err := Simulate(context.Background(), Problem{Model: m, Input: in, Duration: 0.1}, &Settings{Dt: 1e-3})
	if err != nil {
		t.Fatal(err)
	}
	vinf := m.EL + 0.4e-9/m.GL
	want := on + 20e-3*math.Log((vinf-m.EL)/(vinf-m.VTh))
	checkNear(t, "first spike after off-grid step", tr.Spikes[0], want, 1e-13, 0)
	// Held at V_reset during t_ref: the first grid sample inside the hold.
	k := int(math.Ceil(tr.Spikes[0] / 1e-3))
	if tr.T[k]-tr.Spikes[0] < m.TRef && tr.Data[0][k] != m.VReset {
		t.Errorf("V at %g s = %g during the refractory period, want V_reset %g", tr.T[k], tr.Data[0][k], m.VReset)
	}
}
