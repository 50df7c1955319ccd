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
			continue
		}
		c.fastStep(a, b)
	}
	return nil
}

// lastFull reports whether the last grid step has the full length dt.
func (sc *schedule) lastFull() bool { return sc.dur-float64(sc.n-1)*sc.dt == sc.dt }

// setInput moves every neuron to a new shared input I, keeping V continuous.
func (c *chunk) setInput(in float64) {
	for j := range c.w {
		v := c.base[j] + c.r[j]*in
		c.w[j] += c.vinf[j] - v
		c.vinf[j] = v
		c.wth[j] = c.vth[j] - v
	}
}

// fastStep advances all neurons over a full step with the precomputed decays; only
// spiking and refractory neurons leave the loop.
func (c *chunk) fastStep(a, b float64) {
	w := c.w
	dc, wth := c.dc[:len(w)], c.wth[:len(w)]
	for j := range w {
		x := w[j]
		y := x * dc[j]
		w[j] = y
		if y >= wth[j] {
			c.cross(j, a, b, x)
		}
	}
	c.release(b)
}

// cross handles neuron j, which started the step [a, b] at w0 and crossed threshold.
func (c *chunk) cross(j int, a, b, w0 float64) {
	ts := a
	if w0 < c.wth[j] {
		ts = math.Min(a+c.tau[j]*math.Log(w0/c.wth[j]), b)
	}
	c.spikes[j] = append(c.spikes[j], ts)
	c.w[j] = c.vres[j] - c.vinf[j]
	c.dc[j] = 1 // held at reset
	if math.IsInf(c.relEnd[j], -1) {
		c.list = append(c.list, int32(j))
	}
	c.relEnd[j] = ts + c.ref[j]
}

// release ends the refractory periods that finish by b and integrates those neurons
// from their release time to b.
func (c *chunk) release(b float64) {
	keep := c.list[:0]
	for _, j32 := range c.list {
		j := int(j32)
		if c.relEnd[j] > b {
			keep = append(keep, j32)
			continue
		}
		a := c.relEnd[j]
		c.relEnd[j], c.dc[j] = math.Inf(-1), c.d[j]
		if c.advanceOne(j, a, b) {
			keep = append(keep, j32)
		}
	}
	c.list = keep
}

// advanceOne integrates non-refractory neuron j over [a, b] at constant input with
// exact crossings; it reports whether j ends refractory (then it is not in c.list
// and the caller keeps it).
func (c *chunk) advanceOne(j int, a, b float64) bool {
	for {
		w1 := c.w[j] * math.Exp(-(b-a)/c.tau[j])
		if w1 < c.wth[j] {
			c.w[j] = w1
			return false
		}
		ts := a
		if c.w[j] < c.wth[j] {
			ts = math.Min(a+c.tau[j]*math.Log(c.w[j]/c.wth[j]), b)
		}
		c.spikes[j] = append(c.spikes[j], ts)
		c.w[j] = c.vres[j] - c.vinf[j]
		if rel := ts + c.ref[j]; rel > b || (rel == b && c.ref[j] > 0) {
			c.relEnd[j], c.dc[j] = rel, 1
			return true
		} else {
			a = rel
		}
	}
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
	c.list = c.list[:0]
	for j := range c.w {
		start := a
		if !math.IsInf(c.relEnd[j], -1) {
			if c.relEnd[j] >= e {
				c.list = append(c.list, int32(j))
				continue
			}
			start = c.relEnd[j]
			c.relEnd[j], c.dc[j] = math.Inf(-1), c.d[j]
		}
		if c.advanceOne(j, start, e) {
			c.list = append(c.list, int32(j))
		}
	}
}
