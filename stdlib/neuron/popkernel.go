package neuron

import (
	"context"
	"math"
)

// run integrates the chunk over the whole schedule.
func (c *chunk) run(ctx context.Context) error {
	sc := c.sc
	next := 0 // next change index
	for k := 0; k < sc.n; k++ {
		if k%256 == 0 {
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		a, b := sc.time(k), sc.time(k+1)
		if sc.samples != nil {
			c.setInput(sc.samples[k])
		}
		for next < len(sc.times) && sc.times[next] <= a {
			c.setInput(sc.values[next])
			next++
		}
		if next < len(sc.times) && sc.times[next] < b || (k == sc.n-1 && !sc.lastFull()) {
			next = c.splitStep(a, b, next)
			c.requeue(k)
			continue
		}
		c.fastStep(k, a, b)
	}
	return nil
}

// lastFull reports whether the last grid step has the full length dt.
func (sc *schedule) lastFull() bool { return sc.dur-float64(sc.n-1)*sc.dt == sc.dt }

// setInput moves every neuron to a new shared input I, keeping V continuous.
func (c *chunk) setInput(in float64) {
	n := len(c.w)
	w, base, r, vinf, vth, wth := c.w, c.base[:n], c.r[:n], c.vinf[:n], c.vth[:n], c.wth[:n]
	for j := range w {
		v := base[j] + r[j]*in
		w[j] += vinf[j] - v
		vinf[j] = v
		wth[j] = vth[j] - v
	}
}

// fastStep advances all neurons over the full grid step k = [a, b] with the
// precomputed decays; only neurons that cross threshold leave the loop. The loop
// goes four neurons at a time and stores a group only when none of it crosses, so a
// crossing group is redone one by one from its unchanged start values; refractory
// neurons ride along with decay 1, held at reset.
func (c *chunk) fastStep(k int, a, b float64) {
	w := c.w
	n := len(w)
	dc, wth := c.dc[:n], c.wth[:n]
	j := 0
	for ; j+4 <= n; j += 4 {
		w4, d4, t4 := w[j:j+4:j+4], dc[j:j+4:j+4], wth[j:j+4:j+4]
		y0, y1, y2, y3 := w4[0]*d4[0], w4[1]*d4[1], w4[2]*d4[2], w4[3]*d4[3]
		if y0 >= t4[0] || y1 >= t4[1] || y2 >= t4[2] || y3 >= t4[3] {
			c.stepEach(j, j+4, k, a, b)
			continue
		}
		w4[0], w4[1], w4[2], w4[3] = y0, y1, y2, y3
	}
	c.stepEach(j, n, k, a, b)
	c.release(k, b)
}

// stepEach advances neurons lo..hi-1 over grid step k = [a, b] one by one.
func (c *chunk) stepEach(lo, hi, k int, a, b float64) {
	for j := lo; j < hi; j++ {
		x := c.w[j]
		y := x * c.dc[j]
		c.w[j] = y
		if y >= c.wth[j] {
			c.cross(j, k, a, b, x)
		}
	}
}

// cross handles neuron j, which started grid step k = [a, b] at w0 and crossed
// threshold: it logs the spike, resets and holds j and queues its release.
func (c *chunk) cross(j, k int, a, b, w0 float64) {
	ts := crossTime(a, b, w0, c.wth[j], c.tau[j])
	c.log.add(j, ts)
	c.w[j] = c.vres[j] - c.vinf[j]
	c.dc[j] = 1 // held at reset
	queued := !math.IsInf(c.relEnd[j], -1)
	c.relEnd[j] = ts + c.ref[j]
	if !queued {
		c.wheel.due(j, k) // checked at the end of this step, like any due neuron
	}
}

// release ends the refractory periods of the neurons due at grid step k that finish
// by b and integrates them from their release time to b; the others wait further.
func (c *chunk) release(k int, b float64) {
	for _, j32 := range c.wheel.take(k) {
		j := int(j32)
		rel := c.relEnd[j]
		if math.IsInf(rel, -1) {
			continue // released already on a split step
		}
		if rel > b {
			c.wheel.add(j, rel, k)
			continue
		}
		c.relEnd[j], c.dc[j] = math.Inf(-1), c.d[j]
		if c.advanceOne(j, rel, b) {
			c.wheel.add(j, c.relEnd[j], k)
		}
	}
}

// requeue rebuilds the release wheel after split step k from the refractory ends,
// which the split step keeps up to date on its own.
func (c *chunk) requeue(k int) {
	c.wheel.clear()
	for j, rel := range c.relEnd {
		if !math.IsInf(rel, -1) {
			c.wheel.add(j, rel, k)
		}
	}
}

// advanceOne integrates non-refractory neuron j over [a, b] at constant input with
// exact crossings; it reports whether j ends refractory (relEnd set, not queued).
func (c *chunk) advanceOne(j int, a, b float64) bool {
	for {
		w1 := c.w[j] * expFast(-(b-a)/c.tau[j])
		if w1 < c.wth[j] {
			c.w[j] = w1
			return false
		}
		ts := crossTime(a, b, c.w[j], c.wth[j], c.tau[j])
		c.log.add(j, ts)
		c.w[j] = c.vres[j] - c.vinf[j]
		if rel := ts + c.ref[j]; rel > b || (rel == b && c.ref[j] > 0) {
			c.relEnd[j], c.dc[j] = rel, 1
			return true
		} else {
			a = rel
		}
	}
}

// crossTime returns when w, starting at w0 at time a and decaying with time constant
// tau, reaches wth: a + τ ln(w0/wth), at most b, or a when w0 is at or beyond wth
// already. The comparison with b does what math.Min does for these finite times.
func crossTime(a, b, w0, wth, tau float64) float64 {
	if !(w0 < wth) {
		return a
	}
	if ts := a + tau*logFast(w0/wth); !(ts > b) {
		return ts
	}
	return b
}

// splitStep advances over [a, b] in pieces at the input changes inside it, with a
// per-neuron exp for each piece, and returns the next change index.
func (c *chunk) splitStep(a, b float64, next int) int {
	sc := c.sc
	for a < b {
		e := b
		if next < len(sc.times) && sc.times[next] < b {
			e = sc.times[next]
		}
		c.slowPiece(a, e)
		if e < b {
			c.setInput(sc.values[next])
			next++
		}
		a = e
	}
	return next
}

// slowPiece advances every neuron over [a, e] without the precomputed decay.
func (c *chunk) slowPiece(a, e float64) {
	for j := range c.w {
		start := a
		if !math.IsInf(c.relEnd[j], -1) {
			if c.relEnd[j] >= e {
				continue
			}
			start = c.relEnd[j]
			c.relEnd[j], c.dc[j] = math.Inf(-1), c.d[j]
		}
		c.advanceOne(j, start, e)
	}
}
