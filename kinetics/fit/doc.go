// Package fit calibrates a design on a builder's measurements: it adjusts a few design keys
// (the "free" keys, each within bounds) until the model reproduces measured pulse figures at
// the measured points, and says how well the data pin each key down.
//
// The measure of misfit is weighted least squares in logarithms, the usual choice for
// quantities spanning decades and measured with a relative error:
//
//	χ²(θ) = Σ_k [(ln y_k(θ) − ln m_k) / s_k]²,   θ_j = ln x_j,
//
// with m_k a measured value, y_k the model's value of the same figure at the same point, and
// s_k = σ_k/m_k its relative standard uncertainty. When the file gives no uncertainties every
// s_k is 1 and the common scatter s² = χ²_min/(n − p) is estimated afterwards (n values, p
// determined keys).
//
// Method: the bounds are removed by θ_j = c_j + b_j·tanh(u_j) (c, b the centre and half-width of
// [ln lo, ln hi]), and χ² is minimised over u by gonum's Newton method with the Gauss–Newton
// matrix 2·JᵀJ in place of the Hessian (J = ∂r/∂θ, forward differences of step 0.01 in ln x by
// gonum/diff/fd; the model's own numerical noise in ln y is about 1e-6, far below the
// step). Several starts: the base design's values, then Latin-hypercube points of the box in
// ln x (seeded, so reproducible); the lowest χ² wins.
//
// Uncertainty of the result, from J at the optimum (the linearised model): the covariance of
// θ is (JᵀJ)⁻¹ (times s² when the scatter was estimated), the 95 % interval is
// θ ± t·sd with t the normal quantile (uncertainties given) or Student's t with n − p degrees
// of freedom (scatter estimated), and the correlation matrix is the covariance scaled by the
// standard deviations. These intervals describe the data's pull on the keys through the model;
// they say nothing about the model's own errors.
//
// A key is reported as not determined, and is never given a value with an interval, when
//   - J is rank-deficient along it: a singular value of J below 1e-3 of the largest whose
//     right singular vector has a component above 0.2 on the key (the data do not move with
//     the key, or only a combination of keys is seen), or
//   - its 95 % interval spans more than a factor MaxSpread (10 by default) or covers the whole
//     range between the bounds, or
//   - it ends within 2 % of a bound (the data pull it beyond what the bounds allow).
//
// Runs that fail at a trial point count as an infinite χ² there; the run counter says how many
// shots a fit took.
package fit
