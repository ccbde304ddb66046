package ode

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"
)

// Rosenbrock is an adaptive linearly implicit Rosenbrock integrator for stiff systems. The zero
// value is not usable; create one with NewRosenbrock.
type Rosenbrock struct {
	core
	tab *RosenbrockTableau

	jac, w    *mat.Dense
	ipiv      []int     // row pivots of the LU factors of w (LAPACK Getrf, in place)
	ft        []float64 // ∂f/∂t at the step start
	u         [][]float64
	rhs, ytmp []float64
	jacValid  bool
	yScale    []float64 // largest |y_j| seen, the scale of difference increments
}

var _ Integrator = (*Rosenbrock)(nil)

// NewRosenbrock returns a Rosenbrock integrator using the method tab; nil means RODAS4.
func NewRosenbrock(tab *RosenbrockTableau) *Rosenbrock {
	if tab == nil {
		tab = RODAS4
	}
	return &Rosenbrock{tab: tab}
}

// Method returns the coefficient table in use.
func (r *Rosenbrock) Method() *RosenbrockTableau { return r.tab }

// Init starts an integration of sys from (t0, y0) with settings s (nil for defaults).
func (r *Rosenbrock) Init(sys System, t0 float64, y0 []float64, s *Settings) error {
	if err := r.core.init(sys, t0, y0, s); err != nil {
		return err
	}
	n := r.n
	if r.jac == nil || r.jac.RawMatrix().Rows != n {
		r.jac, r.w = mat.NewDense(n, n, nil), mat.NewDense(n, n, nil)
		r.rhs, r.ytmp, r.ft = make([]float64, n), make([]float64, n), make([]float64, n)
		r.ipiv = make([]int, n)
		r.u = nil
	}
	for len(r.u) < r.tab.Stages() {
		r.u = append(r.u, make([]float64, n))
	}
	r.yScale = resize(r.yScale, n)
	for i, v := range y0 {
		r.yScale[i] = math.Abs(v)
	}
	r.jacValid = false
	r.h = r.initialStep(r.tab.Order)
	r.ready = true
	return nil
}

// Step takes one accepted step and returns the new time [s].
func (r *Rosenbrock) Step() (float64, error) {
	err := r.step(r, math.Inf(1))
	return r.t, err
}

// AdvanceTo sets the state to y(t) [s]: interpolated within the last step, otherwise by
// stepping with the last step ending exactly on t.
func (r *Rosenbrock) AdvanceTo(t float64) error { return r.advanceTo(r, t) }

func (r *Rosenbrock) order() int        { return r.tab.Order }
func (r *Rosenbrock) exponent() float64 { return 1 / float64(min(r.tab.Order, r.tab.EmbeddedOrder)+1) }
func (r *Rosenbrock) accepted()         { r.jacValid = false }
func (r *Rosenbrock) predictive() bool  { return true }

// tStart is the time at which the step start is evaluated: just after t when t is a stop.
func (r *Rosenbrock) tStart() float64 {
	if r.nextStop > 0 && r.cfg.stops[r.nextStop-1] == r.t {
		return math.Nextafter(r.t, math.Inf(1))
	}
	return r.t
}

var errSingular = errors.New("ode: singular iteration matrix")

func (r *Rosenbrock) try(h float64) (float64, error) {
	n, tb := r.n, r.tab
	if !r.jacValid {
		if err := r.jacobian(h); err != nil {
			return 0, err
		}
		r.jacValid = true
	}
	fac := 1 / (h * tb.Gamma)
	jr, wr := r.jac.RawMatrix(), r.w.RawMatrix()
	for i := range n {
		for j := range n {
			wr.Data[i*wr.Stride+j] = -jr.Data[i*jr.Stride+j]
		}
		wr.Data[i*wr.Stride+i] += fac
	}
	// LU factors in place through LAPACK directly: mat.LU would also estimate the condition
	// number at every factorisation, a cost this small system feels on every step.
	if !lapack64.Getrf(wr, r.ipiv) {
		r.stats.Factorizations++
		return 0, errSingular
	}
	r.stats.Factorizations++
	for s := range tb.Stages() {
		if s == 0 {
			copy(r.rhs, r.f)
		} else {
			copy(r.ytmp, r.y)
			for j, a := range tb.A[s] {
				if a != 0 {
					floats.AddScaled(r.ytmp, a, r.u[j])
				}
			}
			if err := r.eval(r.t+tb.Alpha[s]*h, r.ytmp, r.rhs); err != nil {
				return 0, err
			}
		}
		for j, c := range tb.C[s] {
			if c != 0 {
				floats.AddScaled(r.rhs, c/h, r.u[j])
			}
		}
		if g := tb.GammaSum[s]; g != 0 {
			floats.AddScaled(r.rhs, h*g, r.ft)
		}
		copy(r.u[s], r.rhs)
		lapack64.Getrs(blas.NoTrans, wr, blas64.General{Rows: n, Cols: 1, Stride: 1, Data: r.u[s]}, r.ipiv)
	}
	copy(r.yNew, r.y)
	for i := range r.ytmp {
		r.ytmp[i] = 0
	}
	for s := range tb.Stages() {
		if m := tb.M[s]; m != 0 {
			floats.AddScaled(r.yNew, m, r.u[s])
		}
		if e := tb.E[s]; e != 0 {
			floats.AddScaled(r.ytmp, e, r.u[s])
		}
	}
	errNorm := r.cfg.weightedRMS(r.ytmp, r.y, r.yNew)
	if errNorm <= 1 {
		if err := r.eval(r.t+h, r.yNew, r.fNew); err != nil {
			return 0, err
		}
	}
	return errNorm, nil
}

// jacobian computes ∂f/∂y and ∂f/∂t at the step start, analytically when the system provides
// them, otherwise by forward differences. The increments follow the CVODE difference quotient
// (Hindmarsh et al., ACM TOMS 31, 363–396, 2005), δ_j = max(√ε·|y_j|, δ_min/w_j) with w_j
// the error weight and δ_min = 1000·ε·|h|·n·‖f‖, except that |y_j| is replaced by the largest
// |y_j| seen so far: a component passing through zero (a charge, a current) keeps an increment
// of its own scale instead of one drowned by rounding.
func (r *Rosenbrock) jacobian(h float64) error {
	t := r.tStart()
	r.stats.JacEvals++
	if js, ok := r.sys.(Jacobian); ok {
		r.jac.Zero()
		js.Jacobian(t, r.y, r.jac)
	} else if err := r.diffJacobian(t, h); err != nil {
		return err
	}
	if td, ok := r.sys.(TimeDerivative); ok {
		td.TimeDerivative(t, r.y, r.ft)
		return nil
	}
	dt := math.Min(math.Sqrt(epsilon)*math.Max(math.Abs(t), h), h)
	dt = (t + dt) - t
	if dt <= 0 {
		for i := range r.ft {
			r.ft[i] = 0
		}
		return nil
	}
	if err := r.eval(t+dt, r.y, r.ft); err != nil {
		return err
	}
	for i := range r.ft {
		r.ft[i] = (r.ft[i] - r.f[i]) / dt
	}
	return nil
}

func (r *Rosenbrock) diffJacobian(t, h float64) error {
	srur := math.Sqrt(epsilon)
	fnorm := r.cfg.weightedRMS(r.f, r.y, nil)
	minInc := 1.0
	if fnorm > 0 {
		minInc = 1000 * epsilon * math.Abs(h) * float64(r.n) * fnorm
	}
	jr := r.jac.RawMatrix()
	copy(r.ytmp, r.y)
	for j := range r.n {
		yj := r.y[j]
		r.yScale[j] = math.Max(r.yScale[j], math.Abs(yj))
		sc := r.cfg.atol[j] + r.cfg.rtol*math.Abs(yj)
		d := math.Max(srur*r.yScale[j], minInc*sc)
		if d == 0 {
			d = srur
		}
		var err error
		for _, sign := range []float64{1, -1} {
			r.ytmp[j] = yj + sign*d
			dj := r.ytmp[j] - yj
			if err = r.eval(t, r.ytmp, r.rhs); err == nil {
				for i := range r.n {
					jr.Data[i*jr.Stride+j] = (r.rhs[i] - r.f[i]) / dj
				}
				break
			}
			if errors.Is(err, ErrFatal) {
				return err
			}
		}
		r.ytmp[j] = yj
		if err != nil {
			return fmt.Errorf("ode: difference Jacobian, column %d: %w", j, err)
		}
	}
	return nil
}
