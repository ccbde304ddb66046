package main

import (
	"bytes"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
)

// TestSlurmJobArray starts a one-node Slurm cluster (scripts/slurm/start-local-cluster.sh),
// submits scripts/slurm/sweep-array.sh as a 4-task job array running the built binary on a
// small sweep, merges the four shards and checks the merge is byte-identical to the same sweep
// on one machine. It runs only with N2PULSE_SLURM=1 (it needs root and installs packages);
// where the cluster cannot start it skips and says why. Not parallel: it starts and stops a
// machine-wide cluster.
func TestSlurmJobArray(t *testing.T) {
	if os.Getenv("N2PULSE_SLURM") != "1" {
		t.Skip("set N2PULSE_SLURM=1 to run the Slurm job-array test (needs root; installs slurm-wlm and munge)")
	}
	root, err := filepath.Abs("../..")
	if err != nil {
		t.Fatal(err)
	}
	start := filepath.Join(root, "scripts", "slurm", "start-local-cluster.sh")
	wasRunning := exec.Command("bash", start, "status").Run() == nil
	out, err := exec.Command("bash", start).CombinedOutput()
	if err != nil {
		t.Skipf("no Slurm cluster: %s failed: %v\n%s", start, err, tail(out, 20))
	}
	if !wasRunning {
		t.Cleanup(func() { exec.Command("bash", start, "stop").Run() })
	}
	conf := ""
	for _, line := range strings.Split(string(out), "\n") {
		if v, ok := strings.CutPrefix(line, "SLURM_CONF="); ok {
			conf = v
		}
	}
	if conf == "" {
		t.Fatalf("start script printed no SLURM_CONF line:\n%s", out)
	}

	bin := buildBinary(t)
	dir := t.TempDir()
	sweep := []string{"--vary", "gas.pressure=150Torr:760Torr:5:log", "--vary", "circuit.charge_voltage=11kV:15kV:3",
		"--set", "numerics.cells=40"}
	env := append(os.Environ(), "SLURM_CONF="+conf, "N2PULSE="+bin, "OUT="+filepath.Join(dir, "shards"))
	sb := exec.Command("sbatch", append([]string{"--wait", "--array=1-4", "--chdir=" + dir,
		filepath.Join(root, "scripts", "slurm", "sweep-array.sh")}, sweep...)...)
	sb.Env = env
	if out, err := sb.CombinedOutput(); err != nil {
		logs, _ := filepath.Glob(filepath.Join(dir, "*.log"))
		var b strings.Builder
		for _, l := range logs {
			c, _ := os.ReadFile(l)
			fmt.Fprintf(&b, "%s:\n%s\n", l, c)
		}
		t.Fatalf("sbatch --wait: %v\n%s\n%s", err, out, b.String())
	}

	shards, _ := filepath.Glob(filepath.Join(dir, "shards", "*"))
	if len(shards) != 4 {
		t.Fatalf("%d shard directories, want 4: %v", len(shards), shards)
	}
	for _, s := range shards {
		m, err := study.ReadManifest(s)
		if err != nil {
			t.Fatal(err)
		}
		if m.Shard.N != 4 || filepath.Base(s) != fmt.Sprint(m.Shard.K) {
			t.Errorf("%s holds shard %s", s, m.Shard)
		}
	}
	merged := filepath.Join(dir, "merged")
	if out, err := exec.Command(bin, append([]string{"merge", "--out", merged}, shards...)...).CombinedOutput(); err != nil {
		t.Fatalf("merge: %v\n%s", err, out)
	}
	single := filepath.Join(dir, "single")
	cmd := exec.Command(bin, append(append([]string{"sweep"}, sweep...), "--out", single, "--quiet")...)
	cmd.Env = os.Environ() // no Slurm variables: the whole sweep
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("single-machine sweep: %v\n%s", err, out)
	}
	a, _ := os.ReadFile(filepath.Join(single, study.ResultsFile))
	b, _ := os.ReadFile(filepath.Join(merged, study.ResultsFile))
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Errorf("merged Slurm shards differ from the single-machine sweep:\n%s\nwant\n%s", b, a)
	}
}

// tail returns the last n lines of b.
func tail(b []byte, n int) string {
	lines := strings.Split(strings.TrimRight(string(b), "\n"), "\n")
	if len(lines) > n {
		lines = lines[len(lines)-n:]
	}
	return strings.Join(lines, "\n")
}
