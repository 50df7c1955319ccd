package stimulus_test

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/stdlib/stimulus"
)

// A step of 100 pA is on from 0.1 s (inclusive) to 0.6 s (exclusive).
func ExampleStep() {
	s := stimulus.Step{Amplitude: 100e-12, Start: 0.1, Stop: 0.6}
	fmt.Println(s.Describe())
	fmt.Println(s.At(0.1), s.At(0.6), s.NextChange(0))
	// Output:
	// step 1e-10 from 0.1 s to 0.6 s
	// 1e-10 0 0.1
}

// A sum of steps is piecewise constant, so a simulator can jump between its
// change times.
func ExampleAsPiecewise() {
	in := stimulus.Sum{Parts: []stimulus.Input{
		stimulus.Step{Amplitude: 1, Start: 0.2, Stop: 0.5},
		stimulus.PulseTrain{Amplitude: 2, Width: 0.01, Rate: 10, Count: 2, Start: 0.3},
	}}
	pw, ok := stimulus.AsPiecewise(in)
	fmt.Println(ok)
	for t := 0.0; !math.IsInf(t, 1); t = pw.NextChange(t) {
		fmt.Printf("%.2f s: %g\n", t, pw.At(t))
	}
	// Output:
	// true
	// 0.00 s: 0
	// 0.20 s: 1
	// 0.30 s: 3
	// 0.31 s: 1
	// 0.40 s: 3
	// 0.41 s: 1
	// 0.50 s: 0
}

// OU noise is generated on a grid from an explicit seed.
func ExampleNewOU() {
	ou, err := stimulus.NewOU(stimulus.OUParams{Mean: 0, Sigma: 20e-12, Tau: 0.005, Dt: 0.0001, Duration: 1, Seed: 42})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(ou.Len(), ou.Describe())
	_, err = stimulus.NewOU(stimulus.OUParams{Sigma: 1, Tau: 0, Dt: 0.0001, Duration: 1})
	fmt.Println(err)
	// Output:
	// 10000 OU noise mean 0, sigma 2e-11, tau 0.005 s, dt 0.0001 s, from 0 s to 1 s, seed 42
	// stimulus: OU tau must be positive, got 0 s; use a correlation time such as 0.005 s
}

// Sample evaluates any input on a regular grid.
func ExampleSample() {
	dst := make([]float64, 5)
	stimulus.Sample(dst, stimulus.Ramp{From: 0, To: 1, Start: 0, Stop: 1}, 0, 0.25)
	fmt.Println(dst)
	// Output:
	// [0 0.25 0.5 0.75 0]
}

// A recorded column played back with linear interpolation.
func ExampleSampled() {
	s := stimulus.Sampled{Times: []float64{0, 0.1, 0.2}, Values: []float64{0, 2, 1}}
	fmt.Println(s.Validate(), s.At(0.05), s.At(0.15))
	// Output:
	// <nil> 1 1.5
}
