package swarm

import (
	"math"
	"testing"

	"n2pulse/units"
)

// syntheticSpecies is an elastic-only gas of mass 28 u with σ_m(ε) given on a log grid.
func syntheticSpecies(sigma func(eV float64) float64) *Species {
	p := Process{Kind: Elastic, Name: "model elastic", Source: "analytic test model"}
	for i := 0; i <= 1200; i++ {
		e := 1e-4 * math.Pow(1e8, float64(i)/1200) // 1e-4 … 1e4 eV
		p.Energy = append(p.Energy, e*units.ElectronVolt)
		p.Sigma = append(p.Sigma, sigma(e))
	}
	return &Species{Name: "model", Mass: 28 * units.AtomicMass, Processes: []Process{p}}
}

// TestMaxwellLimit: elastic collisions only with a constant collision frequency
// (σ_m = C ε^-½) give a Maxwellian at k T_e = k T_g + (M/6m)(E/N / C)² and the drift velocity
// w = (γ/2)(E/N)/C = eE/(m ν_m) (analytic: e.g. Hagelaar & Pitchford 2005, section 2; Raizer,
// Gas Discharge Physics, 1991, section 2.4). Mean energy within 1 %.
func TestMaxwellLimit(t *testing.T) {
	t.Parallel()
	const C = 1e-20 // m² eV^½
	sp := syntheticSpecies(func(e float64) float64 { return C / math.Sqrt(e) })
	s, err := NewSolver([]Component{{sp, 1}}, &Settings{Cells: 400})
	if err != nil {
		t.Fatal(err)
	}
	en := 0.1 * units.Townsend
	r, err := s.Solve(en)
	if err != nil {
		t.Fatal(err)
	}
	ratio := sp.Mass / units.ElectronMass
	kTg := units.Boltzmann * 300 / units.ElementaryCharge
	kTe := kTg + en*en*ratio/(6*C*C) // eV
	mean := r.MeanEnergy / units.ElectronVolt
	if d := math.Abs(mean/(1.5*kTe) - 1); d > 0.01 {
		t.Errorf("mean energy %.5g eV, Maxwellian 1.5 kTe = %.5g eV (deviation %.2g)", mean, 1.5*kTe, d)
	}
	w := gamma / 2 * en / C
	if d := math.Abs(r.DriftVelocity/w - 1); d > 0.01 {
		t.Errorf("drift velocity %.5g m/s, analytic %.5g m/s", r.DriftVelocity, w)
	}
	// shape: F0 ∝ exp(−ε/kTe), normalised; check where F0 is above 1e-6 of its peak
	norm := 2 / math.Sqrt(math.Pi) * math.Pow(kTe, -1.5)
	for i, e := range r.Energy {
		ev := e / units.ElectronVolt
		want := norm * math.Exp(-ev/kTe)
		got := r.EEDF[i] * math.Pow(units.ElectronVolt, 1.5)
		if want > 1e-6*norm && math.Abs(got/want-1) > 0.02 {
			t.Errorf("F0(%.3g eV) = %.4g eV^-3/2, Maxwellian %.4g", ev, got, want)
			break
		}
	}
}

// TestDruyvesteynLimit: elastic only, constant cross section, cold gas: F0 ∝ exp(−ε²/a²) with
// a² = (M/3m)(E/N / σ)², mean energy a·Γ(5/4)/Γ(3/4) (Druyvesteyn 1930; analytic, e.g. Raizer,
// Gas Discharge Physics, 1991, section 2.5). Within 1 %.
func TestDruyvesteynLimit(t *testing.T) {
	t.Parallel()
	const sigma = 1e-19
	sp := syntheticSpecies(func(float64) float64 { return sigma })
	s, err := NewSolver([]Component{{sp, 1}}, &Settings{Cells: 400, ColdGas: true})
	if err != nil {
		t.Fatal(err)
	}
	en := 4 * units.Townsend
	r, err := s.Solve(en)
	if err != nil {
		t.Fatal(err)
	}
	a := en / sigma * math.Sqrt(sp.Mass/(3*units.ElectronMass))
	want := a * math.Gamma(1.25) / math.Gamma(0.75)
	mean := r.MeanEnergy / units.ElectronVolt
	if d := math.Abs(mean/want - 1); d > 0.01 {
		t.Errorf("mean energy %.5g eV, Druyvesteyn %.5g eV (deviation %.2g)", mean, want, d)
	}
}

func n2Solver(t testing.TB, cells int) *Solver {
	mix, err := SetMixture(SetOriginal, 1, 0, 0)
	if err != nil {
		t.Fatal(err)
	}
	s, err := NewSolver(mix, &Settings{Cells: cells})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestBalances: power from the field = collision powers + growth within 1e-3 (in practice
// ~1e-5), EEDF normalised to 1e-9, growth rate self-consistent, in N₂ and air from 10 to
// 3000 Td (conservation test of the discretisation).
func TestBalances(t *testing.T) {
	t.Parallel()
	for _, x := range []struct{ n, o float64 }{{1, 0}, {AirNitrogen, AirOxygen}} {
		mix, _ := SetMixture(SetOriginal, x.n, x.o, 0)
		s, err := NewSolver(mix, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, td := range []float64{10, 30, 100, 300, 1000, 3000} {
			r, err := s.Solve(td * units.Townsend)
			if err != nil {
				t.Fatal(err)
			}
			if b := r.PowerBalance(); math.Abs(b) > 1e-3 {
				t.Errorf("N2 %g: %g Td: power balance residual %.3g", x.n, td, b)
			}
			if d := math.Abs(r.Normalisation - 1); d > 1e-9 {
				t.Errorf("N2 %g: %g Td: normalisation off by %.3g", x.n, td, d)
			}
			two := r.Attachment - r.ThreeBodyAttachment
			if d := math.Abs(r.GrowthRate - (r.Ionisation - two)); d > 1e-6*(r.Ionisation+two)+1e-40 {
				t.Errorf("N2 %g: %g Td: growth %.6g vs k_ion − k_att %.6g", x.n, td, r.GrowthRate, r.Ionisation-two)
			}
		}
	}
}

// TestNumberConservation: each column of the inelastic operator removes exactly the electrons
// lost by attachment and adds one per ionisation (both sharing rules).
func TestNumberConservation(t *testing.T) {
	t.Parallel()
	mix, _ := SetMixture(SetOriginal, AirNitrogen, AirOxygen, 0)
	for _, sh := range []Sharing{EqualSharing, OneTakesAll} {
		s, err := NewSolver(mix, &Settings{Sharing: sh})
		if err != nil {
			t.Fatal(err)
		}
		g := s.buildGrid(200)
		n := g.n
		for j := 0; j < n; j++ {
			sum, want, scale := 0.0, 0.0, 0.0
			for i := 0; i < n; i++ {
				sum += g.inel[i*n+j]
			}
			for q, ref := range g.procIdx {
				cm := &s.mix[ref.comp]
				l := cm.x * g.loss[q][j]
				scale += l
				switch cm.procs[ref.proc].p.Kind {
				case Ionisation:
					want -= l
				case Attachment:
					want += l
				}
			}
			if math.Abs(sum-want) > 1e-12*scale {
				t.Fatalf("sharing %d, column %d: sum %.6g, want %.6g", sh, j, sum, want)
			}
		}
	}
}

// TestGridConvergence: refining the energy grid (100, 200, 400 cells) the coefficients settle:
// the change from 200 to 400 cells is smaller than from 100 to 200 and below 1 % (drift, mean
// energy, α/N) or 3 % (k_C).
func TestGridConvergence(t *testing.T) {
	t.Parallel()
	var res [3]*Result
	for _, td := range []float64{100, 1000} {
		for k, n := range []int{100, 200, 400} {
			r, err := n2Solver(t, n).Solve(td * units.Townsend)
			if err != nil {
				t.Fatal(err)
			}
			res[k] = r
		}
		for _, q := range []struct {
			name string
			tol  float64
			get  func(r *Result) float64
		}{
			{"drift velocity", 0.01, func(r *Result) float64 { return r.DriftVelocity }},
			{"mean energy", 0.01, func(r *Result) float64 { return r.MeanEnergy }},
			{"alpha/N", 0.01, func(r *Result) float64 { return r.AlphaN }},
			{"k_C", 0.03, func(r *Result) float64 { return r.ExciteC }},
		} {
			a, b, c := q.get(res[0]), q.get(res[1]), q.get(res[2])
			d1, d2 := math.Abs(b-a), math.Abs(c-b)
			if d2 > d1 && d2 > 1e-4*math.Abs(c) {
				t.Errorf("%g Td %s: not converging: %g, %g, %g", td, q.name, a, b, c)
			}
			if d2 > q.tol*math.Abs(c) {
				t.Errorf("%g Td %s: 200→400 cells changes %.3g%%", td, q.name, 100*d2/math.Abs(c))
			}
		}
	}
}

// TestSharingRules: both ionisation sharing rules conserve power; at 1000 Td one-takes-all
// leaves the primary with more energy, so α/N is not lower than with equal sharing.
func TestSharingRules(t *testing.T) {
	t.Parallel()
	mix, _ := SetMixture(SetOriginal, 1, 0, 0)
	var an [2]float64
	for k, sh := range []Sharing{EqualSharing, OneTakesAll} {
		s, _ := NewSolver(mix, &Settings{Sharing: sh})
		r, err := s.Solve(1000 * units.Townsend)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(r.PowerBalance()) > 1e-3 {
			t.Errorf("sharing %d: power balance %.3g", sh, r.PowerBalance())
		}
		an[k] = r.AlphaN
	}
	if an[1] < an[0] {
		t.Errorf("α/N one-takes-all %.4g < equal sharing %.4g", an[1], an[0])
	}
}

func TestSolverInputErrors(t *testing.T) {
	t.Parallel()
	mix, _ := SetMixture(SetOriginal, 1, 0, 0)
	if _, err := NewSolver(mix, &Settings{Cells: 5}); err == nil {
		t.Error("5 cells accepted")
	}
	if _, err := NewSolver([]Component{{mix[0].Species, 0.5}}, nil); err == nil {
		t.Error("fractions summing to 0.5 accepted")
	}
	s, _ := NewSolver(mix, nil)
	if _, err := s.Solve(0); err == nil {
		t.Error("E/N = 0 accepted")
	}
	if _, err := SetMixture(SetOriginal, 1, -0.1, 0.1); err == nil {
		t.Error("negative fraction accepted")
	}
}
