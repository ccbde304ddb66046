package kinetics

import (
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// TestDepositionTime: a constant plasma power over steps 10…29 (dt = 1 ns) deposits 10 %
// of its energy at 12 ns and 90 % at 28 ns: 16 ns apart (hand calculation).
func TestDepositionTime(t *testing.T) {
	t.Parallel()
	wf := &waveforms{plasmaPower: make([]float64, 50)}
	for k := 10; k < 30; k++ {
		wf.plasmaPower[k] = 2
		wf.plasmaSampled += 2 * 1e-9
	}
	if got := depositionTime(wf, 1e-9); !scalar.EqualWithinAbsOrRel(got, 16e-9, 1e-18, 1e-9) {
		t.Errorf("deposition time %g s, want 16 ns", got)
	}
	if got := depositionTime(&waveforms{}, 1e-9); got != 0 {
		t.Errorf("no deposition: %g s, want 0", got)
	}
}

// TestRegimeChecks: a shot at 2.5 eV per molecule and n_e/N = 7e-4 (the loading of the
// 11 mm Blumlein experiment case) is outside the uniform-glow regime on both counts; one at
// 0.1 eV and 5e-5 (the 8.8 cm charge-transfer cases) is inside; at 1 atm the constriction
// time is the estimate's 100 ns, at 2 atm half of it (scaled as 1/N).
func TestRegimeChecks(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	n := units.GasDensity(101325, 300)
	p := &Parameters{GasDensity: n, TimeStep: 1e-9}
	wf := &waveforms{plasmaPower: []float64{1, 1, 1, 1, 1, 1, 1, 1, 1, 1}, plasmaSampled: 10e-9}
	for _, c := range []struct {
		eV, degree float64
		outside    []string
	}{
		{2.5, 7e-4, []string{"ionisation degree n_e/N", "energy per molecule"}},
		{0.1, 5e-5, nil},
	} {
		s := &Summary{EnergyPerMolecule: c.eV, PeakElectronDensity: c.degree * n}
		checks := regimeChecks(d, p, wf, s)
		var got []string
		for _, ch := range checks {
			if ch.Outside {
				got = append(got, ch.Name)
			}
			if !(ch.Low <= ch.Limit && ch.Limit <= ch.High) || ch.Source == "" {
				t.Errorf("%s: limit %g outside its range %g–%g or no source", ch.Name, ch.Limit, ch.Low, ch.High)
			}
		}
		if strings.Join(got, ",") != strings.Join(c.outside, ",") {
			t.Errorf("%.2g eV, n_e/N %.2g: outside %v, want %v", c.eV, c.degree, got, c.outside)
		}
		note := regimeNote(checks)
		if (note == "") != (c.outside == nil) || (note != "" && !strings.HasSuffix(note, "the prediction is an upper bound")) {
			t.Errorf("%.2g eV: note %q", c.eV, note)
		}
		if tc := checks[3].Limit; !scalar.EqualWithinAbsOrRel(tc, 100e-9*units.GasDensity(101325, 300)/n, 0, 1e-12) {
			t.Errorf("constriction time %g s at 1 atm, want 100 ns", tc)
		}
	}
	p.GasDensity = 2 * n
	if tc := regimeChecks(d, p, wf, &Summary{})[3].Limit; !scalar.EqualWithinAbsOrRel(tc, 50e-9, 0, 1e-12) {
		t.Errorf("constriction time %g s at 2 atm, want 50 ns", tc)
	}
}

// TestRegimeInRun: the example design keeps every limit; with a preionisation of 1e3 cm⁻³,
// below the ~1e4 cm⁻³ of Palmer, Appl. Phys. Lett. 25, 138 (1974), the run says it is
// outside the uniform-glow regime, in the flag and the verdict.
func TestRegimeInRun(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	r, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if !r.Summary.UniformGlow || len(r.Summary.Regime) != 4 || strings.Contains(r.Summary.Verdict, "uniform-glow") {
		t.Errorf("example design: uniform %v, verdict %q, checks %+v", r.Summary.UniformGlow, r.Summary.Verdict, r.Summary.Regime)
	}
	d.Discharge.SeedDensity = 1e9
	r, err = Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.Summary.UniformGlow || !strings.Contains(r.Summary.Verdict, "outside the uniform-glow regime (preionisation 10× below the limit)") {
		t.Errorf("seed 1e3 cm⁻³: uniform %v, verdict %q", r.Summary.UniformGlow, r.Summary.Verdict)
	}
}
