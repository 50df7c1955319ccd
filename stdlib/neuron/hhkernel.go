package neuron

import (
	"context"
)

// hhState is the HH state (V in volts, then the gates) as four scalars, so that a
// step passes it in registers instead of through slices.
type hhState struct{ v, m, h, n float64 }

// hhKernel is an HH membrane with the factors that do not change during a run (Q10
// factor, unit conversions) worked out once. Its derivative does the floating-point
// operations of HH.Deriv in the same order but takes the rates from hhRatesFast, so
// it agrees with HH.Deriv to rounding; its exponential Euler step is exactly
// HH.ExpEulerStep. It saves the interface calls, the slice loops, the per-call Q10
// factor and two thirds of the time in math.Exp.
type hhKernel struct {
	k            float64 // 1e3·φ: gate rates from 1/ms to 1/s
	phi          float64 // Q10 factor
	gna, gk, gl  float64 // mS/cm²
	ena, ek, el  float64 // mV
	c100         float64 // µF/cm²
	eNa, eK, eL  float64 // V, for the exponential Euler V∞ as HH.ExpEulerStep forms it
	gNa, gK, gL0 float64 // S/m², likewise
}

// newHHKernel precomputes the constant factors of m.
func newHHKernel(m *HH) *hhKernel {
	phi := m.phi()
	return &hhKernel{k: 1e3 * phi, phi: phi,
		gna: m.GNa * 0.1, gk: m.GK * 0.1, gl: m.GL * 0.1,
		ena: m.ENa * 1e3, ek: m.EK * 1e3, el: m.EL * 1e3, c100: m.C * 100,
		eNa: m.ENa, eK: m.EK, eL: m.EL, gNa: m.GNa, gK: m.GK, gL0: m.GL}
}

// deriv returns the time derivative of s at input in, as HH.Deriv writes it.
func (q *hhKernel) deriv(s hhState, in float64) hhState {
	v := s.v * 1e3
	am, bm, ah, bh, an, bn := hhRatesFast(v)
	ionic := q.gna*s.m*s.m*s.m*s.h*(v-q.ena) + q.gk*s.n*s.n*s.n*s.n*(v-q.ek) + q.gl*(v-q.el)
	return hhState{
		(in*100 - ionic) / q.c100,
		q.k * (am*(1-s.m) - bm*s.m),
		q.k * (ah*(1-s.h) - bh*s.h),
		q.k * (an*(1-s.n) - bn*s.n),
	}
}

// axpy returns y + c·d component by component.
func (y hhState) axpy(c float64, d hhState) hhState {
	return hhState{y.v + c*d.v, y.m + c*d.m, y.h + c*d.h, y.n + c*d.n}
}

// rk4 is the classical Runge–Kutta step of length h from y with the inputs at the
// start, middle and end of the step.
func (q *hhKernel) rk4(y hhState, h, in0, inm, in1 float64) hhState {
	k1 := q.deriv(y, in0)
	k2 := q.deriv(y.axpy(h/2, k1), inm)
	k3 := q.deriv(y.axpy(h/2, k2), inm)
	k4 := q.deriv(y.axpy(h, k3), in1)
	c := h / 6
	return hhState{
		y.v + c*(k1.v+2*k2.v+2*k3.v+k4.v),
		y.m + c*(k1.m+2*k2.m+2*k3.m+k4.m),
		y.h + c*(k1.h+2*k2.h+2*k3.h+k4.h),
		y.n + c*(k1.n+2*k2.n+2*k3.n+k4.n),
	}
}

// expEuler is HH.ExpEulerStep over dt seconds at input in.
func (q *hhKernel) expEuler(y hhState, dt, in float64) hhState {
	h := dt * 1e3 * q.phi
	v := y.v * 1e3
	am, bm, ah, bh, an, bn := hhRatesFast(v)
	gm, gh, gn := gateStep(y.m, am, bm, h), gateStep(y.h, ah, bh, h), gateStep(y.n, an, bn, h)
	gna := q.gNa * 0.1 * gm * gm * gm * gh
	gk := q.gK * 0.1 * gn * gn * gn * gn
	gl := q.gL0 * 0.1
	g := gna + gk + gl
	vinf := (gna*q.eNa*1e3 + gk*q.eK*1e3 + gl*q.eL*1e3 + in*100) / g
	return hhState{(vinf + (v-vinf)*expFast(-dt*1e3*g/q.c100)) * 1e-3, gm, gh, gn}
}

// load reads an hhState from y; store writes s into dst.
func load(y []float64) hhState { _ = y[3]; return hhState{y[0], y[1], y[2], y[3]} }

func (s hhState) store(dst []float64) {
	_ = dst[3]
	dst[0], dst[1], dst[2], dst[3] = s.v, s.m, s.h, s.n
}

// finite reports whether every component of s is finite: x·0 is 0 for finite x and
// NaN for ±Inf or NaN, so one comparison covers all four.
func (s hhState) finite() bool {
	z := s.v*0 + s.m*0 + s.h*0 + s.n*0
	return z == z
}

// hhStep is one kernel step of length h from (a, y) with the run's method.
func (sm *sim) hhStep(y hhState, a, h float64) hhState {
	if sm.st.Method == ExponentialEuler {
		return sm.hh.expEuler(y, h, sm.input(a+h/2))
	}
	return sm.hh.rk4(y, h, sm.input(a), sm.input(a+h/2), sm.input(a+h))
}

// runHH is runFixed for the HH kernel. HH has no reset or refractory period, so a
// sub-interval is one step, a finiteness check and a threshold test; the state stays
// in registers and goes to sm.y only to be recorded, at a spike and at the end.
func (sm *sim) runHH(ctx context.Context) error {
	sm.record(0, 0, sm.y)
	y := load(sm.y)
	defer func() { y.store(sm.y) }()
	due := sm.st.Every // steps until the next recorded grid point
	for k := 1; k <= sm.n; k++ {
		if err := sm.checkpoint(ctx, k, sm.gridTime(k-1)); err != nil {
			return err
		}
		a, b := sm.gridTime(k-1), sm.gridTime(k)
		for a < b {
			e := sm.segment(a, b)
			if e <= a {
				e = b
			}
			y1 := sm.hhStep(y, a, e-a)
			if !y1.finite() {
				y1.store(sm.y1)
				return sm.checkFiniteState(e, sm.y1)
			}
			if y.v < sm.det && y1.v >= sm.det {
				y.store(sm.y)
				y1.store(sm.y1)
				if err := sm.spike(sm.hermite(a, e-a)); err != nil {
					return err
				}
			}
			y, a = y1, e
		}
		sm.tr.Steps++
		if due--; due == 0 || k == sm.n {
			due = sm.st.Every
			y.store(sm.y)
			sm.keep(b, sm.y)
		}
	}
	return nil
}
