package data

import _ "embed"

//go:embed designs/example.toml
var exampleDesign []byte

// ExampleDesign returns the text of the built-in example design file (a bench-top atmospheric
// Blumlein laser, a scenario invented for the examples).
func ExampleDesign() []byte { return append([]byte(nil), exampleDesign...) }
