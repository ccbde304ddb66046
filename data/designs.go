package data

import _ "embed"

//go:embed designs/example.toml
var exampleDesign []byte

//go:embed designs/board.toml
var boardDesign []byte

// ExampleDesign returns the text of the built-in example design file (a bench-top atmospheric
// Blumlein laser, a scenario invented for the examples).
func ExampleDesign() []byte { return append([]byte(nil), exampleDesign...) }

// BoardDesign returns the text of the built-in example of a design described as built: a
// Blumlein whose capacitors are plates on a glass-epoxy board (an invented scenario).
func BoardDesign() []byte { return append([]byte(nil), boardDesign...) }
