package kinetics

import (
	"math"
	"testing"
)

// The short series of a Frantz–Nodvik pass agree with the library functions to rounding
// inside their ranges and say so only there.
func TestPassSeries(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{0, 1e-300, 1e-12, 1e-6, 0x1p-14, 1e-4, 1e-3, 0.01, 1.0 / 64} {
		r, ok := expNegSeries(x)
		want := -math.Expm1(-x)
		if !ok || math.Abs(r-want) > 4e-16*want {
			t.Errorf("expNegSeries(%g) = %.17g, %v; want %.17g", x, r, ok, want)
		}
	}
	for _, x := range []float64{-1e-9, 0.0157, 1, 40} {
		if _, ok := expNegSeries(x); ok {
			t.Errorf("expNegSeries claims %g is in range", x)
		}
	}
	for _, w := range []float64{0, 1e-300, 1e-12, 1e-6, 1e-4, 1e-3, 0.01, 1.0 / 64} {
		for _, s := range []float64{1, -1} {
			l, ok := log1pSeries(s * w)
			want := math.Log1p(s * w)
			if !ok || math.Abs(l-want) > 4e-16*math.Abs(want) {
				t.Errorf("log1pSeries(%g) = %.17g, %v; want %.17g", s*w, l, ok, want)
			}
		}
	}
	for _, w := range []float64{-0.5, -0.0157, 0.0157, 3} {
		if _, ok := log1pSeries(w); ok {
			t.Errorf("log1pSeries claims %g is in range", w)
		}
	}
	// The longer series of passWide, up to x = 1/8 and |w| = 1/16.
	for _, x := range []float64{0, 1e-300, 1e-6, 1.0 / 64, 0.03, 0.07, 0.1, 1.0 / 8} {
		if got, want := expNegSeriesWide(x), -math.Expm1(-x); math.Abs(got-want) > 4e-16*want {
			t.Errorf("expNegSeriesWide(%g) = %.17g, want %.17g", x, got, want)
		}
	}
	for _, w := range []float64{0, 1e-300, 1e-6, 1.0 / 64, 0.03, 0.05, 1.0 / 16} {
		for _, s := range []float64{1, -1} {
			if got, want := log1pSeriesWide(s*w), math.Log1p(s*w); math.Abs(got-want) > 4e-16*math.Abs(want) {
				t.Errorf("log1pSeriesWide(%g) = %.17g, want %.17g", s*w, got, want)
			}
		}
	}
}

// passReference is a Frantz–Nodvik pass (Frantz & Nodvik, J. Appl. Phys. 34, 2346 (1963)) by
// the library functions: a = ln(G′/G) = −ln(1 + (G−1)(1 − e^(−x))), accurate to a few
// rounding units at every x and G.
func passReference(x, g float64) float64 {
	return -math.Log1p((g - 1) * -math.Expm1(-x))
}

// The expansion far below saturation matches the closed form inside its range and refuses
// outside it.
func TestPassTiny(t *testing.T) {
	t.Parallel()
	for _, g := range []float64{1e-3, 0.3, 0.9, 1 - 1e-9, 1, 1 + 1e-9, 1.001, 1.3, 2, 10, 1000} {
		for _, x := range []float64{0, 1e-20, 1e-9, 1e-6, 1e-5, 3e-5, 6e-5} {
			if x*g >= tinyFluence {
				x = 0.99 * tinyFluence / g
			}
			a, ok := passTiny(x, g)
			want := passReference(x, g)
			if !ok {
				t.Errorf("G = %g, x = %g: passTiny refuses", g, x)
				continue
			}
			if d := math.Abs(a - want); d > 2e-15*math.Abs(want) {
				t.Errorf("G = %g, x = %g: a = %.17g, closed form %.17g (rel %.2g)", g, x, a, want, d/math.Abs(want))
			}
		}
	}
	for _, c := range [][2]float64{{1e-4, 1}, {1e-5, 10}, {0.1, 0.5}} {
		if _, ok := passTiny(c[0], c[1]); ok {
			t.Errorf("passTiny accepts x = %g, G = %g", c[0], c[1])
		}
	}
}

// One pass through one cell, in every regime of the hot loop (a channel of one cell, no
// mirrors, no spontaneous emission, a fluence injected forward): the fluence leaving is the
// Frantz–Nodvik output, the gain factor left behind is G·e^(−ΔJ/J_s), and the transitions
// taken from the populations are the photons gained.
func TestPassCell(t *testing.T) {
	t.Parallel()
	const sigma, g, dz = 1.4e-19, 0.83, 1e-3
	for _, gain := range []float64{0.2, 0.5, 0.97, 1, 1.0004, 1.1, 1.3, 1.5, 3, 40} {
		for _, x := range []float64{0, 1e-12, 1e-7, 5e-5, 2e-4, 0.005, 0.015, 0.05, 0.1, 0.125, 0.13, 1, 30} {
			m := newMedium(1, dz, dz/299792458.0, sigma, g, 0, 0, 0, 0)
			// Populations that give this gain factor: N_C − g·N_B = ln G/(σΔz).
			inv := math.Log(gain) / (sigma * dz)
			m.b[0] = 1e22 + 2*max(0, -inv)/g
			m.c[0] = inv + g*m.b[0]
			m.gain[0] = gain
			c0, b0 := m.c[0], m.b[0]
			jin := x * m.js
			m.inject = jin / m.dt
			m.propagate(0) // the forward pass carries jin, the backward pass nothing
			stim := m.ledger.stimulated
			jout := m.fluxOf(m.fp[0]) * m.dt
			// Frantz–Nodvik, J. Appl. Phys. 34, 2346 (1963): J_out = J_s·ln(1 + G(e^x − 1)).
			want := m.js * math.Log1p(gain*math.Expm1(x))
			if d := math.Abs(jout - want); d > 1e-14*want && d > 1e-300 {
				t.Errorf("G = %g, x = %g: J_out = %.17g, Frantz–Nodvik %.17g (rel %.2g)", gain, x, jout, want, d/want)
			}
			dj := -passReference(x, gain) * m.js
			if d := math.Abs(stim - dj); d > 4e-15*math.Abs(dj) {
				t.Errorf("G = %g, x = %g: ΔJ = %.17g, want %.17g", gain, x, stim, dj)
			}
			if w := gain * math.Exp(-dj/m.js); math.Abs(m.gain[0]-w) > 4e-15*w {
				t.Errorf("G = %g, x = %g: gain factor left %.17g, want %.17g", gain, x, m.gain[0], w)
			}
			// Every photon gained is a transition from C to B (common practice, no source:
			// the bookkeeping of a rate-equation laser model), to the rounding of N_C and N_B.
			if d := (c0 - m.c[0]) * dz; math.Abs(d-stim) > 1e-12*math.Abs(stim)+1e-15*c0*dz {
				t.Errorf("G = %g, x = %g: N_C fell by %.6g m⁻², beam gained %.6g", gain, x, d, stim)
			}
			if d := (m.b[0] - b0) * dz; math.Abs(d-stim) > 1e-12*math.Abs(stim)+1e-15*m.b[0]*dz {
				t.Errorf("G = %g, x = %g: N_B rose by %.6g m⁻², beam gained %.6g", gain, x, d, stim)
			}
		}
	}
}
