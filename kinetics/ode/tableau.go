package ode

// RosenbrockTableau holds a Rosenbrock method with embedded error estimate in the
// implementation form of Hairer & Wanner (Solving ODEs II, 2nd ed., Sect. IV.7): with
// U_i = Σ_j γ_ij·k_j, each stage solves
//
//	(I/(hγ) − J)·U_i = f(t + Alpha_i·h, y + Σ_{j<i} A_ij·U_j) + Σ_{j<i} (C_ij/h)·U_j + h·GammaSum_i·∂f/∂t
//
// and y₁ = y + Σ M_i·U_i, error estimate Σ E_i·U_i.
type RosenbrockTableau struct {
	Name     string
	Citation string
	// Order is the order of y₁, EmbeddedOrder that of the embedded solution y₁ − Σ E_i·U_i.
	Order, EmbeddedOrder int
	// Gamma is the diagonal coefficient γ.
	Gamma float64
	// A and C are strictly lower triangular (row i has i entries).
	A, C [][]float64
	// M are the solution weights, E the error weights.
	M, E []float64
	// Alpha are the stage times α_i = Σ_j α_ij; GammaSum are γ_i = Σ_j γ_ij (with γ_ii = γ).
	Alpha, GammaSum []float64
}

// Stages returns the number of stages.
func (tb *RosenbrockTableau) Stages() int { return len(tb.M) }

// RODAS4 is the stiffly accurate, L-stable Rosenbrock method of order 4 with embedded order 3
// and six stages, coefficients as in Hairer & Wanner, Solving Ordinary Differential Equations II,
// 2nd ed. (Springer 1996), Sect. IV.7, method RODAS, in the implementation form used by their
// code RODAS (METH = 1); the digits agree with several public copies of that code. Stages 5 and 6 sit at t+h; y₁ is the argument of stage 6 plus
// U₆ and U₆ is the error estimate.
var RODAS4 = &RosenbrockTableau{
	Name:          "RODAS4",
	Citation:      "Hairer & Wanner, Solving Ordinary Differential Equations II, 2nd ed., Springer 1996, Sect. IV.7",
	Order:         4,
	EmbeddedOrder: 3,
	Gamma:         0.25,
	A: [][]float64{
		{},
		{1.544},
		{0.9466785280815826, 0.2557011698983284},
		{3.314825187068521, 2.896124015972201, 0.9986419139977817},
		{1.221224509226641, 6.019134481288629, 12.53708332932087, -0.6878860361058950},
		{1.221224509226641, 6.019134481288629, 12.53708332932087, -0.6878860361058950, 1},
	},
	C: [][]float64{
		{},
		{-5.6688},
		{-2.430093356833875, -0.2063599157091915},
		{-0.1073529058151375, -9.594562251023355, -20.47028614809616},
		{7.496443313967647, -10.24680431464352, -33.99990352819905, 11.70890893206160},
		{8.083246795921522, -7.981132988064893, -31.52159432874371, 16.31930543123136, -6.058818238834054},
	},
	M:        []float64{1.221224509226641, 6.019134481288629, 12.53708332932087, -0.6878860361058950, 1, 1},
	E:        []float64{0, 0, 0, 0, 0, 1},
	Alpha:    []float64{0, 0.386, 0.21, 0.63, 1, 1},
	GammaSum: []float64{0.25, -0.1043, 0.1035, -0.3620000000000023e-01, 0, 0},
}

// ROS34PW2 is the L-stable, stiffly accurate Rosenbrock method of order 3 with embedded order 2
// and four stages of Rang & Angermann, "New Rosenbrock W-methods of order 3 for partial
// differential algebraic equations of index 1", BIT Numer. Math. 45, 761–787 (2005), given
// in the standard form α_ij, γ_ij, b, b̂ and converted here to the implementation form. The
// digits are from memory; the order-condition and L-stability tests verify them.
var ROS34PW2 = fromStandard("ROS34PW2",
	"Rang & Angermann, BIT Numer. Math. 45, 761–787 (2005)", 3, 2,
	0.435866521508459,
	[][]float64{
		{},
		{0.87173304301691801},
		{0.84457060015369423, -0.11299064236484185},
		{0, 0, 1},
	},
	[][]float64{
		{},
		{-0.87173304301691801},
		{-0.90338057013044082, 0.054180672388095326},
		{0.24212380706095346, -1.2232505839045147, 0.54526025533510214},
	},
	[]float64{0.24212380706095346, -1.2232505839045147, 1.5452602553351020, 0.435866521508459},
	[]float64{0.37810903145819369, -0.096042292212423178, 0.5, 0.2179332607542295},
)

// fromStandard converts a Rosenbrock method given as α_ij, γ_ij (strictly lower), γ, b and b̂
// (Hairer & Wanner Sect. IV.7) to the implementation form: with Γ = (γ_ij) including the
// diagonal, A = α·Γ⁻¹, C = diag(1/γ) − Γ⁻¹, M = bᵀ·Γ⁻¹, E = (b − b̂)ᵀ·Γ⁻¹.
func fromStandard(name, cite string, p, ph int, gamma float64, alpha, gam [][]float64, b, bh []float64) *RosenbrockTableau {
	s := len(b)
	g := make([][]float64, s) // Γ, lower triangular
	for i := range s {
		g[i] = make([]float64, s)
		copy(g[i], gam[i])
		g[i][i] = gamma
	}
	inv := lowerInverse(g)
	tb := &RosenbrockTableau{Name: name, Citation: cite, Order: p, EmbeddedOrder: ph, Gamma: gamma,
		A: make([][]float64, s), C: make([][]float64, s), M: make([]float64, s), E: make([]float64, s),
		Alpha: make([]float64, s), GammaSum: make([]float64, s)}
	for i := range s {
		tb.A[i] = make([]float64, i)
		tb.C[i] = make([]float64, i)
		for j := range i {
			for k := j; k < i; k++ {
				tb.A[i][j] += alpha[i][k] * inv[k][j]
			}
			tb.C[i][j] = -inv[i][j]
		}
		for j := range i {
			tb.Alpha[i] += alpha[i][j]
		}
		for j := 0; j <= i; j++ {
			tb.GammaSum[i] += g[i][j]
		}
		for k := i; k < s; k++ {
			tb.M[i] += b[k] * inv[k][i]
			tb.E[i] += (b[k] - bh[k]) * inv[k][i]
		}
	}
	return tb
}

// lowerInverse inverts a lower triangular matrix by forward substitution.
func lowerInverse(l [][]float64) [][]float64 {
	n := len(l)
	inv := make([][]float64, n)
	for i := range n {
		inv[i] = make([]float64, n)
	}
	for j := range n {
		inv[j][j] = 1 / l[j][j]
		for i := j + 1; i < n; i++ {
			var sum float64
			for k := j; k < i; k++ {
				sum += l[i][k] * inv[k][j]
			}
			inv[i][j] = -sum / l[i][i]
		}
	}
	return inv
}

// Standard returns the method in the standard form of Hairer & Wanner Sect. IV.7: α_ij and
// γ_ij as full lower triangular s×s arrays (γ with the diagonal γ), and the weights b and b̂.
// It inverts the transformation of the implementation form: Γ = (diag(1/γ) − C)⁻¹, α = A·Γ,
// b = M·Γ, b̂ = (M − E)·Γ.
func (tb *RosenbrockTableau) Standard() (alpha, gam [][]float64, b, bh []float64) {
	s := tb.Stages()
	ginv := make([][]float64, s)
	for i := range s {
		ginv[i] = make([]float64, s)
		for j := range i {
			ginv[i][j] = -tb.C[i][j]
		}
		ginv[i][i] = 1 / tb.Gamma
	}
	gam = lowerInverse(ginv)
	alpha = make([][]float64, s)
	b, bh = make([]float64, s), make([]float64, s)
	for i := range s {
		alpha[i] = make([]float64, s)
		for j := range i {
			for k := j; k < i; k++ {
				alpha[i][j] += tb.A[i][k] * gam[k][j]
			}
		}
		for k := i; k < s; k++ {
			b[i] += tb.M[k] * gam[k][i]
			bh[i] += (tb.M[k] - tb.E[k]) * gam[k][i]
		}
	}
	return alpha, gam, b, bh
}
