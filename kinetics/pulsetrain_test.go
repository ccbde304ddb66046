package kinetics

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
)

// fwhmOfSigma is the half-maximum width of a Gaussian of rms width 1 (analytic).
var fwhmOfSigma = 2 * math.Sqrt(2*math.Ln2)

// bisect returns x in [lo, hi] where f changes sign (f(lo) and f(hi) of opposite signs).
func bisect(f func(float64) float64, lo, hi float64) float64 {
	flo := f(lo)
	for range 200 {
		m := 0.5 * (lo + hi)
		if (f(m) < 0) == (flo < 0) {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// TestSeparatePulsesGaussians: one Gaussian is one pulse whose widths are 2·sqrt(2 ln 2)·σ and
// whose half-maximum window holds erf(sqrt(ln 2)) = 0.7610 of the energy (analytic); two
// Gaussians 5 ns apart (peaks 1 and 0.8) are two pulses 5 ns apart, the strongest alone the
// width of one Gaussian, the FWHM from the first's rise to the second's fall. Tolerances: the
// widths 1e-3 relative (sampled at 1 ps against 1.18 ns), the separation one sample.
func TestSeparatePulsesGaussians(t *testing.T) {
	t.Parallel()
	dt, sigma := 1e-12, 0.5e-9
	p := gaussian(8000, dt, 3e-9, sigma)
	tr := separatePulses(p, make([]float64, len(p)), dt, 100)
	if tr.count != 1 || tr.separation != 0 {
		t.Errorf("one Gaussian: %d pulses %g s apart, want 1, 0", tr.count, tr.separation)
	}
	if want := fwhmOfSigma * sigma; !scalar.EqualWithinAbsOrRel(tr.strongestWidth, want, 0, 1e-3) {
		t.Errorf("one Gaussian: strongest width %.5g s, want %.5g s", tr.strongestWidth, want)
	}
	if want := math.Erf(math.Sqrt(math.Ln2)); !scalar.EqualWithinAbsOrRel(tr.energyShare, want, 0, 1e-3) {
		t.Errorf("one Gaussian: energy share %.5g, want %.5g", tr.energyShare, want)
	}

	q := gaussian(14000, dt, 3e-9, sigma)
	for k, v := range gaussian(14000, dt, 8e-9, sigma) {
		q[k] += 0.8 * v
	}
	tr = separatePulses(q, make([]float64, len(q)), dt, 100)
	if tr.count != 2 || !scalar.EqualWithinAbsOrRel(tr.separation, 5e-9, dt, 0) {
		t.Errorf("two Gaussians: %d pulses %.5g s apart, want 2, 5 ns", tr.count, tr.separation)
	}
	if want := fwhmOfSigma * sigma; !scalar.EqualWithinAbsOrRel(tr.strongestWidth, want, 0, 1e-3) {
		t.Errorf("two Gaussians: strongest width %.5g s, want %.5g s", tr.strongestWidth, want)
	}
	if tr.riseSpans {
		t.Errorf("two Gaussians, the first the highest: the rise is said to span them")
	}
	pk, kp := peak(q)
	a, b := crossings(q, kp, 0.5*pk)
	// The second reaches half of the first's peak where 0.8·exp(−x²/2σ²) = 0.5.
	want := 5e-9 + 0.5*fwhmOfSigma*sigma + sigma*math.Sqrt(2*math.Log(0.8/0.5))
	if !scalar.EqualWithinAbsOrRel((b-a)*dt, want, 0, 1e-3) {
		t.Errorf("two Gaussians: FWHM %.5g s, want %.5g s", (b-a)*dt, want)
	}
}

// TestSeparatePulsesRiseSpans: when the first of two pulses stays below 90 % of the second,
// a 10–90 % rise read off the whole trace spans them and the train says so; when the first is
// the higher, it does not.
func TestSeparatePulsesRiseSpans(t *testing.T) {
	t.Parallel()
	dt, sigma := 1e-12, 0.5e-9
	for _, c := range []struct {
		first float64
		spans bool
	}{{0.8, true}, {0.95, false}} {
		q := gaussian(14000, dt, 3e-9, sigma)
		for k, v := range gaussian(14000, dt, 8e-9, sigma) {
			q[k] = c.first*q[k] + v
		}
		tr := separatePulses(q, make([]float64, len(q)), dt, 100)
		if tr.count != 2 || tr.riseSpans != c.spans {
			t.Errorf("first pulse %.2g of the second: %d pulses, rise spans %v; want 2, %v", c.first, tr.count, tr.riseSpans, c.spans)
		}
	}
}

// TestSeparatePulsesSpikeTrain: spikes one period apart that fall to zero between them
// (cos² modulation of period T under a Gaussian envelope) are one pulse when the mean is
// taken over one period, and many without it (window 1); the FWHM still spans the spikes.
func TestSeparatePulsesSpikeTrain(t *testing.T) {
	t.Parallel()
	dt, period := 1e-12, 0.8e-9
	p := gaussian(12000, dt, 6e-9, 2e-9)
	for k := range p {
		c := math.Cos(math.Pi * float64(k+1) * dt / period)
		p[k] *= c * c
	}
	if tr := separatePulses(p, make([]float64, len(p)), dt, int(math.Round(period/dt))); tr.count != 1 {
		t.Errorf("spike train over one period: %d pulses, want 1", tr.count)
	}
	if tr := separatePulses(p, make([]float64, len(p)), dt, 1); tr.count < 5 {
		t.Errorf("spike train, no mean: %d pulses, want each spike above half (≥ 5)", tr.count)
	}
}

// TestSeparatePulsesSpikeOnTail: a Gaussian spike (σ = 0.2 ns, peak 1) on an exponential tail
// (0.4·e^(−t/10 ns) from the spike's centre) is one pulse; its half-maximum width is the
// spike's (the crossings solved by bisection) and the window holds the share of the energy
// computed from erf and the exponential's integral (analytic), both within 1e-3.
func TestSeparatePulsesSpikeOnTail(t *testing.T) {
	t.Parallel()
	dt, sigma, tau, t0 := 1e-12, 0.2e-9, 10e-9, 2e-9
	shape := func(x float64) float64 { // x: time from the spike's centre
		v := math.Exp(-0.5 * x * x / (sigma * sigma))
		if x >= 0 {
			v += 0.4 * math.Exp(-x/tau)
		}
		return v
	}
	p := make([]float64, 100000)
	for k := range p {
		p[k] = shape(float64(k+1)*dt - t0)
	}
	tr := separatePulses(p, make([]float64, len(p)), dt, 100)
	if tr.count != 1 {
		t.Errorf("spike on a tail: %d pulses, want 1", tr.count)
	}
	half := 0.5 * shape(0)
	a := bisect(func(x float64) float64 { return shape(x) - half }, -1e-9, 0)
	b := bisect(func(x float64) float64 { return shape(x) - half }, 0, 2e-9)
	if !scalar.EqualWithinAbsOrRel(tr.strongestWidth, b-a, 0, 1e-3) {
		t.Errorf("spike on a tail: width %.5g s, want the spike's %.5g s", tr.strongestWidth, b-a)
	}
	end := float64(len(p))*dt - t0
	phi := func(x float64) float64 { return 0.5 * math.Erfc(-x/(sigma*math.Sqrt2)) }
	tail := func(x float64) float64 { return 0.4 * tau * (1 - math.Exp(-x/tau)) } // ∫₀ˣ 0.4 e^(−s/τ) ds
	spike := sigma * math.Sqrt(2*math.Pi)
	want := (spike*(phi(b)-phi(a)) + tail(b)) / (spike*phi(end) + tail(end))
	if !scalar.EqualWithinAbsOrRel(tr.energyShare, want, 0, 1e-3) {
		t.Errorf("spike on a tail: energy share %.5g, want %.5g", tr.energyShare, want)
	}
}

// TestSeparatePulsesDipThreshold: two triangles (peaks 1 and 0.8, samples on straight lines,
// no mean) are two pulses when the valley between them is just below DipLevel of the peak and
// one just above; the separation is the 200 samples between the peaks, and the widths are
// those of straight lines crossing half (exact up to rounding).
func TestSeparatePulsesDipThreshold(t *testing.T) {
	t.Parallel()
	dt := 1e-12
	trace := func(valley float64) []float64 {
		var p []float64
		ramp := func(from, to float64) {
			for i := range 100 {
				p = append(p, from+(to-from)*float64(i)/100)
			}
		}
		ramp(0, 1)
		ramp(1, valley)
		ramp(valley, 0.8)
		ramp(0.8, 0)
		return append(p, 0)
	}
	for _, c := range []struct {
		valley float64
		count  int
	}{{DipLevel * (1 - 1e-3), 2}, {DipLevel * (1 + 1e-3), 1}} {
		p := trace(c.valley)
		tr := separatePulses(p, make([]float64, len(p)), dt, 1)
		if tr.count != c.count {
			t.Errorf("valley %.5g: %d pulses, want %d", c.valley, tr.count, c.count)
		}
		// The first triangle crosses half at sample 50 and, falling from 1 to the valley,
		// at 100 + 50/(1 − valley); the second falls through half at 300 + 100·(0.3/0.8).
		first := (100 + 50/(1-c.valley) - 50) * dt
		whole := (300 + 100*0.3/0.8 - 50) * dt
		want, sep := whole, 0.0
		if c.count == 2 {
			want, sep = first, 200*dt
		}
		if !scalar.EqualWithinAbsOrRel(tr.strongestWidth, want, 1e-9*dt, 1e-9) || !scalar.EqualWithinAbsOrRel(tr.separation, sep, 1e-9*dt, 1e-9) {
			t.Errorf("valley %.5g: strongest width %.6g s, separation %.6g s; want %.6g s, %.6g s", c.valley, tr.strongestWidth, tr.separation, want, sep)
		}
	}
	if tr := separatePulses(make([]float64, 10), make([]float64, 10), dt, 4); tr != (pulseTrain{}) {
		t.Errorf("dark trace: %+v, want no pulse", tr)
	}
}

// TestRunningMeanConserves: the running mean keeps the sum of a trace that is zero within
// half a window of both ends (to 1e-12 relative) and is the trace itself on a constant
// stretch a window away from its edges (to 1e-12).
func TestRunningMeanConserves(t *testing.T) {
	t.Parallel()
	p := make([]float64, 1000)
	for k := 300; k < 700; k++ {
		p[k] = 2 + math.Sin(float64(k))*float64(k%7)
	}
	for k := 450; k < 550; k++ {
		p[k] = 3
	}
	for _, w := range []int{2, 7, 40} {
		m := runningMean(make([]float64, len(p)), p, w)
		var sp, sm float64
		for k := range p {
			sp, sm = sp+p[k], sm+m[k]
		}
		if !scalar.EqualWithinAbsOrRel(sm, sp, 0, 1e-12) {
			t.Errorf("window %d: Σ mean %.15g, Σ trace %.15g", w, sm, sp)
		}
		if w <= 40 && !scalar.EqualWithinAbsOrRel(m[500], 3, 1e-12, 0) {
			t.Errorf("window %d: mean on the flat stretch %.15g, want 3", w, m[500])
		}
	}
}

// TestTubeTwoPulses: the reduced-pressure tube design at 20 Torr lases twice, once on the
// peaking capacitor's current and once on the storage capacitor's when the switch finishes
// closing; the summary counts two pulses about 23 ns apart, the strongest alone ≈ 7.2 ns
// against the ≈ 29 ns FWHM that spans both, and the verdict says so; at its own 50 Torr it
// is one pulse. This is the model's own behaviour (a regression check, not a validation):
// tolerances 1 ns on the separation and the strongest width, 5 % on the FWHM. Measured when
// the count was added: 21.9 ns, 7.8 ns, 28.2 ns, the first pulse at ≈ 0.7 of the second (so
// the 10–90 % rise spanned both); since the recombination follows the ion mixture (less of it
// at 20 Torr, where N₂⁺ lives for ns) the first pulse is the stronger, the second at ≈ 0.95 of
// it, and the rise is the first pulse's own (the clause is tested in
// TestSeparatePulsesRiseSpans).
func TestTubeTwoPulses(t *testing.T) {
	t.Parallel()
	d, err := design.LoadDesign("../data/designs/tube.toml")
	if err != nil {
		t.Fatal(err)
	}
	one, err := Run(d, &RunSettings{SummaryOnly: true})
	if err != nil {
		t.Fatal(err)
	}
	if s := one.Summary; s.Pulses != 1 || s.PulseSeparation != 0 || s.StrongestPulseFWHM != s.FWHM || strings.Contains(s.Verdict, "separate pulses") {
		t.Errorf("tube at 50 Torr: %d pulses, %g s apart, strongest %g s, FWHM %g s; verdict %q: want one pulse",
			s.Pulses, s.PulseSeparation, s.StrongestPulseFWHM, s.FWHM, s.Verdict)
	}
	if err := d.Set("gas.pressure", "20 Torr"); err != nil {
		t.Fatal(err)
	}
	r, err := Run(d, &RunSettings{SummaryOnly: true})
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	if s.Pulses != 2 || !scalar.EqualWithinAbsOrRel(s.PulseSeparation, 22.7e-9, 1e-9, 0) {
		t.Errorf("tube at 20 Torr: %d pulses %.4g s apart, want 2 about 22.7 ns apart", s.Pulses, s.PulseSeparation)
	}
	if !scalar.EqualWithinAbsOrRel(s.StrongestPulseFWHM, 7.15e-9, 1e-9, 0) || !scalar.EqualWithinAbsOrRel(s.FWHM, 29.3e-9, 0, 0.05) {
		t.Errorf("tube at 20 Torr: strongest %.4g s, FWHM %.4g s; want about 7.2 ns and 29.3 ns", s.StrongestPulseFWHM, s.FWHM)
	}
	// The first pulse is the stronger, so the 10–90 % rise is its own and does not span both.
	if !strings.Contains(s.Verdict, "the output is 2 separate pulses") || strings.Contains(s.Verdict, "10–90 % rise") {
		t.Errorf("tube at 20 Torr: verdict %q does not name the two pulses, or says a rise spans them", s.Verdict)
	}
}
