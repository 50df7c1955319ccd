package stdlib

import (
	"context"
	"math"
	goruntime "runtime"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/runtime"
)

// evalSpiking runs src in a fresh session and returns the last value.
func evalSpiking(t testing.TB, src string) runtime.Value {
	t.Helper()
	res, err := newTestSession().Execute(context.Background(), "cell", src, discard{})
	if err != nil {
		t.Fatalf("%s: %v", src, err)
	}
	return res.Value
}

// within is the one abs-or-rel tolerance check of these tests.
func within(got, want, abs, rel float64) bool {
	return math.Abs(got-want) <= math.Max(abs, rel*math.Abs(want))
}

// TestSweepIndependentOfCores checks the f–I curve is bit-identical with
// one and two cores (common practice: parallel results must not depend on
// scheduling; each amplitude is written at its own index).
func TestSweepIndependentOfCores(t *testing.T) {
	src := `sweep(hh(), amplitude = span(0, 15, by = 3) uA/cm^2, duration = 200 ms)`
	run := func(procs int) *Curve {
		old := goruntime.GOMAXPROCS(procs)
		defer goruntime.GOMAXPROCS(old)
		return evalSpiking(t, src).(*Curve)
	}
	a, b := run(1), run(2)
	for i := range a.Y {
		if a.Y[i] != b.Y[i] || a.Extra[0].Y[i] != b.Extra[0].Y[i] {
			t.Errorf("amplitude %d: rate %v / %v, first-ISI %v / %v differ between 1 and 2 cores", i, a.Y[i], b.Y[i], a.Extra[0].Y[i], b.Extra[0].Y[i])
		}
	}
}

// TestPopulationIndependentOfCores does the same for a population of
// models run one per goroutine (AdEx) and for the LIF kernel.
func TestPopulationIndependentOfCores(t *testing.T) {
	for _, src := range []string{
		`simulate(adex(b = [0.02, 0.05, 0.08] nA), step(1 nA), duration = 200 ms)`,
		`simulate(lif(tau_m = [10, 15, 20, 25] ms), step(0.4 nA), duration = 200 ms)`,
	} {
		old := goruntime.GOMAXPROCS(1)
		a := evalSpiking(t, src).(*SpikePop)
		goruntime.GOMAXPROCS(2)
		b := evalSpiking(t, src).(*SpikePop)
		goruntime.GOMAXPROCS(old)
		for i := range a.trains {
			if len(a.trains[i]) != len(b.trains[i]) || len(a.trains[i]) == 0 {
				t.Fatalf("%s: neuron %d has %d / %d spikes", src, i, len(a.trains[i]), len(b.trains[i]))
			}
			for k := range a.trains[i] {
				if a.trains[i][k] != b.trains[i][k] {
					t.Errorf("%s: neuron %d spike %d differs", src, i, k)
				}
			}
		}
	}
}

// TestLIFPopulationClosedForm checks each neuron of a LIF population
// against the closed-form rate (Dayan & Abbott 2001, ch. 5).
func TestLIFPopulationClosedForm(t *testing.T) {
	p := evalSpiking(t, `simulate(lif(tau_m = [10, 20, 30] ms), step(0.4 nA), duration = 2000 ms, dt = 0.1 ms)`).(*SpikePop)
	for i, tau := range []float64{0.010, 0.020, 0.030} {
		want := 1 / (0.002 + tau*math.Log(2)) // V∞ − V_reset = 40 mV, V∞ − V_th = 20 mV
		tr := p.trains[i]
		got := float64(len(tr)-1) / (tr[len(tr)-1] - tr[0])
		// 1e-6 relative: crossings are solved in closed form, no grid error.
		if !within(got, want, 0, 1e-6) {
			t.Errorf("tau_m %g s: rate %g Hz, closed form %g Hz", tau, got, want)
		}
	}
}

// TestTraceDisplay checks the trace shows an SVG figure with the voltage
// panel over the stimulus panel, and a summary naming the spikes.
func TestTraceDisplay(t *testing.T) {
	v := evalSpiking(t, `simulate(hh(), step(10 uA/cm^2, start = 5 ms), duration = 50 ms)`)
	bs, err := runtime.Show(v)
	if err != nil {
		t.Fatal(err)
	}
	svg, _ := bs[0].Data["image/svg+xml"].(string)
	for _, want := range []string{"V (mV)", "input (µA/cm^2)", "time (ms)"} {
		if !strings.Contains(svg, want) {
			t.Errorf("figure lacks axis label %q", want)
		}
	}
	if len(bs) != 2 || !strings.Contains(bs[1].PlainText(), "spikes in 50 ms") {
		t.Errorf("want figure and spike summary, got %d bundles: %q", len(bs), bs[len(bs)-1].PlainText())
	}
}

// TestSimulateErrorsLeaveSessionClean checks a failing cell binds nothing.
func TestSimulateErrorsLeaveSessionClean(t *testing.T) {
	s := newTestSession()
	_, err := s.Execute(context.Background(), "cell", `bad = simulate(hh(), step(1 nA), duration = 10 ms)`, discard{})
	if err == nil || !strings.Contains(err.Error(), "current density") {
		t.Fatalf("error %v, want the unit mismatch", err)
	}
	if _, ok := s.Lookup("bad"); ok {
		t.Error("a failed simulate left a binding in the session")
	}
}

// TestSimulateInterrupt checks a cancelled context stops a long run.
func TestSimulateInterrupt(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := newTestSession().Execute(ctx, "cell", `simulate(hh(), step(10 uA/cm^2), duration = 5000 ms, every = 100)`, discard{})
	if err == nil {
		t.Fatal("a cancelled simulation returned no error")
	}
}

func BenchmarkSimulateHH(b *testing.B) {
	s := newTestSession()
	for b.Loop() {
		if _, err := s.Execute(context.Background(), "cell", `simulate(hh(), step(10 uA/cm^2), duration = 1000 ms, every = 10)`, discard{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkSweepHH(b *testing.B) {
	s := newTestSession()
	for b.Loop() {
		if _, err := s.Execute(context.Background(), "cell", `sweep(hh(), amplitude = span(0, 20, n = 21) uA/cm^2, duration = 500 ms)`, discard{}); err != nil {
			b.Fatal(err)
		}
	}
}
