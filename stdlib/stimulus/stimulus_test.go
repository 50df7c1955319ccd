package stimulus

import (
	"math"
	"strings"
	"testing"
)

// near reports whether got is within abs or rel·|want| of want; NaN matches NaN.
// It is the one tolerance helper of this package's tests.
func near(got, want, abs, rel float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	if got == want {
		return true
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

var inf = math.Inf(1)

// TestEdges checks exact values at and around the edges. The windows are
// half-open [start, stop), the usual convention for sampled signals (common
// practice); values on each side of an edge are exact, so no tolerance.
func TestEdges(t *testing.T) {
	t.Parallel()
	step := Step{Amplitude: 2, Start: 0.1, Stop: 0.6}
	pulses := PulseTrain{Amplitude: 3, Width: 0.002, Period: 0.1, Count: 3, Start: 0.05}
	ramp := Ramp{From: 1, To: 3, Start: 1, Stop: 2}
	below := math.Nextafter
	// Edges are float64 sums (Go constant arithmetic would be exact and differ).
	on0, w, per := 0.05, 0.002, 0.1
	cases := []struct {
		name string
		in   Input
		t    float64
		want float64
	}{
		{"step before start", step, below(0.1, -inf), 0},
		{"step on at start", step, 0.1, 2},
		{"step inside", step, 0.3, 2},
		{"step just before stop", step, below(0.6, -inf), 2},
		{"step off at stop", step, 0.6, 0},
		{"endless step", Step{Amplitude: 1, Start: 0, Stop: inf}, 1e9, 1},
		{"pulse 0 on at onset", pulses, 0.05, 3},
		{"pulse 0 off at onset+width", pulses, on0 + w, 0},
		{"pulse 1 on at its onset", pulses, on0 + 1*per, 3},
		{"pulse 2 on", pulses, on0 + 2*per, 3},
		{"no pulse 3 (count 3)", pulses, on0 + 3*per, 0},
		{"between pulses", pulses, 0.1, 0},
		{"ramp at start is from", ramp, 1, 1},
		{"ramp midpoint", ramp, 1.5, 2},
		{"ramp off at stop", ramp, 2, 0},
		{"ramp before start", ramp, below(1, -inf), 0},
		{"sine off before start", Sine{Amplitude: 1, Frequency: 1, Start: 1, Stop: inf}, 0.5, 0},
		{"constant", Constant{Value: -4}, 123, -4},
	}
	for _, c := range cases {
		if got := c.in.At(c.t); got != c.want {
			t.Errorf("%s: At(%v) = %v, want %v", c.name, c.t, got, c.want)
		}
	}
}

// TestSine checks the sine against sin's known values: sin(π/2) = 1 at a
// quarter period and sin(π) = 0 at half a period (to 1e-15 absolute, the
// rounding of 2π·f·t). The phase shifts the curve by phase/(2πf).
func TestSine(t *testing.T) {
	t.Parallel()
	s := Sine{Amplitude: 2, Frequency: 5, Offset: 1, Start: 0.1, Stop: inf}
	cases := []struct {
		name string
		s    Sine
		t    float64
		want float64
	}{
		{"start is offset", s, 0.1, 1},
		{"quarter period peak", s, 0.1 + 0.05, 3},
		{"half period", s, 0.1 + 0.1, 1},
		{"three quarters trough", s, 0.1 + 0.15, -1},
		{"phase π/2 starts at peak", Sine{Amplitude: 2, Frequency: 5, Phase: math.Pi / 2, Start: 0, Stop: 1}, 0, 2},
	}
	for _, c := range cases {
		if got := c.s.At(c.t); !near(got, c.want, 1e-14, 0) {
			t.Errorf("%s: At(%v) = %v, want %v", c.name, c.t, got, c.want)
		}
	}
}

// chain follows NextChange from t0 until +Inf or max steps.
func chain(p Piecewise, t0 float64, max int) []float64 {
	var out []float64
	for t := t0; len(out) < max; {
		t = p.NextChange(t)
		if math.IsInf(t, 1) {
			break
		}
		out = append(out, t)
	}
	return out
}

// TestNextChange follows the change times of each piecewise type and checks,
// for each interval, that the value really is constant on [t, next) and that
// each reported time is after the one before. The edges are the defining
// times themselves, so they must match exactly.
func TestNextChange(t *testing.T) {
	t.Parallel()
	sum, ok := AsPiecewise(Sum{Parts: []Input{
		Step{Amplitude: 1, Start: 0.2, Stop: 0.5},
		Scaled{Factor: 2, S: Step{Amplitude: 1, Start: 0.3, Stop: 0.4}},
	}})
	if !ok {
		t.Fatal("AsPiecewise(sum of steps) = false, want true")
	}
	held, _ := AsPiecewise(Sampled{Times: []float64{1, 2, 4}, Values: []float64{5, 6, 7}, Mode: Hold})
	tenth := 0.1 // a float64 variable, so that 0.1+0.01 rounds as the code's sum does
	cases := []struct {
		name string
		p    Piecewise
		want []float64
	}{
		{"constant", Constant{Value: 1}, nil},
		{"step", Step{Amplitude: 1, Start: 0.1, Stop: 0.6}, []float64{0.1, 0.6}},
		{"pulses", PulseTrain{Amplitude: 1, Width: 0.01, Rate: 10, Count: 2, Start: 0}, []float64{0, 0.01, 0.1, tenth + 0.01}},
		{"sum of steps", sum, []float64{0.2, 0.3, 0.4, 0.5}},
		{"held samples", held, []float64{1, 2, 4}},
	}
	for _, c := range cases {
		got := chain(c.p, -1, 100)
		if len(got) != len(c.want) {
			t.Errorf("%s: changes %v, want %v", c.name, got, c.want)
			continue
		}
		for i := range got {
			if got[i] != c.want[i] {
				t.Errorf("%s: change %d = %v, want %v", c.name, i, got[i], c.want[i])
			}
		}
		checkConstantBetween(t, c.name, c.p, append([]float64{-1}, got...))
	}
}

// checkConstantBetween checks that p is constant on each [ts[i], next change).
func checkConstantBetween(t *testing.T, name string, p Piecewise, ts []float64) {
	t.Helper()
	for _, a := range ts {
		b := p.NextChange(a)
		if !(b > a) {
			t.Errorf("%s: NextChange(%v) = %v, not after it", name, a, b)
			continue
		}
		end := b
		if math.IsInf(b, 1) {
			end = a + 10
		}
		for _, f := range []float64{0.25, 0.5, 0.75} {
			if u := a + f*(end-a); p.At(u) != p.At(a) {
				t.Errorf("%s: value changes inside [%v, %v): At(%v) = %v, At(%v) = %v", name, a, b, u, p.At(u), a, p.At(a))
			}
		}
		if last := math.Nextafter(end, -inf); !math.IsInf(b, 1) && p.At(last) != p.At(a) {
			t.Errorf("%s: value changes just before %v", name, b)
		}
	}
}

// TestPulseRateEqualsPeriod checks that rate 20 Hz and period 0.05 s describe
// the same train (P = 1/f, SI definition of frequency).
func TestPulseRateEqualsPeriod(t *testing.T) {
	t.Parallel()
	a := PulseTrain{Amplitude: 1, Width: 0.01, Rate: 20, Start: 0.5}
	b := PulseTrain{Amplitude: 1, Width: 0.01, Period: 0.05, Start: 0.5}
	for i := 0; i < 4000; i++ {
		u := 0.5 + float64(i)*0.000731
		if a.At(u) != b.At(u) || a.NextChange(u) != b.NextChange(u) {
			t.Fatalf("rate and period trains differ at t = %v", u)
		}
	}
}

// TestAsPiecewise checks which inputs are piecewise constant. By definition a
// sum is piecewise constant when all its parts are (common practice).
func TestAsPiecewise(t *testing.T) {
	t.Parallel()
	sine := Sine{Amplitude: 1, Frequency: 1, Start: 0, Stop: 1}
	step := Step{Amplitude: 1, Start: 0, Stop: 1}
	cases := []struct {
		name string
		in   Input
		want bool
	}{
		{"step", step, true},
		{"ramp", Ramp{From: 0, To: 1, Start: 0, Stop: 1}, false},
		{"sine", sine, false},
		{"sum with sine", Sum{Parts: []Input{step, sine}}, false},
		{"scaled sine", Scaled{Factor: 2, S: sine}, false},
		{"scaled step", Scaled{Factor: 2, S: step}, true},
		{"empty sum", Sum{}, true},
		{"sampled linear", Sampled{Times: []float64{0, 1}, Values: []float64{0, 1}}, false},
		{"sampled hold", Sampled{Times: []float64{0, 1}, Values: []float64{0, 1}, Mode: Hold}, true},
		{"nil", nil, false},
	}
	for _, c := range cases {
		if _, got := AsPiecewise(c.in); got != c.want {
			t.Errorf("%s: AsPiecewise = %v, want %v", c.name, got, c.want)
		}
	}
}

// TestLinearity checks Sum and Scaled: (k·(a+b))(t) = k·a(t) + k·b(t). The two
// sides round differently, so 4 ulp relative (4.4e-16·4 ≈ 2e-15) is allowed.
func TestLinearity(t *testing.T) {
	t.Parallel()
	a := Sine{Amplitude: 1.3, Frequency: 7, Phase: 0.4, Offset: 0.2, Start: 0, Stop: 2}
	b := Ramp{From: -1, To: 2, Start: 0.5, Stop: 1.5}
	c := PulseTrain{Amplitude: 0.7, Width: 0.003, Rate: 40, Start: 0.01}
	k := -2.5
	lhs := Scaled{Factor: k, S: Sum{Parts: []Input{a, b, c}}}
	rhs := Sum{Parts: []Input{Scaled{Factor: k, S: a}, Scaled{Factor: k, S: b}, Scaled{Factor: k, S: c}}}
	for i := 0; i < 2000; i++ {
		u := float64(i) * 0.00107
		want := k*a.At(u) + k*b.At(u) + k*c.At(u)
		if l, r := lhs.At(u), rhs.At(u); !near(l, want, 1e-15, 2e-15) || !near(r, want, 1e-15, 2e-15) {
			t.Fatalf("t = %v: k(a+b+c) = %v, ka+kb+kc = %v, want %v", u, l, r, want)
		}
	}
}

// TestSampled checks interpolation against hand-computed values: linear
// interpolation halfway between (1, 10) and (3, 30) is 20 (definition).
func TestSampled(t *testing.T) {
	t.Parallel()
	ts, vs := []float64{1, 3, 4}, []float64{10, 30, -2}
	lin := Sampled{Times: ts, Values: vs}
	hold := Sampled{Times: ts, Values: vs, Mode: Hold, Outside: HoldEnds}
	cases := []struct {
		name string
		s    Sampled
		t    float64
		want float64
	}{
		{"linear at sample", lin, 3, 30},
		{"linear halfway", lin, 2, 20},
		{"linear quarter", lin, 3.25, 22},
		{"linear before range is 0", lin, 0.5, 0},
		{"linear at last time is 0 (half-open)", lin, 4, 0},
		{"hold keeps value", hold, 2.9, 10},
		{"hold at sample", hold, 3, 30},
		{"hold ends before", hold, -5, 10},
		{"hold ends after", hold, 9, -2},
	}
	for _, c := range cases {
		if got := c.s.At(c.t); !near(got, c.want, 1e-14, 0) {
			t.Errorf("%s: At(%v) = %v, want %v", c.name, c.t, got, c.want)
		}
	}
	before := append([]float64(nil), ts...)
	_ = lin.Validate()
	for i := range ts {
		if ts[i] != before[i] {
			t.Fatal("Validate modified the input times")
		}
	}
}

// TestValidate checks that every bad parameter is reported with a message
// that names it and says what to do.
func TestValidate(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	cases := []struct {
		name string
		s    interface{ Validate() error }
		want string // "" = valid
	}{
		{"good step", Step{Amplitude: 1, Start: 0, Stop: 1}, ""},
		{"stop before start", Step{Amplitude: 1, Start: 1, Stop: 0.5}, "must be after start"},
		{"nan amplitude", Step{Amplitude: nan, Start: 0, Stop: 1}, "amplitude must be a finite number"},
		{"infinite start", Step{Amplitude: 1, Start: -inf, Stop: 1}, "start must be a finite time"},
		{"endless ramp", Ramp{From: 0, To: 1, Start: 0, Stop: inf}, "ramp stop must be finite"},
		{"negative frequency", Sine{Amplitude: 1, Frequency: -2, Start: 0, Stop: 1}, "frequency must be ≥ 0"},
		{"zero width", PulseTrain{Amplitude: 1, Width: 0, Rate: 10}, "width must be positive"},
		{"width ≥ period", PulseTrain{Amplitude: 1, Width: 0.2, Period: 0.1}, "shorter than the period"},
		{"period and rate", PulseTrain{Amplitude: 1, Width: 0.01, Period: 0.1, Rate: 10}, "give only one"},
		{"no period", PulseTrain{Amplitude: 1, Width: 0.01}, "needs a period or a rate"},
		{"negative count", PulseTrain{Amplitude: 1, Width: 0.01, Rate: 10, Count: -1}, "count must be ≥ 0"},
		{"OU tau 0", OUParams{Sigma: 1, Tau: 0, Dt: 1e-4, Duration: 1}, "tau must be positive"},
		{"OU negative sigma", OUParams{Sigma: -1, Tau: 1, Dt: 1e-4, Duration: 1}, "sigma must be ≥ 0"},
		{"OU zero dt", OUParams{Sigma: 1, Tau: 1, Dt: 0, Duration: 1}, "dt must be positive"},
		{"OU too big", OUParams{Sigma: 1, Tau: 1, Dt: 1e-9, Duration: 100}, "use a larger dt"},
		{"sampled unsorted", Sampled{Times: []float64{0, 2, 1}, Values: []float64{1, 2, 3}}, "row 3 (1 s) is not after row 2"},
		{"sampled lengths", Sampled{Times: []float64{0, 1}, Values: []float64{1}}, "2 times but 1 values"},
		{"sampled one point", Sampled{Times: []float64{0}, Values: []float64{1}}, "at least 2 samples"},
		{"sampled nan", Sampled{Times: []float64{0, 1}, Values: []float64{1, nan}}, "must be finite"},
		{"sum bad part", Sum{Parts: []Input{Step{Amplitude: 1, Start: 2, Stop: 1}}}, "in sum part 1"},
		{"scaled nil", Scaled{Factor: 1}, "no waveform"},
	}
	for _, c := range cases {
		err := c.s.Validate()
		switch {
		case c.want == "" && err != nil:
			t.Errorf("%s: unexpected error %v", c.name, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "stimulus: ")):
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

// TestSample checks Sample against direct calls, writing every entry.
func TestSample(t *testing.T) {
	t.Parallel()
	s := Step{Amplitude: 1, Start: 0.25, Stop: 0.75}
	dst := []float64{math.NaN(), math.NaN(), math.NaN(), math.NaN()}
	Sample(dst, s, 0, 0.25)
	want := []float64{0, 1, 1, 0}
	for i := range dst {
		if dst[i] != want[i] {
			t.Errorf("Sample[%d] = %v, want %v", i, dst[i], want[i])
		}
	}
}

// TestDescribe checks that every type has a one-line description.
func TestDescribe(t *testing.T) {
	t.Parallel()
	ou, err := NewOU(OUParams{Sigma: 1, Tau: 0.01, Dt: 0.001, Duration: 0.01, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []Stimulus{Constant{1}, Step{1, 0, 1}, Ramp{0, 1, 0, 1}, Sine{1, 2, 0, 0, 0, inf},
		PulseTrain{Amplitude: 1, Width: 0.01, Rate: 10, Count: 5}, ou, Sum{Parts: []Input{Constant{1}, Step{1, 0, 1}}},
		Scaled{2, Constant{1}}, Sampled{Times: []float64{0, 1}, Values: []float64{0, 1}}} {
		if d := s.Describe(); d == "" || strings.Contains(d, "\n") || len(s.Params()) == 0 {
			t.Errorf("%T: Describe %q, %d params", s, d, len(s.Params()))
		}
	}
}
