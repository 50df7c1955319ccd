package stimulus

import (
	"fmt"
	"math"
	"strconv"
)

// Input is a waveform: At returns its value at time t in seconds.
type Input interface {
	At(t float64) float64
}

// Piecewise is an Input that is piecewise constant. NextChange returns the next
// time strictly greater than t at which the value may jump, or +Inf if the value
// never changes again; the value is constant on [t, NextChange(t)).
type Piecewise interface {
	Input
	NextChange(t float64) float64
}

// Stimulus is what every waveform of this package provides besides At.
type Stimulus interface {
	Input
	// Validate reports the first invalid parameter, saying how to fix it.
	Validate() error
	// Describe is a one-line human description.
	Describe() string
	// Params lists the parameters for display, in declaration order.
	Params() []Param
}

// Param is one named parameter for display. Unit is an SI symbol ("s", "Hz",
// "rad") or empty for quantities in the waveform's own value unit (A or A/m²,
// chosen by the caller) and for pure numbers. Text, when not empty, is the exact
// display form (used for seeds, which a float64 cannot always hold exactly).
type Param struct {
	Name  string
	Value float64
	Unit  string
	Text  string
}

var (
	_ Piecewise = Constant{}
	_ Piecewise = Step{}
	_ Piecewise = PulseTrain{}
	_ Piecewise = (*OU)(nil)
	_ Stimulus  = Ramp{}
	_ Stimulus  = Sine{}
	_ Stimulus  = Sum{}
	_ Stimulus  = Scaled{}
	_ Stimulus  = Sampled{}
)

// finite returns an error naming the first non-finite value among the pairs
// name, value.
func finite(kind string, names []string, vals ...float64) error {
	for i, v := range vals {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("stimulus: %s %s must be a finite number, got %v; give a real value", kind, names[i], v)
		}
	}
	return nil
}

// window checks a half-open window [start, stop); stop may be +Inf.
func window(kind string, start, stop float64) error {
	if math.IsNaN(start) || math.IsInf(start, 0) {
		return fmt.Errorf("stimulus: %s start must be a finite time, got %v s; use e.g. 0 s", kind, start)
	}
	if math.IsNaN(stop) || math.IsInf(stop, -1) {
		return fmt.Errorf("stimulus: %s stop must be a time or +Inf, got %v s", kind, stop)
	}
	if stop <= start {
		return fmt.Errorf("stimulus: %s stop (%g s) must be after start (%g s); swap them or lengthen the window", kind, stop, start)
	}
	return nil
}

// g formats a number compactly for Describe.
func g(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// span formats a window for Describe.
func span(start, stop float64) string {
	if math.IsInf(stop, 1) {
		return "from " + g(start) + " s on"
	}
	return "from " + g(start) + " s to " + g(stop) + " s"
}

// Constant is a value that never changes.
type Constant struct {
	Value float64
}

// At returns c.Value for every t.
func (c Constant) At(t float64) float64 { return c.Value }

// NextChange returns +Inf: a constant never changes.
func (c Constant) NextChange(t float64) float64 { return math.Inf(1) }

// Validate reports a non-finite value.
func (c Constant) Validate() error { return finite("constant", []string{"value"}, c.Value) }

// Describe returns e.g. "constant 2e-10".
func (c Constant) Describe() string { return "constant " + g(c.Value) }

// Params lists the value.
func (c Constant) Params() []Param { return []Param{{Name: "value", Value: c.Value}} }

// Step has value Amplitude on [Start, Stop) and 0 elsewhere. Stop may be +Inf
// for a step that never switches off.
type Step struct {
	Amplitude   float64
	Start, Stop float64 // s
}

// At returns the amplitude for Start ≤ t < Stop and 0 otherwise.
func (s Step) At(t float64) float64 {
	if t >= s.Start && t < s.Stop {
		return s.Amplitude
	}
	return 0
}

// NextChange returns Start before the step, Stop during it, +Inf after.
func (s Step) NextChange(t float64) float64 {
	switch {
	case t < s.Start:
		return s.Start
	case t < s.Stop:
		return s.Stop
	}
	return math.Inf(1)
}

// Validate checks that the amplitude is finite and Start < Stop.
func (s Step) Validate() error {
	if err := finite("step", []string{"amplitude"}, s.Amplitude); err != nil {
		return err
	}
	return window("step", s.Start, s.Stop)
}

// Describe returns e.g. "step 1e-10 from 0.1 s to 0.6 s".
func (s Step) Describe() string { return "step " + g(s.Amplitude) + " " + span(s.Start, s.Stop) }

// Params lists amplitude, start and stop.
func (s Step) Params() []Param {
	return []Param{{Name: "amplitude", Value: s.Amplitude}, {Name: "start", Value: s.Start, Unit: "s"}, {Name: "stop", Value: s.Stop, Unit: "s"}}
}

// Ramp rises linearly from From at Start towards To at Stop, on [Start, Stop),
// and is 0 outside that window. It varies continuously, so it is not Piecewise.
type Ramp struct {
	From, To    float64
	Start, Stop float64 // s; Stop must be finite
}

// At returns From + (To − From)(t − Start)/(Stop − Start) on [Start, Stop), else 0.
func (r Ramp) At(t float64) float64 {
	if t < r.Start || t >= r.Stop {
		return 0
	}
	f := (t - r.Start) / (r.Stop - r.Start)
	return r.From + (r.To-r.From)*f
}

// Validate checks finite values and a finite window Start < Stop.
func (r Ramp) Validate() error {
	if err := finite("ramp", []string{"from", "to"}, r.From, r.To); err != nil {
		return err
	}
	if math.IsInf(r.Stop, 1) {
		return fmt.Errorf("stimulus: ramp stop must be finite, got +Inf s; a ramp needs an end time to set its slope")
	}
	return window("ramp", r.Start, r.Stop)
}

// Describe returns e.g. "ramp 0 → 5e-10 from 0 s to 1 s".
func (r Ramp) Describe() string {
	return "ramp " + g(r.From) + " → " + g(r.To) + " " + span(r.Start, r.Stop)
}

// Params lists from, to, start and stop.
func (r Ramp) Params() []Param {
	return []Param{{Name: "from", Value: r.From}, {Name: "to", Value: r.To}, {Name: "start", Value: r.Start, Unit: "s"}, {Name: "stop", Value: r.Stop, Unit: "s"}}
}

// Sine is Offset + Amplitude·sin(2π·Frequency·(t − Start) + Phase) on
// [Start, Stop) and 0 outside; Stop may be +Inf. Phase is in radians. It is not
// Piecewise.
type Sine struct {
	Amplitude, Frequency, Phase, Offset float64 // value, Hz, rad, value
	Start, Stop                         float64 // s
}

// At returns the sine value inside the window and 0 outside.
func (s Sine) At(t float64) float64 {
	if t < s.Start || t >= s.Stop {
		return 0
	}
	return s.Offset + s.Amplitude*math.Sin(2*math.Pi*s.Frequency*(t-s.Start)+s.Phase)
}

// Validate checks finite values, Frequency ≥ 0 and Start < Stop.
func (s Sine) Validate() error {
	if err := finite("sine", []string{"amplitude", "frequency", "phase", "offset"}, s.Amplitude, s.Frequency, s.Phase, s.Offset); err != nil {
		return err
	}
	if s.Frequency < 0 {
		return fmt.Errorf("stimulus: sine frequency must be ≥ 0 Hz, got %g Hz; flip the sign of the amplitude or add π to the phase instead", s.Frequency)
	}
	return window("sine", s.Start, s.Stop)
}

// Describe returns e.g. "sine 1e-10 at 5 Hz, phase 0 rad, offset 0 from 0 s on".
func (s Sine) Describe() string {
	return "sine " + g(s.Amplitude) + " at " + g(s.Frequency) + " Hz, phase " + g(s.Phase) + " rad, offset " + g(s.Offset) + " " + span(s.Start, s.Stop)
}

// Params lists amplitude, frequency, phase, offset, start and stop.
func (s Sine) Params() []Param {
	return []Param{{Name: "amplitude", Value: s.Amplitude}, {Name: "frequency", Value: s.Frequency, Unit: "Hz"},
		{Name: "phase", Value: s.Phase, Unit: "rad"}, {Name: "offset", Value: s.Offset},
		{Name: "start", Value: s.Start, Unit: "s"}, {Name: "stop", Value: s.Stop, Unit: "s"}}
}

// Sample fills dst[i] with s.At(t0 + i·dt). It allocates nothing and does not
// validate s; dst may be empty.
func Sample(dst []float64, s Input, t0, dt float64) {
	for i := range dst {
		dst[i] = s.At(t0 + float64(i)*dt)
	}
}
