package fit

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"strconv"
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/optimize"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/fit/measured"
	"n2pulse/kinetics/study"
)

// Free is a design key the fit adjusts, within [Lo, Hi] in SI (0 < Lo < Hi).
type Free struct {
	Key    string
	Lo, Hi float64
}

// Settings tune a fit; nil or zero fields take the defaults.
type Settings struct {
	Starts        int          // number of starts (default 3; the first is the base design's values)
	Seed          uint64       // seed of the Latin-hypercube starts after the first
	Workers       int          // shots run at once (default: one per CPU)
	Run           study.Runner // the model (default study.ModelRunner)
	Step          float64      // finite-difference step in ln x (default 0.01)
	MaxIterations int          // Newton iterations per start (default 30)
	MaxSpread     float64      // a 95 % interval wider than this factor is not a determination (default 10)
	// Progress, when set, is called after each start with its number (from 1) and outcome.
	Progress func(start int, s Start)
}

// Limits of a fit's size: the cost of a fit grows with points × free keys × iterations.
const (
	MaxFree   = 8
	MaxStarts = 20
)

// DefaultStep is the forward-difference step in ln x: the model's noise in ln y is about 1e-6
// (measured on the 8.8 cm experiment case: d ln E/d ln L_s is −0.0829, −0.0841 and −0.0853 at
// steps 0.001, 0.003 and 0.01, but −0.096 at 1e-4), so a step of 0.01 keeps the noise of a
// derivative near 1e-4 and its truncation error at a few per cent.
const DefaultStep = 0.01

// Param is the outcome for one free key.
type Param struct {
	Key        string  `json:"key"`
	Start      float64 `json:"start"`       // value in the base design [SI]
	Lo         float64 `json:"lower_bound"` // bounds [SI]
	Hi         float64 `json:"upper_bound"`
	Value      float64 `json:"value"`         // fitted [SI]
	SDLog      float64 `json:"sd_ln"`         // standard uncertainty of ln(value); NaN when unknown
	Lo95       float64 `json:"ci95_low"`      // 95 % confidence interval [SI]; NaN when unknown
	Hi95       float64 `json:"ci95_high"`     //
	Determined bool    `json:"determined"`    // the data determine this key (see the package comment)
	Why        string  `json:"why,omitempty"` // why not, in words
	AtBound    bool    `json:"at_bound"`
}

// Residual is one measured value against the fitted model.
type Residual struct {
	Point    int     `json:"point"` // index in the measured set
	Line     int     `json:"line"`  // line of the file
	Quantity string  `json:"quantity"`
	Measured float64 `json:"measured"` // [SI]
	Model    float64 `json:"model"`    // [SI]
	// Uncertainty is the standard uncertainty of Measured, given or (with the scatter
	// estimated) RelScatter × Measured; NaN when the scatter is unknown.
	Uncertainty float64 `json:"uncertainty"`
	// Normalised is (ln model − ln measured)/s: in standard uncertainties, given or estimated
	// (NaN when the scatter is unknown).
	Normalised float64 `json:"normalised"`
}

// Start is one start of the minimiser.
type Start struct {
	From       []float64 `json:"from"`   // start values [SI]
	Values     []float64 `json:"values"` // where it ended [SI]
	ChiSquare  float64   `json:"chi_square"`
	Iterations int       `json:"iterations"`
	Status     string    `json:"status"`
	Err        string    `json:"error,omitempty"`
}

// Result is a finished fit.
type Result struct {
	Params []Param `json:"params"`
	// Correlation[i][j] of the fitted ln values; NaN in rows of keys J cannot resolve.
	Correlation [][]float64 `json:"correlation"`
	Residuals   []Residual  `json:"residuals"`
	ChiSquare   float64     `json:"chi_square"` // Σ normalised residual² with the weights of the fit (unit weights when estimated)
	Values      int         `json:"values"`     // measured values n
	DOF         int         `json:"degrees_of_freedom"`
	// ScatterEstimated: the file gave no uncertainties and the relative scatter RelScatter
	// (sd of ln(model/measured)) was estimated from the residuals; NaN when n ≤ p.
	ScatterEstimated bool      `json:"scatter_estimated"`
	RelScatter       float64   `json:"relative_scatter"`
	Singular         []float64 `json:"singular_values"` // of the weighted J in ln x, largest first
	Starts           []Start   `json:"starts"`
	Best             int       `json:"best_start"`
	// SeveralOptima: another start ended as low (χ² within 1 or 1 %) somewhere else (outside
	// the 95 % intervals): the data allow more than one answer.
	SeveralOptima bool           `json:"several_optima"`
	Runs          int64          `json:"runs"` // shots run
	Design        *design.Design `json:"-"`    // the base design with the fitted values
}

// problem is one fit in progress: the points as designs, the weights, and the shot counter.
type problem struct {
	ctx      context.Context
	base     *design.Design
	data     *measured.Set
	free     []Free
	run      study.Runner
	sem      chan struct{}
	logMeas  []float64 // ln m_k
	scale    []float64 // s_k (relative uncertainty, or 1)
	valueOf  []struct{ point, value int }
	runs     atomic.Int64
	step     float64
	mu       sync.Mutex
	cache    map[string][]float64
	firstErr error
}

// Fit adjusts the free keys of base to the measured points (see the package comment). base is
// not changed; Result.Design is a copy with the fitted values.
func Fit(ctx context.Context, base *design.Design, data *measured.Set, free []Free, s *Settings) (*Result, error) {
	var set Settings
	if s != nil {
		set = *s
	}
	if err := check(base, data, free, &set); err != nil {
		return nil, err
	}
	p := &problem{ctx: ctx, base: base, data: data, free: free, run: set.Run, step: set.Step,
		sem: make(chan struct{}, set.Workers), cache: map[string][]float64{}}
	for i, pt := range data.Points {
		for j, v := range pt.Values {
			p.valueOf = append(p.valueOf, struct{ point, value int }{i, j})
			p.logMeas = append(p.logMeas, math.Log(v.Value))
			sc := 1.0
			if data.Uncertain {
				sc = v.Uncertainty / v.Value
			}
			p.scale = append(p.scale, sc)
		}
	}
	res := &Result{Values: len(p.logMeas)}
	starts, err := p.starts(set.Starts, set.Seed)
	if err != nil {
		return nil, err
	}
	best := -1
	for i, u0 := range starts {
		st := p.minimise(u0, set.MaxIterations)
		res.Starts = append(res.Starts, st)
		if set.Progress != nil {
			set.Progress(i+1, st)
		}
		if st.Err == "" && (best < 0 || st.ChiSquare < res.Starts[best].ChiSquare) {
			best = i
		}
		if err := ctx.Err(); err != nil {
			return nil, err
		}
	}
	if best < 0 {
		return nil, fmt.Errorf("fit: every start failed; first: %s", res.Starts[0].Err)
	}
	res.Best = best
	theta := make([]float64, len(free))
	for j, v := range res.Starts[best].Values {
		theta[j] = math.Log(v)
	}
	if err := p.analyse(res, theta, set.MaxSpread); err != nil {
		return nil, err
	}
	res.Runs = p.runs.Load()
	return res, nil
}

// check validates the inputs and fills the defaults of set.
func check(base *design.Design, data *measured.Set, free []Free, set *Settings) error {
	if base == nil || data == nil || len(data.Points) == 0 {
		return errors.New("fit: no design or no measured points")
	}
	if len(free) == 0 || len(free) > MaxFree {
		return fmt.Errorf("fit: %d free keys, want 1…%d", len(free), MaxFree)
	}
	seen := map[string]bool{}
	for _, c := range data.Keys {
		seen[c.Name] = true
	}
	for _, f := range free {
		lo, hi, _, ok := design.KeyRange(f.Key)
		switch {
		case !ok || design.KeyInteger(f.Key):
			return fmt.Errorf("fit: free key %s: not a numeric design key that can vary continuously", f.Key)
		case seen[f.Key]:
			return fmt.Errorf("fit: free key %s is also a column of the measured points (or named twice): a key is either measured or fitted", f.Key)
		case !(f.Lo > 0 && f.Hi > f.Lo) || math.IsInf(f.Hi, 0):
			return fmt.Errorf("fit: free key %s: bounds %g…%g, want 0 < low < high, finite (the fit works in logarithms)", f.Key, f.Lo, f.Hi)
		case f.Lo < lo || f.Hi > hi:
			return fmt.Errorf("fit: free key %s: bounds %g…%g outside the key's allowed range %g…%g", f.Key, f.Lo, f.Hi, lo, hi)
		case f.Hi*math.Exp(stepOr(set.Step)) > hi:
			return fmt.Errorf("fit: free key %s: upper bound %g leaves no room for the finite-difference step: at most %.4g", f.Key, f.Hi, hi/math.Exp(stepOr(set.Step)))
		}
		seen[f.Key] = true
	}
	if set.Starts == 0 {
		set.Starts = 3
	}
	if set.Starts < 1 || set.Starts > MaxStarts {
		return fmt.Errorf("fit: %d starts, want 1…%d", set.Starts, MaxStarts)
	}
	if set.Workers <= 0 {
		set.Workers = runtime.GOMAXPROCS(0)
	}
	if set.Run == nil {
		set.Run = study.ModelRunner
	}
	set.Step = stepOr(set.Step)
	if !(set.Step > 0 && set.Step <= 0.1) {
		return fmt.Errorf("fit: finite-difference step %g, want 0 < step ≤ 0.1 (in ln x)", set.Step)
	}
	if set.MaxIterations == 0 {
		set.MaxIterations = 30
	}
	if set.MaxIterations < 1 {
		return fmt.Errorf("fit: %d iterations, want at least 1", set.MaxIterations)
	}
	if set.MaxSpread == 0 {
		set.MaxSpread = 10
	}
	if !(set.MaxSpread > 1) {
		return fmt.Errorf("fit: largest interval factor %g, want above 1", set.MaxSpread)
	}
	return nil
}

// stepOr is the finite-difference step of a setting, the default for 0.
func stepOr(step float64) float64 {
	if step == 0 {
		return DefaultStep
	}
	return step
}

// box returns the centre and half-width of free key j's bounds in ln x.
func (p *problem) box(j int) (c, b float64) {
	lo, hi := math.Log(p.free[j].Lo), math.Log(p.free[j].Hi)
	return (lo + hi) / 2, (hi - lo) / 2
}

// theta maps the unbounded u to ln x inside the bounds.
func (p *problem) theta(u []float64) []float64 {
	th := make([]float64, len(u))
	for j := range u {
		c, b := p.box(j)
		th[j] = c + b*math.Tanh(u[j])
	}
	return th
}

// toU maps ln x to u, keeping a point on a bound just inside it.
func (p *problem) toU(theta []float64) []float64 {
	u := make([]float64, len(theta))
	for j := range theta {
		c, b := p.box(j)
		u[j] = math.Atanh(math.Max(-0.999, math.Min(0.999, (theta[j]-c)/b)))
	}
	return u
}

// starts returns the starting u of every start: the base design's values clipped into the
// bounds, then Latin-hypercube points of the box in ln x.
func (p *problem) starts(n int, seed uint64) ([][]float64, error) {
	th := make([]float64, len(p.free))
	for j, f := range p.free {
		v, err := p.base.Get(f.Key)
		if err != nil {
			return nil, fmt.Errorf("fit: %w", err)
		}
		if !(v > 0) {
			v = math.Sqrt(f.Lo * f.Hi)
		}
		th[j] = math.Log(math.Max(f.Lo, math.Min(f.Hi, v)))
	}
	out := [][]float64{p.toU(th)}
	if n > 1 {
		pts, err := study.LatinHypercube(n-1, len(p.free), seed)
		if err != nil {
			return nil, fmt.Errorf("fit: %w", err)
		}
		for _, q := range pts {
			t := make([]float64, len(q))
			for j := range q {
				c, b := p.box(j)
				t[j] = c + b*(2*q[j]-1)*0.9 // inside the box: tanh would need u → ∞ at its edge
			}
			out = append(out, p.toU(t))
		}
	}
	return out, nil
}

// designAt returns the design of point i with the free keys at theta.
func (p *problem) designAt(i int, theta []float64) (*design.Design, error) {
	d := p.base.Clone()
	pt := p.data.Points[i]
	keys := make([]string, 0, len(pt.Settings))
	for _, s := range pt.Settings {
		if err := d.Set(s.Key, s.Value); err != nil {
			return nil, fmt.Errorf("line %d: %w", pt.Line, err)
		}
		keys = append(keys, s.Key)
	}
	for j, f := range p.free {
		u, _ := design.KeyUnit(f.Key)
		if err := d.Set(f.Key, strconv.FormatFloat(math.Exp(theta[j]), 'g', -1, 64)+" "+u); err != nil {
			return nil, err
		}
	}
	if err := d.BalanceMixture(keys); err != nil {
		return nil, fmt.Errorf("line %d: %w", pt.Line, err)
	}
	if err := d.Validate(); err != nil {
		return nil, fmt.Errorf("line %d: %w", pt.Line, err)
	}
	return d, nil
}

// metric returns the figure of the summary a quantity is compared with.
func metric(s *kinetics.Summary, q string) float64 {
	switch q {
	case "energy_front":
		return s.EnergyFront
	case "energy_rear":
		return s.EnergyRear
	case "energy_total":
		return s.EnergyTotal
	case "peak_power":
		return s.PeakPower
	case "fwhm":
		// The width from the rms duration: a pulse of several spikes has a first-to-last
		// half-maximum width that jumps when a spike crosses half maximum, which no
		// least-squares fit can follow; the rms width moves smoothly, as a detector of finite
		// speed sees the pulse.
		return s.RMSWidth
	}
	return math.NaN()
}

// shot runs the model on d, holding one of the workers' places.
func (p *problem) shot(d *design.Design) (kinetics.Summary, error) {
	select {
	case p.sem <- struct{}{}:
	case <-p.ctx.Done():
		return kinetics.Summary{}, p.ctx.Err()
	}
	defer func() { <-p.sem }()
	p.runs.Add(1)
	return p.run(d)
}

// summaries runs every point at theta, the points at once on the workers.
func (p *problem) summaries(theta []float64) ([]kinetics.Summary, error) {
	n := len(p.data.Points)
	sums := make([]kinetics.Summary, n)
	errs := make([]error, n)
	var wg sync.WaitGroup
	for i := range n {
		wg.Add(1)
		go func() {
			defer wg.Done()
			d, err := p.designAt(i, theta)
			if err == nil {
				sums[i], err = p.shot(d)
			}
			errs[i] = err
		}()
	}
	wg.Wait()
	return sums, errors.Join(errs...)
}

// residuals returns r_k(θ) = (ln y_k − ln m_k)/s_k, cached by θ.
func (p *problem) residuals(theta []float64) ([]float64, error) {
	key := fmt.Sprint(theta)
	p.mu.Lock()
	r, ok := p.cache[key]
	p.mu.Unlock()
	if ok {
		return r, nil
	}
	sums, err := p.summaries(theta)
	if err != nil {
		return nil, err
	}
	r = make([]float64, len(p.logMeas))
	for k, pv := range p.valueOf {
		pt := p.data.Points[pv.point]
		y := metric(&sums[pv.point], pt.Values[pv.value].Quantity)
		if !(y > 0) || math.IsInf(y, 0) {
			return nil, fmt.Errorf("line %d: the model gives %s = %g, not a positive number", pt.Line, pt.Values[pv.value].Quantity, y)
		}
		r[k] = (math.Log(y) - p.logMeas[k]) / p.scale[k]
	}
	p.mu.Lock()
	if len(p.cache) > 256 {
		clear(p.cache)
	}
	p.cache[key] = r
	p.mu.Unlock()
	return r, nil
}

// jacobian returns J = ∂r/∂θ at theta (forward differences), or an error when a run failed.
func (p *problem) jacobian(theta []float64) (*mat.Dense, []float64, error) {
	r0, err := p.residuals(theta)
	if err != nil {
		return nil, nil, err
	}
	J := mat.NewDense(len(r0), len(theta), nil)
	var mu sync.Mutex
	var ferr error
	fd.Jacobian(J, func(y, th []float64) {
		r, err := p.residuals(th)
		if err != nil {
			mu.Lock()
			ferr = err
			mu.Unlock()
			for i := range y {
				y[i] = math.NaN()
			}
			return
		}
		copy(y, r)
	}, theta, &fd.JacobianSettings{Formula: fd.Forward, OriginValue: r0, Step: p.step, Concurrent: true})
	if ferr != nil {
		return nil, nil, ferr
	}
	return J, r0, nil
}

// chi2 is Σ r².
func chi2(r []float64) float64 {
	s := 0.0
	for _, x := range r {
		s += x * x
	}
	return s
}

// minimise runs one start of gonum's Newton method with the Gauss–Newton matrix.
func (p *problem) minimise(u0 []float64, maxIter int) Start {
	st := Start{From: expAll(p.theta(u0))}
	var jcache struct {
		key string
		J   *mat.Dense
		r   []float64
	}
	jac := func(u []float64) (*mat.Dense, []float64, []float64, bool) {
		th := p.theta(u)
		key := fmt.Sprint(th)
		if jcache.key != key {
			J, r, err := p.jacobian(th)
			if err != nil {
				p.noteErr(err)
				return nil, nil, nil, false
			}
			jcache.key, jcache.J, jcache.r = key, J, r
		}
		// dθ/du
		dt := make([]float64, len(u))
		for j := range u {
			_, b := p.box(j)
			t := math.Tanh(u[j])
			dt[j] = b * (1 - t*t)
		}
		return jcache.J, jcache.r, dt, true
	}
	prob := optimize.Problem{
		Func: func(u []float64) float64 {
			r, err := p.residuals(p.theta(u))
			if err != nil {
				p.noteErr(err)
				return math.Inf(1)
			}
			return chi2(r)
		},
		Grad: func(g, u []float64) {
			J, r, dt, ok := jac(u)
			if !ok {
				for j := range g {
					g[j] = math.NaN()
				}
				return
			}
			for j := range g {
				s := 0.0
				for k := range r {
					s += J.At(k, j) * r[k]
				}
				g[j] = 2 * s * dt[j]
			}
		},
		Hess: func(h *mat.SymDense, u []float64) {
			J, _, dt, ok := jac(u)
			n := len(u)
			for a := range n {
				for b := a; b < n; b++ {
					s := 0.0
					if ok {
						for k := 0; k < J.RawMatrix().Rows; k++ {
							s += J.At(k, a) * J.At(k, b)
						}
						s *= 2 * dt[a] * dt[b]
					} else {
						s = math.NaN()
					}
					h.SetSym(a, b, s)
				}
			}
		},
	}
	settings := &optimize.Settings{
		MajorIterations: maxIter,
		Converger:       &optimize.FunctionConverge{Absolute: 1e-12, Relative: 1e-4, Iterations: 1},
		// The gradient in u: a point on a flat side (far from every bound) with χ² changing by
		// less than 1e-8 per unit of u is done.
		GradientThreshold: 1e-8,
	}
	res, err := optimize.Minimize(prob, u0, settings, &optimize.Newton{Linesearcher: &optimize.Backtracking{}})
	if res == nil || res.X == nil {
		st.Err = errText(err, p.takeErr())
		return st
	}
	st.Values = expAll(p.theta(res.X))
	st.ChiSquare, st.Iterations, st.Status = res.F, res.Stats.MajorIterations, res.Status.String()
	// A run that failed at a trial point only turned the line search back, and a line search
	// that cannot move the point any more (no progress: at exact data χ² sits at the model's
	// numerical noise) ends the start where it is; the start failed only when it ends without
	// a finite χ² or the minimiser itself failed.
	e := p.takeErr()
	if (err != nil && !errors.Is(err, optimize.ErrLinesearcherFailure) && !errors.Is(err, optimize.ErrNoProgress)) || math.IsInf(res.F, 0) || math.IsNaN(res.F) {
		st.Err = errText(err, e)
	}
	return st
}

func errText(err, model error) string {
	switch {
	case model != nil:
		return model.Error()
	case err != nil:
		return err.Error()
	}
	return "no minimum found"
}

func (p *problem) noteErr(err error) {
	p.mu.Lock()
	if p.firstErr == nil {
		p.firstErr = err
	}
	p.mu.Unlock()
}

func (p *problem) takeErr() error {
	p.mu.Lock()
	defer p.mu.Unlock()
	e := p.firstErr
	p.firstErr = nil
	return e
}

func expAll(th []float64) []float64 {
	x := make([]float64, len(th))
	for j := range th {
		x[j] = math.Exp(th[j])
	}
	return x
}

// designUnit is the SI unit a key's value is written in ("" for a pure number).
func designUnit(key string) (string, bool) { return design.KeyUnit(key) }
