package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"

	"n2pulse/kinetics/study"
)

// buildBinary compiles the command into a temporary directory, for tests that need a separate
// process (killing it, or handing it to Slurm).
func buildBinary(t *testing.T) string {
	t.Helper()
	bin := filepath.Join(t.TempDir(), "n2pulse")
	goTool := filepath.Join(runtime.GOROOT(), "bin", "go")
	if _, err := os.Stat(goTool); err != nil {
		goTool = "go"
	}
	out, err := exec.Command(goTool, "build", "-o", bin, ".").CombinedOutput()
	if err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

// smallSweep is a cheap 6 × 5 sweep of the example design (coarse channel grid) for the
// process-level tests.
var smallSweep = []string{"sweep", "--vary", "gas.pressure=100Torr:760Torr:6:log",
	"--vary", "circuit.charge_voltage=10kV:16kV:5", "--set", "numerics.cells=60", "--quiet"}

func journalLines(path string) int {
	b, _ := os.ReadFile(path)
	return bytes.Count(b, []byte("\n"))
}

// TestSweepSurvivesKill kills a sweep with SIGKILL after some points are journaled, resumes
// it, and checks that results.csv is byte-identical to an uninterrupted sweep. Not parallel:
// the kill lands by polling the journal of another process, so the test keeps the machine to
// itself rather than let other tests' load move that moment.
func TestSweepSurvivesKill(t *testing.T) {
	if testing.Short() {
		t.Skip("builds the binary and runs 60 model points")
	}
	bin := buildBinary(t)
	dir := t.TempDir()
	whole, killed := filepath.Join(dir, "whole"), filepath.Join(dir, "killed")
	if out, err := exec.Command(bin, append(smallSweep, "--out", whole)...).CombinedOutput(); err != nil {
		t.Fatalf("uninterrupted sweep: %v\n%s", err, out)
	}
	want, err := os.ReadFile(filepath.Join(whole, study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}

	cmd := exec.Command(bin, append(smallSweep, "--out", killed, "--workers", "1")...)
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	journal := filepath.Join(killed, study.JournalFile)
	deadline := time.Now().Add(2 * time.Minute)
	for journalLines(journal) < 4 && time.Now().Before(deadline) {
		time.Sleep(2 * time.Millisecond)
	}
	if err := cmd.Process.Signal(syscall.SIGKILL); err != nil {
		t.Fatal(err)
	}
	cmd.Wait()
	n := journalLines(journal)
	if n < 4 || n >= 30 {
		t.Fatalf("%d of 30 points journaled when killed; the test needs a sweep killed mid-way", n)
	}
	if _, err := os.Stat(filepath.Join(killed, study.ResultsFile)); err == nil {
		t.Fatal("the killed sweep wrote results.csv")
	}
	out, err := exec.Command(bin, append(smallSweep, "--out", killed, "--resume")...).CombinedOutput()
	if err != nil {
		t.Fatalf("resume: %v\n%s", err, out)
	}
	got, err := os.ReadFile(filepath.Join(killed, study.ResultsFile))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("killed-then-resumed results.csv differs from the uninterrupted one (killed after %d points)", n)
	}
	if journalLines(journal) != 30 {
		t.Errorf("journal holds %d lines after resume, want 30", journalLines(journal))
	}
	t.Logf("killed after %d of 30 points; resumed results identical", n)
}

func TestSweepCommandErrors(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	for _, c := range []struct {
		args []string
		code int
		msg  string
	}{
		{[]string{"sweep"}, 2, "at least one --vary"},
		{[]string{"sweep", "--vary", "gas.presure=1:2:3"}, 2, "did you mean gas.pressure"},
		{[]string{"sweep", "--vary", "gas.pressure=1atm:2atm:2", "--metric", "nosuch"}, 2, "allowed energy_front_J"},
		{[]string{"sweep", "--vary", "gas.pressure=1atm:2atm:2", "--shard", "5/4"}, 2, "1 ≤ K ≤ N"},
		{[]string{"sweep", "--vary", "gas.pressure=1atm:2atm:2", "--workers", "0"}, 2, "--workers"},
		{[]string{"merge"}, 2, "name the shard directories"},
		{[]string{"merge", dir}, 1, "sweep.json"},
		{[]string{"length", "--from", "3 kV"}, 2, "--from"},
		{[]string{"length", "--travelling-wave", "fast"}, 2, "optics.excitation_velocity"},
		{[]string{"length", "--points", "2"}, 2, "allowed 3 to 10000"},
	} {
		var out, errb bytes.Buffer
		if code := run(c.args, &out, &errb); code != c.code || !strings.Contains(errb.String(), c.msg) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", c.args, code, errb.String(), c.code, c.msg)
		}
	}
}

// TestShardedSweepMerges runs a sweep as three shards in-process, merges them and compares
// with the unsharded sweep; merging two of three shards names the missing points.
func TestShardedSweepMerges(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs 24 model points")
	}
	dir := t.TempDir()
	args := []string{"sweep", "--vary", "gas.pressure=200Torr:760Torr:3", "--vary", "circuit.charge_voltage=12kV:14kV:2",
		"--set", "numerics.cells=40", "--quiet", "--workers", "2"}
	var out, errb bytes.Buffer
	if code := run(append(args, "--out", filepath.Join(dir, "whole")), &out, &errb); code != 0 {
		t.Fatalf("whole sweep: exit %d: %s", code, errb.String())
	}
	var shards []string
	for _, k := range []string{"1", "2", "3"} {
		sd := filepath.Join(dir, "shard"+k)
		shards = append(shards, sd)
		if code := run(append(args, "--out", sd, "--shard", k+"/3"), &out, &errb); code != 0 {
			t.Fatalf("shard %s: exit %d: %s", k, code, errb.String())
		}
	}
	merged := filepath.Join(dir, "merged")
	if code := run(append([]string{"merge", "--out", merged}, shards...), &out, &errb); code != 0 {
		t.Fatalf("merge: exit %d: %s", code, errb.String())
	}
	a, _ := os.ReadFile(filepath.Join(dir, "whole", study.ResultsFile))
	b, _ := os.ReadFile(filepath.Join(merged, study.ResultsFile))
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Error("merged shards differ from the unsharded sweep")
	}
	if _, err := os.Stat(filepath.Join(merged, "map-energy_total_J.svg")); err != nil {
		t.Errorf("merge drew no map: %v", err)
	}
	errb.Reset()
	if code := run([]string{"merge", "--force", "--out", merged, shards[0], shards[2]}, &out, &errb); code != 1 || !strings.Contains(errb.String(), "2 of 6 points missing: 1, 4") {
		t.Errorf("merge of two shards: exit %d, %q", code, errb.String())
	}
	// An existing merge is not overwritten without --force, and a shard's own directory is
	// never the output (it would become the whole sweep and refuse to resume as a shard).
	for _, c := range []struct {
		args []string
		want string
	}{
		{append([]string{"merge", "--out", merged}, shards...), "is not empty"},
		{append([]string{"merge", "--force", "--out", shards[1]}, shards...), "is the shard directory"},
	} {
		errb.Reset()
		if code := run(c.args, &out, &errb); code != 1 || !strings.Contains(errb.String(), c.want) {
			t.Errorf("%v: exit %d, %q; want exit 1 and %q", c.args, code, errb.String(), c.want)
		}
	}
	if m1, err := study.ReadManifest(shards[1]); err != nil || m1.Shard.K != 2 || m1.Shard.N != 3 {
		t.Errorf("shard 2's manifest after a refused merge: %+v, %v; want shard 2/3", m1, err)
	}
	errb.Reset()
	if code := run(append([]string{"merge", "--force", "--out", merged}, shards...), &out, &errb); code != 0 {
		t.Errorf("merge --force over the earlier merge: exit %d, %q", code, errb.String())
	}
}
