package kinetics

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/spectro"
	"n2pulse/units"
)

// TestManifoldExact: from R = 0 with a constant feed p, R(t) = (p/Γ)(1 − e^(−Γt)) and B(0)
// receives η·k·N_N₂·(p/Γ)·(t − (1 − e^(−Γt))/Γ) (hand integration of the reservoir
// equation); the steps reproduce both to 1e-12, and the ledger fed = R + into B(0) + lost
// closes to 1e-12 under a feed that changes every step (conservation).
func TestManifoldExact(t *testing.T) {
	t.Parallel()
	l := design.ExampleDesign().Levels
	l.ManifoldShare = 0.4
	g := design.Gas{Pressure: 101325, Temperature: 300, Nitrogen: 0.79, Oxygen: 0.21}
	n := units.GasDensity(g.Pressure, g.Temperature)
	dt := 3e-12
	m := newManifold(l, g, n, dt)
	gamma := n*(0.79*l.ManifoldRelaxationNitrogen+0.21*l.ManifoldRelaxationOxygen) + 1/l.LowerLifetime
	toB := 0.4 * n * 0.79 * l.ManifoldRelaxationNitrogen
	const p = 1e30
	steps := 2000
	intoB := 0.0
	for range steps {
		intoB += m.step(p) * dt
	}
	tEnd := float64(steps) * dt
	wantR := p / gamma * -math.Expm1(-gamma*tEnd)
	wantB := toB * p / gamma * (tEnd + math.Expm1(-gamma*tEnd)/gamma)
	if !scalar.EqualWithinAbsOrRel(m.r, wantR, 0, 1e-12) {
		t.Errorf("R = %.12g m⁻³, want %.12g", m.r, wantR)
	}
	if !scalar.EqualWithinAbsOrRel(intoB, wantB, 0, 1e-12) || !scalar.EqualWithinAbsOrRel(m.given, wantB, 0, 1e-12) {
		t.Errorf("into B(0) %.12g (ledger %.12g) m⁻³, want %.12g", intoB, m.given, wantB)
	}
	for k := range 5000 {
		m.step(p * (1 + math.Sin(float64(k)/37)))
	}
	if sum := m.r + m.given + m.lost; !scalar.EqualWithinAbsOrRel(sum, m.fed, 0, 1e-12) {
		t.Errorf("ledger: R + into B(0) + lost = %.12g, fed %.12g", sum, m.fed)
	}
}

// TestManifoldDefaults: the manifold's constants are those of their sources: N₂(B) + N₂ →
// N₂(A) + N₂ 1.2e-11 cm³/s (J. Appl. Phys. 125, 243301 (2019), Table I, R25) and N₂(B) + O₂
// 3e-10 cm³/s (Kossyi et al., Plasma Sources Sci. Technol. 1, 207 (1992)); the share is the
// derived 0.25 (TestManifoldShareDerived).
func TestManifoldDefaults(t *testing.T) {
	t.Parallel()
	l := design.ExampleDesign().Levels
	if !scalar.EqualWithinAbsOrRel(l.ManifoldRelaxationNitrogen, 1.2e-11*1e-6, 0, 1e-12) {
		t.Errorf("k(B manifold + N₂) = %g m³/s, want 1.2e-17", l.ManifoldRelaxationNitrogen)
	}
	if !scalar.EqualWithinAbsOrRel(l.ManifoldRelaxationOxygen, 3e-10*1e-6, 0, 1e-12) {
		t.Errorf("k(B manifold + O₂) = %g m³/s, want 3e-16", l.ManifoldRelaxationOxygen)
	}
	// C(v=1) → C(0) and C(v=1) quenching by N₂: 1.5e-11 cm³/s each (Dilecce, Ambrico & De
	// Benedictis, Chem. Phys. Lett. 431, 241 (2006); from memory, range 1–2e-11).
	if !scalar.EqualWithinAbsOrRel(l.UpperRelaxationNitrogen, 1.5e-17, 0, 1e-12) || !scalar.EqualWithinAbsOrRel(l.UpperV1QuenchingNitrogen, 1.5e-17, 0, 1e-12) {
		t.Errorf("C(v=1) constants %g, %g m³/s, want 1.5e-17 each", l.UpperRelaxationNitrogen, l.UpperV1QuenchingNitrogen)
	}
	if l.ManifoldShare != 0.25 {
		t.Errorf("manifold share %g, want the derived 0.25", l.ManifoldShare)
	}
}

// TestManifoldShareDerived recomputes the derivation of levels.manifold_share written in
// kinetics/design/levels.go: the Franck–Condon factors X(0) → B(v) of package spectro weight the
// chance p^v of stepping down v levels of the B ladder, p = k_VR/(k_VR + k_BA) with k_VR = 2e-11
// cm³/s (from memory) and k_BA the default B → A transfer (1.2e-11, J. Appl. Phys. 125, 243301
// (2019) Table I R25): the ladder keeps 0.27; with a tenth of the manifold (B′) keeping p⁵ the
// whole gives the default 0.25; k_VR 1–3e-11 and k_BA 1.2–3e-11 span 0.05–0.37 (the range in
// design.Spreads).
func TestManifoldShareDerived(t *testing.T) {
	t.Parallel()
	m, err := spectro.DefaultModel()
	if err != nil {
		t.Fatal(err)
	}
	q := make([]float64, 14)
	for v := range q {
		if q[v], _, err = m.FranckCondon("X", 0, "B", v); err != nil {
			t.Fatal(err)
		}
	}
	ladder := func(kVR, kBA float64) float64 {
		p := kVR / (kVR + kBA)
		var num, den float64
		for v := 1; v < len(q); v++ {
			num += q[v] * math.Pow(p, float64(v))
			den += q[v]
		}
		return num / den
	}
	l := design.ExampleDesign().Levels
	kBA := l.ManifoldRelaxationNitrogen
	y := ladder(2e-17, kBA)
	if !scalar.EqualWithinAbsOrRel(y, 0.27, 0.005, 0) {
		t.Errorf("ladder yield %.4f, want 0.27", y)
	}
	p := 2e-17 / (2e-17 + kBA)
	whole := 0.9*y + 0.1*math.Pow(p, 5)
	if !scalar.EqualWithinAbsOrRel(whole, l.ManifoldShare, 0.01, 0) {
		t.Errorf("whole manifold %.4f, default share %g", whole, l.ManifoldShare)
	}
	lo, hi := 0.9*ladder(1e-17, 3e-17)+0.1*math.Pow(0.25, 5), ladder(3e-17, 1.2e-17)
	s, ok := design.KeySpread("levels.manifold_share")
	if !ok || !scalar.EqualWithinAbsOrRel(s.Low, lo, 0.005, 0) || !scalar.EqualWithinAbsOrRel(s.High, hi, 0.005, 0) {
		t.Errorf("range %.3f–%.3f from the rates, spread %+v", lo, hi, s)
	}
}

// TestManifoldConservation: with the manifold feeding B(0) (share 0.5) and C(v=1) feeding
// C(0) the example design's energy and photon balances still close to 1e-6, populations stay
// non-negative, and the feed of B(0) lowers the pulse energy (a fuller lower level ends the
// gain sooner). Switching C(v=1) off lowers it too (less pump of C(0)), and the C(v=1) ledger
// closes.
func TestManifoldConservation(t *testing.T) {
	t.Parallel()
	d := design.ExampleDesign()
	d.Levels.ManifoldShare = 0
	base, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	d.Levels.ManifoldShare = 0.5
	r, err := Run(d, nil)
	if err != nil {
		t.Fatal(err)
	}
	s := r.Summary
	if s.EnergyBalanceResidual > 1e-6 || s.PhotonBalanceResidual > 1e-6 {
		t.Errorf("balances %.2g (energy), %.2g (photons), want < 1e-6", s.EnergyBalanceResidual, s.PhotonBalanceResidual)
	}
	for i, b := range r.LowerLevel {
		if b < 0 || r.UpperLevel[i] < 0 {
			t.Fatalf("negative population at step %d", i)
		}
	}
	if !(s.EnergyTotal < base.Summary.EnergyTotal) {
		t.Errorf("feeding B(0) raised the pulse energy: %g → %g J", base.Summary.EnergyTotal, s.EnergyTotal)
	}
	d = design.ExampleDesign()
	d.Levels.ManifoldShare = 0
	d.Levels.UpperRelaxationNitrogen = 0
	off, err := Run(d, &RunSettings{Light: true})
	if err != nil {
		t.Fatal(err)
	}
	if !(off.Summary.EnergyTotal < base.Summary.EnergyTotal) {
		t.Errorf("leaving C(v=1) out raised the pulse energy: %g → %g J", base.Summary.EnergyTotal, off.Summary.EnergyTotal)
	}
}

// TestUpperShadowExact: from C = 0 with a constant pump p and loss Γ, C(t) = (p/Γ)(1 − e^(−Γt))
// and ∫C dt = (p/Γ)(t − (1 − e^(−Γt))/Γ) (hand integration); the steps and the sum of their
// means reproduce both to 1e-12.
func TestUpperShadowExact(t *testing.T) {
	t.Parallel()
	const p, gamma, dt = 1e32, 2.7e8, 3e-12
	u := &upperShadow{dt: dt}
	steps := 4000
	integral := 0.0
	for range steps {
		integral += u.step(p, gamma) * dt
	}
	tEnd := float64(steps) * dt
	wantC := p / gamma * -math.Expm1(-gamma*tEnd)
	wantI := p / gamma * (tEnd + math.Expm1(-gamma*tEnd)/gamma)
	if !scalar.EqualWithinAbsOrRel(u.c, wantC, 0, 1e-12) {
		t.Errorf("C = %.12g m⁻³, want %.12g", u.c, wantC)
	}
	if !scalar.EqualWithinAbsOrRel(integral, wantI, 0, 1e-12) {
		t.Errorf("∫C dt = %.12g m⁻³ s, want %.12g", integral, wantI)
	}
}
