package main

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"

	"n2pulse/internal/atomicfile"
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
	"n2pulse/report"
)

func init() {
	register(command{
		name:    "compare",
		summary: "run two or more designs and set them side by side: the keys that differ, every figure of merit with its ratio, the pulses on one figure",
		run:     runCompare,
	})
}

// compared is one design of a comparison and its shot.
type compared struct {
	Name    string           `json:"name"`
	File    string           `json:"file"`
	Summary kinetics.Summary `json:"summary"`
	// Uncertainty is the design's band with --uncertainty (uncertaintyJSON).
	Uncertainty map[string]any `json:"uncertainty,omitempty"`
	design      *design.Design
	result      *kinetics.Result
	band        *study.UncertaintyResult
}

// keyDiff is a design key whose value differs between the designs, in SI.
type keyDiff struct {
	Key    string   `json:"key"`
	Values []string `json:"values"`
}

// metricRow is one figure of merit of every design and its ratio to the first (null where the
// first is zero or a value is undefined).
type metricRow struct {
	Metric string     `json:"metric"`
	Values []float64  `json:"values"`
	Ratios []*float64 `json:"ratio_to_first"`
	// Bands (with --uncertainty) is each design's 5/50/95 % band, null where it has none;
	// RatioBands the band of each design's ratio to the first over paired samples (the same
	// constants in both), null where there is none.
	Bands      []*study.Band `json:"bands,omitempty"`
	RatioBands []*study.Band `json:"ratio_to_first_bands,omitempty"`
}

// comparison is what `compare --json` prints.
type comparison struct {
	Designs []compared  `json:"designs"`
	Differ  []keyDiff   `json:"differing_keys"`
	Metrics []metricRow `json:"metrics"`
	Files   []string    `json:"files,omitempty"`
	// Samples and Seed of --uncertainty; absent without.
	Samples int    `json:"uncertainty_samples,omitempty"`
	Seed    uint64 `json:"uncertainty_seed,omitempty"`
}

func runCompare(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("compare", "A.toml B.toml [C.toml …] [--set key=value …] [--out DIR] [--json]", stderr)
	sets := fs.StringArray("set", nil, `override a design key in every design, e.g. --set gas.pressure="40 Torr" (repeatable)`)
	out := fs.String("out", "compare", `directory for compare.csv, the figure compare.png/.svg and report.html ("" writes none)`)
	asJSON := fs.Bool("json", false, "print the comparison as JSON on stdout (SI units)")
	samples := fs.Int("uncertainty", 0, fmt.Sprintf("also run every design over the same N samples of the uncertain constants (Latin hypercube, %d…%d; a constant a design gives at a value other than its default is held in that design): each figure's 5–95 %% band and the band of each ratio to the first design", study.MinSamples, study.MaxSamples))
	seed := fs.Uint64("seed", 1, "seed of the --uncertainty samples (the same seed gives the same bands on any machine and worker count)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() < 2 {
		return usagef("compare: name at least two design files, got %d", fs.NArg())
	}
	if err := study.CheckSamples("--uncertainty", *samples); err != nil {
		return usageOf("compare: ", err)
	}
	if err := study.CheckSampledRuns("--uncertainty", *samples, fs.NArg()); err != nil {
		return usageOf("compare: ", err)
	}
	c := comparison{Samples: *samples}
	if *samples > 0 {
		c.Seed = *seed
	}
	seen := map[string]int{}
	for _, f := range fs.Args() {
		d, err := loadDesign([]string{f}, *sets)
		if err != nil {
			return err
		}
		r, err := kinetics.Run(d, nil)
		if err != nil {
			return fmt.Errorf("compare: %s: %w", f, err)
		}
		name := d.Name
		if name == "" || seen[name] > 0 {
			name = strings.TrimSuffix(filepath.Base(f), filepath.Ext(f))
		}
		seen[name]++
		cd := compared{Name: name, File: f, Summary: r.Summary, design: d, result: r}
		if *samples > 0 {
			if cd.band, err = study.Uncertainty(context.Background(), d, *samples, *seed, 0, nil); err != nil {
				return fmt.Errorf("compare: %s: --uncertainty: %w", f, err)
			}
			cd.Uncertainty = uncertaintyJSON(cd.band)
		}
		c.Designs = append(c.Designs, cd)
		for _, w := range r.Warnings {
			fmt.Fprintf(stderr, "warning: %s: %s\n", name, w)
		}
	}
	c.Differ = differingKeys(c.Designs)
	var err error
	if c.Metrics, err = metricRows(c.Designs); err != nil {
		return err
	}
	if *out != "" {
		if c.Files, err = writeCompareFiles(*out, &c); err != nil {
			return err
		}
	}
	if *asJSON {
		b, err := json.MarshalIndent(c, "", "  ")
		if err != nil {
			return fmt.Errorf("compare: %w", err)
		}
		fmt.Fprintln(stdout, string(b))
	} else {
		printComparison(stdout, &c)
		if c.Samples > 0 {
			printCompareBands(stdout, &c)
		}
	}
	var stored, pulse float64
	for _, d := range c.Designs {
		stored, pulse = math.Max(stored, d.Summary.StoredEnergy), math.Max(pulse, d.Summary.EnergyTotal)
	}
	if msg := caution(stored, pulse); msg != "" && !*asJSON {
		fmt.Fprintln(stdout, "\n"+msg)
	}
	if len(c.Files) > 0 {
		fmt.Fprintf(stderr, "wrote %s\n", strings.Join(c.Files, ", "))
	}
	return nil
}

// differingKeys lists the design keys (in the order of the key listing) whose values are not
// the same in every design; name and description are left out.
func differingKeys(ds []compared) []keyDiff {
	lists := make([]map[string]string, len(ds))
	var order []string
	for i, d := range ds {
		lists[i] = map[string]string{}
		for _, line := range strings.Split(d.design.String(), "\n") {
			k, v, ok := strings.Cut(line, " = ")
			if !ok || k == "name" || k == "description" {
				continue
			}
			if i == 0 {
				order = append(order, k)
			}
			lists[i][k] = strings.Trim(v, `"`)
		}
	}
	var out []keyDiff
	for _, k := range order {
		kd := keyDiff{Key: k}
		same := true
		for i := range ds {
			kd.Values = append(kd.Values, lists[i][k])
			same = same && lists[i][k] == lists[0][k]
		}
		if !same {
			out = append(out, kd)
		}
	}
	return out
}

// metricRows reads every numeric figure of merit of each design (through the JSON names of
// the summary) and its ratio to the first design's.
func metricRows(ds []compared) ([]metricRow, error) {
	vals := make([]map[string]any, len(ds))
	for i, d := range ds {
		b, err := json.Marshal(d.Summary)
		if err != nil {
			return nil, fmt.Errorf("compare: %w", err)
		}
		if err := json.Unmarshal(b, &vals[i]); err != nil {
			return nil, fmt.Errorf("compare: %w", err)
		}
	}
	var rows []metricRow
	for _, m := range study.NumericMetrics() {
		row := metricRow{Metric: m}
		for i := range ds {
			v, _ := vals[i][m].(float64)
			row.Values = append(row.Values, v)
		}
		for _, v := range row.Values {
			if r := v / row.Values[0]; row.Values[0] != 0 && !math.IsNaN(r) && !math.IsInf(r, 0) {
				row.Ratios = append(row.Ratios, &r)
			} else {
				row.Ratios = append(row.Ratios, nil)
			}
		}
		if ds[0].band != nil {
			for _, d := range ds {
				if b, ok := d.band.Metric(m); ok {
					row.Bands = append(row.Bands, &b.Band)
				} else {
					row.Bands = append(row.Bands, nil)
				}
				if b, ok := study.RatioBand(ds[0].band, d.band, m); ok {
					row.RatioBands = append(row.RatioBands, &b)
				} else {
					row.RatioBands = append(row.RatioBands, nil)
				}
			}
		}
		rows = append(rows, row)
	}
	return rows, nil
}

// keyLabel is the label of a design key in its display unit.
func keyLabel(key string) plots.Label {
	u, _ := design.KeyUnit(key)
	if u == "" {
		return plots.LabelOf(key)
	}
	return plots.LabelOf(key + " [" + u + "]")
}

// displayValue writes a design value from the key listing in the key's display unit.
func displayValue(key, v string) string {
	x, err := strconv.ParseFloat(v, 64)
	if err != nil {
		return v
	}
	return keyLabel(key).Format(x)
}

// printComparison writes the differing keys, then every figure of merit with its ratio to the
// first design, then each design's verdict.
func printComparison(w io.Writer, c *comparison) {
	for i, d := range c.Designs {
		fmt.Fprintf(w, "%s: %s (%s)\n", letter(i), d.Name, d.File)
	}
	fmt.Fprintln(w)
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "\t"+strings.Join(designColumns(len(c.Designs)), "\t")+"\t")
	pad := strings.Repeat("\t", 2*len(c.Designs)-1)
	if len(c.Differ) == 0 {
		fmt.Fprintln(tw, "keys that differ: none\t"+pad)
	} else {
		fmt.Fprintln(tw, "keys that differ\t"+pad)
	}
	for _, k := range c.Differ {
		line := "  " + keyLabel(k.Key).Text + "\t"
		for _, v := range k.Values {
			line += displayValue(k.Key, v) + "\t"
		}
		fmt.Fprintln(tw, line+strings.Repeat("\t", len(c.Designs)-1))
	}
	fmt.Fprintln(tw, "figures of merit\t"+pad)
	for _, m := range c.Metrics {
		l := plots.LabelOf(m.Metric)
		line := "  " + l.Text + "\t"
		for _, v := range m.Values {
			line += l.Format(v) + "\t"
		}
		for _, r := range m.Ratios[1:] {
			if r == nil {
				line += "—\t"
			} else {
				line += strconv.FormatFloat(*r, 'g', 3, 64) + "\t"
			}
		}
		fmt.Fprintln(tw, line)
	}
	tw.Flush()
	fmt.Fprintln(w)
	for i, d := range c.Designs {
		fmt.Fprintf(w, "%s: %s\n", letter(i), d.Summary.Verdict)
		if d.Summary.Advice != "" {
			fmt.Fprintf(w, "   what to change: %s\n", d.Summary.Advice)
		}
	}
}

// designColumns are the column heads of a comparison's tables: A, B, … then B / A, C / A, ….
func designColumns(n int) []string {
	var head []string
	for i := range n {
		head = append(head, letter(i))
	}
	for i := 1; i < n; i++ {
		head = append(head, letter(i)+" / A")
	}
	return head
}

// letter names the i-th design of a comparison: A, B, … Z, then 27, 28, ….
func letter(i int) string {
	if i < 26 {
		return string(rune('A' + i))
	}
	return strconv.Itoa(i + 1)
}

// writeCompareFiles writes compare.csv (SI values, one column per design, then the ratios)
// and the pulse figure into dir; it returns the files written.
func writeCompareFiles(dir string, c *comparison) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("compare: %w", err)
	}
	var b bytes.Buffer
	cw := csv.NewWriter(&b)
	head := []string{"key"}
	for _, d := range c.Designs {
		head = append(head, d.Name)
	}
	for _, d := range c.Designs[1:] {
		head = append(head, "ratio "+d.Name+"/"+c.Designs[0].Name)
	}
	if c.Samples > 0 {
		for _, d := range c.Designs {
			for _, s := range study.BandSuffixes {
				head = append(head, d.Name+s)
			}
		}
		for _, d := range c.Designs[1:] {
			for _, s := range study.BandSuffixes {
				head = append(head, "ratio "+d.Name+"/"+c.Designs[0].Name+s)
			}
		}
	}
	bandWidth := len(head) - 2*len(c.Designs)
	cw.Write(head)
	for _, k := range c.Differ {
		row := append([]string{k.Key}, k.Values...)
		cw.Write(append(row, make([]string, len(c.Designs)-1+bandWidth)...))
	}
	for _, m := range c.Metrics {
		row := []string{m.Metric}
		for _, v := range m.Values {
			row = append(row, strconv.FormatFloat(v, 'g', -1, 64))
		}
		for _, r := range m.Ratios[1:] {
			if r == nil {
				row = append(row, "")
			} else {
				row = append(row, strconv.FormatFloat(*r, 'g', 6, 64))
			}
		}
		for _, b := range append(append([]*study.Band(nil), m.Bands...), ratioTail(m.RatioBands)...) {
			if b == nil {
				row = append(row, "", "", "")
				continue
			}
			for _, v := range []float64{b.P05, b.P50, b.P95} {
				row = append(row, strconv.FormatFloat(v, 'g', -1, 64))
			}
		}
		cw.Write(row)
	}
	if c.Samples > 0 {
		for _, line := range compareBandRows(c) {
			cw.Write(append(line, make([]string, len(c.Designs)-1+bandWidth)...))
		}
	}
	cw.Flush()
	files := []string{filepath.Join(dir, "compare.csv")}
	if err := atomicfile.WriteFile(files[0], b.Bytes()); err != nil {
		return nil, fmt.Errorf("compare: %w", err)
	}
	var pulses []plots.ComparePulse
	var names []string
	for _, d := range c.Designs {
		pulses = append(pulses, plots.ComparePulse{Name: d.Name, Time: d.result.Time, Power: d.result.PowerFront})
		names = append(names, d.Name)
	}
	for _, ext := range []string{".png", ".svg"} {
		f := filepath.Join(dir, "compare"+ext)
		if err := plots.CompareFigure(f, "output pulses: "+strings.Join(names, ", "), pulses); err != nil {
			return files, err
		}
		files = append(files, f)
	}
	if err := writeCompareReport(dir, c); err != nil {
		return files, err
	}
	return append(files, filepath.Join(dir, report.FileName)), nil
}
