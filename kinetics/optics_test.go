package kinetics

import (
	"math"
	"testing"
)

// testMedium is a uniformly inverted channel with no pump, no relaxation, no spontaneous
// emission and no reflections: populations change only by stimulated emission and
// absorption.
func testMedium(n int, length, sigma, g, c0, b0 float64) *medium {
	dz := length / float64(n)
	m := newMedium(n, dz, dz/299792458.0, sigma, g, 0, 0, 0, 0)
	for i := range m.c {
		m.c[i], m.b[i] = c0, b0
	}
	m.resync()
	return m
}

// amplifySquare sends a square pulse of flux f and duration tau into z = 0 and returns the
// output fluence at z = L [photons m⁻²].
func amplifySquare(m *medium, f, tau float64) float64 {
	pulseSteps := int(math.Round(tau / m.dt))
	out := 0.0
	for k := 0; k < pulseSteps+2*m.n+2; k++ {
		m.inject = 0
		if k < pulseSteps {
			m.inject = f
		}
		front, _ := m.propagate(k)
		out += front * m.dt
	}
	return out
}

// TestFrantzNodvik: a square pulse through a saturable amplifier (Frantz & Nodvik, J. Appl.
// Phys. 34, 2346 (1963), eq. for the output energy of a square pulse):
// J_out = J_s·ln(1 + G₀·(e^(J_in/J_s) − 1)), G₀ = e^(σΔN₀L), J_s = 1/((1+g)σ).
func TestFrantzNodvik(t *testing.T) {
	t.Parallel()
	const (
		length = 0.2
		sigma  = 1.5e-19
		g      = 0.83
		c0, b0 = 2e20, 5e19
	)
	js := 1 / ((1 + g) * sigma)
	g0 := math.Exp(sigma * (c0 - g*b0) * length)
	for _, jinRatio := range []float64{1e-4, 0.1, 1, 5} {
		m := testMedium(400, length, sigma, g, c0, b0)
		tau := 200 * m.dt
		jin := jinRatio * js
		got := amplifySquare(m, jin/tau, tau)
		want := js * math.Log1p(g0*math.Expm1(jin/js))
		// Frantz–Nodvik within 1 % (the tolerance).
		if math.Abs(got-want) > 0.01*want {
			t.Errorf("J_in/J_s = %g: J_out = %.5g, Frantz–Nodvik %.5g (%.2f%%)", jinRatio, got, want, 100*(got/want-1))
		}
		// Every photon gained is a transition taken from the medium.
		gained := m.ledger.stimulated
		if r := math.Abs(gained-(got-jin)) / got; r > 1e-9 {
			t.Errorf("J_in/J_s = %g: photon balance %.2g", jinRatio, r)
		}
	}
}

// TestSmallSignalGain: a weak signal grows as e^(gL) (Beer–Lambert law with negative
// absorption; textbook).
func TestSmallSignalGain(t *testing.T) {
	t.Parallel()
	for _, gl := range []float64{-3, 1, 5, 12} {
		sigma, length := 1e-19, 0.3
		c0 := gl / (sigma * length)
		b0 := 0.0
		if gl < 0 {
			c0, b0 = 0, -gl/(sigma*length*0.8)
		}
		m := testMedium(150, length, sigma, 0.8, c0, b0)
		tau := 50 * m.dt
		jin := 1e-15 / ((1 + 0.8) * sigma) // far below saturation: J_out/J_s stays below 1e-9
		got := amplifySquare(m, jin/tau, tau)
		if r := got / (jin * math.Exp(gl)); math.Abs(r-1) > 1e-6 {
			t.Errorf("gL = %g: gain %.8g, want e^gL = %.8g", gl, got/jin, math.Exp(gl))
		}
	}
}

// TestPopulationsNonNegative: populations stay non-negative however strong the flux.
func TestPopulationsNonNegative(t *testing.T) {
	t.Parallel()
	m := testMedium(50, 0.1, 1e-19, 0.8, 1e20, 3e19)
	amplifySquare(m, 1e35, 10*m.dt)
	for i := range m.c {
		if m.c[i] < 0 || m.b[i] < 0 {
			t.Fatalf("cell %d: N_C = %g, N_B = %g", i, m.c[i], m.b[i])
		}
		// Saturated to transparency: N_C ≈ g·N_B.
		if inv := m.c[i] - 0.8*m.b[i]; math.Abs(inv) > 1e-6*m.c[i] {
			t.Errorf("cell %d: inversion %.3g left after a saturating pulse", i, inv)
		}
	}
}
