package neuron

import (
	"math"
	"math/big"
)

// logFast returns the natural logarithm of x to within one unit in the last place
// (the sweeps in logfast_test.go find it within one ulp of math.Log everywhere),
// without a division, for the exact threshold crossings of the population kernel,
// which take one logarithm per spike. Zero, negative, subnormal, infinite and NaN
// arguments go to math.Log.
//
// It writes x = 2^k·z with z in [0.707, 1.414), so that k = 0 near 1 and nothing
// cancels there, picks the subinterval of z from the top seven bits of its
// mantissa, and uses the identity
//
//	ln x = k·ln2 − ln(1/c) + ln(1 + r),   r = z·(1/c) − 1,
//
// where 1/c is a double near the inverse of the subinterval's centre (exactly 1 on
// the two subintervals beside 1, where r = z − 1 is exact) and −ln(1/c) comes from
// a table correct to about 2^-85. Because the fused multiply-add rounds r once and
// |r| ≤ 2^-7, ln(1 + r) needs only its Taylor polynomial to r⁸ (the first term left
// out is below 2^-66). The large terms are summed with their rounding error kept
// (Knuth's Fast2Sum, The Art of Computer Programming vol. 2, §4.2.2), so the result
// carries one final rounding plus at most a quarter ulp from r.
func logFast(x float64) float64 {
	if !(x >= 0x1p-1022 && x <= math.MaxFloat64) {
		return math.Log(x)
	}
	ix := math.Float64bits(x)
	tmp := ix - logOff
	k := int64(tmp) >> 52 // arithmetic shift: negative below logOff
	e := &logTable[(tmp>>45)&(logN-1)]
	z := math.Float64frombits(ix - tmp&(0xfff<<52))
	r := math.FMA(z, e.invc, -1)
	kf := float64(k)
	t := kf*ln2Hi32 + e.logcHi // exact: both are multiples of 2^-32 below 2^11
	hi := t + r
	lo := (t - hi) + r // exact as |t| ≥ |r| or t = 0
	r2 := r * r
	p := r2*(-0.5+r*(1.0/3)) + r2*r2*((-0.25+r*0.2)+r2*((-1.0/6+r*(1.0/7))+r2*-0.125))
	return hi + (lo + (kf*ln2Lo32 + e.logcLo) + p)
}

const (
	logN    = 128                // subintervals of z
	logOff  = 0x3fe6a00000000000 // bits of 0.70703125, a multiple of 2^45 so 1.0 starts a subinterval
	ln2Hi32 = 6.93147180369123816490e-01
	ln2Lo32 = 1.90821492927058770002e-10 // ln2 − ln2Hi32 (fdlibm's split, low 21 bits of ln2Hi32 zero)
)

// logEntry is one subinterval of logFast: the inverse centre and −ln(invc) as a
// multiple of 2^-32 plus a remainder.
type logEntry struct{ invc, logcHi, logcLo float64 }

// logTable is built once with math/big, so its logarithms do not depend on
// math.Log's own rounding.
var logTable = func() (t [logN]logEntry) {
	for i := range t {
		lo := math.Float64frombits(logOff + uint64(i)<<45)
		hi := math.Float64frombits(logOff + uint64(i+1)<<45)
		invc := 2 / (lo + hi)
		if lo == 1 || hi == 1 {
			invc = 1 // r = z − 1 exactly beside 1
		}
		l := bigLog(invc)
		l.Neg(l)
		f, _ := l.Float64()
		h := math.Round(f*0x1p32) / 0x1p32
		rest, _ := new(big.Float).SetPrec(logPrec).Sub(l, big.NewFloat(h)).Float64()
		t[i] = logEntry{invc, h, rest}
	}
	return t
}()

// logPrec is the working precision of bigLog, bits.
const logPrec = 160

// bigLog returns ln y for y in [0.5, 2] to about 2^-150 from the series
// ln y = 2·atanh(s) = 2(s + s³/3 + s⁵/5 + …), s = (y − 1)/(y + 1).
func bigLog(y float64) *big.Float {
	newF := func() *big.Float { return new(big.Float).SetPrec(logPrec) }
	one := newF().SetInt64(1)
	yb := newF().SetFloat64(y)
	s := newF().Quo(newF().Sub(yb, one), newF().Add(yb, one))
	s2 := newF().Mul(s, s)
	sum, pow := newF().Set(s), newF().Set(s)
	eps := newF().SetMantExp(one, -logPrec)
	for n := int64(3); ; n += 2 {
		pow.Mul(pow, s2)
		term := newF().Quo(pow, newF().SetInt64(n))
		if newF().Abs(term).Cmp(eps) < 0 {
			break
		}
		sum.Add(sum, term)
	}
	return sum.Add(sum, sum)
}
