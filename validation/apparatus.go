package validation

import (
	"bytes"
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"n2pulse/internal/pool"
	"n2pulse/kinetics"
	"n2pulse/kinetics/build"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// Apparatus alternatives: the values of the common block (testdata/experiments/COMMON.md) that
// no source gives, replaced one at a time by physically consistent choices, so that a reader
// sees how far the apparatus alone could move each case. The list is fixed in COMMON.md
// ("Apparatus alternatives"); it is apparatus uncertainty, not the model's (ExperimentBands).

// Alternative is one apparatus alternative for one case: the design keys it sets (SI values)
// and why.
type Alternative struct {
	Name string             // "switch-holding-gap", ...
	Sets map[string]float64 // design key → SI value
	Why  string             // the constraint or range it comes from
}

// AlternativeRun is one alternative's run of a case.
type AlternativeRun struct {
	Alternative
	Energy float64 // at the end(s) the source measured [J]; NaN when the run failed
	FWHM   float64 // output-end pulse width [s]; NaN when undefined or the run failed
	// FWHMIllConditioned: the run's half-maximum width may leap with a small change
	// (kinetics.Summary.FWHMIllConditioned).
	FWHMIllConditioned bool
	Lases              bool // laser output above the spontaneous-emission floor
	Err                error
}

// EnvelopeRow is one experiment case's measured energy and FWHM set against the range of the
// model over the apparatus alternatives (not including the nominal run, whose switch need not
// hold the charge).
type EnvelopeRow struct {
	Case                  string
	End                   string  // "front" or "total": the end(s) the source measured
	Measured, MeasuredW   float64 // measured energy [J] and FWHM [s]; NaN when not measured
	Nominal, NominalW     float64 // the case as written (common block) [J], [s]
	EnergyLow, EnergyHigh float64 // smallest and largest energy of the alternatives [J]
	FWHMLow, FWHMHigh     float64 // smallest and largest FWHM of the alternatives [s]; NaN when none defined
	MeasuredLases         *bool   // whether the source's laser lased, when the source says; nil otherwise
	NominalLases          bool    // whether the nominal run lases
	Runs                  []AlternativeRun
	// Derived are the case's checks derived from its measured variations (optimum, ratio,
	// direction, optimum shift), each over the same alternatives.
	Derived []DerivedRow
	Err     error // the case could not be set up or its nominal run failed
}

// IllConditionedW returns the names of the alternatives whose FWHM is ill-conditioned.
func (r EnvelopeRow) IllConditionedW() []string {
	var names []string
	for _, a := range r.Runs {
		if a.Err == nil && a.FWHMIllConditioned {
			names = append(names, a.Name)
		}
	}
	return names
}

// position says where x lies against [lo, hi]: "inside", "below", "above", or "" when x or the
// range is undefined.
func position(x, lo, hi float64) string {
	switch {
	case math.IsNaN(x) || math.IsNaN(lo) || math.IsNaN(hi):
		return ""
	case x < lo:
		return "below"
	case x > hi:
		return "above"
	}
	return "inside"
}

// MeasuredPosition says where the measured energy lies against the alternatives' range:
// "inside", "below", "above", or "" when not measured or no range.
func (r EnvelopeRow) MeasuredPosition() string {
	return position(r.Measured, r.EnergyLow, r.EnergyHigh)
}

// MeasuredWPosition is MeasuredPosition for the FWHM.
func (r EnvelopeRow) MeasuredWPosition() string {
	return position(r.MeasuredW, r.FWHMLow, r.FWHMHigh)
}

// Lasing counts the alternatives whose run lases and those that ran.
func (r EnvelopeRow) Lasing() (lasing, ran int) {
	for _, a := range r.Runs {
		if a.Err == nil {
			ran++
			if a.Lases {
				lasing++
			}
		}
	}
	return lasing, ran
}

// NominalPosition says where the nominal energy lies against the alternatives' range.
func (r EnvelopeRow) NominalPosition() string {
	return position(r.Nominal, r.EnergyLow, r.EnergyHigh)
}

// switchGas is the gas of the common block's spark gap: room air (COMMON.md).
const switchGas = "air"

// HoldingSwitch returns the two spark gaps of the apparatus alternatives that hold the charge
// voltage v [V] exactly by the project's Paschen law for air at 293.15 K (build.Townsend,
// data/materials.toml): the gap [m] at the given pressure p [Pa], and the pressure [Pa] at
// which the given gap d [m] holds.
func HoldingSwitch(v, p, d float64) (gap, pressure float64, err error) {
	if !(p > 0) || !(d > 0) {
		return 0, 0, fmt.Errorf("validation: holding switch: pressure %g Pa and gap %g m must be positive", p, d)
	}
	g, err := build.Gas(switchGas)
	if err != nil {
		return 0, 0, err
	}
	pd, err := g.HoldingPD(v)
	if err != nil {
		return 0, 0, err
	}
	// ReducedPD at the fits' own temperature is p·d itself, as bench rates the switch.
	return pd / p, pd / d, nil
}

// commonWidth returns the discharge width of the common block (common.toml), the value the
// cases use when their source gives none.
func commonWidth() (float64, error) {
	b, err := experimentFiles.ReadFile(experimentDir + "/common.toml")
	if err != nil {
		return 0, fmt.Errorf("validation: common block: %w", err)
	}
	var c struct {
		Channel struct {
			Width string `toml:"width"`
		} `toml:"channel"`
	}
	if _, err := toml.NewDecoder(bytes.NewReader(b)).Decode(&c); err != nil {
		return 0, fmt.Errorf("validation: common.toml: %w", err)
	}
	w, err := units.Parse(c.Channel.Width, units.Length)
	if err != nil {
		return 0, fmt.Errorf("validation: common.toml: channel.width: %w", err)
	}
	return w, nil
}

// Alternatives returns the apparatus alternatives of a case design, in the order of COMMON.md.
// widthGiven says whether the case's source gives the discharge width (then the width is not
// varied).
func Alternatives(d *design.Design, widthGiven bool) ([]Alternative, error) {
	get := func(key string) float64 { v, _ := d.Get(key); return v }
	v0, p0, d0 := get("circuit.charge_voltage"), get("switch.pressure"), get("switch.gap")
	hGap, hPres, err := HoldingSwitch(v0, p0, d0)
	if err != nil {
		return nil, err
	}
	ls, lc := get("circuit.switch_inductance"), get("circuit.channel_inductance")
	const paschen = "holds the charge voltage by the project's Paschen law for air (data/materials.toml townsend.air)"
	const loops = "range of a common-practice loop inductance: common practice, no source"
	gapSw := map[string]float64{"switch.gap": hGap}
	presSw := map[string]float64{"switch.pressure": hPres}
	// The spark's resistance scales as d·√p (Rompe–Weizel, kinetics/circuit.go): the slow
	// corner takes the holding switch with the larger factor.
	slowSw, fastSw := gapSw, presSw
	if hGap*math.Sqrt(p0) < d0*math.Sqrt(hPres) {
		slowSw, fastSw = presSw, gapSw
	}
	with := func(sw map[string]float64, f float64) map[string]float64 {
		m := map[string]float64{"circuit.switch_inductance": f * ls, "circuit.channel_inductance": f * lc}
		for k, v := range sw {
			m[k] = v
		}
		return m
	}
	alts := []Alternative{
		{"switch-holding-gap", gapSw, fmt.Sprintf("shortest gap at %s that %s", units.Format(p0, "Pa"), paschen)},
		{"switch-holding-pressure", presSw, fmt.Sprintf("lowest pressure at which the %s gap %s", units.Format(d0, "m"), paschen)},
		{"switch-loop-half", map[string]float64{"circuit.switch_inductance": 0.5 * ls}, loops},
		{"switch-loop-triple", map[string]float64{"circuit.switch_inductance": 3 * ls}, loops},
		{"channel-loop-half", map[string]float64{"circuit.channel_inductance": 0.5 * lc}, loops},
		{"channel-loop-triple", map[string]float64{"circuit.channel_inductance": 3 * lc}, loops},
	}
	if !widthGiven {
		g := get("channel.gap")
		const glow = "glow 1–2 gaps wide where the source gives no width: common practice, no source"
		alts = append(alts,
			Alternative{"width-one-gap", map[string]float64{"channel.width": g}, glow},
			Alternative{"width-two-gaps", map[string]float64{"channel.width": 2 * g}, glow})
	}
	return append(alts,
		Alternative{"corner-slow", with(slowSw, 3), "holding switch with the larger spark resistance factor d·√p, both loops ×3"},
		Alternative{"corner-fast", with(fastSw, 0.5), "holding switch with the smaller spark resistance factor d·√p, both loops ×0.5"},
	), nil
}

// apply returns a copy of d with the alternative's keys set, validated.
func (a Alternative) apply(d *design.Design) (*design.Design, error) {
	c := d.Clone()
	for key, v := range a.Sets {
		u, ok := design.KeyUnit(key)
		if !ok {
			return nil, fmt.Errorf("validation: alternative %s: unknown key %s", a.Name, key)
		}
		if err := c.Set(key, fmt.Sprintf("%.17g %s", v, u)); err != nil {
			return nil, fmt.Errorf("validation: alternative %s: %w", a.Name, err)
		}
	}
	if err := c.Validate(); err != nil {
		return nil, fmt.Errorf("validation: alternative %s: %w", a.Name, err)
	}
	return c, nil
}

// ApparatusEnvelope runs every experiment case with a measured energy, FWHM, lasing or
// variation once per apparatus alternative (Alternatives; workers goroutines, 0: one per CPU)
// and returns one row per such case, in case order, with the nominal values of the
// scoreboard's runs. Each alternative also reruns the case's measured variations (the scans of
// the default checks) and derives their checks the same way (EnvelopeRow.Derived). A case that
// fails carries its error in its row; an error is returned only when the cases cannot be read.
func ApparatusEnvelope(workers int) ([]EnvelopeRow, error) {
	cases, err := loadExperiments(experimentFiles)
	if err != nil {
		return nil, err
	}
	score, err := Scoreboard()
	if err != nil {
		return nil, err
	}
	wCommon, err := commonWidth()
	if err != nil {
		return nil, err
	}
	nan := math.NaN()
	var rows []*EnvelopeRow
	type task struct {
		row *EnvelopeRow
		k   int
		d   *design.Design
	}
	var tasks []task
	// The measured variations of each case rerun under each alternative, grouped by
	// alternative so that an optimum shift compares two cases under the same one.
	var altNames []string
	plans := map[string][]*scanPlan{}
	var derivedJobs []*job
	for i := range cases {
		c := &cases[i]
		s := score[i]
		if math.IsNaN(s.Measured) && math.IsNaN(s.MeasuredW) && c.Measured.Lases == nil && len(c.Measured.Variation) == 0 {
			continue
		}
		row := &EnvelopeRow{Case: c.Name, End: "front", Measured: s.Measured, MeasuredW: s.MeasuredW,
			Nominal: s.Energy, NominalW: s.FWHM, EnergyLow: nan, EnergyHigh: nan, FWHMLow: nan, FWHMHigh: nan, Err: s.Err,
			MeasuredLases: c.Measured.Lases, NominalLases: s.Lases}
		if c.Measured.Energy != nil && c.Measured.Energy.End == "total" {
			row.End = "total"
		}
		rows = append(rows, row)
		if row.Err != nil {
			continue
		}
		alts, err := Alternatives(c.Design, c.Design.Channel.Width != wCommon)
		if err != nil {
			row.Err = fmt.Errorf("validation: %s: %w", c.Name, err)
			continue
		}
		for _, a := range alts {
			row.Runs = append(row.Runs, AlternativeRun{Alternative: a, Energy: nan, FWHM: nan})
			k := len(row.Runs) - 1
			d, err := a.apply(c.Design)
			if err != nil {
				row.Runs[k].Err = err
				continue
			}
			tasks = append(tasks, task{row, k, d})
			alt := &expCase{Name: c.Name, Design: d, Measured: c.Measured}
			for v := range c.Measured.Variation {
				p := planScan(alt, &c.Measured.Variation[v])
				if _, ok := plans[a.Name]; !ok {
					altNames = append(altNames, a.Name)
				}
				plans[a.Name] = append(plans[a.Name], p)
				derivedJobs = append(derivedJobs, p.jobs...)
			}
		}
	}
	pool.Each(len(tasks), workers, func(i int) {
		t := tasks[i]
		run := &t.row.Runs[t.k]
		res, err := kinetics.Run(t.d, &kinetics.RunSettings{Light: true})
		if err != nil {
			run.Err = err
			return
		}
		run.Energy, run.FWHM, run.Lases = res.Summary.EnergyFront, res.Summary.FWHM, res.Summary.Lases
		run.FWHMIllConditioned = res.Summary.FWHMIllConditioned
		if t.row.End == "total" {
			run.Energy = res.Summary.EnergyTotal
		}
	})
	runJobs(derivedJobs, workers)
	addDerived(rows, altNames, plans)
	out := make([]EnvelopeRow, len(rows))
	for i, r := range rows {
		for _, run := range r.Runs {
			r.EnergyLow, r.EnergyHigh = widen(r.EnergyLow, r.EnergyHigh, run.Energy)
			r.FWHMLow, r.FWHMHigh = widen(r.FWHMLow, r.FWHMHigh, run.FWHM)
		}
		out[i] = *r
	}
	return out, nil
}

// widen extends [lo, hi] (NaN: empty) by x when x is a number.
func widen(lo, hi, x float64) (float64, float64) {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return lo, hi
	}
	if math.IsNaN(lo) || x < lo {
		lo = x
	}
	if math.IsNaN(hi) || x > hi {
		hi = x
	}
	return lo, hi
}

// Settings describes what the alternative sets, keys in sorted order:
// "circuit.switch_inductance = 5 nH".
func (a Alternative) Settings() string {
	keys := make([]string, 0, len(a.Sets))
	for k := range a.Sets {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	var b strings.Builder
	for i, k := range keys {
		if i > 0 {
			b.WriteString(", ")
		}
		u, _ := design.KeyUnit(k)
		fmt.Fprintf(&b, "%s = %s", k, units.Format(a.Sets[k], u))
	}
	return b.String()
}

// ApparatusNote is the sentence every output of the envelope carries: what it is and is not.
const ApparatusNote = "apparatus alternatives, not model uncertainty: the common block's switch, loop inductances and (where the source gives none) discharge width replaced one at a time by the choices listed in validation/testdata/experiments/COMMON.md; the range is over the alternatives only (the nominal switch does not hold the charge); the default checks, their tolerances and the common block are unchanged"

// writeApparatus writes the apparatus section of checks.md (nothing when rows is nil).
func writeApparatus(w *bytes.Buffer, rows []EnvelopeRow) {
	if rows == nil {
		return
	}
	fmt.Fprintf(w, "\n## Apparatus alternatives (not model uncertainty)\n\n")
	fmt.Fprintf(w, "%s.\n\n", strings.ToUpper(ApparatusNote[:1])+ApparatusNote[1:])
	fmt.Fprintf(w, "| case | end | measured energy | nominal | alternatives min–max | measured lies | nominal lies | measured FWHM | nominal FWHM | alternatives FWHM min–max | measured FWHM lies |\n")
	fmt.Fprintf(w, "| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |\n")
	for _, r := range rows {
		if r.Err != nil {
			fmt.Fprintf(w, "| %s | error: %s | | | | | | | | | |\n", r.Case, mdCell(r.Err.Error()))
			continue
		}
		ill := ""
		if n := len(r.IllConditionedW()); n > 0 {
			ill = fmt.Sprintf(" (%d ill-conditioned)", n)
		}
		fmt.Fprintf(w, "| %s | %s | %s | %s | %s – %s | %s | %s | %s | %s | %s – %s%s | %s |\n", r.Case, r.End,
			scoreValue(r.Measured*1e6, "µJ"), scoreValue(r.Nominal*1e6, "µJ"),
			scoreValue(r.EnergyLow*1e6, "µJ"), scoreValue(r.EnergyHigh*1e6, "µJ"), dash(r.MeasuredPosition()), dash(r.NominalPosition()),
			scoreValue(r.MeasuredW*1e9, "ns"), scoreValue(r.NominalW*1e9, "ns"),
			scoreValue(r.FWHMLow*1e9, "ns"), scoreValue(r.FWHMHigh*1e9, "ns"), ill, dash(r.MeasuredWPosition()))
	}
	for _, r := range rows {
		if r.Err == nil && r.MeasuredLases != nil {
			fmt.Fprintf(w, "\n%s.\n", LasingSentence(r))
		}
	}
	writeDerived(w, rows)
	fmt.Fprintf(w, "\n| case | alternative | sets | energy | FWHM | lases |\n| --- | --- | --- | --- | --- | --- |\n")
	for _, r := range rows {
		for _, a := range r.Runs {
			if a.Err != nil {
				fmt.Fprintf(w, "| %s | %s | %s | error: %s | | |\n", r.Case, a.Name, mdCell(a.Settings()), mdCell(a.Err.Error()))
				continue
			}
			fwhm := scoreValue(a.FWHM*1e9, "ns")
			if a.FWHMIllConditioned {
				fwhm += " (ill-conditioned)"
			}
			fmt.Fprintf(w, "| %s | %s | %s | %s | %s | %s |\n", r.Case, a.Name, mdCell(a.Settings()),
				scoreValue(a.Energy*1e6, "µJ"), fwhm, yesNo(a.Lases))
		}
	}
}

// LasingSentence says, for a case whose source says whether its laser lased, what the source,
// the nominal run and the alternatives give: "tea-x: the source's laser did not lase; the
// nominal run lases; 8 of 8 alternatives lase".
func LasingSentence(r EnvelopeRow) string {
	src := "did not lase"
	if r.MeasuredLases != nil && *r.MeasuredLases {
		src = "lased"
	}
	nom := "does not lase"
	if r.NominalLases {
		nom = "lases"
	}
	k, n := r.Lasing()
	return fmt.Sprintf("%s: the source's laser %s; the nominal run %s; %d of %d alternatives lase", r.Case, src, nom, k, n)
}

// yesNo is "yes" or "no".
func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// dash is s, or "–" when empty.
func dash(s string) string {
	if s == "" {
		return "–"
	}
	return s
}
