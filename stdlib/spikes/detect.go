package spikes

import (
	"fmt"
	"math"
)

// DefaultHysteresis is the re-arm margin used when DetectSettings.Hysteresis
// is 0: 5 mV, well above sampling noise of a simulated trace yet far below a
// spike's height (common practice).
const DefaultHysteresis = 0.005

// DetectSettings tunes Detect. A nil *DetectSettings means all defaults.
type DetectSettings struct {
	// Threshold is the crossing level in V; the zero value 0 V is the default.
	Threshold float64
	// Hysteresis in V: after a spike the trace must fall below
	// Threshold − Hysteresis before another crossing counts. 0 means
	// DefaultHysteresis; for almost none, give a tiny value such as 1e-9 V.
	Hysteresis float64
	// Refractory in s is a dead time after each spike in which crossings are
	// ignored even if the trace has re-armed. 0 means none.
	Refractory float64
}

// Detect returns the times of upward threshold crossings of the trace (t, v),
// appended to dst[:0]. A crossing between samples i−1 and i, with
// v[i−1] < θ ≤ v[i], is placed at the linear interpolate
//
//	t[i−1] + (θ − v[i−1])/(v[i] − v[i−1])·(t[i] − t[i−1]).
//
// A trace that starts at or above θ − hysteresis is not armed until it first
// falls below θ − hysteresis, so a trace starting mid-spike is not counted.
// t must be finite and strictly increasing and v finite, of the same length;
// the inputs are not modified.
func Detect(dst, t, v []float64, s *DetectSettings) ([]float64, error) {
	cfg, err := detectConfig(s)
	if err != nil {
		return nil, err
	}
	if err := checkTrace(t, v); err != nil {
		return nil, err
	}
	th, rearm := cfg.Threshold, cfg.Threshold-cfg.Hysteresis
	out := dst[:0]
	armed, last := false, math.Inf(-1)
	for i := range v {
		if v[i] < rearm {
			armed = true
		}
		if !armed || i == 0 || !(v[i-1] < th && v[i] >= th) {
			continue
		}
		tc := t[i-1] + (th-v[i-1])/(v[i]-v[i-1])*(t[i]-t[i-1])
		if tc-last < cfg.Refractory {
			continue
		}
		out = append(out, tc)
		armed, last = false, tc
	}
	return out, nil
}

// detectConfig fills defaults and validates the settings.
func detectConfig(s *DetectSettings) (DetectSettings, error) {
	var c DetectSettings
	if s != nil {
		c = *s
	}
	if c.Hysteresis == 0 {
		c.Hysteresis = DefaultHysteresis
	}
	switch {
	case math.IsNaN(c.Threshold) || math.IsInf(c.Threshold, 0):
		return c, fmt.Errorf("spikes: threshold must be a finite voltage, got %v V; use e.g. 0 V or -0.02 V", c.Threshold)
	case !(c.Hysteresis > 0) || math.IsInf(c.Hysteresis, 1):
		return c, fmt.Errorf("spikes: hysteresis must be positive, got %v V; use e.g. 0.005 V", c.Hysteresis)
	case !(c.Refractory >= 0) || math.IsInf(c.Refractory, 1):
		return c, fmt.Errorf("spikes: refractory period must be ≥ 0, got %v s; use 0 for none or e.g. 0.002 s", c.Refractory)
	}
	return c, nil
}

// checkTrace validates a sampled trace.
func checkTrace(t, v []float64) error {
	if len(t) != len(v) {
		return fmt.Errorf("spikes: trace has %d times but %d voltages; give one voltage per time", len(t), len(v))
	}
	for i := range t {
		if !isFinite(t[i]) || !isFinite(v[i]) {
			return fmt.Errorf("spikes: trace sample %d has time %v s, voltage %v V; every sample must be finite (drop or fill missing samples)", i+1, t[i], v[i])
		}
		if i > 0 && t[i] <= t[i-1] {
			return fmt.Errorf("spikes: trace times must increase strictly, but sample %d (%g s) is not after sample %d (%g s); sort the trace by time", i+1, t[i], i, t[i-1])
		}
	}
	return nil
}

// CheckTrain returns an error unless the spike times are finite and strictly
// increasing.
func CheckTrain(spikes []float64) error {
	for i, s := range spikes {
		if !isFinite(s) {
			return fmt.Errorf("spikes: spike %d has time %v s; spike times must be finite", i+1, s)
		}
		if i > 0 && s <= spikes[i-1] {
			return fmt.Errorf("spikes: spike times must increase strictly, but spike %d (%g s) is not after spike %d (%g s); sort the times and remove repeats", i+1, s, i, spikes[i-1])
		}
	}
	return nil
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
