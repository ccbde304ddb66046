package data

import (
	"embed"
	"fmt"
	"strings"
)

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

//go:embed designs/*.toml
var designFiles embed.FS

// Example is one of the shipped example designs, all invented scenarios.
type Example struct {
	Name    string // what `init --example` takes
	File    string // file in data/designs
	Summary string // one line for the help
}

// examples are the shipped example designs, in the order the help lists them.
var examples = []Example{
	{"blumlein", "example.toml", "bench-top atmospheric Blumlein, 20 cm, 2 × 4 nF at 14 kV (the default)"},
	{"board", "board.toml", "Blumlein etched on a glass-epoxy board, described as built (plates, dielectric, rails)"},
	{"tube", "tube.toml", "reduced-pressure charge-transfer tube, 50 cm at 50 Torr, with an optional rear mirror"},
	{"tea-transfer", "tea-transfer.toml", "small atmospheric charge-transfer laser, 12 cm, 1.2 nF into 0.6 nF at 17 kV"},
}

// Examples lists the shipped example designs.
func Examples() []Example { return append([]Example(nil), examples...) }

// ExampleText returns the design file of the named example, or an error listing the names.
func ExampleText(name string) ([]byte, error) {
	var names []string
	for _, e := range examples {
		if e.Name == name {
			return designFiles.ReadFile("designs/" + e.File)
		}
		names = append(names, e.Name)
	}
	return nil, fmt.Errorf("data: no example design %q; the examples are %s", name, strings.Join(names, ", "))
}
