package main

import (
	"bytes"
	"strings"
	"testing"
)

func TestExitCodes(t *testing.T) {
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
