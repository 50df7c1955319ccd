package units

import (
	"math"
	"strconv"
)

// dimInfo is what the package knows about a named dimension: its name, the
// decimal display units the trade uses from the largest to the smallest,
// which of them is the usual one (used for 0, NaN, ±Inf and in Describe),
// the larger non-decimal units (h, min) for values beyond the decimal ones,
// and the coherent SI unit for values beyond every display unit.
type dimInfo struct {
	name  string
	units []Unit
	def   int
	long  []Unit
	si    Unit
}

// infos maps each named dimension to its dimInfo. It is filled once and only
// read afterwards. It is built in init, not in its declaration, because
// building it parses units, and parse errors name dimensions through infos.
var infos map[Dim]*dimInfo

func init() { infos = buildInfos() }

func buildInfos() map[Dim]*dimInfo {
	m := make(map[Dim]*dimInfo)
	add := func(d Dim, name, usual string, display ...string) {
		info := &dimInfo{name: name}
		for i, s := range display {
			u := MustParse(s)
			if u.Dim != d {
				panic("units: display unit " + s + " is not " + name)
			}
			info.units = append(info.units, u)
			if s == usual {
				info.def = i
			}
			if u.Scale == 1 {
				info.si = u
			}
		}
		if info.si.Symbol == "" {
			info.si = info.units[0]
		}
		m[d] = info
	}
	m[Dimensionless] = &dimInfo{name: "dimensionless", units: []Unit{{Scale: 1}}}
	add(Time, "time", "ms", "s", "ms", "µs", "ns")
	m[Time].long = []Unit{MustParse("h"), MustParse("min")}
	add(Length, "length", "µm", "m", "cm", "mm", "µm", "nm")
	add(Mass, "mass", "g", "kg", "g", "mg", "µg")
	add(Current, "current", "nA", "A", "mA", "µA", "nA", "pA")
	add(Temperature, "temperature", "K", "K")
	add(Amount, "amount of substance", "mmol", "mol", "mmol", "µmol", "nmol")
	add(LuminousIntensity, "luminous intensity", "cd", "cd")
	add(Voltage, "voltage", "mV", "V", "mV", "µV")
	add(Conductance, "conductance", "nS", "S", "mS", "µS", "nS", "pS")
	add(Resistance, "resistance", "MΩ", "GΩ", "MΩ", "kΩ", "Ω")
	add(Capacitance, "capacitance", "pF", "F", "mF", "µF", "nF", "pF")
	add(Charge, "charge", "pC", "C", "mC", "µC", "nC", "pC")
	add(Frequency, "frequency", "Hz", "GHz", "MHz", "kHz", "Hz")
	add(Area, "area", "µm^2", "m^2", "cm^2", "mm^2", "µm^2")
	add(Volume, "volume", "L", "L", "mL", "µL", "nL", "pL")
	add(Velocity, "velocity", "m/s", "m/s")
	add(CurrentDensity, "current density", "µA/cm^2", "mA/cm^2", "µA/cm^2", "nA/cm^2")
	add(ConductanceDensity, "conductance density", "mS/cm^2", "mS/cm^2")
	add(CapacitanceDensity, "capacitance density", "µF/cm^2", "µF/cm^2")
	add(SpecificResistance, "specific membrane resistance", "kΩ·cm^2", "kΩ·cm^2", "Ω·cm^2")
	add(Resistivity, "resistivity", "Ω·cm", "kΩ·cm", "Ω·cm")
	add(Concentration, "concentration", "mM", "M", "mM", "µM", "nM")
	return m
}

func infoOf(d Dim) *dimInfo { return infos[d] }

// A mantissa in [lowMant, highMant) prints, after rounding to six
// significant digits, as a number in [1, 1000): 999.9996 is "1000" and so
// belongs to the next larger unit, 0.9999996 is "1" and stays. A mantissa
// in [lowNear, highNear) still reads well in plain notation ("0.63 pF",
// "3600 s"); beyond that a prefixed unit would carry an e-notation number
// ("1e-08 pA") or too many integer digits ("123457 s").
const (
	lowMant  = 1 - 5e-7
	highMant = 1000 * (1 - 5e-7)
	lowNear  = 1e-3 * (1 - 5e-7)
	highNear = 1e4 * (1 - 5e-7)
)

// pick returns the display unit for a value of magnitude a in SI: the first
// decimal unit, from the largest down, that puts the mantissa in [1, 1000);
// failing that, the decimal unit that brings it nearest to that range if the
// mantissa there stays in [0.001, 10000); failing that, for a large value,
// a non-decimal unit (h, min) that puts it in [1, 1000); failing that, the
// coherent SI unit, in which the number prints in e notation ("1e-20 A").
// For 0, NaN and ±Inf it returns the usual unit.
func (info *dimInfo) pick(a float64) Unit {
	if a == 0 || math.IsNaN(a) || math.IsInf(a, 0) {
		return info.units[info.def]
	}
	best, bestOff := 0, math.Inf(1)
	for i, u := range info.units {
		m := a / u.Scale
		switch {
		case m >= lowMant && m < highMant:
			return u
		case m < lowMant && lowMant/m < bestOff:
			best, bestOff = i, lowMant/m
		case m >= highMant && m/highMant < bestOff:
			best, bestOff = i, m/highMant
		}
	}
	u := info.units[best]
	if m := a / u.Scale; m >= lowNear && m < highNear {
		return u
	} else if m < lowNear {
		return info.si
	}
	for _, l := range info.long {
		if m := a / l.Scale; m >= lowMant && m < highMant {
			return l
		}
	}
	return info.si
}

// FormatNumber returns v with six significant digits and trailing zeros
// trimmed, in plain notation for magnitudes from 1e-4 up to below 1e6 and in
// e notation outside ("1.5e-07", "2.5e+06"); "0" for both zeros, "NaN",
// "+Inf", "-Inf".
func FormatNumber(v float64) string {
	var buf [32]byte
	return string(AppendNumber(buf[:0], v))
}

// AppendNumber appends FormatNumber(v) to dst and returns the result.
func AppendNumber(dst []byte, v float64) []byte {
	if v == 0 {
		return append(dst, '0')
	}
	// strconv's %g with precision 6 switches to e notation exactly when the
	// rounded decimal exponent is below -4 or at least 6, and trims zeros.
	return strconv.AppendFloat(dst, v, 'g', 6, 64)
}

// Format returns a value stored in SI, of dimension d, in a readable unit:
// Format(0.0125, Time) is "12.5 ms", Format(1.5e-9, Current) "1.5 nA". The
// unit is the trade's display unit that puts the number in [1, 1000), else
// the nearest while the number there stays in [0.001, 10000) ("0.63 pF",
// "3600 s"), else for long times hours or minutes ("34.2936 h"), else the
// coherent SI unit with the number in e notation ("1e-20 A", never
// "1e-08 pA"); 0, NaN and ±Inf use the dimension's usual unit ("0 ms",
// "NaN mV"). A dimensionless value prints as the bare number. A dimension
// without a name prints in coherent SI units, built from V, S, Ω, F and C
// where that is shorter ("3.2 V/s"), else from base units. Temperatures
// print in K; use FormatIn for °C.
func Format(si float64, d Dim) string {
	var buf [48]byte
	return string(AppendFormat(buf[:0], si, d))
}

// AppendFormat appends Format(si, d) to dst and returns the result; for a
// named dimension and a dst with room it does not allocate.
func AppendFormat(dst []byte, si float64, d Dim) []byte {
	return appendIn(dst, si, chooseOne(math.Abs(si), d))
}

// FormatIn returns a value stored in SI shown in the unit u, which must have
// the value's dimension: FormatIn(-0.065, mV) is "-65 mV", and
// FormatIn(279.45, °C) is "6.3 °C". A unit with an empty Symbol gives the bare
// number, and so does the unit "1".
func FormatIn(si float64, u Unit) string {
	var buf [48]byte
	return string(appendIn(buf[:0], si, u))
}

// AppendFormatIn appends FormatIn(si, u) to dst and returns the result.
func AppendFormatIn(dst []byte, si float64, u Unit) []byte { return appendIn(dst, si, u) }

func appendIn(dst []byte, si float64, u Unit) []byte {
	dst = AppendNumber(dst, u.FromSI(si))
	if u.Symbol == "" || u.Symbol == "1" {
		return dst
	}
	dst = append(dst, ' ')
	return append(dst, u.Symbol...)
}

// chooseOne returns the display unit of dimension d for magnitude a in SI.
func chooseOne(a float64, d Dim) Unit {
	if info := infoOf(d); info != nil {
		return info.pick(a)
	}
	return Unit{Symbol: composedSymbol(d), Scale: 1, Dim: d}
}

// Choose returns one display unit for a whole vector of values stored in SI,
// so that a vector prints in a single unit: the unit Format would use for the
// median magnitude of the finite non-zero values (the lower median for an
// even count). With no such value it returns the dimension's usual unit. It
// does not modify si; for more than 64 values it allocates a copy.
func Choose(si []float64, d Dim) Unit {
	info := infoOf(d)
	if info == nil || len(info.units) == 1 {
		return chooseOne(0, d)
	}
	var small [64]float64
	mags := small[:0]
	if len(si) > len(small) {
		mags = make([]float64, 0, len(si))
	}
	for _, v := range si {
		if a := math.Abs(v); a != 0 && a <= math.MaxFloat64 {
			mags = append(mags, a)
		}
	}
	if len(mags) == 0 {
		return info.units[info.def]
	}
	return info.pick(selectKth(mags, (len(mags)-1)/2))
}
