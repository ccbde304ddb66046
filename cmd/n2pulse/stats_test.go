package main

import (
	"bytes"
	"regexp"
	"strconv"
	"testing"
)

// TestRunStats checks that run --stats prints every counter the circuit integrator keeps
// (steps, rejections, failed evaluations, f evaluations, Jacobians, factorisations), with
// numbers that hang together: one Jacobian per accepted or rejected step at most, at least one
// factorisation per step.
func TestRunStats(t *testing.T) {
	t.Parallel()
	var out, errb bytes.Buffer
	if code := run([]string{"run", "--stats", "--set", "numerics.cells=40"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	re := regexp.MustCompile(`steps (\d+), rejected (\d+) \((\d+) failed evaluations\), f evaluations (\d+), Jacobians (\d+), factorisations (\d+)`)
	m := re.FindStringSubmatch(errb.String())
	if m == nil {
		t.Fatalf("--stats printed %q, want every integrator counter", errb.String())
	}
	n := make([]int, len(m)-1)
	for i := range n {
		n[i], _ = strconv.Atoi(m[i+1])
	}
	steps, rejected, jac, fact := n[0], n[1], n[4], n[5]
	if steps == 0 || jac == 0 || jac > steps+rejected || fact < steps {
		t.Errorf("counters do not hang together: %v", m[0])
	}
}
