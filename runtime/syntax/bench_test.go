package syntax

import (
	"fmt"
	"strings"
	"testing"
)

// cell50 is a 50-line cell of arithmetic with units (invented demo values).
var cell50 = func() string {
	var b strings.Builder
	for i := 0; i < 50; i++ {
		switch i % 5 {
		case 0:
			fmt.Fprintf(&b, "v%d = -65 mV + %d.5 mV * (1 - exp(-t / 20 ms))\n", i, i)
		case 1:
			fmt.Fprintf(&b, "i%d = 10 uA/cm^2 * %d / (1 + (v%d / 30 mV)^2)\n", i, i, i-1)
		case 2:
			fmt.Fprintf(&b, "g%d = [1, 2, 3] nS * gain + 0.5 nS # conductances\n", i)
		case 3:
			fmt.Fprintf(&b, "r%d = span(0, 20, by = 0.5) uA/cm^2 in nA/cm^2\n", i)
		default:
			fmt.Fprintf(&b, "k%d = if v%d > -50 mV then 1 s^-1 else 2.5e-3 s^-1\n", i, i-4)
		}
	}
	return b.String()
}()

func BenchmarkParse50(b *testing.B) {
	if _, err := Parse("bench", cell50); err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(len(cell50)))
	b.ReportAllocs()
	for b.Loop() {
		Parse("bench", cell50)
	}
}

func BenchmarkCompleteness50(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		Completeness(cell50)
	}
}

func BenchmarkScan50(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		Scan(cell50)
	}
}
