// Package tuning provides tuning curves (firing rate as a function of an
// input) and populations of them with a linear readout.
//
// The leaky integrate-and-fire (LIF) neuron driven by a constant input has
// the closed-form rate (Dayan & Abbott 2001, ch. 5)
//
//	r(v) = 1 / (τ_ref − τ_m ln(1 − 1/v))   for v > 1, else 0,
//
// where v = I/I_th is the input in units of the rheobase I_th = (V_th − E_L)/R.
// The rate rises from 0 at v = 1 (with infinite slope) to 1/τ_ref as v → ∞.
// LIFRate evaluates it stably near v = 1 and for huge v; LIFRateDeriv gives
// dr/dv. Times are in seconds and rates in hertz throughout.
//
// A Curve maps an input x to a rate and exposes its parameters (name, value,
// unit) so that a fitter can vary them: RateCurve (an activation function of
// gain·x + bias, times an output scale), LIFCurve (the closed form of
// gain·x + bias) and Sampled (linear interpolation through measured points,
// such as an f–I sweep of a spiking model).
//
// A Population holds N LIF curves over a normalised input x ∈ [−1, 1], each
// with an encoder sign, gain and bias, drawn from stated distributions with
// a seed or given as vectors. Responses fills the N × M response matrix over
// M inputs in parallel (the result does not depend on the number of
// workers), and Decode solves regularised least-squares decoders for a
// target function of the input.
package tuning
