package kinetics

import (
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// TestGainTableAgainstSpectro: the interpolated σ(T) and g_C/g_B(T) at constant density
// agree with package spectro computed directly, midway between the nodes and at them, to
// gainTableTolerance, at 1 atm and 50 Torr (at 300 K).
func TestGainTableAgainstSpectro(t *testing.T) {
	t.Parallel()
	for _, p := range []float64{units.Atmosphere, 50 * units.Torr} {
		n := units.GasDensity(p, 300)
		lp0, err := spectro.Laser(p, 300)
		if err != nil {
			t.Fatal(err)
		}
		tb := newGainTable(n, 300, lp0.CrossSection, lp0.DegeneracyRatio)
		r := math.Log(spectro.MaxTemperature / 300)
		for i := 0; i < 2*(gainTableNodes-1); i++ {
			temp := 300 * math.Exp(r*float64(i)/float64(2*(gainTableNodes-1)))
			lp, err := spectro.Laser(n*units.Boltzmann*temp, temp)
			if err != nil {
				t.Fatal(err)
			}
			s, g := tb.at(temp)
			if !scalar.EqualWithinAbsOrRel(s, lp.CrossSection, 0, gainTableTolerance) ||
				!scalar.EqualWithinAbsOrRel(g, lp.DegeneracyRatio, 0, gainTableTolerance) {
				t.Errorf("p %g Pa, T %.1f K: table σ %.5g m², g %.5g; spectro %.5g m², %.5g", p, temp, s, g, lp.CrossSection, lp.DegeneracyRatio)
			}
			if i%8 == 0 {
				t.Logf("p %g Pa T %6.1f K: σ %.4g m² (%.3f of 300 K) g %.4f", p, temp, s, s/lp0.CrossSection, g)
			}
		}
	}
}

// BenchmarkGainTable is the start-up cost of the gain table of one run (three nodes, a gas
// that heats by a few kelvin) and of a whole table (every node to spectro.MaxTemperature).
func BenchmarkGainTable(b *testing.B) {
	n := units.GasDensity(units.Atmosphere, 300)
	lp, err := spectro.Laser(units.Atmosphere, 300)
	if err != nil {
		b.Fatal(err)
	}
	b.Run("start", func(b *testing.B) {
		for b.Loop() {
			newGainTable(n, 300, lp.CrossSection, lp.DegeneracyRatio)
		}
	})
	b.Run("whole", func(b *testing.B) {
		for b.Loop() {
			tb := newGainTable(n, 300, lp.CrossSection, lp.DegeneracyRatio)
			tb.at(spectro.MaxTemperature)
		}
	})
}

// TestGasHeatingHand: one cell of 0.1 m × 10 mm × 1 mm (1e-6 m³) of N₂ at 2.446e25 m⁻³ and
// 300 K takes 1e8 W for 100 steps of 10 ps, 1 % of it elastic and 50 % electronic (C 20 %,
// other 30 %), with a fast-heating share of 0.2 released at k = 1.2e-11 cm³/s × N. By hand:
// elastic 0.01·1e8 W·1 ns/1e-6 m³ = 1000 J/m³; the fast share feeds F = 0.2·0.5·1e8/1e-6 =
// 1e13 W/m³ into the reservoir of rate q = 2.446e25·1.2e-17 = 2.93520e8 s⁻¹, which releases
// F·(t − (1 − e^(−qt))/q) = 1333.957 J/m³ by t = 1 ns; N·(5/2)·k_B = 844.2669 J m⁻³ K⁻¹, so
// ΔT = 2333.957/844.2669 = 2.764478 K.
func TestGasHeatingHand(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	d.Channel.Length, d.Channel.Width, d.Channel.Gap = 0.1, 0.01, 0.001
	d.Gas = design.Gas{Pressure: d.Gas.Pressure, Temperature: 300, Nitrogen: 1}
	d.Levels.FastHeatingShare, d.Levels.ManifoldRelaxationNitrogen = 0.2, 1.2e-17
	h := newGasHeating(d, 2.446e25, 1e-11)
	var share [swarm.NumChannels]float64
	share[swarm.ChannelElastic], share[swarm.ChannelC], share[swarm.ChannelOtherElectronic] = 0.01, 0.2, 0.3
	share[swarm.ChannelVibrational] = 0.49
	var temp float64
	for range 100 {
		temp = h.step(1e8, &share, 1e-11)
	}
	if want := 302.764478; !scalar.EqualWithinAbsOrRel(temp, want, 0, 1e-7) {
		t.Errorf("T = %.7f K, hand calculation %.7f K", temp, want)
	}
	if !scalar.EqualWithinAbsOrRel(h.prompt, 1000, 0, 1e-12) {
		t.Errorf("elastic heat %.9g J/m³, want 1000", h.prompt)
	}
	// Nothing fed is lost: what is held and what came out add up to the fast share fed.
	if got := h.heat - h.prompt + h.held.r; !scalar.EqualWithinAbsOrRel(got, 1e4, 0, 1e-12) {
		t.Errorf("fast heat released + held %.9g J/m³, fed 1e4", got)
	}
}

// heatedCase runs the 11 mm Blumlein case (2.5 eV per molecule, the most heated of the
// experiment cases) with the fast-heating share eta and cells cells.
func heatedCase(t *testing.T, eta float64, cells int) *Result {
	t.Helper()
	_, r := runWith(t, "../validation/testdata/experiments/tea-blumlein-11mm-n2.toml",
		"levels.fast_heating_share", strconv.FormatFloat(eta, 'g', -1, 64), "numerics.cells", strconv.Itoa(cells))
	return r
}

// TestHeatingConservation: in the most heated case, with three times the default
// fast-heating share, the heat in the gas and the heat still held add up to the elastic
// part plus the share of the electronic part of the plasma energy (the same samples), and
// the photon and energy balances still close to 1e-6 while the medium takes new cross
// sections through the shot.
func TestHeatingConservation(t *testing.T) {
	t.Parallel()
	d, err := design.LoadDesign("../validation/testdata/experiments/tea-blumlein-11mm-n2.toml")
	if err != nil {
		t.Fatal(err)
	}
	d.Levels.FastHeatingShare = 0.3
	table, err := swarmTable(d, "")
	if err != nil {
		t.Fatal(err)
	}
	par, _, err := laserParameters(d)
	if err != nil {
		t.Fatal(err)
	}
	circ := newCircuit(d, table)
	par.CellLength = d.Channel.Length / float64(d.Numerics.Cells)
	par.TimeStep = par.CellLength / units.SpeedOfLight
	steps := int(math.Ceil(d.Numerics.EndTime / par.TimeStep))
	wf, _, err := solveCircuit(circ, d, &par, steps, false)
	if err != nil {
		t.Fatal(err)
	}
	h := wf.heating
	vol := d.Channel.Length * d.Channel.Width * d.Channel.Gap
	want := wf.plasmaSplit[swarm.ChannelElastic]
	for _, c := range electronicChannels {
		want += 0.3 * wf.plasmaSplit[c]
	}
	if got := (h.heat + h.held.r) * vol; !scalar.EqualWithinAbsOrRel(got, want, 0, 1e-9) {
		t.Errorf("heat in the gas + held %.9g J, elastic + 0.3 × electronic %.9g J", got, want)
	}
	r := heatedCase(t, 0.3, d.Numerics.Cells)
	s := r.Summary
	if s.PhotonBalanceResidual > 1e-6 || s.EnergyBalanceResidual > 1e-6 {
		t.Errorf("photon balance %.2g, energy balance %.2g; want < 1e-6", s.PhotonBalanceResidual, s.EnergyBalanceResidual)
	}
	if !(s.PulseGasTemperature > 320 && s.PeakGasTemperature > s.PulseGasTemperature) {
		t.Errorf("gas temperature at the pulse %.4g K, peak %.4g K: want heating by more than 20 K at the pulse and more after", s.PulseGasTemperature, s.PeakGasTemperature)
	}
}

// TestHeatingConverges: the heating's effect on the pulse energy of the most heated case
// (fast-heating share 0.3 against 0) and the gas temperature at the pulse agree within 1 %
// between 20 and 40 cells (the optical time step halves with the cells).
func TestHeatingConverges(t *testing.T) {
	t.Parallel()
	var ratio, temp [2]float64
	for i, cells := range []int{20, 40} {
		hot, cold := heatedCase(t, 0.3, cells), heatedCase(t, 0, cells)
		ratio[i] = hot.Summary.EnergyTotal / cold.Summary.EnergyTotal
		temp[i] = hot.Summary.PulseGasTemperature
	}
	t.Logf("energy with/without heating %.5f (20 cells), %.5f (40 cells); gas at the pulse %.1f K, %.1f K", ratio[0], ratio[1], temp[0], temp[1])
	if !scalar.EqualWithinAbsOrRel(ratio[0], ratio[1], 0, 0.01) || !scalar.EqualWithinAbsOrRel(temp[0], temp[1], 0, 0.01) {
		t.Errorf("energy ratio %.5f vs %.5f, gas temperature %.2f vs %.2f K: want within 1 %%", ratio[0], ratio[1], temp[0], temp[1])
	}
	if !(ratio[0] < 1) {
		t.Errorf("heating raised the energy (ratio %.5f): a hotter gas has less gain per molecule", ratio[0])
	}
}

// TestHeatingAboveRange: a fast-heating share of 1 takes the 11 mm case past 3000 K, the top
// of the gain table: the run says so in the summary and a warning.
func TestHeatingAboveRange(t *testing.T) {
	t.Parallel()
	r := heatedCase(t, 1, 20)
	s := r.Summary
	if !s.GasTemperatureAbove || s.PeakGasTemperature <= spectro.MaxTemperature {
		t.Errorf("peak %.4g K, above the range %v: want above %g K and flagged", s.PeakGasTemperature, s.GasTemperatureAbove, spectro.MaxTemperature)
	}
	found := false
	for _, w := range s.Warnings {
		found = found || strings.Contains(w, "above the") && strings.Contains(w, "gain cross section")
	}
	if !found {
		t.Errorf("no warning of the gain table's range in %q", s.Warnings)
	}
	if r2 := heatedCase(t, 0.1, 20); r2.Summary.GasTemperatureAbove {
		t.Errorf("default share flagged above the range (peak %.4g K)", r2.Summary.PeakGasTemperature)
	}
}
