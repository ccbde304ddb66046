package kinetics

import (
	"math"
	"testing"
)

// The short series of the hot loop agree with the library functions to rounding.
func TestSmallSeries(t *testing.T) {
	for _, x := range []float64{0, 1e-300, 1e-12, 1e-6, 1e-3, 0.01, 1.0 / 64, 0.02, 0.5, 3} {
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"exp", expSmall(x), math.Exp(x)},
			{"exp(-x)", expSmall(-x), math.Exp(-x)},
			{"expm1", expm1Small(x), math.Expm1(x)},
			{"log1p", log1pSmall(x), math.Log1p(x)},
		} {
			if d := math.Abs(c.got - c.want); d > 4e-16*math.Abs(c.want) && d > 1e-320 {
				t.Errorf("%s(%g) = %.17g, want %.17g", c.name, x, c.got, c.want)
			}
		}
	}
}
