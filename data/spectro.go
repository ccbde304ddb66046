package data

import _ "embed"

//go:embed n2-constants.toml
var spectroscopy []byte

// Spectroscopy returns the TOML text of the N₂ spectroscopic constants (states X, A, B, C; the
// C–B transition moment; the collision-broadening coefficient), each number with its source in
// the file. The caller gets its own copy.
func Spectroscopy() []byte { return append([]byte(nil), spectroscopy...) }

//go:embed n2-vibronic.csv
var vibronic []byte

// Vibronic returns the text of data/n2-vibronic.csv: the wave-function quantities of the C→B
// (0,0) laser band (band A, C(0) lifetime, excitation shares) that package kinetics/spectro
// derives from n2-constants.toml, shipped so that start-up need not solve the radial equations.
// The caller gets its own copy.
func Vibronic() []byte { return append([]byte(nil), vibronic...) }
