package data

import _ "embed"

//go:embed n2-constants.toml
var spectroscopy []byte

// Spectroscopy returns the TOML text of the N₂ spectroscopic constants (states X, A, B, C; the
// C–B transition moment; the collision-broadening coefficient), each number with its source in
// the file. The caller gets its own copy.
func Spectroscopy() []byte { return append([]byte(nil), spectroscopy...) }
