package study

import (
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"slices"

	"n2pulse/internal/atomicfile"
	"n2pulse/kinetics/design"
)

// File names inside a sweep directory.
const (
	ManifestFile = "sweep.json"    // the sweep's grid, design and shard
	JournalFile  = "journal.jsonl" // one line per finished point, appended as points finish
	ResultsFile  = "results.csv"   // the table in point order, written when the sweep ends
)

// maxPoints bounds the size of one sweep.
const maxPoints = 10_000_000

// Sweep is a grid of designs: Design with each Axes key set to every combination of its
// values. Run computes it (or its Shard) into Dir.
type Sweep struct {
	Design   *design.Design // base design; not modified
	Axes     []Axis         // at least one
	Runner   Runner         // nil means the full model, ModelRunner
	Workers  int            // ≤ 0 means runtime.NumCPU()
	Shard    Shard          // zero means every point
	Dir      string         // directory of the journal, manifest and results
	Resume   bool           // finish a sweep already started in Dir
	Progress io.Writer      // progress line (for a terminal); nil means silent
	// Samples, when not 0, runs every point also over this many samples of the uncertain
	// constants (a Latin hypercube of Seed; the varied keys keep their grid values) and adds
	// the band columns (bandColumns) to the table.
	Samples int
	Seed    uint64
}

// Points returns the number of grid points (of the whole sweep, not the shard).
func (s *Sweep) Points() int {
	n := 1
	for _, a := range s.Axes {
		n *= a.N
	}
	return n
}

// Columns returns the header of the sweep's results table.
func (s *Sweep) Columns() []string {
	cols := []string{PointColumn}
	for _, a := range s.Axes {
		cols = append(cols, a.Header())
	}
	cols = append(cols, Metrics()...)
	if s.Samples > 0 {
		cols = append(cols, bandColumns("", NumericMetrics())...)
	}
	return append(cols, StatusColumn)
}

// Indices returns the grid index along each axis of point i (the last axis varies fastest).
func (s *Sweep) Indices(i int) []int {
	idx := make([]int, len(s.Axes))
	for k := len(s.Axes) - 1; k >= 0; k-- {
		idx[k] = i % s.Axes[k].N
		i /= s.Axes[k].N
	}
	return idx
}

// Values returns the varied values [SI] of point i, in axis order.
func (s *Sweep) Values(i int) []float64 {
	idx := s.Indices(i)
	v := make([]float64, len(idx))
	for k, a := range s.Axes {
		v[k] = a.Values()[idx[k]]
	}
	return v
}

// PointDesign returns the design of point i.
func (s *Sweep) PointDesign(i int) (*design.Design, error) {
	d := s.Design.Clone()
	keys := make([]string, len(s.Axes))
	for k, v := range s.Values(i) {
		keys[k] = s.Axes[k].Key
		if err := d.Set(keys[k], siText(keys[k], v)); err != nil {
			return nil, fmt.Errorf("study: point %d: %w", i, err)
		}
	}
	if err := d.BalanceMixture(keys); err != nil {
		return nil, fmt.Errorf("study: point %d: %w", i, err)
	}
	if err := d.Validate(); err != nil {
		return nil, fmt.Errorf("study: point %d: %w", i, err)
	}
	return d, nil
}

// row builds the table row of a finished point.
func (s *Sweep) row(o outcome) []string {
	r := []string{fmt.Sprint(o.i)}
	for _, v := range s.Values(o.i) {
		r = append(r, formatNumber(v))
	}
	if o.err == nil {
		r = append(r, summaryFields(o.sum)...)
	} else {
		r = append(r, make([]string, len(Metrics()))...)
	}
	return append(r, statusOf(o.sum, o.err))
}

// bandRow builds the table row of a finished point with its band: row with the band cells
// before the status.
func (s *Sweep) bandRow(p sampledPoint) []string {
	r := s.row(p.nominal)
	status := r[len(r)-1]
	return append(append(r[:len(r)-1], bandCells(p, NumericMetrics(), bandNote(p))...), status)
}

// axisKeys returns the varied keys, which uncertainty samples leave at their grid values.
func (s *Sweep) axisKeys() []string {
	keys := make([]string, len(s.Axes))
	for k, a := range s.Axes {
		keys[k] = a.Key
	}
	return keys
}

// DesignHash is the SHA-256 of the design's full key listing (design.Design.String), the
// fingerprint by which shards and resumed sweeps are matched.
func DesignHash(d *design.Design) string {
	h := sha256.Sum256([]byte(d.String()))
	return hex.EncodeToString(h[:])
}

// Check reports a sweep that is specified wrongly (no design or axes, an axis that cannot make
// a grid, a key varied twice, too many points, a bad shard, no directory); Run calls it first.
func (s *Sweep) Check() error {
	if s.Design == nil {
		return errors.New("study: sweep has no design")
	}
	if len(s.Axes) == 0 {
		return errors.New("study: sweep needs at least one varied key (--vary KEY=FROM:TO:N)")
	}
	n := 1
	seen := map[string]bool{}
	for _, a := range s.Axes {
		if err := a.Check(); err != nil {
			return fmt.Errorf("study: %w", err)
		}
		if seen[a.Key] {
			return fmt.Errorf("study: %s is varied twice", a.Key)
		}
		seen[a.Key] = true
		n *= a.N
		if n > maxPoints {
			return fmt.Errorf("study: the grid has more than %d points", maxPoints)
		}
	}
	if !s.Shard.Whole() && (s.Shard.K < 1 || s.Shard.K > s.Shard.N) {
		return fmt.Errorf("study: shard %d/%d: want 1 ≤ K ≤ N", s.Shard.K, s.Shard.N)
	}
	if err := CheckSamples("--uncertainty", s.Samples); err != nil {
		return err
	}
	owned := n
	if !s.Shard.Whole() {
		owned = (n + s.Shard.N - 1) / s.Shard.N
	}
	if err := CheckSampledRuns("--uncertainty", s.Samples, owned); err != nil {
		return err
	}
	if s.Dir == "" {
		return errors.New("study: sweep has no output directory")
	}
	return nil
}

// Run computes the points of the sweep's shard that Dir does not yet hold, journaling each as
// it finishes, then writes results.csv (the shard's rows in point order) and returns that table.
// A point whose design or run fails becomes a row with status "failed: …"; it does not stop the
// sweep. Cancelling ctx stops starting points and returns ctx.Err() after the points in flight
// are journaled; Run with Resume then finishes the job.
func (s *Sweep) Run(ctx context.Context) (*Table, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	run := s.Runner
	if run == nil {
		run = ModelRunner
	}
	m := s.manifest()
	if err := os.MkdirAll(s.Dir, 0o755); err != nil {
		return nil, fmt.Errorf("study: %w", err)
	}
	if err := s.prepare(m); err != nil {
		return nil, err
	}
	// A kill between the write and the rename of results.csv or sweep.json leaves a
	// temporary file; the next run or resume removes it.
	if _, err := atomicfile.RemoveLeftovers(s.Dir); err != nil {
		return nil, fmt.Errorf("study: %w", err)
	}
	j, err := openJournal(filepath.Join(s.Dir, JournalFile), m)
	if err != nil {
		return nil, err
	}
	defer j.close()

	var todo []int
	for i := range m.Points {
		if _, done := j.rows[i]; !done && m.Shard.Owns(i) {
			todo = append(todo, i)
		}
	}
	prog := newProgress(s.Progress, len(todo))
	if s.Samples > 0 {
		err = sampledEvaluate(ctx, todo, s.Samples, s.Seed, s.axisKeys(), s.Workers, s.PointDesign, run, func(p sampledPoint) error {
			if err := j.append(p.nominal.i, s.bandRow(p)); err != nil {
				return err
			}
			prog.step()
			return nil
		})
	} else {
		err = evaluate(ctx, todo, s.Workers, s.PointDesign, run, func(o outcome) error {
			if err := j.append(o.i, s.row(o)); err != nil {
				return err
			}
			prog.step()
			return nil
		})
	}
	prog.finish()
	if err != nil {
		return nil, err
	}
	t := j.table(m)
	if err := t.WriteCSV(filepath.Join(s.Dir, ResultsFile)); err != nil {
		return nil, err
	}
	return t, nil
}

// prepare writes the manifest of a new sweep, or checks that Dir holds this same sweep.
func (s *Sweep) prepare(m *Manifest) error {
	path := filepath.Join(s.Dir, ManifestFile)
	old, err := ReadManifest(s.Dir)
	switch {
	case errors.Is(err, os.ErrNotExist):
		if _, jerr := os.Stat(filepath.Join(s.Dir, JournalFile)); jerr == nil {
			return fmt.Errorf("study: %s holds a journal but no %s; refusing to mix sweeps", s.Dir, ManifestFile)
		}
		return m.Write(path)
	case err != nil:
		return err
	case !s.Resume:
		return fmt.Errorf("study: %s already holds a sweep (%s); pass --resume to finish it, or choose another directory", s.Dir, ManifestFile)
	}
	if diff := old.Differs(m); diff != "" {
		return fmt.Errorf("study: cannot resume in %s: it holds a different sweep (%s)", s.Dir, diff)
	}
	if old.Shard != m.Shard {
		return fmt.Errorf("study: cannot resume in %s: it holds shard %s, this is shard %s", s.Dir, old.Shard, m.Shard)
	}
	return nil
}

// table assembles the journaled rows in point order.
func (j *journal) table(m *Manifest) *Table {
	idx := make([]int, 0, len(j.rows))
	for i := range j.rows {
		idx = append(idx, i)
	}
	slices.Sort(idx)
	t := &Table{Columns: m.Columns}
	for _, i := range idx {
		t.Rows = append(t.Rows, j.rows[i])
	}
	return t
}
