package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// gaussian samples exp(−(t−t0)²/2σ²) at the ends of n steps of dt.
func gaussian(n int, dt, t0, sigma float64) []float64 {
	p := make([]float64, n)
	for k := range p {
		x := (float64(k+1)*dt - t0) / sigma
		p[k] = math.Exp(-0.5 * x * x)
	}
	return p
}

// TestHalfMaximumWidth: the half-maximum width of a sampled Gaussian is 2·sqrt(2 ln 2)·σ
// (analytic) within 0.1 %; two spikes whose envelope stays above half maximum count as one
// pulse, from the first rise to the last fall (the FWHM a photodiode shows of the envelope).
func TestHalfMaximumWidth(t *testing.T) {
	t.Parallel()
	dt, sigma := 1e-12, 0.5e-9
	p := gaussian(4000, dt, 2e-9, sigma)
	pk, kp := peak(p)
	a, b := crossings(p, kp, 0.5*pk)
	if want := 2 * math.Sqrt(2*math.Ln2) * sigma; !scalar.EqualWithinAbsOrRel((b-a)*dt, want, 0, 1e-3) {
		t.Errorf("Gaussian: half-maximum width %.5g s, want %.5g s", (b-a)*dt, want)
	}
	// Two equal Gaussians 1 ns apart: each half max ±0.589 ns about its centre, the dip
	// between them at 2·exp(−0.5·(0.5/0.5)²) = 1.21 of one peak (above half of the sum's
	// peak), so the width is 1 ns + 2·0.589 ns = 2.177 ns (analytic, within 0.5 %).
	q := gaussian(6000, dt, 2e-9, sigma)
	for k, v := range gaussian(6000, dt, 3e-9, sigma) {
		q[k] += v
	}
	pk, kp = peak(q)
	a, b = crossings(q, kp, 0.5*pk)
	half := func(x float64) float64 { // the sum at x ns from the first centre, over its peak
		g := func(y float64) float64 { return math.Exp(-0.5 * y * y / 0.25) }
		return (g(x) + g(x-1)) / (g(0.5) + g(-0.5))
	}
	// Outer half-maximum point: solve half(x) = 0.5 for x < 0 by bisection.
	lo, hi := -2.0, 0.0
	for range 60 {
		m := 0.5 * (lo + hi)
		if half(m) < 0.5 {
			lo = m
		} else {
			hi = m
		}
	}
	want := (1 - 2*lo) * 1e-9
	if !scalar.EqualWithinAbsOrRel((b-a)*dt, want, 0, 5e-3) {
		t.Errorf("two spikes: width %.5g s, want the envelope's %.5g s", (b-a)*dt, want)
	}
}

// TestDetectorResponse: a single-pole detector keeps the energy of a pulse (∫y = ∫p once the
// response has decayed, to 1e-9), answers a step with 1 − e^(−t/τ) (exact for a step held over
// each sample, to 1e-12), and widens a pulse.
func TestDetectorResponse(t *testing.T) {
	t.Parallel()
	dt, tau := 1e-12, 0.3e-9
	step := make([]float64, 1000)
	for k := range step {
		step[k] = 1
	}
	y := detected(step, dt, tau)
	for _, k := range []int{0, 99, 299, 999} {
		want := 1 - math.Exp(-float64(k+1)*dt/tau)
		if !scalar.EqualWithinAbsOrRel(y[k], want, 1e-12, 1e-12) {
			t.Errorf("step response at %d: %.12g, want %.12g", k, y[k], want)
		}
	}
	p := gaussian(20000, dt, 2e-9, 0.5e-9)
	y = detected(p, dt, tau)
	var ep, ey float64
	for k := range p {
		ep += p[k]
		ey += y[k]
	}
	if !scalar.EqualWithinAbsOrRel(ey, ep, 0, 1e-9) {
		t.Errorf("energy through the detector %.12g, want %.12g", ey, ep)
	}
}

// TestFWHMIssue16 (issue 16 case 4): before, fwhm_s was 2·sqrt(2 ln 2) × the rms width
// (1.975 ns on the example, where the trace's half-maximum width was 1.52 ns). Now fwhm_s is
// the half-maximum width (equal to half_max_width_s with an ideal detector), the rms-based
// width is rms_fwhm_s, and a detector of 1 ns widens the FWHM.
func TestFWHMIssue16(t *testing.T) {
	t.Parallel()
	r, err := Run(design.ExampleDesign(), &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	t.Logf("example: fwhm %.4g ns, rms-based %.4g ns", 1e9*s.FWHM, 1e9*s.RMSWidth)
	if s.FWHM != s.HalfMaxWidth || s.DetectorResponse != 0 {
		t.Errorf("fwhm %g s, half-max width %g s, detector %g s: want equal widths, ideal detector", s.FWHM, s.HalfMaxWidth, s.DetectorResponse)
	}
	// The two widths are different measures: on the example they differed by 30 % at the time
	// of the change, by 1.6 % after issue 15's C(v=1) and electron collisions reshaped the
	// pulse, by 0.3 % once B(0) took the electrons' C(0) → B(0) flow; the low-pressure tube's
	// long tail keeps them far apart (half-maximum 5.1 ns, rms-based 12 ns).
	dt, err := design.LoadDesign("testdata/tube.toml")
	if err != nil {
		t.Fatal(err)
	}
	rt, err := Run(dt, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if st := rt.Summary; !(st.RMSWidth > 0) || math.Abs(st.RMSWidth/st.FWHM-1) < 0.5 {
		t.Errorf("tube: rms-based width %g s within 50 %% of the FWHM %g s: the two no longer differ", st.RMSWidth, st.FWHM)
	}
	rd, err := Run(design.ExampleDesign(), &RunSettings{Light: true, DetectorResponse: 1e-9})
	if err != nil {
		t.Fatal(err)
	}
	if d := rd.Summary; d.FWHM <= s.FWHM || d.HalfMaxWidth != s.HalfMaxWidth || d.DetectorResponse != 1e-9 || d.EnergyTotal != s.EnergyTotal {
		t.Errorf("1 ns detector: fwhm %g s (ideal %g s), half-max %g s, energy %g J (%g J)", d.FWHM, s.FWHM, d.HalfMaxWidth, d.EnergyTotal, s.EnergyTotal)
	}
}
