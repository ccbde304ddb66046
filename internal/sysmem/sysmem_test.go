package sysmem

import (
	"strings"
	"testing"
)

func TestMemTotal(t *testing.T) {
	t.Parallel()
	in := "MemTotal:       16314460 kB\nMemFree:         1234 kB\n"
	if got, ok := memTotal(strings.NewReader(in)); !ok || got != 16314460*1024 {
		t.Errorf("memTotal = %d, %v; want %d", got, ok, 16314460*1024)
	}
	if _, ok := memTotal(strings.NewReader("MemFree: 12 kB\n")); ok {
		t.Error("no MemTotal line: want false")
	}
}

func TestParseBytes(t *testing.T) {
	t.Parallel()
	for text, want := range map[string]int64{"4 GB": 4e9, "512MiB": 512 << 20, "1.5 GiB": 3 << 29, "2e9 B": 2e9} {
		if got, err := ParseBytes(text); err != nil || got != want {
			t.Errorf("ParseBytes(%q) = %d, %v; want %d", text, got, err, want)
		}
	}
	for _, bad := range []string{"", "4", "GB", "4 GiGa", "-1 GB", "10 kB", "NaN GB"} {
		if _, err := ParseBytes(bad); err == nil {
			t.Errorf("ParseBytes(%q): want an error", bad)
		}
	}
}
