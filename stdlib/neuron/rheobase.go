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
	RelTol    float64       // stop when (hi − lo) ≤ RelTol·hi; default 1e-3
	MinSpikes int           // spikes during the step that count as firing; default 1
}

// RheobaseResult is the smallest firing amplitude and its final bracket.
type RheobaseResult struct {
	Amplitude float64 // Hi of the bracket: the smallest amplitude seen to fire
	Lo, Hi    float64 // Lo does not fire, Hi fires
	Runs      int     // simulations made
}

// Rheobase finds the smallest amplitude of a long step (Length, default 1 s) that
// makes the model fire, by bisection between 0 (which must not fire) and an
// amplitude that does, until the bracket is below RelTol (relative, default 1e-3).
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
	r.Amplitude = r.Hi
	return r, nil
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
