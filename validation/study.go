package validation

import (
	"context"
	"fmt"
	"math"
	"os"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/units"
)

// Trends of the trade checked through the study machinery (sweeps and length scans), with the
// full model on coarse grids. The channel is resolved with 60 cells: the figures of merit used
// here agree with 200 cells to three digits on these designs.

func init() {
	Register("study", func() ([]Check, error) {
		var checks []Check
		for _, f := range []func() (Check, error){pressureOptimum, widthFallsWithPressure, usefulLength, travellingWaveGain} {
			c, err := f()
			if err != nil {
				return checks, err
			}
			checks = append(checks, c)
		}
		return checks, nil
	})
}

// studyDesign is the example design with keys changed, as `--set` would.
func studyDesign(set ...string) (*design.Design, error) {
	d := design.ExampleDesign()
	set = append([]string{"numerics.cells", "60"}, set...)
	for i := 0; i+1 < len(set); i += 2 {
		if err := d.Set(set[i], set[i+1]); err != nil {
			return nil, fmt.Errorf("validation: %w", err)
		}
	}
	return d, d.Validate()
}

// sweepOf runs a one-key sweep of d in a scratch directory and returns the axis values and the
// table.
func sweepOf(d *design.Design, vary string) ([]float64, *study.Table, error) {
	a, err := study.ParseAxis(vary, d)
	if err != nil {
		return nil, nil, err
	}
	dir, err := os.MkdirTemp("", "n2pulse-check-")
	if err != nil {
		return nil, nil, fmt.Errorf("validation: %w", err)
	}
	defer os.RemoveAll(dir)
	t, err := (&study.Sweep{Design: d, Axes: []study.Axis{a}, Dir: dir}).Run(context.Background())
	if err != nil {
		return nil, nil, err
	}
	for r := range t.Rows {
		if !t.OK(r) {
			return nil, nil, fmt.Errorf("validation: sweep %s: point %d %s", vary, r, t.Rows[r][t.Column(study.StatusColumn)])
		}
	}
	return a.Values(), t, nil
}

func column(t *study.Table, name string) []float64 {
	c := t.Column(name)
	v := make([]float64, len(t.Rows))
	for r := range v {
		v[r] = t.Float(r, c)
	}
	return v
}

// reducedPressure is a low-pressure variant of the example (an invented scenario): a 50 cm
// channel with a 2 cm gap, a 1 cm wide discharge between 2 cm electrodes, charged to 16 kV,
// so that E/N stays in the exciting range at tens of Torr.
var reducedPressure = []string{"channel.length", "50 cm", "channel.gap", "2 cm", "channel.width", "1 cm",
	"channel.electrode_width", "2 cm", "circuit.charge_voltage", "16 kV", "numerics.end_time", "40 ns"}

// pressureOptimum: the pulse energy of a reduced-pressure design peaks at an interior pressure.
func pressureOptimum() (Check, error) {
	c := Check{ID: "study.pressure_optimum", Unit: "Torr", Mode: Range, Kind: CommonPractice,
		Source: "common practice, no source: low-pressure nitrogen lasers have an optimum pressure; below it the discharge burns at too low a voltage to take the circuit's energy, above it the gap breaks late, at too low an E/N, or not at all"}
	d, err := studyDesign(reducedPressure...)
	if err != nil {
		return c, err
	}
	p, t, err := sweepOf(d, "gas.pressure=10Torr:300Torr:8:log")
	if err != nil {
		return c, err
	}
	e := column(t, "energy_total_J")
	best := 0
	for i := range e {
		if e[i] > e[best] {
			best = i
		}
	}
	c.Quantity = fmt.Sprintf("pressure of the energy maximum of a 50 cm, 2 cm-gap design at 16 kV, 10–300 Torr (energies %s µJ); must lie inside the grid",
		listScaled(e, 1e6))
	c.Computed = p[best] / units.Torr
	c.Reference = c.Computed
	c.Low, c.High = p[1]/units.Torr, p[len(p)-2]/units.Torr
	return c, nil
}

// widthFallsWithPressure: at fixed voltage the rms-based pulse width falls as the pressure rises.
func widthFallsWithPressure() (Check, error) {
	c := Check{ID: "study.fwhm_falls_with_pressure", Mode: True, Kind: CommonPractice,
		Source: "common practice, no source: collisions grow with pressure — they fill B(0) from the B/W/B′ manifold and quench C(0) — and end the inversion sooner"}
	d, err := studyDesign()
	if err != nil {
		return c, err
	}
	_, t, err := sweepOf(d, "gas.pressure=100Torr:760Torr:5:log")
	if err != nil {
		return c, err
	}
	// The rms-based width: the trend is one of the pulse's duration, which the half-maximum
	// width of an ASE spike train follows only in jumps.
	w := column(t, "rms_fwhm_s")
	falls := 1.0
	for i := 1; i < len(w); i++ {
		if !(w[i] < w[i-1]) {
			falls = 0
		}
	}
	c.Quantity = fmt.Sprintf("rms-based width of the example at 14 kV falls at every step 100→760 Torr (%s ns)", listScaled(w, 1e9))
	c.Computed = falls
	return c, nil
}

// usefulLength: the useful length is of the order of c·τ_g. The rule is one of optical transit
// (light from the far end arrives after the gain is over), so the scan excites the channel alike
// at every length: both capacitors grow with the length and both circuit inductances shrink with
// it, which keeps the current per unit length and the rise time of the example. (Growing the
// capacitors at a fixed switch inductance slows the rise as √L, and where the lower level fills
// fast that, not transit, ends the growth; laser.trend.length_saturates scans that family.) τ_g
// is the gain duration of the shortest channel, where the light extracts least: at the useful
// length the extraction itself shortens the gain.
func usefulLength() (Check, error) {
	c := Check{ID: "study.useful_length_transit", Unit: "m", Mode: Factor, Tolerance: 1.5, Kind: CommonPractice,
		Source: "common practice, no source: no gain past the length light travels during the gain"}
	base, err := studyDesign()
	if err != nil {
		return c, err
	}
	lengths := []float64{0.1, 0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 2.0, 2.4}
	energy := make([]float64, len(lengths))
	var tau float64
	for i, l := range lengths {
		d := base.Clone()
		f := l / base.Channel.Length
		d.Channel.Length = l
		d.Circuit.SwitchCapacitance *= f
		d.Circuit.ChannelCapacitance *= f
		d.Circuit.SwitchInductance /= f
		d.Circuit.ChannelInductance /= f
		if err := d.Validate(); err != nil {
			return c, fmt.Errorf("validation: length %g m: %w", l, err)
		}
		s, err := study.ModelRunner(d)
		if err != nil {
			return c, fmt.Errorf("validation: length %g m: %w", l, err)
		}
		energy[i] = s.EnergyFront
		if i == 0 {
			tau = s.InversionDuration
		}
	}
	useful, rule := study.UsefulLength(lengths, energy)
	c.Quantity = fmt.Sprintf("useful length of the example excited alike at every length (capacitors ∝ length, inductances ∝ 1/length, 10–240 cm; output-end energies %s µJ; %s) against c·τ_g of the 10 cm channel",
		listScaled(energy, 1e6), rule)
	c.Computed, c.Reference = useful, units.SpeedOfLight*tau
	return c, nil
}

// travellingWaveGain: a front at light speed raises the forward energy of a long channel.
func travellingWaveGain() (Check, error) {
	c := Check{ID: "study.travelling_wave_long_channel", Mode: Range, Low: 1.02, High: math.Inf(1), Kind: CommonPractice,
		Source: "common practice, no source: a front moving with the light keeps the gain in step with the forward pulse"}
	var e [2]float64
	for i, v := range []string{"infinite", "c"} {
		// 1 m: five times the example's channel, capacitors scaled with it (4 nF per 20 cm).
		d, err := studyDesign("channel.length", "1 m", "circuit.switch_capacitance", "20 nF",
			"circuit.channel_capacitance", "20 nF", "optics.excitation_velocity", v)
		if err != nil {
			return c, err
		}
		s, err := study.ModelRunner(d)
		if err != nil {
			return c, err
		}
		e[i] = s.EnergyFront
	}
	c.Quantity = fmt.Sprintf("output-end energy of a 1 m channel, front at c / simultaneous (%.4g / %.4g µJ)", 1e6*e[1], 1e6*e[0])
	c.Computed = e[1] / e[0]
	c.Reference = 1
	return c, nil
}

// listScaled writes values × scale with three digits, comma-separated.
func listScaled(v []float64, scale float64) string {
	s := ""
	for i, x := range v {
		if i > 0 {
			s += ", "
		}
		s += fmt.Sprintf("%.3g", x*scale)
	}
	return s
}
