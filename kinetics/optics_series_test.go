package kinetics

import (
	"math"
	"testing"
)

// The short series of the hot loop agree with the library functions to rounding.
func TestSmallSeries(t *testing.T) {
	t.Parallel()
	for _, x := range []float64{0, 1e-12, 1e-6, 1.0 / 1100, 1.0 / 2048} {
		f, ok := expTiny(x)
		g, _ := expTiny(-x)
		if !ok || math.Abs(f/math.Exp(x)-1) > 5e-14 || math.Abs(g/math.Exp(-x)-1) > 5e-14 {
			t.Errorf("expTiny(±%g) = %.17g, %.17g, want %.17g, %.17g", x, f, g, math.Exp(x), math.Exp(-x))
		}
	}
	if _, ok := expTiny(0.002); ok {
		t.Error("expTiny claims 0.002 is tiny")
	}
	for _, x := range []float64{0, 1e-300, 1e-12, 1e-6, 1e-4, 0x1p-13, 1.3e-4, 1e-3, 0.01, 1.0 / 64, 0.02, 0.5, 3} {
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"exp", expMedium(x), math.Exp(x)},
			{"exp(-x)", expMedium(-x), math.Exp(-x)},
		} {
			if d := math.Abs(c.got - c.want); d > 4e-16*math.Abs(c.want) && d > 1e-320 {
				t.Errorf("%s(%g) = %.17g, want %.17g", c.name, x, c.got, c.want)
			}
		}
	}
}
