package neuron

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"
)

// SweepSettings tune Sweep and Rheobase; nil or zero fields mean the defaults.
type SweepSettings struct {
	Sim      *Settings             // integration settings; Record defaults to the first variable only
	Onset    float64               // step onset, s; default 0
	Length   float64               // step length, s; default 1 s. The run lasts Onset + Length.
	Window   float64               // steady-rate window at the end of the step, s; default Length/2
	Workers  int                   // goroutines; default GOMAXPROCS. Results do not depend on it.
	Progress func(done, total int) // called after each finished amplitude with the number finished
}

// SweepResult holds one entry per amplitude; entries not finished are NaN.
type SweepResult struct {
	Amplitudes []float64 // input amplitudes, in the model's input unit
	Rate       []float64 // steady rate (Hz) in the last Window of the step
	FirstRate  []float64 // 1 / first ISI during the step (Hz); 0 with fewer than 2 spikes
	Count      []float64 // spikes during the step
	Latency    []float64 // first spike after onset (s); +Inf when none
	Finished   int       // entries computed
}

// Sweep runs one simulation per amplitude (a step current from Onset for Length
// seconds, zero before) over Workers goroutines, each result written at its own
// index so the result does not depend on the worker count. The steady rate is the
// inverse mean ISI of the spikes in the last Window of the step,
// (k−1)/(t_k − t_1), or k/Window when fewer than two spikes fall in it. factory must
// return a fresh model per call. On cancellation the finished entries are kept, the
// others are NaN, and the error says how many finished.
func Sweep(ctx context.Context, factory func() Model, amps []float64, s *SweepSettings) (*SweepResult, error) {
	st, err := sweepDefaults(factory, s)
	if err != nil {
		return nil, err
	}
	res := newSweepResult(amps)
	var next, done atomic.Int64
	var mu sync.Mutex
	var wg sync.WaitGroup
	errs := make([]error, len(amps))
	for w := 0; w < min(st.Workers, max(len(amps), 1)); w++ {
		wg.Go(func() {
			for i := int(next.Add(1) - 1); i < len(amps); i = int(next.Add(1) - 1) {
				errs[i] = sweepOne(ctx, factory(), amps[i], st, res, i)
				if errs[i] != nil {
					continue // not finished: progress counts finished amplitudes only
				}
				d := int(done.Add(1))
				if st.Progress != nil {
					mu.Lock()
					st.Progress(d, len(amps))
					mu.Unlock()
				}
			}
		})
	}
	wg.Wait()
	return res, res.finish(ctx, errs)
}

// sweepDefaults validates the factory and fills in defaults.
func sweepDefaults(factory func() Model, s *SweepSettings) (SweepSettings, error) {
	var st SweepSettings
	if s != nil {
		st = *s
	}
	if factory == nil {
		return st, errors.New("neuron: Sweep needs a model factory, e.g. func() neuron.Model { return neuron.NewHH() }")
	}
	if st.Length == 0 {
		st.Length = 1
	}
	if st.Window == 0 {
		st.Window = st.Length / 2
	}
	if st.Workers <= 0 {
		st.Workers = runtime.GOMAXPROCS(0)
	}
	switch {
	case !(st.Length > 0) || math.IsInf(st.Length, 0):
		return st, fmt.Errorf("neuron: step length must be positive and finite, got %g s; use e.g. 1 s", st.Length)
	case !(st.Onset >= 0) || math.IsInf(st.Onset, 0):
		return st, fmt.Errorf("neuron: step onset must be ≥ 0 and finite, got %g s", st.Onset)
	case !(st.Window > 0) || st.Window > st.Length:
		return st, fmt.Errorf("neuron: rate window %g s must lie in (0, %g s], the step length", st.Window, st.Length)
	}
	return st, nil
}

func newSweepResult(amps []float64) *SweepResult {
	n := len(amps)
	r := &SweepResult{Amplitudes: append([]float64(nil), amps...), Rate: nanVec(n), FirstRate: nanVec(n), Count: nanVec(n), Latency: nanVec(n)}
	return r
}

func nanVec(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = math.NaN()
	}
	return v
}

// sweepOne simulates amplitude a and writes entry i.
func sweepOne(ctx context.Context, m Model, a float64, st SweepSettings, res *SweepResult, i int) error {
	if err := ctx.Err(); err != nil {
		return err
	}
	tr, err := stepRun(ctx, m, a, st)
	if err != nil {
		return err
	}
	rate, first, count, lat := stepStats(tr.Spikes, st.Onset, st.Onset+st.Length, st.Window)
	res.Rate[i], res.FirstRate[i], res.Count[i], res.Latency[i] = rate, first, count, lat
	return nil
}

// stepRun simulates m under a step of amplitude a, recording little.
func stepRun(ctx context.Context, m Model, a float64, st SweepSettings) (*Trace, error) {
	var sim Settings
	if st.Sim != nil {
		sim = *st.Sim
	}
	if sim.Record == nil {
		sim.Record = []string{m.Vars()[0].Name}
	}
	if sim.Every == 0 {
		sim.Every = 1000 // the sweep needs spikes, not traces
	}
	in := Step{Amp: a, On: st.Onset, Off: st.Onset + st.Length}
	return Simulate(ctx, Problem{Model: m, Input: in, Duration: st.Onset + st.Length}, &sim)
}

// stepStats computes the steady rate, first-ISI rate, count and latency of the
// spikes in [on, off).
func stepStats(sp []float64, on, off, window float64) (rate, first, count, lat float64) {
	var in []float64
	for _, t := range sp {
		if t >= on && t < off {
			in = append(in, t)
		}
	}
	count, lat = float64(len(in)), math.Inf(1)
	if len(in) > 0 {
		lat = in[0] - on
	}
	if len(in) > 1 {
		first = 1 / (in[1] - in[0])
	}
	var win []float64
	for _, t := range in {
		if t >= off-window {
			win = append(win, t)
		}
	}
	if len(win) > 1 {
		return float64(len(win)-1) / (win[len(win)-1] - win[0]), first, count, lat
	}
	return float64(len(win)) / window, first, count, lat
}

// finish counts finished entries and builds the error.
func (r *SweepResult) finish(ctx context.Context, errs []error) error {
	for i := range r.Rate {
		if !math.IsNaN(r.Rate[i]) {
			r.Finished++
		}
	}
	if err := ctx.Err(); err != nil && r.Finished < len(r.Rate) {
		return fmt.Errorf("neuron: sweep stopped after %d of %d amplitudes: %w", r.Finished, len(r.Rate), err)
	}
	return errors.Join(errs...)
}
