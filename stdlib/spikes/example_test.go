package spikes_test

import (
	"fmt"
	"math"

	"github.com/loligo-lab/loligo/stdlib/spikes"
)

// Spikes are found where the trace crosses the threshold upwards; the time is
// interpolated between samples.
func ExampleDetect() {
	t := []float64{0, 0.001, 0.002, 0.003, 0.004, 0.005}
	v := []float64{-0.065, -0.010, 0.030, -0.070, -0.020, 0.020}
	s, err := spikes.Detect(nil, t, v, &spikes.DetectSettings{Threshold: 0})
	fmt.Printf("%.4f %v\n", s, err)
	// Output:
	// [0.0013 0.0045] <nil>
}

// Measures of a spike train; quantities that need more spikes are NaN.
func ExampleCV() {
	train := []float64{0.10, 0.15, 0.22, 0.31, 0.42}
	cv, _ := spikes.CV(train)
	ai, _ := spikes.AdaptationIndex(train)
	rate, _ := spikes.Rate(train, 0, 0.5)
	single, _ := spikes.CV([]float64{0.1})
	fmt.Printf("CV %.3f, adaptation %.3f, rate %g Hz, one spike: %v\n", cv, ai, rate, single)
	_, err := spikes.CV([]float64{0.2, 0.1})
	fmt.Println(err)
	// Output:
	// CV 0.280, adaptation 0.131, rate 10 Hz, one spike: NaN
	// spikes: spike times must increase strictly, but spike 2 (0.1 s) is not after spike 1 (0.2 s); sort the times and remove repeats
}

// A PSTH of three trials in 0.1 s bins.
func ExamplePSTH() {
	trials := [][]float64{{0.05, 0.12}, {0.11, 0.25}, {0.15}}
	r, err := spikes.PSTH(trials, spikes.PSTHSettings{Start: 0, Stop: 0.3, BinWidth: 0.1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for i := range r.Counts {
		fmt.Printf("[%.1f, %.1f) s: %g spikes, %.4g Hz\n", r.Edges[i], r.Edges[i+1], r.Counts[i], r.Rate[i])
	}
	// Output:
	// [0.0, 0.1) s: 1 spikes, 3.333 Hz
	// [0.1, 0.2) s: 3 spikes, 10 Hz
	// [0.2, 0.3) s: 1 spikes, 3.333 Hz
}

// LV separates regular from irregular firing.
func ExampleLV() {
	lv, _ := spikes.LV([]float64{0, 1, 3, 7})
	fmt.Printf("%.4f %v\n", lv, math.IsNaN(must(spikes.LV([]float64{0, 1}))))
	// Output:
	// 0.3333 true
}

func must(v float64, err error) float64 {
	if err != nil {
		panic(err)
	}
	return v
}
