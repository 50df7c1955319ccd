package units

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// FuzzParse checks that no input makes Parse panic or hang, that every
// failure is an *Error that points inside the text, and that every unit it
// accepts has a usable scale and a canonical Symbol that parses back to the
// same unit exactly (the same atoms give the same scale with no new
// rounding). The seed corpus is in testdata/fuzz/FuzzParse.
func FuzzParse(f *testing.F) {
	for _, s := range []string{"ms", "mS/cm^2", "1/ms", "°C", "mV/", "μF·cm^-2"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, text string) {
		u, err := Parse(text)
		if err != nil {
			var e *Error
			if !errors.As(err, &e) || !strings.HasPrefix(err.Error(), "units: ") {
				t.Fatalf("Parse(%q): error %v is not a units *Error", text, err)
			}
			if e.Offset < 0 || e.Offset > len(text) {
				t.Fatalf("Parse(%q): offset %d outside the text", text, e.Offset)
			}
			return
		}
		if !(u.Scale > 0) || math.IsInf(u.Scale, 0) {
			t.Fatalf("Parse(%q): scale %g", text, u.Scale)
		}
		if u.IsAffine() && u.Symbol != "°C" {
			t.Fatalf("Parse(%q): affine unit %q", text, u.Symbol)
		}
		back, err := Parse(u.Symbol)
		if err != nil {
			t.Fatalf("Parse(%q).Symbol %q does not parse: %v", text, u.Symbol, err)
		}
		if back != u {
			t.Fatalf("Parse(%q) = %+v but its symbol parses to %+v", text, u, back)
		}
	})
}
