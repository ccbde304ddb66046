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

// HoldingPD returns the smallest reduced p·d [Pa m] on the right branch of Paschen's curve
// (at or above the minimum) whose static breakdown voltage is v [V]: a uniform gap holds v
// exactly when its reduced p·d is at least this. It is found by bisection in ln(pd) to a
// relative width of 1e-12 (Breakdown rises monotonically right of the minimum). v at or below
// the minimum sparking voltage returns the minimum's p·d.
func (t Townsend) HoldingPD(v float64) (float64, error) {
	if !(v > 0) || math.IsInf(v, 0) || !(t.A > 0) || !(t.B > 0) || !(t.Gamma > 0 && t.Gamma < 1) {
		return 0, fmt.Errorf("build: no holding p·d for %g V with A = %g, B = %g, γ = %g", v, t.A, t.B, t.Gamma)
	}
	lo, vmin := t.Minimum()
	if v <= vmin {
		return lo, nil
	}
	// Right of the minimum V_b > B·pd/ln(A·pd) grows faster than pd/ln(pd): doubling from
	// the minimum brackets v in a few dozen steps for any voltage a laser uses.
	hi := 2 * lo
	for {
		vb, err := t.Breakdown(hi)
		if err != nil {
			return 0, err
		}
		if vb >= v {
			break
		}
		lo, hi = hi, 2*hi
		if hi > 1e12 {
			return 0, fmt.Errorf("build: no holding p·d for %g V below 1e12 Pa m", v)
		}
	}
	for hi-lo > 1e-12*hi {
		mid := math.Sqrt(lo * hi)
		vb, err := t.Breakdown(mid)
		if err != nil {
			return 0, err
		}
		if vb >= v {
			hi = mid
		} else {
			lo = mid
		}
	}
	return hi, nil
}
