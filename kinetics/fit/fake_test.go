package fit

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/fit/measured"
)

// peakModel is a stand-in for the laser with a closed form, so that the fit's intervals can be
// checked against a hand calculation: the energy is w·A·exp(−(g − k·L)²/(2s²)), a gap scan
// whose height grows with the discharge width w and whose best gap k·L moves with the switch
// inductance L. levels.upper_quenching_oxygen plays no part.
const (
	peakA = 1e-3 / 2e-3 // J per m of width
	peakK = 0.15e-3 / 1e-9
	peakS = 0.5e-3
)

func peakEnergy(g, w, l float64) float64 {
	x := g - peakK*l
	return w * peakA * math.Exp(-x*x/(2*peakS*peakS))
}

func peakRunner(d *design.Design) (kinetics.Summary, error) {
	return kinetics.Summary{EnergyFront: peakEnergy(d.Channel.Gap, d.Channel.Width, d.Circuit.SwitchInductance)}, nil
}

// productRunner sees only the product w·L.
func productRunner(d *design.Design) (kinetics.Summary, error) {
	return kinetics.Summary{EnergyFront: d.Channel.Width * d.Circuit.SwitchInductance * 1e8 * (1 + d.Channel.Gap)}, nil
}

func gapScan(t *testing.T, gaps []float64, w, l, rel float64) *measured.Set {
	t.Helper()
	var b strings.Builder
	b.WriteString("channel.gap [mm], energy_front [J], energy_front_uncertainty [%]\n")
	for _, g := range gaps {
		b.WriteString(strings.Join([]string{ftoa(g * 1e3), ftoa(peakEnergy(g, w, l)), ftoa(100 * rel)}, ",") + "\n")
	}
	set, err := measured.Parse([]byte(b.String()), "scan.csv")
	if err != nil {
		t.Fatal(err)
	}
	return set
}

func testDesign(t testing.TB) *design.Design {
	t.Helper()
	d, err := design.LoadDesign("testdata/small-transfer.toml")
	if err != nil {
		t.Fatal(err)
	}
	return d
}

// TestIntervalsByHand: exact data of the closed-form model; the fit must return the true keys
// and the 95 % intervals of the hand-computed covariance (J with analytic derivatives).
func TestIntervalsByHand(t *testing.T) {
	t.Parallel()
	const w, l, rel = 1.5e-3, 12e-9, 0.05
	gaps := []float64{1.2e-3, 1.5e-3, 1.8e-3, 2.1e-3, 2.4e-3, 2.7e-3}
	data := gapScan(t, gaps, w, l, rel)
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 40e-9}}
	res, err := Fit(context.Background(), testDesign(t), data, free, &Settings{Run: peakRunner, Starts: 2})
	if err != nil {
		t.Fatal(err)
	}
	// Hand calculation: r = ln E/rel, ∂r/∂ln w = 1/rel, ∂r/∂ln L = (g − kL)·kL/(s²·rel).
	var a, b, c float64 // JᵀJ = [[a b][b c]]
	for _, g := range gaps {
		j1, j2 := 1/rel, (g-peakK*l)*peakK*l/(peakS*peakS*rel)
		a, b, c = a+j1*j1, b+j1*j2, c+j2*j2
	}
	det := a*c - b*b
	sdW, sdL, corr := math.Sqrt(c/det), math.Sqrt(a/det), -b/math.Sqrt(a*c)
	for i, want := range []struct{ value, sd float64 }{{w, sdW}, {l, sdL}} {
		p := res.Params[i]
		if !p.Determined {
			t.Fatalf("%s not determined: %s", p.Key, p.Why)
		}
		// The data are exact: the optimum is the truth to the minimiser's tolerance.
		if !scalar.EqualWithinAbsOrRel(p.Value, want.value, 0, 1e-4) {
			t.Errorf("%s = %g, want %g", p.Key, p.Value, want.value)
		}
		// Forward differences of step 0.01 in ln x: a few per cent on the sd.
		if !scalar.EqualWithinAbsOrRel(p.SDLog, want.sd, 0, 0.03) {
			t.Errorf("%s: sd of ln = %g, hand calculation %g", p.Key, p.SDLog, want.sd)
		}
		if !scalar.EqualWithinAbsOrRel(p.Hi95/p.Value, math.Exp(1.959964*want.sd), 0, 0.01) {
			t.Errorf("%s: upper 95 %% limit %g", p.Key, p.Hi95)
		}
	}
	if !scalar.EqualWithinAbsOrRel(res.Correlation[0][1], corr, 0.02, 0) {
		t.Errorf("correlation %g, hand calculation %g", res.Correlation[0][1], corr)
	}
	if res.ChiSquare > 1e-6 || res.DOF != 4 {
		t.Errorf("χ² = %g with %d degrees of freedom, want ≈ 0 with 4", res.ChiSquare, res.DOF)
	}
	if v, _ := res.Design.Get("channel.width"); !scalar.EqualWithinAbsOrRel(v, w, 0, 1e-4) {
		t.Errorf("fitted design has width %g", v)
	}
}

// TestUntouchedKey: a key the model ignores is reported as not determined, and the others
// still are.
func TestUntouchedKey(t *testing.T) {
	t.Parallel()
	data := gapScan(t, []float64{1.2e-3, 1.6e-3, 2.0e-3, 2.4e-3}, 2e-3, 10e-9, 0.05)
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 40e-9},
		{"levels.upper_quenching_oxygen", 1e-17, 1e-15}}
	res, err := Fit(context.Background(), testDesign(t), data, free, &Settings{Run: peakRunner, Starts: 1})
	if err != nil {
		t.Fatal(err)
	}
	if got := res.Undetermined(); len(got) != 1 || got[0] != "levels.upper_quenching_oxygen" {
		t.Fatalf("not determined: %v, want only levels.upper_quenching_oxygen", got)
	}
	if p := res.Params[2]; !strings.Contains(p.Why, "do not change") || !math.IsNaN(p.SDLog) {
		t.Errorf("why %q, sd %g", p.Why, p.SDLog)
	}
	if !math.IsNaN(res.Correlation[2][0]) || math.IsNaN(res.Correlation[0][1]) {
		t.Errorf("correlations %v", res.Correlation)
	}
}

// TestCombinationOnly: a model that sees only w·L determines neither alone.
func TestCombinationOnly(t *testing.T) {
	t.Parallel()
	data, err := measured.Parse([]byte("channel.gap [mm], energy_front [uJ]\n1.0, 30\n1.5, 30.2\n2.0, 29.9\n"), "c.csv")
	if err != nil {
		t.Fatal(err)
	}
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 40e-9}}
	res, err := Fit(context.Background(), testDesign(t), data, free, &Settings{Run: productRunner, Starts: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range res.Params {
		if p.Determined || !strings.Contains(p.Why, "combination") {
			t.Errorf("%s: determined %v, why %q", p.Key, p.Determined, p.Why)
		}
	}
}

func ftoa(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

// TestCurves: the curves run along the column with the most distinct values, one per group of
// the other column, across the measured span widened by a fifth each side, and carry the
// model's values there.
func TestCurves(t *testing.T) {
	t.Parallel()
	text := "circuit.switch_capacitance [pF], channel.gap [mm], energy_front [uJ]\n" +
		"800, 1.0, 10\n800, 1.5, 12\n1300, 2.0, 20\n1300, 1.5, 18\n800, 2.0, 9\n"
	data, err := measured.Parse([]byte(text), "c.csv")
	if err != nil {
		t.Fatal(err)
	}
	d := testDesign(t)
	curves, dropped, err := Curves(context.Background(), d, data, "", 11, &Settings{Run: peakRunner})
	if err != nil {
		t.Fatal(err)
	}
	if len(curves) != 2 || dropped != 0 || curves[0].Key != "channel.gap" || len(curves[0].Points) != 3 || len(curves[1].Points) != 2 {
		t.Fatalf("curves %+v", curves)
	}
	c := curves[1]
	if c.Fixed[0].Value != "1300 pF" || c.PointX[0] != 1.5e-3 || c.PointX[1] != 2e-3 {
		t.Errorf("second group %+v", c)
	}
	// 1.0 … 2.0 mm widened by 0.2 mm each side.
	if !scalar.EqualWithinAbsOrRel(c.X[0], 0.8e-3, 1e-12, 0) || !scalar.EqualWithinAbsOrRel(c.X[10], 2.2e-3, 1e-12, 0) {
		t.Errorf("x from %g to %g, want 0.8 mm to 2.2 mm", c.X[0], c.X[10])
	}
	for j, x := range c.X {
		want := peakEnergy(x, d.Channel.Width, d.Circuit.SwitchInductance)
		if !scalar.EqualWithinAbsOrRel(c.Y["energy_front"][j], want, 0, 1e-12) {
			t.Errorf("y(%g) = %g, want %g", x, c.Y["energy_front"][j], want)
		}
	}
	if _, _, err := Curves(context.Background(), d, data, "gas.pressure", 11, &Settings{Run: peakRunner}); err == nil {
		t.Error("a curve along a key that is not a column was drawn")
	}
}

// TestFailingRuns: runs that fail in part of the box only turn the minimiser back; when every
// run fails the fit returns the model's error, naming the line, and never panics.
func TestFailingRuns(t *testing.T) {
	t.Parallel()
	data := gapScan(t, []float64{1.2e-3, 1.6e-3, 2.0e-3, 2.4e-3}, 1.5e-3, 10e-9, 0.05)
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 40e-9}}
	partly := func(d *design.Design) (kinetics.Summary, error) {
		if d.Channel.Width > 3e-3 {
			return kinetics.Summary{}, errors.New("too wide for this stand-in")
		}
		return peakRunner(d)
	}
	res, err := Fit(context.Background(), testDesign(t), data, free, &Settings{Run: partly, Starts: 3})
	if err != nil {
		t.Fatal(err)
	}
	if w := res.Params[0]; !scalar.EqualWithinAbsOrRel(w.Value, 1.5e-3, 0, 1e-3) {
		t.Errorf("width %g, want 1.5 mm", w.Value)
	}
	never := func(*design.Design) (kinetics.Summary, error) { return kinetics.Summary{}, errors.New("no shot") }
	_, err = Fit(context.Background(), testDesign(t), data, free, &Settings{Run: never, Starts: 2})
	if err == nil || !strings.Contains(err.Error(), "every start failed") || !strings.Contains(err.Error(), "no shot") {
		t.Errorf("error %v", err)
	}
}

// TestCoverage: over 200 seeded noise draws of the closed-form model (6 gaps, 5 % lognormal
// errors, 5 % stated), the 95 % intervals of both keys hold the true values in 95 % of the
// draws: binomial standard deviation 1.5 %, so 90.5–99.5 % is a ±3 sd band. The model is
// nonlinear in ln L, so this checks the linearised intervals, not only their algebra.
func TestCoverage(t *testing.T) {
	t.Parallel()
	const w, l, rel, draws = 1.5e-3, 12e-9, 0.05, 200
	gaps := []float64{1.2e-3, 1.5e-3, 1.8e-3, 2.1e-3, 2.4e-3, 2.7e-3}
	rng := rand.New(rand.NewPCG(11, 3))
	free := []Free{{"channel.width", 0.5e-3, 5e-3}, {"circuit.switch_inductance", 3e-9, 40e-9}}
	d := testDesign(t)
	inside := [2]int{}
	for range draws {
		var b strings.Builder
		b.WriteString("channel.gap [mm], energy_front [J], energy_front_uncertainty [%]\n")
		for _, g := range gaps {
			b.WriteString(ftoa(g*1e3) + "," + ftoa(peakEnergy(g, w, l)*math.Exp(rel*rng.NormFloat64())) + ",5\n")
		}
		data, err := measured.Parse([]byte(b.String()), "draw.csv")
		if err != nil {
			t.Fatal(err)
		}
		res, err := Fit(context.Background(), d, data, free, &Settings{Run: peakRunner, Starts: 1})
		if err != nil {
			t.Fatal(err)
		}
		for i, truth := range []float64{w, l} {
			if p := res.Params[i]; p.Lo95 <= truth && truth <= p.Hi95 {
				inside[i]++
			}
		}
	}
	for i, n := range inside {
		if f := float64(n) / draws; f < 0.905 || f > 0.995 {
			t.Errorf("%s: true value inside the 95 %% interval in %.1f %% of the draws", free[i].Key, 100*f)
		}
	}
	t.Logf("coverage: %d and %d of %d", inside[0], inside[1], draws)
}

// TestSeveralOptima: a stand-in whose energy depends on the width only through
// (ln(w/2 mm))² fits the data equally well at 2 mm·e^(±0.5); starts on both sides must find
// both and say so.
func TestSeveralOptima(t *testing.T) {
	t.Parallel()
	twoWays := func(d *design.Design) (kinetics.Summary, error) {
		x := math.Log(d.Channel.Width / 2e-3)
		return kinetics.Summary{EnergyFront: d.Channel.Gap * 0.1 * math.Exp(-x*x)}, nil
	}
	var b strings.Builder
	b.WriteString("channel.gap [mm], energy_front [J], energy_front_uncertainty [%]\n")
	for _, g := range []float64{1e-3, 2e-3, 3e-3} {
		b.WriteString(ftoa(g*1e3) + "," + ftoa(g*0.1*math.Exp(-0.25)) + ",5\n")
	}
	data, err := measured.Parse([]byte(b.String()), "two.csv")
	if err != nil {
		t.Fatal(err)
	}
	res, err := Fit(context.Background(), testDesign(t), data, []Free{{"channel.width", 0.5e-3, 5e-3}}, &Settings{Run: twoWays, Starts: 4})
	if err != nil {
		t.Fatal(err)
	}
	var low, high bool
	for _, s := range res.Starts {
		low = low || scalar.EqualWithinAbsOrRel(s.Values[0], 2e-3*math.Exp(-0.5), 0, 1e-3)
		high = high || scalar.EqualWithinAbsOrRel(s.Values[0], 2e-3*math.Exp(0.5), 0, 1e-3)
	}
	if !low || !high || !res.SeveralOptima {
		t.Errorf("starts ended at %+v; several optima %v; want both 1.21 mm and 3.30 mm, flagged", res.Starts, res.SeveralOptima)
	}
}
