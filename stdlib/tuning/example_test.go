package tuning_test

import (
	"context"
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/loligo-lab/loligo/stdlib/tuning"
)

func ExampleLIFRate() {
	// τ_ref = 2 ms, τ_m = 20 ms: about 63 Hz at twice the rheobase, 500 Hz
	// in the limit.
	fmt.Printf("%.2f Hz %.2f Hz %.0f Hz\n",
		tuning.LIFRate(2, 0.002, 0.02), tuning.LIFRate(1, 0.002, 0.02), tuning.LIFRate(1e15, 0.002, 0.02))
	// Output: 63.04 Hz 0.00 Hz 500 Hz
}

func ExampleNewLIFCurve() {
	c, err := tuning.NewLIFCurve(0.002, 0.02, -0.055, -0.070, 1e8)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.1f Hz at 300 pA\n", c.Rate(300e-12))
	for _, p := range c.Params() {
		fmt.Printf("%s = %.4g %s\n", p.Name, p.Value, p.Unit)
	}
	// Output:
	// 63.0 Hz at 300 pA
	// tau_ref = 0.002 s
	// tau_m = 0.02 s
	// gain = 6.667e+09 1/A
	// bias = 0
}

func ExampleNewSampled() {
	// Invented demo points, not measurements: an f–I sweep at 0..3 nA.
	s, err := tuning.NewSampled([]float64{0, 1, 2, 3}, []float64{0, 12, 30, 41}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(s.Rate(1.5), s.Rate(5))
	// Output: 21 41
}

func ExampleDecode() {
	p, err := tuning.NewPopulation(30, 1, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	xs, _ := tuning.Span(-1, 1, 101)
	r := mat.NewDense(p.Len(), len(xs), nil)
	if err := p.Responses(context.Background(), r, xs, 0); err != nil {
		fmt.Println(err)
		return
	}
	ro, err := tuning.Decode(tuning.ReadoutProblem{Responses: r, Target: xs}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d decoders, RMS error below 0.05: %v\n", len(ro.Decoders), ro.RMSE < 0.05)
	// Output: 30 decoders, RMS error below 0.05: true
}
