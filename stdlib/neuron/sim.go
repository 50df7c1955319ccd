package neuron

import (
	"context"
	"fmt"
	"math"
)

// checkEvery is how many steps pass between context checks.
const checkEvery = 4096

// sim is the state of one running simulation; buffers are allocated once.
type sim struct {
	m      Model
	rs     Resetter // nil for models without a reset
	det    float64  // detection threshold on y[0] for non-reset models (NaN: none)
	in     Input
	pw     Piecewise // non-nil when in is piecewise constant
	inst   func(y []float64, in float64) bool
	st     Settings
	dt     float64
	dur    float64
	n      int // grid steps
	y, y1  []float64
	k      [7][]float64 // stage buffers
	tmp    []float64
	rec    []int
	tr     *Trace
	nrec   int       // samples recorded
	held   float64   // value y[0] is held at while refractory
	refEnd float64   // end of the refractory period, s
	next   float64   // next input change (piecewise inputs)
	inA    float64   // input on the current piecewise interval
	tau    float64   // membrane time constant (Exact method)
	hh     *hhKernel // non-nil for HH with a fixed-step method
}

// zeroInput is the input used when Problem.Input is nil.
var zeroInput Input = Constant(0)

// newSim checks the memory limit and allocates the trace and buffers.
func newSim(p Problem, st Settings) (*sim, error) {
	vars := p.Model.Vars()
	rec, err := recorded(vars, st.Record)
	if err != nil {
		return nil, err
	}
	sm := &sim{m: p.Model, st: st, dt: st.Dt, dur: p.Duration, det: math.NaN(), in: p.Input, rec: rec, refEnd: math.Inf(-1)}
	sm.n = steps(p.Duration, st.Dt)
	samples := sm.n/st.Every + 2
	if need := samples * (len(rec) + 2); need > st.MaxValues || need < 0 {
		fit := (sm.n*(len(rec)+2))/st.MaxValues + 1
		return nil, fmt.Errorf("neuron: recording %d samples of %d series needs %d values, above the limit of %d; record every %d-th sample (Settings.Every) or fewer variables", samples, len(rec)+2, need, st.MaxValues, fit)
	}
	sm.setup(p, vars, samples)
	return sm, nil
}

// setup wires the model's optional interfaces and allocates buffers.
func (sm *sim) setup(p Problem, vars []Var, samples int) {
	if sm.in == nil {
		sm.in = zeroInput
	}
	sm.pw, _ = sm.in.(Piecewise)
	sm.next = math.Inf(-1)
	sm.rs, _ = p.Model.(Resetter)
	if d, ok := p.Model.(Detector); ok && sm.rs == nil {
		sm.det = d.Detect()
	}
	if h, ok := p.Model.(*HH); ok && (sm.st.Method == RK4 || sm.st.Method == ExponentialEuler) {
		sm.hh = newHHKernel(h)
	}
	if r, ok := p.Model.(*Rate); ok {
		sm.inst = r.instant
	}
	nv := len(vars)
	sm.y, sm.y1, sm.tmp = make([]float64, nv), make([]float64, nv), make([]float64, nv)
	for i := range sm.k {
		sm.k[i] = make([]float64, nv)
	}
	if p.Init != nil {
		copy(sm.y, p.Init)
	} else {
		p.Model.Init(sm.y)
	}
	tr := &Trace{Method: sm.st.Method, T: make([]float64, 0, samples), Input: make([]float64, 0, samples)}
	for _, i := range sm.rec {
		tr.Names = append(tr.Names, vars[i].Name)
		tr.Units = append(tr.Units, vars[i].Unit)
		tr.Data = append(tr.Data, make([]float64, 0, samples))
	}
	sm.tr = tr
}

// recorded maps variable names to state indices; nil names means all.
func recorded(vars []Var, names []string) ([]int, error) {
	if names == nil {
		idx := make([]int, len(vars))
		for i := range idx {
			idx[i] = i
		}
		return idx, nil
	}
	idx := make([]int, 0, len(names))
	for _, n := range names {
		i := findVar(vars, n)
		if i < 0 {
			return nil, fmt.Errorf("neuron: no state variable %q; the model has %s", n, varList(vars))
		}
		idx = append(idx, i)
	}
	return idx, nil
}

func findVar(vars []Var, name string) int {
	for i, v := range vars {
		if v.Name == name {
			return i
		}
	}
	return -1
}

func varList(vars []Var) string {
	s := ""
	for i, v := range vars {
		if i > 0 {
			s += ", "
		}
		s += v.Name
	}
	return s
}

// record appends the state y at time t when grid point k is kept.
func (sm *sim) record(k int, t float64, y []float64) {
	if k%sm.st.Every != 0 && k != sm.n {
		return
	}
	sm.keep(t, y)
}

// keep appends the state y at time t to the trace.
func (sm *sim) keep(t float64, y []float64) {
	in := sm.in.At(t)
	if sm.inst != nil {
		sm.inst(y, in)
	}
	tr := sm.tr
	tr.T = append(tr.T, t)
	tr.Input = append(tr.Input, in)
	for j, i := range sm.rec {
		tr.Data[j] = append(tr.Data[j], y[i])
	}
}

// spike appends a spike time, failing when the memory limit would be exceeded.
func (sm *sim) spike(t float64) error {
	if len(sm.tr.Spikes) >= sm.st.MaxValues/2 {
		return fmt.Errorf("neuron: more than %d spikes by t = %g s; the input is too strong or the model unstable", len(sm.tr.Spikes), t)
	}
	sm.tr.Spikes = append(sm.tr.Spikes, t)
	return nil
}

// finish trims nothing today; it exists so every run path ends the same way.
func (sm *sim) finish() {}

// checkFiniteState returns an error naming the first non-finite variable.
func (sm *sim) checkFiniteState(t float64, y []float64) error {
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			name := sm.m.Vars()[i].Name
			return fmt.Errorf("neuron: %s diverged: %s is %v at t = %.6g ms; reduce dt or use DormandPrince54", sm.m.Name(), name, v, t*1e3)
		}
	}
	return nil
}

// segment returns the end of the sub-interval starting at a that ends before b,
// the next input change or the end of the refractory period, and sets sm.inA.
func (sm *sim) segment(a, b float64) float64 {
	if sm.pw != nil {
		if a >= sm.next {
			sm.next = sm.pw.NextChange(a)
			sm.inA = sm.in.At(a)
		}
		b = math.Min(b, sm.next)
	}
	if a < sm.refEnd {
		b = math.Min(b, sm.refEnd)
	}
	return b
}

// input returns the input at stage time t of a sub-interval.
func (sm *sim) input(t float64) float64 {
	if sm.pw != nil {
		return sm.inA
	}
	return sm.in.At(t)
}

// refractory reports whether a sub-interval starting at a is refractory.
func (sm *sim) refractory(a float64) bool { return a < sm.refEnd }

// fire registers a spike at t and applies the model's reset to y.
func (sm *sim) fire(t float64, y []float64) error {
	sm.rs.Reset(y)
	sm.held = y[0]
	if r := sm.rs.Refractory(); r > 0 {
		sm.refEnd = t + r
	}
	return sm.spike(t)
}

// checkpoint returns ctx.Err() at step 1 and every checkEvery steps after,
// and at the same steps reports the simulated time t (s) to
// Settings.Progress, if set.
func (sm *sim) checkpoint(ctx context.Context, step int, t float64) error {
	if step%checkEvery != 1 {
		return nil
	}
	if sm.st.Progress != nil {
		sm.st.Progress(t)
	}
	return ctx.Err()
}
