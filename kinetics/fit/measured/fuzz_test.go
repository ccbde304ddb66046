package measured

import (
	"errors"
	"math"
	"testing"
)

// FuzzParse: any text either parses into points whose measured values and uncertainties are
// positive and finite, or fails with a *Error or a wrapped read error; it never panics.
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"channel.gap [mm], energy_front [uJ]\n1.5, 40\n",
		"channel.gap [mm], gas.pressure, energy_front [uJ], energy_front_uncertainty [%], fwhm [ns], fwhm_uncertainty [ps], note\n1.2, 760 Torr, 48, 10, 1.1, 100, a\n1.6, 1 atm, 61, 10, , , b\n",
		"# c\ncircuit.topology, peak_power [kW]\ntransfer, 50\n",
		"energy_total [J]\n1e-4\n",
		"channel.gap [mm], energy_front [uJ]\n1, 2, 3\n",
		"\"a\"b, c\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		s, err := Parse(b, "fuzz.csv")
		if err != nil {
			var e *Error
			if !errors.As(err, &e) && s != nil {
				t.Fatalf("error %v with a result", err)
			}
			return
		}
		if len(s.Points) == 0 || len(s.Quantities) == 0 {
			t.Fatalf("a set without points or quantities: %+v", s)
		}
		for _, p := range s.Points {
			if len(p.Values) == 0 || len(p.Settings) != len(s.Keys) {
				t.Fatalf("point %+v", p)
			}
			for _, v := range p.Values {
				if !(v.Value > 0) || math.IsInf(v.Value, 0) || v.Uncertainty < 0 || math.IsInf(v.Uncertainty, 0) || math.IsNaN(v.Uncertainty) {
					t.Fatalf("value %+v", v)
				}
				if s.Uncertain != (v.Uncertainty > 0) {
					t.Fatalf("uncertain %v but value %+v", s.Uncertain, v)
				}
			}
		}
	})
}
