package neuron

import (
	"context"
	"testing"
)

func TestSmoke(t *testing.T) {
	for _, c := range []struct {
		m   Model
		in  Input
		met Method
	}{
		{NewNormLIF(), Constant(2), Exact}, {NewNormLIF(), Constant(2), RK4}, {NewNormLIF(), Constant(2), DormandPrince54},
		{NewHH(), Step{Amp: 0.1, On: 0.01, Off: 1}, RK4}, {NewHH(), Step{Amp: 0.1, On: 0.01, Off: 1}, ExponentialEuler}, {NewHH(), Step{Amp: 0.1, On: 0.01, Off: 1}, DormandPrince54},
		{NewAdEx(), Constant(1e-9), RK4}, {NewAdEx(), Constant(1e-9), DormandPrince54},
		{&RegularSpiking, Constant(10), RK4}, {&RegularSpiking, Constant(10), DormandPrince54},
	} {
		tr, err := Simulate(context.Background(), Problem{Model: c.m, Input: c.in, Duration: 0.2}, &Settings{Method: c.met})
		if err != nil {
			t.Fatal(err)
		}
		n := len(tr.Spikes)
		t.Logf("%s %v: %d spikes, first %v, steps %d, samples %d, V0 %g", c.m.Name(), c.met, n, tr.Spikes[:min(3, n)], tr.Steps, len(tr.T), tr.Data[0][0])
	}
}
