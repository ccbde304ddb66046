package main

import (
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"n2pulse/data"
	"n2pulse/kinetics"
	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "bench",
		summary: "derive circuit values from the laser as built and rate its stresses: dielectric, channel, shunt, switch",
		run:     runBench,
	})
}

func runBench(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("bench", "[DESIGN] [--json] [--set key=value …]", stderr)
	asJSON := fs.Bool("json", false, "print the bench report as JSON on stdout")
	sets := fs.StringArray("set", nil, "override a design key after reading, e.g. --set circuit.charge_voltage=\"16 kV\" (repeatable)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	var text []byte
	name := "example.toml"
	switch fs.NArg() {
	case 0:
		text = data.ExampleDesign()
	case 1:
		var err error
		if text, name, err = designText(fs.Arg(0)); err != nil {
			return err
		}
	default:
		return usagef("bench: takes at most one design file, got %d arguments", fs.NArg())
	}
	b, err := design.ParseBuiltDesign(text, name)
	if err != nil {
		return err
	}
	if len(*sets) > 0 {
		for _, s := range *sets {
			key, value, ok := strings.Cut(s, "=")
			if !ok {
				return usagef("--set %q: want key=value, e.g. --set gas.pressure=\"40 Torr\"", s)
			}
			if err := b.Design.Set(strings.TrimSpace(key), strings.TrimSpace(value)); err != nil {
				return usageOf("--set: ", err)
			}
		}
		if err := b.Design.Validate(); err != nil {
			return usageOf("--set: ", err)
		}
		// Set has re-derived the circuit from the build; rate the design as it now stands.
		if _, err = b.Design.ApplyBuild(&b.Design.Build); err != nil {
			return err
		}
		b.Spec, b.Derived = b.Design.Build, b.Design.Derived
	}
	bench, err := kinetics.Bench(b.Design, b.Design.Build)
	if err != nil {
		return err
	}
	if *asJSON {
		out := struct {
			Design  string       `json:"design"`
			Derived []string     `json:"derived"`
			Bench   *build.Bench `json:"bench"`
		}{b.Design.Name, b.Derived, bench}
		j, err := json.MarshalIndent(out, "", "  ")
		if err != nil {
			return err
		}
		fmt.Fprintln(stdout, string(j))
		return nil
	}
	printBench(stdout, name, b, bench)
	return nil
}

// printBench writes the bench report as readable tables.
func printBench(w io.Writer, name string, b *design.Built, r *build.Bench) {
	d := b.Design
	fmt.Fprintf(w, "bench: %s (%s)\n\n", d.Name, name)
	derived := map[string]bool{}
	for _, k := range b.Derived {
		derived[k] = true
	}
	from := func(key, how string) string {
		if derived[key] {
			return "derived: " + how
		}
		return "design"
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	first, second := "C₁ switch side", "C₂ channel side"
	if d.Circuit.Topology == design.ChargeTransfer {
		first, second = "C_s storage", "C_p peaking"
	}
	plates := func(l *build.Line) string {
		if l == nil {
			return ""
		}
		return fmt.Sprintf("%s × %s plates, %s of %s, ε_r %.3g (%s)", units.Format(l.Length, "m"), units.Format(l.Width, "m"),
			units.Format(l.Thickness, "m"), r.Dielectric.Name, l.Permittivity, r.Fringe)
	}
	fmt.Fprintln(tw, "circuit\tvalue\tfrom")
	fmt.Fprintf(tw, "%s\t%s\t%s\n", first, units.Format(r.SwitchCapacitance, "F"), from("circuit.switch_capacitance", plates(r.SwitchLine)))
	fmt.Fprintf(tw, "%s\t%s\t%s\n", second, units.Format(r.ChannelCapacitance, "F"), from("circuit.channel_capacitance", plates(r.ChannelLine)))
	fmt.Fprintf(tw, "L_s switch loop\t%s\t%s\n", units.Format(r.SwitchInductance, "H"), from("circuit.switch_inductance", "plate line L'·l/3 + the switch's own"))
	fmt.Fprintf(tw, "L_c channel loop\t%s\t%s\n", units.Format(r.ChannelInductance, "H"), from("circuit.channel_inductance",
		"plate line L'·l/3 + rails μ₀·g·h/L = "+units.Format(r.RailInductance, "H")))
	if r.SwitchGap > 0 {
		fmt.Fprintf(tw, "spark gap\t%s\t%s\n", units.Format(r.SwitchGap, "m"), from("switch.gap", "build.switch_gap"))
	}
	fmt.Fprintf(tw, "stored energy\t%s\t\n", units.Format(r.StoredEnergy, "J"))
	tw.Flush()

	if r.SwitchLine != nil || r.ChannelLine != nil {
		fmt.Fprintln(w)
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "plate line\tZ₀\tone-way transit\tL'\tloop L'·l/3")
		for _, x := range []struct {
			n string
			l *build.Line
		}{{first, r.SwitchLine}, {second, r.ChannelLine}} {
			if x.l != nil {
				fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", x.n, units.Format(x.l.Impedance, "Ω"), units.Format(x.l.TransitTime, "s"),
					units.Format(x.l.InductancePerLength, "H/m"), units.Format(x.l.LoopInductance, "H"))
			}
		}
		tw.Flush()
	}

	fmt.Fprintln(w)
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "stress\tvalue\tagainst")
	if r.Dielectric != nil {
		fmt.Fprintf(tw, "dielectric field\t%s at %s\tstrength %s: margin %.2g\n", units.Format(r.DielectricField, "V/m"),
			units.Format(r.DielectricVoltage, "V"), units.Format(r.Dielectric.Strength, "V/m"), r.DielectricMargin)
	}
	if r.ChannelBreakdown > 0 {
		fmt.Fprintf(tw, "channel static breakdown\t%s\tPaschen, N₂, pd = %.3g Torr cm at 293 K, γ = %.3g\n", units.Format(r.ChannelBreakdown, "V"),
			r.ChannelPD/(units.Torr*0.01), r.Townsend.Gamma)
	}
	charging := "held near 0 by the shunt"
	switch {
	case d.Circuit.Topology == design.ChargeTransfer:
		charging = "0 until the switch closes (the peaking capacitor charges through it)"
	case r.ShuntNeeded:
		charging = "no shunt: the channel sits in the charging path"
	}
	fmt.Fprintf(tw, "channel while charging\t%s\t%s\n", units.Format(r.ChannelCharging, "V"), charging)
	ov := ""
	if r.Overvoltage > 0 {
		ov = fmt.Sprintf("%.2g × static breakdown", r.Overvoltage)
	}
	fmt.Fprintf(tw, "channel peak after closure\t%s\t%s\n", units.Format(r.ChannelPeak, "V"), ov)
	if r.SwitchBreakdown > 0 {
		fmt.Fprintf(tw, "spark gap static breakdown\t%s\tcharge voltage %s\n", units.Format(r.SwitchBreakdown, "V"), units.Format(d.Circuit.ChargeVoltage, "V"))
	}
	fmt.Fprintf(tw, "channel voltage rise\t%s\tπ·sqrt(L_s·C) + switch closing time\n", units.Format(r.VoltageRise, "s"))
	fmt.Fprintf(tw, "channel current rise\t%s\t(π/2)·sqrt(L_c·C_ch)\n", units.Format(r.CurrentRise, "s"))
	fmt.Fprintf(tw, "effective C(0) lifetime\t%s\tτ_C/(1 + p/p_q) at %s\n", units.Format(r.UpperLifetime, "s"), units.Format(d.Gas.Pressure, "Pa"))
	tw.Flush()

	if len(r.Warnings) > 0 {
		fmt.Fprintln(w, "\nwarnings:")
		for _, s := range r.Warnings {
			fmt.Fprintln(w, "  - "+s)
		}
	} else {
		fmt.Fprintln(w, "\nno warnings")
	}
	fmt.Fprintln(w, "\n"+safetyNotice)
}

// PrintSensitivity writes two tables: the five design keys that move the output energy most,
// with the direction that gives more energy, and the uncertain physical constants the
// prediction hangs on most (no direction: they are the gas's, not the builder's), each value
// in the trade's units (rate constants in cm³/s).
func PrintSensitivity(w io.Writer, rows []study.SensitivityRow) {
	var design, constants []study.SensitivityRow
	var skipped []string
	for _, r := range rows {
		switch {
		case r.Problem != "":
			skipped = append(skipped, r.Key+" ("+r.Problem+")")
		case r.Constant:
			constants = append(constants, r)
		default:
			design = append(design, r)
		}
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "design key\tvalue\td ln E/d ln x\td ln P/d ln x\tfor more energy")
	for _, r := range design[:min(5, len(design))] {
		dir := "raise it"
		if r.Energy < 0 {
			dir = "lower it"
		}
		if math.Abs(r.Energy) < 1e-3 {
			dir = "no effect"
		}
		if r.OneSided {
			dir += " (one-sided: at its range limit)"
		}
		fmt.Fprintf(tw, "%s\t%s\t%+.3g\t%+.3g\t%s\n", r.Key, tradeValue(r.Value, r.Unit), r.Energy, r.PeakPower, dir)
	}
	tw.Flush()
	fmt.Fprintln(w, "(a sensitivity s means: 1 % more of the key gives about s % more energy)")
	if len(constants) > 0 {
		fmt.Fprintln(w, "\nuncertain physical constants the prediction depends on (properties of the gas, not things to change):")
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "constant\tvalue\td ln E/d ln x\td ln P/d ln x")
		for _, r := range constants[:min(5, len(constants))] {
			fmt.Fprintf(tw, "%s\t%s\t%+.3g\t%+.3g\n", r.Key, tradeValue(r.Value, r.Unit), r.Energy, r.PeakPower)
		}
		tw.Flush()
	}
	if len(skipped) > 0 {
		fmt.Fprintln(w, "not varied: "+strings.Join(skipped, "; "))
	}
}

// tradeValue writes a value in the trade's units: rate constants in cm³/s and densities in
// cm⁻³ (units.Format would put its prefix on the metre), others with an SI prefix.
func tradeValue(v float64, unit string) string {
	switch unit {
	case "m³/s":
		return fmt.Sprintf("%.3g cm³/s", v*1e6)
	case "m⁻³":
		return fmt.Sprintf("%.3g cm⁻³", v*1e-6)
	case "Pa m² V⁻² s⁻¹":
		return fmt.Sprintf("%.3g atm cm² V⁻² s⁻¹", v/units.Atmosphere*1e4)
	}
	return units.Format(v, unit)
}
