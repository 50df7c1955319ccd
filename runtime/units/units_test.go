package units

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// near reports whether got is within absTol or relTol·|want| of want; NaN
// matches only NaN and an infinity only itself. It is the one tolerance
// helper of this package's tests; each caller says why its tolerance is what
// it is.
func near(got, want, absTol, relTol float64) bool {
	if math.IsNaN(want) || math.IsInf(want, 0) {
		return math.IsNaN(got) && math.IsNaN(want) || got == want
	}
	d := math.Abs(got - want)
	return d <= absTol || d <= relTol*math.Abs(want)
}

// siDim builds a Dim from exponents written per SI base unit symbol, so the
// expectations below read like the SI Brochure rather than like Dim's order.
func siDim(exps map[string]int8) Dim {
	var d Dim
	for sym, e := range exps {
		i := map[string]int{"s": 0, "m": 1, "kg": 2, "A": 3, "K": 4, "mol": 5, "cd": 6}[sym]
		d[i] = e
	}
	return d
}

// TestPrefixes checks every decimal prefix against its factor.
// Source: BIPM, The International System of Units (SI Brochure), 9th edition
// (2019), table 7. Tolerance 0: math.Pow10 and a decimal literal both give
// the float64 nearest to 10^n, and the prefixed unit has no other rounding.
func TestPrefixes(t *testing.T) {
	t.Parallel()
	cases := []struct {
		prefix string
		factor float64
	}{
		{"f", 1e-15}, {"p", 1e-12}, {"n", 1e-9}, {"u", 1e-6}, {"µ", 1e-6}, {"μ", 1e-6},
		{"m", 1e-3}, {"c", 1e-2}, {"k", 1e3}, {"M", 1e6}, {"G", 1e9}, {"T", 1e12},
	}
	for _, c := range cases {
		for _, name := range []string{"s", "m", "A", "V", "S", "F", "C", "Hz", "Ohm", "mol", "K"} {
			u, err := Parse(c.prefix + name)
			if err != nil {
				t.Errorf("Parse(%q): %v", c.prefix+name, err)
				continue
			}
			if !near(u.Scale, c.factor, 0, 0) {
				t.Errorf("Parse(%q).Scale = %g, want %g", c.prefix+name, u.Scale, c.factor)
			}
		}
		// The gram carries the kilo of the base unit kg: 1 g = 1e-3 kg.
		if u, err := Parse(c.prefix + "g"); err != nil || !near(u.Scale, c.factor*1e-3, 0, 1e-15) {
			t.Errorf("Parse(%q) = %v, %v; want scale %g", c.prefix+"g", u.Scale, err, c.factor*1e-3)
		}
	}
}

// TestDerivedUnits checks the coherent derived units in SI base units.
// Source: SI Brochure, 9th edition (2019), table 4 (V, S, F, Ω, Hz, C), and
// table 8 for the litre (1 L = 1 dm³ = 1e-3 m³) and the minute and hour.
// The molar, mol/L, is common practice (IUPAC Green Book, 3rd edition, §2.10).
func TestDerivedUnits(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text  string
		dim   Dim
		named Dim
		scale float64
	}{
		{"V", siDim(map[string]int8{"kg": 1, "m": 2, "s": -3, "A": -1}), Voltage, 1},
		{"S", siDim(map[string]int8{"kg": -1, "m": -2, "s": 3, "A": 2}), Conductance, 1},
		{"F", siDim(map[string]int8{"kg": -1, "m": -2, "s": 4, "A": 2}), Capacitance, 1},
		{"Ohm", siDim(map[string]int8{"kg": 1, "m": 2, "s": -3, "A": -2}), Resistance, 1},
		{"Hz", siDim(map[string]int8{"s": -1}), Frequency, 1},
		{"C", siDim(map[string]int8{"A": 1, "s": 1}), Charge, 1},
		{"L", siDim(map[string]int8{"m": 3}), Volume, 1e-3},
		{"M", siDim(map[string]int8{"mol": 1, "m": -3}), Concentration, 1e3},
		{"min", siDim(map[string]int8{"s": 1}), Time, 60},
		{"h", siDim(map[string]int8{"s": 1}), Time, 3600},
		{"kg*m^2/s^3/A", siDim(map[string]int8{"kg": 1, "m": 2, "s": -3, "A": -1}), Voltage, 1},
	}
	for _, c := range cases {
		u, err := Parse(c.text)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.text, err)
			continue
		}
		if u.Dim != c.dim || c.named != c.dim || !near(u.Scale, c.scale, 0, 1e-15) {
			t.Errorf("Parse(%q) = %v %v, want %v %v (named %v)", c.text, u.Scale, u.Dim.SIForm(), c.scale, c.dim.SIForm(), c.named.SIForm())
		}
	}
	// S = Ω⁻¹ (SI Brochure table 4).
	if inv, _ := Resistance.Pow(-1); inv != Conductance {
		t.Errorf("Ω^-1 = %v, want S", inv.SIForm())
	}
	// V = A·Ω and C = F·V (table 4 relations).
	if Current.Mul(Resistance) != Voltage || Capacitance.Mul(Voltage) != Charge {
		t.Error("A·Ω must be V and F·V must be C")
	}
}

// TestCompounds checks the scale of the trade's compound units. Each scale
// is worked out from table 7 of the SI Brochure in the comment; tolerance is
// one rounding of 10^n (rel 1.2e-16 rounded up to 2e-16), since Parse keeps
// the power of ten exact and rounds once.
func TestCompounds(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text, symbol string
		scale        float64
		dim          Dim
	}{
		{"uA/cm^2", "µA/cm^2", 1e-2, CurrentDensity},     // 1e-6 A / 1e-4 m² = 1e-2 A/m²
		{"µA/cm^2", "µA/cm^2", 1e-2, CurrentDensity},     // micro sign U+00B5
		{"μF/cm^2", "µF/cm^2", 1e-2, CapacitanceDensity}, // Greek mu U+03BC
		{"mS/cm^2", "mS/cm^2", 10, ConductanceDensity},   // 1e-3 S / 1e-4 m²
		{"nS", "nS", 1e-9, Conductance},
		{"pF", "pF", 1e-12, Capacitance},
		{"MOhm", "MΩ", 1e6, Resistance},
		{"MΩ", "MΩ", 1e6, Resistance},
		{"kohm", "kΩ", 1e3, Resistance},
		{"Ohm", "Ω", 1, Resistance},
		{"kHz", "kHz", 1e3, Frequency},
		{"s^-1", "s^-1", 1, Frequency},
		{"1/ms", "1/ms", 1e3, Frequency},
		{"mV/ms", "mV/ms", 1, Voltage.Div(Time)},
		{"mV/ms/cm", "mV/ms/cm", 1e2, Voltage.Div(Time).Div(Length)}, // left to right
		{"mol", "mol", 1, Amount},
		{"mM", "mM", 1, Concentration}, // 1e-3 mol / 1e-3 m³
		{"uM", "µM", 1e-3, Concentration},
		{"um", "µm", 1e-6, Length},
		{"µm^2", "µm^2", 1e-12, Area},
		{"K", "K", 1, Temperature},
		{"Hz", "Hz", 1, Frequency},
		{"m", "m", 1, Length},
		{"mm", "mm", 1e-3, Length},
		{"ms", "ms", 1e-3, Time},
		{"mS", "mS", 1e-3, Conductance},
		{"C", "C", 1, Charge},
		{" mV / ms ", "mV/ms", 1, Voltage.Div(Time)},
		{"kΩ·cm^2", "kΩ·cm^2", 1e-1, SpecificResistance}, // 1e3 Ω · 1e-4 m²
		{"m^2·kg·s^-3·A^-1", "m^2·kg·s^-3·A^-1", 1, Voltage},
		{" mS / cm ^ 2", "mS/cm^2", 10, ConductanceDensity},
		{"µA/cm²", "µA/cm^2", 1e-2, CurrentDensity}, // superscripts as pasted
		{"s⁻¹", "s^-1", 1, Frequency},
		{"m¹⁰/m⁹", "m^10/m^9", 1, Length},
		{"1", "1", 1, Dimensionless},
		{"m/m", "m/m", 1, Dimensionless},
	}
	for _, c := range cases {
		u, err := Parse(c.text)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.text, err)
			continue
		}
		if u.Symbol != c.symbol || u.Dim != c.dim || !near(u.Scale, c.scale, 0, 2e-16) || u.Offset != 0 {
			t.Errorf("Parse(%q) = %+v, want %s scale %g dim %v", c.text, u, c.symbol, c.scale, c.dim.SIForm())
		}
	}
}

// TestCelsius checks the degree Celsius against T/°C = T/K − 273.15
// (SI Brochure, 9th edition, §2.3.1). Tolerance 1e-12 K: one float64
// addition near 300 K rounds by at most 3e-14 K.
func TestCelsius(t *testing.T) {
	t.Parallel()
	for _, text := range []string{"degC", "°C", "℃"} {
		u, err := Parse(text)
		if err != nil {
			t.Fatalf("Parse(%q): %v", text, err)
		}
		cases := []struct{ celsius, kelvin float64 }{{0, 273.15}, {6.3, 279.45}, {-273.15, 0}, {37, 310.15}}
		for _, c := range cases {
			if got := u.ToSI(c.celsius); !near(got, c.kelvin, 1e-12, 0) {
				t.Errorf("%g %s = %g K, want %g K", c.celsius, text, got, c.kelvin)
			}
		}
		if u.Symbol != "°C" || !u.IsAffine() || u.Dim != Temperature {
			t.Errorf("Parse(%q) = %+v", text, u)
		}
	}
}

// TestParseErrors checks that bad units give an *Error that says what is
// wrong, points at it and suggests a close spelling. The expectations are
// this package's own contract (no outside source); the suggestions follow
// the edit distance of Damerau (1964) restricted to adjacent transpositions.
func TestParseErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		text, msg, suggestion string
		offset                int
	}{
		{"mVV", "units: unknown unit mVV; did you mean mV?", "mV", 0},
		{"mv", "did you mean mV?", "mV", 0},       // case alone wins over other edits
		{"hz", "did you mean Hz?", "Hz", 0},       //
		{"Ohms", "did you mean Ohm?", "Ohm", 0},   // one deletion
		{"kOmh", "did you mean kOhm?", "kOhm", 0}, // one transposition
		{"msec", "did you mean ms?", "ms", 0},
		{"sec", "did you mean s?", "s", 0},
		{"mV/mss", "unknown unit mss in mV/mss; did you mean ms?", "ms", 3},
		{"xyz", "unknown unit xyz; write a unit such as", "", 0},
		{"1 degC/s", "affine", "", 2},
		{"degC/s", "write temperature differences and rates in K", "", 0},
		{"°C^2", "cannot be part of a compound unit", "", 0},
		{"k", "k is the prefix kilo, not a unit", "", 0},
		{"µ", "prefix micro, not a unit", "", 0},
		{"", "empty unit", "", 0},
		{"   ", "empty unit", "", 0},
		{"ms mV", "missing operator", "", 3},
		{"mV/", "ends after an operator", "", 3},
		{"(ms)", "unexpected '('", "", 0},
		{"2ms", "unexpected number", "", 0},
		{"cm^", "expected an integer after ^", "", 2},
		{"m^200", "exponent 200", "", 2},
		{"m^99999999999999999999", "too large", "", 2},
		{"m^127*m", "exponent overflow", "", 6},
		{"1.5/s", "unexpected number", "", 0},
		{"10/s", "unexpected number", "", 0},
		{"Tm^40", "beyond the range of float64", "", 0},
		{"m⁻", "expected superscript digits", "", 1},
		{"m¹²⁸", "too large", "", 1},
		{"m^ ", "expected an integer after ^", "", 1},
	}
	for _, c := range cases {
		_, err := Parse(c.text)
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("Parse(%q) error = %v, want *Error", c.text, err)
			continue
		}
		if !strings.HasPrefix(err.Error(), "units: ") || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("Parse(%q) error = %q, want it to contain %q", c.text, err, c.msg)
		}
		if e.Suggestion != c.suggestion || e.Offset != c.offset {
			t.Errorf("Parse(%q): suggestion %q offset %d, want %q %d", c.text, e.Suggestion, e.Offset, c.suggestion, c.offset)
		}
	}
}

// TestExponents checks Pow, Root and the checked products at the edges of
// int8, whose range is -128..127 (Go specification, numeric types).
func TestExponents(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		d    Dim
		n    int
		want Dim
		err  bool
	}{
		{"m^127", Length, 127, Dim{iLength: 127}, false},
		{"m^-128", Length, -128, Dim{iLength: -128}, false},
		{"m^128", Length, 128, Length, true},
		{"(m^2)^64", Area, 64, Area, true},
		{"(m^2)^-64", Area, -64, Dim{iLength: -128}, false},
		{"huge power", Voltage, 1 << 40, Voltage, true},
		{"negative huge power", Voltage, -(1 << 40), Voltage, true},
		{"dimensionless to any power", Dimensionless, 1 << 40, Dimensionless, false},
		{"(V)^-1", Voltage, -1, Dim{3, -2, -1, 1, 0, 0, 0}, false},
		{"x^0", Charge, 0, Dimensionless, false},
	}
	for _, c := range cases {
		got, err := c.d.Pow(c.n)
		if (err != nil) != c.err || got != c.want {
			t.Errorf("%s: Pow = %v, %v; want %v, error %v", c.name, got, err, c.want, c.err)
		}
		if err != nil && !strings.HasPrefix(err.Error(), "units: exponent overflow") {
			t.Errorf("%s: error %q", c.name, err)
		}
	}
	big := Dim{iLength: 100}
	if _, err := big.MulChecked(big); err == nil {
		t.Error("m^100 · m^100 must overflow")
	}
	if _, err := big.DivChecked(Dim{iLength: -100}); err == nil {
		t.Error("m^100 / m^-100 must overflow")
	}
	if got, err := Area.MulChecked(Length); err != nil || got != Volume || got != Area.Mul(Length) {
		t.Errorf("m^2·m = %v, %v", got, err)
	}
	if got, err := Area.Root(2); err != nil || got != Length {
		t.Errorf("√(m^2) = %v, %v", got, err)
	}
	for _, n := range []int{0, -2} {
		if _, err := Area.Root(n); err == nil {
			t.Errorf("Root(%d) must fail", n)
		}
	}
	if _, err := Time.Root(2); err == nil || !strings.Contains(err.Error(), "fractional exponent of s") {
		t.Errorf("√s error = %v", err)
	}
}
