package activation

import (
	"math/rand/v2"
	"testing"
)

// benchInput is 1 M values spread over [−8, 8), seeded for repeatability.
func benchInput() []float64 {
	r := rand.New(rand.NewPCG(1, 2))
	s := make([]float64, 1<<20)
	for i := range s {
		s[i] = 16*r.Float64() - 8
	}
	return s
}

// BenchmarkApply times each slice form over 1 M elements; divide ns/op by
// 1,048,576 for ns/element (also reported as ns/elem).
func BenchmarkApply(b *testing.B) {
	src := benchInput()
	dst := make([]float64, len(src))
	for _, f := range allFuncs(b) {
		b.Run(f.Name(), func(b *testing.B) {
			for b.Loop() {
				f.Apply(dst, src)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(src)), "ns/elem")
		})
		b.Run(f.Name()+"_deriv", func(b *testing.B) {
			for b.Loop() {
				f.ApplyDeriv(dst, src)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(src)), "ns/elem")
		})
	}
}

func BenchmarkSoftmax1000(b *testing.B) {
	src := benchInput()[:1000]
	dst := make([]float64, len(src))
	for b.Loop() {
		if err := Softmax(dst, src, 1); err != nil {
			b.Fatal(err)
		}
	}
}
