package neuron

import (
	"context"
	"testing"
)

func benchHH(b *testing.B, m Method) {
	p := Problem{Model: NewHH(), Input: Step{Amp: 0.1, On: 0.01, Off: 1}, Duration: 1}
	s := &Settings{Dt: 1e-5, Method: m, Record: []string{"V"}}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Simulate(context.Background(), p, s); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkHHRK4 is 1 s of HH at dt 0.01 ms (100,000 steps) recording V.
func BenchmarkHHRK4(b *testing.B) { benchHH(b, RK4) }

// BenchmarkHHExpEuler is the same run with exponential Euler.
func BenchmarkHHExpEuler(b *testing.B) { benchHH(b, ExponentialEuler) }

// BenchmarkHHDP54 is the same run with the adaptive method at rtol 1e-6.
func BenchmarkHHDP54(b *testing.B) { benchHH(b, DormandPrince54) }

func benchPop(b *testing.B, workers int) {
	p := testPopulation(10000)
	p.Duration = 1
	p.Input = Constant(0.25e-9)
	s := &PopulationSettings{Dt: 1e-4, Workers: workers}
	for b.Loop() {
		if _, err := SimulatePopulation(context.Background(), p, s); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)*1e8/b.Elapsed().Seconds()/1e6, "Mneuron-steps/s")
}

// BenchmarkPopulation1 is 10,000 LIF cells × 1 s at 0.1 ms on one worker.
func BenchmarkPopulation1(b *testing.B) { benchPop(b, 1) }

// BenchmarkPopulation2 is the same on two workers.
func BenchmarkPopulation2(b *testing.B) { benchPop(b, 2) }

func benchSweep(b *testing.B, workers int) {
	amps := make([]float64, 41)
	for i := range amps {
		amps[i] = 0.002 * float64(i) // 0 to 8 µA/cm² in A/m²
	}
	s := &SweepSettings{Workers: workers, Length: 1}
	for b.Loop() {
		if _, err := Sweep(context.Background(), hhFactory, amps, s); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSweepHH1 is 41 HH amplitudes × 1 s on one worker.
func BenchmarkSweepHH1(b *testing.B) { benchSweep(b, 1) }

// BenchmarkSweepHH2 is the same on two workers.
func BenchmarkSweepHH2(b *testing.B) { benchSweep(b, 2) }
