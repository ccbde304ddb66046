// Package ode integrates initial value problems y′ = f(t, y) for the small, very stiff
// systems of the laser model (the discharge circuit, whose plasma resistance times gap
// capacitance falls to ~1e-15 s while the pulse lasts 10–100 ns).
//
// Two adaptive integrators share one interface:
//
//   - Rosenbrock: linearly implicit Rosenbrock methods with an embedded error estimate.
//     The default table is RODAS4 (order 4(3), six stages, stiffly accurate, L-stable;
//     Hairer & Wanner, Solving Ordinary Differential Equations II, 2nd ed., Springer 1996,
//     Sect. IV.7). ROS34PW2 (order 3(2), four stages, L-stable; Rang & Angermann, BIT 45,
//     761–787, 2005) is offered as a cheaper alternative. Each stage solves
//
//     (I/(hγ) − J)·U_i = f(t + α_i·h, y + Σ_j a_ij·U_j) + Σ_j (c_ij/h)·U_j + h·γ_i·∂f/∂t
//
//     with y₁ = y + Σ m_i·U_i (the implementation form of Hairer & Wanner, Sect. IV.7).
//     The Jacobian J comes from the system when it implements Jacobian, otherwise from
//     column-wise forward differences; the iteration matrix is factorised in place by
//     LAPACK's Getrf (gonum's lapack64), with no allocation per step.
//
//   - DormandPrince: the explicit Runge–Kutta pair 5(4) of Dormand & Prince (J. Comput. Appl.
//     Math. 6, 19–26, 1980) with first-same-as-last, for non-stiff problems.
//
// Error control uses the weighted root-mean-square norm of SUNDIALS,
//
//	‖e‖ = sqrt( (1/n)·Σ_i (e_i / (AbsTol_i + RelTol·max(|y_i|, |y₁_i|)))² ),
//
// and a step is accepted when ‖e‖ ≤ 1. Times are in seconds (any consistent unit works; error
// messages print "s"). Integration runs forward in time only.
//
// AdvanceTo(t) ends a step exactly on t (shortening the step that would pass it; the step
// size proposal is kept for the next step), so its result carries the method's full accuracy.
// Within the last accepted step, Interpolate evaluates the cubic Hermite interpolant through
// both ends' values and derivatives (error O(h⁴), not controlled) at no cost: to sample a
// solution on a grid much finer than the steps, call Step and Interpolate each grid time it
// covers, and bound MaxStep so the interpolant resolves the solution.
// Times listed in Settings.Stops are hit exactly by a step end; the right-hand side may change
// there (a switch closing), and the step after a stop evaluates it just after the stop time, so a
// system that changes its equations for t > stop sees the old equations up to and at the stop.
//
// A right-hand side that returns an error marks a recoverable failure (for example a quantity
// outside its domain): the step is retried with a smaller step size. An error wrapping ErrFatal
// aborts the integration at once.
package ode
