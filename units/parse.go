package units

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// Dimension is the exponent of each SI base unit (metre, kilogram, second, ampere, kelvin).
type Dimension [5]int8

// Dimensions of the quantities a design names.
var (
	Dimensionless = Dimension{}
	Length        = Dimension{1, 0, 0, 0, 0}
	Area          = Dimension{2, 0, 0, 0, 0}
	Time          = Dimension{0, 0, 1, 0, 0}
	Frequency     = Dimension{0, 0, -1, 0, 0}
	Speed         = Dimension{1, 0, -1, 0, 0}
	Temperature   = Dimension{0, 0, 0, 0, 1}
	Pressure      = Dimension{-1, 1, -2, 0, 0}
	Energy        = Dimension{2, 1, -2, 0, 0}
	Power         = Dimension{2, 1, -3, 0, 0}
	Voltage       = Dimension{2, 1, -3, -1, 0}
	Current       = Dimension{0, 0, 0, 1, 0}
	Resistance    = Dimension{2, 1, -3, -2, 0}
	Capacitance   = Dimension{-2, -1, 4, 2, 0}
	Inductance    = Dimension{2, 1, -2, -2, 0}
	Density       = Dimension{-3, 0, 0, 0, 0}  // number density [m⁻³]
	RateConstant  = Dimension{3, 0, -1, 0, 0}  // two-body rate coefficient [m³/s]
	Attenuation   = Dimension{-1, 0, 0, 0, 0}  // per length [m⁻¹]
	ReducedField  = Dimension{4, 1, -3, -1, 0} // E/N [V m²]
	ElectricField = Dimension{1, 1, -3, -1, 0} // [V/m]
	SparkConstant = Dimension{-3, -1, 3, 2, 0} // Rompe–Weizel a [Pa m² V⁻² s⁻¹]
)

var dimensionNames = map[Dimension]string{
	Dimensionless: "dimensionless", Length: "m", Area: "m²", Time: "s", Frequency: "Hz",
	Speed: "m/s", Temperature: "K", Pressure: "Pa", Energy: "J", Power: "W", Voltage: "V",
	Current: "A", Resistance: "Ω", Capacitance: "F", Inductance: "H", Density: "m⁻³",
	RateConstant: "m³/s", Attenuation: "m⁻¹", ReducedField: "V m²", ElectricField: "V/m",
	SparkConstant: "Pa m² V⁻² s⁻¹",
}

// String names the SI unit of the dimension ("V", "m³/s"), or lists the exponents.
func (d Dimension) String() string {
	if s, ok := dimensionNames[d]; ok {
		return s
	}
	return fmt.Sprintf("m^%d kg^%d s^%d A^%d K^%d", d[0], d[1], d[2], d[3], d[4])
}

func (d Dimension) add(o Dimension, k int8) Dimension {
	for i := range d {
		d[i] += k * o[i]
	}
	return d
}

type baseUnit struct {
	factor float64
	dim    Dimension
	prefix bool // whether SI prefixes may be applied
}

var baseUnits = map[string]baseUnit{
	"m":    {1, Length, true},
	"g":    {1e-3, Dimension{0, 1, 0, 0, 0}, true},
	"s":    {1, Time, true},
	"A":    {1, Current, true},
	"K":    {1, Temperature, false},
	"V":    {1, Voltage, true},
	"F":    {1, Capacitance, true},
	"H":    {1, Inductance, true},
	"Ω":    {1, Resistance, true},
	"ohm":  {1, Resistance, true},
	"Pa":   {1, Pressure, true},
	"J":    {1, Energy, true},
	"W":    {1, Power, true},
	"Hz":   {1, Frequency, true},
	"C":    {1, Dimension{0, 0, 1, 1, 0}, true},
	"eV":   {ElectronVolt, Energy, true},
	"Td":   {Townsend, ReducedField, false},
	"Torr": {Torr, Pressure, true},
	"torr": {Torr, Pressure, true},
	"atm":  {Atmosphere, Pressure, false},
	"bar":  {1e5, Pressure, true},
	"%":    {0.01, Dimensionless, false},
}

var prefixes = map[string]float64{
	"f": 1e-15, "p": 1e-12, "n": 1e-9, "u": 1e-6, "µ": 1e-6, "μ": 1e-6, "m": 1e-3,
	"c": 1e-2, "d": 1e-1, "k": 1e3, "M": 1e6, "G": 1e9, "T": 1e12,
}

var superscripts = strings.NewReplacer("⁻", "-", "¹", "1", "²", "2", "³", "3", "⁴", "4", "⁵", "5")

// Parse reads a number with an optional unit ("12 kV", "3.3nF", "1e-9 cm3/s", "40 Torr") and
// returns it in SI. want is the dimension the caller expects; a number without a unit is taken
// as SI already. The unit may be a product of symbols with integer powers, separated by spaces,
// '*', '·' or '/': "cm^-3", "cm³/s", "atm cm2 V-2 s-1".
func Parse(text string, want Dimension) (float64, error) {
	s := strings.TrimSpace(text)
	if s == "" {
		return 0, fmt.Errorf("units: empty value, want a number in %v", want)
	}
	i := numberEnd(s)
	if i == 0 {
		return 0, fmt.Errorf("units: %q does not start with a number", text)
	}
	v, err := strconv.ParseFloat(s[:i], 64)
	if err != nil {
		return 0, fmt.Errorf("units: %q: bad number: %w", text, err)
	}
	unit := strings.TrimSpace(s[i:])
	if unit == "" {
		return v, nil
	}
	factor, dim, err := ParseUnit(unit)
	if err != nil {
		return 0, fmt.Errorf("units: %q: %w", text, err)
	}
	if dim != want {
		return 0, fmt.Errorf("units: %q is in %v, want %v", text, dim, want)
	}
	return v * factor, nil
}

// numberEnd returns the length of the leading floating-point literal of s.
func numberEnd(s string) int {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && (s[i] >= '0' && s[i] <= '9' || s[i] == '.') {
		i++
		digits++
	}
	if digits == 0 {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		k := j
		for k < len(s) && s[k] >= '0' && s[k] <= '9' {
			k++
		}
		if k > j {
			i = k
		}
	}
	return i
}

// ParseUnit returns the SI factor and dimension of a unit expression such as "kV/cm" or "cm^-3".
func ParseUnit(unit string) (float64, Dimension, error) {
	unit = superscripts.Replace(unit)
	factor, dim := 1.0, Dimension{}
	sign := int8(1)
	tok := strings.Builder{}
	flush := func() error {
		t := tok.String()
		tok.Reset()
		if t == "" {
			return nil
		}
		f, d, err := parseFactor(t)
		if err != nil {
			return err
		}
		factor *= math.Pow(f, float64(sign))
		dim = dim.add(d, sign)
		return nil
	}
	for _, r := range unit {
		switch {
		case r == '/':
			if err := flush(); err != nil {
				return 0, dim, err
			}
			sign = -1
		case r == '*' || r == '·' || unicode.IsSpace(r):
			if err := flush(); err != nil {
				return 0, dim, err
			}
		default:
			tok.WriteRune(r)
		}
	}
	if err := flush(); err != nil {
		return 0, dim, err
	}
	return factor, dim, nil
}

// parseFactor reads one symbol with optional prefix and power: "cm^-3", "cm3", "kV", "s-1".
func parseFactor(t string) (float64, Dimension, error) {
	sym, pow := t, 1
	if j := strings.IndexAny(t, "^-0123456789"); j > 0 {
		sym = t[:j]
		p, err := strconv.Atoi(strings.TrimPrefix(t[j:], "^"))
		if err != nil {
			return 0, Dimension{}, fmt.Errorf("bad power in unit %q", t)
		}
		pow = p
	}
	b, ok := baseUnits[sym]
	scale := 1.0
	if !ok {
		for p, f := range prefixes {
			if rest, found := strings.CutPrefix(sym, p); found && rest != "" {
				if bb, ok2 := baseUnits[rest]; ok2 && bb.prefix {
					b, scale, ok = bb, f, true
					break
				}
			}
		}
	}
	if !ok {
		return 0, Dimension{}, fmt.Errorf("unknown unit %q", sym)
	}
	f := math.Pow(b.factor*scale, float64(pow))
	return f, Dimension{}.add(b.dim, int8(pow)), nil
}

// Format writes v (in the SI unit unit) with an SI prefix and three significant figures:
// Format(1.234e-6, "J") is "1.23 µJ".
func Format(v float64, unit string) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprintf("%.3g %s", v, unit)
	}
	exp := int(math.Floor(math.Log10(math.Abs(v))/3)) * 3
	exp = max(-15, min(12, exp))
	names := map[int]string{-15: "f", -12: "p", -9: "n", -6: "µ", -3: "m", 0: "", 3: "k", 6: "M", 9: "G", 12: "T"}
	return fmt.Sprintf("%.3g %s%s", v/math.Pow(10, float64(exp)), names[exp], unit)
}

// UnitOf returns the unit written after the number in text ("20Torr" → "Torr", "14 kV" → "kV"),
// or "" when there is none or text does not start with a number.
func UnitOf(text string) string {
	s := strings.TrimSpace(text)
	i := numberEnd(s)
	if i == 0 {
		return ""
	}
	return strings.TrimSpace(s[i:])
}
