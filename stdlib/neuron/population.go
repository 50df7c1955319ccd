package neuron

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
)

// PopulationProblem is a population of independent LIF neurons sharing one input.
type PopulationProblem struct {
	Cells    []LIF     // one per neuron; not modified
	Input    Input     // shared current, A; nil means zero
	Offset   []float64 // per-neuron added current, A; nil means none
	Duration float64   // s
}

// PopulationSettings tune SimulatePopulation; nil or zero fields mean defaults.
type PopulationSettings struct {
	Dt      float64 // step, s; default 0.1 ms
	Workers int     // goroutines; default GOMAXPROCS. Results do not depend on it.
}

// PopulationResult holds each neuron's spike times (s) and final potential (V).
type PopulationResult struct {
	Spikes [][]float64
	V      []float64
}

// SimulatePopulation integrates every cell exactly, as the Exact method does for a
// single LIF: per step w ← w·exp(−dt/τ) with w = V − V∞, threshold crossings solved
// in closed form and steps split at the input's change times when it is Piecewise
// (otherwise the input is sampled at each step's midpoint). Neurons are split
// across Workers goroutines; each neuron's arithmetic is the same for any split, so
// results are identical for any worker count. On cancellation it returns ctx.Err().
func SimulatePopulation(ctx context.Context, p PopulationProblem, s *PopulationSettings) (*PopulationResult, error) {
	var st PopulationSettings
	if s != nil {
		st = *s
	}
	sched, err := checkPopulation(p, &st)
	if err != nil {
		return nil, err
	}
	n := len(p.Cells)
	res := &PopulationResult{Spikes: make([][]float64, n), V: make([]float64, n)}
	workers := min(st.Workers, n)
	var wg sync.WaitGroup
	errs := make([]error, workers)
	for w := 0; w < workers; w++ {
		lo, hi := w*n/workers, (w+1)*n/workers
		wg.Go(func() {
			c := newChunk(p, lo, hi, st.Dt, sched)
			errs[w] = c.run(ctx)
			c.store(res, lo)
		})
	}
	wg.Wait()
	return res, errors.Join(errs...)
}

// schedule is the shared input: its value on [0, first change) and its changes, or
// one midpoint sample per step.
type schedule struct {
	n       int
	dt, dur float64
	i0      float64
	times   []float64 // change times in (0, dur)
	values  []float64 // value from each change time on
	samples []float64 // per-step midpoint samples (non-piecewise inputs)
}

// checkPopulation validates p, fills defaults in st and builds the input schedule.
func checkPopulation(p PopulationProblem, st *PopulationSettings) (*schedule, error) {
	if st.Dt == 0 {
		st.Dt = 1e-4
	}
	if st.Workers <= 0 {
		st.Workers = runtime.GOMAXPROCS(0)
	}
	if len(p.Cells) == 0 {
		return nil, errors.New("neuron: the population has no cells; give at least one LIF")
	}
	if p.Offset != nil && len(p.Offset) != len(p.Cells) {
		return nil, fmt.Errorf("neuron: %d offsets for %d cells; give one offset per cell or none", len(p.Offset), len(p.Cells))
	}
	for i := range p.Cells {
		if err := p.Cells[i].Validate(); err != nil {
			return nil, fmt.Errorf("cell %d: %w", i, err)
		}
	}
	if err := checkSettings(Problem{Model: NewLIF(), Duration: p.Duration}, Settings{Dt: st.Dt, Every: 1, RTol: 1e-6, ATol: 1e-6, Method: Exact}); err != nil {
		return nil, err
	}
	return newSchedule(p.Input, p.Duration, st.Dt)
}

// newSchedule samples or lists the changes of the shared input.
func newSchedule(in Input, dur, dt float64) (*schedule, error) {
	if in == nil {
		in = zeroInput
	}
	sc := &schedule{n: steps(dur, dt), dt: dt, dur: dur, i0: in.At(0)}
	pw, ok := in.(Piecewise)
	if !ok {
		sc.samples = make([]float64, sc.n)
		for k := range sc.samples {
			sc.samples[k] = in.At(0.5 * (sc.time(k) + sc.time(k+1)))
		}
		return sc, nil
	}
	for t := pw.NextChange(0); t < dur; t = pw.NextChange(t) {
		if len(sc.times) > sc.n+DefaultMaxValues/16 {
			return nil, errors.New("neuron: the population input changes too often; sample it on the step grid instead")
		}
		sc.times = append(sc.times, t)
		sc.values = append(sc.values, in.At(t))
	}
	return sc, nil
}

// time returns grid time k.
func (sc *schedule) time(k int) float64 {
	if k >= sc.n {
		return sc.dur
	}
	return float64(k) * sc.dt
}

// chunk is one worker's neurons in struct-of-arrays form.
type chunk struct {
	sc                     *schedule
	tau, d, vth, vres, ref []float64 // per neuron constants
	base, r                []float64 // V∞ = base + r·I
	w, wth, dc, vinf       []float64 // state: w = V − V∞, threshold in w, current decay
	relEnd                 []float64 // end of refractory period (−Inf when not refractory)
	wheel                  releaseWheel
	log                    spikeLog
}

// newChunk copies cells lo..hi-1 into a chunk at input sc.i0.
func newChunk(p PopulationProblem, lo, hi int, dt float64, sc *schedule) *chunk {
	m := hi - lo
	f := func() []float64 { return make([]float64, m) }
	c := &chunk{sc: sc, tau: f(), d: f(), vth: f(), vres: f(), ref: f(), base: f(), r: f(),
		w: f(), wth: f(), dc: f(), vinf: f(), relEnd: f()}
	for j := 0; j < m; j++ {
		cell := &p.Cells[lo+j]
		c.tau[j], c.vth[j], c.vres[j], c.ref[j] = cell.C/cell.GL, cell.VTh, cell.VReset, cell.TRef
		c.d[j], c.dc[j] = math.Exp(-dt/c.tau[j]), math.Exp(-dt/c.tau[j])
		c.r[j] = 1 / cell.GL
		c.base[j] = cell.EL
		if p.Offset != nil {
			c.base[j] += c.r[j] * p.Offset[lo+j]
		}
		v0 := cell.EL
		if !math.IsNaN(cell.V0) {
			v0 = cell.V0
		}
		c.vinf[j] = c.base[j] + c.r[j]*sc.i0
		c.w[j], c.wth[j], c.relEnd[j] = v0-c.vinf[j], c.vth[j]-c.vinf[j], math.Inf(-1)
	}
	c.wheel = newReleaseWheel(c.ref, dt)
	return c
}

// store copies the chunk's results into res at offset lo.
func (c *chunk) store(res *PopulationResult, lo int) {
	copy(res.Spikes[lo:], c.log.trains(len(c.w)))
	for j := range c.w {
		res.V[lo+j] = c.w[j] + c.vinf[j]
	}
}
