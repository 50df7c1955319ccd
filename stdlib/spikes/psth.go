package spikes

import (
	"context"
	"fmt"
	"math"
)

// MaxBins bounds the number of PSTH bins, so that a mistyped bin width fails at
// once with a message instead of exhausting memory.
const MaxBins = 10_000_000

// PSTHSettings describes the bins of a PSTH.
type PSTHSettings struct {
	Start, Stop float64 // s; spikes in [Start, Stop) are counted
	// BinWidth in s; Stop − Start must be a whole number of bins (to 1e-9).
	BinWidth float64
	// Smooth is the standard deviation σ in s of a Gaussian kernel applied to
	// the rate; 0 means no smoothing. The kernel is sampled at the bin centres,
	// cut at ±4σ and renormalised near the ends so a flat rate stays flat.
	Smooth float64
}

// PSTHResult is a peri-stimulus time histogram.
type PSTHResult struct {
	Edges  []float64 // bin edges in s, len(Counts)+1; bin i is [Edges[i], Edges[i+1])
	Counts []float64 // spikes of all trains in each bin
	Rate   []float64 // Hz: Counts/(trains·BinWidth), smoothed if Smooth > 0
	Trains int       // number of trains
}

// PSTH bins the spikes of many trains (trials) and returns counts and the mean
// rate per train in Hz; see PSTHContext.
func PSTH(trains [][]float64, s PSTHSettings) (*PSTHResult, error) {
	return PSTHContext(context.Background(), trains, s)
}

// PSTHContext is PSTH with cancellation, checked between trains. Each train
// must be finite and strictly increasing; the trains are not modified.
func PSTHContext(ctx context.Context, trains [][]float64, s PSTHSettings) (*PSTHResult, error) {
	n, err := s.bins()
	if err != nil {
		return nil, err
	}
	if len(trains) == 0 {
		return nil, fmt.Errorf("spikes: PSTH needs at least one spike train; give a list of trains (an empty train is fine)")
	}
	r := &PSTHResult{Edges: make([]float64, n+1), Counts: make([]float64, n), Rate: make([]float64, n), Trains: len(trains)}
	for i := range r.Edges {
		r.Edges[i] = s.Start + float64(i)*s.BinWidth
	}
	for j, tr := range trains {
		if err := ctx.Err(); err != nil {
			return nil, fmt.Errorf("spikes: PSTH stopped at train %d of %d: %w", j+1, len(trains), err)
		}
		if err := CheckTrain(tr); err != nil {
			return nil, fmt.Errorf("%w (in train %d)", err, j+1)
		}
		r.binTrain(tr)
	}
	norm := 1 / (float64(len(trains)) * s.BinWidth)
	for i, c := range r.Counts {
		r.Rate[i] = c * norm
	}
	if s.Smooth > 0 {
		r.Rate = smooth(r.Rate, s.Smooth/s.BinWidth)
	}
	return r, nil
}

// bins validates the settings and returns the number of bins.
func (s PSTHSettings) bins() (int, error) {
	if err := checkWindow(s.Start, s.Stop); err != nil {
		return 0, err
	}
	if !(s.BinWidth > 0) || math.IsInf(s.BinWidth, 1) {
		return 0, fmt.Errorf("spikes: PSTH bin width must be positive, got %v s; use e.g. 0.005 s", s.BinWidth)
	}
	if !(s.Smooth >= 0) || math.IsInf(s.Smooth, 1) {
		return 0, fmt.Errorf("spikes: PSTH smoothing σ must be ≥ 0, got %v s; use 0 for none or e.g. 0.01 s", s.Smooth)
	}
	r := (s.Stop - s.Start) / s.BinWidth
	if r > MaxBins {
		return 0, fmt.Errorf("spikes: PSTH would have %.3g bins, more than the limit of %d; use wider bins or a shorter window", r, MaxBins)
	}
	n := wholeBins(r, false)
	if n < 1 || math.Abs(r-float64(n)) > 1e-9*r {
		return 0, fmt.Errorf("spikes: PSTH window of %g s is not a whole number of %g s bins (%.6g); adjust the stop time or the bin width", s.Stop-s.Start, s.BinWidth, r)
	}
	return n, nil
}

// binTrain adds one sorted train to the counts. The bin index from the division
// is corrected against the stored edges so a spike on an edge always lands in
// the bin that starts there.
func (r *PSTHResult) binTrain(tr []float64) {
	n := len(r.Counts)
	lo, hi, w := r.Edges[0], r.Edges[n], r.Edges[1]-r.Edges[0]
	for _, t := range tr {
		if t < lo || t >= hi {
			continue
		}
		k := min(int((t-lo)/w), n-1)
		for k > 0 && r.Edges[k] > t {
			k--
		}
		for k < n-1 && r.Edges[k+1] <= t {
			k++
		}
		r.Counts[k]++
	}
}

// smooth convolves x with a Gaussian of sd sigma bins, renormalising the
// kernel over the bins that exist at each end.
func smooth(x []float64, sigma float64) []float64 {
	h := int(math.Min(math.Ceil(4*sigma), float64(len(x))))
	w := make([]float64, h+1)
	for j := range w {
		w[j] = math.Exp(-float64(j*j) / (2 * sigma * sigma))
	}
	out := make([]float64, len(x))
	for i := range x {
		var s, ws float64
		for j := max(-h, -i); j <= h && i+j < len(x); j++ {
			wj := w[abs(j)]
			s += wj * x[i+j]
			ws += wj
		}
		out[i] = s / ws
	}
	return out
}

func abs(j int) int {
	if j < 0 {
		return -j
	}
	return j
}

// PopulationRate returns the population activity of N neurons,
// A = spikes of all neurons in a bin / (N·BinWidth) in Hz (Gerstner, Kistler,
// Naud & Paninski 2014, Neuronal Dynamics, ch. 7 — from memory). It is the PSTH
// computation with neurons in place of trials; Rate holds A.
func PopulationRate(trains [][]float64, s PSTHSettings) (*PSTHResult, error) {
	return PSTH(trains, s)
}

// Raster flattens trains into (neuron index, spike time) pairs, ordered by
// neuron and then time, ready for a scatter plot or a two-column table.
// Neuron indices count from 0.
func Raster(trains [][]float64) (neuron []int, times []float64) {
	total := 0
	for _, tr := range trains {
		total += len(tr)
	}
	neuron, times = make([]int, 0, total), make([]float64, 0, total)
	for i, tr := range trains {
		for _, t := range tr {
			neuron = append(neuron, i)
			times = append(times, t)
		}
	}
	return neuron, times
}
