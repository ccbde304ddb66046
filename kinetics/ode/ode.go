package ode

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
)

// System is a right-hand side y′ = f(t, y) of fixed dimension.
type System interface {
	// Dim returns the number of state variables.
	Dim() int
	// Eval stores f(t, y) in dydt. It must not keep y or dydt. A returned error is a
	// recoverable failure (the step is retried smaller) unless it wraps ErrFatal.
	Eval(t float64, y, dydt []float64) error
}

// Jacobian is implemented by a System that can compute ∂f/∂y analytically.
type Jacobian interface {
	// Jacobian stores ∂f_i/∂y_j at (t, y) in dst, an n×n matrix.
	Jacobian(t float64, y []float64, dst *mat.Dense)
}

// TimeDerivative is implemented by a System that can compute ∂f/∂t analytically. Without it a
// Rosenbrock integrator uses a forward difference (one extra evaluation per Jacobian).
type TimeDerivative interface {
	// TimeDerivative stores ∂f/∂t at (t, y) in dst.
	TimeDerivative(t float64, y, dst []float64)
}

// Settings controls an integration. A nil *Settings or a zero field means the default.
type Settings struct {
	// RelTol is the relative tolerance; default 1e-6. Allowed range [0, 1).
	RelTol float64
	// AbsTol is the absolute tolerance of each component, in the component's unit; nil means
	// 1e-12 for all. If given it must have length Dim and non-negative entries.
	AbsTol []float64
	// InitialStep is the first step size [s]; zero means an estimate from f(t0, y0).
	InitialStep float64
	// MaxStep bounds the step size [s]; zero means no bound.
	MaxStep float64
	// MinStep is the smallest step size [s] before ErrStepUnderflow; zero means a few
	// rounding units of t.
	MinStep float64
	// MaxSteps is the maximum number of step attempts (accepted and rejected) since Init;
	// default 100000.
	MaxSteps int
	// Stops are times [s] that a step must end on exactly (switch closure, pulse edges).
	// Their order does not matter; stops before t0 are ignored.
	Stops []float64
}

// Default settings.
const (
	DefaultRelTol   = 1e-6
	DefaultAbsTol   = 1e-12
	DefaultMaxSteps = 100000
)

// Stats counts the work done since Init.
type Stats struct {
	Steps          int // accepted steps
	Rejected       int // rejected step attempts (error too large, failed evaluation, singular matrix)
	Failures       int // of Rejected, those rejected because an evaluation failed or the matrix was singular
	FuncEvals      int // evaluations of f, including those for difference Jacobians
	JacEvals       int // Jacobian evaluations (analytic or by differences)
	Factorizations int // LU factorisations of the iteration matrix
}

// String formats the counters for a statistics block.
func (s Stats) String() string {
	return fmt.Sprintf("steps %d, rejected %d (%d failed evaluations), f evaluations %d, Jacobians %d, factorisations %d",
		s.Steps, s.Rejected, s.Failures, s.FuncEvals, s.JacEvals, s.Factorizations)
}

// Integrator is the interface shared by the integrators of this package.
type Integrator interface {
	// Init starts an integration of sys from (t0, y0). It may be called again to restart,
	// reusing storage when the dimension is unchanged.
	Init(sys System, t0 float64, y0 []float64, s *Settings) error
	// Step takes one accepted step and returns the new time.
	Step() (t float64, err error)
	// AdvanceTo sets the state to y(t): interpolated if t lies within the last step,
	// otherwise by stepping, the last step shortened to end exactly on t.
	AdvanceTo(t float64) error
	// State returns the time and solution of the last Step or AdvanceTo. The slice is owned by
	// the integrator and overwritten by the next call.
	State() (t float64, y []float64)
	// Stats returns the work counters since Init.
	Stats() Stats
}

// Errors returned (wrapped in a *StepError) by the integrators.
var (
	// ErrStepUnderflow: the step size fell below the minimum step.
	ErrStepUnderflow = errors.New("step size underflow")
	// ErrMaxSteps: Settings.MaxSteps step attempts were used up.
	ErrMaxSteps = errors.New("too many steps")
	// ErrFatal is wrapped by a System's error to abort the integration instead of retrying.
	ErrFatal = errors.New("fatal right-hand side failure")
	// ErrNotStarted: Step or AdvanceTo called before a successful Init.
	ErrNotStarted = errors.New("integrator not initialised")
)

// StepError is an integration failure at time T with step size H.
type StepError struct {
	T, H float64 // time [s] and step size [s] at the failure
	Err  error   // the cause; errors.Is(e, ErrStepUnderflow) etc. work through it
}

func (e *StepError) Error() string {
	return fmt.Sprintf("ode: %v at t=%.6g s (h=%.3g s)", e.Err, e.T, e.H)
}

// Unwrap returns the cause.
func (e *StepError) Unwrap() error { return e.Err }

// config is a validated copy of Settings.
type config struct {
	rtol     float64
	atol     []float64
	h0       float64
	maxStep  float64
	minStep  float64
	maxSteps int
	stops    []float64
}

func (c *config) set(s *Settings, n int, t0 float64) error {
	if s == nil {
		s = &Settings{}
	}
	bad := func(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) || v < 0 }
	switch {
	case bad(s.RelTol) || s.RelTol >= 1:
		return fmt.Errorf("ode: Settings.RelTol = %g, want 0 ≤ RelTol < 1", s.RelTol)
	case bad(s.InitialStep):
		return fmt.Errorf("ode: Settings.InitialStep = %g s, want ≥ 0 and finite", s.InitialStep)
	case bad(s.MaxStep):
		return fmt.Errorf("ode: Settings.MaxStep = %g s, want ≥ 0 and finite", s.MaxStep)
	case bad(s.MinStep):
		return fmt.Errorf("ode: Settings.MinStep = %g s, want ≥ 0 and finite", s.MinStep)
	case s.MaxStep > 0 && s.MinStep > s.MaxStep:
		return fmt.Errorf("ode: Settings.MinStep = %g s exceeds MaxStep = %g s", s.MinStep, s.MaxStep)
	case s.MaxSteps < 0:
		return fmt.Errorf("ode: Settings.MaxSteps = %d, want ≥ 0", s.MaxSteps)
	case s.AbsTol != nil && len(s.AbsTol) != n:
		return fmt.Errorf("ode: len(Settings.AbsTol) = %d, want the system dimension %d", len(s.AbsTol), n)
	}
	c.rtol = s.RelTol
	if c.rtol == 0 {
		c.rtol = DefaultRelTol
	}
	c.atol = resize(c.atol, n)
	for i := range c.atol {
		if s.AbsTol == nil {
			c.atol[i] = DefaultAbsTol
			continue
		}
		if bad(s.AbsTol[i]) {
			return fmt.Errorf("ode: Settings.AbsTol[%d] = %g, want ≥ 0 and finite", i, s.AbsTol[i])
		}
		c.atol[i] = s.AbsTol[i]
		if c.atol[i] == 0 && c.rtol == 0 {
			return fmt.Errorf("ode: Settings.AbsTol[%d] and RelTol are both zero", i)
		}
	}
	c.h0, c.minStep = s.InitialStep, s.MinStep
	c.maxStep = s.MaxStep
	if c.maxStep == 0 {
		c.maxStep = math.Inf(1)
	}
	c.maxSteps = s.MaxSteps
	if c.maxSteps == 0 {
		c.maxSteps = DefaultMaxSteps
	}
	c.stops = c.stops[:0]
	for i, ts := range s.Stops {
		if math.IsNaN(ts) || math.IsInf(ts, 0) {
			return fmt.Errorf("ode: Settings.Stops[%d] = %g s, want a finite time", i, ts)
		}
		if ts > t0 {
			c.stops = append(c.stops, ts)
		}
	}
	sort.Float64s(c.stops)
	return nil
}

// weightedRMS returns the SUNDIALS weighted RMS norm of e with weights from y0 and y1
// (y1 may be nil).
func (c *config) weightedRMS(e, y0, y1 []float64) float64 {
	var sum float64
	for i, ei := range e {
		sc := math.Abs(y0[i])
		if y1 != nil {
			sc = math.Max(sc, math.Abs(y1[i]))
		}
		sc = c.atol[i] + c.rtol*sc
		r := ei / sc
		sum += r * r
	}
	return math.Sqrt(sum / float64(len(e)))
}

func resize(s []float64, n int) []float64 {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]float64, n)
}
