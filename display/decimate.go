package display

import "math"

// Break is the index Decimate writes where a line must be broken (at a
// non-finite sample).
const Break = -1

// Decimate appends to dst the indices of the samples of the line (x, y)
// that must be drawn for it to look the same at the resolution given by
// column, and returns the extended slice. column maps an x value to the
// index of the pixel column it falls in; it must not decrease along x
// (Decimate is meant for x sorted ascending, as in a time trace).
//
// Within each run of consecutive finite samples in one column it keeps the
// first, the lowest, the highest and the last sample, in their original
// order, so that the drawn line reaches every extremum of every column and
// joins the columns exactly as the full line would. A sample whose x or y
// is not finite ends the run and is replaced by one Break, so the line
// shows a gap. At most four indices per column and run are kept, whatever
// the length of the input. The inputs are not modified; the loop does not
// allocate beyond growing dst. It panics if len(x) != len(y).
func Decimate(dst []int, x, y []float64, column func(x float64) int) []int {
	if len(x) != len(y) {
		panic("display: Decimate: x and y have different lengths")
	}
	run := runState{first: -1}
	for i := range x {
		xi, yi := x[i], y[i]
		if math.IsNaN(xi) || math.IsInf(xi, 0) || math.IsNaN(yi) || math.IsInf(yi, 0) {
			dst = run.flush(dst)
			if len(dst) > 0 && dst[len(dst)-1] != Break {
				dst = append(dst, Break)
			}
			continue
		}
		c := column(xi)
		if run.first >= 0 && c != run.col {
			dst = run.flush(dst)
		}
		run.push(i, c, yi, y)
	}
	return run.flush(dst)
}

// runState is the part of one column's run seen so far.
type runState struct {
	col                 int
	first, lo, hi, last int
	loY, hiY            float64
}

func (r *runState) push(i, c int, yi float64, y []float64) {
	if r.first < 0 {
		*r = runState{col: c, first: i, lo: i, hi: i, last: i, loY: yi, hiY: yi}
		return
	}
	r.last = i
	if yi < r.loY {
		r.lo, r.loY = i, yi
	}
	if yi > r.hiY {
		r.hi, r.hiY = i, yi
	}
}

// flush appends the run's kept indices in increasing order, without
// repeats, and empties the run.
func (r *runState) flush(dst []int) []int {
	if r.first < 0 {
		return dst
	}
	a, b := r.lo, r.hi
	if a > b {
		a, b = b, a
	}
	prev := -2
	for _, k := range [4]int{r.first, a, b, r.last} {
		if k != prev {
			dst = append(dst, k)
			prev = k
		}
	}
	r.first = -1
	return dst
}
