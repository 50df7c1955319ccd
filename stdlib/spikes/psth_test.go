package spikes

import (
	"context"
	"errors"
	"math"
	"testing"
)

// TestPSTHCounts checks binning by hand: bins of 0.1 s on [0, 0.5), spikes on
// a bin's left edge belong to that bin, spikes at Stop or before Start are not
// counted, and rate = counts/(trains·width) (definition of the PSTH, Dayan &
// Abbott 2001, ch. 1).
func TestPSTHCounts(t *testing.T) {
	t.Parallel()
	s := PSTHSettings{Start: 0, Stop: 0.5, BinWidth: 0.1}
	w := 0.1
	edge3 := 0 + 3*w // the stored edge, a float64 product as in the code (not exact constant arithmetic)
	trains := [][]float64{{0, 0.1, 0.15, edge3, 0.49}, {-0.1, 0.1, 0.5}}
	r, err := PSTH(trains, s)
	if err != nil {
		t.Fatal(err)
	}
	wantCounts := []float64{1, 3, 0, 1, 1}
	for i, w := range wantCounts {
		if r.Counts[i] != w || !near(r.Rate[i], w/(2*0.1), 0, 1e-15) {
			t.Errorf("bin %d: count %v rate %v, want %v and %v", i, r.Counts[i], r.Rate[i], w, w/0.2)
		}
	}
	if len(r.Edges) != 6 || r.Edges[5] != 0.5 || r.Trains != 2 {
		t.Errorf("edges %v, trains %d", r.Edges, r.Trains)
	}
}

// TestPSTHSmooth checks the Gaussian smoothing. A single spike in the middle
// bin becomes the sampled Gaussian kernel; at the centre it must equal the
// continuous density 1/(σ_b·sqrt(2π)) times the spike's rate, up to the sampling
// (Poisson summation error ~e^{−2π²σ_b²}, negligible for σ_b = 2) and the ±4σ
// cut (tail mass 6.3e-5, standard normal table): tolerance 1e-4 relative.
// A flat rate must stay flat, also at the ends (renormalised kernel).
func TestPSTHSmooth(t *testing.T) {
	t.Parallel()
	s := PSTHSettings{Start: 0, Stop: 1.01, BinWidth: 0.01, Smooth: 0.02}
	r, err := PSTH([][]float64{{0.505}}, s)
	if err != nil {
		t.Fatal(err)
	}
	peak := (1 / 0.01) / (2 * math.Sqrt(2*math.Pi))
	if !near(r.Rate[50], peak, 0, 1e-4) {
		t.Errorf("smoothed peak = %v, want %v", r.Rate[50], peak)
	}
	// Symmetry and the kernel's shape: neighbour j bins away is e^{−j²/8} of the peak.
	for j := 1; j <= 8; j++ {
		want := r.Rate[50] * math.Exp(-float64(j*j)/8)
		if !near(r.Rate[50+j], want, 0, 1e-12) || r.Rate[50-j] != r.Rate[50+j] {
			t.Errorf("bin 50±%d = %v, %v, want %v", j, r.Rate[50-j], r.Rate[50+j], want)
		}
	}
	if r.Rate[40] != 0 || r.Counts[50] != 1 {
		t.Errorf("beyond 4σ should be 0, got %v; counts stay raw", r.Rate[40])
	}
	flat := make([]float64, 101)
	for i := range flat {
		flat[i] = 0.005 + float64(i)*0.01
	}
	r, _ = PSTH([][]float64{flat}, s)
	for i, v := range r.Rate {
		if !near(v, 100, 0, 1e-12) { // a weighted mean of equal values, rounding only
			t.Fatalf("flat rate bin %d = %v, want 100", i, v)
		}
	}
}

// TestPSTHCancel checks that a cancelled context stops the PSTH.
func TestPSTHCancel(t *testing.T) {
	t.Parallel()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := PSTHContext(ctx, [][]float64{{1}}, PSTHSettings{Start: 0, Stop: 1, BinWidth: 0.1})
	if !errors.Is(err, context.Canceled) {
		t.Fatalf("err = %v, want context.Canceled", err)
	}
}

// TestRaster checks the flattened (neuron, time) pairs.
func TestRaster(t *testing.T) {
	t.Parallel()
	idx, ts := Raster([][]float64{{0.1, 0.2}, {}, {0.05}})
	wantI, wantT := []int{0, 0, 2}, []float64{0.1, 0.2, 0.05}
	if len(idx) != 3 || len(ts) != 3 {
		t.Fatalf("raster %v %v", idx, ts)
	}
	for i := range idx {
		if idx[i] != wantI[i] || ts[i] != wantT[i] {
			t.Errorf("pair %d = (%d, %v), want (%d, %v)", i, idx[i], ts[i], wantI[i], wantT[i])
		}
	}
}

// TestPopulationRate checks A = spikes/(N·Δt): 4 neurons, 2 spikes in one bin
// of 0.5 s give 2/(4·0.5) = 1 Hz.
func TestPopulationRate(t *testing.T) {
	t.Parallel()
	r, err := PopulationRate([][]float64{{0.1}, {}, {0.3}, {}}, PSTHSettings{Start: 0, Stop: 1, BinWidth: 0.5})
	if err != nil || r.Rate[0] != 1 || r.Rate[1] != 0 {
		t.Fatalf("population rate %v, %v; want [1 0]", r, err)
	}
}

func BenchmarkPSTH1000x100(b *testing.B) {
	trains := make([][]float64, 1000)
	for i := range trains {
		trains[i] = poisson(100, 50, uint64(i))
	}
	s := PSTHSettings{Start: 0, Stop: 2, BinWidth: 0.005, Smooth: 0.01}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := PSTH(trains, s); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDetect(b *testing.B) {
	n := 100000
	ts, vs := make([]float64, n), make([]float64, n)
	for i := range ts {
		ts[i] = float64(i) * 1e-5
		vs[i] = 0.04 * math.Sin(2*math.Pi*20*ts[i])
	}
	dst := make([]float64, 0, 64)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		dst, _ = Detect(dst, ts, vs, nil)
	}
}
