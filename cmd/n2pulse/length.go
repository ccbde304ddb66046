package main

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"os/signal"
	"path/filepath"
	"runtime"
	"syscall"
	"text/tabwriter"

	"n2pulse/internal/usermsg"
	"n2pulse/kinetics"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "length",
		summary: "scan the channel length: energy, peak power and FWHM, the useful length and c × gain duration",
		run:     runLength,
	})
}

func runLength(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("length", "[DESIGN] [--from L1] [--to L2] [--points N] [--travelling-wave V] [--out DIR]", stderr)
	from := fs.String("from", "5 cm", "shortest channel")
	to := fs.String("to", "1 m", "longest channel")
	points := fs.Int("points", 12, "number of lengths, evenly spaced (3 to 10000)")
	tw := fs.String("travelling-wave", "", `also scan with an excitation front at this speed: "c", "0.8c", "2e8 m/s" (design key optics.excitation_velocity)`)
	out := fs.String("out", "", "write length.csv and the figure length.png/.svg to this directory")
	sets := fs.StringArray("set", nil, `override a design key, e.g. --set gas.pressure="100 Torr" (repeatable)`)
	workers := fs.Int("workers", runtime.NumCPU(), "lengths computed at once")
	memLimit := fs.String("memory-limit", "", `largest memory all lengths computed at once may take, e.g. "8 GB" (default: half the machine's memory); each length gets its share`)
	asJSON := fs.Bool("json", false, "print the scan as JSON on stdout (SI units) instead of a table")
	scale := fs.Bool("scale-capacitors", true, "grow both capacitors in proportion to the channel length (Blumlein plates running along the channel); --scale-capacitors=false keeps the design's circuit at every length")
	samples := fs.Int("uncertainty", 0, fmt.Sprintf("also run every length over N samples of the uncertain constants (Latin hypercube, %d…%d; a constant given with --set or in the design file at a value other than its default is held): the 5–95 %% band of every figure and of the useful length, with the constants that drive them", study.MinSamples, study.MaxSamples))
	seed := fs.Uint64("seed", 1, "seed of the --uncertainty samples (the same seed gives the same scan on any machine and worker count)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if err := study.CheckSamples("--uncertainty", *samples); err != nil {
		return usageOf("length: ", err)
	}
	if *points < 3 || *points > 10000 {
		return usagef("length: --points %d: allowed 3 to 10000", *points)
	}
	if *workers < 1 {
		return usagef("length: --workers %d: want at least 1", *workers)
	}
	d, err := loadDesign(fs.Args(), *sets)
	if err != nil {
		return err
	}
	s := &study.LengthScan{Design: d, Points: *points, Workers: *workers, ScaleCapacitors: *scale, Samples: *samples, Seed: *seed}
	if s.Runner, err = sharedMemoryRunner("length", *memLimit, *workers); err != nil {
		return err
	}
	if s.From, err = units.Parse(*from, units.Length); err != nil {
		return usagef("length: --from %q: %v", *from, err)
	}
	if s.To, err = units.Parse(*to, units.Length); err != nil {
		return usagef("length: --to %q: %v", *to, err)
	}
	if !(s.From > 0 && s.From < s.To) {
		return usagef("length: --from %s --to %s: want 0 < from < to", *from, *to)
	}
	for _, l := range []struct{ flag, text string }{{"--from", *from}, {"--to", *to}} {
		if err := d.Clone().Set("channel.length", l.text); err != nil {
			return usagef("length: %s: %v", l.flag, err)
		}
	}
	if *tw != "" {
		probe := d.Clone()
		if err := probe.Set("optics.excitation_velocity", *tw); err != nil {
			return usagef("length: --travelling-wave: %v", err)
		}
		s.TravellingWave = probe.Optics.ExcitationVelocity
	}
	curves := 1
	if s.TravellingWave != 0 {
		curves = 2
	}
	if err := study.CheckSampledRuns("--uncertainty", *samples, curves**points); err != nil {
		return usageOf("length: ", err)
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	r, err := s.Run(ctx)
	if errors.Is(err, context.Canceled) {
		return errors.New("length: interrupted")
	}
	if err != nil {
		return err
	}
	if *asJSON {
		if err := printLengthJSON(stdout, r, *scale); err != nil {
			return err
		}
	} else if *scale {
		fmt.Fprintf(stdout, "capacitors scaled with the length: %s and %s per %s of channel\n",
			units.Format(d.Circuit.SwitchCapacitance, "F"), units.Format(d.Circuit.ChannelCapacitance, "F"), units.Format(d.Channel.Length, "m"))
	} else {
		fmt.Fprintln(stdout, "circuit as designed at every length")
	}
	if !*asJSON {
		printLength(stdout, r)
		if r.Samples > 0 {
			printLengthBands(stdout, r, *seed, study.HeldConstants(d))
		}
	}
	if *out == "" {
		return nil
	}
	if err := os.MkdirAll(*out, 0o755); err != nil {
		return fmt.Errorf("length: %w", err)
	}
	if err := r.Table().WriteCSV(filepath.Join(*out, "length.csv")); err != nil {
		return err
	}
	files, err := plots.LengthFigure(r, filepath.Join(*out, "length"))
	if err != nil {
		return err
	}
	fmt.Fprintf(stderr, "wrote %s, %s\n", filepath.Join(*out, "length.csv"), filepath.Base(files[0])+", "+filepath.Base(files[1]))
	return nil
}

// printLength writes the scan as a table in units of the trade, then the useful lengths.
func printLength(w io.Writer, r *study.LengthResult) {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	head := "length [cm]\t"
	for c := range r.Curves {
		pre := ""
		if c > 0 {
			pre = "tw "
		}
		head += pre + "energy [µJ]\t" + pre + "peak [kW]\t" + pre + "FWHM [ns]\t" + pre + "τ_g [ns]\t" + pre + "c·τ_g [cm]\t"
	}
	fmt.Fprintln(tw, head)
	for k := range r.Curves[0].Points {
		line := fmt.Sprintf("%.4g\t", 100*r.Curves[0].Points[k].Length)
		for _, cur := range r.Curves {
			p := cur.Points[k]
			if p.Err != nil {
				line += "failed\t\t\t\t\t"
				continue
			}
			s := p.Summary
			cut := ""
			if s.Truncated {
				cut = " (truncated)"
			}
			split := ""
			if s.Pulses >= 2 {
				split = fmt.Sprintf(" (%d pulses)", s.Pulses)
			}
			if s.FWHMIllConditioned {
				split += " (ill-conditioned)"
			}
			line += fmt.Sprintf("%.4g%s\t%.4g\t%.3g%s\t%.3g\t%.4g\t", 1e6*s.EnergyFront, cut, 1e-3*s.PeakPower, 1e9*s.FWHM, split,
				1e9*s.InversionDuration, 100*units.SpeedOfLight*s.InversionDuration)
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
	for _, cur := range r.Curves {
		name := "simultaneous excitation"
		if !math.IsInf(cur.Velocity, 1) {
			name = fmt.Sprintf("excitation front at %.3g c", cur.Velocity/units.SpeedOfLight)
		}
		if math.IsNaN(cur.Useful) {
			fmt.Fprintf(w, "\n%s: no useful length: %s; transit estimate c·τ_g = %.3g cm\n", name, cur.Rule, 100*cur.Transit)
			continue
		}
		fmt.Fprintf(w, "\n%s: useful length %.3g cm (%s); transit estimate c·τ_g = %.3g cm (useful/transit %.2f)\n",
			name, 100*cur.Useful, cur.Rule, 100*cur.Transit, cur.Useful/cur.Transit)
	}
	ill := 0
	for _, cur := range r.Curves {
		for _, p := range cur.Points {
			if p.Err == nil && p.Summary.FWHMIllConditioned {
				ill++
			}
		}
	}
	if ill > 0 {
		fmt.Fprintf(w, "(ill-conditioned) on %d FWHM cells: a maximum or a flat shoulder of the output lies near half its peak, so a small change can move that FWHM a long way (fwhm_45_s, fwhm_55_s in run --json)\n", ill)
	}
	for _, p := range r.Curves[0].Points {
		if p.Err != nil {
			fmt.Fprintf(w, "length %.4g cm failed: %s\n", 100*p.Length, usermsg.Strip(p.Err.Error()))
		} else if p.Summary.Truncated {
			fmt.Fprintf(w, "length %.4g cm truncated: the pulse was still going at %.4g ns, the longest a run may take; its numbers are cut short\n",
				100*p.Length, 1e9*p.Summary.EndTime)
		}
		if s := p.Summary; p.Err == nil && s.Pulses >= 2 {
			fmt.Fprintf(w, "length %.4g cm: %d separate pulses, the first two %.3g ns apart: its FWHM spans them (the strongest alone %.3g ns)\n",
				100*p.Length, s.Pulses, 1e9*s.PulseSeparation, 1e9*s.StrongestPulseFWHM)
		}
	}
}

// lengthJSON is one curve of `length --json`, in SI.
type lengthJSON struct {
	// ExcitationVelocity is the front speed [m/s]; null for a simultaneous discharge.
	ExcitationVelocity *float64 `json:"excitation_velocity_m_s"`
	UsefulLength       *float64 `json:"useful_length_m"` // null when there is none
	Rule               string   `json:"useful_length_rule"`
	TransitLength      *float64 `json:"transit_length_m"` // c·τ_g
	// UsefulP05 … UsefulP95 are the band of the useful length over the --uncertainty samples
	// (each sample's own curve), UsefulSamples the samples that have one; absent without.
	UsefulP05     *float64          `json:"useful_length_m_p05,omitempty"`
	UsefulP50     *float64          `json:"useful_length_m_p50,omitempty"`
	UsefulP95     *float64          `json:"useful_length_m_p95,omitempty"`
	UsefulSamples *int              `json:"useful_length_samples,omitempty"`
	UsefulBeyond  *int              `json:"useful_length_beyond_samples,omitempty"` // samples still rising at the longest length (their quantiles are null)
	Points        []lengthPointJSON `json:"points"`
}

type lengthPointJSON struct {
	Length  float64           `json:"length_m"`
	Summary *kinetics.Summary `json:"summary,omitempty"`
	Error   string            `json:"error,omitempty"`
	// Uncertainty is the point's band with --uncertainty (uncertaintyJSON, with "note": why
	// the band is flagged, "" when not).
	Uncertainty map[string]any `json:"uncertainty,omitempty"`
}

// finite returns a pointer to v, or nil for NaN and infinities (JSON has no such numbers).
func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// printLengthJSON writes the scan as JSON: whether the capacitors were scaled, and per curve
// its useful length, the rule that found it, the transit estimate and every point's summary.
func printLengthJSON(w io.Writer, r *study.LengthResult, scaled bool) error {
	out := struct {
		ScaleCapacitors bool         `json:"scale_capacitors"`
		Curves          []lengthJSON `json:"curves"`
	}{ScaleCapacitors: scaled}
	for _, c := range r.Curves {
		j := lengthJSON{ExcitationVelocity: finite(c.Velocity), UsefulLength: finite(c.Useful), Rule: c.Rule, TransitLength: finite(c.Transit)}
		if r.Samples > 0 {
			n, beyond := c.UsefulSamples, c.UsefulBeyond
			j.UsefulSamples, j.UsefulBeyond = &n, &beyond
			if b := c.UsefulBand; b != nil {
				j.UsefulP05, j.UsefulP50, j.UsefulP95 = finite(b.P05), finite(b.P50), finite(b.P95)
			}
		}
		for _, p := range c.Points {
			pj := lengthPointJSON{Length: p.Length}
			if r.Samples > 0 {
				pj.Uncertainty = uncertaintyJSON(p.Band)
				if pj.Uncertainty == nil {
					pj.Uncertainty = map[string]any{}
				}
				pj.Uncertainty["note"] = p.BandNote
			}
			if p.Err != nil {
				pj.Error = p.Err.Error()
			} else {
				s := p.Summary
				pj.Summary = &s
			}
			j.Points = append(j.Points, pj)
		}
		out.Curves = append(out.Curves, j)
	}
	b, err := json.MarshalIndent(out, "", "  ")
	if err != nil {
		return fmt.Errorf("length: %w", err)
	}
	fmt.Fprintln(w, string(b))
	return nil
}

// printLengthBands writes the band of each length (output-end energy and peak power) with the
// rows flagged, then each curve's useful-length band and the constants that drive the energy;
// held names the constants the design pins (held in every sample).
func printLengthBands(w io.Writer, r *study.LengthResult, seed uint64, held []string) {
	fmt.Fprintf(w, "\nuncertainty: %d samples of the uncertain constants at every length (Latin hypercube, seed %d)\n", r.Samples, seed)
	if len(held) > 0 {
		fmt.Fprintf(w, "  held at the design's values, not sampled: %s\n", heldText(held))
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	for c, cur := range r.Curves {
		pre := ""
		if c > 0 {
			pre = "tw "
		}
		fmt.Fprintf(tw, "%slength [cm]\tenergy 5 %% / median / 95 %% [µJ]\tpeak 5 %% / median / 95 %% [kW]\tnote\n", pre)
		for _, p := range cur.Points {
			e, pk := "–", "–"
			if p.Band != nil {
				if b, ok := p.Band.Metric("energy_front_J"); ok {
					e = fmt.Sprintf("%.4g / %.4g / %.4g", 1e6*b.P05, 1e6*b.P50, 1e6*b.P95)
				}
				if b, ok := p.Band.Metric("peak_power_W"); ok {
					pk = fmt.Sprintf("%.4g / %.4g / %.4g", 1e-3*b.P05, 1e-3*b.P50, 1e-3*b.P95)
				}
			}
			note := p.BandNote
			if p.Band != nil && p.Band.MayNotLase() {
				note = "MAY NOT LASE: " + note
			}
			fmt.Fprintf(tw, "%.4g\t%s\t%s\t%s\n", 100*p.Length, e, pk, note)
		}
	}
	tw.Flush()
	for _, cur := range r.Curves {
		name := "simultaneous excitation"
		if !math.IsInf(cur.Velocity, 1) {
			name = fmt.Sprintf("excitation front at %.3g c", cur.Velocity/units.SpeedOfLight)
		}
		if b := cur.UsefulBand; b != nil {
			long := 100 * cur.Points[len(cur.Points)-1].Length
			q := func(v float64) string {
				if math.IsInf(v, 1) {
					return fmt.Sprintf("beyond %.3g", long)
				}
				return fmt.Sprintf("%.3g", 100*v)
			}
			fmt.Fprintf(w, "%s: useful length 5 %% / median / 95 %%: %s / %s / %s cm (%d of %d samples; %d still rising at the longest length)\n",
				name, q(b.P05), q(b.P50), q(b.P95), cur.UsefulSamples, r.Samples, cur.UsefulBeyond)
		} else {
			fmt.Fprintf(w, "%s: no useful-length band (%d of %d samples have a useful length in the range)\n", name, cur.UsefulSamples, r.Samples)
		}
		var all []study.Driver
		for _, p := range cur.Points {
			if p.Band == nil {
				continue
			}
			if b, ok := p.Band.Metric("energy_front_J"); ok {
				all = append(all, b.Drivers...)
			}
		}
		fmt.Fprintf(w, "  output-end energy driven most by (median rank correlation over the lengths): %s\n", driverLine(rankDrivers(all)))
	}
}

// rankDrivers ranks constants listed several times (once per point) by the median of their
// rank correlations, largest magnitude first.
func rankDrivers(ds []study.Driver) []study.RankedDriver {
	t := &study.Table{Columns: []string{"x" + study.DriversSuffix}}
	for _, d := range ds {
		t.Rows = append(t.Rows, []string{fmt.Sprintf("%s:%g", d.Key, d.RankCorrelation)})
	}
	return t.Drivers("", "x")
}
