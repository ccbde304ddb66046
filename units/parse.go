package units

import (
	"fmt"
	"math"
	"slices"
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

// baseUnit is one unit symbol: its SI value is factor·10^dec, the power of ten kept apart so
// that a value in a decimal unit ("0.1 pF", "2.5 cm") converts with a single correct rounding.
type baseUnit struct {
	factor float64
	dim    Dimension
	prefix bool // whether SI prefixes may be applied
	dec    int  // decimal exponent of the unit's value in SI
}

// Units of the trade beyond the SI. The inch-pound values follow from the exact definitions of
// the inch (0.0254 m), the pound (0.45359237 kg) and standard gravity (9.80665 m/s²) of the 1959
// international yard and pound agreement and the 3rd CGPM (1901); the conventional millimetre of
// mercury is 13.5951 g/cm³ × 9.80665 m/s² × 1 mm (NIST SP 811 (2008), App. B.8 lists
// 1.333 224 E+02 Pa; from memory).
const (
	// Bar is 1 bar in pascal (exact).
	Bar = 1e5
	// PoundPerSquareInch is 1 psi (lbf/in²) in pascal (exact from its definition).
	PoundPerSquareInch = 0.45359237 * 9.80665 / (0.0254 * 0.0254)
	// MillimetreOfMercury is 1 mmHg (conventional) in pascal.
	MillimetreOfMercury = 13.5951e3 * 9.80665 * 1e-3
	// Mil is one thousandth of an inch in metre (exact), the trade's unit of dielectric film.
	Mil = 0.0254e-3
	// Inch is 0.0254 m (exact).
	Inch = 0.0254
	// ZeroCelsius is 0 °C in kelvin (exact).
	ZeroCelsius = 273.15
)

var baseUnits = map[string]baseUnit{
	"m":    {1, Length, true, 0},
	"g":    {1, Dimension{0, 1, 0, 0, 0}, true, -3},
	"s":    {1, Time, true, 0},
	"A":    {1, Current, true, 0},
	"K":    {1, Temperature, false, 0},
	"V":    {1, Voltage, true, 0},
	"F":    {1, Capacitance, true, 0},
	"H":    {1, Inductance, true, 0},
	"Ω":    {1, Resistance, true, 0},
	"ohm":  {1, Resistance, true, 0},
	"Pa":   {1, Pressure, true, 0},
	"J":    {1, Energy, true, 0},
	"W":    {1, Power, true, 0},
	"Hz":   {1, Frequency, true, 0},
	"C":    {1, Dimension{0, 0, 1, 1, 0}, true, 0},
	"eV":   {ElectronVolt, Energy, true, 0},
	"Td":   {1, ReducedField, false, -21},
	"Torr": {Torr, Pressure, true, 0},
	"torr": {Torr, Pressure, true, 0},
	"atm":  {Atmosphere, Pressure, false, 0},
	"bar":  {1, Pressure, true, 5},
	"psi":  {PoundPerSquareInch, Pressure, false, 0},
	"mmHg": {MillimetreOfMercury, Pressure, false, 0},
	"mil":  {Mil, Length, false, 0},
	"in":   {Inch, Length, false, 0},
	"inch": {Inch, Length, false, 0},
	"%":    {1, Dimensionless, false, -2},
}

// prefixes are the SI prefixes as decimal exponents.
var prefixes = map[string]int{
	"f": -15, "p": -12, "n": -9, "u": -6, "µ": -6, "μ": -6, "m": -3,
	"c": -2, "d": -1, "h": 2, "k": 3, "M": 6, "G": 9, "T": 12,
}

// celsius are the spellings of the degree Celsius, an offset unit allowed only on its own.
var celsius = []string{"°C", "℃", "degC", "deg C"}

// MaxPower bounds the power of each SI base unit in a unit expression: no quantity of the
// trade needs more, and a larger power is a typing mistake ("m^256").
const MaxPower = 30

// examples suggests, per dimension, the units a builder would write.
var examples = map[Dimension]string{
	Length: "mm, cm, m, mil", Time: "ns, µs", Temperature: "K, °C", Pressure: "Pa, Torr, mbar, bar, atm, psi",
	Voltage: "V, kV", Capacitance: "pF, nF", Inductance: "nH, µH", Resistance: "ohm, kohm",
	Area: "mm2, cm2", Speed: "m/s", Frequency: "Hz, s-1", Density: "cm-3, m-3",
	RateConstant: "cm3/s, m3/s", Attenuation: "/m, /cm", ElectricField: "V/m, kV/cm",
	ReducedField: "Td", Energy: "J, eV", Power: "W", Current: "A",
}

var superscripts = strings.NewReplacer("⁻", "-", "¹", "1", "²", "2", "³", "3", "⁴", "4", "⁵", "5")

// NoUnitError is a dimensioned value given as a bare number (other than 0): such a number is
// never taken as SI silently, since a builder typing "40" for a pressure means Torr or mbar.
type NoUnitError struct {
	Text string    // the value as given
	Want Dimension // the dimension expected
}

func (e *NoUnitError) Error() string {
	ex := examples[e.Want]
	if ex == "" {
		ex = e.Want.String()
	}
	return fmt.Sprintf("%q has no unit: write e.g. \"%s %v\" (units of this quantity: %s; a bare number is taken as SI only for 0)",
		e.Text, strings.TrimSpace(e.Text), e.Want, ex)
}

// Parse reads a number with a unit ("12 kV", "3.3nF", "1e-9 cm3/s", "40 Torr", "20 °C") and
// returns it in SI. want is the dimension the caller expects. A bare number is accepted only
// for a dimensionless quantity or for zero; any other bare number is a *NoUnitError that
// suggests the unit. The unit may be a product of symbols with integer powers (at most
// MaxPower in size), separated by spaces, '*', '·' or '/': "cm^-3", "cm³/s",
// "atm cm2 V-2 s-1". Degrees Celsius ("°C", "℃", "degC") stand alone and only for a
// temperature. The result is always finite.
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
		return 0, fmt.Errorf("units: %q: number out of range of a float64", text)
	}
	unit := strings.TrimSpace(s[i:])
	if unit == "" {
		if want != Dimensionless && v != 0 {
			return 0, &NoUnitError{Text: s, Want: want}
		}
		return v, nil
	}
	if slices.Contains(celsius, unit) {
		if want != Temperature {
			return 0, fmt.Errorf("units: %q is a temperature, want %v", text, want)
		}
		if v+ZeroCelsius < 0 {
			return 0, fmt.Errorf("units: %q is below absolute zero", text)
		}
		return v + ZeroCelsius, nil
	}
	dec, other, dim, err := parseUnit(unit)
	if err != nil {
		return 0, fmt.Errorf("units: %q: %w", text, err)
	}
	if dim != want {
		hint := ""
		if want == Temperature && unit == "C" {
			hint = " (C is the coulomb; for degrees Celsius write °C or degC)"
		}
		return 0, fmt.Errorf("units: %q is in %v, want %v%s", text, dim, want, hint)
	}
	r, err := scaleDecimal(s[:i], dec)
	r *= other
	if err != nil || math.IsInf(r, 0) || math.IsNaN(r) || (r == 0 && v != 0) {
		return 0, fmt.Errorf("units: %q is out of range of a float64 in SI", text)
	}
	return r, nil
}

// scaleDecimal returns the decimal literal num times 10^dec, rounded once: "0.1" with −12 is
// the float64 nearest 1e-13, exactly the literal 1e-13 (0.1 × 1e-12 in floating point is not).
func scaleDecimal(num string, dec int) (float64, error) {
	mant, exp := num, 0
	if k := strings.IndexAny(num, "eE"); k >= 0 {
		e, err := strconv.Atoi(num[k+1:])
		if err != nil {
			return 0, err
		}
		mant, exp = num[:k], e
	}
	return strconv.ParseFloat(mant+"e"+strconv.Itoa(exp+dec), 64)
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

// ParseUnit returns the SI factor and dimension of a unit expression such as "kV/cm" or
// "cm^-3". A power of any base unit beyond ±MaxPower, or a factor outside the range of a
// float64, is an error.
func ParseUnit(unit string) (float64, Dimension, error) {
	dec, other, dim, err := parseUnit(unit)
	if err != nil {
		return 0, dim, err
	}
	factor, err := strconv.ParseFloat("1e"+strconv.Itoa(dec), 64)
	factor *= other
	if err != nil || factor == 0 || math.IsInf(factor, 0) || math.IsNaN(factor) {
		return 0, Dimension{}, fmt.Errorf("unit %q is out of range of a float64", unit)
	}
	return factor, dim, nil
}

// parseUnit returns the SI value of a unit expression as 10^dec·other and its dimension.
func parseUnit(unit string) (dec int, other float64, _ Dimension, _ error) {
	unit = superscripts.Replace(unit)
	other = 1.0
	var dim [5]int
	sign := 1
	tok := strings.Builder{}
	flush := func() error {
		t := tok.String()
		tok.Reset()
		if t == "" {
			return nil
		}
		b, pdec, pow, err := parseFactor(t)
		if err != nil {
			return err
		}
		dec += sign * pow * (b.dec + pdec)
		if b.factor != 1 {
			other *= math.Pow(b.factor, float64(sign*pow))
		}
		for k := range dim {
			dim[k] += sign * pow * int(b.dim[k])
			if dim[k] > MaxPower || dim[k] < -MaxPower {
				return fmt.Errorf("power of a base unit in %q beyond ±%d", unit, MaxPower)
			}
		}
		return nil
	}
	for _, r := range unit {
		switch {
		case r == '/':
			if err := flush(); err != nil {
				return 0, 0, Dimension{}, err
			}
			sign = -1
		case r == '*' || r == '·' || unicode.IsSpace(r):
			if err := flush(); err != nil {
				return 0, 0, Dimension{}, err
			}
		default:
			tok.WriteRune(r)
		}
	}
	if err := flush(); err != nil {
		return 0, 0, Dimension{}, err
	}
	if other == 0 || math.IsInf(other, 0) || math.IsNaN(other) {
		return 0, 0, Dimension{}, fmt.Errorf("unit %q is out of range of a float64", unit)
	}
	var d Dimension
	for k := range dim {
		d[k] = int8(dim[k])
	}
	return dec, other, d, nil
}

// parseFactor reads one symbol with optional prefix and power: "cm^-3", "cm3", "kV", "s-1". It
// returns the unit, the decimal exponent of its prefix and the power.
func parseFactor(t string) (baseUnit, int, int, error) {
	sym, pow := t, 1
	if j := strings.IndexAny(t, "^-0123456789"); j > 0 {
		sym = t[:j]
		p, err := strconv.Atoi(strings.TrimPrefix(t[j:], "^"))
		if err != nil {
			return baseUnit{}, 0, 0, fmt.Errorf("bad power in unit %q", t)
		}
		if p > MaxPower || p < -MaxPower {
			return baseUnit{}, 0, 0, fmt.Errorf("power %d in unit %q: allowed -%d to %d", p, t, MaxPower, MaxPower)
		}
		pow = p
	}
	if b, ok := baseUnits[sym]; ok {
		return b, 0, pow, nil
	}
	for p, e := range prefixes {
		if rest, found := strings.CutPrefix(sym, p); found && rest != "" {
			if b, ok := baseUnits[rest]; ok && b.prefix {
				return b, e, pow, nil
			}
		}
	}
	if slices.Contains(celsius, sym) || sym == "°" || sym == "deg" {
		return baseUnit{}, 0, 0, fmt.Errorf("°C stands alone, not in a product of units (%q)", t)
	}
	return baseUnit{}, 0, 0, fmt.Errorf("unknown unit %q", sym)
}

// Format writes v (in the SI unit unit) with an SI prefix and three significant figures:
// Format(1.234e-6, "J") is "1.23 µJ".
func Format(v float64, unit string) string { return FormatDigits(v, unit, 3) }

// FormatDigits writes v (in the SI unit unit) with an SI prefix and the given number of
// significant figures: FormatDigits(2666.4473684210525, "Pa", 6) is "2.66645 kPa". A pure
// number (unit "") gets no prefix: 0.25 is "0.25", never "250 m", which reads as metres.
func FormatDigits(v float64, unit string, digits int) string {
	if unit == "" {
		return fmt.Sprintf("%.*g", digits, v)
	}
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprintf("%.*g %s", digits, v, unit)
	}
	exp := int(math.Floor(math.Log10(math.Abs(v))/3)) * 3
	exp = max(-15, min(12, exp))
	names := map[int]string{-15: "f", -12: "p", -9: "n", -6: "µ", -3: "m", 0: "", 3: "k", 6: "M", 9: "G", 12: "T"}
	return fmt.Sprintf("%.*g %s%s", digits, v/math.Pow(10, float64(exp)), names[exp], unit)
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
