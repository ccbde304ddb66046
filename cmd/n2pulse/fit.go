package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"text/tabwriter"

	"n2pulse/internal/atomicfile"
	"n2pulse/internal/usermsg"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/fit"
	"n2pulse/kinetics/fit/measured"
	"n2pulse/plots"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "fit",
		summary: "calibrate a design on measured points: fit free keys, with intervals, and say what the data cannot determine",
		run:     runFit,
	})
}

// fitCurvePoints is the number of model points along each curve of the overlay figure.
const fitCurvePoints = 25

func runFit(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("fit", "DESIGN --measured FILE --free KEY[=LO:HI] … [--out DIR] [--json]", stderr)
	measuredFile := fs.String("measured", "", "CSV of measured points: design keys as columns with units in the header (\"channel.gap [mm]\"), and energy_front, energy_rear, energy_total, peak_power or fwhm with units, each with an optional <quantity>_uncertainty column (units or %)")
	frees := fs.StringArray("free", nil, `a design key to fit, with bounds: --free circuit.switch_inductance="2 nH:100 nH" (repeatable; without bounds: a tenth to ten times the design's value)`)
	sets := fs.StringArray("set", nil, `override a design key before fitting, e.g. --set gas.pressure="760 Torr" (repeatable)`)
	starts := fs.Int("starts", 3, "starts of the minimiser: the design's values, then Latin-hypercube points inside the bounds")
	seed := fs.Uint64("seed", 1, "seed of the starts after the first")
	workers := fs.Int("workers", runtime.NumCPU(), "shots run at once")
	out := fs.String("out", "fit", `directory for fitted.toml (the design with the fitted values), residuals.csv, fit.json and one overlay figure per measured quantity ("" writes none)`)
	memLimit := fs.String("memory-limit", "", `largest memory all shots computed at once may take, e.g. "8 GB" (default: half the machine's memory); each worker gets its share`)
	along := fs.String("along", "", "design-key column of the measured file to draw the figures along (default: the one with the most distinct values)")
	asJSON := fs.Bool("json", false, "print the fit as JSON on stdout (SI units; null where a value is not determined)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() != 1 {
		return usagef("fit: name one design file, got %d", fs.NArg())
	}
	if *measuredFile == "" {
		return usagef("fit: --measured FILE is required (a CSV of measured points; see n2pulse fit --help)")
	}
	if len(*frees) == 0 {
		return usagef("fit: name at least one --free KEY to fit")
	}
	if *starts < 1 || *starts > fit.MaxStarts {
		return usagef("fit: --starts %d: want 1…%d", *starts, fit.MaxStarts)
	}
	if *workers < 1 {
		return usagef("fit: --workers %d: want at least 1", *workers)
	}
	if *along != "" {
		if _, ok := design.KeyUnit(*along); !ok {
			return usagef("fit: --along %s: not a design key", *along)
		}
	}
	d, err := loadDesign(fs.Args(), *sets)
	if err != nil {
		return err
	}
	data, err := measured.ReadFile(*measuredFile)
	if err != nil {
		return err
	}
	free, typed, err := parseFree(d, *frees)
	if err != nil {
		return err
	}
	for _, f := range free {
		for _, c := range data.Keys {
			if c.Name == f.Key {
				return usagef("fit: --free %s is also a column of %s: a key is either measured or fitted", f.Key, *measuredFile)
			}
		}
	}
	if !*asJSON {
		fmt.Fprintf(stderr, "fitting %s to %s, %s…\n", count(len(free), "key"), count(len(data.Points), "measured point"), count(*starts, "start"))
	}
	ctx := context.Background()
	runner, err := sharedMemoryRunner("fit", *memLimit, *workers)
	if err != nil {
		return err
	}
	settings := &fit.Settings{Starts: *starts, Seed: *seed, Workers: *workers, Run: runner}
	if !*asJSON {
		settings.Progress = func(i int, s fit.Start) {
			if s.Err != "" {
				fmt.Fprintf(stderr, "  start %d of %d failed: %s\n", i, *starts, usermsgText(s.Err))
				return
			}
			fmt.Fprintf(stderr, "  start %d of %d: χ² %.4g after %s\n", i, *starts, s.ChiSquare, count(s.Iterations, "iteration"))
		}
	}
	res, err := fit.Fit(ctx, d, data, free, settings)
	if err != nil {
		return err
	}
	fr := &fitReport{design: fs.Arg(0), file: *measuredFile, data: data, res: res, typed: typed, sets: *sets}
	if *out != "" {
		curves, dropped, err := fit.Curves(ctx, res.Design, data, *along, fitCurvePoints, settings)
		if err != nil {
			return err
		}
		fr.curves, fr.dropped = curves, dropped
		if fr.files, err = writeFitFiles(*out, fr); err != nil {
			return err
		}
	}
	if *asJSON {
		b, err := json.MarshalIndent(fitJSON(fr), "", "  ")
		if err != nil {
			return fmt.Errorf("fit: %w", err)
		}
		fmt.Fprintln(stdout, string(b))
	} else {
		printFit(stdout, fr)
	}
	if len(fr.files) > 0 {
		fmt.Fprintf(stderr, "wrote %s\n", strings.Join(fr.files, ", "))
	}
	return nil
}

// fitReport is everything the outputs of a fit draw on.
type fitReport struct {
	design, file string
	data         *measured.Set
	res          *fit.Result
	typed        map[string]string // free key → unit the user wrote its bounds in
	sets         []string          // --set values applied before the fit
	curves       []fit.Curve
	dropped      int
	files        []string
}

// parseFree reads the --free values: KEY, or KEY=LO:HI with units ("2 nH:100 nH"; a unit on
// the upper bound alone serves both: "2:100 nH"). It returns the bounds in SI and the unit the
// user wrote for each key.
func parseFree(d *design.Design, frees []string) ([]fit.Free, map[string]string, error) {
	var out []fit.Free
	typed := map[string]string{}
	seen := map[string]bool{}
	for _, f := range frees {
		key, bounds, hasBounds := strings.Cut(f, "=")
		key = strings.TrimSpace(key)
		lo, hi, zeroOK, ok := design.KeyRange(key)
		if !ok || design.KeyInteger(key) {
			if _, err := d.Get(key); err != nil {
				return nil, nil, usageOf("--free: ", err)
			}
			return nil, nil, usagef("--free %s: not a numeric key that varies continuously", key)
		}
		if seen[key] {
			return nil, nil, usagef("--free %s given twice", key)
		}
		seen[key] = true
		_ = zeroOK
		var fl fit.Free
		fl.Key = key
		if !hasBounds {
			v, _ := d.Get(key)
			if !(v > 0) {
				return nil, nil, usagef("--free %s: the design's value is %g, so bounds cannot be taken around it; give them: --free %s=LO:HI", key, v, key)
			}
			fl.Lo, fl.Hi = math.Max(v/10, lo), math.Min(v*10, hi/math.Exp(fit.DefaultStep))
		} else {
			a, b, ok := strings.Cut(bounds, ":")
			if !ok {
				return nil, nil, usagef("--free %q: want KEY=LO:HI, e.g. --free %s=\"2 nH:100 nH\"", f, key)
			}
			a, b = strings.TrimSpace(a), strings.TrimSpace(b)
			unit := units.UnitOf(b)
			if units.UnitOf(a) == "" && unit != "" {
				a += " " + unit
			}
			var err error
			if fl.Lo, err = boundValue(key, a); err != nil {
				return nil, nil, err
			}
			if fl.Hi, err = boundValue(key, b); err != nil {
				return nil, nil, err
			}
			if !(fl.Lo > 0 && fl.Hi > fl.Lo) {
				return nil, nil, usagef("--free %s: bounds %s : %s, want 0 < LO < HI (the fit works in logarithms)", key, a, b)
			}
			if fl.Hi*math.Exp(fit.DefaultStep) > hi {
				return nil, nil, usagef("--free %s: upper bound %s is too close to the key's largest allowed value %g %s", key, b, hi, unitOf(key))
			}
			typed[key] = unit
		}
		out = append(out, fl)
	}
	if len(out) > fit.MaxFree {
		return nil, nil, usagef("--free: %d keys, at most %d", len(out), fit.MaxFree)
	}
	return out, typed, nil
}

// boundValue reads one bound of a free key as a design value of that key.
func boundValue(key, text string) (float64, error) {
	d := design.Defaults()
	if err := d.Set(key, text); err != nil {
		return 0, usageOf("--free: ", err)
	}
	return d.Get(key)
}

func unitOf(key string) string { u, _ := design.KeyUnit(key); return u }

// freeLabel is the label of a free key, shown in the unit its bounds were written in.
func (fr *fitReport) freeLabel(key string) plots.Label {
	return keyLabel(key).Typed(micro(fr.typed[key]))
}

// micro writes the ASCII micro prefix of a typed unit as µ for display: "uJ" → "µJ".
func micro(unit string) string {
	if len(unit) > 1 && unit[0] == 'u' {
		if _, _, err := units.ParseUnit(unit[1:]); err == nil {
			return "µ" + unit[1:]
		}
	}
	return unit
}

// quantityLabel is the label of a measured quantity in the unit of the file's header.
func (fr *fitReport) quantityLabel(q string) plots.Label {
	mq, _ := measured.QuantityOf(q)
	l := plots.LabelOf(mq.Metric)
	l.Text = mq.Words
	for _, c := range fr.data.Quantities {
		if c.Name == q {
			return l.Typed(micro(c.Unit))
		}
	}
	return l
}

// printFit writes the fitted keys, what is not determined, correlations, residuals and χ².
func printFit(w io.Writer, fr *fitReport) {
	r := fr.res
	fmt.Fprintf(w, "fit of %s to %s: %s, %s, %s; %s, %s (best: %d)\n", fr.design, fr.file,
		count(len(fr.data.Points), "point"), count(r.Values, "measured value"), count(len(r.Params), "free key"),
		count(int(r.Runs), "shot"), count(len(r.Starts), "start"), r.Best+1)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "\nkey\tdesign\tfitted\t95 % interval\tbounds")
	for _, p := range r.Params {
		l := fr.freeLabel(p.Key)
		interval := "NOT DETERMINED"
		if p.Determined {
			interval = l.Format(p.Lo95) + " … " + l.Format(p.Hi95)
		}
		fitted := l.Format(p.Value)
		if !p.Determined {
			fitted = "(" + fitted + ")"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s … %s\n", p.Key, l.Format(p.Start), fitted, interval, l.Format(p.Lo), l.Format(p.Hi))
	}
	tw.Flush()
	for _, p := range r.Params {
		if !p.Determined {
			fmt.Fprintf(w, "  %s is not determined by these data: %s. Its value in fitted.toml is where the minimiser stopped, not a measurement.\n", p.Key, p.Why)
		}
	}
	if r.SeveralOptima {
		fmt.Fprintln(w, "  another start ended as low elsewhere: the data allow more than one answer (see the starts in fit.json)")
	}
	if len(r.Params) > 1 {
		fmt.Fprintln(w, "\ncorrelation of the fitted values (ln):")
		tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
		for i, p := range r.Params {
			fmt.Fprintf(tw, "%s\t", p.Key)
			for j := range r.Params {
				if c := r.Correlation[i][j]; math.IsNaN(c) {
					fmt.Fprint(tw, "–\t")
				} else {
					fmt.Fprintf(tw, "%+.2f\t", c)
				}
			}
			fmt.Fprintln(tw)
		}
		tw.Flush()
	}
	if len(r.Singular) > 1 {
		var sv []string
		for _, x := range r.Singular {
			sv = append(sv, fmt.Sprintf("%.3g", x))
		}
		fmt.Fprintf(w, "how strongly the data respond to the keys (singular values of the weighted Jacobian in ln x): %s", strings.Join(sv, ", "))
		if s := r.Singular; s[0] > 0 && s[len(s)-1] < 0.01*s[0] {
			fmt.Fprintf(w, "; the smallest is %.2g of the largest: the data see mainly a combination of the keys", s[len(s)-1]/s[0])
		}
		fmt.Fprintln(w)
	}
	fmt.Fprintln(w, "\nresiduals (model against measured):")
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprint(tw, "line\t")
	for _, c := range fr.data.Keys {
		fmt.Fprintf(tw, "%s\t", c.Name)
	}
	fmt.Fprintln(tw, "quantity\tmeasured\tmodel\tmodel/measured\tin standard uncertainties")
	for _, rs := range r.Residuals {
		pt := fr.data.Points[rs.Point]
		fmt.Fprintf(tw, "%d\t", rs.Line)
		for _, s := range pt.Settings {
			fmt.Fprintf(tw, "%s\t", s.Value)
		}
		l := fr.quantityLabel(rs.Quantity)
		norm := fmt.Sprintf("%+.2f", rs.Normalised)
		if math.IsNaN(rs.Normalised) {
			norm = "–"
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%.3g\t%s\n", rs.Quantity, l.Format(rs.Measured), l.Format(rs.Model), rs.Model/rs.Measured, norm)
	}
	tw.Flush()
	switch {
	case !r.ScatterEstimated:
		fmt.Fprintf(w, "χ² = %.3g for %d degree%s of freedom (uncertainties from the file)\n", r.ChiSquare, r.DOF, map[bool]string{true: "", false: "s"}[r.DOF == 1])
	case r.DOF > 0:
		fmt.Fprintf(w, "no uncertainties in the file: scatter of model/measured estimated from the residuals, %.2g %% (%s)\n", 100*r.RelScatter, fmt.Sprintf("%d degree%s of freedom", r.DOF, map[bool]string{true: "", false: "s"}[r.DOF == 1]))
	default:
		fmt.Fprintln(w, "no uncertainties in the file and no measured value to spare (as many values as determined keys): no interval can be given; add <quantity>_uncertainty columns or more points")
	}
	fmt.Fprintln(w, "The intervals say how far the data pin each key down through the model; they do not include the model's own errors.")
	if fr.dropped > 0 {
		fmt.Fprintf(w, "the figures show the first %d groups of points; %d more were left out\n", len(fr.curves), fr.dropped)
	}
	var stored, pulse float64
	for _, c := range fr.curves {
		stored, pulse = math.Max(stored, c.Stored), math.Max(pulse, c.Pulse)
	}
	if c := caution(stored, pulse); c != "" {
		fmt.Fprintln(w, "\n"+c)
	}
}

// usermsgText is an error text without the library's package prefixes.
func usermsgText(s string) string { return usermsg.Strip(s) }

// count writes n things: "1 start", "3 starts".
func count(n int, thing string) string {
	if n == 1 {
		return "1 " + thing
	}
	return fmt.Sprintf("%d %ss", n, thing)
}

// nullable is x, or nil (JSON null) when it is NaN or infinite.
func nullable(x float64) any {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return nil
	}
	return x
}

// fitJSON is what fit --json prints and fit.json holds (SI units).
func fitJSON(fr *fitReport) map[string]any {
	r := fr.res
	var params []map[string]any
	for _, p := range r.Params {
		m := map[string]any{"key": p.Key, "start": nullable(p.Start), "lower_bound": p.Lo, "upper_bound": p.Hi,
			"value": p.Value, "determined": p.Determined, "at_bound": p.AtBound,
			"sd_ln": nullable(p.SDLog), "ci95_low": nil, "ci95_high": nil}
		if p.Determined {
			m["ci95_low"], m["ci95_high"] = p.Lo95, p.Hi95
		}
		if p.Why != "" {
			m["why"] = p.Why
		}
		params = append(params, m)
	}
	corr := make([][]any, len(r.Correlation))
	for i, row := range r.Correlation {
		for _, c := range row {
			corr[i] = append(corr[i], nullable(c))
		}
	}
	var resid []map[string]any
	for _, rs := range r.Residuals {
		settings := map[string]string{}
		for _, s := range fr.data.Points[rs.Point].Settings {
			settings[s.Key] = s.Value
		}
		resid = append(resid, map[string]any{"line": rs.Line, "settings": settings, "quantity": rs.Quantity,
			"measured": rs.Measured, "model": rs.Model, "uncertainty": nullable(rs.Uncertainty), "normalised": nullable(rs.Normalised)})
	}
	var starts []map[string]any
	for _, s := range r.Starts {
		m := map[string]any{"from": s.From, "values": s.Values, "chi_square": nullable(s.ChiSquare), "iterations": s.Iterations, "status": s.Status}
		if s.Err != "" {
			m["error"] = s.Err
		}
		starts = append(starts, m)
	}
	files := fr.files
	if files == nil {
		files = []string{}
	}
	undetermined := r.Undetermined()
	if undetermined == nil {
		undetermined = []string{}
	}
	return map[string]any{
		"design": fr.design, "measured": fr.file, "points": len(fr.data.Points), "values": r.Values,
		"params": params, "undetermined": undetermined, "correlation": corr, "residuals": resid,
		"chi_square": r.ChiSquare, "degrees_of_freedom": r.DOF, "scatter_estimated": r.ScatterEstimated,
		"relative_scatter": nullable(r.RelScatter), "singular_values": r.Singular, "starts": starts,
		"best_start": r.Best + 1, "several_optima": r.SeveralOptima, "shots": r.Runs, "files": files,
	}
}

// writeFitFiles writes fitted.toml, residuals.csv, fit.json and the overlay figures into dir.
func writeFitFiles(dir string, fr *fitReport) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var files []string
	write := func(name string, b []byte) error {
		path := filepath.Join(dir, name)
		if err := atomicfile.WriteFile(path, b); err != nil {
			return err
		}
		files = append(files, path)
		return nil
	}
	var toml bytes.Buffer
	fmt.Fprintf(&toml, "# Design %s fitted to the measured points of %s by `n2pulse fit`.\n", fr.design, fr.file)
	for _, s := range fr.sets {
		fmt.Fprintf(&toml, "# changed before the fit: --set %s\n", s)
	}
	for _, p := range fr.res.Params {
		l := fr.freeLabel(p.Key)
		if p.Determined {
			fmt.Fprintf(&toml, "# %s = %s (95 %%: %s … %s)\n", p.Key, l.Format(p.Value), l.Format(p.Lo95), l.Format(p.Hi95))
		} else {
			fmt.Fprintf(&toml, "# %s = %s is NOT determined by the data (%s): where the minimiser stopped, not a measurement\n", p.Key, l.Format(p.Value), p.Why)
		}
	}
	toml.WriteString("\n" + fr.res.Design.Listing())
	if err := write("fitted.toml", toml.Bytes()); err != nil {
		return nil, err
	}
	var csv bytes.Buffer
	csv.WriteString("line")
	for _, c := range fr.data.Keys {
		fmt.Fprintf(&csv, ",%s", c.Name)
	}
	csv.WriteString(",quantity,measured_SI,model_SI,uncertainty_SI,normalised\n")
	for _, rs := range fr.res.Residuals {
		fmt.Fprintf(&csv, "%d", rs.Line)
		for _, s := range fr.data.Points[rs.Point].Settings {
			fmt.Fprintf(&csv, ",%q", s.Value)
		}
		fmt.Fprintf(&csv, ",%s,%g,%g,%g,%g\n", rs.Quantity, rs.Measured, rs.Model, rs.Uncertainty, rs.Normalised)
	}
	if err := write("residuals.csv", csv.Bytes()); err != nil {
		return nil, err
	}
	for _, q := range fr.data.Quantities {
		if len(fr.curves) == 0 {
			break
		}
		path := filepath.Join(dir, "fit-"+q.Name+".png")
		if err := plots.FitOverlay(path, fitFigure(fr, q.Name)); err != nil {
			return nil, err
		}
		files = append(files, path)
	}
	fr.files = append(files, filepath.Join(dir, "fit.json")) // listed in its own content
	js, err := json.MarshalIndent(fitJSON(fr), "", "  ")
	fr.files = nil
	if err != nil {
		return nil, fmt.Errorf("fit: %w", err)
	}
	if err := write("fit.json", append(js, '\n')); err != nil {
		return nil, err
	}
	return files, nil
}

// fitFigure is the overlay of one measured quantity: the curves of the fitted model and the
// measured points, in the file's units.
func fitFigure(fr *fitReport, q string) plots.FitFigure {
	key := fr.curves[0].Key
	xl := keyLabel(key)
	for _, c := range fr.data.Keys {
		if c.Name == key {
			xl = xl.Typed(micro(c.Unit))
		}
	}
	yl := fr.quantityLabel(q)
	var xmax, ymax float64
	for _, c := range fr.curves {
		for _, x := range c.X {
			xmax = math.Max(xmax, math.Abs(x))
		}
		for _, y := range c.Y[q] {
			if !math.IsNaN(y) {
				ymax = math.Max(ymax, math.Abs(y))
			}
		}
	}
	for _, p := range fr.data.Points {
		for _, v := range p.Values {
			if v.Quantity == q {
				ymax = math.Max(ymax, v.Value)
			}
		}
	}
	xs, _ := xl.Display(xmax)
	ys, _ := yl.Display(ymax)
	fig := plots.FitFigure{Title: yl.Text + ": measured and fitted model", XLabel: xl.AxisTitle(xmax), YLabel: yl.AxisTitle(ymax)}
	for _, c := range fr.curves {
		var words []string
		for _, s := range c.Fixed {
			words = append(words, keyLabel(s.Key).Text+" "+s.Value)
		}
		s := plots.FitSeries{Label: strings.Join(words, ", ")}
		for j, x := range c.X {
			s.ModelX = append(s.ModelX, x*xs)
			s.ModelY = append(s.ModelY, c.Y[q][j]*ys)
		}
		var errs []float64
		for k, i := range c.Points {
			for _, v := range fr.data.Points[i].Values {
				if v.Quantity != q {
					continue
				}
				s.PointX = append(s.PointX, c.PointX[k]*xs)
				s.PointY = append(s.PointY, v.Value*ys)
				errs = append(errs, v.Uncertainty*ys)
			}
		}
		if fr.data.Uncertain {
			s.PointErr = errs
		}
		fig.Series = append(fig.Series, s)
	}
	return fig
}
