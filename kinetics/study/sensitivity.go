package study

import (
	"context"
	"fmt"
	"math"
	"sort"
	"strings"

	"n2pulse/internal/pool"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// SensitivityRow is the logarithmic sensitivity of the output to one design key.
type SensitivityRow struct {
	Key       string  `json:"key"`
	Value     float64 `json:"value"`           // the design's value, SI
	Unit      string  `json:"unit"`            // SI unit of Value
	Energy    float64 `json:"d_ln_energy"`     // d ln E_total / d ln x
	PeakPower float64 `json:"d_ln_peak_power"` // d ln P_peak / d ln x
	OneSided  bool    `json:"one_sided"`       // a range limit forced a one-sided difference
	// Constant marks an uncertain physical constant (see PhysicalConstant): its sensitivity
	// says how much the prediction hangs on it, not what to build differently.
	Constant bool   `json:"physical_constant"`
	Problem  string `json:"problem,omitempty"`
}

// PhysicalConstant reports whether a design key is an uncertain constant of nature (the level
// kinetics, spectroscopic overrides, electron–ion recombination, the spark law's constant)
// rather than something a builder chooses: the gas's own properties are not advice.
func PhysicalConstant(key string) bool {
	return strings.HasPrefix(key, "levels.") || strings.HasPrefix(key, "spectroscopy.") ||
		strings.HasPrefix(key, "discharge.recombination") || key == "switch.spark_constant"
}

// SensitivityKeys returns the numeric keys of d whose sensitivity can be taken: non-zero and
// finite, used by the design's switch model and gas (no oxygen constants without oxygen), and
// not numerics.*, spectroscopy overrides left at "computed" or gas mole fractions (each of
// those would need a swarm table solved anew).
func SensitivityKeys(d *design.Design) []string {
	unused := map[string]bool{}
	switch d.Switch.Model {
	case design.IdealSwitch:
		for _, k := range []string{"off_resistance", "rise_time", "gap", "pressure", "spark_constant"} {
			unused["switch."+k] = true
		}
	case design.ExponentialSwitch:
		for _, k := range []string{"gap", "pressure", "spark_constant"} {
			unused["switch."+k] = true
		}
	case design.RompeWeizelSwitch:
		unused["switch.rise_time"] = true
	}
	if d.Gas.Oxygen == 0 {
		unused["levels.upper_quenching_oxygen"], unused["levels.lower_removal_oxygen"] = true, true
		unused["levels.manifold_relaxation_oxygen"] = true
	}
	if d.Gas.Helium == 0 {
		unused["levels.upper_quenching_helium"] = true
	}
	var keys []string
	for _, k := range design.Keys() {
		if strings.HasPrefix(k, "build.") || strings.HasPrefix(k, "numerics.") || strings.HasPrefix(k, "gas.") && k != "gas.pressure" && k != "gas.temperature" || unused[k] {
			continue
		}
		if v, err := d.Get(k); err == nil && v != 0 && !math.IsInf(v, 0) && !math.IsNaN(v) {
			keys = append(keys, k)
		}
	}
	return keys
}

// Sensitivity returns d ln E / d ln x and d ln P / d ln x of the total output energy E and the
// peak power P to each key x (SensitivityKeys(d) when keys is empty), by central differences
// over re-runs at x·exp(±step) (step 0.01 when ≤ 0), or one-sided ones where the key's range
// forbids a side. Rows are ranked by |d ln E / d ln x|; a key that cannot be varied or whose
// runs fail carries its problem. Each key is varied through design.Design.Set, as on the command line,
// so a design described as built re-derives its circuit. Runs go on the project's worker pool,
// one per CPU.
func Sensitivity(d *design.Design, keys []string, step float64) ([]SensitivityRow, error) {
	if step <= 0 {
		step = 0.01
	}
	if step > 0.5 {
		return nil, fmt.Errorf("study: sensitivity step %g: allowed above 0 to 0.5 (in ln x)", step)
	}
	if len(keys) == 0 {
		keys = SensitivityKeys(d)
	}
	for _, k := range keys {
		if _, err := d.Get(k); err != nil {
			return nil, err // unknown key, or a text key: no sensitivity
		}
	}
	base, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		return nil, err
	}
	e0, p0 := base.Summary.EnergyTotal, base.Summary.PeakPower
	if !(e0 > 0) || !(p0 > 0) {
		return nil, fmt.Errorf("study: sensitivity: the design makes no output (E = %g J), so ln E has no derivative", e0)
	}
	type job struct {
		row  int
		sign float64
	}
	rows := make([]SensitivityRow, len(keys))
	sides := make([][2]side, len(keys)) // [0] at x·e^(−h), [1] at x·e^(+h)
	var jobs []job
	for i, k := range keys {
		x, _ := d.Get(k)
		unit, _ := design.KeyUnit(k)
		rows[i] = SensitivityRow{Key: k, Value: x, Unit: unit, Constant: PhysicalConstant(k)}
		if x == 0 || math.IsInf(x, 0) {
			rows[i].Problem = "value is 0 or infinite: ln x undefined"
			continue
		}
		for _, s := range []float64{-1, 1} {
			jobs = append(jobs, job{i, s})
		}
	}
	problems := map[int][]string{}
	type perturbed struct {
		sum kinetics.Summary
		err error
	}
	_ = pool.Run(context.Background(), len(jobs), 0, func(n int) perturbed {
		s, err := perturbedRun(d, keys[jobs[n].row], jobs[n].sign*step)
		return perturbed{s, err}
	}, func(n int, p perturbed) error {
		j := jobs[n]
		if p.err == nil {
			sides[j.row][(int(j.sign)+1)/2] = side{p.sum, true}
		} else if !isRangeError(p.err) {
			problems[j.row] = append(problems[j.row], p.err.Error())
		}
		return nil
	})
	for i := range rows {
		if rows[i].Problem == "" {
			rows[i].derive(sides[i][0], sides[i][1], base.Summary, step, problems[i])
		}
	}
	sort.SliceStable(rows, func(a, b int) bool {
		ra, rb := rows[a], rows[b]
		if (ra.Problem == "") != (rb.Problem == "") {
			return ra.Problem == ""
		}
		return math.Abs(ra.Energy) > math.Abs(rb.Energy)
	})
	return rows, nil
}

// side is the run on one side of a key's value: its summary, and whether it ran.
type side struct {
	sum kinetics.Summary
	ok  bool
}

// derive sets the row's d ln E/d ln x and d ln P/d ln x from the runs below (lo) and above
// (hi) the key's value by central differences over 2·step, or from one of them and the base
// run by one-sided differences over step; or, when neither ran or one has no output, the
// row's problem.
func (r *SensitivityRow) derive(lo, hi side, base kinetics.Summary, step float64, problems []string) {
	e0, p0 := base.EnergyTotal, base.PeakPower
	var eLo, eHi, pLo, pHi, span float64
	switch {
	case lo.ok && hi.ok:
		eLo, eHi, pLo, pHi, span = lo.sum.EnergyTotal, hi.sum.EnergyTotal, lo.sum.PeakPower, hi.sum.PeakPower, 2*step
	case hi.ok:
		eLo, eHi, pLo, pHi, span = e0, hi.sum.EnergyTotal, p0, hi.sum.PeakPower, step
		r.OneSided = true
	case lo.ok:
		eLo, eHi, pLo, pHi, span = lo.sum.EnergyTotal, e0, lo.sum.PeakPower, p0, step
		r.OneSided = true
	default:
		r.Problem = "no run possible: " + strings.Join(problems, "; ")
		if len(problems) == 0 {
			r.Problem = "both sides out of the key's range"
		}
		return
	}
	if !(eLo > 0 && eHi > 0 && pLo > 0 && pHi > 0) {
		r.Problem = "no output on one side" // values stay 0: JSON has no NaN
		return
	}
	r.Energy = (math.Log(eHi) - math.Log(eLo)) / span
	r.PeakPower = (math.Log(pHi) - math.Log(pLo)) / span
}

// rangeError marks a perturbed value outside its key's range.
type rangeError struct{ error }

func isRangeError(err error) bool { _, ok := err.(rangeError); return ok }

// perturbedRun runs d with key multiplied by exp(h), set through design.Design.Set as a user would
// set it: a key the build derives from (the channel length and gap, a build key) re-derives
// the circuit, and a derived circuit key set this way becomes explicit.
func perturbedRun(d *design.Design, key string, h float64) (kinetics.Summary, error) {
	c := d.Clone()
	x0, err := c.Get(key)
	if err != nil {
		return kinetics.Summary{}, err
	}
	x := x0 * math.Exp(h)
	if err := c.Set(key, siText(key, x)); err != nil {
		return kinetics.Summary{}, rangeError{err}
	}
	if err := c.Validate(); err != nil {
		return kinetics.Summary{}, rangeError{err}
	}
	r, err := kinetics.Run(c, &kinetics.RunSettings{Light: true})
	if err != nil {
		return kinetics.Summary{}, fmt.Errorf("%s × e^%+g: %w", key, h, err)
	}
	return r.Summary, nil
}
