package study

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// fakeRunner is a cheap deterministic stand-in for the model, for testing the machinery only:
// the figures of merit are simple functions of pressure and voltage, and points above
// 700 Torr fail. Each call sleeps a pseudo-random time so that points finish out of order.
func fakeRunner(d *design.Design) (kinetics.Summary, error) {
	p, v := d.Gas.Pressure, d.Circuit.ChargeVoltage
	h := math.Mod(p*7.31+v*0.013, 1)
	time.Sleep(time.Duration(h * float64(2*time.Millisecond)))
	if p > 700*units.Torr {
		return kinetics.Summary{}, fmt.Errorf("fake: pressure %g Pa\ntoo high", p)
	}
	return kinetics.Summary{
		EnergyTotal:      1e-9 * v * p / (1 + p/1e4),
		PeakPower:        v * p,
		FWHM:             1e-9 / (1 + p/1e4),
		Efficiency:       1e-3 * p / 1e5,
		TerminationCause: "lower-level bottleneck, fake",
		Lases:            true,
		Overridden:       []string{"a", "b"},
	}, nil
}

func testSweep(t *testing.T, dir string) *Sweep {
	t.Helper()
	d := design.ExampleDesign()
	p, err := ParseAxis("gas.pressure=20Torr:760Torr:7:log", d)
	if err != nil {
		t.Fatal(err)
	}
	v, err := ParseAxis("circuit.charge_voltage=8kV:16kV:5", d)
	if err != nil {
		t.Fatal(err)
	}
	return &Sweep{Design: d, Axes: []Axis{p, v}, Runner: fakeRunner, Workers: 3, Dir: dir}
}

func readFile(t *testing.T, path string) []byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

func TestParseAxis(t *testing.T) {
	d := design.ExampleDesign()
	a, err := ParseAxis("gas.pressure=20Torr:760 Torr:20:log", d)
	if err != nil {
		t.Fatal(err)
	}
	// 1 Torr = 101325/760 Pa exactly (NIST SP 811, appendix B).
	if want := 20 * 101325.0 / 760; math.Abs(a.From-want) > 1e-9*want || a.To != 760*101325.0/760 || a.N != 20 || !a.Log {
		t.Errorf("axis %+v, want from %g", a, want)
	}
	if a.Header() != "gas.pressure [Pa]" {
		t.Errorf("header %q", a.Header())
	}
	v := a.Values()
	if v[0] != a.From || v[19] != a.To {
		t.Errorf("ends %g %g", v[0], v[19])
	}
	// log spacing: constant ratio (38^(1/19)).
	r := math.Pow(38, 1.0/19)
	for i := 1; i < len(v); i++ {
		if q := v[i] / v[i-1]; math.Abs(q-r) > 1e-12 {
			t.Fatalf("ratio %d: %g, want %g", i, q, r)
		}
	}
	lin, err := ParseAxis("circuit.charge_voltage=10kV:20kV:3", d)
	if err != nil {
		t.Fatal(err)
	}
	if got := lin.Values(); got[0] != 1e4 || got[1] != 1.5e4 || got[2] != 2e4 {
		t.Errorf("linear values %v", got)
	}
	for _, bad := range []struct{ in, want string }{
		{"gas.presure=1:2:3", "did you mean gas.pressure"},
		{"gas.pressure=1atm:2atm", "KEY=FROM:TO:N"},
		{"gas.pressure=1atm:2atm:0", "whole number from 1"},
		{"gas.pressure=1atm:2atm:x", "whole number from 1"},
		{"gas.pressure=1 kV:2atm:3", "FROM"},
		{"gas.pressure=1atm:1e9atm:3", "out of range"},
		{"gas.pressure=1atm:2atm:3:cubic", "allowed log or lin"},
		{"channel.stray_capacitance=0:1nF:3:log", "positive ends"},
		{"circuit.topology=a:b:2", "text key"},
		{"=1:2:3", "KEY=FROM:TO:N"},
	} {
		_, err := ParseAxis(bad.in, d)
		if err == nil || !strings.Contains(err.Error(), bad.want) {
			t.Errorf("ParseAxis(%q) = %v, want an error containing %q", bad.in, err, bad.want)
		}
	}
}

func TestMetricsFollowSummary(t *testing.T) {
	m := Metrics()
	want := []string{"energy_front_J", "energy_total_J", "peak_power_W", "fwhm_s", "efficiency", "inversion_duration_s", "termination_cause"}
	for _, w := range want {
		found := false
		for _, x := range m {
			found = found || x == w
		}
		if !found {
			t.Errorf("metric %s missing from %v", w, m)
		}
	}
	if n := len(summaryFields(kinetics.Summary{})); n != len(m) {
		t.Errorf("%d fields for %d metrics", n, len(m))
	}
	for _, x := range NumericMetrics() {
		if x == "termination_cause" || x == "lases" {
			t.Errorf("%s listed as numeric", x)
		}
	}
}

func TestPointsOrderAndIndices(t *testing.T) {
	s := testSweep(t, t.TempDir())
	if s.Points() != 35 {
		t.Fatalf("points %d", s.Points())
	}
	// Last axis fastest: point 6 is pressure index 1, voltage index 1.
	if got := s.Indices(6); got[0] != 1 || got[1] != 1 {
		t.Errorf("indices of 6: %v", got)
	}
	d, err := s.PointDesign(6)
	if err != nil {
		t.Fatal(err)
	}
	if d.Circuit.ChargeVoltage != 10e3 || d.Gas.Pressure != s.Axes[0].Values()[1] {
		t.Errorf("point 6 design: %g V, %g Pa", d.Circuit.ChargeVoltage, d.Gas.Pressure)
	}
	if s.Design.Circuit.ChargeVoltage != 14e3 {
		t.Error("base design modified")
	}
}

func TestSweepOrderIndependentOfWorkers(t *testing.T) {
	var csvs [][]byte
	for _, w := range []int{1, 4} {
		s := testSweep(t, t.TempDir())
		s.Workers = w
		tab, err := s.Run(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		if len(tab.Rows) != 35 {
			t.Fatalf("%d rows", len(tab.Rows))
		}
		for r := range tab.Rows {
			if tab.Rows[r][0] != fmt.Sprint(r) {
				t.Fatalf("row %d holds point %s", r, tab.Rows[r][0])
			}
		}
		csvs = append(csvs, readFile(t, filepath.Join(s.Dir, ResultsFile)))
	}
	if !bytes.Equal(csvs[0], csvs[1]) {
		t.Error("results.csv differs between 1 and 4 workers")
	}
	head := strings.SplitN(string(csvs[0]), "\n", 2)[0]
	if !strings.HasPrefix(head, "point,gas.pressure [Pa],circuit.charge_voltage [V],energy_front_J,") || !strings.HasSuffix(head, ",status") {
		t.Errorf("header %q", head)
	}
}

func TestFailedPointsKeepTheirRows(t *testing.T) {
	s := testSweep(t, t.TempDir())
	var calls atomic.Int32
	s.Runner = func(d *design.Design) (kinetics.Summary, error) {
		if calls.Add(1) == 3 {
			panic("boom")
		}
		return fakeRunner(d)
	}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	st, e := tab.Column(StatusColumn), tab.Column("energy_total_J")
	var ok, failed, panicked int
	for r, row := range tab.Rows {
		switch {
		case tab.OK(r):
			ok++
			if math.IsNaN(tab.Float(r, e)) {
				t.Errorf("row %d: ok but no energy", r)
			}
		case strings.HasPrefix(row[st], "failed: fake: pressure") && !strings.Contains(row[st], "\n"):
			failed++
			if row[e] != "" {
				t.Errorf("row %d: failed but energy %q", r, row[e])
			}
		case strings.Contains(row[st], "model panicked: boom"):
			panicked++
		default:
			t.Errorf("row %d: status %q", r, row[st])
		}
	}
	// The last pressure (760 Torr) fails on each of its 5 voltages; one other point panicked.
	if panicked != 1 || failed < 4 || ok+failed+panicked != 35 {
		t.Errorf("ok %d, failed %d, panicked %d", ok, failed, panicked)
	}
}

// interrupt runs the sweep and cancels it after n points have finished.
func interrupt(t *testing.T, s *Sweep, n int32) {
	t.Helper()
	ctx, cancel := context.WithCancel(context.Background())
	var count atomic.Int32
	run := s.Runner
	s.Runner = func(d *design.Design) (kinetics.Summary, error) {
		if count.Add(1) >= n {
			cancel()
		}
		return run(d)
	}
	if _, err := s.Run(ctx); !errors.Is(err, context.Canceled) {
		t.Fatalf("interrupted run: %v", err)
	}
	s.Runner = run
}

func TestResumeComputesOnlyMissingPoints(t *testing.T) {
	whole := testSweep(t, t.TempDir())
	if _, err := whole.Run(context.Background()); err != nil {
		t.Fatal(err)
	}
	want := readFile(t, filepath.Join(whole.Dir, ResultsFile))

	s := testSweep(t, t.TempDir())
	interrupt(t, s, 10)
	rows, _, err := readJournal(filepath.Join(s.Dir, JournalFile), s.manifest())
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 10 || len(rows) > 13 {
		t.Fatalf("%d points journaled after cancelling at 10 with 3 workers", len(rows))
	}
	if _, err := os.Stat(filepath.Join(s.Dir, ResultsFile)); err == nil {
		t.Error("an interrupted sweep wrote results.csv")
	}
	// A cut last line, as a kill during a write leaves it.
	f, _ := os.OpenFile(filepath.Join(s.Dir, JournalFile), os.O_APPEND|os.O_WRONLY, 0)
	f.WriteString(`{"point":34,"row":["34","1`)
	f.Close()

	if _, err := s.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "--resume") {
		t.Fatalf("rerun without resume: %v", err)
	}
	var calls atomic.Int32
	s.Resume = true
	s.Runner = func(d *design.Design) (kinetics.Summary, error) { calls.Add(1); return fakeRunner(d) }
	if _, err := s.Run(context.Background()); err != nil {
		t.Fatal(err)
	}
	if int(calls.Load()) != 35-len(rows) {
		t.Errorf("resume computed %d points, want %d", calls.Load(), 35-len(rows))
	}
	if got := readFile(t, filepath.Join(s.Dir, ResultsFile)); !bytes.Equal(got, want) {
		t.Errorf("resumed results differ:\n%s\nwant\n%s", got, want)
	}
	// Resuming a finished sweep computes nothing and gives the same file.
	calls.Store(0)
	if _, err := s.Run(context.Background()); err != nil || calls.Load() != 0 {
		t.Errorf("second resume: %v, %d calls", err, calls.Load())
	}
}

func TestResumeRefusesAnotherSweep(t *testing.T) {
	s := testSweep(t, t.TempDir())
	interrupt(t, s, 4)
	other := testSweep(t, s.Dir)
	other.Resume = true
	other.Axes[1].N = 6
	if _, err := other.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "different sweep") {
		t.Errorf("different grid: %v", err)
	}
	other = testSweep(t, s.Dir)
	other.Resume = true
	if err := other.Design.Set("channel.length", "30 cm"); err != nil {
		t.Fatal(err)
	}
	if _, err := other.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "channel.length") {
		t.Errorf("different design: %v", err)
	}
	other = testSweep(t, s.Dir)
	other.Resume = true
	other.Shard = Shard{K: 1, N: 2}
	if _, err := other.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "shard") {
		t.Errorf("different shard: %v", err)
	}
}

func TestShardsMerge(t *testing.T) {
	whole := testSweep(t, t.TempDir())
	full, err := whole.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	root := t.TempDir()
	var dirs []string
	for k := 1; k <= 3; k++ {
		s := testSweep(t, filepath.Join(root, fmt.Sprint(k)))
		s.Shard = Shard{K: k, N: 3}
		tab, err := s.Run(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		if want := (35 + 3 - k) / 3; len(tab.Rows) != want {
			t.Errorf("shard %d: %d rows, want %d", k, len(tab.Rows), want)
		}
		dirs = append(dirs, s.Dir)
	}
	merged, m, err := Merge([]string{dirs[2], dirs[0], dirs[1]})
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(merged.CSV(), full.CSV()) {
		t.Error("merged shards differ from the whole sweep")
	}
	if m.Points != 35 || m.Shard != (Shard{1, 1}) {
		t.Errorf("merged manifest %+v", m)
	}

	if _, _, err := Merge(dirs[:2]); err == nil || !strings.Contains(err.Error(), "11 of 35 points missing: 2, 5, 8") {
		t.Errorf("missing shard: %v", err)
	}
	if _, _, err := Merge([]string{dirs[0], dirs[1], dirs[2], dirs[0]}); err == nil || !strings.Contains(err.Error(), "present more than once: 0 (in") {
		t.Errorf("duplicate shard: %v", err)
	}
	odd := testSweep(t, filepath.Join(root, "odd"))
	odd.Shard = Shard{K: 3, N: 3}
	if err := odd.Design.Set("circuit.channel_inductance", "2 nH"); err != nil {
		t.Fatal(err)
	}
	if _, err := odd.Run(context.Background()); err != nil {
		t.Fatal(err)
	}
	if _, _, err := Merge([]string{dirs[0], dirs[1], odd.Dir}); err == nil || !strings.Contains(err.Error(), "circuit.channel_inductance") || !strings.Contains(err.Error(), "odd") {
		t.Errorf("shard of another design: %v", err)
	}
}

func TestShardFromSlurm(t *testing.T) {
	env := func(kv ...string) func(string) string {
		m := map[string]string{}
		for i := 0; i < len(kv); i += 2 {
			m[kv[i]] = kv[i+1]
		}
		return func(k string) string { return m[k] }
	}
	for _, c := range []struct {
		env  func(string) string
		want Shard
		ok   bool
		err  string
	}{
		{env(), Shard{}, false, ""},
		{env("SLURM_ARRAY_TASK_ID", "3", "SLURM_ARRAY_TASK_COUNT", "4"), Shard{3, 4}, true, ""},
		{env("SLURM_ARRAY_TASK_ID", "0", "SLURM_ARRAY_TASK_MIN", "0", "SLURM_ARRAY_TASK_MAX", "3"), Shard{1, 4}, true, ""},
		{env("SLURM_ARRAY_TASK_ID", "4", "SLURM_ARRAY_TASK_MIN", "1", "SLURM_ARRAY_TASK_COUNT", "4"), Shard{4, 4}, true, ""},
		{env("SLURM_ARRAY_TASK_ID", "2"), Shard{}, false, "pass --shard"},
		{env("SLURM_ARRAY_TASK_ID", "x", "SLURM_ARRAY_TASK_COUNT", "4"), Shard{}, false, "whole number"},
		{env("SLURM_ARRAY_TASK_ID", "9", "SLURM_ARRAY_TASK_COUNT", "4"), Shard{}, false, "not a shard"},
	} {
		s, ok, err := ShardFromSlurm(c.env)
		if s != c.want || ok != c.ok || (c.err == "") != (err == nil) || err != nil && !strings.Contains(err.Error(), c.err) {
			t.Errorf("got %v %v %v, want %v %v %q", s, ok, err, c.want, c.ok, c.err)
		}
	}
	if s, err := ParseShard("2/5"); err != nil || s != (Shard{2, 5}) {
		t.Errorf("ParseShard: %v %v", s, err)
	}
	for _, bad := range []string{"0/3", "4/3", "a/b", "3"} {
		if _, err := ParseShard(bad); err == nil {
			t.Errorf("ParseShard(%q) accepted", bad)
		}
	}
}

func TestProgressLine(t *testing.T) {
	got := progressLine(30, 120, 10*time.Second)
	if !strings.Contains(got, "30/120 points") || !strings.Contains(got, "3 points/s") || !strings.Contains(got, "30s left") || !strings.HasPrefix(got, "[#######.") {
		t.Errorf("progress line %q", got)
	}
}

// TestWorkersRunConcurrently checks that nothing serialises the points: with W workers, W runs
// are in flight at once (each waits until all W have started).
func TestWorkersRunConcurrently(t *testing.T) {
	const w = 4
	var inFlight atomic.Int32
	all := make(chan struct{})
	s := testSweep(t, t.TempDir())
	s.Workers = w
	s.Runner = func(d *design.Design) (kinetics.Summary, error) {
		if inFlight.Add(1) == w {
			close(all)
		}
		select {
		case <-all:
		case <-time.After(10 * time.Second):
			return kinetics.Summary{}, errors.New("fewer than 4 points ran at once")
		}
		return fakeRunner(d)
	}
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	for r := range tab.Rows {
		if st := tab.Rows[r][tab.Column(StatusColumn)]; strings.Contains(st, "at once") {
			t.Fatalf("point %d: %s", r, st)
		}
	}
}

// signedLine is a journal line with its correct checksum.
func signedLine(t *testing.T, point int, row []string) string {
	t.Helper()
	e := journalEntry{Point: point, Row: row}
	sum, err := e.checksum()
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(journalLine{e, sum})
	if err != nil {
		t.Fatal(err)
	}
	return string(b) + "\n"
}

// TestJournalThatIsNotThisSweep: a damaged line inside the journal, a line without a checksum
// (an older journal) or with one that does not match (a number edited by hand), a point
// outside the grid or another shard's point make resume refuse, naming the line.
func TestJournalThatIsNotThisSweep(t *testing.T) {
	for _, c := range []struct{ line, want string }{
		{`{"point":1,"row":[` + "\n", "journal.jsonl:1"},
		{`{"point":1,"row":["1"]}` + "\n", "no checksum"},
		{signedLine(t, 99, []string{}), "outside the grid"},
		{signedLine(t, 1, []string{"1"}), "1 fields"},
	} {
		s := testSweep(t, t.TempDir())
		interrupt(t, s, 3)
		path := filepath.Join(s.Dir, JournalFile)
		good, _ := os.ReadFile(path)
		os.WriteFile(path, append([]byte(c.line), good...), 0o644)
		s.Resume = true
		if _, err := s.Run(context.Background()); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("journal starting %q: %v, want %q", c.line, err, c.want)
		}
	}
	s := testSweep(t, t.TempDir())
	s.Shard = Shard{K: 2, N: 2}
	interrupt(t, s, 3)
	path := filepath.Join(s.Dir, JournalFile)
	good, _ := os.ReadFile(path)
	os.WriteFile(path, append([]byte(signedLine(t, 0, []string{})), good...), 0o644)
	s.Resume = true
	if _, err := s.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "not in shard 2/2") {
		t.Errorf("another shard's point: %v", err)
	}
}

// TestJournalEditedNumber: a digit changed inside a whole, well-formed journal line is caught
// by the line's checksum, on resume and on merge.
func TestJournalEditedNumber(t *testing.T) {
	t.Parallel()
	s := testSweep(t, t.TempDir())
	interrupt(t, s, 3)
	path := filepath.Join(s.Dir, JournalFile)
	b := readFile(t, path)
	first, rest, _ := bytes.Cut(b, []byte("\n"))
	var jl journalLine
	if err := json.Unmarshal(first, &jl); err != nil {
		t.Fatal(err)
	}
	k := len(s.Axes) + 1 // the first figure of merit
	if jl.Row[k] == "" {
		t.Fatalf("point %d has no value in column %d to edit: %v", jl.Point, k, jl.Row)
	}
	edited := bytes.Replace(first, []byte(`"`+jl.Row[k]+`"`), []byte(`"`+jl.Row[k]+`1"`), 1)
	if bytes.Equal(edited, first) {
		t.Fatal("edit did not change the line")
	}
	os.WriteFile(path, append(append(edited, '\n'), rest...), 0o644)
	s.Resume = true
	if _, err := s.Run(context.Background()); err == nil || !strings.Contains(err.Error(), "changed after it was written") {
		t.Errorf("resume over an edited line: %v", err)
	}
	if _, _, err := Merge([]string{s.Dir}); err == nil || !strings.Contains(err.Error(), "journal.jsonl:1: checksum") {
		t.Errorf("merge over an edited line: %v", err)
	}
}

// TestResumeRemovesLeftovers: a temporary results.csv left by a kill between write and
// rename is removed when the sweep resumes.
func TestResumeRemovesLeftovers(t *testing.T) {
	t.Parallel()
	s := testSweep(t, t.TempDir())
	interrupt(t, s, 3)
	left := filepath.Join(s.Dir, ".results.csv.tmp2718281828")
	if err := os.WriteFile(left, []byte("point,half a table"), 0o644); err != nil {
		t.Fatal(err)
	}
	s.Resume = true
	if _, err := s.Run(context.Background()); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(left); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("%s still there after resume: %v", left, err)
	}
}
