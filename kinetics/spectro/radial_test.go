package spectro

import (
	"math"
	"testing"
)

func testConstants(t testing.TB) *Constants {
	t.Helper()
	c, err := Default()
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// Morse levels on the grid against the analytic Morse result ωe(v+½) − ωexe(v+½)²
// (P.M. Morse, Phys. Rev. 34, 57, 1929; analytic).
func TestMorseLevels(t *testing.T) {
	t.Parallel()
	c := testConstants(t)
	mu := c.ReducedMass()
	for _, name := range []string{"X", "B", "C"} {
		s := c.States[name]
		lv, err := SolveRadial(Morse(s, mu), mu, DefaultGrid, SincDVR, 6)
		if err != nil {
			t.Fatal(err)
		}
		for v := 0; v <= 5; v++ {
			x := float64(v) + 0.5
			want := s.We*x - s.WeXe*x*x
			if d := lv.Energy[v] - want; math.Abs(d) > 1e-3 {
				t.Errorf("%s v=%d: E = %.6f cm⁻¹, analytic %.6f, diff %.2e", name, v, lv.Energy[v], want, d)
			}
		}
	}
}

// Harmonic limit: levels ωe(v+½) exactly (analytic).
func TestHarmonicLevels(t *testing.T) {
	t.Parallel()
	c := testConstants(t)
	mu := c.ReducedMass()
	s := c.States["X"]
	lv, err := SolveRadial(Harmonic(s.We, s.Re, mu), mu, DefaultGrid, SincDVR, 6)
	if err != nil {
		t.Fatal(err)
	}
	for v := 0; v <= 5; v++ {
		want := s.We * (float64(v) + 0.5)
		if d := lv.Energy[v] - want; math.Abs(d) > 1e-3 {
			t.Errorf("harmonic v=%d: E = %.6f, analytic %.6f cm⁻¹", v, lv.Energy[v], want)
		}
	}
}

// Grid convergence: the three-point stencil's error falls as h² (ratio 4 when h halves), and the
// sinc-DVR levels at the default spacing (0.0077 Å) agree with a grid twice as fine to 1e−6 cm⁻¹
// (analytic orders of the two discretisations).
func TestGridConvergence(t *testing.T) {
	t.Parallel()
	c := testConstants(t)
	mu := c.ReducedMass()
	s := c.States["C"]
	exact := s.We*0.5 - s.WeXe*0.25
	var errs []float64
	for _, n := range []int{81, 161, 321} {
		g := Grid{RMin: 0.8, RMax: 1.8, N: n}
		lv, err := SolveRadial(Morse(s, mu), mu, g, ThreePoint, 1)
		if err != nil {
			t.Fatal(err)
		}
		errs = append(errs, lv.Energy[0]-exact)
	}
	for i := 1; i < len(errs); i++ {
		if r := errs[i-1] / errs[i]; math.Abs(r-4) > 0.1 {
			t.Errorf("three-point error ratio %g (errors %g, %g), want 4 ± 0.1", r, errs[i-1], errs[i])
		}
	}
	h := DefaultGrid.Step()
	coarse, err := SolveRadial(Morse(s, mu), mu, Grid{0.8, 0.8 + 130*h, 131}, SincDVR, 10)
	if err != nil {
		t.Fatal(err)
	}
	fine, err := SolveRadial(Morse(s, mu), mu, Grid{0.8, 0.8 + 130*h, 261}, SincDVR, 10)
	if err != nil {
		t.Fatal(err)
	}
	for v := range 10 {
		if d := coarse.Energy[v] - fine.Energy[v]; math.Abs(d) > 1e-6 {
			t.Errorf("sinc-DVR v=%d: default grid %.8f vs fine %.8f cm⁻¹", v, coarse.Energy[v], fine.Energy[v])
		}
	}
}

// Eigenvectors are orthonormal (analytic property of a symmetric eigen-decomposition).
func TestOrthonormal(t *testing.T) {
	t.Parallel()
	c := testConstants(t)
	mu := c.ReducedMass()
	lv, err := SolveRadial(Morse(c.States["B"], mu), mu, DefaultGrid, SincDVR, 8)
	if err != nil {
		t.Fatal(err)
	}
	for i := range 8 {
		for j := range 8 {
			s, _ := Overlap(lv.Psi[i], lv.Psi[j], lv.R)
			want := 0.0
			if i == j {
				want = 1
			}
			if math.Abs(s-want) > 1e-12 {
				t.Errorf("⟨%d|%d⟩ = %g, want %g", i, j, s, want)
			}
		}
	}
}

func TestSolveRadialErrors(t *testing.T) {
	t.Parallel()
	V := func(r float64) float64 { return r * r }
	cases := []struct {
		g  Grid
		n  int
		mu float64
	}{
		{Grid{0.5, 2, 5}, 1, 7},    // too few points
		{Grid{2, 0.5, 100}, 1, 7},  // reversed
		{Grid{0.5, 2, 100}, 0, 7},  // no levels
		{Grid{0.5, 2, 100}, 1, -1}, // bad mass
	}
	for _, c := range cases {
		if _, err := SolveRadial(V, c.mu, c.g, SincDVR, c.n); err == nil {
			t.Errorf("SolveRadial(%+v, n=%d, mu=%g) gave no error", c.g, c.n, c.mu)
		}
	}
}
