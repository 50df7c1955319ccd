package neuron

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"
)

// TestBadInput checks that bad problems and settings return errors that say what is
// wrong (no panics), prefixed with the package name.
func TestBadInput(t *testing.T) {
	badLIF := NewLIF()
	badLIF.VReset = -40e-3
	nanHH := NewHH()
	nanHH.GNa = math.NaN()
	negTau := NewNormLIF()
	negTau.Tau = -1
	hotHH := NewHH()
	hotHH.Temp = 400
	cases := []struct {
		name string
		p    Problem
		s    *Settings
		want string
	}{
		{"nil model", Problem{Duration: 1}, nil, "Model is nil"},
		{"negative dt", Problem{Model: NewHH(), Duration: 1}, &Settings{Dt: -1e-4}, "dt must be positive, got -0.1 ms"},
		{"dt above duration", Problem{Model: NewHH(), Duration: 1e-3}, &Settings{Dt: 1e-2}, "exceeds the duration"},
		{"NaN duration", Problem{Model: NewHH(), Duration: math.NaN()}, nil, "duration must be positive and finite"},
		{"infinite duration", Problem{Model: NewHH(), Duration: math.Inf(1)}, nil, "duration must be positive and finite"},
		{"reset above threshold", Problem{Model: badLIF, Duration: 1}, nil, "must lie below threshold"},
		{"NaN conductance", Problem{Model: nanHH, Duration: 1}, nil, "gNa is NaN"},
		{"negative tau", Problem{Model: negTau, Duration: 1}, nil, "tau must be positive"},
		// Squid axon kinetics were measured near 6.3 °C (Hodgkin & Huxley 1952);
		// 400 °C is no temperature of living tissue.
		{"absurd temperature", Problem{Model: hotHH, Duration: 1}, nil, "temperature must lie between 0 and 50 °C, got 400 °C"},
		{"exact for HH", Problem{Model: NewHH(), Duration: 1}, &Settings{Method: Exact}, "Exact method needs a LIF"},
		{"exp Euler for AdEx", Problem{Model: NewAdEx(), Duration: 1}, &Settings{Method: ExponentialEuler}, "no exponential Euler"},
		{"unknown variable", Problem{Model: NewHH(), Duration: 1}, &Settings{Record: []string{"q"}}, `no state variable "q"; the model has V, m, h, n`},
		{"memory limit", Problem{Model: NewHH(), Duration: 1}, &Settings{MaxValues: 1000}, "record every"},
		{"wrong init length", Problem{Model: NewHH(), Duration: 1, Init: []float64{0}}, nil, "Init has 1 values"},
		{"rate without F", Problem{Model: &Rate{Tau: 1e-3}, Duration: 1}, nil, "no activation function"},
		{"diverging HH", Problem{Model: NewHH(), Input: Constant(50), Duration: 0.1}, &Settings{Dt: 1e-3}, "diverged"},
	}
	for _, c := range cases {
		_, err := Simulate(context.Background(), c.p, c.s)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "neuron: ") {
			t.Errorf("%s: err = %v, want one containing %q", c.name, err, c.want)
		}
	}
}

// TestCancel checks that a cancelled context stops a run with ctx.Err() and the
// trace recorded so far.
func TestCancel(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	for _, m := range []Method{RK4, DormandPrince54, ExponentialEuler} {
		tr, err := Simulate(ctx, Problem{Model: NewHH(), Duration: 1}, &Settings{Method: m})
		if !errors.Is(err, context.Canceled) || tr == nil || len(tr.T) != 1 {
			t.Errorf("%v: err %v, trace %v", m, err, tr != nil)
		}
	}
	if _, err := SimulatePopulation(ctx, testPopulation(4), nil); !errors.Is(err, context.Canceled) {
		t.Errorf("population: err %v, want context.Canceled", err)
	}
}

// TestInputsUnchanged checks that Simulate does not modify Problem.Init.
func TestInputsUnchanged(t *testing.T) {
	init := []float64{-0.07, 0.05, 0.6, 0.3}
	keep := append([]float64(nil), init...)
	if _, err := Simulate(context.Background(), Problem{Model: NewHH(), Duration: 1e-3, Init: init}, nil); err != nil {
		t.Fatal(err)
	}
	for i := range init {
		if init[i] != keep[i] {
			t.Fatalf("Init changed: %v, was %v", init, keep)
		}
	}
}

// TestVtrap checks the removable singularity of x/(1 − e^{−x}): its limit 1 at 0
// and the series 1 + x/2 + x²/12 next to it (Taylor expansion, common practice).
func TestVtrap(t *testing.T) {
	cases := []struct{ x, want, rel float64 }{
		{0, 1, 0},
		{1e-8, 1 + 0.5e-8, 1e-15},
		{-1e-7, 1 - 0.5e-7, 1e-15},
		{1e-5, 1e-5 / -math.Expm1(-1e-5), 1e-15},
		{1, 1 / (1 - math.Exp(-1)), 1e-15},
	}
	for _, c := range cases {
		checkNear(t, "vtrap", vtrap(c.x), c.want, 0, c.rel)
	}
	// αm at exactly −40 mV is 1/ms and αn at −55 mV is 0.1/ms (the limits).
	am, _, _, _, _, _ := hhRates(-40)
	_, _, _, _, an, _ := hhRates(-55)
	checkNear(t, "alpha_m(-40 mV)", am, 1, 0, 1e-15)
	checkNear(t, "alpha_n(-55 mV)", an, 0.1, 0, 1e-15)
}

// TestIzhikevichClasses checks every published class name resolves and an unknown
// one fails with the list of names.
func TestIzhikevichClasses(t *testing.T) {
	for name := range IzhikevichClasses {
		if _, err := NewIzhikevich(name); err != nil {
			t.Error(err)
		}
	}
	if _, err := NewIzhikevich("bursting"); err == nil || !strings.Contains(err.Error(), "regular spiking") {
		t.Errorf("err = %v", err)
	}
}
