package atomicfile

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

func TestWriteFile(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "a.txt")
	if err := WriteFile(p, []byte("one")); err != nil {
		t.Fatal(err)
	}
	if err := WriteFile(p, []byte("two")); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(p); string(b) != "two" {
		t.Errorf("content %q", b)
	}
	if err := WriteFile(filepath.Join(dir, "missing", "b.txt"), nil); err == nil {
		t.Error("no error for a missing directory")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("left behind: %v", entries)
	}
}

type failing struct{}

func (failing) WriteTo(io.Writer) (int64, error) { return 0, errors.New("render failed") }

func TestWriteToKeepsOldFile(t *testing.T) {
	p := filepath.Join(t.TempDir(), "fig.png")
	os.WriteFile(p, []byte("old"), 0o644)
	if err := WriteTo(p, failing{}); err == nil {
		t.Fatal("no error")
	}
	if b, _ := os.ReadFile(p); string(b) != "old" {
		t.Errorf("old file changed to %q", b)
	}
}

// TestRemoveLeftovers: the temporary file a kill leaves between write and rename is removed,
// and nothing else is (a file merely named like one, a hidden file, a directory).
func TestRemoveLeftovers(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	keep := []string{"results.csv", ".hidden", "x.tmp1", ".results.csv.tmpfoo"}
	gone := []string{".results.csv.tmp123456", ".sweep.json.tmp42"}
	for _, n := range append(append([]string{}, keep...), gone...) {
		if err := os.WriteFile(filepath.Join(dir, n), []byte("x"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	if err := os.Mkdir(filepath.Join(dir, ".d.tmp7"), 0o755); err != nil {
		t.Fatal(err)
	}
	n, err := RemoveLeftovers(dir)
	if err != nil || n != len(gone) {
		t.Fatalf("RemoveLeftovers = %d, %v; want %d removed", n, err, len(gone))
	}
	for _, k := range append(keep, ".d.tmp7") {
		if _, err := os.Stat(filepath.Join(dir, k)); err != nil {
			t.Errorf("%s removed: %v", k, err)
		}
	}
	for _, g := range gone {
		if _, err := os.Stat(filepath.Join(dir, g)); !errors.Is(err, os.ErrNotExist) {
			t.Errorf("%s left: %v", g, err)
		}
	}
	if _, err := RemoveLeftovers(filepath.Join(dir, "missing")); err == nil {
		t.Error("no error for a missing directory")
	}
}
