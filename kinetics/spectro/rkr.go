package spectro

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/integrate/quad"
	"gonum.org/v1/gonum/interp"
)

// First-order Rydberg–Klein–Rees (RKR) potential from the Dunham expansions G(v) and B_v:
// with k = ħ²/2μ [cm⁻¹ Å²], at each energy U = G(v) the turning points r± follow from
//
//	f = √k ∫ dv′ / √(G(v)−G(v′)),   g = (1/√k) ∫ B(v′) dv′ / √(G(v)−G(v′)),   (v′ from −½ to v)
//	r± = √(f/g + f²) ± f
//
// (R. Rydberg, Z. Phys. 73, 376, 1932; O. Klein, Z. Phys. 76, 226, 1932; A.L.G. Rees, Proc.
// Phys. Soc. 59, 998, 1947). The integrals are taken after the substitution
// v′ = −½ + (v+½)(1−t²), which removes the inverse-square-root end-point singularity, by
// Gauss–Legendre quadrature (gonum integrate/quad).

// RKRTurningPoints returns the inner and outer turning points [Å] of state s at the
// (continuous) vibrational quantum number v > −½, for reduced mass mu [u].
func RKRTurningPoints(s State, mu, v float64) (inner, outer float64) {
	k := KineticConstant(mu)
	x := v + 0.5
	gv := gCont(s, x)
	ff := func(t float64) float64 {
		xp := x * (1 - t*t)
		return 2 * x * t / math.Sqrt(gv-gCont(s, xp))
	}
	gg := func(t float64) float64 {
		xp := x * (1 - t*t)
		return bCont(s, xp) * 2 * x * t / math.Sqrt(gv-gCont(s, xp))
	}
	f := math.Sqrt(k) * quad.Fixed(ff, 0, 1, 64, nil, 0)
	g := quad.Fixed(gg, 0, 1, 64, nil, 0) / math.Sqrt(k)
	root := math.Sqrt(f/g + f*f)
	return root - f, root + f
}

// gCont and bCont are G and B_v at continuous x = v+½.
func gCont(s State, x float64) float64 { return x * (s.We + x*(-s.WeXe+x*(s.WeYe+x*s.WeZe))) }
func bCont(s State, x float64) float64 { return s.Be - s.AlphaE*x + s.GammaE*x*x }

// RKR returns the RKR potential [cm⁻¹, from the minimum] of state s built from turning points
// at v = −0.49 … vmax (steps of 0.1). The curve is interpolated in the signed root
// y = ±√V (negative on the inner branch), which is a smooth, monotone function of r through
// the minimum, by a not-a-knot cubic spline (gonum interp); V = y². Beyond the last turning
// points y continues along the state's Morse curve, shifted to join continuously. vmax must
// lie where G(v) still rises.
func RKR(s State, mu float64, vmax int) (Potential, error) {
	if vmax < 0 || vmax > 60 {
		return nil, fmt.Errorf("spectro: RKR vmax = %d, want 0…60", vmax)
	}
	var ri, ro, u []float64
	for v := -0.49; v <= float64(vmax)+1e-9; v += 0.1 {
		x := v + 0.5
		slope := s.We + x*(-2*s.WeXe+x*(3*s.WeYe+x*4*s.WeZe))
		if slope <= 0 {
			return nil, fmt.Errorf("spectro: RKR %s: G(v) stops rising below v = %.2f", s.Label, v)
		}
		a, b := RKRTurningPoints(s, mu, v)
		if math.IsNaN(a) || math.IsNaN(b) || a <= 0 || (len(ri) > 0 && (a >= ri[len(ri)-1] || b <= ro[len(ro)-1])) {
			return nil, fmt.Errorf("spectro: RKR %s: turning points not monotone at v = %.2f", s.Label, v)
		}
		ri, ro, u = append(ri, a), append(ro, b), append(u, gCont(s, x))
	}
	n := len(u)
	xs := make([]float64, 0, 2*n+1)
	ys := make([]float64, 0, 2*n+1)
	for i := n - 1; i >= 0; i-- {
		xs, ys = append(xs, ri[i]), append(ys, -math.Sqrt(u[i]))
	}
	// the minimum: re is where y = 0; the turning points fix it to within the first-order
	// RKR accuracy, so take the midpoint of the two lowest turning points' zero crossing
	xs, ys = append(xs, 0.5*(ri[0]+ro[0])), append(ys, 0)
	for i := 0; i < n; i++ {
		xs, ys = append(xs, ro[i]), append(ys, math.Sqrt(u[i]))
	}
	var sp interp.NotAKnotCubic
	if err := sp.Fit(xs, ys); err != nil {
		return nil, fmt.Errorf("spectro: RKR %s: %w", s.Label, err)
	}
	de := s.We * s.We / (4 * s.WeXe)
	a := math.Sqrt(s.WeXe / KineticConstant(mu))
	ym := func(r float64) float64 { return math.Sqrt(de) * (1 - math.Exp(-a*(r-s.Re))) }
	rLo, rHi := xs[0], xs[len(xs)-1]
	shiftLo, shiftHi := ys[0]-ym(rLo), ys[len(ys)-1]-ym(rHi)
	return func(r float64) float64 {
		var y float64
		switch {
		case r < rLo:
			y = ym(r) + shiftLo
		case r > rHi:
			y = ym(r) + shiftHi
		default:
			y = sp.Predict(r)
		}
		return y * y
	}, nil
}
