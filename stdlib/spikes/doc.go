// Package spikes finds spikes in sampled voltage traces and measures spike
// trains. Times are in seconds, rates in hertz, voltages in volts.
//
// A spike train is a slice of spike times, finite and strictly increasing;
// functions that take one return an error for anything else, so a mistake in
// the data is reported rather than measured. Quantities that need more spikes
// than the train has (an ISI needs two spikes, an adaptation index three) are
// NaN, never an error: NaN means "not defined for this train" and propagates
// through averages, while errors are kept for bad input.
//
//	quantity            needs            definition
//	ISIs                2 spikes         s[i+1] − s[i]
//	CV                  2 spikes         sd(ISI)/mean(ISI), sd with 1/n
//	LV                  3 spikes         3/(n−1)·Σ((I[i]−I[i+1])/(I[i]+I[i+1]))²
//	AdaptationIndex     3 spikes         mean of (I[k+1]−I[k])/(I[k+1]+I[k])
//	Rate                a window         spikes in [a, b) / (b − a)
//	SteadyRate          2 in the window  1/mean ISI of the spikes in [a, b)
//	FirstISIRate        2 after onset    1/(first ISI after the onset)
//	Latency             1 after onset    first spike at or after onset − onset
//	Fano                2 windows        var/mean of counts in windows
//
// LV is from Shinomoto, Shima & Tanji (2003, Neural Comput. 15:2823); CV and
// the Fano factor as in Dayan & Abbott (2001, Theoretical Neuroscience, ch. 1).
//
// Detect finds upward threshold crossings in a sampled trace, interpolates
// each crossing time linearly between the two samples around it, and re-arms
// only after the trace falls below threshold − hysteresis. PSTH bins many
// trains into a rate histogram with optional Gaussian smoothing.
package spikes
