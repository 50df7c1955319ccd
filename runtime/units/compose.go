package units

import (
	"slices"
	"strconv"
	"strings"
	"sync"
	"sync/atomic"
)

// pieces are the coherent derived units a dimension without a name may be
// written with, so that mV/ms prints as "V/s" rather than "m^2·kg·s^-4·A^-1".
var pieces = [...]struct {
	sym string
	dim Dim
}{
	{"V", Voltage}, {"S", Conductance}, {"Ω", Resistance}, {"F", Capacitance}, {"C", Charge},
}

// composedSymbol returns the coherent SI symbol of d (scale 1): a piece of
// pieces raised to ±1 or ±2 times base units, when that has fewer factors
// (counting each unit of exponent) than base units alone, else base units.
// Factors with positive exponents come first, each negative one follows a
// "/", so that Parse reads the symbol back: "V/s", "A·s^2", "1/s^2".
func composedSymbol(d Dim) string {
	if d.IsDimensionless() {
		return ""
	}
	if s, ok := composedCache.Load(d); ok {
		return s.(string)
	}
	s := compose(d)
	if composedCount.Add(1) <= maxComposed {
		composedCache.Store(d, s)
	}
	return s
}

// composedCache keeps the symbols of unnamed dimensions already seen, since
// Format is on the display path of every number; it stops growing after
// maxComposed entries, which no real session reaches.
var (
	composedCache sync.Map // Dim → string
	composedCount atomic.Int64
)

const maxComposed = 4096

func compose(d Dim) string {
	bestSym, bestK, bestRest := "", 0, d
	bestCost := cost(d)
	for _, pc := range pieces {
		for _, k := range [...]int{1, -1, 2, -2} {
			p, err := pc.dim.Pow(k)
			if err != nil {
				continue
			}
			rest, err := d.DivChecked(p)
			if err != nil {
				continue
			}
			if c := abs(k) + cost(rest); c < bestCost {
				bestSym, bestK, bestRest, bestCost = pc.sym, k, rest, c
			}
		}
	}
	return render(bestSym, bestK, bestRest)
}

// cost counts the factors of d written in base units: the sum of |exponent|.
func cost(d Dim) int {
	c := 0
	for _, e := range d {
		c += abs(int(e))
	}
	return c
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// render writes piece^k times rest as described for composedSymbol.
func render(piece string, k int, rest Dim) string {
	var b strings.Builder
	factor := func(sym string, e int) {
		b.WriteString(sym)
		if e != 1 {
			b.WriteByte('^')
			b.WriteString(strconv.Itoa(e))
		}
	}
	if piece != "" && k > 0 {
		factor(piece, k)
	}
	for _, i := range brochureOrder {
		if rest[i] > 0 {
			if b.Len() > 0 {
				b.WriteString("·")
			}
			factor(baseSymbols[i], int(rest[i]))
		}
	}
	if b.Len() == 0 {
		b.WriteByte('1')
	}
	if piece != "" && k < 0 {
		b.WriteByte('/')
		factor(piece, -k)
	}
	for _, i := range brochureOrder {
		if rest[i] < 0 {
			b.WriteByte('/')
			factor(baseSymbols[i], -int(rest[i]))
		}
	}
	return b.String()
}

// selectKth returns the k-th smallest element of x (k from 0), reordering x.
// It is a quickselect with a median-of-three pivot and a three-way partition,
// so runs of equal values (common in recorded traces) cost one pass; if the
// partitions keep coming out lopsided it sorts the remaining range, so the
// worst case stays O(n log n).
func selectKth(x []float64, k int) float64 {
	lo, hi := 0, len(x)-1
	for budget := 2 * bitLen(len(x)); lo < hi; budget-- {
		if budget == 0 {
			slices.Sort(x[lo : hi+1])
			break
		}
		lt, gt := partition3(x, lo, hi)
		switch {
		case k < lt:
			hi = lt - 1
		case k > gt:
			lo = gt + 1
		default:
			return x[k]
		}
	}
	return x[k]
}

// partition3 orders x[lo..hi] around a median-of-three pivot into values
// below it, equal to it (x[lt..gt]) and above it (Dijkstra's three-way
// partition), and returns lt and gt.
func partition3(x []float64, lo, hi int) (lt, gt int) {
	a, b, c := x[lo], x[lo+(hi-lo)/2], x[hi]
	pivot := max(min(a, b), min(max(a, b), c))
	lt, gt = lo, hi
	for i := lo; i <= gt; {
		switch v := x[i]; {
		case v < pivot:
			x[lt], x[i] = v, x[lt]
			lt++
			i++
		case v > pivot:
			x[gt], x[i] = v, x[gt]
			gt--
		default:
			i++
		}
	}
	return lt, gt
}

func bitLen(n int) int {
	b := 0
	for ; n > 0; n >>= 1 {
		b++
	}
	return b
}
