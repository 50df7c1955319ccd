package stimulus

import "testing"

var sink float64

func BenchmarkStepAt(b *testing.B) {
	s := Step{Amplitude: 1, Start: 0.1, Stop: 0.6}
	t := 0.0
	for i := 0; i < b.N; i++ {
		sink += s.At(t)
		t += 1e-4
	}
}

func BenchmarkOU1e6(b *testing.B) {
	p := OUParams{Sigma: 1, Tau: 0.005, Dt: 1e-4, Duration: 100, Seed: 1}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		ou, err := NewOU(p)
		if err != nil || ou.Len() != 1_000_000 {
			b.Fatal(err)
		}
	}
}
