package kinetics

import (
	"math"
	"testing"

	"n2pulse/kinetics/design"
)

// TestRunConservation: on the example design the circuit's energy balance closes to 1e-4 of
// the stored energy and the photon balance to 1e-3 (conservation; the tolerances).
func TestRunConservation(t *testing.T) {
	t.Parallel()
	r, err := Run(design.ExampleDesign(), nil)
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	if s.EnergyBalanceResidual > 1e-4 {
		t.Errorf("energy balance residual %.2g", s.EnergyBalanceResidual)
	}
	if s.PhotonBalanceResidual > 1e-3 {
		t.Errorf("photon balance residual %.2g", s.PhotonBalanceResidual)
	}
	if s.EnergyTotal <= 0 || !s.Lases {
		t.Errorf("example design does not lase: %+v", s)
	}
	for i, x := range r.UpperLevel {
		if x < 0 || r.LowerLevel[i] < 0 {
			t.Fatalf("negative population at step %d", i)
		}
	}
}

// TestRunConvergence: refining the optical grid from N to 2N cells changes the energy by
// less than 1 % and the FWHM by less than 2 % on the example design (the criterion).
func TestRunConvergence(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	var e, w []float64
	for _, n := range []int{d.Numerics.Cells, 2 * d.Numerics.Cells} {
		d.Numerics.Cells = n
		r, err := Run(d, &RunSettings{Light: true})
		if err != nil {
			t.Fatal(err)
		}
		e = append(e, r.Summary.EnergyTotal)
		w = append(w, r.Summary.FWHM)
	}
	t.Logf("energy %.6g → %.6g J, FWHM %.6g → %.6g s", e[0], e[1], w[0], w[1])
	if d := math.Abs(e[1]/e[0] - 1); d > 0.01 {
		t.Errorf("energy changes by %.2f%% from N to 2N cells", 100*d)
	}
	if d := math.Abs(w[1]/w[0] - 1); d > 0.02 {
		t.Errorf("FWHM changes by %.2f%% from N to 2N cells", 100*d)
	}
}

// TestSternVolmer: with no pump and no photons, C(0) decays at 1/τ_C + k_q·N
// (Stern–Volmer). Reference: τ_C = 40.8 ns and k_q(N₂) = 1.0e-11 cm³/s give the quenching
// pressure p_q = k_B·T/(τ_C·k_q) = 74 Torr at 293 K (Capitelli et al. 2000 and Kossyi et al.
// 1992 as quoted in air-plasma mechanism files; p_q derived), so at 760 Torr
// τ_eff = τ_C/(1 + 760/74.5).
func TestSternVolmer(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	d.Gas.Temperature = 293
	d.Spectroscopy.UpperLifetime = 40.8e-9
	d.Spectroscopy.EinsteinA00 = 1e7
	par := faintParameters(t, d)
	n := d.Numerics.Cells
	steps := 3000
	wf := &waveforms{pumpC: make([]float64, steps), pumpB: make([]float64, steps), density: make([]float64, steps)}
	sh := newShot(d, &par, wf, steps, &RunSettings{})
	for i := range sh.med.c {
		sh.med.c[i] = 1e18
	}
	sh.run(&Result{})
	tEnd := float64(steps) * par.TimeStep
	got := -math.Log(sh.med.c[n/2]/1e18) / tEnd
	pq := 1.380649e-23 * 293 / (40.8e-9 * 1.0e-17) / (101325.0 / 760)
	want := (1 + 760/pq) / 40.8e-9
	if math.Abs(pq-74.5) > 0.5 {
		t.Errorf("quenching pressure %.2f Torr, want 74.5", pq)
	}
	if math.Abs(got/want-1) > 1e-6 {
		t.Errorf("C(0) decay rate %.6g s⁻¹, Stern–Volmer %.6g s⁻¹", got, want)
	}
}

// TestRunWarnsWhenCutShort: a run that ends mid-pulse says so.
func TestRunWarnsWhenCutShort(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	d.Numerics.EndTime = 12.5e-9
	r, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Warnings) == 0 {
		t.Fatalf("no warning for a run cut at 12.5 ns (delay %.3g s)", r.Summary.Delay)
	}
	full, err := Run(design.ExampleDesign(), &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(full.Warnings) != 0 {
		t.Errorf("warnings on the full example: %v", full.Warnings)
	}
}

// TestApertureSolidAngle: the on-axis solid angle of a disc, 2π(1 − L/√(L²+r²)) (textbook
// geometry), tends to A/L² far away and to 2π close up.
func TestApertureSolidAngle(t *testing.T) {
	t.Parallel()
	a := 4.5e-6
	if got, want := apertureSolidAngle(a, 0.2), a/0.04; math.Abs(got/want-1) > 1e-4 {
		t.Errorf("long channel: %g sr, want A/L² = %g sr", got, want)
	}
	if got := apertureSolidAngle(a, 1e-7); math.Abs(got-2*math.Pi) > 1e-3 {
		t.Errorf("short channel: %g sr, want 2π", got)
	}
	r := math.Sqrt(a / math.Pi)
	if got, want := apertureSolidAngle(a, r), 2*math.Pi*(1-1/math.Sqrt2); math.Abs(got-want) > 1e-12 {
		t.Errorf("L = r: %g sr, want %g", got, want)
	}
}

// faintParameters returns the laser parameters of d on its cell grid (one cell per optical
// time step) with an optical area so small that no photons to speak of are made: a shot that
// follows the level populations alone.
func faintParameters(t *testing.T, d *design.Design) Parameters {
	t.Helper()
	par, _, err := laserParameters(d)
	if err != nil {
		t.Fatal(err)
	}
	par.CellLength = d.Channel.Length / float64(d.Numerics.Cells)
	par.TimeStep = par.CellLength / 299792458.0
	par.OpticalArea = 1e-12
	return par
}
