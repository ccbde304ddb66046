package main

import (
	"encoding/json"
	"fmt"
	"io"
	"text/tabwriter"

	"n2pulse/kinetics/spectro"
	"n2pulse/plots"
	"n2pulse/units"
)

func init() {
	register(command{
		name:    "lines",
		summary: "spectroscopy of the N₂ C→B system: band heads, Franck–Condon factors, A values and the 337 nm laser lines",
		run:     runLines,
	})
}

type bandJSON struct {
	VUpper       int     `json:"v_upper"`
	VLower       int     `json:"v_lower"`
	OriginAirNm  float64 `json:"origin_air_nm"`
	OriginVacNm  float64 `json:"origin_vacuum_nm"`
	HeadAirNm    float64 `json:"head_air_nm"`
	HeadVacNm    float64 `json:"head_vacuum_nm"`
	FCF          float64 `json:"fcf"`
	RCentroidA   float64 `json:"r_centroid_angstrom"`
	EinsteinAPer float64 `json:"einstein_A_s"`
}

type lineJSON struct {
	Branch         string  `json:"branch"`
	JUpper         int     `json:"j_upper"`
	JLower         int     `json:"j_lower"`
	AirNm          float64 `json:"air_nm"`
	VacuumNm       float64 `json:"vacuum_nm"`
	SigmaLine      float64 `json:"sigma_line_m2"`
	SigmaEffective float64 `json:"sigma_effective_m2"`
	UpperShare     float64 `json:"upper_share"`
	DegeneracyEff  float64 `json:"degeneracy_ratio_effective"`
}

type linesJSON struct {
	PressurePa    float64                 `json:"pressure_Pa"`
	TemperatureK  float64                 `json:"temperature_K"`
	Bands         []bandJSON              `json:"bands"`
	LifetimeC0    float64                 `json:"lifetime_C0_s"`
	StrongestLine []lineJSON              `json:"laser_lines"`
	Laser         spectro.LaserParameters `json:"laser"`
	GainPeak      spectro.GainPeak        `json:"gain_peak"`
}

func runLines(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("lines", "[--pressure P] [--temperature T] [--plot FILE.png|.svg] [--json]", stderr)
	pText := fs.String("pressure", "760 Torr", "gas pressure, with a unit (\"40 Torr\", \"1 atm\", \"13 kPa\")")
	tText := fs.String("temperature", "300 K", "gas temperature, with a unit")
	plotFile := fs.String("plot", "", "draw the (0,0) band as sticks and broadened at P and T into FILE (.png or .svg)")
	asJSON := fs.Bool("json", false, "print the tables as JSON")
	nLines := fs.Int("lines", 10, "number of strongest laser lines to list (1–100)")
	if help, err := parseFlags(fs, args); help || err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usagef("lines: takes no arguments, got %q", fs.Args())
	}
	p, err := units.Parse(*pText, units.Pressure)
	if err != nil {
		return usagef("lines: --pressure: %v", err)
	}
	T, err := units.Parse(*tText, units.Temperature)
	if err != nil {
		return usagef("lines: --temperature: %v", err)
	}
	if *nLines < 1 || *nLines > 100 {
		return usagef("lines: --lines %d: want 1…100", *nLines)
	}
	lp, err := spectro.Laser(p, T)
	if err != nil {
		return usagef("lines: %v", err)
	}
	m, err := spectro.DefaultModel()
	if err != nil {
		return err
	}
	bands, err := m.Bands(4)
	if err != nil {
		return err
	}
	tau, err := m.Lifetime(0)
	if err != nil {
		return err
	}
	gl, err := m.GainLines(0, 0, p, T)
	if err != nil {
		return err
	}
	gl = gl[:min(*nLines, len(gl))]
	peak, err := m.GainPeak(0, 0, p, T)
	if err != nil {
		return err
	}
	out := linesJSON{PressurePa: p, TemperatureK: T, LifetimeC0: tau, Laser: lp, GainPeak: peak}
	for _, b := range bands {
		out.Bands = append(out.Bands, bandJSON{VUpper: b.VUpper, VLower: b.VLower,
			OriginAirNm: b.OriginAir * 1e9, OriginVacNm: b.OriginVacuum * 1e9,
			HeadAirNm: b.Head.AirWavelength * 1e9, HeadVacNm: b.Head.VacuumWavelength * 1e9,
			FCF: b.FranckCondon, RCentroidA: b.RCentroid, EinsteinAPer: b.EinsteinA})
	}
	for _, g := range gl {
		out.StrongestLine = append(out.StrongestLine, lineJSON{Branch: g.Branch.String(),
			JUpper: g.JUpper, JLower: g.JLower, AirNm: g.AirWavelength * 1e9, VacuumNm: g.VacuumWavelength * 1e9,
			SigmaLine: g.PeakSigma, SigmaEffective: g.Effective, UpperShare: g.UpperShare,
			DegeneracyEff: g.EffectiveRatio})
	}
	if *plotFile != "" {
		head := bands[0].Head.AirWavelength
		sp, err := m.EmissionSpectrum(0, 0, p, T, head-1.2e-9, head+0.1e-9, 4000)
		if err != nil {
			return err
		}
		d := plots.SpectrumData{
			Title: fmt.Sprintf("nitrogen C→B (0,0) band at %s, %s",
				plots.LabelOf("gas.pressure [Pa]").Typed(units.UnitOf(*pText)).Format(p), plots.LabelOf("gas.temperature [K]").Format(T)),
			XLabel: "wavelength in air [nm]", YLabel: "relative emission",
			StickY: sp.StickIntensity, ProfileY: sp.ProfileIntensity,
		}
		for _, x := range sp.StickWavelength {
			d.StickX = append(d.StickX, x*1e9)
		}
		for _, x := range sp.ProfileWavelength {
			d.ProfileX = append(d.ProfileX, x*1e9)
		}
		if err := plots.Spectrum(*plotFile, d); err != nil {
			return err
		}
	}
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		return enc.Encode(out)
	}
	printLines(stdout, out)
	return nil
}

func printLines(w io.Writer, o linesJSON) {
	fmt.Fprintf(w, "N₂ C³Πu → B³Πg bands (v′, v″ ≤ 4); wavelengths in nm, standard air (Ciddor 1996) and vacuum\n\n")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "v′\tv″\torigin air\thead air\thead vac\tq\tr̄ [Å]\tA [1/s]\t")
	for _, b := range o.Bands {
		fmt.Fprintf(tw, "%d\t%d\t%.3f\t%.3f\t%.3f\t%.4f\t%.4f\t%.3e\t\n", b.VUpper, b.VLower,
			b.OriginAirNm, b.HeadAirNm, b.HeadVacNm, b.FCF, b.RCentroidA, b.EinsteinAPer)
	}
	tw.Flush()
	fmt.Fprintf(w, "\nradiative lifetime of C(v=0): %.2f ns\n", o.LifetimeC0*1e9)
	fmt.Fprintf(w, "\nstrongest (0,0) laser lines at %s, %s (σ_eff = σ_line × upper-level share)\n\n",
		units.Format(o.PressurePa, "Pa"), units.Format(o.TemperatureK, "K"))
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintln(tw, "line\tJ′\tair [nm]\tvac [nm]\tσ_line [m²]\tshare\tσ_eff [m²]\t(g_C/g_B)_eff\t")
	for _, l := range o.StrongestLine {
		fmt.Fprintf(tw, "%s(%d)\t%d\t%.4f\t%.4f\t%.3e\t%.4f\t%.3e\t%.3f\t\n", l.Branch, l.JLower, l.JUpper,
			l.AirNm, l.VacuumNm, l.SigmaLine, l.UpperShare, l.SigmaEffective, l.DegeneracyEff)
	}
	tw.Flush()
	lp := o.Laser
	fmt.Fprintf(w, "\nlaser model inputs: λ_air %.4f nm, hν %.4f eV, σ %.3e m², g_C/g_B %.3f, A00 %.3e 1/s, τ_C %.2f ns, f_C %.3f, f_B %.3f, width %s\n",
		lp.AirWavelength*1e9, lp.PhotonEnergy/units.ElectronVolt, lp.CrossSection, lp.DegeneracyRatio,
		lp.EinsteinA00, lp.UpperLifetime*1e9, lp.UpperShare, lp.LowerShare, units.Format(lp.LineWidth, "Hz"))
	g := o.GainPeak
	fmt.Fprintf(w, "gain-spectrum peak with overlapping lines summed: λ_air %.4f nm, σ %.3e m² (×%.2f the single line, %d lines ≥ 10 %%), g_C/g_B %.3f\n",
		g.AirWavelength*1e9, g.CrossSection, g.Enhancement, g.Lines, g.DegeneracyRatio)
}
