package activation

import (
	"math"
	"strings"
	"testing"
)

// TestSoftmaxProperties checks properties that follow from the definition
// (common practice): outputs sum to 1, shifting all inputs changes nothing,
// exp(log_softmax) = softmax, and the T → 0 limit is OneHot.
func TestSoftmaxProperties(t *testing.T) {
	t.Parallel()
	inputs := map[string][]float64{
		"large":   {1000, 1001, 1002},
		"huge":    {1e308, -1e308, 0},
		"ties":    {2, 5, 5, 5, -1},
		"neg inf": {math.Inf(-1), 0, 3},
		"single":  {-42},
	}
	for name, src := range inputs {
		for _, temp := range []float64{1e-3, 0.5, 1, 40} {
			p, lp := nanFill(len(src)), nanFill(len(src))
			if err := Softmax(p, src, temp); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			if err := LogSoftmax(lp, src, temp); err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			sum := 0.0
			for i := range p {
				sum += p[i]
				// exp(log p) = p: one exp rounding of a value ≤ 0 with
				// magnitude up to ~1e3 amplifies its ulp: allow 1e-12 rel.
				checkClose(t, name+" exp(log_softmax)", math.Exp(lp[i]), p[i], 1e-300, 1e-12)
			}
			// A sum of n ≤ 5 values in [0, 1]: n ulps.
			checkClose(t, name+" sum", sum, 1, 0, float64(len(p))*ulp)
		}
	}
	// Shift invariance: softmax(z + c) = softmax(z) (the log-sum-exp shift
	// makes the two computations identical up to the rounding of z + c).
	a, b := make([]float64, 3), make([]float64, 3)
	_ = Softmax(a, []float64{0, 1, 2}, 1)
	_ = Softmax(b, []float64{1000, 1001, 1002}, 1)
	for i := range a {
		checkClose(t, "shift invariance", b[i], a[i], 0, 4*ulp)
	}
	// T → 0: softmax approaches the one-hot split over the tied maxima.
	src := []float64{2, 5, 5, 4.999}
	hot, soft := nanFill(4), nanFill(4)
	_ = OneHot(hot, src)
	_ = Softmax(soft, src, 1e-5)
	for i := range hot {
		checkClose(t, "softmax T=1e-5 vs one-hot", soft[i], hot[i], 1e-12, 0)
	}
	checkClose(t, "one-hot tie share", hot[1], 0.5, 0, 0)
}

func TestArgmaxFirstOnTies(t *testing.T) {
	t.Parallel()
	cases := []struct {
		src  []float64
		want int
	}{
		{[]float64{1, 3, 3, 2}, 1},
		{[]float64{-1}, 0},
		{[]float64{math.Inf(-1), math.Inf(-1)}, 0},
		{[]float64{0, math.Inf(1), 5}, 1},
	}
	for _, c := range cases {
		got, err := Argmax(c.src)
		if err != nil || got != c.want {
			t.Errorf("Argmax(%v) = %d, %v; want %d", c.src, got, err, c.want)
		}
	}
}

func TestGroupErrors(t *testing.T) {
	t.Parallel()
	nan, inf := math.NaN(), math.Inf(1)
	cases := []struct {
		name string
		call func() error
		want string
	}{
		{"softmax empty", func() error { return Softmax(nil, nil, 1) }, "empty"},
		{"softmax NaN", func() error { return Softmax(make([]float64, 2), []float64{1, nan}, 1) }, "NaN"},
		{"softmax +Inf", func() error { return Softmax(make([]float64, 2), []float64{1, inf}, 1) }, "+Inf"},
		{"softmax all −Inf", func() error { return Softmax(make([]float64, 2), []float64{-inf, -inf}, 1) }, "−Inf everywhere"},
		{"softmax T = 0", func() error { return Softmax(make([]float64, 1), []float64{1}, 0) }, "temperature"},
		{"softmax T < 0", func() error { return Softmax(make([]float64, 1), []float64{1}, -2) }, "temperature"},
		{"softmax T NaN", func() error { return Softmax(make([]float64, 1), []float64{1}, nan) }, "temperature"},
		{"log_softmax empty", func() error { return LogSoftmax(nil, nil, 1) }, "empty"},
		{"log_softmax NaN", func() error { return LogSoftmax(make([]float64, 1), []float64{nan}, 1) }, "NaN"},
		{"one_hot empty", func() error { return OneHot(nil, nil) }, "empty"},
		{"one_hot NaN", func() error { return OneHot(make([]float64, 1), []float64{nan}) }, "NaN"},
		{"argmax empty", func() error { _, err := Argmax(nil); return err }, "empty"},
		{"argmax NaN", func() error { _, err := Argmax([]float64{0, nan}); return err }, "NaN"},
	}
	for _, c := range cases {
		err := c.call()
		if err == nil || !strings.HasPrefix(err.Error(), "activation: ") || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
	// On error dst is left as it was.
	dst := []float64{7, 7}
	_ = Softmax(dst, []float64{1, nan}, 1)
	if dst[0] != 7 || dst[1] != 7 {
		t.Errorf("dst changed on error: %v", dst)
	}
}
