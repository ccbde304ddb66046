package validation

import (
	"bytes"
	"embed"
	"errors"
	"fmt"
	"io/fs"
	"math"
	"path"
	"sort"
	"strings"
	"sync"

	"github.com/BurntSushi/toml"

	"n2pulse/internal/pool"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// The experiment cases: each <case>.toml is a design file for design.ParseDesign, and each
// <case>.measured.toml holds what the source measured, with its citation. common.toml is the
// block of values no source gives (see testdata/experiments/COMMON.md).
//
//go:embed testdata/experiments/*.toml
var experimentFiles embed.FS

const experimentDir = "testdata/experiments"

func init() {
	Register("experiments", func() ([]Check, error) {
		r := experimentResults()
		return r.checks, r.err
	})
}

// measuredValue is one number a source states, with where it stands.
type measuredValue struct {
	Value       string  `toml:"value"`       // number with unit, "34 uJ"
	End         string  `toml:"end"`         // "front" or "total": which output the source measured
	How         string  `toml:"how"`         // "text", "table" or "plot"
	Uncertainty float64 `toml:"uncertainty"` // relative reading uncertainty of a value read off a plot
	Where       string  `toml:"where"`       // figure, table or sentence
}

// measuredPoint is one (x, y) point of a measured variation.
type measuredPoint struct {
	X, Y        string
	How         string
	Uncertainty float64
	Note        string
}

// variationSpec is one measured variation of a case and how the model is scanned for it.
type variationSpec struct {
	ID               string          `toml:"id"`
	Title            string          `toml:"title"`
	Key              string          `toml:"key"`        // design key that is varied
	Complement       string          `toml:"complement"` // key set to 1 − x (mole fractions)
	XUnit            string          `toml:"x_unit"`     // display unit of x ("" dimensionless)
	Quantity         string          `toml:"quantity"`   // energy_front, energy_total, fwhm, peak_power
	YUnit            string          `toml:"y_unit"`
	Scan             []string        `toml:"scan"` // model x values
	Optimum          string          `toml:"optimum"`
	OptimumTolerance float64         `toml:"optimum_tolerance"`
	OptimumAbove     string          `toml:"optimum_above"` // "<case>/<id>" whose optimum lies lower
	RatioLow         float64         `toml:"ratio_low"`     // y(last point)/y(first point) range
	RatioHigh        float64         `toml:"ratio_high"`
	Where            string          `toml:"where"`
	Points           []measuredPoint `toml:"points"`
}

// measured is the content of a <case>.measured.toml file.
type measured struct {
	Case      string         `toml:"case"`
	Source    string         `toml:"source"`
	Kind      string         `toml:"kind"`
	Energy    *measuredValue `toml:"energy"`
	FWHM      *measuredValue `toml:"fwhm"`
	PeakPower *measuredValue `toml:"peak_power"`
	// Lases, when given, says whether the laser gave any laser output at all; LasesWhere is
	// the sentence that says so.
	Lases      *bool           `toml:"lases"`
	LasesWhere string          `toml:"lases_where"`
	Variation  []variationSpec `toml:"variation"`
}

// expCase is one experiment: its design and its measurements.
type expCase struct {
	Name     string
	Design   *design.Design
	Measured measured
}

// Variation is one measured dependence of a laser's output on a design parameter together with
// the model's curve over the same parameter, in display units, for overlay figures.
type Variation struct {
	ID        string    // "<case>/<variation>", e.g. "tea-transfer-88mm-v1/gap"
	Title     string    // what is varied, in words
	Key       string    // design key varied
	XLabel    string    // axis label with unit
	YLabel    string    // axis label with unit
	ModelX    []float64 // model scan, in the x display unit
	ModelY    []float64 // model values, in the y display unit (NaN where the run failed)
	MeasuredX []float64 // measured points, in the x display unit
	MeasuredY []float64
	Notes     []string // one per measured point: how it was read
	Source    string   // citation and place in the source
}

// Variations returns every measured variation of the experiment cases with the model's curve.
// The model runs once per process; Variations and the "experiments" registry group share the
// runs.
func Variations() ([]Variation, error) {
	r := experimentResults()
	return r.variations, r.err
}

type expResults struct {
	checks     []Check
	variations []Variation
	scores     []ScoreRow
	err        error
}

var (
	expOnce sync.Once
	expRes  expResults
)

func experimentResults() expResults {
	expOnce.Do(func() {
		cases, err := loadExperiments(experimentFiles)
		if err != nil {
			expRes.err = err
			return
		}
		expRes.checks, expRes.variations, expRes.scores = runExperiments(cases)
	})
	return expRes
}

// loadExperiments reads every case of the directory: design, measurements, and the rule that
// the common block is applied identically.
func loadExperiments(fsys fs.FS) ([]expCase, error) {
	names, err := fs.Glob(fsys, path.Join(experimentDir, "*.measured.toml"))
	if err != nil {
		return nil, fmt.Errorf("validation: experiments: %w", err)
	}
	if len(names) == 0 {
		return nil, errors.New("validation: experiments: no case files")
	}
	sort.Strings(names)
	var cases []expCase
	for _, mname := range names {
		c, err := loadCase(fsys, mname)
		if err != nil {
			return nil, err
		}
		cases = append(cases, c)
	}
	return cases, nil
}

func loadCase(fsys fs.FS, mname string) (expCase, error) {
	var c expCase
	mb, err := fs.ReadFile(fsys, mname)
	if err != nil {
		return c, fmt.Errorf("validation: experiments: %w", err)
	}
	md, err := toml.NewDecoder(bytes.NewReader(mb)).Decode(&c.Measured)
	if err != nil {
		return c, fmt.Errorf("validation: experiments: %s: %w", mname, err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		return c, fmt.Errorf("validation: experiments: %s: unknown key %s", mname, und[0])
	}
	c.Name = strings.TrimSuffix(path.Base(mname), ".measured.toml")
	if c.Measured.Case != c.Name {
		return c, fmt.Errorf("validation: experiments: %s: case = %q, want %q", mname, c.Measured.Case, c.Name)
	}
	if c.Measured.Source == "" {
		return c, fmt.Errorf("validation: experiments: %s: source is missing", mname)
	}
	dname := path.Join(experimentDir, c.Name+".toml")
	db, err := fs.ReadFile(fsys, dname)
	if err != nil {
		return c, fmt.Errorf("validation: experiments: case %s has no design: %w", c.Name, err)
	}
	if c.Design, err = design.ParseDesign(db, dname); err != nil {
		return c, fmt.Errorf("validation: experiments: %w", err)
	}
	return c, nil
}

// quantity returns the named figure of merit of a summary in SI.
func quantity(s kinetics.Summary, name string) (float64, error) {
	switch name {
	case "energy_front":
		return s.EnergyFront, nil
	case "energy_total":
		return s.EnergyTotal, nil
	case "fwhm":
		return s.FWHM, nil
	case "peak_power":
		return s.PeakPower, nil
	}
	return math.NaN(), fmt.Errorf("validation: experiments: unknown quantity %q (energy_front, energy_total, fwhm, peak_power)", name)
}

// displayScale returns the SI value of one display unit ("uJ" → 1e-6); "" is 1.
func displayScale(unit string, dim units.Dimension) (float64, error) {
	if unit == "" {
		return 1, nil
	}
	return units.Parse("1 "+unit, dim)
}

// job is one model run.
type job struct {
	d   *design.Design
	sum kinetics.Summary
	err error
}

// runJobs runs the designs on workers goroutines (0: one per CPU).
func runJobs(jobs []*job, workers int) {
	pool.Each(len(jobs), workers, func(k int) {
		j := jobs[k]
		res, err := kinetics.Run(j.d, &kinetics.RunSettings{Light: true})
		if err != nil {
			j.err = err
			return
		}
		j.sum = res.Summary
	})
}

// scanPlan is the model scan of one variation.
type scanPlan struct {
	c      *expCase
	v      *variationSpec
	xs     []float64 // SI
	jobs   []*job
	setErr error
}

func runExperiments(cases []expCase) ([]Check, []Variation, []ScoreRow) {
	base := make([]*job, len(cases))
	var all []*job
	for i := range cases {
		base[i] = &job{d: cases[i].Design.Clone()}
		all = append(all, base[i])
	}
	var plans []*scanPlan
	for i := range cases {
		for k := range cases[i].Measured.Variation {
			p := planScan(&cases[i], &cases[i].Measured.Variation[k])
			plans = append(plans, p)
			all = append(all, p.jobs...)
		}
	}
	runJobs(all, 0)

	var checks []Check
	scores := make([]ScoreRow, len(cases))
	for i := range cases {
		checks = append(checks, pointChecks(&cases[i], base[i])...)
		scores[i] = scoreRow(&cases[i], base[i])
	}
	cs, vars := derivedChecks(plans)
	return append(checks, cs...), vars, scores
}

// derivedChecks returns, after their runs, the checks of the variation plans (per plan its
// optimum, direction and ratio, in plan order, then the optimum shifts between plans) and the
// overlay series. The experiment checks and the apparatus alternatives (ApparatusEnvelope)
// both derive them here.
func derivedChecks(plans []*scanPlan) ([]Check, []Variation) {
	var checks []Check
	optima := map[string]float64{}
	var vars []Variation
	for _, p := range plans {
		cs, v, opt := variationChecks(p)
		checks = append(checks, cs...)
		vars = append(vars, v)
		if !math.IsNaN(opt) {
			optima[v.ID] = opt
		}
	}
	for _, p := range plans {
		if p.v.OptimumAbove == "" {
			continue
		}
		id := p.c.Name + "/" + p.v.ID
		c := Check{
			ID:       "exp." + p.c.Name + "." + p.v.ID + ".optimum-shift",
			Quantity: fmt.Sprintf("optimum of %s lies above that of %s", id, p.v.OptimumAbove),
			Mode:     True, Kind: Experiment, Reference: 1,
			Source: p.c.Measured.Source + "; " + p.v.Where,
		}
		hi, ok1 := optima[id]
		lo, ok2 := optima[p.v.OptimumAbove]
		switch {
		case !ok1 || !ok2:
			c.Err = fmt.Errorf("validation: experiments: optimum of %s or %s not found by the model", id, p.v.OptimumAbove)
		case hi > lo:
			c.Computed = 1
		}
		checks = append(checks, c)
	}
	return checks, vars
}

// planScan prepares the model runs of one variation.
func planScan(c *expCase, v *variationSpec) *scanPlan {
	p := &scanPlan{c: c, v: v}
	if _, ok := design.KeyUnit(v.Key); !ok {
		p.setErr = fmt.Errorf("validation: experiments: %s/%s: unknown design key %q", c.Name, v.ID, v.Key)
		return p
	}
	for _, s := range v.Scan {
		d := c.Design.Clone()
		err := d.Set(v.Key, s)
		if err == nil && v.Complement != "" {
			var x float64
			if x, err = d.Get(v.Key); err == nil {
				err = d.Set(v.Complement, fmt.Sprint(1-x))
			}
		}
		if err == nil {
			err = d.Validate()
		}
		if err != nil {
			p.setErr = fmt.Errorf("validation: experiments: %s/%s: %w", c.Name, v.ID, err)
			return p
		}
		x, _ := d.Get(v.Key)
		p.xs = append(p.xs, x)
		p.jobs = append(p.jobs, &job{d: d})
	}
	return p
}

// pointChecks compares the base run of a case with its measured energy, FWHM and peak power.
func pointChecks(c *expCase, j *job) []Check {
	m := c.Measured
	type item struct {
		name, what, unit string
		dim              units.Dimension
		mv               *measuredValue
		quantity         string
		mode             Mode
		tol              float64
	}
	// Tolerances of the project: energy within a factor 2, FWHM within 40 %, peak power within
	// a factor 2 (common practice, no source: the spread of measured nitrogen lasers).
	items := []item{
		{"energy", "pulse energy", "µJ", units.Energy, m.Energy, "energy_front", Factor, 2},
		{"fwhm", "pulse width (FWHM)", "ns", units.Time, m.FWHM, "fwhm", Relative, 0.4},
		{"peak-power", "peak power", "kW", units.Power, m.PeakPower, "peak_power", Factor, 2},
	}
	var out []Check
	if m.Lases != nil {
		chk := Check{
			ID:       "exp." + c.Name + ".lases",
			Quantity: fmt.Sprintf("laser output above the spontaneous-emission floor: %v (%s)", *m.Lases, c.Name),
			Mode:     True, Reference: 1, Kind: Experiment,
			Source: fmt.Sprintf("%s; %s [stated in the text]", m.Source, m.LasesWhere),
		}
		if j.err != nil {
			chk.Err = j.err
		} else if j.sum.Lases == *m.Lases {
			chk.Computed = 1
		}
		out = append(out, chk)
	}
	for _, it := range items {
		if it.mv == nil {
			continue
		}
		q := it.quantity
		end := "output end"
		if it.mv.End == "total" && q == "energy_front" {
			q, end = "energy_total", "both ends"
		}
		chk := Check{
			ID:       "exp." + c.Name + "." + it.name,
			Quantity: fmt.Sprintf("%s, %s (%s)", it.what, end, c.Name),
			Unit:     it.unit, Mode: it.mode, Tolerance: it.tol, Kind: Experiment,
			Source: fmt.Sprintf("%s; %s [%s]", m.Source, it.mv.Where, readNote(it.mv.How, it.mv.Uncertainty)),
		}
		scale, _ := displayScale(strings.Replace(it.unit, "µ", "u", 1), it.dim)
		ref, err := units.Parse(it.mv.Value, it.dim)
		if err != nil {
			chk.Err = fmt.Errorf("validation: experiments: %s: %s: %w", c.Name, it.name, err)
			out = append(out, chk)
			continue
		}
		chk.Reference = ref / scale
		if j.err != nil {
			chk.Err, chk.Computed = j.err, math.NaN()
		} else {
			v, _ := quantity(j.sum, q)
			chk.Computed = v / scale
			if q == "fwhm" && j.sum.FWHMIllConditioned {
				// The model's FWHM may leap with a small change: the row says so.
				chk.Quantity += fmt.Sprintf("; the model's FWHM is ill-conditioned (%.3g ns at 45 %% of the peak, %.3g ns at 55 %%)",
					1e9*j.sum.FWHMAt45, 1e9*j.sum.FWHMAt55)
			}
		}
		out = append(out, chk)
	}
	return out
}

func readNote(how string, unc float64) string {
	switch how {
	case "plot":
		return fmt.Sprintf("read off a plot, ±%.0f%%", 100*unc)
	case "table":
		return "from a table"
	}
	return "stated in the text"
}

// variationChecks builds the overlay series of one variation and its trend checks: the
// position of an optimum, a ratio between the first and last measured points, and the
// direction of the change between them. It returns the model's optimum (SI) or NaN.
func variationChecks(p *scanPlan) ([]Check, Variation, float64) {
	c, v := p.c, p.v
	src := c.Measured.Source + "; " + v.Where
	out := Variation{ID: c.Name + "/" + v.ID, Title: v.Title, Key: v.Key, Source: src}
	xs, runErr, err := variationCurves(p, &out)
	if err != nil {
		return []Check{{ID: "exp." + c.Name + "." + v.ID, Quantity: v.Title, Kind: Experiment,
			Mode: True, Source: src, Err: err}}, out, math.NaN()
	}
	var checks []Check
	opt := math.NaN()
	if v.Optimum != "" {
		var chk Check
		chk, opt = optimumCheck(p, src, xs, runErr)
		checks = append(checks, chk)
	}
	return append(checks, trendChecks(p, &out, src, runErr)...), out, opt
}

// variationCurves fills the axis labels, the model curve and the measured points of out, in
// the display units of the variation, and returns the x scale (SI per display unit) and the
// error of the last failed run; an error means the variation cannot be compared at all.
func variationCurves(p *scanPlan, out *Variation) (xs float64, runErr, err error) {
	c, v := p.c, p.v
	xdim := dimensionOfKey(v.Key)
	ydim := quantityDimension(v.Quantity)
	xs, errx := displayScale(v.XUnit, xdim)
	ys, erry := displayScale(v.YUnit, ydim)
	out.XLabel = axisLabel(v.Key, v.XUnit)
	out.YLabel = axisLabel(v.Quantity, v.YUnit)
	if err := errors.Join(p.setErr, errx, erry); err != nil {
		return xs, nil, err
	}
	for i, j := range p.jobs {
		y := math.NaN()
		if j.err != nil {
			runErr = j.err
		} else if q, err := quantity(j.sum, v.Quantity); err != nil {
			return xs, runErr, err
		} else {
			y = q
		}
		out.ModelX = append(out.ModelX, p.xs[i]/xs)
		out.ModelY = append(out.ModelY, y/ys)
	}
	for _, pt := range v.Points {
		x, err1 := units.Parse(pt.X, xdim)
		y, err2 := units.Parse(pt.Y, ydim)
		if err := errors.Join(err1, err2); err != nil {
			return xs, runErr, fmt.Errorf("validation: experiments: %s: point: %w", c.Name+"/"+v.ID, err)
		}
		out.MeasuredX = append(out.MeasuredX, x/xs)
		out.MeasuredY = append(out.MeasuredY, y/ys)
		out.Notes = append(out.Notes, readNote(pt.How, pt.Uncertainty)+"; "+pt.Note)
	}
	return xs, runErr, nil
}

// optimumCheck compares the position of the model's optimum with the measured one, and
// returns it [SI] (NaN when a run failed).
func optimumCheck(p *scanPlan, src string, xs float64, runErr error) (Check, float64) {
	c, v := p.c, p.v
	opt := math.NaN()
	ref, err := units.Parse(v.Optimum, dimensionOfKey(v.Key))
	chk := Check{
		ID:       "exp." + c.Name + "." + v.ID + ".optimum",
		Quantity: fmt.Sprintf("position of the optimum of %s", v.Title),
		Unit:     v.XUnit, Reference: ref / xs, Mode: Relative, Tolerance: v.OptimumTolerance,
		Kind: Experiment, Source: src,
	}
	if err != nil {
		chk.Err = err
	} else if runErr != nil {
		chk.Err, chk.Computed = runErr, math.NaN()
	} else {
		opt = optimum(p.xs, yValues(p))
		chk.Computed = opt / xs
	}
	return chk, opt
}

// trendChecks compare the direction of the change between the first and the last measured
// point with the model's, and, when the case gives one, the ratio of the two against its
// measured range.
func trendChecks(p *scanPlan, out *Variation, src string, runErr error) []Check {
	c, v := p.c, p.v
	if len(out.MeasuredX) < 2 {
		return nil
	}
	var checks []Check
	first, last := 0, len(out.MeasuredX)-1
	mFirst := interpolate(out.ModelX, out.ModelY, out.MeasuredX[first])
	mLast := interpolate(out.ModelX, out.ModelY, out.MeasuredX[last])
	dirMeasured := math.Copysign(1, out.MeasuredY[last]-out.MeasuredY[first])
	dir := Check{
		ID:       "exp." + c.Name + "." + v.ID + ".direction",
		Quantity: fmt.Sprintf("direction of the change, %s, from %s = %g to %g", v.Title, v.Key, out.MeasuredX[first], out.MeasuredX[last]),
		Mode:     True, Reference: dirMeasured, Kind: Experiment, Source: src,
	}
	if runErr != nil {
		dir.Err = runErr
	} else if (mLast-mFirst)*dirMeasured > 0 {
		dir.Computed = 1
	}
	checks = append(checks, dir)
	if v.RatioHigh > 0 {
		r := Check{
			ID:       "exp." + c.Name + "." + v.ID + ".ratio",
			Quantity: fmt.Sprintf("ratio y(%g)/y(%g), %s", out.MeasuredX[last], out.MeasuredX[first], v.Title),
			Mode:     Range, Low: v.RatioLow, High: v.RatioHigh,
			Reference: (v.RatioLow + v.RatioHigh) / 2, Kind: Experiment, Source: src,
		}
		if runErr != nil {
			r.Err, r.Computed = runErr, math.NaN()
		} else {
			r.Computed = mLast / mFirst
		}
		checks = append(checks, r)
	}
	return checks
}

func yValues(p *scanPlan) []float64 {
	y := make([]float64, len(p.jobs))
	for i, j := range p.jobs {
		y[i], _ = quantity(j.sum, p.v.Quantity)
	}
	return y
}

// optimum returns the x of the largest y, refined by the vertex of the parabola through the
// best point and its neighbours when it is an interior point.
func optimum(x, y []float64) float64 {
	best := 0
	for i := range y {
		if y[i] > y[best] {
			best = i
		}
	}
	if best == 0 || best == len(y)-1 {
		return x[best]
	}
	x0, x1, x2 := x[best-1], x[best], x[best+1]
	y0, y1, y2 := y[best-1], y[best], y[best+1]
	den := (x0 - x1) * (x0 - x2) * (x1 - x2)
	a := (x2*(y1-y0) + x1*(y0-y2) + x0*(y2-y1)) / den
	b := (x2*x2*(y0-y1) + x1*x1*(y2-y0) + x0*x0*(y1-y2)) / den
	if a >= 0 || den == 0 {
		return x1
	}
	v := -b / (2 * a)
	return math.Max(x0, math.Min(x2, v))
}

// interpolate evaluates the piecewise-linear curve (x, y), x increasing, at t; outside the
// curve it returns NaN. It is kept on purpose beside gonum's interp.PiecewiseLinear (which
// kinetics/study uses): that type panics on fewer than two points and on repeated x, which a
// digitised measured curve may have, and holds the end values outside where a comparison
// wants NaN.
func interpolate(x, y []float64, t float64) float64 {
	for i := 0; i+1 < len(x); i++ {
		if t >= x[i] && t <= x[i+1] {
			if x[i+1] == x[i] {
				return y[i]
			}
			f := (t - x[i]) / (x[i+1] - x[i])
			return y[i] + f*(y[i+1]-y[i])
		}
	}
	if len(x) > 0 && t == x[len(x)-1] {
		return y[len(y)-1]
	}
	return math.NaN()
}

// dimensionOfKey returns the dimension of a numeric design key from its SI unit.
func dimensionOfKey(key string) units.Dimension {
	u, _ := design.KeyUnit(key)
	if u == "" {
		return units.Dimensionless
	}
	_, dim, err := units.ParseUnit(strings.NewReplacer("²", "2", "³", "3", "⁻¹", "-1", "⁻³", "-3", "Ω", "ohm").Replace(u))
	if err != nil {
		return units.Dimensionless
	}
	return dim
}

func quantityDimension(q string) units.Dimension {
	switch q {
	case "fwhm":
		return units.Time
	case "peak_power":
		return units.Power
	}
	return units.Energy
}

var axisNames = map[string]string{
	"channel.gap": "electrode gap", "channel.length": "channel length", "gas.pressure": "pressure",
	"gas.oxygen": "O₂ mole fraction", "circuit.charge_voltage": "charging voltage",
	"energy_front": "pulse energy at the output end", "energy_total": "pulse energy, both ends",
	"fwhm": "pulse width (FWHM)", "peak_power": "peak power",
}

func axisLabel(name, unit string) string {
	s := axisNames[name]
	if s == "" {
		s = name
	}
	if unit != "" {
		s += " [" + strings.Replace(unit, "u", "µ", 1) + "]"
	}
	return s
}
