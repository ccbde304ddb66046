package swarm

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// Load reads a table file once while it is unchanged, reads it again once it changes, and
// names the file when it cannot be read.
func TestLoad(t *testing.T) {
	t.Parallel()
	tb, err := BuiltinSet("n2", SetOriginal)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := tb.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "user.csv")
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	a, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	b, err := Load(path)
	if err != nil || a != b {
		t.Errorf("second Load: table %p, error %v; want the cached %p", b, err, a)
	}
	lo, hi := a.Range()
	if wlo, whi := tb.Range(); lo != wlo || hi != whi {
		t.Errorf("range %g–%g V m², want %g–%g", lo, hi, wlo, whi)
	}
	// One row fewer: another size, so the file is read again.
	rows := tb.Rows()
	short, err := NewTable(rows[:len(rows)-1])
	if err != nil {
		t.Fatal(err)
	}
	buf.Reset()
	if err := short.WriteCSV(&buf); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
	c, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if c == a || len(c.Rows()) != len(rows)-1 {
		t.Errorf("after the change: %d rows, want %d rows in a new table", len(c.Rows()), len(rows)-1)
	}
	if _, err := Load(filepath.Join(t.TempDir(), "missing.csv")); err == nil {
		t.Error("a missing file loaded")
	}
}
