package design

import (
	"math"
	"testing"

	"n2pulse/data"
)

// FuzzParseDesign feeds arbitrary text to the design reader: it may refuse, never panic, and a
// design it accepts passes Validate. Seeds are in testdata/fuzz/FuzzParseDesign.
func FuzzParseDesign(f *testing.F) {
	f.Add(data.ExampleDesign())
	f.Add(data.BoardDesign())
	f.Fuzz(func(t *testing.T, b []byte) {
		d, err := ParseDesign(b, "fuzz.toml")
		if err != nil {
			return
		}
		if err := d.Validate(); err != nil {
			t.Fatalf("accepted design fails Validate: %v\n%s", err, b)
		}
	})
}

// FuzzSet assigns arbitrary text to a key of the example design (the key chosen by the
// fuzzer's number, or an arbitrary name): Set may refuse, never panic, and a numeric value it
// accepts is a number within the key's range (or an allowed 0).
func FuzzSet(f *testing.F) {
	f.Add(uint16(0), "", "40 Torr")
	f.Add(uint16(3), "", "1e400 m")
	f.Add(uint16(0), "gas.pressure", "760 Torr m^256")
	keys := Keys()
	f.Fuzz(func(t *testing.T, k uint16, name, value string) {
		key := name
		if key == "" {
			key = keys[int(k)%len(keys)]
		}
		d := ExampleDesign()
		if err := d.Set(key, value); err != nil {
			return
		}
		fld := fieldIndex[key]
		if fld == nil || (fld.num == nil && !fld.integer) {
			return
		}
		v, err := d.Get(key)
		if err != nil {
			t.Fatalf("Set(%s, %q) accepted but Get fails: %v", key, value, err)
		}
		if math.IsNaN(v) || !((v == 0 && fld.zeroOK) || (v >= fld.min && v <= fld.max)) {
			t.Fatalf("Set(%s, %q) accepted %g, outside %s", key, value, v, fld.rangeText())
		}
	})
}
