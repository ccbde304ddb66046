package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestHalfMaxGaussian: a sampled Gaussian's widths at 45 % and 55 % of its peak are
// 2σ·sqrt(2 ln(1/0.45)) and 2σ·sqrt(2 ln(1/0.55)) (analytic; 1.073 and 0.929 × FWHM) within
// 1e-3 (sampled at 1 ps against 1.2 ns); its edges never leap (jump exactly 0) and its FWHM is
// well-conditioned.
func TestHalfMaxGaussian(t *testing.T) {
	t.Parallel()
	dt, sigma := 1e-12, 0.5e-9
	p := gaussian(8000, dt, 3e-9, sigma)
	pk, kp := peak(p)
	h := halfMaxConditioning(p, kp, pk)
	low, high := 2*sigma*math.Sqrt(2*math.Log(1/0.45))/dt, 2*sigma*math.Sqrt(2*math.Log(1/0.55))/dt
	if !scalar.EqualWithinAbsOrRel(h.low, low, 0, 1e-3) || !scalar.EqualWithinAbsOrRel(h.high, high, 0, 1e-3) || h.jump != 0 {
		t.Errorf("Gaussian: widths %.6g, %.6g samples, jump %g; want %.6g, %.6g, 0", h.low, h.high, h.jump, low, high)
	}
	if h.illConditioned(fwhmOfSigma * sigma / dt) {
		t.Errorf("Gaussian: FWHM called ill-conditioned (%+v)", h)
	}
}

// sideSpike is a triangle of peak 1 at sample 20 (base 0…40) and a narrow triangle of peak
// height at sample 60 (base 55…65), zero elsewhere up to sample 80: every sample lies on a
// straight line, so every crossing is exact up to rounding.
func sideSpike(height float64) []float64 {
	p := make([]float64, 81)
	for i := range p {
		p[i] = max(0, 1-math.Abs(float64(i)-20)/20) + height*max(0, 1-math.Abs(float64(i)-60)/5)
	}
	return p
}

// TestHalfMaxSideSpike: a main pulse with a side spike whose top sits at exactly half the peak
// has an FWHM from sample 10 to the spike's top (60: 50 samples) that leaps back to the main
// pulse's fall (sample 30) for a level just above half: a jump of 30 samples, ill-conditioned.
// The widths at 45 % and 55 % are 9 → 60.5 (51.5) and 11 → 29 (18). A spike at 30 % of the
// peak leaps only at a level of 30 %, outside the band: FWHM 20, widths 22 and 18, not
// flagged. Spikes just inside the band's ends (45.1 %, 54.9 %) are flagged, just outside
// (44.9 %, 55.1 %) are not. All exact to 1e-9 (straight lines).
func TestHalfMaxSideSpike(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		height, fwhm, low, high, jump float64
		ill                           bool
	}{
		{0.5, 50, 51.5, 18, 30, true},
		{0.3, 20, 22, 18, 0, false},
		// 45.1 %: the FWHM is the main pulse's; at a level of 45.1 % the last fall is the
		// spike's top (60), just above it the main pulse's fall through 0.451 (30.98).
		{0.451, 20, 60 + 0.001/0.451*5 - 9, 18, 60 - 30.98, true},
		{0.449, 20, 22, 18, 0, false},
		// 54.9 %: the spike is inside the FWHM (its fall through half at 60 + 5·(0.049/0.549)).
		{0.549, 50 + 5*0.049/0.549, 60 + 5*0.099/0.549 - 9, 18, 60 - 29.02, true},
		{0.551, 50 + 5*0.051/0.551, 60 + 5*0.101/0.551 - 9, 60 + 5*0.001/0.551 - 11, 0, false},
	} {
		p := sideSpike(c.height)
		pk, kp := peak(p)
		a, b := crossings(p, kp, 0.5*pk)
		h := halfMaxConditioning(p, kp, pk)
		eq := func(x, y float64) bool { return scalar.EqualWithinAbsOrRel(x, y, 1e-9, 1e-9) }
		if !eq(b-a, c.fwhm) || !eq(h.low, c.low) || !eq(h.high, c.high) || !eq(h.jump, c.jump) || h.illConditioned(b-a) != c.ill {
			t.Errorf("side spike at %g: FWHM %.6g, widths %.6g / %.6g, jump %.6g, ill-conditioned %v; want %.6g, %.6g / %.6g, %.6g, %v",
				c.height, b-a, h.low, h.high, h.jump, h.illConditioned(b-a), c.fwhm, c.low, c.high, c.jump, c.ill)
		}
	}
}

// TestHalfMaxExponentialTail: a sudden rise and an exponential decay (time constant 1000
// samples) changes its width smoothly with the level: w(f) = 1000·ln(1/f) + 1 − f samples
// (the rise from sample 99 to 100 crossed at 99 + f), so the widths at 45 % and 55 % differ by
// 29 % of the FWHM with no leap. Not ill-conditioned: a rule on that difference alone at 25 %
// would flag the commonest pulse shape. Tolerance 1e-6 (linear interpolation of the decay
// between samples: (1/1000)²/8 relative).
func TestHalfMaxExponentialTail(t *testing.T) {
	t.Parallel()
	p := make([]float64, 3000)
	for i := 100; i < len(p); i++ {
		p[i] = math.Exp(-float64(i-100) / 1000)
	}
	pk, kp := peak(p)
	h := halfMaxConditioning(p, kp, pk)
	w := func(f float64) float64 { return 1000*math.Log(1/f) + 1 - f }
	if !scalar.EqualWithinAbsOrRel(h.low, w(0.45), 0, 1e-6) || !scalar.EqualWithinAbsOrRel(h.high, w(0.55), 0, 1e-6) || h.jump != 0 {
		t.Errorf("exponential: widths %.8g / %.8g, jump %g; want %.8g / %.8g, 0", h.low, h.high, h.jump, w(0.45), w(0.55))
	}
	if spread := (h.low - h.high) / w(0.5); !scalar.EqualWithinAbsOrRel(spread, 0.2896, 1e-3, 0) || h.illConditioned(w(0.5)) {
		t.Errorf("exponential: spread %.4g of the FWHM (want 0.2896), ill-conditioned %v (want false)", spread, h.illConditioned(w(0.5)))
	}
}

// TestHalfMaxShoulder: a pulse whose fall levels off into a shoulder just below half the peak
// (1 → 0.47 over 10 samples, then 0.47 → 0.43 over 40) has no leap, but its width grows from
// 17.49 samples at 55 % (11 → 20 + 0.45/0.053) to 41 at 45 % (9 → 50) against an FWHM of
// 19.43 (10 → 20 + 0.5/0.053): ill-conditioned by the spread (1.21 of the FWHM > SpreadLimit).
// Exact to 1e-9 (straight lines).
func TestHalfMaxShoulder(t *testing.T) {
	t.Parallel()
	var p []float64
	ramp := func(from, to float64, n int) {
		for i := range n {
			p = append(p, from+(to-from)*float64(i)/float64(n))
		}
	}
	ramp(0, 1, 20)
	ramp(1, 0.47, 10)
	ramp(0.47, 0.43, 40)
	ramp(0.43, 0, 10)
	p = append(p, 0)
	pk, kp := peak(p)
	a, b := crossings(p, kp, 0.5*pk)
	h := halfMaxConditioning(p, kp, pk)
	eq := func(x, y float64) bool { return scalar.EqualWithinAbsOrRel(x, y, 1e-9, 1e-9) }
	fwhm := 20 + 0.5/0.053 - 10
	if !eq(b-a, fwhm) || !eq(h.low, 41) || !eq(h.high, 20+0.45/0.053-11) || h.jump != 0 || !h.illConditioned(b-a) {
		t.Errorf("shoulder: FWHM %.8g, widths %.8g / %.8g, jump %g, ill-conditioned %v; want %.8g, 41 / %.8g, 0, true",
			b-a, h.low, h.high, h.jump, h.illConditioned(b-a), fwhm, 20+0.45/0.053-11)
	}
}

// TestHalfMaxRule: the rule's two limits on their own, FWHM 1: a leap of 0.11 with a spread of
// 0.3 is ill-conditioned, 0.09 is not (JumpLimit 0.1); a spread of 0.51 without a leap is, 0.49
// is not (SpreadLimit 0.5).
func TestHalfMaxRule(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		h   halfMax
		ill bool
	}{
		{halfMax{low: 1.15, high: 0.85, jump: 0.11}, true},
		{halfMax{low: 1.15, high: 0.85, jump: 0.09}, false},
		{halfMax{low: 1.26, high: 0.75}, true},
		{halfMax{low: 1.24, high: 0.75}, false},
	} {
		if got := c.h.illConditioned(1); got != c.ill {
			t.Errorf("%+v: ill-conditioned %v, want %v", c.h, got, c.ill)
		}
	}
}
