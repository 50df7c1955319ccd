package neuron

import "math"

// releaseWheel holds the refractory neurons of a chunk by the grid step at which
// they may be released, so a step touches only the neurons whose period could end in
// it instead of scanning every refractory neuron. The bucket a neuron sits in is a
// lower bound on its release step; the exact test (relEnd ≤ step end, the same
// comparison as a scan) is made when the bucket comes up, and a neuron not yet due
// moves on to a later bucket. Periods longer than the wheel simply go round again.
type releaseWheel struct {
	slots [][]int32 // slot s holds neurons due at steps ≡ s (mod len(slots))
	mask  int
	perDt float64 // 1/dt, s⁻¹
}

// newReleaseWheel sizes the wheel to cover the longest refractory period in ref
// (s) at step dt, as a power of two between 4 and 4096 slots.
func newReleaseWheel(ref []float64, dt float64) releaseWheel {
	longest := 0.0
	for _, r := range ref {
		longest = math.Max(longest, r)
	}
	size := 4
	for size < 4096 && float64(size) < longest/dt+3 {
		size *= 2
	}
	return releaseWheel{slots: make([][]int32, size), mask: size - 1, perDt: 1 / dt}
}

// add queues neuron j, refractory until rel (s), found not yet due at step k.
func (q *releaseWheel) add(j int, rel float64, k int) {
	s := k + 1
	// The release step r has (r+1)·dt ≥ rel, so r ≥ rel/dt − 1; taking off 0.001
	// more covers the rounding of rel·(1/dt) for any run below 10¹² steps, and the
	// float64 comparison keeps huge periods from overflowing int.
	if e := rel*q.perDt - 1.001; e > float64(s) {
		s = k + len(q.slots) - 1
		if e < float64(s) {
			s = int(e)
		}
	}
	q.slots[s&q.mask] = append(q.slots[s&q.mask], int32(j))
}

// due queues neuron j for the check at the end of the current step k.
func (q *releaseWheel) due(j, k int) {
	q.slots[k&q.mask] = append(q.slots[k&q.mask], int32(j))
}

// take empties and returns the bucket of step k; the returned slice stays valid
// until the bucket comes round again.
func (q *releaseWheel) take(k int) []int32 {
	b := q.slots[k&q.mask]
	q.slots[k&q.mask] = b[:0]
	return b
}

// clear empties every bucket, keeping their storage.
func (q *releaseWheel) clear() {
	for i := range q.slots {
		q.slots[i] = q.slots[i][:0]
	}
}

// spikeBlock holds logBlock spikes of a chunk: each neuron's index in the chunk and
// the time (s), in two arrays so an event takes 12 bytes rather than a padded 16.
type spikeBlock struct {
	j [logBlock]int32
	t [logBlock]float64
}

// spikeLog is a chunk's spikes in the order they were found, in fixed-size blocks
// so that growing it never copies what is already logged.
type spikeLog struct {
	blocks []*spikeBlock // the last one is being filled
	used   int           // events in the last block
}

// logBlock is the number of events per block (48 KiB).
const logBlock = 4096

// add logs a spike of neuron j at time t (s).
func (l *spikeLog) add(j int, t float64) {
	if l.used == logBlock || len(l.blocks) == 0 {
		l.blocks, l.used = append(l.blocks, new(spikeBlock)), 0
	}
	b := l.blocks[len(l.blocks)-1]
	b.j[l.used], b.t[l.used] = int32(j), t
	l.used++
}

// each calls f with the neuron indices and times of each block in order.
func (l *spikeLog) each(f func(js []int32, ts []float64)) {
	for i, b := range l.blocks {
		n := logBlock
		if i == len(l.blocks)-1 {
			n = l.used
		}
		f(b.j[:n], b.t[:n])
	}
}

// trains splits the log, in time order per neuron, into one slice per neuron of m,
// all cut from one backing array with their capacity capped so an append by the
// caller cannot run into a neighbour's spikes. Neurons without spikes get nil, as
// per-neuron appends would leave them. It counts first, then allocates once and
// scatters.
func (l *spikeLog) trains(m int) [][]float64 {
	first := make([]int32, m+1) // first[j] becomes neuron j's first index
	l.each(func(js []int32, _ []float64) {
		for _, j := range js {
			first[j+1]++
		}
	})
	for j := 1; j <= m; j++ {
		first[j] += first[j-1]
	}
	all := make([]float64, first[m])
	next := append([]int32(nil), first[:m]...)
	l.each(func(js []int32, ts []float64) {
		ts = ts[:len(js)]
		for i, j := range js {
			all[next[j]] = ts[i]
			next[j]++
		}
	})
	out := make([][]float64, m)
	for j := range out {
		if lo, hi := first[j], first[j+1]; hi > lo {
			out[j] = all[lo:hi:hi]
		}
	}
	return out
}
