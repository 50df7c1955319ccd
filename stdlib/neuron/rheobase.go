package neuron

import (
	"context"
	"errors"
	"fmt"
	"math"
)

// RheobaseSettings tune Rheobase; nil or zero fields mean the defaults.
type RheobaseSettings struct {
	Sweep     SweepSettings // step and integration settings (Length default 1 s)
	Hi        float64       // an amplitude that fires; default the model's InputScale, doubled until it fires
	RelTol    float64       // stop when (hi − lo) ≤ RelTol·hi; default 1e-4
	MinSpikes int           // spikes during the step that count as firing; default 1
}

// RheobaseResult is the smallest firing amplitude and its final bracket.
type RheobaseResult struct {
	Amplitude float64 // the middle of the final bracket, or the closed form (LIF)
	Lo, Hi    float64 // Lo does not fire, Hi fires; both Amplitude for a closed form
	Runs      int     // simulations made (0 for a closed form)
	Exact     bool    // Amplitude is the closed form, not a bisection
}

// Rheobase finds the smallest amplitude of a long step (Length, default 1 s) that
// makes the model fire. For a LIF or normalised LIF asked for one spike the answer
// is the closed form (see lifRheobase) and nothing is simulated. Otherwise it
// bisects between 0 (which must not fire) and an amplitude that does, until the
// bracket is below RelTol (relative, default 1e-4), and returns the bracket's
// middle, within RelTol/2 of the threshold amplitude.
func Rheobase(ctx context.Context, factory func() Model, s *RheobaseSettings) (*RheobaseResult, error) {
	var st RheobaseSettings
	if s != nil {
		st = *s
	}
	sw, err := sweepDefaults(factory, &st.Sweep)
	if err != nil {
		return nil, err
	}
	if st.RelTol == 0 {
		st.RelTol = 1e-3
	}
	if st.MinSpikes == 0 {
		st.MinSpikes = 1
	}
	if !(st.RelTol > 0 && st.RelTol < 1) {
		return nil, fmt.Errorf("neuron: rheobase RelTol must lie in (0, 1), got %g; use e.g. 1e-3", st.RelTol)
	}
	if st.MinSpikes == 1 {
		if a, ok, err := lifRheobase(factory(), sw.Onset, sw.Length); ok || err != nil {
			return &RheobaseResult{Amplitude: a, Lo: a, Hi: a, Exact: true}, err
		}
	}
	r := &RheobaseResult{}
	fires := func(a float64) (bool, error) {
		r.Runs++
		tr, err := stepRun(ctx, factory(), a, sw)
		if err != nil {
			return false, err
		}
		_, _, n, _ := stepStats(tr.Spikes, sw.Onset, sw.Onset+sw.Length, sw.Window)
		return int(n) >= st.MinSpikes, nil
	}
	if r.Lo, r.Hi, err = bracket(factory(), st.Hi, fires); err != nil {
		return r, err
	}
	for r.Hi-r.Lo > st.RelTol*math.Abs(r.Hi) {
		mid := 0.5 * (r.Lo + r.Hi)
		ok, err := fires(mid)
		if err != nil {
			return r, err
		}
		if ok {
			r.Hi = mid
		} else {
			r.Lo = mid
		}
	}
	r.Amplitude = 0.5 * (r.Lo + r.Hi)
	return r, nil
}

// lifRheobase returns the smallest step amplitude that brings a LIF (or
// normalised LIF) to threshold before the step of the given length ends, and
// reports whether m is such a model. The membrane relaxes exponentially,
// V(t) = V∞ + (V_on − V∞) e^{−t/τ} with V∞ = E_L + R·I (Dayan & Abbott 2001,
// ch. 5), so V(T) = V_th gives
//
//	I = ((V_th − E_L) − (V_on − E_L) e^{−T/τ}) / ((1 − e^{−T/τ}) R),
//
// where V_on is the potential at the step's onset, reached from the initial
// potential with no input. For a long step this is (V_th − E_L)/R.
func lifRheobase(m Model, onset, length float64) (float64, bool, error) {
	var tau, el, r, vth float64
	switch x := m.(type) {
	case *LIF:
		tau, el, r, vth = x.C/x.GL, x.EL, 1/x.GL, x.VTh
	case *NormLIF:
		tau, el, r, vth = x.Tau, 0, 1, 1
	default:
		return 0, false, nil
	}
	if err := m.Validate(); err != nil {
		return 0, true, err
	}
	y := make([]float64, 1)
	m.Init(y)
	// Potentials relative to E_L first: the differences are exact for the
	// usual millivolt values, and no large terms cancel.
	d0 := (y[0] - el) * math.Exp(-onset/tau)
	a := ((vth - el) - d0*math.Exp(-length/tau)) / -math.Expm1(-length/tau) / r
	if !(a > 0) || y[0] >= vth {
		return 0, true, errors.New("neuron: the model fires with no input, so it has no rheobase")
	}
	return a, true, nil
}

// bracket returns lo = 0 (checked not to fire) and an amplitude hi that fires.
func bracket(m Model, hi float64, fires func(float64) (bool, error)) (float64, float64, error) {
	if ok, err := fires(0); err != nil || ok {
		if err == nil {
			err = errors.New("neuron: the model fires with no input, so it has no rheobase")
		}
		return 0, 0, err
	}
	if hi == 0 {
		hi = 1
		if sc, ok := m.(InputScaler); ok {
			hi = sc.InputScale()
		}
	}
	if !(hi > 0) || math.IsInf(hi, 0) {
		return 0, 0, fmt.Errorf("neuron: rheobase Hi must be a positive amplitude, got %g", hi)
	}
	lo := 0.0
	for i := 0; i < 40; i++ {
		ok, err := fires(hi)
		if err != nil || ok {
			return lo, hi, err
		}
		lo, hi = hi, 2*hi
	}
	return 0, 0, fmt.Errorf("neuron: no firing up to amplitude %g; set RheobaseSettings.Hi to an amplitude that fires", hi)
}
