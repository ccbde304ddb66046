package build

import (
	"fmt"
	"math"
)

// paschenReference is the temperature of the Townsend fits [K]: pd is reduced to it.
const paschenReference = 293.15

// ReducedPD returns p·d reduced to 293.15 K, p·d·(293.15/T) [Pa m]: Paschen's law holds in N·d.
func ReducedPD(pressure, gap, temperature float64) float64 {
	return pressure * gap * paschenReference / temperature
}

// Breakdown returns the static breakdown voltage of a uniform gap [V] from Paschen's law
// V_b = B·pd / ln(A·pd / ln(1 + 1/γ)), with pd reduced to 293.15 K [Pa m]. Left of the
// Paschen minimum where the logarithm falls to zero or below, the gap cannot break down by the
// Townsend mechanism and an error is returned.
func (t Townsend) Breakdown(pd float64) (float64, error) {
	den := math.Log(t.A * pd / math.Log(1+1/t.Gamma))
	if !(pd > 0) || den <= 0 {
		return 0, fmt.Errorf("build: Paschen's law has no breakdown voltage at pd = %.3g Pa m (the left branch ends at %.3g Pa m)",
			pd, math.Log(1+1/t.Gamma)/t.A)
	}
	return t.B * pd / den, nil
}

// Minimum returns the Paschen minimum: (pd)_min = e·ln(1+1/γ)/A [Pa m] and
// V_min = e·B·ln(1+1/γ)/A [V].
func (t Townsend) Minimum() (pd, v float64) {
	k := math.E * math.Log(1+1/t.Gamma) / t.A
	return k, t.B * k
}
