package activation

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

// reference holds testdata/reference.json, written by testdata/gen_reference.py
// with SciPy 1.10.1 and NumPy 1.24.2 (Debian 12 packages; versions are also
// recorded in the file).
type reference struct {
	SciPy, NumPy  string
	Points        []float64
	Logistic      []float64 `json:"logistic"`
	LogisticDeriv []float64 `json:"logistic_deriv"`
	Tanh          []float64 `json:"tanh"`
	Arctan        []float64 `json:"arctan"`
	Softplus      []float64 `json:"softplus"`
	SoftplusDeriv []float64 `json:"softplus_deriv"`
	LogLogistic   []float64 `json:"log_logistic"`
	ExpNegAbs     []float64 `json:"exp_neg_abs"`
	Softmax       map[string]groupCase
	LogSoftmax    map[string]groupCase `json:"log_softmax"`
}

type groupCase struct {
	Input  []float64
	T      float64
	Output []float64
}

func loadReference(t *testing.T) reference {
	t.Helper()
	b, err := os.ReadFile("testdata/reference.json")
	if err != nil {
		t.Fatalf("reading reference values: %v", err)
	}
	var r reference
	if err := json.Unmarshal(b, &r); err != nil {
		t.Fatalf("decoding reference values: %v", err)
	}
	if len(r.Points) == 0 || r.SciPy == "" {
		t.Fatal("reference.json has no points or no SciPy version")
	}
	return r
}

// Tolerances against SciPy/NumPy: both sides are computed in float64 with
// correctly rounded or ≤1-ulp elementary functions (Go's math package and
// glibc's libm) followed by at most three further roundings, so agreement
// within 4 ulps relative is expected. In the subnormal range (|y| < 2.2e-308,
// reached by e^z for z < −708) relative precision is lost on both sides, so
// an absolute 1e-322 (about 20 subnormal spacings) is also allowed.
//
// SciPy 1.10's expit evaluates 1/(1+e^(−z)) and so returns 0 once e^(−z)
// overflows (z < −709.78), although the true value e^z/(1+e^z) is still a
// positive subnormal; the same holds for expit(z)·expit(−z) at |z| ≥ 710.
// At those points the Go values are checked instead against NumPy's
// e^(−|z|), which is the exact logistic tail there because 1 + e^(−|z|)
// rounds to 1 for |z| > 40.
const (
	refRel = 4 * ulp
	refAbs = 1e-322
)

// tailFix replaces reference values that SciPy flushed to zero by NumPy's
// e^(−|z|) (see above). Only points with |z| > 700 are touched.
func tailFix(want, points, expNegAbs []float64) []float64 {
	out := append([]float64(nil), want...)
	for i, z := range points {
		if math.Abs(z) > 700 && out[i] == 0 && expNegAbs[i] > 0 {
			out[i] = expNegAbs[i]
		}
	}
	return out
}

func TestElementwiseAgainstSciPy(t *testing.T) {
	t.Parallel()
	r := loadReference(t)
	sp := Softplus{}
	fix := func(w []float64) []float64 { return tailFix(w, r.Points, r.ExpNegAbs) }
	cases := []struct {
		name string
		f    func(float64) float64
		want []float64
	}{
		{"logistic vs scipy.special.expit", Logistic{}.Eval, fix(r.Logistic)},
		{"logistic' vs expit(z)·expit(−z)", Logistic{}.Deriv, fix(r.LogisticDeriv)},
		{"tanh vs numpy.tanh", Tanh{}.Eval, r.Tanh},
		{"arctan vs numpy.arctan", Arctan{}.Eval, r.Arctan},
		{"softplus vs numpy.logaddexp(0, z)", sp.Eval, r.Softplus},
		{"softplus' vs scipy.special.expit", sp.Deriv, fix(r.SoftplusDeriv)},
		{"−softplus(−z) vs scipy.special.log_expit", func(z float64) float64 { return -sp.Eval(-z) }, r.LogLogistic},
	}
	for _, c := range cases {
		if len(c.want) != len(r.Points) {
			t.Fatalf("%s: %d reference values for %d points", c.name, len(c.want), len(r.Points))
		}
		for i, z := range r.Points {
			got := c.f(z)
			if !within(got, c.want[i], refAbs, refRel) {
				t.Errorf("%s at z = %g: got %.17g, want %.17g", c.name, z, got, c.want[i])
			}
		}
	}
}

func TestGroupAgainstSciPy(t *testing.T) {
	t.Parallel()
	r := loadReference(t)
	run := func(kind string, fn func(dst, src []float64, t float64) error, cases map[string]groupCase) {
		for name, c := range cases {
			dst := nanFill(len(c.Input))
			if err := fn(dst, c.Input, c.T); err != nil {
				t.Errorf("%s %s: %v", kind, name, err)
				continue
			}
			for i := range dst {
				// Softmax outputs are sums of a few exps and one division,
				// as in SciPy's, so the 4-ulp tolerance applies; log-softmax
				// entries near −1000 carry an absolute rounding of about
				// ulp(1000) = 1.1e-13, hence the absolute term of 1e-12.
				if !within(dst[i], c.Output[i], 1e-12*boolF(kind == "log_softmax")+refAbs, refRel) {
					t.Errorf("%s %s[%d] (scipy.special.%s): got %.17g, want %.17g", kind, name, i, kind, dst[i], c.Output[i])
				}
			}
		}
	}
	run("softmax", Softmax, r.Softmax)
	run("log_softmax", LogSoftmax, r.LogSoftmax)
}

func boolF(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

// TestIdentities checks textbook identities at many points.
func TestIdentities(t *testing.T) {
	t.Parallel()
	xs := []float64{1e-300, 1e-8, 0.001, 0.3, 0.9, 1, 1.7, 3, 10, 50, 1e3, 1e10}
	th, at, lg := Tanh{}, Arctan{}, Logistic{}
	for _, x := range xs {
		for _, s := range []float64{1, -1} {
			x := s * x
			// tanh(2x) = 2 tanh x / (1 + tanh² x): Abramowitz & Stegun 1964,
			// ch. 4 (hyperbolic functions), from memory. A few roundings
			// on each side: 8 ulps.
			tx := th.Eval(x)
			checkClose(t, "tanh(2x) double-angle", th.Eval(2*x), 2*tx/(1+tx*tx), 0, 8*ulp)
			// logistic(z) = (1 + tanh(z/2))/2: common practice. For very
			// negative z the right side cancels, so compare absolutely at
			// the ulp of 1.
			checkClose(t, "logistic via tanh", lg.Eval(x), (1+th.Eval(x/2))/2, 4*ulp, 4*ulp)
		}
		// arctan x + arctan(1/x) = π/2 for x > 0: Abramowitz & Stegun
		// 1964, ch. 4 (inverse circular functions), from memory. Two
		// roundings of values ≤ π/2 plus the sum: 4 ulps of π/2.
		checkClose(t, "arctan x + arctan 1/x", at.Eval(x)+at.Eval(1/x), math.Pi/2, 4*ulp*math.Pi/2, 0)
		checkClose(t, "arctan(−x) + arctan(−1/x)", at.Eval(-x)+at.Eval(-1/x), -math.Pi/2, 4*ulp*math.Pi/2, 0)
	}
}
