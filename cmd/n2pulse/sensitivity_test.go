package main

import (
	"bytes"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
)

// TestSensitivityTablesIssue16 (issue 16 case 5): design keys and uncertain physical constants
// are ranked in separate tables; a constant gets no advice to change it (before: "lower it"
// for levels.upper_quenching_nitrogen) and is printed in cm³/s (before: "0.01 fm³/s" for
// 1e-11 cm³/s).
func TestSensitivityTablesIssue16(t *testing.T) {
	t.Parallel()
	rows := []study.SensitivityRow{
		{Key: "circuit.charge_voltage", Value: 14e3, Unit: "V", Energy: 1.8, PeakPower: 1},
		{Key: "levels.upper_quenching_nitrogen", Value: 1e-17, Unit: "m³/s", Energy: -0.7, PeakPower: -0.3,
			Constant: study.PhysicalConstant("levels.upper_quenching_nitrogen")},
		{Key: "switch.spark_constant", Value: 10.1325, Unit: "Pa m² V⁻² s⁻¹", Energy: 0.2, PeakPower: 0.1,
			Constant: study.PhysicalConstant("switch.spark_constant")},
		{Key: "channel.width", Value: 3e-3, Unit: "m", Energy: -0.5, PeakPower: 0.1},
	}
	var b bytes.Buffer
	PrintSensitivity(&b, rows)
	out := b.String()
	design, constants, ok := strings.Cut(out, "uncertain physical constants")
	if !ok {
		t.Fatalf("no table of constants:\n%s", out)
	}
	for _, want := range []string{"circuit.charge_voltage", "raise it", "channel.width", "lower it"} {
		if !strings.Contains(design, want) {
			t.Errorf("design table lacks %q:\n%s", want, design)
		}
	}
	if strings.Contains(design, "levels.") || strings.Contains(constants, "raise it") || strings.Contains(constants, "lower it") {
		t.Errorf("a constant in the design table or with advice:\n%s", out)
	}
	// 1e-17 m³/s = 1e-11 cm³/s; 10.1325 Pa m² V⁻² s⁻¹ = 1 atm cm² V⁻² s⁻¹ (unit arithmetic).
	for _, want := range []string{"1e-11 cm³/s", "1 atm cm² V⁻² s⁻¹"} {
		if !strings.Contains(constants, want) {
			t.Errorf("constants table lacks %q:\n%s", want, constants)
		}
	}
}
