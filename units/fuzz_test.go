package units

import (
	"math"
	"testing"
)

// fuzzDims are the dimensions FuzzParse asks for, chosen by the fuzzer's second argument.
var fuzzDims = []Dimension{Dimensionless, Length, Pressure, Temperature, Voltage, Capacitance,
	Density, RateConstant, SparkConstant, Speed}

// FuzzParse feeds arbitrary text to Parse and ParseUnit: neither may panic, and an accepted
// value is always finite. Seeds are in testdata/fuzz/FuzzParse.
func FuzzParse(f *testing.F) {
	f.Add("12 kV", uint8(4))
	f.Add("0A100000000", uint8(0))
	f.Fuzz(func(t *testing.T, text string, k uint8) {
		want := fuzzDims[int(k)%len(fuzzDims)]
		v, err := Parse(text, want)
		if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
			t.Fatalf("Parse(%q, %v) = %g with no error", text, want, v)
		}
		factor, _, err := ParseUnit(text)
		if err == nil && (factor == 0 || math.IsNaN(factor) || math.IsInf(factor, 0)) {
			t.Fatalf("ParseUnit(%q) factor %g with no error", text, factor)
		}
	})
}
