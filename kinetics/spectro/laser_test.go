package spectro

import (
	"math"
	"strings"
	"testing"

	"n2pulse/units"
)

// The lasing line and its cross section at 1 atm, 300 K. The single-line peak cross section must
// be of order 1e−18…1e−17 m² (1e−14…1e−13 cm²; physics-data.md §6, derived there for Doppler and
// 3–10 GHz collision widths) and the line must be a P-branch line of the (0,0) band within the
// band's first 0.1 nm from the head at 337.13 nm (Pearse & Gaydon 1976, from memory).
func TestLaserOneAtmosphere(t *testing.T) {
	t.Parallel()
	lp, err := Laser(units.Atmosphere, 300)
	if err != nil {
		t.Fatal(err)
	}
	m := testModel(t)
	gl, err := m.GainLines(0, 0, units.Atmosphere, 300)
	if err != nil {
		t.Fatal(err)
	}
	best := gl[0]
	if best.PeakSigma < 1e-18 || best.PeakSigma > 1e-17 {
		t.Errorf("line σ = %.3g m², want 1e−18…1e−17", best.PeakSigma)
	}
	if best.Branch != P {
		t.Errorf("strongest line %v(%d), want a P line", best.Branch, best.JLower)
	}
	if lp.CrossSection != best.Effective || lp.DegeneracyRatio != best.EffectiveRatio {
		t.Errorf("Laser and GainLines disagree: %+v vs %+v", lp, best)
	}
	if d := lp.AirWavelength*1e9 - 337.13; d > 0 || d < -0.1 {
		t.Errorf("lasing line at %.4f nm air, want within 0.1 nm blue of 337.13", lp.AirWavelength*1e9)
	}
	// effective σ = line σ × upper share (definition, DESIGN.md §2.4)
	if r := lp.CrossSection / (best.PeakSigma * best.UpperShare); math.Abs(r-1) > 1e-12 {
		t.Errorf("σ_eff/(σ_line·s_C) = %g", r)
	}
	// photon energy hc/λ: 3.677 eV at 337.13 nm air (physics-data.md §6, derived)
	if e := lp.PhotonEnergy / units.ElectronVolt; math.Abs(e-3.677) > 0.002 {
		t.Errorf("photon energy %.4f eV, want 3.677 ± 0.002", e)
	}
	// f_C > f_B: electron impact from X0 favours C(0) (about 10:1 in C:B excitation into v=0 is
	// quoted; physics-data.md §6 context, seen on an overview page) — ratio between 3 and 30.
	if r := lp.UpperShare / lp.LowerShare; r < 3 || r > 30 {
		t.Errorf("f_C/f_B = %.2f, want 3…30", r)
	}
	if lp.LineWidth < best.DopplerFWHM || lp.LineWidth > best.DopplerFWHM+best.CollisionFWHM {
		t.Errorf("line width %g outside [Doppler, Doppler+collision]", lp.LineWidth)
	}
}

// Pressure dependence: at low pressure the width tends to the Doppler width and σ rises; the
// effective ratio does not depend on pressure (analytic properties of the model).
func TestLaserPressure(t *testing.T) {
	t.Parallel()
	lo, err := Laser(10, 300)
	if err != nil {
		t.Fatal(err)
	}
	hi, err := Laser(units.Atmosphere, 300)
	if err != nil {
		t.Fatal(err)
	}
	nu := units.SpeedOfLight / lo.VacuumWavelength
	if d := DopplerFWHM(nu, 300, units.NitrogenMass); math.Abs(lo.LineWidth-d) > 1e-3*d {
		t.Errorf("width at 10 Pa %g, Doppler %g", lo.LineWidth, d)
	}
	if lo.CrossSection <= hi.CrossSection {
		t.Errorf("σ(10 Pa) = %g not above σ(1 atm) = %g", lo.CrossSection, hi.CrossSection)
	}
}

func TestLaserErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		p, T  float64
		field string
	}{{-1, 300, "pressure"}, {1e5, 0, "temperature"}, {math.NaN(), 300, "pressure"}, {1e5, 1e5, "temperature"}} {
		_, err := Laser(c.p, c.T)
		if err == nil || !strings.Contains(err.Error(), c.field) || !strings.HasPrefix(err.Error(), "spectro: ") {
			t.Errorf("Laser(%g, %g): error %v, want one naming %s", c.p, c.T, err, c.field)
		}
	}
}

func BenchmarkLaser(b *testing.B) {
	if _, err := Laser(units.Atmosphere, 300); err != nil { // build the cache outside the timing
		b.Fatal(err)
	}
	b.ResetTimer()
	for b.Loop() {
		if _, err := Laser(units.Atmosphere, 300); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "calls/s")
}

func BenchmarkModel(b *testing.B) {
	c, err := Default()
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := NewModel(c, DefaultGrid, RKRCurve); err != nil {
			b.Fatal(err)
		}
	}
}

// The fast search in Laser picks the same line as the fully sorted table (consistency of the two
// code paths) over the accepted range of pressure and temperature.
func TestLaserMatchesTable(t *testing.T) {
	t.Parallel()
	m := testModel(t)
	for _, p := range []float64{1, 100, 1e4, units.Atmosphere, 1e6} {
		for _, T := range []float64{77, 300, 600, 1500} {
			lp, err := Laser(p, T)
			if err != nil {
				t.Fatal(err)
			}
			gl, err := m.GainLines(0, 0, p, T)
			if err != nil {
				t.Fatal(err)
			}
			if lp.CrossSection != gl[0].Effective || lp.LineWidth != gl[0].FWHM {
				t.Errorf("p=%g T=%g: Laser σ %g width %g, table %v(%d) σ %g width %g", p, T,
					lp.CrossSection, lp.LineWidth, gl[0].Branch, gl[0].JLower, gl[0].Effective, gl[0].FWHM)
			}
		}
	}
}

// The gain-spectrum peak with overlapping lines summed is never below the strongest single line
// (a sum of non-negative terms, analytic); at 100 Pa, where the head lines (3–5 GHz apart) are
// resolved by the 2.1 GHz Doppler width, it equals the single line within 1 %; at 1 atm the
// neighbours add (analytic consequence of the line spacing and the width).
func TestGainPeak(t *testing.T) {
	t.Parallel()
	m := testModel(t)
	for _, p := range []float64{100, 1e4, units.Atmosphere, 3e5} {
		g, err := m.GainPeak(0, 0, p, 300)
		if err != nil {
			t.Fatal(err)
		}
		if g.Enhancement < 1 {
			t.Errorf("p=%g: enhancement %g < 1", p, g.Enhancement)
		}
		if p == 100 && math.Abs(g.Enhancement-1) > 0.01 {
			t.Errorf("p=100 Pa: enhancement %g, want 1 ± 0.01", g.Enhancement)
		}
		if p == units.Atmosphere && (g.Enhancement < 1.05 || g.Lines < 2) {
			t.Errorf("1 atm: enhancement %g with %d lines, want > 1.05 and ≥ 2 lines", g.Enhancement, g.Lines)
		}
		if g.DegeneracyRatio < 0.5 || g.DegeneracyRatio > 1.5 {
			t.Errorf("p=%g: blended g ratio %g", p, g.DegeneracyRatio)
		}
	}
}
