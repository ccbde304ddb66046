// Package plots draws the project's figures from result data with gonum/plot: the pulse
// report of one shot (circuit, discharge, populations and output power on one time axis), the
// z–t gain map, sweep maps and curves, length scans, spectra and model–measurement overlays.
//
// The package knows no physics: it takes plain slices in SI units (V, A, V m², m⁻³, W, m, s)
// and converts them only for display (kV, kA, Td, cm⁻³, MW, cm, ns), choosing SI prefixes from
// the data's magnitude. The output format follows the file extension: ".png" (raster, 150 dpi)
// or ".svg" (vector). Every file is written atomically: rendered in memory, written to a
// temporary file in the destination folder, then renamed over the destination, so a reader
// never sees a half-written figure and a failed write leaves no temporary file behind.
//
// Fonts are sized for a figure printed at its nominal size (16–18 cm wide): 10 pt axis
// labels, 9 pt tick labels and legends, 11 pt titles.
package plots
