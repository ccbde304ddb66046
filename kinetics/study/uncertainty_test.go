package study

import (
	"context"
	"errors"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/floats"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// knownRunner makes figures of merit that are known functions of two sampled constants: the
// energy rises with the C(0)–N₂ quenching constant only, the peak power falls with the B(0)
// lifetime only, so each must be driven by its own constant with ρ = ±1 exactly. A design
// whose upper_relaxation_nitrogen lies in the top fifth of its range fails.
func knownRunner(d *design.Design) (kinetics.Summary, error) {
	if d.Levels.UpperRelaxationNitrogen > 1.8e-17 {
		return kinetics.Summary{}, errors.New("made to fail")
	}
	return kinetics.Summary{
		EnergyTotal: 1e-4 * d.Levels.UpperQuenchingNitrogen / 1e-17,
		PeakPower:   1e5 / (d.Levels.LowerLifetime / 1e-6),
	}, nil
}

// TestUncertainty checks bands and drivers against knownRunner: the energy band is the
// quenching constant's own band scaled (uniform 1.0–1.5e-17 over 50 stratified samples: the
// median within one stratum of 1.25), failed samples are counted and left out, the drivers are
// the right constants with ρ = +1 and −1, and the result is the same with 1 and 2 workers.
func TestUncertainty(t *testing.T) {
	t.Parallel()
	base := design.ExampleDesign()
	const n = 50
	r, err := Uncertainty(context.Background(), base, n, 11, 2, knownRunner)
	if err != nil {
		t.Fatal(err)
	}
	// upper_relaxation_nitrogen is uniform 1–2e-17: exactly the 10 samples above 1.8e-17 fail
	if r.Failed != 10 {
		t.Errorf("%d failed samples, want 10 (one per stratum above 1.8e-17)", r.Failed)
	}
	e, ok := r.Metric("energy_total_J")
	if !ok {
		t.Fatal("no band for energy_total_J")
	}
	if e.Samples != n-r.Failed {
		t.Errorf("energy band over %d samples, want %d", e.Samples, n-r.Failed)
	}
	if !(e.P05 < e.P50 && e.P50 < e.P95) || e.P05 < 1e-4 || e.P95 > 1.5e-4 {
		t.Errorf("energy band %+v, want ordered inside 1e-4…1.5e-4", e.Band)
	}
	if math.Abs(e.P50-1.25e-4) > 0.5e-4/n*5 { // failures thin the strata at random: allow 5 strata
		t.Errorf("energy median %g, want 1.25e-4 within %g", e.P50, 0.5e-4/n*5)
	}
	if e.Drivers[0].Key != "levels.upper_quenching_nitrogen" || math.Abs(e.Drivers[0].RankCorrelation-1) > 1e-12 {
		t.Errorf("energy driven by %+v, want levels.upper_quenching_nitrogen at ρ = 1", e.Drivers[0])
	}
	p, ok := r.Metric("peak_power_W")
	if !ok {
		t.Fatal("no band for peak_power_W")
	}
	if p.Drivers[0].Key != "levels.lower_lifetime" || math.Abs(p.Drivers[0].RankCorrelation+1) > 1e-12 {
		t.Errorf("peak power driven by %+v, want levels.lower_lifetime at ρ = −1", p.Drivers[0])
	}
	if _, ok := r.Metric("fwhm_s"); ok {
		t.Error("fwhm_s has a band although every sample leaves it undefined (0)")
	}
	one, err := Uncertainty(context.Background(), base, n, 11, 1, knownRunner)
	if err != nil {
		t.Fatal(err)
	}
	if !sameFigures(one.figs, r.figs) {
		t.Error("1 and 2 workers keep different sample figures")
	}
	one.figs, r.figs = nil, nil // NaN (undefined figures) is never DeepEqual to itself
	if !reflect.DeepEqual(one, r) {
		t.Error("1 and 2 workers give different results")
	}
	// lasing iff the quenching constant is in the lower half of its range: exactly 25 of 50
	half, err := Uncertainty(context.Background(), base, n, 11, 2, func(d *design.Design) (kinetics.Summary, error) {
		return kinetics.Summary{Lases: d.Levels.UpperQuenchingNitrogen < 1.25e-17}, nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if half.Lasing != 25 || !half.MayNotLase() {
		t.Errorf("%d of %d samples lase (may not lase: %v), want 25 and true", half.Lasing, n, half.MayNotLase())
	}
	if r.MayNotLase() || r.Lasing != 0 {
		t.Errorf("knownRunner: %d lasing, may not lase %v; want 0, false (none lases)", r.Lasing, r.MayNotLase())
	}
	if _, err := Uncertainty(context.Background(), base, 5, 1, 1, func(*design.Design) (kinetics.Summary, error) {
		return kinetics.Summary{}, errors.New("always")
	}); err == nil {
		t.Error("every sample failing: no error")
	}
}

// TestUncertaintyModel runs the real model on the example design with 8 samples: every sample
// runs, and the energy band is ordered and positive (a smoke test of the wiring; the band's
// width is physics, not pinned here).
func TestUncertaintyModel(t *testing.T) {
	t.Parallel()
	if testing.Short() {
		t.Skip("runs the model 8 times")
	}
	r, err := Uncertainty(context.Background(), design.ExampleDesign(), 8, 1, 0, nil)
	if err != nil {
		t.Fatal(err)
	}
	e, ok := r.Metric("energy_total_J")
	if r.Failed != 0 || !ok || !(e.P05 > 0 && e.P05 <= e.P50 && e.P50 <= e.P95) {
		t.Errorf("failed %d, energy band %+v (found %v); want no failures and 0 < p05 ≤ p50 ≤ p95", r.Failed, e.Band, ok)
	}
}

// sameFigures compares the sample figures of two studies, NaN equal to NaN.
func sameFigures(a, b []sampleFigures) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i].ok != b[i].ok || a[i].lases != b[i].lases || a[i].truncated != b[i].truncated || !floats.Same(a[i].vals, b[i].vals) {
			return false
		}
	}
	return true
}
