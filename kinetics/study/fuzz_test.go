package study

import (
	"testing"

	"n2pulse/kinetics/design"
)

// FuzzParseAxis feeds arbitrary text to the --vary parser: it may refuse, never panic, and an
// axis it accepts has N values, exactly its ends (FROM alone when N = 1), all within them, each a design the key's
// range admits. Seeds are in testdata/fuzz/FuzzParseAxis.
func FuzzParseAxis(f *testing.F) {
	f.Add("gas.pressure=20Torr:760Torr:20:log")
	f.Add("numerics.cells=20:200:4:log")
	base := design.ExampleDesign()
	f.Fuzz(func(t *testing.T, text string) {
		a, err := ParseAxis(text, base)
		if err != nil || a.N > 200 {
			return
		}
		v := a.Values()
		if len(v) != a.N || v[0] != a.From || (a.N > 1 && v[a.N-1] != a.To) { // one point is FROM
			t.Fatalf("%q: values %v, want %d from %g to %g", text, v, a.N, a.From, a.To)
		}
		lo, hi := min(a.From, a.To), max(a.From, a.To)
		for i, x := range v {
			if x < lo || x > hi {
				t.Fatalf("%q: value %d = %g outside [%g, %g]", text, i, x, lo, hi)
			}
			if err := base.Clone().Set(a.Key, siText(a.Key, x)); err != nil {
				t.Fatalf("%q: point %d (%g) refused by Set: %v", text, i, x, err)
			}
		}
	})
}

// FuzzReadJournal feeds arbitrary bytes to the journal reader of a 12-point, 3-column sweep
// (shard 2 of 3): it may refuse, never panic, and what it accepts are rows of this sweep's
// shard, of the table's width, from whole lines only. Seeds are in testdata/fuzz/FuzzReadJournal.
func FuzzReadJournal(f *testing.F) {
	f.Add([]byte(`{"point":1,"row":["1","2","ok"],"crc":"00000000"}` + "\n"))
	f.Add([]byte(`{"point":1,"row":["1","2","ok"]}` + "\n"))
	m := &Manifest{Points: 12, Columns: []string{"point", "x", "status"}, Shard: Shard{K: 2, N: 3}}
	f.Fuzz(func(t *testing.T, b []byte) {
		rows, good, err := parseJournal(b, "fuzz.jsonl", m)
		if err != nil {
			return
		}
		if good < 0 || good > int64(len(b)) || (good > 0 && b[good-1] != '\n') {
			t.Fatalf("whole-line length %d of %d bytes", good, len(b))
		}
		for i, r := range rows {
			if i < 0 || i >= m.Points || !m.Shard.Owns(i) || len(r) != len(m.Columns) {
				t.Fatalf("accepted point %d with row %q", i, r)
			}
		}
	})
}
