package study

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/interp"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// LengthScan runs one design over channel lengths, as given and, optionally, with a
// travelling excitation front.
type LengthScan struct {
	Design   *design.Design // base design; not modified
	From, To float64        // shortest and longest channel [m]
	Points   int            // number of lengths, at least 3
	// TravellingWave, when non-zero, adds a second curve with optics.excitation_velocity set to
	// it [m/s] (units.SpeedOfLight for a front at light speed).
	TravellingWave float64
	// ScaleCapacitors grows both circuit capacitors in proportion to the channel length, as
	// for a Blumlein whose plates run along the channel: the stored energy per unit length
	// stays that of the design. Without it the circuit is the design's at every length.
	ScaleCapacitors bool
	Runner          Runner // nil means ModelRunner
	Workers         int    // ≤ 0 means runtime.NumCPU()
	// Samples, when not 0, runs every length also over this many samples of the uncertain
	// constants (a Latin hypercube of Seed, the same constants at every length), for the band
	// of each figure and of the useful length.
	Samples int
	Seed    uint64
}

// LengthPoint is one channel length of a curve.
type LengthPoint struct {
	Length  float64 // [m]
	Summary kinetics.Summary
	Err     error // the run failed; Summary is zero
	// Band is the point's uncertainty band (with LengthScan.Samples); nil without, or when
	// the point has none (BandNote says why).
	Band *UncertaintyResult
	// BandNote says why the point's band is flagged (may not lase, failed or truncated
	// samples, no band); "" when it is not.
	BandNote string
	// sampleEnergy and sampleTau are each sample's output-end energy [J] and inversion
	// duration [s], NaN where the sample failed.
	sampleEnergy, sampleTau []float64
}

// LengthCurve is a length scan at one excitation velocity, with its useful length.
type LengthCurve struct {
	Velocity float64 // excitation velocity [m/s]; +Inf for a simultaneous discharge
	Points   []LengthPoint
	Useful   float64 // useful length [m]; NaN when the energy has no plateau in the range
	Rule     string  // how Useful was found, in words
	// Transit is the transit-time estimate c·τ_g [m], τ_g the inversion duration at the useful
	// length (at the longest length when there is no useful length).
	Transit float64
	// UsefulBand is the band of the useful length over the samples (with LengthScan.Samples):
	// each sample's own energy curve gives its useful length, +Inf for a sample whose energy
	// still rises at the longest length (its useful length lies beyond the range), so a
	// quantile among those is +Inf; nil when fewer than three samples count. UsefulSamples
	// counts the samples in the band, UsefulBeyond those beyond the range.
	UsefulBand    *Band
	UsefulSamples int
	UsefulBeyond  int
}

// LengthResult holds the curve of the design as given and, with a travelling wave, a second.
type LengthResult struct {
	Curves []LengthCurve
	// Samples is LengthScan.Samples (0: no bands).
	Samples int
}

// Lengths returns the scan's channel lengths, evenly spaced.
func (s *LengthScan) Lengths() []float64 {
	return Axis{Key: "channel.length", From: s.From, To: s.To, N: s.Points}.Values()
}

func (s *LengthScan) check() error {
	if s.Design == nil {
		return errors.New("study: length scan has no design")
	}
	if s.Points < 3 || s.Points > 10000 {
		return fmt.Errorf("study: length scan: --points %d: allowed 3 to 10000", s.Points)
	}
	if !(s.From > 0) || !(s.To > s.From) {
		return fmt.Errorf("study: length scan: --from %g m, --to %g m: want 0 < from < to", s.From, s.To)
	}
	for _, l := range []float64{s.From, s.To} {
		if err := s.Design.Clone().Set("channel.length", siText("channel.length", l)); err != nil {
			return fmt.Errorf("study: length scan: %w", err)
		}
	}
	if s.TravellingWave != 0 {
		if err := s.Design.Clone().Set("optics.excitation_velocity", siText("optics.excitation_velocity", s.TravellingWave)); err != nil {
			return fmt.Errorf("study: length scan: --travelling-wave: %w", err)
		}
	}
	if err := CheckSamples("--uncertainty", s.Samples); err != nil {
		return err
	}
	curves := 1
	if s.TravellingWave != 0 {
		curves = 2
	}
	return CheckSampledRuns("--uncertainty", s.Samples, curves*s.Points)
}

// Run computes the curves. A length whose run fails keeps its error in its LengthPoint.
func (s *LengthScan) Run(ctx context.Context) (*LengthResult, error) {
	if err := s.check(); err != nil {
		return nil, err
	}
	run := s.Runner
	if run == nil {
		run = ModelRunner
	}
	lengths := s.Lengths()
	velocities := []float64{s.Design.Optics.ExcitationVelocity}
	if s.TravellingWave != 0 {
		velocities = append(velocities, s.TravellingWave)
	}
	res := &LengthResult{Curves: make([]LengthCurve, len(velocities)), Samples: s.Samples}
	idx := make([]int, len(lengths)*len(velocities))
	for c, v := range velocities {
		res.Curves[c] = LengthCurve{Velocity: v, Points: make([]LengthPoint, len(lengths))}
		for k, l := range lengths {
			idx[c*len(lengths)+k] = c*len(lengths) + k
			res.Curves[c].Points[k].Length = l
		}
	}
	designAt := func(i int) (*design.Design, error) {
		d := s.Design.Clone()
		d.Channel.Length = lengths[i%len(lengths)]
		d.Optics.ExcitationVelocity = velocities[i/len(lengths)]
		if s.ScaleCapacitors {
			f := d.Channel.Length / s.Design.Channel.Length
			d.Circuit.SwitchCapacitance *= f
			d.Circuit.ChannelCapacitance *= f
		}
		return d, d.Validate()
	}
	var err error
	if s.Samples > 0 {
		hold := []string{"channel.length", "optics.excitation_velocity"}
		err = sampledEvaluate(ctx, idx, s.Samples, s.Seed, hold, s.Workers, designAt, run, func(sp sampledPoint) error {
			o := sp.nominal
			p := &res.Curves[o.i/len(lengths)].Points[o.i%len(lengths)]
			p.Summary, p.Err = o.sum, o.err
			p.Band, p.BandNote = sp.band, bandNote(sp)
			p.sampleEnergy, p.sampleTau = sampleColumn(sp.figs, "energy_front_J"), sampleColumn(sp.figs, "inversion_duration_s")
			return nil
		})
	} else {
		err = evaluate(ctx, idx, s.Workers, designAt, run, func(o outcome) error {
			p := &res.Curves[o.i/len(lengths)].Points[o.i%len(lengths)]
			p.Summary, p.Err = o.sum, o.err
			return nil
		})
	}
	if err != nil {
		return nil, err
	}
	for c := range res.Curves {
		res.Curves[c].mark()
		if s.Samples > 0 {
			res.Curves[c].markBand(s.Samples)
		}
	}
	return res, nil
}

// sampleColumn returns one numeric figure of merit of every sample, NaN where the sample failed
// or leaves it undefined.
func sampleColumn(figs []sampleFigures, metric string) []float64 {
	m := slices.Index(NumericMetrics(), metric)
	out := make([]float64, len(figs))
	for i, f := range figs {
		out[i] = math.NaN()
		if f.ok && m >= 0 {
			out[i] = f.vals[m]
		}
	}
	return out
}

// markBand finds the useful length of each of the n samples from its own energy curve (the
// lengths where the sample ran) and the band of those lengths.
func (c *LengthCurve) markBand(n int) {
	var useful []float64
	for k := range n {
		var L, E []float64
		for _, p := range c.Points {
			if p.sampleEnergy != nil && !math.IsNaN(p.sampleEnergy[k]) {
				L, E = append(L, p.Length), append(E, p.sampleEnergy[k])
			}
		}
		u, _ := UsefulLength(L, E)
		switch {
		case !math.IsNaN(u):
			useful = append(useful, u)
		case len(E) >= 3 && floats.MaxIdx(E) == len(E)-1 && E[len(E)-1] > 0:
			// still rising at the longest length: the useful length lies beyond the range
			useful = append(useful, math.Inf(1))
			c.UsefulBeyond++
		}
	}
	c.UsefulSamples = len(useful)
	if len(useful) >= 3 {
		if b, err := BandOf(useful); err == nil {
			c.UsefulBand = &b
		}
	}
}

// mark finds the useful length and the transit estimate of a curve from its output-end energy.
func (c *LengthCurve) mark() {
	var L, E, tau []float64
	cut := 0
	for _, p := range c.Points {
		if p.Err == nil {
			L, E, tau = append(L, p.Length), append(E, p.Summary.EnergyFront), append(tau, p.Summary.InversionDuration)
			if p.Summary.Truncated {
				cut++
			}
		}
	}
	c.Useful, c.Rule = UsefulLength(L, E)
	if cut > 0 {
		c.Rule += fmt.Sprintf("; %d of %d lengths truncated (their energies cut short), so the useful length is uncertain", cut, len(L))
	}
	c.Transit = math.NaN()
	if len(L) == 0 {
		return
	}
	at := L[len(L)-1]
	if !math.IsNaN(c.Useful) {
		at = c.Useful
	}
	c.Transit = units.SpeedOfLight * interpolate(L, tau, at)
}

// Criteria of UsefulLength.
const (
	usefulFraction = 0.9 // the useful length reaches this share of the largest energy
	plateauGrowth  = 0.1 // the last quarter of the range adds less than this share: a plateau
)

// UsefulLengthRule says in words how UsefulLength finds the useful length; the same rule holds
// for every curve, whether its energy levels off or falls again after a maximum.
const UsefulLengthRule = "shortest length reaching 90 % of the largest output-end energy of the scan"

// UsefulLength returns the useful channel length of an energy curve E(L) (L increasing): the
// shortest length at which E reaches 90 % of its largest value in the scan, interpolated
// linearly; a longer channel adds less than a tenth. The same rule applies whether E levels
// off or falls after a maximum. It returns NaN when E is largest at the longest length and
// still rising there (the last quarter of the range adds more than 10 %), and says why.
func UsefulLength(L, E []float64) (float64, string) {
	n := len(L)
	if n < 3 {
		return math.NaN(), "fewer than three computed lengths"
	}
	imax := floats.MaxIdx(E)
	top := E[imax]
	if !(top > 0) {
		return math.NaN(), "no output energy"
	}
	quarter := interpolate(L, E, L[n-1]-0.25*(L[n-1]-L[0]))
	if imax == n-1 && E[n-1]-quarter > plateauGrowth*E[n-1] {
		return math.NaN(), "energy still rising at the longest length: no plateau in the range"
	}
	want := usefulFraction * top
	if E[0] >= want {
		return L[0], "90 % of the largest energy already at the shortest length"
	}
	for i := 1; i < n; i++ {
		if E[i] >= want {
			f := (want - E[i-1]) / (E[i] - E[i-1])
			return L[i-1] + f*(L[i]-L[i-1]), UsefulLengthRule
		}
	}
	return L[imax], UsefulLengthRule
}

// interpolate evaluates the piecewise-linear function through (x, y) at t, held at the end
// values outside, by gonum's interp.PiecewiseLinear; a single point is a constant, and x that
// is not strictly increasing (which that type refuses with a panic) gives NaN.
func interpolate(x, y []float64, t float64) float64 {
	if len(x) == 1 {
		return y[0]
	}
	for i := 1; i < len(x); i++ {
		if !(x[i] > x[i-1]) {
			return math.NaN()
		}
	}
	var pl interp.PiecewiseLinear
	if err := pl.Fit(x, y); err != nil {
		return math.NaN()
	}
	return pl.Predict(t)
}

// finiteCell writes a number, or an empty cell for NaN and infinities.
func finiteCell(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ""
	}
	return formatNumber(v)
}

// lengthMetrics are the figures of merit a length table lists per curve.
var lengthMetrics = []string{"energy_front_J", "energy_total_J", "peak_power_W", "fwhm_s", "inversion_duration_s"}

// Table returns the scan as a table: the length, then for each curve its energies, peak power,
// FWHM, inversion duration, number of separate pulses ("pulses": above 1 the FWHM spans them
// all), whether the FWHM is ill-conditioned ("fwhm_ill_conditioned"), transit estimate c·τ_g ("transit_length_m"), the curve's useful
// length (the same on every row, empty when there is none) and status; columns of the
// travelling-wave curve carry the prefix "tw.". With samples, each curve adds the band of its
// useful length (an empty cell for a quantile beyond the longest length), useful_length_beyond
// (samples still rising at the longest length) and the band columns of its figures.
func (r *LengthResult) Table() *Table {
	t := &Table{Columns: []string{"channel.length [m]"}}
	for c := range r.Curves {
		pre := ""
		if c > 0 {
			pre = "tw."
		}
		for _, m := range lengthMetrics {
			t.Columns = append(t.Columns, pre+m)
		}
		t.Columns = append(t.Columns, pre+"pulses", pre+"fwhm_ill_conditioned", pre+"transit_length_m", pre+"useful_length_m")
		if r.Samples > 0 {
			t.Columns = append(t.Columns, pre+"useful_length_m_p05", pre+"useful_length_m_p50", pre+"useful_length_m_p95", pre+"useful_length_beyond")
			t.Columns = append(t.Columns, bandColumns(pre, lengthMetrics)...)
		}
		t.Columns = append(t.Columns, pre+StatusColumn)
	}
	all := Metrics()
	listed := append(slices.Clip(lengthMetrics), "pulses", "fwhm_ill_conditioned")
	pos := make([]int, len(listed))
	for k, m := range listed {
		for j, a := range all {
			if a == m {
				pos[k] = j
			}
		}
	}
	for k := range r.Curves[0].Points {
		row := []string{formatNumber(r.Curves[0].Points[k].Length)}
		for _, c := range r.Curves {
			p := c.Points[k]
			useful := ""
			if !math.IsNaN(c.Useful) {
				useful = formatNumber(c.Useful)
			}
			if p.Err != nil {
				row = append(row, make([]string, len(listed)+1)...)
				row = append(row, useful)
			} else {
				f := summaryFields(p.Summary)
				for _, j := range pos {
					row = append(row, f[j])
				}
				row = append(row, formatNumber(units.SpeedOfLight*p.Summary.InversionDuration), useful)
			}
			if r.Samples > 0 {
				if b := c.UsefulBand; b != nil {
					row = append(row, finiteCell(b.P05), finiteCell(b.P50), finiteCell(b.P95))
				} else {
					row = append(row, "", "", "")
				}
				row = append(row, strconv.Itoa(c.UsefulBeyond))
				row = append(row, bandCells(sampledPoint{band: p.Band}, lengthMetrics, p.BandNote)...)
			}
			row = append(row, statusOf(p.Summary, p.Err))
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}
