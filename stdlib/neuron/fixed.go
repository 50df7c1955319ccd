package neuron

import (
	"context"
	"math"
)

// runFixed integrates with a fixed-step method (RK4 or ExponentialEuler).
func (sm *sim) runFixed(ctx context.Context) error {
	if sm.hh != nil {
		return sm.runHH(ctx)
	}
	sm.record(0, 0, sm.y)
	for k := 1; k <= sm.n; k++ {
		if err := sm.checkpoint(ctx, k, sm.gridTime(k-1)); err != nil {
			return err
		}
		b := sm.gridTime(k)
		if err := sm.advance(sm.gridTime(k-1), b); err != nil {
			return err
		}
		sm.tr.Steps++
		sm.record(k, b, sm.y)
	}
	return nil
}

// advance integrates from a to b, splitting at input changes, refractory ends and
// spikes.
func (sm *sim) advance(a, b float64) error {
	for a < b {
		e := sm.segment(a, b)
		if e <= a {
			e = b
		}
		var err error
		if a, err = sm.sub(a, e); err != nil {
			return err
		}
	}
	return nil
}

// sub takes one step over [a, e] and returns where it stopped: e, or the time of a
// reset spike from which the step must resume.
func (sm *sim) sub(a, e float64) (float64, error) {
	h := e - a
	sm.step(sm.y1, sm.y, a, h)
	if sm.refractory(a) {
		sm.y1[0] = sm.held
		copy(sm.y, sm.y1)
		return e, sm.checkFiniteState(e, sm.y)
	}
	if sm.rs != nil && !(sm.y1[0] < sm.rs.Peak()) {
		s := sm.locate(a, h)
		sm.step(sm.y1, sm.y, a, s)
		copy(sm.y, sm.y1)
		if err := sm.checkFiniteState(a+s, sm.y); err != nil {
			return a + s, err
		}
		return a + s, sm.fire(a+s, sm.y)
	}
	if err := sm.checkFiniteState(e, sm.y1); err != nil {
		return e, err
	}
	if sm.y[0] < sm.det && sm.y1[0] >= sm.det {
		if err := sm.spike(sm.hermite(a, h)); err != nil {
			return e, err
		}
	}
	copy(sm.y, sm.y1)
	return e, nil
}

// step writes into dst the state one step of length h from (a, y); dst must not
// alias y.
func (sm *sim) step(dst, y []float64, a, h float64) {
	if q := sm.hh; q != nil {
		if sm.st.Method == ExponentialEuler {
			q.expEuler(load(y), h, sm.input(a+h/2)).store(dst)
		} else {
			q.rk4(load(y), h, sm.input(a), sm.input(a+h/2), sm.input(a+h)).store(dst)
		}
		return
	}
	if sm.st.Method == ExponentialEuler {
		copy(dst, y)
		sm.m.(ExpEulerStepper).ExpEulerStep(dst, h, sm.input(a+h/2))
		return
	}
	sm.rk4(dst, y, a, h)
}

// rk4 is the classical fourth-order Runge–Kutta step.
func (sm *sim) rk4(dst, y []float64, a, h float64) {
	k1, k2, k3, k4, tmp := sm.k[0], sm.k[1], sm.k[2], sm.k[3], sm.k[4]
	in0, inm, in1 := sm.input(a), sm.input(a+h/2), sm.input(a+h)
	sm.m.Deriv(k1, a, y, in0)
	for i := range y {
		tmp[i] = y[i] + h/2*k1[i]
	}
	sm.m.Deriv(k2, a+h/2, tmp, inm)
	for i := range y {
		tmp[i] = y[i] + h/2*k2[i]
	}
	sm.m.Deriv(k3, a+h/2, tmp, inm)
	for i := range y {
		tmp[i] = y[i] + h*k3[i]
	}
	sm.m.Deriv(k4, a+h, tmp, in1)
	for i := range y {
		dst[i] = y[i] + h/6*(k1[i]+2*k2[i]+2*k3[i]+k4[i])
	}
}

// locate returns the length s ≤ h of the step from (a, sm.y) whose end first reaches
// the reset peak, by bisection to 1e-13 s. A non-finite trial counts as beyond the
// peak, so stiff upswings (AdEx) are located without overflow.
func (sm *sim) locate(a, h float64) float64 {
	peak := sm.rs.Peak()
	lo, hi := 0.0, h
	for i := 0; i < 200 && hi-lo > 1e-13; i++ {
		mid := 0.5 * (lo + hi)
		sm.step(sm.tmp, sm.y, a, mid)
		if sm.tmp[0] < peak {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// hermite returns the time at which the cubic Hermite interpolant of y[0] over the
// step [a, a+h] from sm.y to sm.y1 crosses the detection threshold upwards.
func (sm *sim) hermite(a, h float64) float64 {
	f0, f1 := sm.k[5], sm.k[6]
	sm.m.Deriv(f0, a, sm.y, sm.input(a))
	sm.m.Deriv(f1, a+h, sm.y1, sm.input(a+h))
	return a + h*cubicRoot(sm.y[0], h*f0[0], sm.y1[0], h*f1[0], sm.det)
}

// cubicRoot returns θ in [0, 1] where the Hermite cubic with end values y0, y1 and
// scaled slopes d0, d1 equals c, by bisection (p(0) < c ≤ p(1)).
func cubicRoot(y0, d0, y1, d1, c float64) float64 {
	p := func(s float64) float64 {
		s2, s3 := s*s, s*s*s
		return (2*s3-3*s2+1)*y0 + (s3-2*s2+s)*d0 + (-2*s3+3*s2)*y1 + (s3-s2)*d1
	}
	lo, hi := 0.0, 1.0
	for i := 0; i < 60; i++ {
		mid := 0.5 * (lo + hi)
		if p(mid) < c {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// runExact integrates a LIF model in closed form.
func (sm *sim) runExact(ctx context.Context) error {
	tau, vth, vreset, vinf := sm.m.(exactLIF).lif()
	sm.tau = tau
	decay := math.Exp(-sm.dt / tau)
	sm.record(0, 0, sm.y)
	for k := 1; k <= sm.n; k++ {
		if err := sm.checkpoint(ctx, k, sm.gridTime(k-1)); err != nil {
			return err
		}
		a, b := sm.gridTime(k-1), sm.gridTime(k)
		ga, full := a, k < sm.n || sm.dur-float64(sm.n-1)*sm.dt == sm.dt
		for a < b {
			e := sm.segment(a, b)
			if e <= a {
				e = b
			}
			in := sm.inA
			if sm.pw == nil {
				in = sm.in.At(0.5 * (a + e)) // midpoint: second order for smooth inputs
			}
			var err error
			d := decay // a whole grid step uses the precomputed exp(−dt/τ)
			if !full || a != ga || e != b {
				d = math.Exp(-(e - a) / tau)
			}
			if a, err = sm.exactSub(a, e, vth, vreset, vinf(in), d); err != nil {
				return err
			}
		}
		sm.tr.Steps++
		sm.record(k, b, sm.y)
	}
	return nil
}

// exactSub advances V over [a, e] at constant input and returns where it stopped.
// d is exp(−(e − a)/τ).
func (sm *sim) exactSub(a, e, vth, vreset, vi, d float64) (float64, error) {
	if sm.refractory(a) {
		sm.y[0] = vreset
		return e, nil
	}
	v := sm.y[0]
	v1 := vi + (v-vi)*d
	if math.IsNaN(v1) || math.IsInf(v1, 0) {
		return e, sm.checkFiniteState(e, []float64{v1})
	}
	if v1 < vth {
		sm.y[0] = v1
		return e, nil
	}
	ts := a
	if vi > vth && v < vth {
		ts = math.Min(a+sm.tau*math.Log((v-vi)/(vth-vi)), e)
	}
	sm.y[0] = vreset
	return ts, sm.fire(ts, sm.y)
}
