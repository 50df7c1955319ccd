package activation

import (
	"math"
	"testing"
)

// ulpsApart returns |got − want| in units of the spacing of float64 at want
// (the spacing of the smallest normal for subnormal want).
func ulpsApart(got, want float64) float64 {
	a := math.Max(math.Abs(want), 0x1p-1022)
	return math.Abs(got-want) / (math.Nextafter(a, math.Inf(1)) - a)
}

// TestKernelsDenseSweep measures the kernels of fastmath.go against Go's
// math package (fdlibm algorithms, documented error below 1 ulp) over a
// dense sweep of each domain, plus tanh and softplus against their
// definitions through math.Tanh and math.Log1p. Two sub-ulp errors can
// add to just under 2 ulps of disagreement, and the sigmoids round two or
// three more times, which sets each bound below; the bounds are far
// inside the 4 ulps allowed against SciPy/NumPy in reference_test.go.
func TestKernelsDenseSweep(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name     string
		lo, hi   float64
		got, ref func(float64) float64
		maxUlps  float64
	}{
		// Ends where the tail switches to math.Exp, and the region of
		// rounding near 0 where 2^m·2^(j/64) = 1.
		{"expNonPos vs math.Exp", -708, 0, expNonPos, math.Exp, 2},
		{"expNonPos near 0 vs math.Exp", -1e-3, 0, expNonPos, math.Exp, 2},
		{"log1pUnit vs math.Log1p", 0, 1, log1pUnit, math.Log1p, 2},
		{"log1pUnit tiny vs math.Log1p", 0, 1e-12, log1pUnit, math.Log1p, 2},
		{"tanh vs math.Tanh", -40, 40, tanh, math.Tanh, 3},                  // two more roundings on top of the kernels
		{"tanh near the switch vs math.Tanh", 0.5, 0.8, tanh, math.Tanh, 3}, // two more roundings on top of the kernels
		{"softplus vs z⁺ + log1p(e^(−|z|))", -745, 40,
			func(z float64) float64 { return softplusGain(1, z) },
			func(z float64) float64 { return math.Max(z, 0) + math.Log1p(math.Exp(-math.Abs(z))) }, 3}, // two more roundings on top of the kernels
		{"logistic vs 1/(1+e^(−z)), e^z/(1+e^z) for z < 0", -700, 40, logistic,
			func(z float64) float64 {
				if z < 0 {
					return math.Exp(z) / (1 + math.Exp(z))
				}
				return 1 / (1 + math.Exp(-z))
			}, 3}, // two more roundings on top of the kernels
	}
	const n = 1 << 20
	for _, c := range cases {
		worst, at := 0.0, 0.0
		for i := range n + 1 {
			x := c.lo + (c.hi-c.lo)*float64(i)/n
			if u := ulpsApart(c.got(x), c.ref(x)); u > worst {
				worst, at = u, x
			}
		}
		if worst > c.maxUlps {
			t.Errorf("%s: %.2f ulps at x = %.17g, want ≤ %g", c.name, worst, at, c.maxUlps)
		}
		t.Logf("%s: max %.2f ulps at %.6g", c.name, worst, at)
	}
}

// TestExp2Table checks the table against math.Exp2 (fdlibm-derived,
// below 1 ulp) within 1 ulp, and its exact entries 2^0 = 1 and 2^(32/64)
// = √2 rounded (math.Sqrt is correctly rounded, IEEE 754-2008 §5.4.1).
func TestExp2Table(t *testing.T) {
	t.Parallel()
	for j, v := range exp2Table {
		if u := ulpsApart(v, math.Exp2(float64(j)/64)); u > 1 {
			t.Errorf("exp2Table[%d] = %.17g is %.2f ulps from math.Exp2", j, v, u)
		}
	}
	checkClose(t, "exp2Table[0]", exp2Table[0], 1, 0, 0)
	checkClose(t, "exp2Table[32]", exp2Table[32], math.Sqrt2, 0, 0)
}
