// Package sysmem reads how much memory the machine has and parses memory sizes written by a
// user ("4 GB", "512MiB"), for the memory limit of a run.
package sysmem

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
)

// Total returns the machine's memory [bytes] from /proc/meminfo (MemTotal), and false where
// that cannot be read (not Linux, no /proc).
func Total() (int64, bool) {
	f, err := os.Open("/proc/meminfo")
	if err != nil {
		return 0, false
	}
	defer f.Close()
	return memTotal(f)
}

// memTotal reads the MemTotal line ("MemTotal:  16314460 kB") of a meminfo listing.
func memTotal(r io.Reader) (int64, bool) {
	sc := bufio.NewScanner(io.LimitReader(r, 1<<16))
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 3 && f[0] == "MemTotal:" && f[2] == "kB" {
			kb, err := strconv.ParseInt(f[1], 10, 64)
			if err != nil || kb <= 0 || kb > 1<<40 {
				return 0, false
			}
			return kb * 1024, true
		}
	}
	return 0, false
}

// ParseBytes reads a memory size: a number and a unit B, kB, MB, GB, TB (powers of 1000) or
// KiB, MiB, GiB, TiB (powers of 1024), with or without a space ("4 GB", "512MiB").
func ParseBytes(text string) (int64, error) {
	t := strings.TrimSpace(text)
	i := strings.IndexFunc(t, func(r rune) bool { return (r < '0' || r > '9') && r != '.' && r != 'e' && r != 'E' && r != '+' })
	if i <= 0 {
		return 0, fmt.Errorf("memory size %q: want a number and a unit, e.g. \"4 GB\" or \"512 MiB\"", text)
	}
	x, err := strconv.ParseFloat(t[:i], 64)
	if err != nil {
		return 0, fmt.Errorf("memory size %q: want a number and a unit, e.g. \"4 GB\" or \"512 MiB\"", text)
	}
	scale := map[string]float64{"B": 1, "kB": 1e3, "KB": 1e3, "MB": 1e6, "GB": 1e9, "TB": 1e12,
		"KiB": 1 << 10, "MiB": 1 << 20, "GiB": 1 << 30, "TiB": 1 << 40}
	s, ok := scale[strings.TrimSpace(t[i:])]
	if !ok {
		return 0, fmt.Errorf("memory size %q: unknown unit %q (want B, kB, MB, GB, TB, KiB, MiB, GiB or TiB)", text, strings.TrimSpace(t[i:]))
	}
	b := x * s
	if !(b >= 1<<20 && b <= 1<<50) {
		return 0, fmt.Errorf("memory size %q: want between 1 MiB and 1 PiB", text)
	}
	return int64(b), nil
}
