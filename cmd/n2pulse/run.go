package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"n2pulse/internal/atomicfile"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"n2pulse/internal/sysmem"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "run",
		summary: "simulate one shot of a design and print the pulse it makes",
		run:     runRun,
	})
}

// loadDesign reads the design named by args (or the built-in example) and applies --set.
func loadDesign(args []string, sets []string) (*design.Design, error) {
	var d *design.Design
	switch len(args) {
	case 0:
		d = design.ExampleDesign()
	case 1:
		text, name, err := designText(args[0])
		if err != nil {
			return nil, err
		}
		if d, err = design.ParseDesign(text, name); err != nil {
			return nil, err
		}
	default:
		return nil, usagef("takes at most one design file, got %d arguments", len(args))
	}
	keys := make([]string, 0, len(sets))
	for _, s := range sets {
		key, value, ok := strings.Cut(s, "=")
		if !ok {
			return nil, usagef("--set %q: want key=value, e.g. --set gas.pressure=\"40 Torr\"", s)
		}
		key = strings.TrimSpace(key)
		if err := d.Set(key, strings.TrimSpace(value)); err != nil {
			return nil, usageOf("--set: ", err)
		}
		keys = append(keys, key)
	}
	// The file was checked when read: what fails now comes from the --set values.
	if err := d.BalanceMixture(keys); err != nil {
		return nil, usageOf("--set: ", err)
	}
	if err := d.Validate(); err != nil {
		return nil, usageOf("--set: ", err)
	}
	return d, nil
}

// stdin is where `run -` (and the other commands given "-" for the design) read the design;
// tests replace it.
var stdin io.Reader = os.Stdin

// designText returns the text of the design named on the command line: a file, or "-" for
// standard input (at most design.MaxDesignBytes either way), and the name for messages.
func designText(arg string) ([]byte, string, error) {
	if arg == "-" {
		b, err := design.ReadText(stdin, "standard input")
		return b, "standard input", err
	}
	b, err := design.ReadFile(arg)
	return b, arg, err
}

func runRun(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("run", "[DESIGN] [--out DIR] [--json] [--set key=value …]", stderr)
	out := fs.String("out", "", "write waveforms.csv, summary.json, the figures and report.html (one self-contained page to send) to this directory")
	asJSON := fs.Bool("json", false, "print the summary (verdict, advice, warnings, energy account) and the design as JSON on stdout")
	sets := fs.StringArray("set", nil, "override a design key, e.g. --set gas.pressure=\"40 Torr\" (repeatable)")
	stats := fs.Bool("stats", false, "print solver statistics")
	memLimit := fs.String("memory-limit", "", `largest memory the run's arrays may take, e.g. "8 GB" (default: half the machine's memory)`)
	detector := fs.String("detector", "", `time constant of the detector for the FWHM, e.g. "300 ps" (default: an ideal detector)`)
	sensitivity := fs.Bool("sensitivity", false, "rank the design keys, and apart from them the uncertain physical constants, by d ln E / d ln x (re-runs the design twice per key)")
	samples := fs.Int("uncertainty", 0, "also run N samples of the uncertain constants (Latin hypercube) and print the 5–95 % band of the pulse energy, peak power and FWHM with the constants that drive them; a constant given with --set, or in the design file at a value other than its default, is held, not sampled")
	seed := fs.Uint64("seed", 1, "seed of the --uncertainty samples (the same seed gives the same samples on any machine and worker count)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if *samples != 0 && (*samples < 10 || *samples > study.MaxSamples) {
		return usagef("--uncertainty %d: want 10…%d samples", *samples, study.MaxSamples)
	}
	d, err := loadDesign(fs.Args(), *sets)
	if err != nil {
		return err
	}
	// Without --out nothing draws the waveforms or the gain map: the run keeps only what the
	// summary needs (the same summary, less memory to fill).
	// The nominal run is a single shot: its circuit and optics share the two cores
	// (RunSettings.Overlap). The --uncertainty samples run on the worker pool without it.
	rs := &kinetics.RunSettings{SummaryOnly: *out == "", Overlap: true}
	if *memLimit != "" {
		b, err := sysmem.ParseBytes(*memLimit)
		if err != nil {
			return usagef("--memory-limit: %v", err)
		}
		rs.MemoryLimit = b
	}
	if *detector != "" {
		tau, err := units.Parse(*detector, units.Time)
		if err != nil || !(tau > 0 && tau <= 1e-6) {
			return usagef("--detector %q: want a time between 0 and 1 µs, e.g. \"300 ps\"", *detector)
		}
		rs.DetectorResponse = tau
	}
	res, err := kinetics.Run(d, rs)
	if err != nil {
		return err
	}
	var unc *study.UncertaintyResult
	var env *study.Envelope
	if *samples > 0 {
		if unc, env, err = runUncertainty(d, res, *samples, *seed, rs.MemoryLimit, *out != ""); err != nil {
			return err
		}
	}
	if *asJSON {
		b, err := runJSON(d, res, unc)
		if err != nil {
			return err
		}
		fmt.Fprintln(stdout, string(b))
	} else {
		printSummary(stdout, d, res)
	}
	for _, w := range res.Warnings {
		fmt.Fprintln(stderr, "warning:", w)
	}
	if *stats {
		s := res.Stats
		fmt.Fprintf(stderr, "circuit: %v; optics: %d steps × %d cells; swarm lookups clamped: %d below, %d above\n",
			s.Circuit, s.OpticalSteps, s.Cells, s.TableBelow, s.TableAbove)
	}
	if *sensitivity {
		rows, err := study.Sensitivity(d, nil, 0.01)
		if err != nil {
			return err
		}
		fmt.Fprintln(stdout, "\nwhat to change (logarithmic sensitivity of the pulse energy and peak power):")
		PrintSensitivity(stdout, rows)
	}
	if unc != nil && !*asJSON {
		printUncertainty(stdout, unc)
	}
	if *out != "" {
		if err := writeRunOutputs(*out, d, res, unc, env); err != nil {
			return err
		}
		fmt.Fprintf(stderr, "wrote %s\n", *out)
	}
	return nil
}

// printSummary writes the readable summary and the caution line.
func printSummary(w io.Writer, d *design.Design, r *kinetics.Result) {
	s := r.Summary
	name := d.Name
	if name == "" {
		name = "design"
	}
	fmt.Fprintf(w, "%s\n", name)
	row := func(label, value string) { fmt.Fprintf(w, "  %-28s %s\n", label, value) }
	switch {
	case s.Truncated:
		row("TRUNCATED", fmt.Sprintf("the pulse was still going at %s after closure, the longest a run may take: energy and widths below are cut short",
			units.Format(s.EndTime, "s")))
	case s.EndTime > 1.5*d.Numerics.EndTime:
		row("simulated", fmt.Sprintf("to %s after closure (the pulse outlasted numerics.end_time = %s)",
			units.Format(s.EndTime, "s"), units.Format(d.Numerics.EndTime, "s")))
	}
	row("pulse energy, output end", units.Format(s.EnergyFront, "J"))
	row("pulse energy, rear end", units.Format(s.EnergyRear, "J"))
	row("peak power, output end", units.Format(s.PeakPower, "W"))
	if s.DetectorResponse > 0 {
		row("FWHM (half maximum)", fmt.Sprintf("%s as a detector of time constant %s shows it (%s with an ideal one)",
			units.Format(s.FWHM, "s"), units.Format(s.DetectorResponse, "s"), units.Format(s.HalfMaxWidth, "s")))
	} else {
		row("FWHM (half maximum)", units.Format(s.FWHM, "s"))
	}
	if s.Pulses >= 2 {
		row("SEPARATE PULSES", fmt.Sprintf("%d, the first two %s apart (the output falls below %.0f %% of its peak between them): the FWHM above spans them; the strongest pulse alone is %s wide",
			s.Pulses, units.Format(s.PulseSeparation, "s"), 100*kinetics.DipLevel, units.Format(s.StrongestPulseFWHM, "s")))
	} else if s.Pulses == 1 {
		row("separate pulses", "1")
	}
	if s.FWHMIllConditioned {
		why := "the output lies nearly flat near half the peak"
		if s.FWHMJump > kinetics.JumpLimit*s.FWHM {
			why = "an edge leaps by " + units.Format(s.FWHMJump, "s") + " within that band"
		}
		row("FWHM ILL-CONDITIONED", fmt.Sprintf("%s at %.0f %% of the peak, %s at %.0f %%; %s: a small change of the model can move the FWHM above a long way (the width from the rms duration is steadier)",
			units.Format(s.FWHMAt45, "s"), 100*(0.5-kinetics.HalfMaxBand), units.Format(s.FWHMAt55, "s"), 100*(0.5+kinetics.HalfMaxBand), why))
	} else if s.Pulses > 0 {
		row("width at 45 % / 55 % of peak", fmt.Sprintf("%s / %s (well-conditioned FWHM)", units.Format(s.FWHMAt45, "s"), units.Format(s.FWHMAt55, "s")))
	}
	if s.Pulses > 0 {
		row("energy inside the FWHM", fmt.Sprintf("%.0f %% of the output-end energy (76 %% for a Gaussian pulse; much less: a spike on a longer tail)", 100*s.HalfMaxEnergyShare))
	}
	row("width from the rms duration", units.Format(s.RMSWidth, "s"))
	row("rise 10–90 %", units.Format(s.Rise, "s"))
	row("delay from switch closure", units.Format(s.Delay, "s"))
	row("efficiency (fraction)", fmt.Sprintf("%.3g of %s stored (%.3g %%)", s.Efficiency, units.Format(s.StoredEnergy, "J"), 100*s.Efficiency))
	row("energy into the plasma", units.Format(s.DepositedEnergy, "J"))
	printAccount(row, s)
	row("peak E/N", fmt.Sprintf("%.0f Td", s.PeakReducedField))
	row("peak current", fmt.Sprintf("%s (%.3g kA/cm²)", units.Format(s.PeakCurrent, "A"), s.PeakCurrentDensity*1e-7))
	row("peak electron density", fmt.Sprintf("%.3g cm⁻³", s.PeakElectronDensity*1e-6))
	row("gas temperature, peak", gasTemperatureLine(s, d.Gas.Temperature))
	// Two different gains: the highest of the mid-channel cell, and the highest channel-mean
	// gain, whose gain-length ∫g dz is the one the verdict uses.
	row("peak gain (mid-channel cell)", fmt.Sprintf("%.3g cm⁻¹ (× channel length: %.3g)", s.PeakGain/100, s.PeakGain*d.Channel.Length))
	row("channel-mean gain, peak", fmt.Sprintf("%.3g cm⁻¹ (gain-length gL = ∫g dz: %.3g)", s.GainLength/d.Channel.Length/100, s.GainLength))
	row("inversion duration", units.Format(s.InversionDuration, "s"))
	row("self-termination", fmt.Sprintf("%s at %s", s.TerminationCause, units.Format(s.TerminationTime, "s")))
	row("discharge regime", regimeLine(s))
	row("verdict", s.Verdict)
	if s.Validity != "" {
		row("validity", s.Validity)
	}
	if s.Advice != "" {
		row("what to change", s.Advice)
	}
	row("energy / photon balance", fmt.Sprintf("%.1e / %.1e", s.EnergyBalanceResidual, s.PhotonBalanceResidual))
	p := r.Parameters
	row("σ, g_C/g_B, A₀₀, τ_C", fmt.Sprintf("%.3g cm², %.3g, %.3g s⁻¹, %s", p.CrossSection*1e4, p.DegeneracyRatio, p.EinsteinA00, units.Format(p.UpperLifetime, "s")))
	if len(s.Derived) > 0 {
		row("derived from [build]", strings.Join(s.Derived, ", "))
	}
	if len(s.Overridden) > 0 {
		row("taken from the design", strings.Join(s.Overridden, ", "))
	}
	if c := caution(s.StoredEnergy, s.EnergyTotal); c != "" {
		fmt.Fprintln(w, "\n"+c)
	}
}

// gasTemperatureLine gives the peak gas temperature of the discharge volume, its rise, and
// whether it went above the range of the gain table.
func gasTemperatureLine(s kinetics.Summary, t0 float64) string {
	line := fmt.Sprintf("%.0f K (+%.0f K from %.0f K) by the end of the run; %.0f K at the pulse peak", s.PeakGasTemperature, s.PeakGasTemperature-t0, t0, s.PulseGasTemperature)
	if s.GasTemperatureAbove {
		line += ", ABOVE the gain table's range: the gain is overstated"
	}
	return line
}

// regimeLine says where the shot sits against the limits of a uniform glow.
func regimeLine(s kinetics.Summary) string {
	var parts []string
	for _, c := range s.Regime {
		v, l := units.Format(c.Value, c.Unit), units.Format(c.Limit, c.Unit)
		switch c.Unit {
		case "m⁻³":
			v, l = fmt.Sprintf("%.3g cm⁻³", c.Value*1e-6), fmt.Sprintf("%.3g cm⁻³", c.Limit*1e-6)
		case "J":
			v, l = fmt.Sprintf("%.3g eV", c.Value/units.ElectronVolt), fmt.Sprintf("%.3g eV", c.Limit/units.ElectronVolt)
		case "":
			v, l = fmt.Sprintf("%.3g", c.Value), fmt.Sprintf("%.3g", c.Limit)
		}
		mark := ""
		if c.Outside {
			mark = " OUTSIDE"
		}
		parts = append(parts, fmt.Sprintf("%s %s (limit %s%s)", c.Name, v, l, mark))
	}
	head := "uniform glow: "
	if !s.UniformGlow {
		head = "NOT a uniform glow, the prediction is an upper bound: "
	}
	return head + strings.Join(parts, "; ")
}

// printAccount writes the loading and where the stored energy went, in per cent of the
// stored energy (plasma channels in per cent of the plasma's share).
func printAccount(row func(label, value string), s kinetics.Summary) {
	a := s.Energy
	row("specific loading", fmt.Sprintf("%.3g J/cm³, %.3g eV per molecule", s.SpecificEnergy*1e-6, s.EnergyPerMolecule))
	if a.Stored <= 0 {
		return
	}
	pc := func(x float64) string { return fmt.Sprintf("%.3g %%", 100*x/a.Stored) }
	parts := fmt.Sprintf("switch %s, plasma %s, left in the circuit %s", pc(a.Switch), pc(a.Plasma), pc(a.LeftInCircuit))
	if a.Shunt > 0 {
		parts += ", shunt " + pc(a.Shunt)
	}
	row("stored energy went to", parts)
	sp := a.PlasmaSplit
	if a.Plasma > 0 && sp != (kinetics.PlasmaSplit{}) {
		q := func(x float64) string { return fmt.Sprintf("%.2g %%", 100*x/a.Plasma) }
		row("plasma energy by channel", fmt.Sprintf("vibrational %s, elastic %s, A %s, B %s, W %s, B′ %s, C %s, other electronic %s, ionisation %s, attachment %s",
			q(sp.Vibrational), q(sp.Elastic), q(sp.StateA), q(sp.StateB), q(sp.StateW), q(sp.StateBPrime), q(sp.StateC),
			q(sp.OtherElectronic), q(sp.Ionisation), q(sp.Attachment)))
	}
	row("into C(0), out as light", fmt.Sprintf("%s (%s of stored), %s", units.Format(a.UpperLevel, "J"), pc(a.UpperLevel), units.Format(a.Laser, "J")))
}

// caution returns the safety line for a design whose stored or pulse energy is above harmless
// levels (0.1 J stored: common practice, no source; a 337 nm pulse of 1 µJ exceeds eye
// exposure limits, common practice, no source).
func caution(stored, pulse float64) string {
	var parts []string
	if stored > 0.1 {
		parts = append(parts, fmt.Sprintf("the capacitors store %s at high voltage, which can kill", units.Format(stored, "J")))
	}
	if pulse > 1e-6 {
		parts = append(parts, "the 337 nm pulse can injure eyes and skin")
	}
	if len(parts) == 0 {
		return ""
	}
	return "Caution: " + strings.Join(parts, "; ") + ". Follow local electrical codes and licensed laser-safety practice."
}

// writeRunOutputs writes waveforms.csv, summary.json and the figures into dir; with an
// uncertainty study u, summary.json carries its block, the pulse report shades the envelope
// env of the output power (when not nil) and report.html has a section on the bands.
func writeRunOutputs(dir string, d *design.Design, r *kinetics.Result, u *study.UncertaintyResult, env *study.Envelope) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	var csv bytes.Buffer
	bw := bufio.NewWriter(&csv)
	fmt.Fprintln(bw, "time_s,channel_voltage_V,current_A,reduced_field_Td,electron_density_m3,upper_level_m3,lower_level_m3,power_front_W,power_rear_W,mean_gain_per_m")
	for k := range r.Time {
		fmt.Fprintf(bw, "%.6e,%.6e,%.6e,%.6e,%.6e,%.6e,%.6e,%.6e,%.6e,%.6e\n", r.Time[k], r.ChannelVoltage[k], r.Current[k],
			r.ReducedField[k]/units.Townsend, r.ElectronDensity[k], r.UpperLevel[k], r.LowerLevel[k],
			r.PowerFront[k], r.PowerRear[k], r.MeanGain[k])
	}
	bw.Flush()
	if err := atomicfile.WriteFile(filepath.Join(dir, "waveforms.csv"), csv.Bytes()); err != nil {
		return err
	}
	js, err := runJSON(d, r, u)
	if err != nil {
		return err
	}
	if err := atomicfile.WriteFile(filepath.Join(dir, "summary.json"), append(js, '\n')); err != nil {
		return err
	}
	if err := writeRunFigures(dir, d, r, env); err != nil {
		return err
	}
	return writeRunReport(dir, d, r, u, env)
}

// runOutput is what `run --json` prints and summary.json holds: every field of the summary
// (figures of merit, verdict, advice, warnings, energy account) and the design that was run,
// each key with its value in SI (strings for choices, "infinite" for an infinite value).
type runOutput struct {
	kinetics.Summary
	Design map[string]any `json:"design"`
	// Uncertainty is present with --uncertainty: uncertaintyJSON.
	Uncertainty map[string]any `json:"uncertainty,omitempty"`
}

// runJSON writes the run's summary and design, and the uncertainty study u when not nil, as
// indented JSON.
func runJSON(d *design.Design, r *kinetics.Result, u *study.UncertaintyResult) ([]byte, error) {
	out := runOutput{Summary: r.Summary, Design: map[string]any{}, Uncertainty: uncertaintyJSON(u)}
	for _, line := range strings.Split(d.String(), "\n") {
		k, v, ok := strings.Cut(line, " = ")
		if !ok {
			continue
		}
		if strings.HasPrefix(v, `"`) {
			out.Design[k] = strings.Trim(v, `"`)
		} else if x, err := strconv.ParseFloat(v, 64); err == nil && !math.IsInf(x, 0) && !math.IsNaN(x) {
			out.Design[k] = x
		} else if math.IsInf(x, 1) {
			out.Design[k] = "infinite"
		} else {
			out.Design[k] = v
		}
	}
	b, err := json.MarshalIndent(out, "", "  ")
	if err != nil {
		return nil, fmt.Errorf("run: %w", err)
	}
	return b, nil
}
