// Package stimulus builds the input waveforms that drive neuron models: constant,
// step, ramp, sine and pulse-train currents, Ornstein–Uhlenbeck noise, recorded
// (sampled) waveforms, and sums and scalings of any of them.
//
// Values are in whatever unit the caller chooses for the model input, normally
// amperes (A) for a point neuron or A/m² for a current density; times are in
// seconds and frequencies in hertz. Every waveform is a value type with exported
// parameter fields, a Validate method whose errors say how to fix the parameter,
// a one-line Describe and a Params list for display.
//
// All windows are half-open: a waveform switched on at start and off at stop has
// its "on" value for start ≤ t < stop, so it is on at t = start and already off
// at t = stop.
//
// Two interfaces describe what a simulator may ask:
//
//	Input      At(t)          value at time t (s)
//	Piecewise  NextChange(t)  next time > t where the value jumps; +Inf if none
//
// A Piecewise input is piecewise constant: its value is constant on
// [t, NextChange(t)), which lets an integrator with a closed-form solution step
// exactly from one change to the next. Constant, Step, PulseTrain and OU
// implement Piecewise directly. Ramp and Sine vary continuously and do not.
// Sum, Scaled and Sampled are piecewise constant only for some contents (a Sum
// of steps is, a Sum containing a sine is not), so they never implement
// NextChange themselves; AsPiecewise returns a Piecewise view of any input when,
// and only when, it is piecewise constant.
//
// The Ornstein–Uhlenbeck generator uses the exact discrete update of Gillespie
// (1996, Phys. Rev. E 54:2084),
//
//	x[k+1] = μ + (x[k] − μ)·exp(−dt/τ) + σ·sqrt(1 − exp(−2dt/τ))·ξ[k],
//
// with ξ standard normal draws from a PCG generator seeded explicitly, so the
// same seed gives the same values on any machine and any number of cores.
package stimulus
