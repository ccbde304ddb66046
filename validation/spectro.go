package validation

import (
	"math"

	"n2pulse/kinetics/spectro"
	"n2pulse/units"
)

func init() {
	Register("spectro", spectroChecks)
}

// spectroChecks compare package spectro with published and analytic values.
func spectroChecks() ([]Check, error) {
	m, err := spectro.DefaultModel()
	if err != nil {
		return nil, err
	}
	return append(bandChecks(m), lineChecks(m)...), nil
}

// bandChecks compare the band structure of C→B with published values: band heads and origin,
// Franck–Condon factors and their completeness, the radiative lifetime of C(0), and the
// radial solver against Morse levels.
func bandChecks(m *spectro.Model) []Check {
	var cs []Check
	// Band heads in standard air.
	heads := []struct {
		vu, vl   int
		ref, tol float64
	}{{0, 0, 337.13, 0.05}, {0, 1, 357.69, 0.1}, {0, 2, 380.49, 0.1}, {1, 0, 315.93, 0.1}}
	for _, h := range heads {
		l, err := m.Head(h.vu, h.vl)
		c := Check{
			ID: "spectro.head." + itoa(h.vu) + itoa(h.vl), Quantity: "C→B (" + itoa(h.vu) + "," + itoa(h.vl) + ") band head, standard air",
			Unit: "nm", Computed: l.AirWavelength * 1e9, Reference: h.ref, Tolerance: h.tol, Mode: Absolute,
			Kind:   FromMemory,
			Source: "Pearse & Gaydon, The Identification of Molecular Spectra, 4th ed. (1976); values from memory (physics-data.md §1d)",
			Err:    err,
		}
		cs = append(cs, c)
	}
	c0 := m.Constants.States["C"]
	b0 := m.Constants.States["B"]
	cs = append(cs, Check{
		ID: "spectro.origin.00", Quantity: "C→B (0,0) band origin from the Laher–Gilmore constants", Unit: "cm⁻¹",
		Computed: spectro.BandOrigin(c0, 0, b0, 0), Reference: 29671.03, Tolerance: 0.3, Mode: Absolute, Kind: Published,
		Source: "ν₀₀ = 29671.03 cm⁻¹ as given in a published N₂ spectrum-fit code (physics-data.md §1b, seen there)",
	})
	// Franck–Condon factors.
	fcf := []struct {
		vl   int
		ref  float64
		kind Kind
		src  string
	}{
		{0, 0.4527, Published, "(0,0) intensity factor of a published N₂ spectrum-fit code (physics-data.md §2a, seen); primary Gilmore, Laher & Espy, J. Phys. Chem. Ref. Data 21, 1005 (1992)"},
		{1, 0.3291, FromMemory, "Gilmore, Laher & Espy, J. Phys. Chem. Ref. Data 21, 1005 (1992), from memory (physics-data.md §2a)"},
		{2, 0.1462, FromMemory, "Gilmore, Laher & Espy, J. Phys. Chem. Ref. Data 21, 1005 (1992), from memory (physics-data.md §2a)"},
	}
	for _, f := range fcf {
		q, _, err := m.FranckCondon("C", 0, "B", f.vl)
		cs = append(cs, Check{
			ID: "spectro.fcf.0" + itoa(f.vl), Quantity: "Franck–Condon factor q(0," + itoa(f.vl) + ") of C→B", Unit: "",
			Computed: q, Reference: f.ref, Tolerance: 0.02, Mode: Absolute, Kind: f.kind, Source: f.src, Err: err,
		})
	}
	sum := 0.0
	for v := 0; v < 30; v++ {
		q, _, _ := m.FranckCondon("C", 0, "B", v)
		sum += q
	}
	cs = append(cs, Check{
		ID: "spectro.fcf.sum", Quantity: "Σ_v″ q(0,v″) of C→B (completeness)", Computed: sum, Reference: 1,
		Tolerance: 1e-6, Mode: Absolute, Kind: Analytic, Source: "completeness of the B-state eigenbasis (analytic)",
	})
	// Lifetime of C(0).
	tau, err := m.Lifetime(0)
	cs = append(cs, Check{
		ID: "spectro.tau.C0", Quantity: "radiative lifetime of C³Πu(v=0) from Σ A(0,v″)", Unit: "ns",
		Computed: tau * 1e9, Reference: 40.8, Low: 0.9 * 36, High: 1.1 * 42, Mode: Range, Kind: Published,
		Source: "measured/recommended 36–42 ns: 40.8 ns Capitelli et al., Plasma Kinetics in Atmospheric Gases (2000) p. 157 (seen via mechanism files); 42 ± 2 ns Pancheshnyi et al., Chem. Phys. Lett. 294, 523 (1998) (from memory); ±10 %",
		Err:    err,
	})
	// Morse levels against the analytic formula.
	mu := m.Constants.ReducedMass()
	lv, err := spectro.SolveRadial(spectro.Morse(c0, mu), mu, spectro.DefaultGrid, spectro.SincDVR, 6)
	worst := math.NaN()
	if err == nil {
		worst = 0
		for v := 0; v <= 5; v++ {
			x := float64(v) + 0.5
			worst = math.Max(worst, math.Abs(lv.Energy[v]-(c0.We*x-c0.WeXe*x*x)))
		}
	}
	cs = append(cs, Check{
		ID: "spectro.morse.levels", Quantity: "largest |E_grid − E_Morse| for C-state Morse levels v ≤ 5", Unit: "cm⁻¹",
		Computed: worst, Reference: 0, Tolerance: 1e-3, Mode: Absolute, Kind: Analytic,
		Source: "Morse levels ωe(v+½) − ωexe(v+½)² (P.M. Morse, Phys. Rev. 34, 57, 1929)", Err: err,
	})
	return cs
}

// lineChecks compare the line shape, the dispersion of air and the line cross section with
// analytic and published values.
func lineChecks(m *spectro.Model) []Check {
	var cs []Check
	cs = append(cs, Check{
		ID: "spectro.doppler.300K", Quantity: "Doppler FWHM of the 337.03 nm line at 300 K", Unit: "GHz",
		Computed: spectro.DopplerFWHM(units.SpeedOfLight/337.03e-9, 300, units.NitrogenMass) / 1e9, Reference: 2.084,
		Tolerance: 0.001, Mode: Absolute, Kind: Analytic,
		Source: "Δν_D = (ν₀/c)√(8kT ln2/m), M = 28.0134 u (physics-data.md §6, derived)",
	})
	w := spectro.Faddeeva(1 + 1i)
	cs = append(cs, Check{
		ID: "spectro.faddeeva.1+i", Quantity: "Re w(1+i), Weideman N=32", Computed: real(w), Reference: 0.30474420525691259,
		Tolerance: 1e-9, Mode: Relative, Kind: FromMemory, Source: "value of w(1+i) = 0.304744205256913 + 0.208218938202832i, from memory",
	})
	cs = append(cs, Check{
		ID: "spectro.faddeeva.i", Quantity: "w(i) against e^(y²)erfc(y) at y = 1", Computed: real(spectro.Faddeeva(1i)),
		Reference: math.Exp(1) * math.Erfc(1), Tolerance: 1e-10, Mode: Relative, Kind: Analytic,
		Source: "w(iy) = e^(y²)erfc(y) (Abramowitz & Stegun 7.1.3)",
	})
	lvac := 337.227e-9
	cs = append(cs, Check{
		ID: "spectro.air.n337", Quantity: "n − 1 of standard air at 337.23 nm (vacuum), Ciddor", Unit: "1e-4",
		Computed: (spectro.AirIndexCiddor(lvac) - 1) * 1e4, Reference: (spectro.AirIndexBirchDowns(lvac) - 1) * 1e4,
		Tolerance: 2e-4, Mode: Absolute, Kind: Published,
		Source: "Birch & Downs, Metrologia 31, 315 (1994) formula; agreement with Ciddor, Appl. Opt. 35, 1566 (1996) to 2e−8 (physics-data.md §7)",
	})
	sig := math.NaN()
	gl, err := m.GainLines(0, 0, units.Atmosphere, 300)
	if err == nil {
		sig = gl[0].PeakSigma
	}
	cs = append(cs, Check{
		ID: "spectro.sigma.line.1atm", Quantity: "peak cross section of the strongest (0,0) line at 1 atm, 300 K", Unit: "m²",
		Computed: sig, Reference: 6e-18, Low: 1e-18, High: 1e-17, Mode: Range, Kind: FromMemory,
		Source: "order 1e−18…1e−17 m²: 6e−18 m² derived for a 3 GHz collision width with A_line ≈ 6.5e6 s⁻¹ (physics-data.md §6; the A value from memory)",
		Err:    err,
	})
	return cs
}

func itoa(i int) string { return string(rune('0' + i)) }
