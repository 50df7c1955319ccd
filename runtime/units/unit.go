package units

import (
	"fmt"
	"math"
	"slices"
)

// Unit is a scale (and, for the degree Celsius only, an offset) onto SI base
// units: a value v in the unit is v*Scale + Offset in SI. Symbol is the
// canonical spelling used in output: micro is written "µ" (U+00B5), the ohm
// "Ω" (U+03A9) and the degree Celsius "°C", whatever was typed. The zero Unit
// is not valid; Dimensionless numbers use Unit{Scale: 1}.
type Unit struct {
	Symbol string
	Scale  float64
	Offset float64
	Dim    Dim
}

// ToSI returns the SI value of v given in u.
func (u Unit) ToSI(v float64) float64 { return v*u.Scale + u.Offset }

// FromSI returns the SI value si expressed in u.
func (u Unit) FromSI(si float64) float64 { return (si - u.Offset) / u.Scale }

// IsAffine reports whether u has an offset, as the degree Celsius has. An
// affine unit names a point on a scale, not a difference, so it cannot take
// part in products, quotients or powers.
func (u Unit) IsAffine() bool { return u.Offset != 0 }

// String returns u.Symbol.
func (u Unit) String() string { return u.Symbol }

// Convert returns v, given in from, expressed in to. It returns an error when
// the two units have different dimensions.
func Convert(v float64, from, to Unit) (float64, error) {
	if from.Dim != to.Dim {
		return math.NaN(), fmt.Errorf("units: cannot convert %s (%s) to %s (%s); the dimensions differ",
			from.Symbol, from.Dim.Name(), to.Symbol, to.Dim.Name())
	}
	return to.FromSI(from.ToSI(v)), nil
}

// A prefix is a decimal SI prefix (SI Brochure, 9th edition, table 7).
type prefix struct {
	spell string // as typed
	sym   string // as printed
	p10   int
	name  string
}

// prefixes lists the decimal prefixes the trade uses, from femto to tera;
// micro may be typed as u, µ (U+00B5, micro sign) or μ (U+03BC, Greek mu).
var prefixes = []prefix{
	{"f", "f", -15, "femto"},
	{"p", "p", -12, "pico"},
	{"n", "n", -9, "nano"},
	{"u", "µ", -6, "micro"},
	{"µ", "µ", -6, "micro"},
	{"μ", "µ", -6, "micro"},
	{"m", "m", -3, "milli"},
	{"c", "c", -2, "centi"},
	{"k", "k", 3, "kilo"},
	{"M", "M", 6, "mega"},
	{"G", "G", 9, "giga"},
	{"T", "T", 12, "tera"},
}

// An atom is a unit name with its prefix resolved: scale = mant·10^p10.
// Keeping the power of ten apart from the mantissa lets a compound such as
// uA/cm^2 get the scale nearest to 10^-2, with no accumulated rounding.
type atom struct {
	sym    string
	mant   float64
	p10    int
	offset float64
	dim    Dim
}

// unit returns the atom as a Unit.
func (a atom) unit() Unit {
	return Unit{Symbol: a.sym, Scale: a.mant * math.Pow10(a.p10), Offset: a.offset, Dim: a.dim}
}

// base is a unit name before prefixes.
type base struct {
	spell    string
	sym      string
	mant     float64
	p10      int
	offset   float64
	dim      Dim
	prefixed bool
}

// bases lists every unit name Parse knows. Names are matched before prefixes,
// which settles the ambiguities: "m" is the metre, "M" the molar, "mol" the
// mole, "min" the minute, "cd" the candela; "mm", "mM" and "MOhm" are a
// prefix and a name.
var bases = []base{
	{spell: "s", sym: "s", mant: 1, dim: Time, prefixed: true},
	{spell: "min", sym: "min", mant: 60, dim: Time},
	{spell: "h", sym: "h", mant: 3600, dim: Time},
	{spell: "m", sym: "m", mant: 1, dim: Length, prefixed: true},
	{spell: "g", sym: "g", mant: 1, p10: -3, dim: Mass, prefixed: true},
	{spell: "A", sym: "A", mant: 1, dim: Current, prefixed: true},
	{spell: "K", sym: "K", mant: 1, dim: Temperature, prefixed: true},
	{spell: "mol", sym: "mol", mant: 1, dim: Amount, prefixed: true},
	{spell: "cd", sym: "cd", mant: 1, dim: LuminousIntensity, prefixed: true},
	{spell: "V", sym: "V", mant: 1, dim: Voltage, prefixed: true},
	{spell: "S", sym: "S", mant: 1, dim: Conductance, prefixed: true},
	{spell: "F", sym: "F", mant: 1, dim: Capacitance, prefixed: true},
	{spell: "C", sym: "C", mant: 1, dim: Charge, prefixed: true},
	{spell: "Hz", sym: "Hz", mant: 1, dim: Frequency, prefixed: true},
	{spell: "Ohm", sym: "Ω", mant: 1, dim: Resistance, prefixed: true},
	{spell: "ohm", sym: "Ω", mant: 1, dim: Resistance, prefixed: true},
	{spell: "Ω", sym: "Ω", mant: 1, dim: Resistance, prefixed: true},      // U+03A9 Greek capital omega
	{spell: "\u2126", sym: "Ω", mant: 1, dim: Resistance, prefixed: true}, // U+2126 ohm sign
	// The molar is mol/L = 1000 mol/m^3.
	{spell: "M", sym: "M", mant: 1, p10: 3, dim: Concentration, prefixed: true},
	{spell: "L", sym: "L", mant: 1, p10: -3, dim: Volume, prefixed: true},
	// 0 °C = 273.15 K exactly (SI Brochure, 9th edition, §2.3.1).
	{spell: "degC", sym: "°C", mant: 1, offset: 273.15, dim: Temperature},
	{spell: "°C", sym: "°C", mant: 1, offset: 273.15, dim: Temperature},
	{spell: "\u2103", sym: "°C", mant: 1, offset: 273.15, dim: Temperature}, // ℃
}

// atoms maps every spelling, prefixed or not, to its atom; spellings is the
// same set sorted, for suggestions. Both are filled once and never written
// again, so concurrent use is safe.
var atoms, spellings = buildAtoms()

// prefixOnly maps a spelling that is a prefix and not a unit to its prefix.
var prefixOnly = buildPrefixOnly()

func buildAtoms() (map[string]atom, []string) {
	m := make(map[string]atom, len(bases)*(len(prefixes)+1))
	for _, b := range bases {
		m[b.spell] = atom{sym: b.sym, mant: b.mant, p10: b.p10, offset: b.offset, dim: b.dim}
	}
	for _, b := range bases {
		if !b.prefixed {
			continue
		}
		for _, p := range prefixes {
			s := p.spell + b.spell
			if _, taken := m[s]; taken {
				continue // a unit name wins over a prefixed reading
			}
			m[s] = atom{sym: p.sym + b.sym, mant: b.mant, p10: b.p10 + p.p10, dim: b.dim}
		}
	}
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	return m, keys
}

func buildPrefixOnly() map[string]prefix {
	m := make(map[string]prefix)
	for _, p := range prefixes {
		if _, isUnit := atoms[p.spell]; !isUnit {
			m[p.spell] = p
		}
	}
	return m
}

// Lookup returns the unit named by a single name with an optional prefix,
// such as "ms", "MOhm", "uM" or "degC"; it accepts no exponent and no
// operator. The evaluator uses it when a bare name is not bound. It does not
// allocate.
func Lookup(name string) (Unit, bool) {
	a, ok := atoms[name]
	if !ok {
		return Unit{}, false
	}
	return a.unit(), true
}

// MustParse is Parse for units written in Go source, such as package-level
// variables. It panics when text is not a unit: that is a programming error.
func MustParse(text string) Unit {
	u, err := Parse(text)
	if err != nil {
		panic(err)
	}
	return u
}

// commonNames are the spellings a user is likely to type: every unit name
// and the prefixed forms the trade uses, with u and µ both offered for micro.
var commonNames = []string{
	"s", "ms", "us", "µs", "ns", "min", "h",
	"m", "cm", "mm", "um", "µm", "nm",
	"g", "kg", "mg",
	"A", "mA", "uA", "µA", "nA", "pA",
	"K", "degC", "°C",
	"mol", "mmol", "umol", "µmol", "nmol",
	"cd",
	"V", "mV", "uV", "µV",
	"S", "mS", "uS", "µS", "nS", "pS",
	"F", "uF", "µF", "nF", "pF",
	"C", "uC", "µC", "nC", "pC",
	"Hz", "kHz",
	"Ohm", "ohm", "Ω", "kOhm", "kΩ", "MOhm", "MΩ", "GOhm", "GΩ",
	"M", "mM", "uM", "µM", "nM",
	"L", "mL", "uL", "µL",
}

var sortedCommon = func() []string {
	s := slices.Clone(commonNames)
	slices.Sort(s)
	return slices.Compact(s)
}()

// Names returns the spellings a user is likely to type, sorted, for
// completion: all unit names and their prefixed forms used in the trade.
// Every name is accepted by Lookup. The caller owns the returned slice.
func Names() []string { return slices.Clone(sortedCommon) }

func isCommon(s string) bool {
	_, ok := slices.BinarySearch(sortedCommon, s)
	return ok
}
