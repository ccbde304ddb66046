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
