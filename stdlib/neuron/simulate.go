package neuron

import (
	"context"
	"errors"
	"fmt"
	"math"
)

// Method selects the integrator.
type Method int

const (
	// Auto picks Exact for the LIF models and RK4 for the others.
	Auto Method = iota
	// RK4 is the classical fourth-order Runge–Kutta method with fixed step Dt.
	RK4
	// ExponentialEuler updates each gate exactly with V frozen, then V by the
	// exponential integrator of its linear current (models implementing
	// ExpEulerStepper, such as HH); first order.
	ExponentialEuler
	// DormandPrince54 is the adaptive Dormand–Prince 5(4) pair with RTol/ATol and
	// dense output; samples fall on the Dt grid and spikes are located on the
	// interpolant.
	DormandPrince54
	// Exact is the closed-form update of the LIF models: exponential relaxation
	// between input changes and threshold crossings solved analytically.
	Exact
)

// String returns the method's name.
func (m Method) String() string {
	switch m {
	case Auto:
		return "auto"
	case RK4:
		return "RK4"
	case ExponentialEuler:
		return "exponential Euler"
	case DormandPrince54:
		return "Dormand–Prince 5(4)"
	case Exact:
		return "exact"
	}
	return fmt.Sprintf("Method(%d)", int(m))
}

// Problem is one single-neuron simulation.
type Problem struct {
	Model    Model
	Input    Input     // injected current; nil means zero
	Duration float64   // s
	Init     []float64 // initial state; nil means Model.Init. Not modified.
}

// Settings tune Simulate; a nil *Settings or a zero field means the default.
type Settings struct {
	Dt     float64  // step (fixed methods) and sample spacing, s; default 0.01 ms
	Method Method   // default Auto
	RTol   float64  // DormandPrince54 relative tolerance; default 1e-6
	ATol   float64  // DormandPrince54 absolute tolerance factor: per variable ATol·Var.Scale; default RTol
	Record []string // state variables to record by name; nil means all
	Every  int      // keep every k-th sample; default 1
	// MaxValues bounds the float64 values a trace may hold (samples × (recorded
	// variables + time + input), plus spikes); default 200 M (1.6 GB).
	MaxValues int
	// Progress, if set, is called every few thousand steps with the
	// simulated time reached (s), from the simulating goroutine; keep it
	// cheap (a display throttles itself).
	Progress func(t float64)
}

// DefaultMaxValues is the default memory limit in float64 values.
const DefaultMaxValues = 200_000_000

// Trace is the result of Simulate: samples on the grid k·Dt (the last at Duration),
// one vector per recorded variable, the input at each sample and the spike times.
type Trace struct {
	T      []float64   // sample times, s
	Names  []string    // recorded variable names
	Units  []string    // their units
	Data   [][]float64 // Data[i][k] is variable Names[i] at T[k]
	Input  []float64   // input at T[k]
	Spikes []float64   // spike times, s
	Method Method      // integrator used
	Steps  int         // accepted steps
	Evals  int         // derivative evaluations (DormandPrince54)
}

// Var returns the recorded samples of the named variable, or nil.
func (tr *Trace) Var(name string) []float64 {
	for i, n := range tr.Names {
		if n == name {
			return tr.Data[i]
		}
	}
	return nil
}

// Simulate integrates p.Model for p.Duration seconds and returns its trace. The
// context is checked every few thousand steps; on cancellation the trace recorded so
// far is returned with ctx.Err(). A state that becomes non-finite stops the run with
// an error naming the time and the variable.
func Simulate(ctx context.Context, p Problem, s *Settings) (*Trace, error) {
	st, err := settle(p, s)
	if err != nil {
		return nil, err
	}
	sm, err := newSim(p, st)
	if err != nil {
		return nil, err
	}
	switch st.Method {
	case Exact:
		err = sm.runExact(ctx)
	case DormandPrince54:
		err = sm.runDopri(ctx)
	default:
		err = sm.runFixed(ctx)
	}
	sm.finish()
	return sm.tr, err
}

// settle validates p and s and returns settings with defaults filled in.
func settle(p Problem, s *Settings) (Settings, error) {
	var st Settings
	if s != nil {
		st = *s
	}
	if p.Model == nil {
		return st, errors.New("neuron: Problem.Model is nil; give a model such as NewHH()")
	}
	if err := p.Model.Validate(); err != nil {
		return st, err
	}
	if st.Dt == 0 {
		st.Dt = 1e-5
	}
	if st.Every == 0 {
		st.Every = 1
	}
	if st.MaxValues == 0 {
		st.MaxValues = DefaultMaxValues
	}
	if st.RTol == 0 {
		st.RTol = 1e-6
	}
	if st.ATol == 0 {
		st.ATol = st.RTol
	}
	if st.Method == Auto {
		st.Method = RK4
		if _, ok := p.Model.(exactLIF); ok {
			st.Method = Exact
		}
	}
	return st, checkSettings(p, st)
}

// checkSettings reports bad durations, steps, tolerances and method choices.
func checkSettings(p Problem, st Settings) error {
	d := p.Duration
	switch {
	case math.IsNaN(d) || math.IsInf(d, 0) || d <= 0:
		return fmt.Errorf("neuron: duration must be positive and finite, got %g s; use e.g. 0.2 s", d)
	case !(st.Dt > 0) || math.IsInf(st.Dt, 0):
		return fmt.Errorf("neuron: dt must be positive, got %g ms; use a step such as 0.01 ms", st.Dt*1e3)
	case st.Dt > d:
		return fmt.Errorf("neuron: dt %g ms exceeds the duration %g ms; use a smaller step such as 0.01 ms", st.Dt*1e3, d*1e3)
	case st.Every < 0:
		return fmt.Errorf("neuron: Every must be ≥ 1, got %d; use 1 to keep every sample", st.Every)
	case !(st.RTol > 0) || !(st.ATol > 0) || st.RTol >= 1:
		return fmt.Errorf("neuron: tolerances must satisfy 0 < RTol < 1 and ATol > 0, got %g and %g; use e.g. 1e-6", st.RTol, st.ATol)
	case st.MaxValues < 0:
		return fmt.Errorf("neuron: MaxValues must be ≥ 0, got %d; use 0 for the default", st.MaxValues)
	case p.Init != nil && len(p.Init) != len(p.Model.Vars()):
		return fmt.Errorf("neuron: Problem.Init has %d values but %s has %d state variables", len(p.Init), p.Model.Name(), len(p.Model.Vars()))
	}
	return checkMethod(p.Model, st.Method)
}

// checkMethod reports a method the model cannot use.
func checkMethod(m Model, meth Method) error {
	switch meth {
	case RK4, DormandPrince54:
		return nil
	case Exact:
		if _, ok := m.(exactLIF); !ok {
			return fmt.Errorf("neuron: the Exact method needs a LIF model, not %s; use RK4 or DormandPrince54", m.Name())
		}
	case ExponentialEuler:
		if _, ok := m.(ExpEulerStepper); !ok {
			return fmt.Errorf("neuron: %s has no exponential Euler step; use RK4 or DormandPrince54", m.Name())
		}
	default:
		return fmt.Errorf("neuron: unknown method %v; use RK4, ExponentialEuler, DormandPrince54 or Exact", meth)
	}
	return nil
}

// steps returns the number of grid steps: the last may be shorter to end at d.
func steps(d, dt float64) int {
	n := math.Ceil(d/dt - 1e-9)
	return int(math.Max(n, 1))
}

// gridTime returns the time of grid point k.
func (sm *sim) gridTime(k int) float64 {
	if k >= sm.n {
		return sm.dur
	}
	return float64(k) * sm.dt
}
