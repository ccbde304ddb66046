// Package units holds the physical constants n2pulse computes with (CODATA 2018, the exact
// values of the 2019 SI where the SI fixes them) and the conversions between SI and the units
// of the trade (Td, Torr, eV, cm⁻¹, ns) that appear only where text enters or leaves the program.
//
// Parse reads a dimensioned value such as "12 kV", "3.3 nF", "40 Torr", "25 cm" or "20 °C" into
// SI and checks its dimension. Besides the SI units and prefixes it takes the units of the trade
// (Torr, mmHg, atm, bar, mbar, hPa, psi; °C; mil, in; eV, Td). A value in a decimal unit converts
// with one rounding ("0.1 pF" is exactly 1e-13 F); a power of a base unit beyond ±30, a result
// beyond float64 and a bare number for a dimensioned quantity (other than 0) are errors, the
// last one suggesting the unit. Format writes an SI value back with an SI prefix ("1.23 µJ").
package units
