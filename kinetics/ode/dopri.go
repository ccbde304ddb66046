package ode

import (
	"math"

	"gonum.org/v1/gonum/floats"
)

// Dormand–Prince 5(4) coefficients: Dormand & Prince, "A family of embedded Runge–Kutta
// formulae", J. Comput. Appl. Math. 6, 19–26 (1980) (also Hairer, Nørsett & Wanner, Solving
// ODEs I, 2nd ed., Sect. II.5); recalled from memory and verified by the order-condition tests.
// The seventh stage is the first of the next step.
var (
	dpC = [7]float64{0, 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9, 1, 1}
	dpA = [7][6]float64{
		{},
		{1.0 / 5},
		{3.0 / 40, 9.0 / 40},
		{44.0 / 45, -56.0 / 15, 32.0 / 9},
		{19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729},
		{9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656},
		{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84},
	}
	// dpB are the fifth-order weights (equal to the last row of dpA), dpBHat the fourth-order ones.
	dpB    = [7]float64{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84, 0}
	dpBHat = [7]float64{5179.0 / 57600, 0, 7571.0 / 16695, 393.0 / 640, -92097.0 / 339200, 187.0 / 2100, 1.0 / 40}
)

// DormandPrince is an adaptive explicit Runge–Kutta 5(4) integrator (local extrapolation:
// the fifth-order solution is propagated) for non-stiff systems. Create one with
// NewDormandPrince.
type DormandPrince struct {
	core
	k    [7][]float64
	ytmp []float64
}

var _ Integrator = (*DormandPrince)(nil)

// NewDormandPrince returns a Dormand–Prince 5(4) integrator.
func NewDormandPrince() *DormandPrince { return &DormandPrince{} }

// Init starts an integration of sys from (t0, y0) with settings s (nil for defaults).
func (d *DormandPrince) Init(sys System, t0 float64, y0 []float64, s *Settings) error {
	if err := d.core.init(sys, t0, y0, s); err != nil {
		return err
	}
	for i := range d.k {
		d.k[i] = resize(d.k[i], d.n)
	}
	d.ytmp = resize(d.ytmp, d.n)
	d.h = d.initialStep(5)
	d.ready = true
	return nil
}

// Step takes one accepted step and returns the new time [s].
func (d *DormandPrince) Step() (float64, error) {
	err := d.step(d, math.Inf(1))
	return d.t, err
}

// AdvanceTo sets the state to y(t) [s]: interpolated within the last step, otherwise by
// stepping with the last step ending exactly on t.
func (d *DormandPrince) AdvanceTo(t float64) error { return d.advanceTo(d, t) }

func (d *DormandPrince) order() int        { return 5 }
func (d *DormandPrince) exponent() float64 { return 1.0 / 5 }
func (d *DormandPrince) accepted()         {}
func (d *DormandPrince) predictive() bool  { return false }

func (d *DormandPrince) try(h float64) (float64, error) {
	copy(d.k[0], d.f)
	for s := 1; s < 7; s++ {
		out := d.ytmp
		if s == 6 {
			out = d.yNew
		}
		copy(out, d.y)
		for j := range s {
			if a := dpA[s][j]; a != 0 {
				floats.AddScaled(out, h*a, d.k[j])
			}
		}
		if err := d.eval(d.t+dpC[s]*h, out, d.k[s]); err != nil {
			return 0, err
		}
	}
	for i := range d.ytmp {
		var e float64
		for s := range 7 {
			e += (dpB[s] - dpBHat[s]) * d.k[s][i]
		}
		d.ytmp[i] = h * e
	}
	errNorm := d.cfg.weightedRMS(d.ytmp, d.y, d.yNew)
	copy(d.fNew, d.k[6])
	if math.IsInf(errNorm, 0) {
		errNorm = math.NaN()
	}
	return errNorm, nil
}
