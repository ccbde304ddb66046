package kinetics

import (
	"fmt"
	"math"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// Memory of a run. A shot keeps about perStepFloats float64 series of one value per optical
// step (the sampled discharge, the powers, the mid-channel populations and gain and their
// running integrals) and perCellFloats values per cell (populations, fluxes and scratch of
// the optics), plus, unless RunSettings.Light, a gain map of gainMapFloats columns per cell.
// The counts are those of the code with a margin (common practice, no source).
const (
	perStepFloats = 27 // 24 before the gas temperature and the medium's σ and g_C/g_B per step
	perCellFloats = 24
)

// DefaultMemoryLimit is the memory [bytes] a run may take for its arrays when
// RunSettings.MemoryLimit is 0: 2 GiB, a conservative bound for a library caller (common
// practice, no source). The command line sets it from the machine's memory.
var DefaultMemoryLimit int64 = 2 << 30

// MemoryError is returned by Run, before anything large is allocated, when a design's arrays
// would need more memory than the limit. It names the keys that drive the memory and what
// would fit.
type MemoryError struct {
	Need, Limit int64   // estimated and allowed memory [bytes]
	Length      float64 // channel.length [m]
	Cells       int     // numerics.cells
	EndTime     float64 // the end time asked for [s]
	FitEndTime  float64 // the longest numerics.end_time that fits at these cells and length [s]; 0 if none
	FitCells    int     // the most numerics.cells that fit at this end time and length; 0 if none
}

func (e *MemoryError) Error() string {
	fit := ""
	if e.FitEndTime > 0 {
		fit = fmt.Sprintf("; would fit: numerics.end_time up to %s", units.Format(e.FitEndTime, "s"))
	}
	if e.FitCells >= 4 { // the least numerics.cells allowed
		if fit == "" {
			fit = "; would fit:"
		} else {
			fit += ", or"
		}
		fit += fmt.Sprintf(" numerics.cells up to %d", e.FitCells)
	}
	return fmt.Sprintf("kinetics: the run needs about %s of memory, above the limit of %s (set with --memory-limit): channel.length = %s, numerics.cells = %d and numerics.end_time = %s make %.3g optical steps (end time × c × cells / length)%s; a longer channel also needs fewer steps",
		formatBytes(e.Need), formatBytes(e.Limit), units.Format(e.Length, "m"), e.Cells, units.Format(e.EndTime, "s"),
		e.EndTime*units.SpeedOfLight*float64(e.Cells)/e.Length, fit)
}

// formatBytes writes a memory size in the largest binary unit that keeps it above 1.
func formatBytes(b int64) string {
	x := float64(b)
	for _, u := range []string{"B", "KiB", "MiB", "GiB", "TiB"} {
		if x < 1024 || u == "TiB" {
			return fmt.Sprintf("%.3g %s", x, u)
		}
		x /= 1024
	}
	return ""
}

// perCell is the number of floats a run keeps per cell: the optics' and, unless light, the
// gain map's columns.
func perCell(s *RunSettings) float64 {
	per := float64(perCellFloats)
	if !s.Light {
		per += float64(gainMapColumns(s))
	}
	return per
}

// gainMapColumns is the number of time columns of the gain map (default 300).
func gainMapColumns(s *RunSettings) int {
	if s.GainMapColumns > 0 {
		return s.GainMapColumns
	}
	return 300
}

// memoryLimit is the run's memory limit [bytes].
func memoryLimit(s *RunSettings) int64 {
	if s.MemoryLimit > 0 {
		return s.MemoryLimit
	}
	return DefaultMemoryLimit
}

// runBytes estimates the memory [bytes] of a shot of steps optical steps over cells cells.
func runBytes(steps, cells float64, s *RunSettings) float64 {
	return 8 * (perStepFloats*steps + perCell(s)*cells)
}

// MemoryEstimate is the memory [bytes] a run of d to its numerics.end_time needs for its
// arrays (a run that follows its pulse past the end time needs more; Run checks each
// extension against the limit).
func MemoryEstimate(d *design.Design, s *RunSettings) int64 {
	if s == nil {
		s = &RunSettings{}
	}
	n := float64(d.Numerics.Cells)
	steps := math.Ceil(d.Numerics.EndTime * units.SpeedOfLight * n / d.Channel.Length)
	return int64(math.Min(runBytes(steps, n, s), math.MaxInt64/2))
}

// memoryError builds the error for a run of d to end that needs more than limit.
func memoryError(d *design.Design, end float64, s *RunSettings) *MemoryError {
	n := float64(d.Numerics.Cells)
	l := d.Channel.Length
	limit := memoryLimit(s)
	steps := math.Ceil(end * units.SpeedOfLight * n / l)
	e := &MemoryError{Need: int64(math.Min(runBytes(steps, n, s), math.MaxInt64/2)), Limit: limit,
		Length: l, Cells: d.Numerics.Cells, EndTime: end}
	per := perCell(s)
	floats := float64(limit) / 8
	if left := floats - per*n; left > 0 {
		// Whole steps, one fewer than fit: Run rounds the step count up.
		e.FitEndTime = (math.Floor(left/perStepFloats) - 1) * l / (units.SpeedOfLight * n)
	}
	e.FitCells = int(floats / (perStepFloats*end*units.SpeedOfLight/l + per))
	return e
}
