package neuron

import (
	"context"
	"fmt"
	"math"
)

// Dormand–Prince 5(4) tableau (Dormand & Prince 1980, J. Comput. Appl. Math. 6:19)
// with the fourth-order continuous extension of Shampine (1986, Math. Comp. 46:135)
// in the power form: y(t+θh) = y + h Σ_j K_j Σ_p dpP[j][p] θ^(p+1).
var (
	dpC = [6]float64{0, 1. / 5, 3. / 10, 4. / 5, 8. / 9, 1}
	dpA = [6][5]float64{
		{},
		{1. / 5},
		{3. / 40, 9. / 40},
		{44. / 45, -56. / 15, 32. / 9},
		{19372. / 6561, -25360. / 2187, 64448. / 6561, -212. / 729},
		{9017. / 3168, -355. / 33, 46732. / 5247, 49. / 176, -5103. / 18656},
	}
	dpB = [6]float64{35. / 384, 0, 500. / 1113, 125. / 192, -2187. / 6784, 11. / 84}
	dpE = [7]float64{-71. / 57600, 0, 71. / 16695, -71. / 1920, 17253. / 339200, -22. / 525, 1. / 40}
	dpP = [7][4]float64{
		{1, -8048581381. / 2820520608, 8663915743. / 2820520608, -12715105075. / 11282082432},
		{},
		{0, 131558114200. / 32700410799, -68118460800. / 10900136933, 87487479700. / 32700410799},
		{0, -1754552775. / 470086768, 14199869525. / 1410260304, -10690763975. / 1880347072},
		{0, 127303824393. / 49829197408, -318862633887. / 49829197408, 701980252875. / 199316789632},
		{0, -282668133. / 205662961, 2019193451. / 616988883, -1453857185. / 822651844},
		{0, 40617522. / 29380423, -110615467. / 29380423, 69997945. / 29380423},
	}
)

// dopri holds the adaptive integrator's per-run state.
type dopri struct {
	atol     []float64
	dense    []float64
	h        float64
	kNext    int // next grid index to record
	fresh    bool
	rejected bool
}

// runDopri integrates with the adaptive Dormand–Prince 5(4) pair.
func (sm *sim) runDopri(ctx context.Context) error {
	vars := sm.m.Vars()
	dp := &dopri{atol: make([]float64, len(vars)), dense: make([]float64, len(vars)), h: sm.dt / 10, kNext: 0, fresh: true}
	for i, v := range vars {
		dp.atol[i] = sm.st.ATol * math.Max(v.Scale, math.SmallestNonzeroFloat64)
	}
	sm.record(0, 0, sm.y)
	dp.kNext = sm.st.Every
	t := 0.0
	for it := 1; t < sm.dur; it++ {
		if err := sm.checkpoint(ctx, it, t); err != nil {
			return err
		}
		var err error
		if t, err = sm.dpStep(dp, t); err != nil {
			return err
		}
	}
	return nil
}

// deriv evaluates the model, holding y[0] while refractory.
func (sm *sim) deriv(dst []float64, t float64, y []float64, refr bool) {
	sm.m.Deriv(dst, t, y, sm.input(t))
	sm.tr.Evals++
	if refr {
		dst[0] = 0
	}
}

// dpStep attempts one step from t and returns the new time (t on rejection).
func (sm *sim) dpStep(dp *dopri, t float64) (float64, error) {
	e := sm.segment(t, sm.dur)
	refr := sm.refractory(t)
	if dp.fresh {
		if refr {
			sm.y[0] = sm.held
		}
		sm.deriv(sm.k[0], t, sm.y, refr)
		dp.fresh = false
	}
	h := math.Min(dp.h, e-t)
	if h < 1e-15*math.Max(1, t) {
		if sm.rs != nil && !refr && sm.k[0][0] > 0 {
			// An integrate-and-fire upswing (AdEx) that outruns the smallest step is
			// within about one such step of its singular crossing: call it the spike.
			dp.fresh, dp.h = true, sm.dt/10
			return t, sm.fire(t, sm.y)
		}
		return t, fmt.Errorf("neuron: step size underflow at t = %.6g ms; loosen RTol/ATol or check the model", t*1e3)
	}
	errNorm := sm.dpTrial(t, h, refr, dp.atol)
	if !(errNorm <= 1) {
		dp.h = h * math.Max(0.2, 0.9*math.Pow(errNorm, -0.2))
		if math.IsNaN(errNorm) || math.IsInf(errNorm, 0) {
			dp.h = h * 0.2
		}
		dp.rejected = true
		return t, nil
	}
	sm.tr.Steps++
	grow := 5.0
	if dp.rejected {
		grow = 1 // no growth right after a rejection (Hairer, Nørsett & Wanner, Solving ODEs I, II.4)
	}
	dp.rejected = false
	dp.h = h * math.Min(grow, math.Max(0.2, 0.9*math.Pow(math.Max(errNorm, 1e-10), -0.2)))
	return sm.dpAccept(dp, t, h, e)
}

// dpTrial computes the stages of a step of length h into sm.k, the fifth-order
// result into sm.y1 and returns the scaled RMS error estimate.
func (sm *sim) dpTrial(t, h float64, refr bool, atol []float64) float64 {
	y, tmp := sm.y, sm.tmp
	for s := 1; s < 6; s++ {
		for i := range y {
			acc := y[i]
			for j := 0; j < s; j++ {
				acc += h * dpA[s][j] * sm.k[j][i]
			}
			tmp[i] = acc
		}
		sm.deriv(sm.k[s], t+dpC[s]*h, tmp, refr)
	}
	for i := range y {
		acc := y[i]
		for j := 0; j < 6; j++ {
			acc += h * dpB[j] * sm.k[j][i]
		}
		sm.y1[i] = acc
	}
	sm.deriv(sm.k[6], t+h, sm.y1, refr)
	sum := 0.0
	for i := range y {
		er := 0.0
		for j := 0; j < 7; j++ {
			er += dpE[j] * sm.k[j][i]
		}
		sc := atol[i] + sm.st.RTol*math.Max(math.Abs(y[i]), math.Abs(sm.y1[i]))
		sum += (h * er / sc) * (h * er / sc)
	}
	return math.Sqrt(sum / float64(len(y)))
}

// dpDense writes the interpolated state at t + θh into dst.
func (sm *sim) dpDense(dst []float64, theta, h float64) {
	th2 := theta * theta
	pw := [4]float64{theta, th2, th2 * theta, th2 * th2}
	for i := range dst {
		acc := 0.0
		for j := 0; j < 7; j++ {
			c := dpP[j][0]*pw[0] + dpP[j][1]*pw[1] + dpP[j][2]*pw[2] + dpP[j][3]*pw[3]
			acc += sm.k[j][i] * c
		}
		dst[i] = sm.y[i] + h*acc
	}
}

// dpAccept handles spikes and samples in an accepted step [t, t+h] and returns the
// time the next step starts from.
func (sm *sim) dpAccept(dp *dopri, t, h, e float64) (float64, error) {
	end := t + h
	if end >= e || e-end < 1e-12*h {
		end = e
	}
	if sm.rs != nil && !sm.refractory(t) && !(sm.y1[0] < sm.rs.Peak()) {
		theta := sm.denseRoot(dp, h, sm.rs.Peak())
		ts := t + theta*h
		sm.dpSamples(dp, t, h, ts)
		sm.dpDense(dp.dense, theta, h)
		copy(sm.y, dp.dense)
		dp.fresh, dp.h = true, math.Max(dp.h, sm.dt/10)
		return ts, sm.fire(ts, sm.y)
	}
	if err := sm.checkFiniteState(end, sm.y1); err != nil {
		return end, err
	}
	if sm.y[0] < sm.det && sm.y1[0] >= sm.det {
		if err := sm.spike(t + h*sm.denseRoot(dp, h, sm.det)); err != nil {
			return end, err
		}
	}
	sm.dpSamples(dp, t, h, end)
	copy(sm.y, sm.y1)
	copy(sm.k[0], sm.k[6]) // first same as last
	dp.fresh = end == e    // a segment boundary may change the input or the hold
	return end, nil
}

// denseRoot returns θ in [0, 1] where the interpolated y[0] first reaches c, by
// bisection (y[0](0) < c ≤ y[0](1)).
func (sm *sim) denseRoot(dp *dopri, h, c float64) float64 {
	lo, hi := 0.0, 1.0
	for i := 0; i < 60; i++ {
		mid := 0.5 * (lo + hi)
		sm.dpDense(dp.dense, mid, h)
		if dp.dense[0] < c {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// dpSamples records the kept grid points in (t, upto] from the interpolant.
func (sm *sim) dpSamples(dp *dopri, t, h, upto float64) {
	for dp.kNext <= sm.n {
		tk := sm.gridTime(dp.kNext)
		if tk > upto {
			return
		}
		sm.dpDense(dp.dense, (tk-t)/h, h)
		if sm.refractory(t) {
			dp.dense[0] = sm.held
		}
		sm.record(dp.kNext, tk, dp.dense)
		if dp.kNext == sm.n {
			dp.kNext++
			return
		}
		dp.kNext = min(dp.kNext+sm.st.Every, sm.n)
	}
}
