package neuron_test

import (
	"context"
	"fmt"

	"github.com/loligo-lab/loligo/stdlib/neuron"
)

// A normalised LIF at twice threshold fires at 1/(τ_ref + τ_m ln 2) ≈ 63 Hz.
func ExampleSimulate() {
	tr, err := neuron.Simulate(context.Background(), neuron.Problem{
		Model:    neuron.NewNormLIF(),
		Input:    neuron.Constant(2),
		Duration: 0.1,
	}, &neuron.Settings{Dt: 1e-4})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d spikes, first at %.4f ms\n", len(tr.Spikes), tr.Spikes[0]*1e3)
	// Output: 6 spikes, first at 13.8629 ms
}

// The HH membrane under a 10 µA/cm² step (0.1 A/m²).
func ExampleSimulate_hodgkinHuxley() {
	tr, err := neuron.Simulate(context.Background(), neuron.Problem{
		Model:    neuron.NewHH(),
		Input:    neuron.Step{Amp: 0.1, On: 0.01, Off: 1},
		Duration: 0.05,
	}, &neuron.Settings{Record: []string{"V"}, Every: 10})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("rest %.3f mV, spikes at", tr.Data[0][0]*1e3)
	for _, s := range tr.Spikes {
		fmt.Printf(" %.3f", s*1e3)
	}
	fmt.Println(" ms")
	// Output: rest -64.996 mV, spikes at 11.901 26.823 41.472 ms
}

// An f–I curve of the default LIF over invented amplitudes; the rates are the
// closed form 1/(t_ref + τ_m ln((V∞ − V_reset)/(V∞ − V_th))).
func ExampleSweep() {
	amps := []float64{0.1e-9, 0.3e-9, 0.5e-9}
	r, err := neuron.Sweep(context.Background(), func() neuron.Model { return neuron.NewLIF() }, amps,
		&neuron.SweepSettings{Sim: &neuron.Settings{Dt: 1e-4}})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, a := range amps {
		fmt.Printf("%.1f nA: %.2f Hz\n", a*1e9, r.Rate[i])
	}
	// Output:
	// 0.1 nA: 0.00 Hz
	// 0.3 nA: 41.71 Hz
	// 0.5 nA: 81.86 Hz
}

// The LIF rheobase is g_L (V_th − E_L) = 0.2 nA.
func ExampleRheobase() {
	r, err := neuron.Rheobase(context.Background(), func() neuron.Model { return neuron.NewLIF() }, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("rheobase %.3f nA\n", r.Amplitude*1e9)
	// Output: rheobase 0.200 nA
}

// A population of 3 invented LIF cells with different offsets.
func ExampleSimulatePopulation() {
	cells := []neuron.LIF{*neuron.NewLIF(), *neuron.NewLIF(), *neuron.NewLIF()}
	r, err := neuron.SimulatePopulation(context.Background(), neuron.PopulationProblem{
		Cells: cells, Input: neuron.Constant(0.25e-9), Offset: []float64{0, 0.05e-9, 0.1e-9}, Duration: 1,
	}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, s := range r.Spikes {
		fmt.Printf("cell %d: %d spikes\n", i, len(s))
	}
	// Output:
	// cell 0: 29 spikes
	// cell 1: 41 spikes
	// cell 2: 52 spikes
}
