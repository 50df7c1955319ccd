package neuron

import (
	"context"
	"testing"
)

// TestHHReference checks rest, spike times and sampled V against SciPy solve_ivp
// (testdata/reference.json, DOP853 rtol 1e-10 atol 1e-12).
func TestHHReference(t *testing.T) {
	ref := loadReference(t)
	cases := []struct {
		name string
		set  Settings
		tol  float64 // spike-time tolerance, s
		vtol float64 // sampled-V tolerance, V
	}{
		// RK4 at 0.01 ms: global error ∝ dt⁴, measured 3e-10 s and 6e-8 V (on the
		// upstroke, where dV/dt ≈ 400 V/s); tolerances allow about 10×.
		{"RK4", Settings{Dt: 1e-5, Method: RK4}, 2e-9, 1e-6},
		// DP54 at rtol 1e-9: measured 4e-11 s; the same tolerances.
		{"DP54", Settings{Dt: 1e-5, Method: DormandPrince54, RTol: 1e-9}, 2e-9, 1e-6},
		// Exponential Euler is first order: measured drift 7e-6 s over ten spikes
		// and 7e-5 V; tolerances allow about 3×.
		{"ExpEuler", Settings{Dt: 1e-5, Method: ExponentialEuler}, 2e-5, 5e-4},
	}
	for _, c := range cases {
		for _, r := range ref.HH {
			m := NewHH()
			// Rest is solved to 1e-9 mV; SciPy's brentq ran to xtol 1e-13 mV.
			checkNear(t, "HH rest (V)", m.Rest(), r.Rest*1e-3, 1e-12, 0)
			in := Step{Amp: r.Amp * 0.01, On: r.On * 1e-3, Off: 1}
			set := c.set
			tr, err := Simulate(context.Background(), Problem{Model: m, Input: in, Duration: r.Stop * 1e-3}, &set)
			if err != nil {
				t.Fatal(err)
			}
			checkSpikes(t, c.name+" HH spikes", tr.Spikes, ms(r.Spikes), c.tol)
			for i, ts := range r.Sample {
				k := int(ts/1e-2 + 0.5)
				// Samples on the grid: T[k] = k·dt exactly represents ts within 1e-15 s.
				checkNear(t, c.name+" HH V sample", tr.Data[0][k], r.V[i]*1e-3, c.vtol, 0)
			}
		}
	}
}

// TestResetModelsReference checks AdEx and Izhikevich spike times (events with
// restarts in SciPy solve_ivp, testdata/reference.json).
func TestResetModelsReference(t *testing.T) {
	ref := loadReference(t)
	methods := []struct {
		name string
		set  Settings
		tol  float64
	}{
		// RK4 at 1 µs, crossings located by step bisection: measured ≤ 2e-11 s.
		{"RK4", Settings{Dt: 1e-6, Method: RK4}, 2e-10},
		// DP54 at rtol 1e-10 with dense output: measured ≤ 4e-10 s (AdEx).
		{"DP54", Settings{Dt: 1e-4, Method: DormandPrince54, RTol: 1e-10}, 3e-9},
	}
	for _, meth := range methods {
		for _, r := range ref.AdEx {
			m := NewAdEx()
			m.VPeak = r.VPeak * 1e-3
			run(t, meth.name+" AdEx", m, Constant(r.Amp*1e-12), r.Stop*1e-3, meth.set, ms(r.Spikes), meth.tol)
		}
		for _, r := range ref.Izh {
			m, err := NewIzhikevich(r.Class)
			if err != nil {
				t.Fatal(err)
			}
			if m.A != r.ABCD[0] || m.B != r.ABCD[1] || m.C != r.ABCD[2] || m.D != r.ABCD[3] {
				t.Errorf("%s parameters %v, reference %v (Izhikevich 2003, fig. 2)", r.Class, *m, r.ABCD)
			}
			run(t, meth.name+" Izhikevich "+r.Class, m, Constant(r.I), r.Stop*1e-3, meth.set, ms(r.Spikes), meth.tol)
		}
	}
}

func run(t *testing.T, what string, m Model, in Input, d float64, set Settings, want []float64, tol float64) {
	t.Helper()
	set.Every = 100
	tr, err := Simulate(context.Background(), Problem{Model: m, Input: in, Duration: d}, &set)
	if err != nil {
		t.Fatalf("%s: %v", what, err)
	}
	checkSpikes(t, what, tr.Spikes, want, tol)
}
