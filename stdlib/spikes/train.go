package spikes

import (
	"fmt"
	"math"
	"sort"
)

// ISIs appends the inter-spike intervals s[i+1] − s[i] (s) to dst[:0]; a train
// of n spikes has n−1 of them (none for fewer than 2 spikes).
func ISIs(dst, spikes []float64) ([]float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return nil, err
	}
	out := dst[:0]
	for i := 1; i < len(spikes); i++ {
		out = append(out, spikes[i]-spikes[i-1])
	}
	return out, nil
}

// InstantRate appends the instantaneous rates 1/ISI (Hz) to dst[:0]; rate i
// belongs to the interval ending at spike i+1.
func InstantRate(dst, spikes []float64) ([]float64, error) {
	out, err := ISIs(dst, spikes)
	for i := range out {
		out[i] = 1 / out[i]
	}
	return out, err
}

// count returns the number of spikes in [a, b) of a sorted train.
func count(spikes []float64, a, b float64) int {
	return sort.SearchFloat64s(spikes, b) - sort.SearchFloat64s(spikes, a)
}

// checkWindow validates a window [a, b).
func checkWindow(a, b float64) error {
	if !isFinite(a) || !isFinite(b) || b <= a {
		return fmt.Errorf("spikes: window [%v s, %v s) is empty or not finite; give finite times with start < stop", a, b)
	}
	return nil
}

// Rate returns the mean firing rate in [a, b): the number of spikes with
// a ≤ s < b divided by b − a, in Hz. A window without spikes has rate 0.
func Rate(spikes []float64, a, b float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if err := checkWindow(a, b); err != nil {
		return math.NaN(), err
	}
	return float64(count(spikes, a, b)) / (b - a), nil
}

// SteadyRate returns the steady firing rate in [a, b): the reciprocal of the
// mean ISI between the spikes in the window, (n − 1)/(s_last − s_first) in Hz,
// which, unlike Rate, does not depend on where the window edges fall between
// spikes. It is NaN with fewer than 2 spikes in the window.
func SteadyRate(spikes []float64, a, b float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if err := checkWindow(a, b); err != nil {
		return math.NaN(), err
	}
	i, j := sort.SearchFloat64s(spikes, a), sort.SearchFloat64s(spikes, b)
	if j-i < 2 {
		return math.NaN(), nil
	}
	return float64(j-i-1) / (spikes[j-1] - spikes[i]), nil
}

// Latency returns the time from onset to the first spike at or after onset, in
// s; NaN if there is none.
func Latency(spikes []float64, onset float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if i := sort.SearchFloat64s(spikes, onset); i < len(spikes) {
		return spikes[i] - onset, nil
	}
	return math.NaN(), nil
}

// FirstISIRate returns 1/(s2 − s1) in Hz for the first two spikes at or after
// onset; NaN if there are fewer than two.
func FirstISIRate(spikes []float64, onset float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if i := sort.SearchFloat64s(spikes, onset); i+1 < len(spikes) {
		return 1 / (spikes[i+1] - spikes[i]), nil
	}
	return math.NaN(), nil
}

// CV returns the coefficient of variation of the ISIs, sd/mean, with the
// population standard deviation sqrt(⟨I²⟩ − ⟨I⟩²) (Dayan & Abbott 2001, ch. 1).
// It is exactly 0 for a periodic train (ISI differences below the rounding
// level of the spike times count as 0, see RoundoffRel), near 1 for a Poisson
// train, and NaN with fewer than 2 spikes.
func CV(spikes []float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	n := len(spikes) - 1
	if n < 1 {
		return math.NaN(), nil
	}
	mean := (spikes[n] - spikes[0]) / float64(n)
	tol := roundoff(spikes)
	ss := 0.0
	for i := 1; i <= n; i++ {
		d := snap(spikes[i]-spikes[i-1]-mean, tol)
		ss += d * d
	}
	return math.Sqrt(ss/float64(n)) / mean, nil
}

// LV returns the local variation of Shinomoto, Shima & Tanji (2003, Neural
// Comput. 15:2823),
//
//	LV = 3/(n−1) · Σ_{i=1}^{n−1} ((I_i − I_{i+1})/(I_i + I_{i+1}))²
//
// over the n ISIs: exactly 0 for a periodic train (see RoundoffRel), 1 for a
// Poisson train, and NaN with fewer than 3 spikes.
func LV(spikes []float64) (float64, error) {
	return pairMean(spikes, func(a, b float64) float64 {
		r := (a - b) / (a + b)
		return 3 * r * r
	})
}

// AdaptationIndex returns the mean over consecutive ISI pairs of
// (I_{k+1} − I_k)/(I_{k+1} + I_k): positive when the train slows down, exactly
// 0 for a periodic train (see RoundoffRel), NaN with fewer than 3 spikes. This
// normalised form is common practice in electrophysiology feature sets (stated
// from memory).
func AdaptationIndex(spikes []float64) (float64, error) {
	return pairMean(spikes, func(a, b float64) float64 { return (b - a) / (b + a) })
}

// pairMean averages f(I_k, I_{k+1}) over consecutive ISI pairs.
func pairMean(spikes []float64, f func(a, b float64) float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if len(spikes) < 3 {
		return math.NaN(), nil
	}
	tol := roundoff(spikes)
	sum := 0.0
	for i := 2; i < len(spikes); i++ {
		a, b := spikes[i-1]-spikes[i-2], spikes[i]-spikes[i-1]
		if snap(b-a, tol) == 0 {
			continue // equal ISIs: every pair measure here is 0
		}
		sum += f(a, b)
	}
	return sum / float64(len(spikes)-2), nil
}

// RoundoffRel is the relative level, 1e-12 of the largest spike time, below
// which CV, LV and AdaptationIndex treat a difference of ISIs as 0. An ISI is
// a difference of two spike times and carries their rounding, about 1e-16 of
// their size for times held as float64 and more for times that come out of an
// integrator; without the snap a periodic train from a simulation shows a CV
// of 1e-15 instead of 0. 1e-12 lies four orders above float64 rounding
// (2.2e-16) and far below any timing a recording resolves: a train of 1000 s
// snaps only differences under 1 ns.
const RoundoffRel = 1e-12

// roundoff returns the absolute level (s) below which an ISI difference of a
// sorted train is rounding: RoundoffRel times the largest |spike time|.
func roundoff(spikes []float64) float64 {
	return RoundoffRel * math.Max(math.Abs(spikes[0]), math.Abs(spikes[len(spikes)-1]))
}

// snap returns 0 for |x| ≤ tol and x otherwise.
func snap(x, tol float64) float64 {
	if math.Abs(x) <= tol {
		return 0
	}
	return x
}

// Fano returns the Fano factor of spike counts in consecutive windows of the
// given width (s) tiling [a, b): the sample variance (1/(K−1)) of the K counts
// over their mean. Only whole windows are used (K = floor((b−a)/width), a
// ratio within 1e-9 of a whole number counts as that number). It is 1 for a
// Poisson process (Dayan & Abbott 2001, ch. 1) and NaN if K < 2 or no window
// holds a spike.
func Fano(spikes []float64, a, b, width float64) (float64, error) {
	if err := CheckTrain(spikes); err != nil {
		return math.NaN(), err
	}
	if err := checkWindow(a, b); err != nil {
		return math.NaN(), err
	}
	if !(width > 0) || math.IsInf(width, 1) {
		return math.NaN(), fmt.Errorf("spikes: Fano window width must be positive, got %v s; use e.g. 0.1 s", width)
	}
	k := wholeBins((b-a)/width, false)
	if k < 2 {
		return math.NaN(), nil
	}
	var s1, s2 float64
	for j := 0; j < k; j++ {
		c := float64(count(spikes, a+float64(j)*width, a+float64(j+1)*width))
		s1 += c
		s2 += c * c
	}
	mean := s1 / float64(k)
	if mean == 0 {
		return math.NaN(), nil
	}
	v := (s2 - s1*mean) / float64(k-1)
	return v / mean, nil
}

// wholeBins returns the number of whole bins in a ratio r, treating a ratio
// within 1e-9·r of an integer as that integer; with ceil it rounds up instead
// of down.
func wholeBins(r float64, ceil bool) int {
	if n := math.Round(r); math.Abs(r-n) <= 1e-9*r {
		return int(n)
	}
	if ceil {
		return int(math.Ceil(r))
	}
	return int(math.Floor(r))
}
