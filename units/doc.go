// Package units holds the physical constants n2pulse computes with (CODATA 2018, the exact
// values of the 2019 SI where the SI fixes them) and the conversions between SI and the units
// of the trade (Td, Torr, eV, cm⁻¹, ns) that appear only where text enters or leaves the program.
//
// Parse reads a dimensioned value such as "12 kV", "3.3 nF", "40 Torr" or "25 cm" into SI and
// checks its dimension; Format writes an SI value back with an SI prefix ("1.23 µJ").
package units
