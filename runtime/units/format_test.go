package units

import (
	"math"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// TestFormatNumber checks the number part against C's "%.6g" as printed by
// Python 3.11's printf-style formatting ('%.6g' % x, which follows C99
// §7.21.6.1): six significant digits, trailing zeros trimmed, e notation
// below 1e-4 and from 1e6. The one deliberate difference: -0 prints as "0".
func TestFormatNumber(t *testing.T) {
	t.Parallel()
	cases := []struct {
		v    float64
		want string
	}{
		{12.5, "12.5"},
		{-65, "-65"},
		{0.001, "0.001"},
		{1e-4, "0.0001"},
		{9.99999e-5, "9.99999e-05"},
		{1.5e-7, "1.5e-07"},
		{123456.7, "123457"},
		{999999.4, "999999"},
		{999999.6, "1e+06"},
		{1e6, "1e+06"},
		{2.5e6, "2.5e+06"},
		{1.0 / 3, "0.333333"},
		{2.0 / 3 * 1000, "666.667"},
		{100000, "100000"},
		{0.1 + 0.2, "0.3"},
		{1e-300, "1e-300"},
		{math.MaxFloat64, "1.79769e+308"},
		{-5e-324, "-4.94066e-324"},
		{279.45, "279.45"},
		{0, "0"},
		{math.Copysign(0, -1), "0"},
		{math.NaN(), "NaN"},
		{math.Inf(1), "+Inf"},
		{math.Inf(-1), "-Inf"},
	}
	for _, c := range cases {
		if got := FormatNumber(c.v); got != c.want {
			t.Errorf("FormatNumber(%v) = %q, want %q", c.v, got, c.want)
		}
	}
}

// TestFormat checks the readable unit. Every expected string follows from
// the prefix factors of the SI Brochure, 9th edition, table 7; the arithmetic
// is in the comments.
func TestFormat(t *testing.T) {
	t.Parallel()
	vPerS := Voltage.Div(Time)
	cases := []struct {
		si   float64
		d    Dim
		want string
	}{
		{0.0125, Time, "12.5 ms"},                       // 0.0125 s / 1e-3
		{1.5e-9, Current, "1.5 nA"},                     // 1.5e-9 A / 1e-9
		{-0.065, Voltage, "-65 mV"},                     // -0.065 V / 1e-3
		{2, Time, "2 s"},                                //
		{3600, Time, "3600 s"},                          // below 10⁴ s plain seconds read best
		{123456.789, Time, "34.2936 h"},                 // 123456789 ms; 1 h = 3600 s (SI Brochure, table 8)
		{5000, Time, "5000 s"},                          // below 10⁴ s stays in s
		{20000, Time, "5.55556 h"},                      // 20000/3600
		{1.5e4 - 0.5, Time, "4.16653 h"},                // 14999.5/3600
		{1e8, Time, "1e+08 s"},                          // 27778 h: beyond every unit, SI in e notation
		{1e9, Frequency, "1 GHz"},                       // giga = 1e9
		{2.5e6, Frequency, "2.5 MHz"},                   // mega = 1e6
		{1e-20, Current, "1e-20 A"},                     // 1e-8 pA would mix a prefix with e notation
		{5e-16, Current, "5e-16 A"},                     // 0.0005 pA: below 0.001 in the smallest unit
		{2e-15, Current, "0.002 pA"},                    // still plain in the smallest unit
		{1e-15, Capacitance, "0.001 pF"},                //
		{1e-19, Capacitance, "1e-19 F"},                 //
		{1e15, Resistance, "1e+15 Ω"},                   // 10⁶ GΩ
		{5e12, Resistance, "5000 GΩ"},                   // plain below 10⁴ in the largest unit
		{2e-8, Time, "20 ns"},                           //
		{1e-5, CurrentDensity, "1 nA/cm^2"},             // 1e-5 A/m² = 1e-9 A/cm² = 1 nA/cm² (1 cm² = 1e-4 m²)
		{0.1, CurrentDensity, "10 µA/cm^2"},             // 0.1 A/m² = 1e-5 A/cm² = 10 µA/cm²
		{1200, ConductanceDensity, "120 mS/cm^2"},       // 1 mS/cm² = 1e-3 S / 1e-4 m² = 10 S/m²
		{3, ConductanceDensity, "0.3 mS/cm^2"},          // only one display unit
		{1e-2, CapacitanceDensity, "1 µF/cm^2"},         // 1 µF/cm² = 1e-6 F / 1e-4 m² = 1e-2 F/m²
		{2e8, Resistance, "200 MΩ"},                     //
		{4.7e3, Resistance, "4.7 kΩ"},                   //
		{1e-10, Conductance, "100 pS"},                  //
		{2.5e-11, Capacitance, "25 pF"},                 //
		{6.3e-13, Capacitance, "0.63 pF"},               // below the smallest unit: nearest is pF
		{1e-10, Area, "100 µm^2"},                       // 1 µm² = 1e-12 m²
		{1e-6, Area, "1 mm^2"},                          // 1 mm² = 1e-6 m²
		{5e-4, Length, "500 µm"},                        // cm gives 0.05, mm 0.5, µm 500
		{0.05, Length, "5 cm"},                          // cm is listed before mm
		{2.5, Concentration, "2.5 mM"},                  // 1 mM = 1 mol/m³
		{1e-4, Concentration, "100 nM"},                 // 1 nM = 1e-6 mol/m³
		{40, Frequency, "40 Hz"},                        //
		{2500, Frequency, "2.5 kHz"},                    //
		{0.2, Frequency, "0.2 Hz"},                      // below 1 Hz stays in Hz
		{0.99999996, Voltage, "1 V"},                    // rounds to 1000 mV, so one unit up
		{0.9999996e-3, Voltage, "1 mV"},                 // rounds to 1 mV and stays
		{279.45, Temperature, "279.45 K"},               // 6.3 °C
		{0, Time, "0 ms"},                               // the usual unit for zero
		{0, Voltage, "0 mV"},                            //
		{math.NaN(), Voltage, "NaN mV"},                 //
		{math.Inf(1), Time, "+Inf ms"},                  //
		{math.Inf(-1), Current, "-Inf nA"},              //
		{0.5, Dimensionless, "0.5"},                     //
		{3.2, vPerS, "3.2 V/s"},                         // 3.2 mV/ms
		{5e-3, Dim{iTime: -2}, "0.005 1/s^2"},           //
		{2, Charge.Mul(Time), "2 C·s"},                  // A·s² written with a coherent piece
		{7, Dim{iLuminous: 1, iLength: -2}, "7 cd/m^2"}, // base units only
	}
	for _, c := range cases {
		if got := Format(c.si, c.d); got != c.want {
			t.Errorf("Format(%v, %v) = %q, want %q", c.si, c.d.SIForm(), got, c.want)
		}
	}
}

// TestAppendFormatAllocs checks that the display path does not allocate for
// named and (once seen) unnamed dimensions; this package's own contract.
func TestAppendFormatAllocs(t *testing.T) {
	buf := make([]byte, 0, 64)
	for _, d := range []Dim{Voltage, CurrentDensity, Voltage.Div(Time)} {
		if n := testing.AllocsPerRun(100, func() { buf = AppendFormat(buf[:0], 0.0125, d) }); n != 0 {
			t.Errorf("AppendFormat(%v) allocates %g times per call", d, n)
		}
	}
}

// TestFormatIn checks values shown in a given unit, with the same sources
// as TestFormat; °C against §2.3.1 of the SI Brochure (T/°C = T/K − 273.15).
func TestFormatIn(t *testing.T) {
	t.Parallel()
	cases := []struct {
		si   float64
		unit string
		want string
	}{
		{-0.065, "mV", "-65 mV"},
		// 1e-5 A/m² = 1e-5 A / 1e4 cm² = 1e-9 A/cm² = 1e-3 µA/cm².
		{1e-5, "uA/cm^2", "0.001 µA/cm^2"},
		{279.45, "degC", "6.3 °C"},
		{273.15, "°C", "0 °C"},
		{0, "degC", "-273.15 °C"},
		{0.0125, "s", "0.0125 s"},
		{5, "1", "5"},
		{1e6, "MOhm", "1 MΩ"},
	}
	for _, c := range cases {
		if got := FormatIn(c.si, MustParse(c.unit)); got != c.want {
			t.Errorf("FormatIn(%v, %s) = %q, want %q", c.si, c.unit, got, c.want)
		}
	}
}

// TestRoundTrip checks Parse → Format → Parse for every display unit of
// every named dimension: the printed text parses back to the value within
// the six significant digits printed (relative error at most 5e-6).
func TestRoundTrip(t *testing.T) {
	t.Parallel()
	for d, info := range infos {
		for _, u := range info.units {
			for _, x := range []float64{1, 12.5, 333.333, 999.4, -42.125} {
				si := u.ToSI(x)
				text := Format(si, d)
				num, sym, _ := strings.Cut(text, " ")
				v, err := strconv.ParseFloat(num, 64)
				if err != nil {
					t.Errorf("Format(%g, %v) = %q: number does not parse: %v", si, d, text, err)
					continue
				}
				back := parseBack(t, sym, d)
				if !near(back.ToSI(v), si, 0, 5e-6) {
					t.Errorf("%g %s → %q → %g SI, want %g", x, u.Symbol, text, back.ToSI(v), si)
				}
				if m := math.Abs(v); back.Dim == d && len(info.units) > 1 && (m < 1 || m >= 1000) {
					t.Errorf("%g %s printed as %q: mantissa outside [1, 1000)", x, u.Symbol, text)
				}
			}
		}
	}
}

// parseBack parses sym (the empty symbol being dimensionless) and checks
// its dimension.
func parseBack(t *testing.T, sym string, d Dim) Unit {
	t.Helper()
	if sym == "" {
		return Unit{Scale: 1}
	}
	u, err := Parse(sym)
	if err != nil || u.Dim != d {
		t.Errorf("Parse(%q) = %v, %v; want dimension %v", sym, u, err, d)
	}
	return u
}

// TestNames checks that the completion list is sorted, free of repeats and
// made only of spellings Lookup accepts, and that callers cannot change it.
func TestNames(t *testing.T) {
	t.Parallel()
	names := Names()
	if !slices.IsSorted(names) || len(slices.Compact(slices.Clone(names))) != len(names) {
		t.Fatal("Names must be sorted without repeats")
	}
	for _, n := range names {
		if u, ok := Lookup(n); !ok || u.Scale <= 0 {
			t.Errorf("Lookup(%q) = %v, %v", n, u, ok)
		}
	}
	for _, want := range []string{"ms", "mV", "nA", "uS", "µF", "MOhm", "mM", "degC", "Hz"} {
		if !slices.Contains(names, want) {
			t.Errorf("Names lacks %q", want)
		}
	}
	names[0] = "changed"
	if Names()[0] == "changed" {
		t.Error("Names returned shared storage")
	}
	if _, ok := Lookup("mV/ms"); ok {
		t.Error("Lookup must not accept compounds")
	}
}

// TestDescribe checks names and usual units; the unnamed SI form follows
// the SI Brochure's convention of writing m, kg, s, A, … in that order.
func TestDescribe(t *testing.T) {
	t.Parallel()
	cases := []struct {
		d          Dim
		name, desc string
	}{
		{Voltage, "voltage", "voltage (mV)"},
		{Time, "time", "time (ms)"},
		{CurrentDensity, "current density", "current density (µA/cm^2)"},
		{Dimensionless, "dimensionless", "dimensionless"},
		{Voltage.Div(Time), "m^2·kg·s^-4·A^-1", "m^2·kg·s^-4·A^-1 (V/s)"},
		{Dim{iLuminous: 1, iLength: -2}, "m^-2·cd", "m^-2·cd (cd/m^2)"},
		{Dim{iTime: 2}, "s^2", "s^2"},
	}
	for _, c := range cases {
		if got := c.d.Name(); got != c.name {
			t.Errorf("Name(%v) = %q, want %q", [7]int8(c.d), got, c.name)
		}
		if got := c.d.Describe(); got != c.desc {
			t.Errorf("Describe(%v) = %q, want %q", [7]int8(c.d), got, c.desc)
		}
		if u, err := Parse(c.d.SIForm()); err != nil || u.Dim != c.d || u.Scale != 1 {
			t.Errorf("Parse(SIForm %q) = %v, %v", c.d.SIForm(), u, err)
		}
	}
}

// TestConvert checks conversions against table 8 of the SI Brochure
// (1 h = 60 min = 3600 s) and §2.3.1 (0 °C = 273.15 K). Tolerance: rel 1e-15
// covers the two roundings of to-SI and from-SI.
func TestConvert(t *testing.T) {
	t.Parallel()
	cases := []struct {
		v        float64
		from, to string
		want     float64
	}{
		{1, "h", "min", 60},
		{90, "min", "h", 1.5},
		{25, "degC", "K", 298.15},
		{310.15, "K", "°C", 37},
		{1, "mM", "uM", 1000},
		{120, "mS/cm^2", "S/m^2", 1200},
	}
	for _, c := range cases {
		got, err := Convert(c.v, MustParse(c.from), MustParse(c.to))
		if err != nil || !near(got, c.want, 0, 1e-15) {
			t.Errorf("Convert(%g %s → %s) = %g, %v; want %g", c.v, c.from, c.to, got, err, c.want)
		}
	}
	if _, err := Convert(1, MustParse("mV"), MustParse("ms")); err == nil || !strings.Contains(err.Error(), "dimensions differ") {
		t.Errorf("mV → ms error = %v", err)
	}
}

// TestChoose checks the vector display unit against the median computed by
// a full sort (slices.Sort, an independent method), for seeded random data.
func TestChoose(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name string
		si   []float64
		d    Dim
		want string
	}{
		{"membrane potential", []float64{-0.070, -0.065, 0.020, -0.0655}, Voltage, "mV"},
		{"zeros are ignored", []float64{0, 0, 0, 2e-9, 3e-9}, Current, "nA"},
		{"all zero", []float64{0, 0}, Current, "nA"},
		{"empty", nil, Time, "ms"},
		{"NaN and Inf ignored", []float64{math.NaN(), math.Inf(1), 1.5}, Time, "s"},
		{"lower median", []float64{1e-3, 2e-6}, Time, "µs"},
		{"dimensionless", []float64{1, 2}, Dimensionless, ""},
		{"unnamed", []float64{1, 2}, Voltage.Div(Time), "V/s"},
	}
	for _, c := range cases {
		in := slices.Clone(c.si)
		if got := Choose(c.si, c.d); got.Symbol != c.want {
			t.Errorf("%s: Choose = %q, want %q", c.name, got.Symbol, c.want)
		}
		if !slices.EqualFunc(in, c.si, func(a, b float64) bool { return a == b || a != a && b != b }) {
			t.Errorf("%s: Choose modified its input", c.name)
		}
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 63, 64, 65, 1000, 4097} {
		si := make([]float64, n)
		for i := range si {
			si[i] = math.Pow(10, -12+9*rng.Float64()) // 1 pA … 1 mA
			if i%7 == 0 {
				si[i] = si[0] // repeated values test the partition
			}
		}
		sorted := slices.Clone(si)
		slices.Sort(sorted)
		want := infos[Current].pick(sorted[(n-1)/2])
		if got := Choose(si, Current); got != want {
			t.Errorf("n=%d: Choose = %s, want %s", n, got.Symbol, want.Symbol)
		}
		if got := selectKth(slices.Clone(si), (n-1)/2); got != sorted[(n-1)/2] {
			t.Errorf("n=%d: selectKth = %g, want %g", n, got, sorted[(n-1)/2])
		}
	}
	same := make([]float64, 500) // all equal: the worst case of the partition
	for i := range same {
		same[i] = 1e-9
	}
	if got := Choose(same, Current); got.Symbol != "nA" {
		t.Errorf("constant vector: Choose = %s", got.Symbol)
	}
}
