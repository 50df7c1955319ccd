package stimulus

import (
	"fmt"
	"math"
	"strings"
)

// Sum adds its parts. It is never Piecewise itself, because it may hold parts
// that vary continuously; AsPiecewise gives a Piecewise view when every part is
// piecewise constant. An empty Sum is 0.
type Sum struct {
	Parts []Input
}

// At returns the sum of the parts at t.
func (s Sum) At(t float64) float64 {
	v := 0.0
	for _, p := range s.Parts {
		v += p.At(t)
	}
	return v
}

// Validate checks that no part is nil and validates every part that can be.
func (s Sum) Validate() error {
	for i, p := range s.Parts {
		if p == nil {
			return fmt.Errorf("stimulus: sum part %d is missing; remove it or give a waveform", i+1)
		}
		if v, ok := p.(interface{ Validate() error }); ok {
			if err := v.Validate(); err != nil {
				return fmt.Errorf("%w (in sum part %d)", err, i+1)
			}
		}
	}
	return nil
}

// Describe joins the parts' descriptions with " + ".
func (s Sum) Describe() string {
	if len(s.Parts) == 0 {
		return "sum of nothing (0)"
	}
	d := make([]string, len(s.Parts))
	for i, p := range s.Parts {
		d[i] = describe(p)
	}
	return strings.Join(d, " + ")
}

// Params lists the number of parts; each part lists its own.
func (s Sum) Params() []Param { return []Param{{Name: "parts", Value: float64(len(s.Parts))}} }

// Scaled multiplies a waveform by a constant factor. Like Sum it is not
// Piecewise itself; use AsPiecewise.
type Scaled struct {
	Factor float64
	S      Input
}

// At returns Factor·S.At(t).
func (s Scaled) At(t float64) float64 { return s.Factor * s.S.At(t) }

// Validate checks a finite factor and a valid inner waveform.
func (s Scaled) Validate() error {
	if err := finite("scaled", []string{"factor"}, s.Factor); err != nil {
		return err
	}
	if s.S == nil {
		return fmt.Errorf("stimulus: scaled has no waveform to scale; give one")
	}
	if v, ok := s.S.(interface{ Validate() error }); ok {
		return v.Validate()
	}
	return nil
}

// Describe returns e.g. "2 × (step 1 from 0 s to 1 s)".
func (s Scaled) Describe() string { return g(s.Factor) + " × (" + describe(s.S) + ")" }

// Params lists the factor.
func (s Scaled) Params() []Param { return []Param{{Name: "factor", Value: s.Factor}} }

// describe uses Describe when the input has one.
func describe(in Input) string {
	if d, ok := in.(interface{ Describe() string }); ok {
		return d.Describe()
	}
	return fmt.Sprintf("%T", in)
}

// AsPiecewise returns a Piecewise view of in and true when in is piecewise
// constant: a type implementing Piecewise itself, a Sum all of whose parts are
// piecewise constant, a Scaled of a piecewise constant input, or a Sampled in
// Hold mode. Otherwise it returns nil, false. The view shares in's parameters.
func AsPiecewise(in Input) (Piecewise, bool) {
	switch v := in.(type) {
	case nil:
		return nil, false
	case Sum:
		parts := make([]Piecewise, len(v.Parts))
		for i, p := range v.Parts {
			pw, ok := AsPiecewise(p)
			if !ok {
				return nil, false
			}
			parts[i] = pw
		}
		return pwSum{parts}, true
	case Scaled:
		pw, ok := AsPiecewise(v.S)
		if !ok {
			return nil, false
		}
		return pwScaled{v.Factor, pw}, true
	case Sampled:
		if v.Mode != Hold {
			return nil, false
		}
		return pwSampled{v}, true
	case Piecewise:
		return v, true
	}
	return nil, false
}

// pwSum is the Piecewise view of a Sum.
type pwSum struct{ parts []Piecewise }

func (s pwSum) At(t float64) float64 {
	v := 0.0
	for _, p := range s.parts {
		v += p.At(t)
	}
	return v
}

// NextChange is the earliest change among the parts.
func (s pwSum) NextChange(t float64) float64 {
	next := math.Inf(1)
	for _, p := range s.parts {
		next = math.Min(next, p.NextChange(t))
	}
	return next
}

// pwScaled is the Piecewise view of a Scaled.
type pwScaled struct {
	k float64
	s Piecewise
}

func (s pwScaled) At(t float64) float64         { return s.k * s.s.At(t) }
func (s pwScaled) NextChange(t float64) float64 { return s.s.NextChange(t) }
