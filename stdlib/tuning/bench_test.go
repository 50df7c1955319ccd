package tuning

import (
	"context"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// BenchmarkResponses1000x1000 fills a 1,000-neuron × 1,000-input matrix.
func BenchmarkResponses1000x1000(b *testing.B) {
	p, err := NewPopulation(1000, 1, nil)
	if err != nil {
		b.Fatal(err)
	}
	xs, _ := Span(-1, 1, 1000)
	r := mat.NewDense(1000, 1000, nil)
	for b.Loop() {
		if err := p.Responses(context.Background(), r, xs, 0); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/1e6, "ns/elem")
}

// BenchmarkDecode200x500 solves the ridge readout for 200 neurons at 500
// inputs.
func BenchmarkDecode200x500(b *testing.B) {
	p, _ := NewPopulation(200, 1, nil)
	xs, _ := Span(-1, 1, 500)
	r := mat.NewDense(200, 500, nil)
	_ = p.Responses(context.Background(), r, xs, 0)
	for b.Loop() {
		if _, err := Decode(ReadoutProblem{r, xs}, nil); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkLIFRate(b *testing.B) {
	s := 0.0
	for i := 0; b.Loop(); i++ {
		s += LIFRate(1+float64(i&1023)*0.01, 0.002, 0.02)
	}
	_ = s
}
