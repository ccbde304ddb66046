package data

import _ "embed"

//go:embed materials.toml
var materials []byte

// Materials returns the TOML text of the bench materials: dielectric presets (relative
// permittivity and dielectric strength [V/m]) and Townsend constants of the gases (A [m⁻¹ Pa⁻¹],
// B [V m⁻¹ Pa⁻¹], γ), each value with its source in the file. The caller gets its own copy.
func Materials() []byte { return append([]byte(nil), materials...) }
