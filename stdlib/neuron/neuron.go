// Package neuron holds spiking and rate neuron models and the integrators that
// simulate them: single neurons, populations of leaky integrate-and-fire cells,
// amplitude sweeps (f–I curves) and rheobase search.
//
// Units are SI at the package boundary: time in seconds, potentials in volts,
// currents in amperes (A/m² for the membrane-area models), conductances in siemens,
// capacitances in farads. A model whose published equations are in ms and mV converts
// internally and says so in its doc comment.
//
// Models share the Model interface; the simulator treats them alike:
//
//	model      state                 input        spike rule              default method
//	LIF        V                     A            V ≥ V_th → V_reset      Exact
//	NormLIF    v                     1 (v_in)     v ≥ 1 → 0               Exact
//	HH         V, m, h, n            A/m²         upward V_detect crossing RK4
//	AdEx       V, w                  A            V ≥ V_peak → V_r, w += b RK4
//	Izhikevich v, u                  1 (I)        v ≥ 30 mV → c, u += d   RK4
//	Rate       r                     A or 1       none                    RK4
//
// Loligo is a research tool, not for clinical or diagnostic use.
package neuron

import (
	"fmt"
	"math"
)

// Input is an injected current (A, or A/m² for density models) as a function of
// time (s). At must be safe for concurrent calls when an Input is shared by a
// parallel sweep or population.
type Input interface{ At(t float64) float64 }

// Piecewise is implemented by inputs that are constant between change times; the
// exact LIF integrator splits its steps at those times so that it has no step error.
// NextChange returns the first change time strictly after t, or +Inf when none.
type Piecewise interface {
	Input
	NextChange(t float64) float64
}

// Var names one state variable and its SI unit.
type Var struct {
	Name string // short name, e.g. "V"
	Unit string // SI unit, e.g. "V"; "1" when dimensionless
	Doc  string // one sentence
	// Scale is a typical magnitude in Unit; the adaptive integrator's default
	// absolute tolerance for this variable is RTol·Scale.
	Scale float64
}

// Param describes one model parameter for model cards and inspection.
type Param struct {
	Name  string
	Unit  string
	Value float64
	Doc   string
}

// Model is a neuron model the simulator can integrate. State vectors are in the
// units listed by Vars; Deriv writes dy/dt (per second) into dst without modifying
// y; in is the input current at time t.
type Model interface {
	// Name is a short human name such as "Hodgkin–Huxley".
	Name() string
	// Vars lists the state variables in state-vector order.
	Vars() []Var
	// Params lists the parameters with their current values.
	Params() []Param
	// Validate reports a parameter that is non-finite or out of range.
	Validate() error
	// Init writes the initial state into dst (len(dst) == len(Vars())).
	Init(dst []float64)
	// Deriv writes dy/dt into dst. It panics if the slices are shorter than Vars.
	Deriv(dst []float64, t float64, y []float64, in float64)
}

// Resetter is implemented by integrate-and-fire models: a spike is emitted when
// y[0] reaches Peak, after which Reset is applied to the state in place and y[0] is
// held at its reset value for Refractory seconds.
type Resetter interface {
	Model
	Peak() float64
	Reset(y []float64)
	Refractory() float64
}

// InputScaler is implemented by models that know a typical input amplitude; Rheobase
// uses it as its first upper bracket.
type InputScaler interface {
	InputScale() float64
}

// exactLIF is implemented by the two LIF forms so the Exact method can use the
// closed-form update: the membrane relaxes to vinf(in) with time constant tau.
type exactLIF interface {
	Resetter
	lif() (tau, vth, vreset float64, vinf func(in float64) float64)
}

// checkFinite returns an error naming the first non-finite parameter.
func checkFinite(model string, ps []Param) error {
	for _, p := range ps {
		if math.IsNaN(p.Value) || math.IsInf(p.Value, 0) {
			return fmt.Errorf("neuron: %s parameter %s is %v; give a finite value in %s", model, p.Name, p.Value, p.Unit)
		}
	}
	return nil
}

// positive returns an error unless v > 0.
func positive(model, name string, v float64, unit string) error {
	if !(v > 0) {
		return fmt.Errorf("neuron: %s parameter %s must be positive, got %g %s", model, name, v, unit)
	}
	return nil
}

// firstErr returns the first non-nil error.
func firstErr(errs ...error) error {
	for _, e := range errs {
		if e != nil {
			return e
		}
	}
	return nil
}

// Constant is an Input that is the same at all times.
type Constant float64

// At returns the constant.
func (c Constant) At(float64) float64 { return float64(c) }

// NextChange returns +Inf: a constant never changes.
func (c Constant) NextChange(float64) float64 { return math.Inf(1) }

// Step is a rectangular current pulse: Amp from On (s) until Off (s), else Base.
type Step struct {
	Base, Amp float64 // A (or the model's input unit)
	On, Off   float64 // s
}

// At returns the current at time t: Amp for On ≤ t < Off, else Base.
func (s Step) At(t float64) float64 {
	if t >= s.On && t < s.Off {
		return s.Amp
	}
	return s.Base
}

// NextChange returns the first of On, Off strictly after t, or +Inf.
func (s Step) NextChange(t float64) float64 {
	switch {
	case t < s.On:
		return s.On
	case t < s.Off:
		return s.Off
	}
	return math.Inf(1)
}

var (
	_ Piecewise = Constant(0)
	_ Piecewise = Step{}
)
