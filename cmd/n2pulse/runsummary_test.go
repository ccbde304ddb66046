package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// TestRunSummaryGainLabels (issue 16 case 5): the summary names both gains. Before, "peak
// gain 1.24 cm⁻¹ (gain × length 21.4)" on a 25 cm channel mixed the cell's peak with the
// channel mean's gain-length. Now the mid-channel cell's peak gain is printed with its own
// product with the length and the channel-mean gain with the gain-length gL; on the example
// (20 cm) the two products differ by more than a factor 2 (cell 2.56 cm⁻¹ × 20 cm = 51.2
// against gL 21.3 when the test was written), so a mix-up cannot pass.
func TestRunSummaryGainLabels(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s, l := r.Summary, d.Channel.Length
	if s.PeakGain*l < 2*s.GainLength {
		t.Fatalf("cell peak × length %.3g not above 2 × gL %.3g: the test cannot tell them apart", s.PeakGain*l, s.GainLength)
	}
	var out, errb bytes.Buffer
	if code := run([]string{"run"}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	for _, want := range []string{
		fmt.Sprintf("peak gain (mid-channel cell) %.3g cm⁻¹ (× channel length: %.3g)", s.PeakGain/100, s.PeakGain*l),
		fmt.Sprintf("channel-mean gain, peak      %.3g cm⁻¹ (gain-length gL = ∫g dz: %.3g)", s.GainLength/l/100, s.GainLength),
	} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("summary lacks %q:\n%s", want, out.String())
		}
	}
}

// TestRunMemoryLimitFlag (issue 11 item 1): `run --memory-limit` refuses a design above it
// (exit 1, the keys named) and rejects a size it cannot read (exit 2).
func TestRunMemoryLimitFlag(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	code := run([]string{"run", "--memory-limit", "100 MB", "--set", "channel.length=1 mm", "--set", "numerics.end_time=10 us"}, &out, &errb)
	if code != 1 || !strings.Contains(errb.String(), "numerics.end_time") || !strings.Contains(errb.String(), "memory") {
		t.Errorf("exit %d, stderr %q: want 1 and the memory limit explained", code, errb.String())
	}
	errb.Reset()
	if code := run([]string{"run", "--memory-limit", "lots"}, &out, &errb); code != 2 {
		t.Errorf("--memory-limit lots: exit %d, want 2 (%s)", code, errb.String())
	}
}

// TestSweepMemoryLimitFlag (issue 11 item 1): `sweep --memory-limit` shares the limit among the
// workers; a point above its share is a failed row naming the memory, and the sweep finishes
// (before, such a point killed the process on every --resume).
func TestSweepMemoryLimitFlag(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	var out, errb bytes.Buffer
	code := run([]string{"sweep", "--set", "channel.length=1 cm", "--vary", "numerics.end_time=30ns:10us:2",
		"--memory-limit", "1 GB", "--workers", "2", "--out", dir, "--quiet"}, &out, &errb)
	if code != 0 {
		t.Fatalf("sweep: exit %d: %s", code, errb.String())
	}
	b, err := os.ReadFile(filepath.Join(dir, "results.csv"))
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(b)), "\n")
	if len(lines) != 3 || !strings.HasSuffix(lines[1], ",ok") || !strings.Contains(lines[2], "failed: ") ||
		!strings.Contains(lines[2], "memory") || !strings.Contains(lines[2], "477 MiB") {
		t.Errorf("results.csv:\n%s\nwant the 30 ns point ok and the 10 µs point failed on its 477 MiB share (1 GB / 2)", b)
	}
}

// length --memory-limit shares the limit among the workers as sweep does: at 10 µs the 1 cm
// and 15.5 cm channels (10.7 GiB and 708 MiB by the estimate) fail on their 477 MiB share
// (1 GB / 2), the 30 cm one runs, and the scan finishes; messages carry no package prefix.
func TestLengthMemoryLimitFlag(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	code := run([]string{"length", "--set", "numerics.end_time=10 us", "--from", "1 cm", "--to", "30 cm",
		"--points", "3", "--memory-limit", "1 GB", "--workers", "2"}, &out, &errb)
	if code != 0 {
		t.Fatalf("length: exit %d: %s", code, errb.String())
	}
	text := out.String() + errb.String()
	if n := strings.Count(text, "failed: the run needs about"); n != 2 || !strings.Contains(text, "477 MiB") {
		t.Errorf("want the 1 cm and 15.5 cm lengths failed on their 477 MiB share, got %d failures:\n%s", n, text)
	}
	if strings.Contains(text, "kinetics:") {
		t.Errorf("a package prefix reached the user:\n%s", text)
	}
}
