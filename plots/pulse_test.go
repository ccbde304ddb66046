package plots

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// demoPulse is invented demo data shaped like a shot: a voltage that collapses as the
// current rises, an avalanche in the electron density, a short output pulse.
func demoPulse() PulseData {
	const n = 600
	d := PulseData{Title: "demo shot", Time: make([]float64, n)}
	for _, p := range []*[]float64{&d.ChannelVoltage, &d.Current, &d.ReducedField, &d.ElectronDensity,
		&d.UpperLevel, &d.LowerLevel, &d.PowerFront, &d.PowerRear} {
		*p = make([]float64, n)
	}
	for i := range n {
		t := 30e-9 * float64(i) / (n - 1)
		d.Time[i] = t
		on := 1 / (1 + math.Exp(-(t-8e-9)/0.7e-9))
		d.ChannelVoltage[i] = 18e3 * (1 - on) * math.Cos(t/6e-9)
		d.Current[i] = 4.5e3 * on * math.Exp(-(t-8e-9)/15e-9) * (1 - on*0.2)
		d.ReducedField[i] = 1e-21 * 250 * (1 - on)
		d.ElectronDensity[i] = 1e12 * math.Exp(math.Min(t, 9e-9)/9e-9*math.Log(1e9))
		g := math.Exp(-math.Pow((t-9e-9)/1.5e-9, 2))
		d.UpperLevel[i] = 2e20 * g
		d.LowerLevel[i] = 3e20 * on * math.Exp(-(t-9e-9)/40e-9)
		d.PowerFront[i] = 250e3 * math.Exp(-math.Pow((t-9.5e-9)/0.6e-9, 2))
		d.PowerRear[i] = 0.4 * d.PowerFront[i]
	}
	d.ElectronDensity[0] = 0 // a zero on the log axis must be skipped
	d.FWHMStart, d.FWHMEnd = 9.5e-9-0.5e-9, 9.5e-9+0.5e-9
	return d
}

// checkFigure asserts that path exists, is non-empty and starts like its format.
func checkFigure(t *testing.T, path string) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	switch filepath.Ext(path) {
	case ".png":
		if !bytes.HasPrefix(b, []byte("\x89PNG\r\n\x1a\n")) {
			t.Errorf("%s: no PNG signature", path)
		}
	case ".svg":
		if !bytes.Contains(b[:min(len(b), 512)], []byte("<svg")) {
			t.Errorf("%s: no <svg element at the start", path)
		}
	}
	if len(b) < 2000 {
		t.Errorf("%s: only %d bytes", path, len(b))
	}
}

// onlyFiles asserts that dir holds exactly the named files (no temporary files left).
func onlyFiles(t *testing.T, dir string, want ...string) {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, e := range ents {
		got = append(got, e.Name())
	}
	sort.Strings(got)
	sort.Strings(want)
	if strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("folder holds %v, want %v", got, want)
	}
}

func TestPulseReportFiles(t *testing.T) {
	dir := t.TempDir()
	d := demoPulse()
	for _, name := range []string{"pulse.png", "pulse.svg"} {
		if err := PulseReport(filepath.Join(dir, name), d); err != nil {
			t.Fatal(err)
		}
		checkFigure(t, filepath.Join(dir, name))
	}
	// One end only, no FWHM, a NaN gap: still drawn.
	d.PowerRear = nil
	d.FWHMStart, d.FWHMEnd = 0, 0
	d.Current[100] = math.NaN()
	if err := PulseReport(filepath.Join(dir, "one-end.png"), d); err != nil {
		t.Fatal(err)
	}
	checkFigure(t, filepath.Join(dir, "one-end.png"))
	// Overwriting an existing figure works and leaves nothing behind.
	if err := PulseReport(filepath.Join(dir, "pulse.png"), d); err != nil {
		t.Fatal(err)
	}
	onlyFiles(t, dir, "pulse.png", "pulse.svg", "one-end.png")
}

func TestPulseReportErrors(t *testing.T) {
	dir := t.TempDir()
	good := demoPulse()
	short := demoPulse()
	short.Current = short.Current[:10]
	back := demoPulse()
	back.Time[5] = back.Time[4] - 1e-12
	fw := demoPulse()
	fw.FWHMStart, fw.FWHMEnd = 2e-9, 1e-9
	for _, c := range []struct {
		path string
		d    PulseData
		want string
	}{
		{filepath.Join(dir, "no-such-folder", "p.png"), good, "p.png"},
		{filepath.Join(dir, "p.pdf"), good, ".png or .svg"},
		{filepath.Join(dir, "p.png"), PulseData{Time: []float64{0}}, "Time"},
		{filepath.Join(dir, "p.png"), short, "Current"},
		{filepath.Join(dir, "p.png"), back, "Time[5]"},
		{filepath.Join(dir, "p.png"), fw, "FWHMStart"},
	} {
		err := PulseReport(c.path, c.d)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "plots: ") {
			t.Errorf("%s: error %v, want one mentioning %q", c.path, err, c.want)
		}
	}
	onlyFiles(t, dir)
}

func TestGainMapFiles(t *testing.T) {
	dir := t.TempDir()
	z, tt, g := demoGain(40, 120, true)
	for _, name := range []string{"gain.png", "gain.svg"} {
		if err := GainMap(filepath.Join(dir, name), z, tt, g); err != nil {
			t.Fatal(err)
		}
		checkFigure(t, filepath.Join(dir, name))
	}
	z, tt, g = demoGain(10, 30, false)
	g[3][4] = math.NaN()
	if err := GainMap(filepath.Join(dir, "positive.png"), z, tt, g); err != nil {
		t.Fatal(err)
	}
	checkFigure(t, filepath.Join(dir, "positive.png"))
	onlyFiles(t, dir, "gain.png", "gain.svg", "positive.png")
}

// demoGain is an invented gain travelling along the channel, optionally turning into
// absorption later [m⁻¹].
func demoGain(nz, nt int, absorb bool) (z, t []float64, g [][]float64) {
	z, t = make([]float64, nz), make([]float64, nt)
	for i := range z {
		z[i] = 0.3 * float64(i) / float64(nz-1)
	}
	for j := range t {
		t[j] = 20e-9 * float64(j) / float64(nt-1)
	}
	g = make([][]float64, nz)
	for i := range g {
		g[i] = make([]float64, nt)
		for j := range g[i] {
			s := t[j] - 8e-9 - z[i]/3e8
			g[i][j] = 20 * math.Exp(-math.Pow(s/1.5e-9, 2))
			if absorb && s > 2e-9 {
				g[i][j] -= 3 * math.Exp(-(s-2e-9)/4e-9)
			}
		}
	}
	return z, t, g
}

func TestGainMapErrors(t *testing.T) {
	dir := t.TempDir()
	z, tt, g := demoGain(5, 8, true)
	rag := append([][]float64(nil), g...)
	rag[2] = rag[2][:3]
	inf := [][]float64{{1, 2}, {3, math.Inf(1)}}
	for _, c := range []struct {
		path string
		z, t []float64
		g    [][]float64
		want string
	}{
		{filepath.Join(dir, "missing", "g.png"), z, tt, g, "g.png"},
		{filepath.Join(dir, "g.jpg"), z, tt, g, ".png or .svg"},
		{filepath.Join(dir, "g.png"), z[:1], tt, g[:1], "z has 1"},
		{filepath.Join(dir, "g.png"), []float64{0, 0.1, 0.1, 0.2, 0.3}, tt, g, "z[2]"},
		{filepath.Join(dir, "g.png"), z, tt, g[:4], "gain rows"},
		{filepath.Join(dir, "g.png"), z, tt, rag, "gain[2]"},
		{filepath.Join(dir, "g.png"), []float64{0, 1}, []float64{0, 1}, inf, "gain[1]"},
	} {
		err := GainMap(c.path, c.z, c.t, c.g)
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "plots: ") {
			t.Errorf("%s: error %v, want one mentioning %q", c.path, err, c.want)
		}
	}
	onlyFiles(t, dir)
}

// TestSIScale checks the display prefixes against the SI prefixes (BIPM, The International
// System of Units, 9th ed. 2019, Table 7) and the power-of-ten labels.
func TestSIScale(t *testing.T) {
	for _, c := range []struct {
		max    float64
		unit   string
		factor float64
		label  string
	}{
		{18e3, "V", 1e-3, "kV"},
		{4.5e3, "A", 1e-3, "kA"},
		{250e3, "W", 1e-3, "kW"},
		{2.5e6, "W", 1e-6, "MW"},
		{999, "W", 1, "W"},
		{0.02, "A", 1e3, "mA"},
		{3e-7, "J", 1e9, "nJ"},
		{0, "V", 1, "V"},
	} {
		f, l := siScale(c.max, c.unit)
		if math.Abs(f/c.factor-1) > 1e-12 || l != c.label {
			t.Errorf("siScale(%g, %q) = %g, %q; want %g, %q", c.max, c.unit, f, l, c.factor, c.label)
		}
	}
	for _, c := range []struct {
		max    float64
		factor float64
		label  string
	}{{2e14, 1e-12, "10^12/cm³"}, {5e15, 1e-15, "10^15/cm³"}, {300, 1, "1/cm³"}, {2e-4, 1e6, "10^-6/cm³"}} {
		f, l := powerScale(c.max, "/cm³")
		if math.Abs(f/c.factor-1) > 1e-12 || l != c.label {
			t.Errorf("powerScale(%g) = %g, %q; want %g, %q", c.max, f, l, c.factor, c.label)
		}
	}
}

// TestTickers checks the axis tick rules: labelled linear ticks at 1, 2 or 5 × 10ⁿ steps
// (common practice, no source), 3 to 11 of them, inside the range; decade ticks at powers of
// ten with at most eight labels.
func TestTickers(t *testing.T) {
	for _, r := range [][2]float64{{0, 30}, {2.4, 251}, {-0.2, 0.2}, {0, 1.7e-3}, {-18, 4.5}, {1e5, 1.00002e5}} {
		var labelled []float64
		for _, tk := range (niceTicks{}).Ticks(r[0], r[1]) {
			if tk.Value < r[0] || tk.Value > r[1] {
				t.Errorf("range %v: tick %v outside", r, tk.Value)
			}
			if tk.Label != "" {
				labelled = append(labelled, tk.Value)
			}
		}
		if len(labelled) < 3 || len(labelled) > 11 {
			t.Errorf("range %v: %d labelled ticks %v", r, len(labelled), labelled)
			continue
		}
		step := labelled[1] - labelled[0]
		m := step / math.Pow(10, math.Floor(math.Log10(step)+1e-9))
		if math.Abs(m-1) > 1e-6 && math.Abs(m-2) > 1e-6 && math.Abs(m-5) > 1e-6 {
			t.Errorf("range %v: step %v is not 1, 2 or 5 × 10ⁿ", r, step)
		}
	}
	var n int
	for _, tk := range (decadeTicks{}).Ticks(3e6, 2e21) {
		if tk.Label != "" {
			n++
			if e := math.Log10(tk.Value); math.Abs(e-math.Round(e)) > 1e-9 || tk.Label != powerOfTen(int(math.Round(e))) {
				t.Errorf("decade tick %v labelled %q", tk.Value, tk.Label)
			}
		}
	}
	if n < 4 || n > 8 {
		t.Errorf("%d labelled decades over 3e6–2e21, want 4 to 8", n)
	}
}

// TestHalfMaxCrossings checks the crossings of a sampled Gaussian against the analytic
// t₀ ± sqrt(2 ln 2)·σ; linear interpolation on a 10 ps grid is within 0.5 ps.
func TestHalfMaxCrossings(t *testing.T) {
	t.Parallel()
	const n = 2001
	tt, p := make([]float64, n), make([]float64, n)
	sigma, t0 := 0.5e-9, 8e-9
	for i := range tt {
		tt[i] = 20e-9 * float64(i) / (n - 1)
		p[i] = 1e5 * math.Exp(-0.5*math.Pow((tt[i]-t0)/sigma, 2))
	}
	a, b := HalfMaxCrossings(tt, p)
	h := math.Sqrt(2*math.Ln2) * sigma
	if !scalar.EqualWithinAbsOrRel(a, t0-h, 0.5e-12, 0) || !scalar.EqualWithinAbsOrRel(b, t0+h, 0.5e-12, 0) {
		t.Errorf("crossings %g, %g s; want %g, %g s", a, b, t0-h, t0+h)
	}
	if a, b := HalfMaxCrossings(tt, make([]float64, n)); a != 0 || b != 0 {
		t.Errorf("no pulse: %g, %g; want 0, 0", a, b)
	}
}
