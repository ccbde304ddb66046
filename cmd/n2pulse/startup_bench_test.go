package main

import (
	"io"
	"os"
	"os/exec"
	"testing"
)

// asProgram is the environment variable that makes the test binary act as n2pulse itself (see
// TestMain): BenchmarkProcessRun starts it as a fresh process to time the whole start-up.
const asProgram = "N2PULSE_TEST_AS_PROGRAM"

// TestMain runs the tests, or, with N2PULSE_TEST_AS_PROGRAM=1 in the environment, runs the
// program on the arguments after "--" and exits with its code.
func TestMain(m *testing.M) {
	if os.Getenv(asProgram) == "1" {
		for i, a := range os.Args {
			if a == "--" {
				os.Exit(run(os.Args[i+1:], os.Stdout, os.Stderr))
			}
		}
		os.Exit(2)
	}
	os.Exit(m.Run())
}

// BenchmarkProcessRun times `n2pulse run` of the example design as a fresh process, start-up
// included (runtime and package initialisation, the embedded tables, the design file, the shot,
// the summary): what a script calling the program in a loop pays per call. The test binary
// stands in for the program, so its own larger initialisation is included too. Reported with
// runs/s.
func BenchmarkProcessRun(b *testing.B) {
	exe, err := os.Executable()
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		cmd := exec.Command(exe, "-test.run=^$", "--", "run", "../../data/designs/example.toml")
		cmd.Env = append(os.Environ(), asProgram+"=1")
		cmd.Stdout, cmd.Stderr = io.Discard, io.Discard
		if err := cmd.Run(); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "runs/s")
}

// BenchmarkRunCommand times the run command in process after a first call has loaded the
// embedded tables: the shot and its report without any start-up, to set against
// BenchmarkProcessRun. Reported with runs/s.
func BenchmarkRunCommand(b *testing.B) {
	args := []string{"run", "../../data/designs/example.toml"}
	if code := run(args, io.Discard, io.Discard); code != 0 {
		b.Fatalf("run: exit code %d", code)
	}
	for b.Loop() {
		if code := run(args, io.Discard, io.Discard); code != 0 {
			b.Fatalf("run: exit code %d", code)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "runs/s")
}
