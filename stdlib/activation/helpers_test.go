package activation

import (
	"math"
	"testing"
)

// ulp is the spacing of float64 numbers just above 1.
const ulp = 0x1p-52

// within reports whether got is within abs or rel·|want| of want (whichever
// is larger). NaN matches NaN and equal infinities match, so special values
// can sit in the same tables as ordinary ones.
func within(got, want, abs, rel float64) bool {
	if math.IsNaN(want) || math.IsNaN(got) {
		return math.IsNaN(want) && math.IsNaN(got)
	}
	if math.IsInf(want, 0) || math.IsInf(got, 0) {
		return got == want
	}
	return math.Abs(got-want) <= math.Max(abs, rel*math.Abs(want))
}

// checkClose fails the test with a message naming what was computed.
func checkClose(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !within(got, want, abs, rel) {
		t.Errorf("%s = %.17g, want %.17g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}

// nanFill returns a slice of n NaNs, so entries a call never writes show up.
func nanFill(n int) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = math.NaN()
	}
	return s
}

// allFuncs returns every function of the table at its default parameters.
func allFuncs(t testing.TB) []Func {
	fs := make([]Func, 0, len(Table))
	for _, d := range Table {
		f, err := New(d.Name, nil)
		if err != nil {
			t.Fatalf("New(%q, nil): %v", d.Name, err)
		}
		fs = append(fs, f)
	}
	return fs
}
