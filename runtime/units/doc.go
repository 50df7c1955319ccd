// Package units holds the physical dimensions and units of the modelling
// language: it parses unit text, checks dimensions and prints values stored
// in SI in a unit the trade reads at a glance.
//
// Every quantity is stored as a float64 in coherent SI units with a Dim, the
// exponents of the seven base quantities. A Unit is a scale onto SI:
//
//	si = value·Scale + Offset
//
// so 12.5 ms is stored as 0.0125 with Dim Time, and Format(0.0125, Time)
// prints "12.5 ms" again. A value far beyond the trade's display units
// prints in the SI unit in e notation ("1e-20 A"), not as an e-notation
// number before a prefix.
//
// Unit text is a name with an optional SI prefix (f p n u µ μ m c k M G T,
// SI Brochure, 9th edition, table 7), an optional integer power, and such
// atoms joined by "/" and "*" from left to right:
//
//	text        scale    dimension
//	mV          1e-3     voltage
//	uA/cm^2     1e-2     current density (A/m^2)
//	mS/cm^2     10       conductance density (S/m^2)
//	MOhm        1e6      resistance
//	mM          1        concentration (mol/m^3)
//	1/ms        1e3      frequency
//
// Names are matched before prefixes, which settles the clashes of the usual
// symbols: "m" is the metre and "mm" the millimetre, "M" the molar and "MΩ"
// the megaohm, "mS" the millisiemens and "ms" the millisecond, "C" the
// coulomb and "°C" the degree Celsius. A prefix alone is not a unit.
//
// Temperatures: a value in °C is stored in kelvin (6.3 °C is 279.45 K) and
// Format shows temperatures in K; FormatIn with the °C unit shows them in °C
// again. Because °C is an offset scale, it cannot be part of a compound unit
// or take a power: write temperature differences and rates in K ("K/s").
//
// Output writes micro as "µ" and the ohm as "Ω" whatever the input spelling.
// All tables are built at start-up and only read afterwards, so every
// function is safe for concurrent use.
package units
