package display

import (
	"math"
	"slices"
	"testing"
)

// TestDecimateCases checks the kept indices on small hand-worked inputs:
// in each column the first, lowest, highest and last sample in index order
// (the min/max reduction per pixel column, common practice for drawing
// long time series).
func TestDecimateCases(t *testing.T) {
	nan := math.NaN()
	unit := func(x float64) int { return int(math.Floor(x)) } // one column per x unit
	cases := []struct {
		name string
		x, y []float64
		want []int
	}{
		{"one column", []float64{0, 0.2, 0.4, 0.6, 0.8}, []float64{1, 5, -2, 3, 0}, []int{0, 1, 2, 4}},
		{"min before max", []float64{0, 0.5, 0.7, 0.9}, []float64{0, -1, 4, 2}, []int{0, 1, 2, 3}},
		{"two columns", []float64{0, 0.5, 1, 1.5}, []float64{1, 2, 3, 4}, []int{0, 1, 2, 3}},
		{"gap", []float64{0, 0.5, 1, 1.5, 2}, []float64{1, 2, nan, 4, 5}, []int{0, 1, Break, 3, 4}},
		{"leading NaN", []float64{0, 1}, []float64{nan, 2}, []int{1}},
		{"all NaN", []float64{0, 1}, []float64{nan, nan}, nil},
		{"single", []float64{3}, []float64{7}, []int{0}},
	}
	for _, c := range cases {
		got := Decimate(nil, c.x, c.y, unit)
		if !slices.Equal(got, c.want) {
			t.Errorf("%s: kept %v, want %v", c.name, got, c.want)
		}
	}
}

// TestDecimateBound checks at most four points per column survive and the
// inputs are left unchanged.
func TestDecimateBound(t *testing.T) {
	tm, v := demoTrace(200_000)
	before := slices.Clone(v)
	cols := 1000
	col := func(x float64) int { return int(x / tm[len(tm)-1] * float64(cols-1)) }
	got := Decimate(nil, tm, v, col)
	if len(got) > 4*cols {
		t.Errorf("kept %d points for %d columns, want at most %d", len(got), cols, 4*cols)
	}
	if !slices.Equal(before, v) {
		t.Error("Decimate modified its input")
	}
	if !slices.IsSorted(got) {
		t.Error("kept indices are not in order")
	}
}
