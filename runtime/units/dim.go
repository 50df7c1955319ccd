package units

import (
	"fmt"
	"strconv"
	"strings"
)

// Dim holds the exponents of the seven SI base quantities, in SI Brochure
// order: time (s), length (m), mass (kg), electric current (A), temperature
// (K), amount of substance (mol) and luminous intensity (cd). The zero Dim is
// dimensionless. Dim is comparable, so == tells whether two quantities may be
// added.
type Dim [7]int8

// Indices of the base quantities inside a Dim.
const (
	iTime = iota
	iLength
	iMass
	iCurrent
	iTemperature
	iAmount
	iLuminous
)

// Named dimensions of the SI and of the trade. Each is a plain value; treat
// them as constants.
var (
	Dimensionless     Dim
	Time              = Dim{iTime: 1}
	Length            = Dim{iLength: 1}
	Mass              = Dim{iMass: 1}
	Current           = Dim{iCurrent: 1}
	Temperature       = Dim{iTemperature: 1}
	Amount            = Dim{iAmount: 1}
	LuminousIntensity = Dim{iLuminous: 1}

	// Voltage is kg·m²·s⁻³·A⁻¹ (the volt).
	Voltage = Dim{-3, 2, 1, -1, 0, 0, 0}
	// Conductance is kg⁻¹·m⁻²·s³·A² (the siemens, Ω⁻¹).
	Conductance = Dim{3, -2, -1, 2, 0, 0, 0}
	// Resistance is kg·m²·s⁻³·A⁻² (the ohm).
	Resistance = Dim{-3, 2, 1, -2, 0, 0, 0}
	// Capacitance is kg⁻¹·m⁻²·s⁴·A² (the farad).
	Capacitance = Dim{4, -2, -1, 2, 0, 0, 0}
	// Charge is A·s (the coulomb).
	Charge = Dim{1, 0, 0, 1, 0, 0, 0}
	// Frequency is s⁻¹ (the hertz); rates such as firing rates have it too.
	Frequency = Dim{iTime: -1}
	Area      = Dim{iLength: 2}
	Volume    = Dim{iLength: 3}
	// Velocity is m·s⁻¹, as for conduction velocity along an axon.
	Velocity = Dim{-1, 1, 0, 0, 0, 0, 0}
	// CurrentDensity is A·m⁻², usually shown in µA/cm^2.
	CurrentDensity = Dim{0, -2, 0, 1, 0, 0, 0}
	// ConductanceDensity is S·m⁻², usually shown in mS/cm^2.
	ConductanceDensity = Dim{3, -4, -1, 2, 0, 0, 0}
	// CapacitanceDensity is F·m⁻², usually shown in µF/cm^2.
	CapacitanceDensity = Dim{4, -4, -1, 2, 0, 0, 0}
	// SpecificResistance is Ω·m², the membrane resistance of a unit area.
	SpecificResistance = Dim{-3, 4, 1, -2, 0, 0, 0}
	// Resistivity is Ω·m, as for the axial resistivity of cytoplasm.
	Resistivity = Dim{-3, 3, 1, -2, 0, 0, 0}
	// Concentration is mol·m⁻³; 1 mM = 1 mol/m^3.
	Concentration = Dim{0, -3, 0, 0, 0, 1, 0}
)

// Mul returns the dimension of a product: the exponents add. Exponents wrap
// around as int8 arithmetic does past ±127; use MulChecked when the exponents
// come from user input.
func (d Dim) Mul(e Dim) Dim {
	for i := range d {
		d[i] += e[i]
	}
	return d
}

// Div returns the dimension of a quotient: the exponents subtract. Like Mul
// it wraps past ±127; use DivChecked for user input.
func (d Dim) Div(e Dim) Dim {
	for i := range d {
		d[i] -= e[i]
	}
	return d
}

// MulChecked is Mul that returns an error instead of wrapping when an
// exponent would leave the range -128..127.
func (d Dim) MulChecked(e Dim) (Dim, error) {
	var r Dim
	for i := range d {
		s := int(d[i]) + int(e[i])
		if s < -128 || s > 127 {
			return d, overflowError(d.Name()+" times "+e.Name(), i, strconv.Itoa(s))
		}
		r[i] = int8(s)
	}
	return r, nil
}

// DivChecked is Div that returns an error instead of wrapping when an
// exponent would leave the range -128..127.
func (d Dim) DivChecked(e Dim) (Dim, error) {
	var r Dim
	for i := range d {
		s := int(d[i]) - int(e[i])
		if s < -128 || s > 127 {
			return d, overflowError(d.Name()+" divided by "+e.Name(), i, strconv.Itoa(s))
		}
		r[i] = int8(s)
	}
	return r, nil
}

// Pow returns d raised to the integer power n. It returns an error, and d
// unchanged, when an exponent would leave the range -128..127. Any power of
// Dimensionless is Dimensionless.
func (d Dim) Pow(n int) (Dim, error) {
	var r Dim
	for i := range d {
		if d[i] == 0 {
			continue
		}
		// |d[i]| ≥ 1, so |n| > 128 overflows for sure; the bound also keeps
		// the product below from overflowing int.
		if n > 128 || n < -128 {
			return d, overflowError(fmt.Sprintf("(%s)^%d", d.Name(), n), i, fmt.Sprintf("(%d×%d)", d[i], n))
		}
		p := int(d[i]) * n
		if p < -128 || p > 127 {
			return d, overflowError(fmt.Sprintf("(%s)^%d", d.Name(), n), i, strconv.Itoa(p))
		}
		r[i] = int8(p)
	}
	return r, nil
}

// Root returns the dimension whose n-th power is d, as for a square root
// (n = 2). It returns an error when n is not positive or when an exponent of
// d is not a multiple of n (the square root of a time has no SI dimension).
func (d Dim) Root(n int) (Dim, error) {
	if n <= 0 {
		return d, fmt.Errorf("units: root degree must be positive, got %d; use 2 for a square root", n)
	}
	var r Dim
	for i := range d {
		if int(d[i])%n != 0 {
			return d, fmt.Errorf("units: the root of degree %d of %s has a fractional exponent of %s; "+
				"take the root of a quantity whose exponents are multiples of %d, such as an area for a square root",
				n, d.Name(), baseSymbols[i], n)
		}
		r[i] = int8(int(d[i]) / n)
	}
	return r, nil
}

// IsDimensionless reports whether every exponent of d is zero.
func (d Dim) IsDimensionless() bool { return d == Dimensionless }

// Name returns the trade's name of d ("voltage", "time", "current density",
// "dimensionless"), or, for a dimension without a name, its SI form in the
// Brochure's order of base units, such as "m^2·kg·s^-4·A^-1".
func (d Dim) Name() string {
	if info := infoOf(d); info != nil {
		return info.name
	}
	return d.SIForm()
}

// String returns d.Name(), so that a Dim prints readably with %v.
func (d Dim) String() string { return d.Name() }

// Describe returns the name of d followed by its usual unit: "voltage (mV)",
// "time (ms)", "current density (µA/cm^2)", "dimensionless". For a dimension
// without a name it returns the SI form followed by the coherent unit built
// from named pieces when there is one: "m^2·kg·s^-4·A^-1 (V/s)".
func (d Dim) Describe() string {
	if info := infoOf(d); info != nil {
		if d.IsDimensionless() {
			return info.name
		}
		return info.name + " (" + info.units[info.def].Symbol + ")"
	}
	si := d.SIForm()
	if c := composedSymbol(d); c != si {
		return si + " (" + c + ")"
	}
	return si
}

// baseSymbols are the coherent SI symbols of the base quantities, by index.
var baseSymbols = [7]string{"s", "m", "kg", "A", "K", "mol", "cd"}

// brochureOrder lists the base quantities in the order the SI Brochure writes
// them in products: m, kg, s, A, K, mol, cd.
var brochureOrder = [7]int{iLength, iMass, iTime, iCurrent, iTemperature, iAmount, iLuminous}

// SIForm returns d as a product of SI base units in the Brochure's order with
// signed exponents, such as "m^2·kg·s^-3·A^-1"; "1" for Dimensionless. Parse
// accepts the result.
func (d Dim) SIForm() string {
	if d.IsDimensionless() {
		return "1"
	}
	var b strings.Builder
	for _, i := range brochureOrder {
		if d[i] == 0 {
			continue
		}
		if b.Len() > 0 {
			b.WriteString("·")
		}
		b.WriteString(baseSymbols[i])
		if d[i] != 1 {
			b.WriteByte('^')
			b.WriteString(strconv.Itoa(int(d[i])))
		}
	}
	return b.String()
}

func overflowError(what string, i int, exp string) error {
	return fmt.Errorf("units: exponent overflow: %s would give %s^%s, beyond the -128..127 an exponent can hold; "+
		"use smaller powers or rescale the computation", what, baseSymbols[i], exp)
}
