package kinetics

import (
	"math"
	"testing"
)

// The shortest expansion of a pass, for the faint light building up from spontaneous
// emission, matches the closed form of Frantz & Nodvik, J. Appl. Phys. 34, 2346 (1963)
// (passReference) inside its range, agrees with passTiny there, and refuses outside it.
func TestPassFaint(t *testing.T) {
	t.Parallel()
	for _, g := range []float64{1e-3, 0.3, 0.9, 1 - 1e-9, 1, 1 + 1e-9, 1.001, 1.3, 2, 10, 1000} {
		for _, x := range []float64{0, 1e-300, 1e-20, 1e-12, 1e-9, 3e-9, 7e-9} {
			if x*g >= faintFluence {
				x = 0.99 * faintFluence / g
			}
			a, ok := passFaint(x, g)
			if !ok {
				t.Errorf("G = %g, x = %g: passFaint refuses", g, x)
				continue
			}
			want := passReference(x, g)
			if d := math.Abs(a - want); d > 2e-15*math.Abs(want) {
				t.Errorf("G = %g, x = %g: a = %.17g, closed form %.17g (rel %.2g)", g, x, a, want, d/math.Abs(want))
			}
			tiny, _ := passTiny(x, g)
			if d := math.Abs(a - tiny); d > 2e-16*math.Abs(tiny) {
				t.Errorf("G = %g, x = %g: passFaint %.17g, passTiny %.17g", g, x, a, tiny)
			}
		}
	}
	for _, c := range [][2]float64{{1e-8, 1}, {1e-9, 100}, {0x1p-27, 0.5}, {1e-4, 1}} {
		if _, ok := passFaint(c[0], c[1]); ok {
			t.Errorf("passFaint accepts x = %g, G = %g", c[0], c[1])
		}
	}
}
