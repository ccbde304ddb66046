package build

import (
	"math"
	"strings"
	"testing"

	"n2pulse/units"
)

// board is an invented Blumlein on 1.6 mm FR-4.
func board() (Spec, Conditions) {
	s := Spec{
		SwitchPlateLength: 0.15, SwitchPlateWidth: 0.25,
		ChannelPlateLength: 0.15, ChannelPlateWidth: 0.25,
		Dielectric: "fr4", DielectricThickness: 1.6e-3,
		RailHeight: 5e-3, SwitchGap: 2e-3,
	}
	c := Conditions{
		ChargeVoltage: 12e3, ChannelLength: 0.25, ChannelGap: 2e-3, GapCapacitance: 1e-12,
		Pressure: 101325, Temperature: 300, Nitrogen: 1, Shunt: true,
		SwitchPressure: 101325, UpperLifetime: 3.7e-9,
	}
	return s, c
}

func TestEvaluateDerivesCircuit(t *testing.T) {
	t.Parallel()
	s, c := board()
	b, err := Evaluate(s, c)
	if err != nil {
		t.Fatal(err)
	}
	eps := units.VacuumPermittivity * 4.5
	near(t, "C₁", b.SwitchCapacitance, eps*0.15*0.25/1.6e-3, 1e-12)
	mu := units.VacuumPermeability
	near(t, "L_s", b.SwitchInductance, mu*1.6e-3/0.25*0.15/3, 1e-12)
	near(t, "L_c", b.ChannelInductance, mu*1.6e-3/0.25*0.15/3+mu*2e-3*5e-3/0.25, 1e-12)
	near(t, "dielectric field", b.DielectricField, 12e3/1.6e-3, 1e-12)
	near(t, "margin", b.DielectricMargin, 20e6/(12e3/1.6e-3), 1e-12)
	near(t, "channel peak", b.ChannelPeak, 24e3, 1e-12)
	near(t, "stored", b.StoredEnergy, 0.5*2*b.SwitchCapacitance*144e6, 1e-12)
	// Explicit values win over derived ones.
	c.SwitchInductance = 20e-9
	b2, _ := Evaluate(s, c)
	if b2.SwitchInductance != 20e-9 || b2.DerivedSwitchInductance != b.SwitchInductance {
		t.Errorf("explicit L_s: used %g, derived %g", b2.SwitchInductance, b2.DerivedSwitchInductance)
	}
	// Palmer adds capacitance.
	s.Fringe = Palmer
	b3, _ := Evaluate(s, c)
	if b3.SwitchCapacitance <= b.SwitchCapacitance {
		t.Errorf("Palmer capacitance %g not above ideal %g", b3.SwitchCapacitance, b.SwitchCapacitance)
	}
}

func hasWarning(b *Bench, part string) bool {
	for _, w := range b.Warnings {
		if strings.Contains(w, part) {
			return true
		}
	}
	return false
}

func TestEvaluateWarnings(t *testing.T) {
	t.Parallel()
	s, c := board()
	b, _ := Evaluate(s, c)
	if hasWarning(b, "over-stressed") || hasWarning(b, "self-fires") {
		t.Errorf("unexpected warnings: %q", b.Warnings)
	}
	// 1.6 mm of FR-4 at 40 kV: 25 MV/m, above 20 MV/m.
	c.ChargeVoltage = 40e3
	b, _ = Evaluate(s, c)
	if !hasWarning(b, "over-stressed") {
		t.Errorf("no over-stress warning at 40 kV: %q", b.Warnings)
	}
	// Without a shunt the Blumlein channel sees V₀ while charging; 12 kV over 2 mm of 1 atm N₂
	// (static breakdown about 7 kV) fires it.
	s, c = board()
	c.Shunt = false
	b, _ = Evaluate(s, c)
	if !b.ShuntNeeded || !hasWarning(b, "self-fires") {
		t.Errorf("no self-fire warning without a shunt: %q (V_b %g)", b.Warnings, b.ChannelBreakdown)
	}
	// A slow switch loop against a 3.7 ns effective lifetime.
	s, c = board()
	c.SwitchInductance = 50e-9
	b, _ = Evaluate(s, c)
	if !hasWarning(b, "switch slower") {
		t.Errorf("no slow-switch warning at 50 nH: %q", b.Warnings)
	}
	// A 2 mm air spark gap breaks down near 7 kV, below 12 kV.
	if b.SwitchBreakdown <= 0 || b.SwitchBreakdown > 12e3 || !hasWarning(b, "spark gap breaks down") {
		t.Errorf("spark gap breakdown %g V, warnings %q", b.SwitchBreakdown, b.Warnings)
	}
	// Transfer: the peaking capacitor rings up to 2V₀·C_s/(C_s+C_p) (lossless LC transfer,
	// analytic).
	s, c = board()
	c.Transfer = true
	c.ChannelCapacitance = b.SwitchCapacitance / 3
	b, _ = Evaluate(s, c)
	near(t, "transfer peak", b.ChannelPeak, 2*12e3*0.75, 1e-9)
	near(t, "transfer rise", b.VoltageRise, math.Pi*math.Sqrt(b.SwitchInductance*b.SwitchCapacitance*b.ChannelCapacitance/(b.SwitchCapacitance+b.ChannelCapacitance)), 1e-12)
}

func TestEvaluateErrors(t *testing.T) {
	t.Parallel()
	s, c := board()
	s.Dielectric = ""
	if _, err := Evaluate(s, c); err == nil {
		t.Error("no error: a thickness without a permittivity")
	}
	s, c = board()
	s.DielectricThickness = 0
	if _, err := Evaluate(s, c); err == nil {
		t.Error("no error: a preset without a thickness")
	}
	s, c = board()
	s.Fringe = "kirchhoff"
	if _, err := Evaluate(s, c); err == nil {
		t.Error("no error: an unknown fringe correction")
	}
	if _, err := Evaluate(Spec{}, c); err == nil {
		t.Error("no error: no circuit from anywhere")
	}
}
