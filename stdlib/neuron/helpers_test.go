package neuron

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

// near reports whether got is within abs or rel·|want| of want (either suffices).
func near(got, want, abs, rel float64) bool {
	if math.IsInf(want, 0) || math.IsNaN(want) {
		return got == want || (math.IsNaN(got) && math.IsNaN(want))
	}
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

// checkNear fails the test when got and want differ beyond the tolerance.
func checkNear(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !near(got, want, abs, rel) {
		t.Errorf("%s = %.15g, want %.15g (diff %.3g, abs %.1g, rel %.1g)", what, got, want, got-want, abs, rel)
	}
}

// checkSpikes compares two spike trains time by time.
func checkSpikes(t *testing.T, what string, got, want []float64, abs float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d spikes, want %d (got %v, want %v)", what, len(got), len(want), got, want)
	}
	for i := range got {
		checkNear(t, what, got[i], want[i], abs, 0)
	}
}

// reference is testdata/reference.json, written by testdata/gen_reference.py with
// SciPy 1.10.1 / NumPy 1.24.2 solve_ivp (DOP853, rtol 1e-10, atol 1e-12).
type reference struct {
	Scipy string `json:"scipy"`
	HH    []struct {
		Rest   float64   `json:"rest_mV"`
		Amp    float64   `json:"amp_uA_per_cm2"`
		On     float64   `json:"on_ms"`
		Stop   float64   `json:"stop_ms"`
		Spikes []float64 `json:"spikes_ms"`
		Sample []float64 `json:"sample_ms"`
		V      []float64 `json:"V_mV"`
	} `json:"hh"`
	AdEx []struct {
		VPeak  float64   `json:"vpeak_mV"`
		Amp    float64   `json:"amp_pA"`
		Stop   float64   `json:"stop_ms"`
		Spikes []float64 `json:"spikes_ms"`
	} `json:"adex"`
	Izh []struct {
		Class  string    `json:"class"`
		ABCD   []float64 `json:"abcd"`
		I      float64   `json:"I"`
		Stop   float64   `json:"stop_ms"`
		Spikes []float64 `json:"spikes_ms"`
	} `json:"izhikevich"`
}

func loadReference(t *testing.T) *reference {
	t.Helper()
	b, err := os.ReadFile("testdata/reference.json")
	if err != nil {
		t.Fatal(err)
	}
	var r reference
	if err := json.Unmarshal(b, &r); err != nil {
		t.Fatal(err)
	}
	return &r
}

// ms converts a slice of milliseconds to seconds.
func ms(v []float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = x * 1e-3
	}
	return out
}
