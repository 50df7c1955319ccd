package neuron

import (
	"context"
	"math"
	"reflect"
	"testing"
)

// offsetStep is a step plus a constant offset; piecewise like Step.
type offsetStep struct {
	Step
	off float64
}

func (o offsetStep) At(t float64) float64 { return o.Step.At(t) + o.off }

// testPopulation builds invented cells with spread time constants and offsets.
func testPopulation(n int) PopulationProblem {
	cells := make([]LIF, n)
	off := make([]float64, n)
	for i := range cells {
		c := NewLIF()
		c.C = 200e-12 * (0.5 + float64(i%7)/6) // τ_m from 10 to 30 ms
		c.TRef = 1e-3 * float64(i%3)           // 0, 1, 2 ms
		cells[i] = *c
		off[i] = 0.05e-9 * float64(i%11)
	}
	return PopulationProblem{Cells: cells, Offset: off, Input: Step{Amp: 0.25e-9, On: 0.01234567, Off: 0.3333333}, Duration: 0.4}
}

// TestPopulationMatchesSingle checks the population kernel is identical for 1 and 2
// workers and equal to one exact single-neuron simulation per cell (the same closed
// form, evaluated as V and as V − V∞, so they agree to rounding).
func TestPopulationMatchesSingle(t *testing.T) {
	p := testPopulation(60)
	var res [2]*PopulationResult
	for w := 1; w <= 2; w++ {
		r, err := SimulatePopulation(context.Background(), p, &PopulationSettings{Workers: w, Dt: 1e-4})
		if err != nil {
			t.Fatal(err)
		}
		res[w-1] = r
	}
	if !reflect.DeepEqual(res[0], res[1]) {
		t.Fatal("population differs between 1 and 2 workers")
	}
	total := 0
	for i := range p.Cells {
		c := p.Cells[i]
		in := offsetStep{p.Input.(Step), p.Offset[i]}
		tr, err := Simulate(context.Background(), Problem{Model: &c, Input: in, Duration: p.Duration}, &Settings{Dt: 1e-4, Every: 1000})
		if err != nil {
			t.Fatal(err)
		}
		// Rounding in the two algebraic forms: 1e-12 s is ~1e4 ulp at 0.4 s.
		checkSpikes(t, "population vs single", res[0].Spikes[i], tr.Spikes, 1e-12)
		checkNear(t, "final V", res[0].V[i], tr.Data[0][len(tr.T)-1], 1e-12, 0)
		total += len(tr.Spikes)
	}
	if total == 0 {
		t.Fatal("no spikes in the population test")
	}
}

// TestPopulationSmoothInput checks a non-piecewise input (sampled at step midpoints)
// also gives identical results for 1 and 2 workers.
func TestPopulationSmoothInput(t *testing.T) {
	p := testPopulation(30)
	p.Input = sine{0.4e-9, 10}
	a, err1 := SimulatePopulation(context.Background(), p, &PopulationSettings{Workers: 1})
	b, err2 := SimulatePopulation(context.Background(), p, &PopulationSettings{Workers: 2})
	if err1 != nil || err2 != nil {
		t.Fatal(err1, err2)
	}
	if !reflect.DeepEqual(a, b) {
		t.Fatal("population with smooth input differs between 1 and 2 workers")
	}
}

// sine is a rectified sinusoidal current, amplitude A at frequency f (Hz).
type sine struct{ amp, f float64 }

func (s sine) At(t float64) float64 { return s.amp * math.Max(0, math.Sin(2*math.Pi*s.f*t)) }
