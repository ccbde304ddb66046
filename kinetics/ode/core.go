package ode

import (
	"errors"
	"fmt"
	"math"
)

// stepper is the method-specific part of an integrator.
type stepper interface {
	// try attempts a step of size h from (core.t, core.y), with core.f = f at the step start.
	// On success it fills core.yNew and, when it returns an error norm ≤ 1, core.fNew =
	// f(t+h, yNew). A non-nil error is a failed evaluation.
	try(h float64) (errNorm float64, err error)
	// accepted is called after a step has been accepted.
	accepted()
	// order is the order used for the initial step estimate; exponent the step-size
	// controller exponent 1/(q+1); predictive whether to use Gustafsson's predictive
	// controller on accepted steps.
	order() int
	exponent() float64
	predictive() bool
}

// core holds what all integrators share: the state, the interpolant of the last step, stop
// handling, step-size control, statistics.
type core struct {
	sys   System
	n     int
	cfg   config
	ready bool

	t    float64   // current step point [s]
	y, f []float64 // y(t) and f at the step start (just after t if t is a stop)
	h    float64   // proposed next step [s]

	tPrev        float64
	yPrev, fPrev []float64 // start of the last accepted step
	fEnd         []float64 // f(t, y) as seen from inside the last step
	hasPrev      bool

	yNew, fNew []float64 // candidate step end

	tOut float64
	yOut []float64

	nextStop int
	facMax   float64 // growth bound of the next accepted step (1 after a rejection)
	hAcc     float64 // last accepted step size [s] (0 before the first), for the predictive controller
	errAcc   float64 // its error norm (floored at 1e-2)
	stats    Stats
}

func (c *core) init(sys System, t0 float64, y0 []float64, s *Settings) error {
	c.ready = false
	n := sys.Dim()
	if n <= 0 {
		return fmt.Errorf("ode: system dimension %d, want ≥ 1", n)
	}
	if len(y0) != n {
		return fmt.Errorf("ode: len(y0) = %d, want the system dimension %d", len(y0), n)
	}
	if math.IsNaN(t0) || math.IsInf(t0, 0) {
		return fmt.Errorf("ode: t0 = %g s, want a finite time", t0)
	}
	for i, v := range y0 {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("ode: y0[%d] = %g, want a finite value", i, v)
		}
	}
	if err := c.cfg.set(s, n, t0); err != nil {
		return err
	}
	c.sys, c.n = sys, n
	for _, p := range []*[]float64{&c.y, &c.f, &c.yPrev, &c.fPrev, &c.fEnd, &c.yNew, &c.fNew, &c.yOut} {
		*p = resize(*p, n)
	}
	c.t, c.tOut, c.tPrev = t0, t0, t0
	copy(c.y, y0)
	copy(c.yOut, y0)
	c.hasPrev = false
	c.nextStop = 0
	c.facMax = 6
	c.hAcc, c.errAcc = 0, 0
	c.stats = Stats{}
	if err := c.eval(t0, c.y, c.f); err != nil {
		return fmt.Errorf("ode: right-hand side at t0 = %g s: %w", t0, err)
	}
	copy(c.fEnd, c.f)
	return nil
}

// eval evaluates f, counts it and rejects non-finite results as a recoverable failure.
func (c *core) eval(t float64, y, dydt []float64) error {
	c.stats.FuncEvals++
	if err := c.sys.Eval(t, y, dydt); err != nil {
		return err
	}
	for i, v := range dydt {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("ode: f[%d] = %g at t=%g s", i, v, t)
		}
	}
	return nil
}

// initialStep estimates a first step after Hairer, Nørsett & Wanner, Solving ODEs I, 2nd ed.,
// Sect. II.4 ("starting step size"), with the weighted RMS norm.
func (c *core) initialStep(p int) float64 {
	hmax := c.cfg.maxStep
	if c.nextStop < len(c.cfg.stops) {
		hmax = math.Min(hmax, c.cfg.stops[c.nextStop]-c.t)
	}
	if c.cfg.h0 > 0 {
		return math.Min(c.cfg.h0, hmax)
	}
	d0 := c.cfg.weightedRMS(c.y, c.y, nil)
	d1 := c.cfg.weightedRMS(c.f, c.y, nil)
	h0 := 1e-6
	if d0 >= 1e-5 && d1 >= 1e-5 {
		h0 = 0.01 * d0 / d1
	}
	h0 = math.Min(h0, hmax)
	// One explicit Euler step estimates the second derivative; back off if it fails.
	for range 20 {
		for i := range c.yNew {
			c.yNew[i] = c.y[i] + h0*c.f[i]
		}
		if c.eval(c.t+h0, c.yNew, c.fNew) == nil {
			break
		}
		h0 *= 0.1
	}
	for i := range c.fNew {
		c.fNew[i] -= c.f[i]
	}
	d2 := c.cfg.weightedRMS(c.fNew, c.y, nil) / h0
	var h1 float64
	if dm := math.Max(d1, d2); dm <= 1e-15 || math.IsNaN(dm) {
		h1 = math.Max(1e-6, h0*1e-3)
	} else {
		h1 = math.Pow(0.01/dm, 1/float64(p+1))
	}
	return math.Min(math.Min(100*h0, h1), hmax)
}

// minStep is the smallest step allowed at time t: a few rounding units of t, and never so
// small that 1/h overflows (near t = 0).
func (c *core) minStep() float64 {
	return math.Max(c.cfg.minStep, math.Max(8*epsilon*math.Abs(c.t), 1e-280))
}

const epsilon = 0x1p-52

// step takes one accepted step with method s, ending at or before tlimit.
func (c *core) step(s stepper, tlimit float64) error {
	if !c.ready {
		return fmt.Errorf("ode: Step: %w", ErrNotStarted)
	}
	var cause error
	for {
		if c.stats.Steps+c.stats.Rejected >= c.cfg.maxSteps {
			return &StepError{T: c.t, H: c.h, Err: fmt.Errorf("%w (Settings.MaxSteps = %d)", ErrMaxSteps, c.cfg.maxSteps)}
		}
		h := math.Min(c.h, c.cfg.maxStep)
		hFree := h
		landing, clipped := false, false
		target := tlimit
		if c.nextStop < len(c.cfg.stops) && c.cfg.stops[c.nextStop] <= target {
			target, landing = c.cfg.stops[c.nextStop], true
		}
		if rem := target - c.t; 1.1*h >= rem {
			h, clipped = rem, true
		} else {
			landing = false
		}
		if !(h > 0) || h < c.minStep() {
			err := ErrStepUnderflow
			if cause != nil {
				err = fmt.Errorf("%w (last failure: %w)", ErrStepUnderflow, cause)
			}
			return &StepError{T: c.t, H: h, Err: err}
		}
		errNorm, err := s.try(h)
		if err != nil {
			if errors.Is(err, ErrFatal) {
				return &StepError{T: c.t, H: h, Err: err}
			}
			cause = err
			c.stats.Rejected++
			c.stats.Failures++
			c.h, c.facMax = 0.25*h, 1
			continue
		}
		if !(errNorm <= 1) {
			fac := 0.25
			if !math.IsNaN(errNorm) {
				fac = math.Max(0.2, 0.9*math.Pow(errNorm, -s.exponent()))
			}
			c.stats.Rejected++
			c.h, c.facMax = fac*h, 1
			continue
		}
		fac := c.facMax
		if errNorm > 0 {
			fac = math.Min(c.facMax, math.Max(0.2, 0.9*math.Pow(errNorm, -s.exponent())))
		}
		if s.predictive() && c.hAcc > 0 && !clipped {
			// Gustafsson's predictive controller (Hairer & Wanner, Solving ODEs II, 2nd ed.,
			// Sect. IV.8) as in their code RODAS: take the smaller of the two
			// proposals, which damps the oscillation between acceptance and rejection on
			// stiff problems.
			e := math.Max(errNorm, 1e-10)
			gus := 0.9 * (h / c.hAcc) * math.Pow(c.errAcc/(e*e), s.exponent())
			fac = math.Min(fac, math.Min(c.facMax, math.Max(0.2, gus)))
		}
		c.hAcc, c.errAcc = h, math.Max(errNorm, 1e-2)
		c.h, c.facMax = fac*h, 6
		if clipped {
			// A step shortened to hit a target says little about the free step size.
			c.h = math.Max(c.h, math.Min(hFree, fac*hFree))
		}
		c.accept(h, target, clipped, landing)
		s.accepted()
		return nil
	}
}

// accept moves the candidate (yNew, fNew) at t+h into the state. A clipped step ends exactly
// on target; landing says the target is a stop.
func (c *core) accept(h, target float64, clipped, landing bool) {
	c.stats.Steps++
	c.tPrev = c.t
	copy(c.yPrev, c.y)
	copy(c.fPrev, c.f)
	if clipped {
		c.t = target
	} else {
		c.t += h
	}
	for c.nextStop < len(c.cfg.stops) && c.cfg.stops[c.nextStop] <= c.t {
		c.nextStop++
	}
	copy(c.y, c.yNew)
	copy(c.fEnd, c.fNew)
	copy(c.f, c.fNew)
	c.hasPrev = true
	if landing {
		// The equations may change at a stop: the next step starts from f just after it.
		if err := c.eval(math.Nextafter(c.t, math.Inf(1)), c.y, c.f); err != nil {
			copy(c.f, c.fEnd)
		}
	}
	c.tOut = c.t
	copy(c.yOut, c.y)
}

// advanceTo steps with s until it lands on tout; a tout inside the last step is interpolated.
func (c *core) advanceTo(s stepper, tout float64) error {
	if !c.ready {
		return fmt.Errorf("ode: AdvanceTo: %w", ErrNotStarted)
	}
	if math.IsNaN(tout) || tout < c.tPrev {
		return fmt.Errorf("ode: AdvanceTo(%g s) is before the last step [%g, %g] s", tout, c.tPrev, c.t)
	}
	for c.t < tout {
		if err := c.step(s, tout); err != nil {
			return err
		}
	}
	c.tOut = tout
	if tout == c.t {
		copy(c.yOut, c.y)
		return nil
	}
	c.interpolate(tout, c.yOut)
	return nil
}

// interpolate evaluates the cubic Hermite interpolant of the last step at t into dst.
func (c *core) interpolate(t float64, dst []float64) {
	h := c.t - c.tPrev
	th := (t - c.tPrev) / h
	u := 1 - th
	h00 := (1 + 2*th) * u * u
	h10 := th * u * u * h
	h01 := th * th * (3 - 2*th)
	h11 := -th * th * u * h
	for i := range dst {
		dst[i] = h00*c.yPrev[i] + h10*c.fPrev[i] + h01*c.y[i] + h11*c.fEnd[i]
	}
}

// Interpolate stores the solution at time t in dst, by cubic Hermite interpolation within the
// last accepted step [tPrev, t]. It returns an error if t lies outside that step.
func (c *core) Interpolate(t float64, dst []float64) error {
	if !c.ready {
		return fmt.Errorf("ode: Interpolate: %w", ErrNotStarted)
	}
	if !c.hasPrev {
		return fmt.Errorf("ode: Interpolate(%g s): no step taken yet", t)
	}
	if len(dst) != c.n {
		panic("ode: Interpolate: wrong destination length")
	}
	if !(t >= c.tPrev && t <= c.t) {
		return fmt.Errorf("ode: Interpolate(%g s) outside the last step [%g, %g] s", t, c.tPrev, c.t)
	}
	c.interpolate(t, dst)
	return nil
}

// State returns the time [s] and the solution of the last Step or AdvanceTo. The slice is
// owned by the integrator and overwritten by the next call.
func (c *core) State() (float64, []float64) { return c.tOut, c.yOut }

// Stats returns the work counters since Init.
func (c *core) Stats() Stats { return c.stats }

// StepSize returns the step size [s] proposed for the next step.
func (c *core) StepSize() float64 { return c.h }
