package study

import (
	"context"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

func TestUsefulLengthRules(t *testing.T) {
	grid := func(n int, to float64) []float64 {
		return Axis{From: to / float64(n), To: to, N: n}.Values()
	}
	// Saturating E = 1 − exp(−L/ℓ): 90 % of the plateau E(1 m) ≈ 1 lies at
	// L = −ℓ·ln(1 − 0.9·E(1 m)) (analytic), here 0.2302 m; linear interpolation on a 2.5 cm grid
	// is within 1 %.
	L := grid(40, 1)
	E := make([]float64, len(L))
	for i, l := range L {
		E[i] = 1 - math.Exp(-l/0.1)
	}
	want := -0.1 * math.Log(1-0.9*(1-math.Exp(-10)))
	if u, rule := UsefulLength(L, E); math.Abs(u-want) > 0.01*want || !strings.Contains(rule, "90 %") {
		t.Errorf("saturating: %g (%s), want %g", u, rule, want)
	}
	// E = L·exp(−L/0.3) peaks at 0.3 m and falls: the same rule, 90 % of the maximum
	// 0.3/e, holds on the rising side at L = 0.3·x with x·e^(−x) = 0.9/e, x = 0.608341
	// (bisection, python3 math, 200 halvings): 0.182502 m; linear interpolation on a 5 cm grid
	// gives 0.185663 m (the same python3 computation), within 2 %.
	L = grid(20, 1)
	E = E[:len(L)]
	for i, l := range L {
		E[i] = l * math.Exp(-l/0.3)
	}
	if u, rule := UsefulLength(L, E); !scalar.EqualWithinAbsOrRel(u, 0.182502, 0, 0.02) || rule != UsefulLengthRule {
		t.Errorf("falling: %g (%s), want 0.1825 m by %q", u, rule, UsefulLengthRule)
	}
	// Still rising linearly: no useful length.
	for i, l := range L {
		E[i] = l
	}
	if u, rule := UsefulLength(L, E); !math.IsNaN(u) || !strings.Contains(rule, "still rising") {
		t.Errorf("rising: %g (%s), want NaN", u, rule)
	}
}

// saturatingRunner stands in for the model in machinery tests: output-end energy saturates
// over 10 cm of channel (faster with a travelling front), gain lasts 1 ns.
func saturatingRunner(d *design.Design) (kinetics.Summary, error) {
	scale := 0.1
	if !math.IsInf(d.Optics.ExcitationVelocity, 1) {
		scale = 0.2
	}
	e := 1e-4 * (1 - math.Exp(-d.Channel.Length/scale))
	return kinetics.Summary{EnergyFront: e, EnergyTotal: 2 * e, InversionDuration: 1e-9}, nil
}

func TestLengthScan(t *testing.T) {
	s := &LengthScan{Design: design.ExampleDesign(), From: 0.02, To: 1, Points: 50,
		TravellingWave: units.SpeedOfLight, Runner: saturatingRunner, Workers: 2}
	r, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Curves) != 2 || !math.IsInf(r.Curves[0].Velocity, 1) || r.Curves[1].Velocity != units.SpeedOfLight {
		t.Fatalf("curves %+v", r.Curves)
	}
	// 90 % of the plateau E(1 m) of 1 − exp(−L/ℓ) at −ℓ·ln(1 − 0.9·E(1 m)) (analytic), within
	// 2 % on a 2 cm grid.
	for c, ell := range []float64{0.1, 0.2} {
		want := -ell * math.Log(1-0.9*(1-math.Exp(-1/ell)))
		if u := r.Curves[c].Useful; math.Abs(u-want) > 0.02*want {
			t.Errorf("curve %d: useful %g m, want %g", c, u, want)
		}
		// c·τ_g with τ_g = 1 ns: 0.2998 m.
		if tr := r.Curves[c].Transit; math.Abs(tr-0.299792458) > 1e-9 {
			t.Errorf("curve %d: transit %g m", c, tr)
		}
	}
	tab := r.Table()
	if len(tab.Rows) != 50 || tab.Columns[0] != "channel.length [m]" || tab.Column("tw.energy_front_J") < 0 || tab.Column("transit_length_m") < 0 {
		t.Errorf("table columns %v, %d rows", tab.Columns, len(tab.Rows))
	}
	if got := tab.Float(49, tab.Column("energy_total_J")); math.Abs(got-2e-4*(1-math.Exp(-10))) > 1e-15 {
		t.Errorf("energy_total_J at 1 m: %g", got)
	}
	// With ScaleCapacitors each length gets the design's capacitance per unit length.
	perLength := s.Design.Circuit.SwitchCapacitance / s.Design.Channel.Length
	scaled := &LengthScan{Design: s.Design, From: 0.1, To: 0.5, Points: 3, ScaleCapacitors: true, Workers: 1,
		Runner: func(d *design.Design) (kinetics.Summary, error) {
			if got := d.Circuit.SwitchCapacitance / d.Channel.Length; math.Abs(got-perLength) > 1e-12*perLength ||
				d.Circuit.ChannelCapacitance != d.Circuit.SwitchCapacitance*s.Design.Circuit.ChannelCapacitance/s.Design.Circuit.SwitchCapacitance {
				t.Errorf("at %g m: capacitances %g F, %g F", d.Channel.Length, d.Circuit.SwitchCapacitance, d.Circuit.ChannelCapacitance)
			}
			return saturatingRunner(d)
		}}
	if _, err := scaled.Run(context.Background()); err != nil {
		t.Fatal(err)
	}
	for _, bad := range []*LengthScan{
		{Design: s.Design, From: 0.3, To: 0.1, Points: 5},
		{Design: s.Design, From: 0.1, To: 0.3, Points: 2},
		{Design: s.Design, From: 0.1, To: 30, Points: 5},
	} {
		if _, err := bad.Run(context.Background()); err == nil {
			t.Errorf("accepted %+v", bad)
		}
	}
}

// interpolate is linear between points (exact here to rounding, 1e-15 relative), held at the
// ends, constant for one point and NaN for x that does not increase.
func TestInterpolate(t *testing.T) {
	t.Parallel()
	x, y := []float64{0.1, 0.2, 0.4}, []float64{1, 3, 2}
	for _, c := range []struct{ at, want float64 }{{0.15, 2}, {0.3, 2.5}, {0.05, 1}, {0.9, 2}, {0.2, 3}} {
		if got := interpolate(x, y, c.at); !scalar.EqualWithinAbsOrRel(got, c.want, 1e-15, 1e-15) {
			t.Errorf("interpolate at %g: %g, want %g", c.at, got, c.want)
		}
	}
	if got := interpolate([]float64{0.2}, []float64{7}, 0.5); got != 7 {
		t.Errorf("one point: %g, want 7", got)
	}
	if got := interpolate([]float64{0.2, 0.2}, []float64{1, 2}, 0.2); !math.IsNaN(got) {
		t.Errorf("repeated x: %g, want NaN", got)
	}
}
