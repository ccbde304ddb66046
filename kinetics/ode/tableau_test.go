package ode

import (
	"math"
	"math/cmplx"
	"testing"
)

// rosenbrockConditions returns the residuals of the Rosenbrock order conditions up to order p
// for weights w (Hairer & Wanner, Solving ODEs II, 2nd ed., Table IV.7.1), with
// β_ij = α_ij + γ_ij (j < i), β′_i = Σ_j β_ij and α_i = Σ_j α_ij.
func rosenbrockConditions(alpha, gam [][]float64, gamma float64, w []float64, p int) []float64 {
	s := len(w)
	beta := make([][]float64, s)
	ai, bp := make([]float64, s), make([]float64, s)
	for i := range s {
		beta[i] = make([]float64, s)
		for j := range i {
			beta[i][j] = alpha[i][j] + gam[i][j]
			ai[i] += alpha[i][j]
			bp[i] += beta[i][j]
		}
	}
	dot := func(f func(i int) float64) float64 {
		var sum float64
		for i := range s {
			sum += w[i] * f(i)
		}
		return sum
	}
	mul := func(m [][]float64, v []float64) []float64 {
		out := make([]float64, s)
		for i := range s {
			for j := range i {
				out[i] += m[i][j] * v[j]
			}
		}
		return out
	}
	sq := func(v []float64) []float64 {
		out := make([]float64, s)
		for i := range v {
			out[i] = v[i] * v[i]
		}
		return out
	}
	g := gamma
	var r []float64
	r = append(r, dot(func(int) float64 { return 1 })-1)
	if p >= 2 {
		r = append(r, dot(func(i int) float64 { return bp[i] })-(0.5-g))
	}
	if p >= 3 {
		bbp := mul(beta, bp)
		r = append(r,
			dot(func(i int) float64 { return ai[i] * ai[i] })-1.0/3,
			dot(func(i int) float64 { return bbp[i] })-(1.0/6-g+g*g))
	}
	if p >= 4 {
		abp := mul(alpha, bp)
		ba2 := mul(beta, sq(ai))
		bbbp := mul(beta, mul(beta, bp))
		r = append(r,
			dot(func(i int) float64 { return ai[i] * ai[i] * ai[i] })-0.25,
			dot(func(i int) float64 { return ai[i] * abp[i] })-(1.0/8-g/3),
			dot(func(i int) float64 { return ba2[i] })-(1.0/12-g/3),
			dot(func(i int) float64 { return bbbp[i] })-(1.0/24-g/2+1.5*g*g-g*g*g))
	}
	return r
}

var rosenbrockTables = []*RosenbrockTableau{RODAS4, ROS34PW2}

// TestRosenbrockOrderConditions checks that each table's main and embedded weights satisfy
// the order conditions of Hairer & Wanner Table IV.7.1 up to their stated orders, and that
// the stage times and γ_i of the implementation form agree with the standard form.
func TestRosenbrockOrderConditions(t *testing.T) {
	t.Parallel()
	for _, tb := range rosenbrockTables {
		alpha, gam, b, bh := tb.Standard()
		for name, c := range map[string]struct {
			w []float64
			p int
		}{"main": {b, tb.Order}, "embedded": {bh, tb.EmbeddedOrder}} {
			for k, res := range rosenbrockConditions(alpha, gam, tb.Gamma, c.w, c.p) {
				if math.Abs(res) > 1e-12 {
					t.Errorf("%s %s weights: order condition %d residual %.3g", tb.Name, name, k+1, res)
				}
			}
		}
		// The embedded method must not also reach the main order, or the estimate vanishes.
		if res := rosenbrockConditions(alpha, gam, tb.Gamma, bh, tb.Order); maxAbs(res) < 1e-6 {
			t.Errorf("%s: embedded weights satisfy order %d too", tb.Name, tb.Order)
		}
		for i := range b {
			var as, gs float64
			for j := range i {
				as += alpha[i][j]
			}
			for j := 0; j <= i; j++ {
				gs += gam[i][j]
			}
			if math.Abs(as-tb.Alpha[i]) > 1e-12 || math.Abs(gs-tb.GammaSum[i]) > 1e-12 {
				t.Errorf("%s stage %d: α_i %v vs Σα_ij %v, γ_i %v vs Σγ_ij %v", tb.Name, i, tb.Alpha[i], as, tb.GammaSum[i], gs)
			}
		}
	}
}

func maxAbs(v []float64) float64 {
	var m float64
	for _, x := range v {
		m = math.Max(m, math.Abs(x))
	}
	return m
}

// stability returns R(z) = 1 + z·wᵀ(I − zB)⁻¹·1 with B = (α_ij + γ_ij), diagonal γ (Hairer &
// Wanner Sect. IV.7), by forward substitution.
func stability(tb *RosenbrockTableau, w []float64, z complex128) complex128 {
	alpha, gam, _, _ := tb.Standard()
	s := len(w)
	x := make([]complex128, s)
	r := complex(1, 0)
	for i := range s {
		sum := complex(1, 0)
		for j := range i {
			sum += z * complex(alpha[i][j]+gam[i][j], 0) * x[j]
		}
		x[i] = sum / (1 - z*complex(tb.Gamma, 0))
		r += z * complex(w[i], 0) * x[i]
	}
	return r
}

// TestLStability checks that both tables are A-stable (|R| ≤ 1 on the imaginary axis and in
// the left half plane) and L-stable (R(z) → 0 as z → −∞), as their sources state.
func TestLStability(t *testing.T) {
	t.Parallel()
	for _, tb := range rosenbrockTables {
		_, _, b, _ := tb.Standard()
		for _, x := range []float64{-1e6, -1e10, -1e14} {
			if r := cmplx.Abs(stability(tb, b, complex(x, 0))); r > 1e-5*1e6/(-x)+1e-12 {
				t.Errorf("%s: |R(%g)| = %.3g, want → 0 like 1/|z|", tb.Name, x, r)
			}
		}
		for k := -40; k <= 40; k++ {
			y := math.Pow(10, float64(k)/8)
			for _, re := range []float64{0, -0.1 * y, -y, -10 * y} {
				if r := cmplx.Abs(stability(tb, b, complex(re, y))); r > 1+1e-12 {
					t.Errorf("%s: |R(%g%+gi)| = %.15g > 1", tb.Name, re, y, r)
				}
			}
		}
	}
}

// TestStabilityMatchesExponential checks R(z) − e^z = O(z^(p+1)) near 0 (consistency of the
// stability function with the order; analytic).
func TestStabilityMatchesExponential(t *testing.T) {
	t.Parallel()
	for _, tb := range rosenbrockTables {
		_, _, b, _ := tb.Standard()
		d1 := cmplx.Abs(stability(tb, b, -0.02) - cmplx.Exp(-0.02))
		d2 := cmplx.Abs(stability(tb, b, -0.01) - cmplx.Exp(-0.01))
		if q := math.Log2(d1 / d2); math.Abs(q-float64(tb.Order+1)) > 0.2 {
			t.Errorf("%s: R(z) − e^z shrinks like z^%.2f, want z^%d", tb.Name, q, tb.Order+1)
		}
	}
}

// rkTree is a rooted tree: a list of subtrees hanging from the root.
type rkTree []rkTree

// treesOfOrder lists rooted trees with n nodes (with repetitions, harmless for checking).
func treesOfOrder(n int) []rkTree {
	if n == 1 {
		return []rkTree{{}}
	}
	var out []rkTree
	var build func(rem, minFirst int, acc rkTree)
	build = func(rem, maxPart int, acc rkTree) {
		if rem == 0 {
			out = append(out, append(rkTree(nil), acc...))
			return
		}
		for k := min(rem, maxPart); k >= 1; k-- {
			for _, sub := range treesOfOrder(k) {
				build(rem-k, k, append(acc, sub))
			}
		}
	}
	build(n-1, n-1, nil)
	return out
}

func treeOrder(t rkTree) int {
	n := 1
	for _, c := range t {
		n += treeOrder(c)
	}
	return n
}

// treeDensity is γ(t) = |t|·Π γ(children).
func treeDensity(t rkTree) float64 {
	g := float64(treeOrder(t))
	for _, c := range t {
		g *= treeDensity(c)
	}
	return g
}

// elementaryWeight returns Φ_i(t) = Π_children Σ_j a_ij Φ_j(child) for each stage i.
func elementaryWeight(t rkTree, a [7][6]float64) [7]float64 {
	var phi [7]float64
	for i := range phi {
		phi[i] = 1
	}
	for _, c := range t {
		pc := elementaryWeight(c, a)
		for i := range phi {
			var s float64
			for j := 0; j < i && j < 6; j++ {
				s += a[i][j] * pc[j]
			}
			phi[i] *= s
		}
	}
	return phi
}

// TestDormandPrinceOrderConditions checks the Butcher order conditions Σ b_i Φ_i(t) = 1/γ(t)
// for all rooted trees up to order 5 (fifth-order weights) and 4 (embedded weights), and the
// row sums c_i = Σ_j a_ij (Hairer, Nørsett & Wanner, Solving ODEs I, Theorem II.2.13).
func TestDormandPrinceOrderConditions(t *testing.T) {
	t.Parallel()
	for i := range dpC {
		var s float64
		for j := 0; j < i && j < 6; j++ {
			s += dpA[i][j]
		}
		if math.Abs(s-dpC[i]) > 1e-15 {
			t.Errorf("row %d: Σ a_ij = %v, c_i = %v", i, s, dpC[i])
		}
	}
	for _, c := range []struct {
		name string
		w    [7]float64
		p    int
	}{{"fifth-order", dpB, 5}, {"fourth-order", dpBHat, 4}} {
		for n := 1; n <= c.p; n++ {
			for _, tr := range treesOfOrder(n) {
				phi := elementaryWeight(tr, dpA)
				var s float64
				for i := range phi {
					s += c.w[i] * phi[i]
				}
				if res := s - 1/treeDensity(tr); math.Abs(res) > 1e-14 {
					t.Errorf("%s weights, tree of order %d: residual %.3g", c.name, n, res)
				}
			}
		}
	}
	if got := len(treesOfOrder(5)); got < 9 {
		t.Errorf("only %d trees of order 5 generated, want at least the 9 distinct ones", got)
	}
}

// TestOrderConditionsDetectErrors makes sure the two checkers above can fail: a coefficient
// changed in its seventh digit must break some condition.
func TestOrderConditionsDetectErrors(t *testing.T) {
	t.Parallel()
	bad := *RODAS4
	bad.A = append([][]float64(nil), RODAS4.A...)
	bad.A[2] = []float64{RODAS4.A[2][0], RODAS4.A[2][1] * (1 + 1e-6)}
	alpha, gam, b, _ := bad.Standard()
	if res := rosenbrockConditions(alpha, gam, bad.Gamma, b, 4); maxAbs(res) < 1e-9 {
		t.Errorf("perturbed RODAS4 still passes its order conditions (max residual %.3g)", maxAbs(res))
	}
	a := dpA
	a[4][2] *= 1 + 1e-6
	var worst float64
	for n := 1; n <= 5; n++ {
		for _, tr := range treesOfOrder(n) {
			phi := elementaryWeight(tr, a)
			var s float64
			for i := range phi {
				s += dpB[i] * phi[i]
			}
			worst = math.Max(worst, math.Abs(s-1/treeDensity(tr)))
		}
	}
	if worst < 1e-9 {
		t.Errorf("perturbed Dormand–Prince still passes its order conditions (max residual %.3g)", worst)
	}
}
