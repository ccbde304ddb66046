package plots

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"n2pulse/units"
)

// Label is how a key of a results table (a figure of merit such as "energy_total_J" or a design
// key such as "gas.pressure") reads on a figure or a printed table: words, the unit of the
// stored value and the unit it is shown in. LabelOf gives it; every figure and printed table
// takes its axis titles and numbers from here, so one key reads the same everywhere.
type Label struct {
	Key  string // the key as stored ("energy_total_J", "gas.pressure")
	Text string // words: "pulse energy, both ends", "pressure"
	SI   string // unit of the stored value: "J", "Pa", "Td"; "" for a pure number
	// Unit is the display unit when fixed ("Torr", "kV", "%", "1/cm"), with Scale the factor
	// from the stored value (display = stored × Scale). When Unit is empty the display unit is
	// SI with a prefix picked from the values (µJ, kW, ns), or none for a pure number.
	Unit  string
	Scale float64
	// Minimise is true when the best value is the smallest (a short pulse, a small residual).
	Minimise bool
	// Pulse is true for properties of the output pulse, which mean nothing where the laser
	// does not lase: figures mask those points and never choose them as an optimum.
	Pulse bool
	// Density is true for number densities, shown per cm³ with a power of ten.
	Density bool
}

// metricLabels are the figures of merit of a shot (the JSON names of kinetics.Summary).
var metricLabels = map[string]Label{
	"energy_front_J":               {Text: "pulse energy, output end", SI: "J", Pulse: true},
	"energy_rear_J":                {Text: "pulse energy, rear end", SI: "J", Pulse: true},
	"energy_total_J":               {Text: "pulse energy, both ends", SI: "J", Pulse: true},
	"peak_power_W":                 {Text: "peak power, output end", SI: "W", Pulse: true},
	"fwhm_s":                       {Text: "pulse width (FWHM)", SI: "s", Minimise: true, Pulse: true},
	"half_max_width_s":             {Text: "first to last half maximum, no detector", SI: "s", Minimise: true, Pulse: true},
	"detector_response_s":          {Text: "detector response time", SI: "s"},
	"rms_fwhm_s":                   {Text: "pulse width from the rms duration", SI: "s", Minimise: true, Pulse: true},
	"pulses":                       {Text: "separate pulses", Pulse: true},
	"pulse_separation_s":           {Text: "time between the first two pulses", SI: "s", Pulse: true},
	"strongest_pulse_fwhm_s":       {Text: "FWHM of the strongest pulse alone", SI: "s", Minimise: true, Pulse: true},
	"half_max_energy_share":        {Text: "energy share inside the FWHM", Unit: "%", Scale: 100, Pulse: true},
	"fwhm_45_s":                    {Text: "width at 45 % of the peak", SI: "s", Minimise: true, Pulse: true},
	"fwhm_55_s":                    {Text: "width at 55 % of the peak", SI: "s", Minimise: true, Pulse: true},
	"fwhm_jump_s":                  {Text: "largest leap of a FWHM edge, 45–55 % level", SI: "s", Pulse: true},
	"pulse_centre_s":               {Text: "pulse centre after switch closure", SI: "s", Minimise: true, Pulse: true},
	"rise_s":                       {Text: "rise time 10–90 %", SI: "s", Minimise: true, Pulse: true},
	"delay_s":                      {Text: "delay from switch closure", SI: "s", Minimise: true, Pulse: true},
	"end_time_s":                   {Text: "end of the run", SI: "s"},
	"upper_pumped_photon_energy_J": {Text: "C(0) excitation × hν/E_C", SI: "J"},
	"peak_current_density_A_m2":    {Text: "peak current density", SI: "A/m²", Unit: "A/cm²", Scale: 1e-4},
	"specific_energy_J_m3":         {Text: "energy into the plasma per volume", SI: "J/m³", Unit: "J/cm³", Scale: 1e-6},
	"energy_per_molecule_eV":       {Text: "energy per gas molecule", SI: "eV", Unit: "eV", Scale: 1},
	"efficiency":                   {Text: "efficiency (pulse / stored energy)", Unit: "%", Scale: 100, Pulse: true},
	"stored_energy_J":              {Text: "stored energy", SI: "J"},
	"deposited_energy_J":           {Text: "energy into the plasma", SI: "J"},
	"peak_gain_per_m":              {Text: "peak gain", SI: "m⁻¹", Unit: "1/cm", Scale: 0.01},
	"gain_length":                  {Text: "gain × length"},
	"inversion_duration_s":         {Text: "inversion duration", SI: "s"},
	"termination_time_s":           {Text: "self-termination time", SI: "s"},
	"peak_reduced_field_Td":        {Text: "peak E/N", SI: "Td", Unit: "Td", Scale: 1},
	"peak_current_A":               {Text: "peak current", SI: "A"},
	"peak_electron_density_m3":     {Text: "peak electron density", SI: "m⁻³", Density: true},
	"energy_balance_residual":      {Text: "energy balance residual", Minimise: true},
	"photon_balance_residual":      {Text: "photon balance residual", Minimise: true},
	"stimulated_to_spontaneous":    {Text: "stimulated per spontaneous photon", Pulse: true},
}

// keyWords are design keys whose words are not their last part with spaces.
var keyWords = map[string]string{
	"gas.pressure":    "pressure",
	"gas.temperature": "gas temperature",
	"gas.nitrogen":    "nitrogen fraction",
	"gas.oxygen":      "oxygen fraction",
	"gas.helium":      "helium fraction",
}

// usualUnits is the trade's display unit for a design value stored in an SI unit, used when the
// user typed none: pressures in Torr, number densities per cm³, rate constants in cm³/s.
var usualUnits = map[string]struct {
	unit  string
	scale float64
}{
	"Pa":   {"Torr", 1 / units.Torr},
	"m³/s": {"cm³/s", 1e6},
	"m⁻¹":  {"1/cm", 0.01},
	"K":    {"K", 1},
}

// LabelOf returns the label of a results-table key: a figure of merit of a shot, a design key
// ("circuit.charge_voltage"), or a column heading with its unit ("gas.pressure [Pa]"). A key it
// does not know reads as its words with the unit its name ends in.
func LabelOf(key string) Label {
	key, siUnit, _ := strings.Cut(key, " [")
	siUnit = strings.TrimSuffix(siUnit, "]")
	if l, ok := metricLabels[key]; ok {
		l.Key = key
		return l
	}
	if section, name, ok := strings.Cut(key, "."); ok {
		l := Label{Key: key, SI: siUnit, Text: keyWords[key]}
		if l.Text == "" {
			l.Text = strings.ReplaceAll(name, "_", " ")
			if (section == "channel" || section == "switch") && !strings.HasPrefix(name, section) {
				l.Text = section + " " + l.Text
			}
		}
		if u, ok := usualUnits[l.SI]; ok {
			l.Unit, l.Scale = u.unit, u.scale
		}
		l.Density = l.SI == "m⁻³"
		return l
	}
	// An unknown metric: words from its name, unit from its ending.
	l := Label{Key: key}
	name := key
	for _, u := range []struct{ suffix, unit string }{
		{"_J", "J"}, {"_W", "W"}, {"_s", "s"}, {"_per_m", "m⁻¹"}, {"_Td", "Td"}, {"_A", "A"}, {"_m3", "m⁻³"}, {"_V", "V"},
	} {
		if strings.HasSuffix(key, u.suffix) {
			name, l.SI = strings.TrimSuffix(key, u.suffix), u.unit
			break
		}
	}
	l.Text = strings.ReplaceAll(name, "_", " ")
	switch l.SI {
	case "m⁻¹":
		l.Unit, l.Scale = "1/cm", 0.01
	case "Td":
		l.Unit, l.Scale = "Td", 1
	case "m⁻³":
		l.Density = true
	}
	return l
}

// Typed returns the label shown in unit, the unit the user typed for the key ("Torr", "kV",
// "mm"); an empty unit, or one that does not convert to the stored unit, leaves l unchanged.
func (l Label) Typed(unit string) Label {
	unit = strings.TrimSpace(unit)
	if unit == "" || l.SI == "" {
		return l
	}
	f, dim, err := units.ParseUnit(unit)
	if err != nil || f <= 0 {
		return l
	}
	_, want, err := units.ParseUnit(strings.ReplaceAll(l.SI, "m⁻³", "m^-3"))
	if err != nil || dim != want {
		return l
	}
	l.Unit, l.Scale = unit, 1/f
	return l
}

// Display returns the factor from stored to shown values and the unit shown, for values up to
// maxAbs in size: the fixed unit when there is one, else the SI unit with the prefix that puts
// maxAbs in [1, 1000), else a power of ten for densities ("10^14/cm³").
func (l Label) Display(maxAbs float64) (scale float64, unit string) {
	switch {
	case l.Unit != "":
		return l.Scale, l.Unit
	case l.Density:
		f, u := powerScale(1e-6*maxAbs, perCm3)
		return 1e-6 * f, u
	case prefixable(l.SI):
		return siScale(maxAbs, l.SI)
	}
	return 1, l.SI
}

// prefixable reports whether unit takes SI prefixes on a figure.
func prefixable(unit string) bool {
	switch unit {
	case "J", "W", "s", "V", "A", "F", "H", "m", "Ω":
		return true
	}
	return false
}

// AxisTitle is the label of an axis showing values up to maxAbs: "charge voltage [kV]", or the
// words alone for a pure number.
func (l Label) AxisTitle(maxAbs float64) string {
	_, u := l.Display(maxAbs)
	if u == "" {
		return l.Text
	}
	return l.Text + " [" + u + "]"
}

// Format writes one value in the label's display unit with three significant digits
// ("957 µJ", "760 Torr", "0.069 %").
func (l Label) Format(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "—"
	}
	if l.Density && l.Unit == "" {
		return sciText(v*1e-6) + " " + perCm3
	}
	f, u := l.Display(math.Abs(v))
	s := numberText(v * f)
	switch u {
	case "":
		return s
	case "%":
		return s + " %"
	}
	return s + " " + u
}

// Optimum is the word for the best value: "maximum", or "minimum" for a metric best small.
func (l Label) Optimum() string {
	if l.Minimise {
		return "minimum"
	}
	return "maximum"
}

// sciText writes v as "3.2×10^14": the figure font has no superscript zero, nine or minus.
func sciText(v float64) string {
	if v == 0 {
		return "0"
	}
	e := int(math.Floor(math.Log10(math.Abs(v))))
	m := v / math.Pow(10, float64(e))
	if math.Abs(m-1) < 5e-4 {
		return fmt.Sprintf("10^%d", e)
	}
	return fmt.Sprintf("%s×10^%d", strconv.FormatFloat(m, 'g', 3, 64), e)
}
