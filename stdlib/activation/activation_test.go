package activation

import (
	"math"
	"strings"
	"testing"
)

// TestDerivativesAgainstFiniteDifferences compares every Deriv with a central
// difference (f(z+h) − f(z−h))/(2h), h = 1e-6·max(1, |z|), away from kinks.
// Truncation error is about h²|f”'|/6 ≲ 1e-12 and rounding about
// ulp·|f|/h ≲ 1e-10·max(1, |f|), so 1e-7 absolute-or-relative is ample
// while still catching a wrong formula (errors of order 1).
func TestDerivativesAgainstFiniteDifferences(t *testing.T) {
	t.Parallel()
	funcs := append(allFuncs(t),
		Logistic{Gain: 3.5}, Tanh{Gain: 0.25}, Arctan{Gain: 7}, Softplus{Gain: 4},
		LeakyReLU{Slope: 0.2}, TwoSlope{Left: -0.5, Right: 2}, ELU{Alpha: 2.5})
	zs := []float64{-30, -4, -1.3, -0.2, 0.05, 0.7, 2, 9, 35}
	for _, f := range funcs {
		for _, z := range zs {
			h := 1e-6 * math.Max(1, math.Abs(z))
			fd := (f.Eval(z+h) - f.Eval(z-h)) / (2 * h)
			checkClose(t, f.Name()+"' at z", f.Deriv(z), fd, 1e-7, 1e-7)
		}
	}
}

// TestSteepLimit shows that as the gain a → ∞ the sigmoids, scaled to the
// threshold's range, converge pointwise to the threshold for z ≠ 0 (common
// practice; the error of the logistic is about e^(−a|z|), of tanh
// 2e^(−2a|z|) and of (2/π)atan about 2/(πa|z|)).
func TestSteepLimit(t *testing.T) {
	t.Parallel()
	zs := []float64{-10, -1, -0.1, -0.01, 0.01, 0.1, 1, 10}
	gains := []float64{1, 10, 100, 1e4, 1e8}
	cases := []struct {
		name  string
		scale func(a, z float64) float64
		step  Func
	}{
		{"logistic → H", func(a, z float64) float64 { return Logistic{a}.Eval(z) }, NewThreshold()},
		{"tanh → sgn", func(a, z float64) float64 { return Tanh{a}.Eval(z) }, SignThreshold{}},
		{"(2/π) atan → sgn", func(a, z float64) float64 { return 2 / math.Pi * Arctan{a}.Eval(z) }, SignThreshold{}},
	}
	for _, c := range cases {
		prev := math.Inf(1)
		for _, a := range gains {
			worst := 0.0
			for _, z := range zs {
				worst = math.Max(worst, math.Abs(c.scale(a, z)-c.step.Eval(z)))
			}
			if worst >= prev && worst > 0 {
				t.Errorf("%s: max error %g at gain %g did not shrink from %g", c.name, worst, a, prev)
			}
			prev = worst
		}
		// At a = 1e8 the slowest (arctan) is within 2/(π·1e8·0.01) ≈ 6.4e-7.
		if prev > 1e-6 {
			t.Errorf("%s: max error %g at gain 1e8, want < 1e-6", c.name, prev)
		}
		// At z = 0 every sigmoid sits at the threshold's default midpoint.
		checkClose(t, c.name+" at 0", c.scale(1e8, 0), c.step.Eval(0), 0, 0)
	}
}

// TestSpecialValues checks NaN propagation, the limits at ±Inf and the
// absence of overflow at ±1e308 for every function (limits: common practice,
// from the definitions).
func TestSpecialValues(t *testing.T) {
	t.Parallel()
	inf := math.Inf(1)
	cases := []struct {
		f                  Func
		atMinusInf, atPlus float64
	}{
		{Logistic{}, 0, 1}, {Tanh{}, -1, 1}, {Arctan{}, -math.Pi / 2, math.Pi / 2},
		{NewThreshold(), 0, 1}, {SignThreshold{}, -1, 1}, {ReLU{}, 0, inf},
		{LeakyReLU{}, -inf, inf}, {TwoSlope{0, 1}, 0, inf}, {TwoSlope{-1, 0}, inf, 0},
		{Softplus{}, 0, inf}, {ELU{Alpha: 2}, -2, inf},
	}
	for _, c := range cases {
		n := c.f.Name()
		if v := c.f.Eval(math.NaN()); !math.IsNaN(v) {
			t.Errorf("%s(NaN) = %v, want NaN", n, v)
		}
		if v := c.f.Deriv(math.NaN()); !math.IsNaN(v) {
			t.Errorf("%s'(NaN) = %v, want NaN", n, v)
		}
		checkClose(t, n+"(−Inf)", c.f.Eval(-inf), c.atMinusInf, 0, 0)
		checkClose(t, n+"(+Inf)", c.f.Eval(inf), c.atPlus, 0, 0)
		for _, z := range []float64{-1e308, -math.MaxFloat64, 1e308, math.MaxFloat64, -inf, inf} {
			if v, d := c.f.Eval(z), c.f.Deriv(z); math.IsNaN(v) || math.IsNaN(d) {
				t.Errorf("%s at %g: value %v, derivative %v; want no NaN", n, z, v, d)
			}
		}
	}
	// Softplus at 1e308 is 1e308 exactly (log1p(e^(−1e308)) = 0), even
	// with a gain whose product with z would overflow.
	checkClose(t, "softplus(1e308)", Softplus{Gain: 10}.Eval(1e308), 1e308, 0, 0)
	checkClose(t, "logistic(−1e308)", Logistic{Gain: 10}.Eval(-1e308), 0, 0, 0)
}

// TestApplyMatchesEval checks the slice forms against the scalar forms,
// writes to every entry, leaves the input untouched and allows aliasing.
func TestApplyMatchesEval(t *testing.T) {
	t.Parallel()
	src := []float64{-1e308, -50, -1, -1e-8, 0, 1e-8, 0.5, 3, 800, math.NaN(), math.Inf(-1)}
	orig := append([]float64(nil), src...)
	for _, f := range allFuncs(t) {
		dst, ddst := nanFill(len(src)), nanFill(len(src))
		f.Apply(dst, src)
		f.ApplyDeriv(ddst, src)
		alias := append([]float64(nil), src...)
		f.Apply(alias, alias)
		for i, z := range src {
			checkClose(t, f.Name()+" Apply", dst[i], f.Eval(z), 0, 0)
			checkClose(t, f.Name()+" ApplyDeriv", ddst[i], f.Deriv(z), 0, 0)
			checkClose(t, f.Name()+" Apply aliased", alias[i], f.Eval(z), 0, 0)
			checkClose(t, "input unchanged", src[i], orig[i], 0, 0)
		}
	}
}

func TestApplyPanicsOnLengthMismatch(t *testing.T) {
	t.Parallel()
	defer func() {
		if r := recover(); r == nil || !strings.Contains(r.(string), "activation:") {
			t.Errorf("recover() = %v, want an activation: panic", r)
		}
	}()
	ReLU{}.Apply(make([]float64, 2), make([]float64, 3))
}

// TestNewFromTable checks the descriptor table: every entry builds at its
// defaults, reports them back and rejects bad names and values.
func TestNewFromTable(t *testing.T) {
	t.Parallel()
	for _, d := range Table {
		f, err := New(d.Name, nil)
		if err != nil || f.Name() != d.Name {
			t.Fatalf("New(%q) = %v, %v", d.Name, f, err)
		}
		ps := f.Params()
		if len(ps) != len(d.Params) {
			t.Fatalf("%s: %d params, descriptor has %d", d.Name, len(ps), len(d.Params))
		}
		for i, p := range ps {
			if p.Name != d.Params[i].Name || p.Value != d.Params[i].Default {
				t.Errorf("%s param %d = %+v, want %s = %g", d.Name, i, p, d.Params[i].Name, d.Params[i].Default)
			}
		}
		if d.Formula == "" || d.Range == "" || d.Source == "" {
			t.Errorf("%s: descriptor lacks formula, range or source", d.Name)
		}
	}
	// Defaults stated in the brief and the docs: leaky slope 0.01 (common
	// practice), threshold midpoint 1/2, sign-threshold 0, ELU α = 1.
	f, _ := New("leaky_relu", nil)
	checkClose(t, "leaky_relu(−2)", f.Eval(-2), -0.02, 0, 0)
	f, _ = New("threshold", nil)
	checkClose(t, "threshold(0)", f.Eval(0), 0.5, 0, 0)
	f, _ = New("logistic", map[string]float64{"gain": 2})
	checkClose(t, "logistic gain 2", f.Eval(1), 1/(1+math.Exp(-2)), 0, 2*ulp)

	bad := []struct {
		name   string
		params map[string]float64
		want   string
	}{
		{"sigmoidal", nil, "unknown function"},
		{"logistic", map[string]float64{"slope": 1}, "no parameter"},
		{"logistic", map[string]float64{"gain": -1}, "must lie in"},
		{"tanh", map[string]float64{"gain": math.Inf(1)}, "must lie in"},
		{"threshold", map[string]float64{"at_zero": 2}, "must lie in"},
		{"elu", map[string]float64{"alpha": math.NaN()}, "must lie in"},
	}
	for _, b := range bad {
		if _, err := New(b.name, b.params); err == nil || !strings.Contains(err.Error(), b.want) ||
			!strings.HasPrefix(err.Error(), "activation: ") {
			t.Errorf("New(%q, %v) error = %v, want one containing %q", b.name, b.params, err, b.want)
		}
	}
	if err := (Logistic{Gain: -3}).Validate(); err == nil {
		t.Error("Logistic{-3}.Validate() = nil, want an error")
	}
}
