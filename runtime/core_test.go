package runtime

import (
	"context"
	"math"
	"testing"
)

// TestMathBuiltinsAgainstGoMath checks each element-wise builtin against
// the Go standard library's math package (the reference here), and a few
// identities from Abramowitz & Stegun (1964), ch. 4 (common practice).
func TestMathBuiltinsAgainstGoMath(t *testing.T) {
	s := NewSession(NewRegistry())
	eval := func(src string) float64 {
		t.Helper()
		res, err := s.Execute(context.Background(), "t", src, nil)
		if err != nil {
			t.Fatalf("%s: %v", src, err)
		}
		return res.Value.(Quantity).V
	}
	cases := []struct {
		src  string
		want float64
	}{
		{"exp(1.25)", math.Exp(1.25)},
		{"log(7.5)", math.Log(7.5)},
		{"log10(2000)", math.Log10(2000)},
		{"sin(0.3)", math.Sin(0.3)},
		{"cos(0.3)", math.Cos(0.3)},
		{"tan(0.3)", math.Tan(0.3)},
		{"sqrt(2)", math.Sqrt(2)},
		{"abs(-3.5)", 3.5},
		{"floor(-2.5)", -3},
		{"ceil(-2.5)", -2},
		{"round(2.5)", 3}, // math.Round rounds half away from zero
		{"pi", math.Pi},
		// identities: exp(log x) = x; sin² + cos² = 1; log(ab) = log a + log b
		{"exp(log(3.7))", 3.7},
		{"sin(1.1)^2 + cos(1.1)^2", 1},
		{"log(2 * 5) - log(2) - log(5)", 0},
	}
	for _, c := range cases {
		got := eval(c.src)
		// Results go through the same math functions, so they agree to the
		// last bit for direct calls; identities get a few ulps of round-off.
		if math.Abs(got-c.want) > 4e-16*math.Max(1, math.Abs(c.want)) {
			t.Errorf("%s = %.17g, want %.17g", c.src, got, c.want)
		}
	}
}

// TestSumIsCompensated: the sum of 1 and ten million 1e-16 is 1 + 1e-9;
// naive summation loses every small term (Higham, Accuracy and Stability of
// Numerical Algorithms, 2002, §4.3 — from memory).
func TestSumIsCompensated(t *testing.T) {
	xs := make([]float64, 10_000_001)
	xs[0] = 1
	for i := 1; i < len(xs); i++ {
		xs[i] = 1e-16
	}
	if got := sumOf(xs); math.Abs(got-(1+1e-9)) > 1e-15 {
		t.Errorf("sum = %.17g, want 1.000000001", got)
	}
}
