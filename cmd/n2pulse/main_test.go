package main

import (
	"bytes"
	"runtime"
	"strings"
	"testing"
)

func TestExitCodes(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"nosuch"}, &out, &errb); code != 2 {
		t.Errorf("unknown command: exit %d, want 2", code)
	}
	if code := run([]string{"check", "--nosuchflag"}, &out, &errb); code != 2 {
		t.Errorf("bad flag: exit %d, want 2", code)
	}
	out.Reset()
	errb.Reset()
	if code := run([]string{"check", "--help"}, &out, &errb); code != 0 {
		t.Errorf("--help: exit %d, want 0", code)
	}
	if !strings.Contains(errb.String(), "usage: n2pulse check") {
		t.Errorf("--help printed %q", errb.String())
	}
	out.Reset()
	if code := run([]string{"help"}, &out, &errb); code != 0 || !strings.Contains(out.String(), "check") {
		t.Errorf("help: exit %d, output %q", code, out.String())
	}
}

// TestVersion checks that --version and the version command print the same one line naming
// the program and the Go release it was built with.
func TestVersion(t *testing.T) {
	t.Parallel()
	var a, b, errb bytes.Buffer
	if code := run([]string{"--version"}, &a, &errb); code != 0 {
		t.Fatalf("--version: exit %d: %s", code, errb.String())
	}
	if code := run([]string{"version"}, &b, &errb); code != 0 {
		t.Fatalf("version: exit %d: %s", code, errb.String())
	}
	if a.String() != b.String() || !strings.HasPrefix(a.String(), "n2pulse ") || !strings.Contains(a.String(), runtime.Version()) ||
		strings.Count(a.String(), "\n") != 1 {
		t.Errorf("--version %q, version %q: want one equal line naming n2pulse and %s", a.String(), b.String(), runtime.Version())
	}
}
