// Package atomicfile writes files so that a reader sees either the old file or the whole new
// one, never a half-written file: the data go to a temporary file in the same directory, are
// synced to disk, and the temporary file is renamed over the target.
package atomicfile

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"sync"
)

// WriteFile writes b to path atomically with permissions 0644.
func WriteFile(path string, b []byte) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	tmp := f.Name()
	_, err = f.Write(b)
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Chmod(tmp, 0o644)
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}

// WriteTo renders w into memory and writes it to path atomically; a failed render leaves the
// target untouched.
func WriteTo(path string, w io.WriterTo) error {
	var b bytes.Buffer
	if _, err := w.WriteTo(&b); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return WriteFile(path, b.Bytes())
}

// tempPattern is the name CreateTemp gives WriteFile's temporary files: "." + the target's
// name + ".tmp" + digits. It is compiled at its first use, not at every start of the program.
var tempPattern = sync.OnceValue(func() *regexp.Regexp { return regexp.MustCompile(`^\..+\.tmp[0-9]+$`) })

// RemoveLeftovers deletes the temporary files that a WriteFile killed before its rename left
// in dir, and returns how many it removed. Call it when a program starts writing into a
// directory again (a resumed sweep, a re-run into the same output), never while another
// process writes there.
func RemoveLeftovers(dir string) (int, error) {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return 0, fmt.Errorf("cleaning %s: %w", dir, err)
	}
	n := 0
	for _, e := range entries {
		if e.Type().IsRegular() && tempPattern().MatchString(e.Name()) {
			if err := os.Remove(filepath.Join(dir, e.Name())); err != nil {
				return n, fmt.Errorf("cleaning %s: %w", dir, err)
			}
			n++
		}
	}
	return n, nil
}
