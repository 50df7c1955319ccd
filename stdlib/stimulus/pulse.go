package stimulus

import (
	"fmt"
	"math"
)

// PulseTrain is a train of rectangular pulses of height Amplitude and length
// Width. Pulse k (k = 0, 1, …) is on for Start + k·P ≤ t < Start + k·P + Width,
// where the period P is Period, or 1/Rate when Period is 0. Set exactly one of
// Period and Rate. Count is the number of pulses; 0 means an endless train.
type PulseTrain struct {
	Amplitude float64
	Width     float64 // s, 0 < Width < period
	Period    float64 // s; 0 means use Rate
	Rate      float64 // Hz; used when Period is 0
	Count     int     // pulses; 0 = no limit
	Start     float64 // s
}

// period returns the pulse period in seconds.
func (p PulseTrain) period() float64 {
	if p.Period != 0 {
		return p.Period
	}
	return 1 / p.Rate
}

// onset returns the start time of pulse k. Onsets are always computed this way
// so that At and NextChange agree exactly on the edges.
func (p PulseTrain) onset(k, per float64) float64 { return p.Start + k*per }

// index returns the largest k ≥ 0 with onset(k) ≤ t, for t ≥ Start.
func (p PulseTrain) index(t, per float64) float64 {
	k := math.Floor((t - p.Start) / per)
	if k < 0 {
		k = 0
	}
	// The division can round either way; fix up against the onsets themselves.
	for k > 0 && p.onset(k, per) > t {
		k--
	}
	for p.onset(k+1, per) <= t {
		k++
	}
	return k
}

// ended reports whether pulse k is beyond the last one.
func (p PulseTrain) ended(k float64) bool { return p.Count > 0 && k >= float64(p.Count) }

// At returns Amplitude during a pulse and 0 otherwise.
func (p PulseTrain) At(t float64) float64 {
	if t < p.Start {
		return 0
	}
	per := p.period()
	k := p.index(t, per)
	if p.ended(k) || t >= p.onset(k, per)+p.Width {
		return 0
	}
	return p.Amplitude
}

// NextChange returns the next pulse edge after t, or +Inf after the last pulse.
func (p PulseTrain) NextChange(t float64) float64 {
	if t < p.Start {
		return p.Start
	}
	per := p.period()
	k := p.index(t, per)
	if p.ended(k) {
		return math.Inf(1)
	}
	if off := p.onset(k, per) + p.Width; t < off {
		return off
	}
	if p.ended(k + 1) {
		return math.Inf(1)
	}
	return p.onset(k+1, per)
}

// Validate checks the amplitude, a width shorter than the period, exactly one
// of Period and Rate, a non-negative count and a finite start.
func (p PulseTrain) Validate() error {
	if err := finite("pulse train", []string{"amplitude", "width", "period", "rate", "start"},
		p.Amplitude, p.Width, p.Period, p.Rate, p.Start); err != nil {
		return err
	}
	switch {
	case p.Period != 0 && p.Rate != 0:
		return fmt.Errorf("stimulus: pulse train has both period (%g s) and rate (%g Hz); give only one of them", p.Period, p.Rate)
	case p.Period == 0 && p.Rate == 0:
		return fmt.Errorf("stimulus: pulse train needs a period or a rate; set e.g. period 0.1 s or rate 10 Hz")
	case p.Period < 0 || p.Rate < 0:
		return fmt.Errorf("stimulus: pulse train period and rate must be positive, got period %g s, rate %g Hz", p.Period, p.Rate)
	case p.Width <= 0:
		return fmt.Errorf("stimulus: pulse train width must be positive, got %g s; use e.g. 0.001 s", p.Width)
	case p.Width >= p.period():
		return fmt.Errorf("stimulus: pulse train width (%g s) must be shorter than the period (%g s); shorten the pulses or lower the rate", p.Width, p.period())
	case p.Count < 0:
		return fmt.Errorf("stimulus: pulse train count must be ≥ 0 (0 = endless), got %d", p.Count)
	}
	return nil
}

// Describe returns e.g. "5 pulses of 1e-10, 0.002 s wide, every 0.1 s from 0 s".
func (p PulseTrain) Describe() string {
	n := "endless pulses"
	if p.Count > 0 {
		n = fmt.Sprintf("%d pulses", p.Count)
	}
	return fmt.Sprintf("%s of %s, %s s wide, every %s s from %s s", n, g(p.Amplitude), g(p.Width), g(p.period()), g(p.Start))
}

// Params lists amplitude, width, period, rate, count and start; period and rate
// are both shown, one derived from the other.
func (p PulseTrain) Params() []Param {
	per := p.period()
	return []Param{{Name: "amplitude", Value: p.Amplitude}, {Name: "width", Value: p.Width, Unit: "s"},
		{Name: "period", Value: per, Unit: "s"}, {Name: "rate", Value: 1 / per, Unit: "Hz"},
		{Name: "count", Value: float64(p.Count)}, {Name: "start", Value: p.Start, Unit: "s"}}
}
