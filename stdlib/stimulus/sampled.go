package stimulus

import (
	"fmt"
	"math"
	"sort"
)

// Interp says how Sampled fills the time between samples.
type Interp int

const (
	// Linear interpolates linearly between neighbouring samples (the default).
	Linear Interp = iota
	// Hold keeps each sample's value until the next sample time.
	Hold
)

// Outside says what Sampled returns outside its time range.
type Outside int

const (
	// Zero makes the waveform 0 before the first sample time and from the last
	// sample time on (the default): the table covers [Times[0], Times[n−1]).
	Zero Outside = iota
	// HoldEnds keeps Values[0] before the first sample time and Values[n−1] from
	// the last sample time on.
	HoldEnds
)

// Sampled is a waveform given by samples, typically a recorded table column.
// Times must be finite and strictly increasing, with at least two samples; the
// slices are read, never modified, and must not be changed while in use.
type Sampled struct {
	Times   []float64 // s
	Values  []float64
	Mode    Interp
	Outside Outside
}

// At returns the sampled value at t, interpolated according to Mode, or the
// Outside value beyond the time range.
func (s Sampled) At(t float64) float64 {
	n := len(s.Times)
	if n == 0 {
		return 0
	}
	if t < s.Times[0] || t >= s.Times[n-1] {
		return s.outside(t)
	}
	i := s.below(t)
	if s.Mode == Hold {
		return s.Values[i]
	}
	t0, t1 := s.Times[i], s.Times[i+1]
	v0, v1 := s.Values[i], s.Values[i+1]
	return v0 + (v1-v0)*((t-t0)/(t1-t0))
}

// outside returns the value beyond the time range.
func (s Sampled) outside(t float64) float64 {
	if s.Outside != HoldEnds {
		return 0
	}
	if t < s.Times[0] {
		return s.Values[0]
	}
	return s.Values[len(s.Values)-1]
}

// below returns the largest i with Times[i] ≤ t, for Times[0] ≤ t.
func (s Sampled) below(t float64) int {
	return sort.Search(len(s.Times), func(i int) bool { return s.Times[i] > t }) - 1
}

// Validate checks lengths, finiteness, strictly increasing times and the modes.
func (s Sampled) Validate() error {
	switch {
	case len(s.Times) != len(s.Values):
		return fmt.Errorf("stimulus: sampled has %d times but %d values; give one value per time", len(s.Times), len(s.Values))
	case len(s.Times) < 2:
		return fmt.Errorf("stimulus: sampled needs at least 2 samples, got %d; use a constant for a single value", len(s.Times))
	case s.Mode != Linear && s.Mode != Hold:
		return fmt.Errorf("stimulus: sampled mode %d is unknown; use Linear or Hold", s.Mode)
	case s.Outside != Zero && s.Outside != HoldEnds:
		return fmt.Errorf("stimulus: sampled outside rule %d is unknown; use Zero or HoldEnds", s.Outside)
	}
	for i, t := range s.Times {
		if math.IsNaN(t) || math.IsInf(t, 0) || math.IsNaN(s.Values[i]) || math.IsInf(s.Values[i], 0) {
			return fmt.Errorf("stimulus: sampled row %d has time %v s, value %v; every time and value must be finite (drop or fill missing rows)", i+1, t, s.Values[i])
		}
		if i > 0 && t <= s.Times[i-1] {
			return fmt.Errorf("stimulus: sampled times must increase strictly, but row %d (%g s) is not after row %d (%g s); sort the table by time and drop repeated times", i+1, t, i, s.Times[i-1])
		}
	}
	return nil
}

// Describe returns e.g. "sampled, 1000 points from 0 s to 1 s, linear, 0 outside".
func (s Sampled) Describe() string {
	if len(s.Times) == 0 {
		return "sampled, no points"
	}
	mode, out := "linear", "0 outside"
	if s.Mode == Hold {
		mode = "hold"
	}
	if s.Outside == HoldEnds {
		out = "end values held outside"
	}
	return fmt.Sprintf("sampled, %d points %s, %s, %s", len(s.Times), span(s.Times[0], s.Times[len(s.Times)-1]), mode, out)
}

// Params lists the number of points and the time range.
func (s Sampled) Params() []Param {
	p := []Param{{Name: "points", Value: float64(len(s.Times))}}
	if n := len(s.Times); n > 0 {
		p = append(p, Param{Name: "start", Value: s.Times[0], Unit: "s"}, Param{Name: "stop", Value: s.Times[n-1], Unit: "s"})
	}
	return p
}

// pwSampled is the Piecewise view of a Sampled in Hold mode.
type pwSampled struct{ s Sampled }

func (p pwSampled) At(t float64) float64 { return p.s.At(t) }

// NextChange returns the next sample time after t, or +Inf from the last on.
func (p pwSampled) NextChange(t float64) float64 {
	ts := p.s.Times
	n := len(ts)
	switch {
	case n == 0 || t >= ts[n-1]:
		return math.Inf(1)
	case t < ts[0]:
		return ts[0]
	}
	return ts[p.s.below(t)+1]
}
