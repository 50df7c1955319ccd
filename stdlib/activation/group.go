package activation

import (
	"fmt"
	"math"
)

// checkGroup validates the input of a group function: non-empty, no NaN,
// no +Inf (whose limit depends on how fast the entries grow), and not all
// −Inf. It returns the index of the first maximum.
func checkGroup(fn string, src []float64) (int, error) {
	if len(src) == 0 {
		return 0, fmt.Errorf("activation: %s of an empty vector is undefined; pass at least one value", fn)
	}
	best := 0
	for i, z := range src {
		switch {
		case math.IsNaN(z):
			return 0, fmt.Errorf("activation: %s input %d is NaN, which would make every output NaN; remove or replace missing values first", fn, i)
		case math.IsInf(z, 1):
			return 0, fmt.Errorf("activation: %s input %d is +Inf, whose limit is ambiguous; use large finite values instead", fn, i)
		case z > src[best]:
			best = i
		}
	}
	if math.IsInf(src[best], -1) {
		return 0, fmt.Errorf("activation: %s input is −Inf everywhere, so no entry can carry weight; at least one value must be finite", fn)
	}
	return best, nil
}

// checkTemp validates a softmax temperature.
func checkTemp(fn string, t float64) error {
	if !(t > 0) || math.IsInf(t, 1) {
		return fmt.Errorf("activation: %s temperature must be positive and finite, got %v; use 1 for the plain %s, or OneHot for the limit T → 0", fn, t, fn)
	}
	return nil
}

// shiftedSum fills dst with e^((z_i − m)/T), where m = src[best] is the
// maximum, and returns the sum over i ≠ best (the term at best is exactly 1).
// Shifting by the maximum keeps every exponent ≤ 0, so nothing overflows.
func shiftedSum(dst, src []float64, best int, t float64) float64 {
	m := src[best]
	rest := 0.0
	for i, z := range src {
		e := math.Exp((z - m) / t)
		dst[i] = e
		if i != best {
			rest += e
		}
	}
	return rest
}

// Softmax sets dst[i] = e^(src[i]/T) / Σ_j e^(src[j]/T) with temperature T,
// computed with the maximum subtracted (the log-sum-exp shift) so that
// large inputs such as [1000, 1001, 1002] do not overflow. Entries of −Inf
// get weight 0. It returns an error for an empty input, a NaN or +Inf
// entry, an all −Inf input, or T not positive and finite; dst is then left
// unchanged. It panics if len(dst) != len(src); dst may alias src.
func Softmax(dst, src []float64, t float64) error {
	checkLen(dst, src)
	if err := checkTemp("softmax", t); err != nil {
		return err
	}
	best, err := checkGroup("softmax", src)
	if err != nil {
		return err
	}
	inv := 1 / (1 + shiftedSum(dst, src, best, t))
	for i := range dst {
		dst[i] *= inv
	}
	return nil
}

// LogSoftmax sets dst[i] = log Softmax(src, T)[i] = (src[i] − m)/T −
// log1p(Σ_{j≠k} e^((src[j] − m)/T)), where k is the first maximum m. Using
// log1p of the sum without the maximum's own term keeps full precision when
// one entry dominates. Errors and panics are those of Softmax.
func LogSoftmax(dst, src []float64, t float64) error {
	checkLen(dst, src)
	if err := checkTemp("log_softmax", t); err != nil {
		return err
	}
	best, err := checkGroup("log_softmax", src)
	if err != nil {
		return err
	}
	m := src[best]
	rest := 0.0
	for i, z := range src {
		if i != best {
			rest += math.Exp((z - m) / t)
		}
	}
	lse := math.Log1p(rest)
	for i, z := range src {
		dst[i] = (z-m)/t - lse
	}
	return nil
}

// OneHot sets dst to the limit of Softmax(src, T) as T → 0: the weight is
// split equally among the k entries equal to the maximum (1/k each, 0
// elsewhere), which is the true limit, since tied entries keep equal
// weights at every temperature. Errors and panics are those of Softmax.
func OneHot(dst, src []float64) error {
	checkLen(dst, src)
	best, err := checkGroup("one_hot", src)
	if err != nil {
		return err
	}
	m := src[best]
	k := 0
	for _, z := range src {
		if z == m {
			k++
		}
	}
	w := 1 / float64(k)
	for i, z := range src {
		if z == m {
			dst[i] = w
		} else {
			dst[i] = 0
		}
	}
	return nil
}

// Argmax returns the index of the largest entry of src, the first one on
// ties. It returns an error for an empty input or a NaN entry (NaN has no
// order); ±Inf entries are ordered as usual.
func Argmax(src []float64) (int, error) {
	if len(src) == 0 {
		return 0, fmt.Errorf("activation: argmax of an empty vector is undefined; pass at least one value")
	}
	best := 0
	for i, z := range src {
		if math.IsNaN(z) {
			return 0, fmt.Errorf("activation: argmax input %d is NaN, which has no order; remove or replace missing values first", i)
		}
		if z > src[best] {
			best = i
		}
	}
	return best, nil
}
