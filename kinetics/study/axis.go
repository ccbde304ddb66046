package study

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// Axis is one varied design key: N values from From to To, evenly spaced or, with Log,
// evenly spaced in the logarithm.
type Axis struct {
	Key  string  `json:"key"`  // dotted design key, "gas.pressure"
	Unit string  `json:"unit"` // SI unit of the key ("" for a pure number)
	From float64 `json:"from"` // first value [SI]
	To   float64 `json:"to"`   // last value [SI]
	N    int     `json:"n"`    // number of values, at least 1
	Log  bool    `json:"log"`  // logarithmic spacing
	// Display is the unit the user typed for FROM ("Torr", "kV"), in which figures show the
	// axis; "" when FROM was a bare SI number. It does not change the grid.
	Display string `json:"display,omitempty"`
}

// maxAxisPoints bounds one axis; more points than this are a typing mistake.
const maxAxisPoints = 100000

// ParseAxis reads an axis written KEY=FROM:TO:N[:log], for example
// "gas.pressure=20Torr:760Torr:20:log". FROM and TO take any unit of the key's dimension (a bare
// number is refused for a dimensioned key, 0 excepted); both ends are checked against the key's allowed range on a copy of base.
func ParseAxis(text string, base *design.Design) (Axis, error) {
	key, rng, ok := strings.Cut(text, "=")
	key = strings.TrimSpace(key)
	if !ok || key == "" {
		return Axis{}, fmt.Errorf("study: --vary %q: want KEY=FROM:TO:N[:log]", text)
	}
	parts := strings.Split(rng, ":")
	if len(parts) < 3 || len(parts) > 4 {
		return Axis{}, fmt.Errorf("study: --vary %q: want KEY=FROM:TO:N[:log], got %d fields after '='", text, len(parts))
	}
	unit, known := design.KeyUnit(key)
	if !known {
		// Set gives the error with a suggestion.
		return Axis{}, fmt.Errorf("study: --vary %q: %w", text, base.Clone().Set(key, parts[0]))
	}
	if _, err := base.Get(key); err != nil {
		return Axis{}, fmt.Errorf("study: --vary %q: %w", text, err)
	}
	a := Axis{Key: key, Unit: unit, Display: units.UnitOf(parts[0])}
	var err error
	if a.From, err = valueOf(base, key, parts[0]); err != nil {
		return Axis{}, fmt.Errorf("study: --vary %q: FROM: %w", text, err)
	}
	if a.To, err = valueOf(base, key, parts[1]); err != nil {
		return Axis{}, fmt.Errorf("study: --vary %q: TO: %w", text, err)
	}
	n, err := strconv.Atoi(strings.TrimSpace(parts[2]))
	if err != nil || n < 1 || n > maxAxisPoints {
		return Axis{}, fmt.Errorf("study: --vary %q: N = %q: want a whole number from 1 to %d", text, parts[2], maxAxisPoints)
	}
	a.N = n
	if len(parts) == 4 {
		switch strings.ToLower(strings.TrimSpace(parts[3])) {
		case "log":
			a.Log = true
		case "lin", "linear", "":
		default:
			return Axis{}, fmt.Errorf("study: --vary %q: spacing %q: allowed log or lin", text, parts[3])
		}
	}
	if err := a.Check(); err != nil {
		return Axis{}, fmt.Errorf("study: --vary %q: %w", text, err)
	}
	return a, nil
}

// valueOf converts text with a unit to SI through the design's own parser and range check.
func valueOf(base *design.Design, key, text string) (float64, error) {
	d := base.Clone()
	if err := d.Set(key, strings.TrimSpace(text)); err != nil {
		return 0, err
	}
	return d.Get(key)
}

// Check reports an axis that cannot make a grid.
func (a Axis) Check() error {
	if a.N < 1 || a.N > maxAxisPoints {
		return fmt.Errorf("%s: %d points: allowed 1 to %d", a.Key, a.N, maxAxisPoints)
	}
	if math.IsNaN(a.From) || math.IsNaN(a.To) || math.IsInf(a.From, 0) || math.IsInf(a.To, 0) {
		return fmt.Errorf("%s: ends %g and %g must be finite", a.Key, a.From, a.To)
	}
	if a.Log && (a.From <= 0 || a.To <= 0) {
		return fmt.Errorf("%s: log spacing needs positive ends, got %g and %g", a.Key, a.From, a.To)
	}
	return nil
}

// Values returns the N grid values in SI. The ends are exactly From and To; the values
// between are rounded to 15 significant digits, so that an axis between decimal ends gives
// the decimals one would type (0.00225, not 0.0022500000000000003), and to whole numbers for
// a whole-number key (numerics.cells); they never leave [From, To].
func (a Axis) Values() []float64 {
	v := make([]float64, a.N)
	v[0] = a.From
	if a.N == 1 {
		return v
	}
	whole := design.KeyInteger(a.Key)
	lo, hi := min(a.From, a.To), max(a.From, a.To)
	n := float64(a.N - 1)
	for i := 1; i < a.N-1; i++ {
		var x float64
		if a.Log {
			x = a.From * math.Pow(a.To/a.From, float64(i)/n)
		} else {
			x = (a.From*(n-float64(i)) + a.To*float64(i)) / n
		}
		x, _ = strconv.ParseFloat(strconv.FormatFloat(x, 'g', 15, 64), 64)
		if whole {
			x = math.Round(x)
		}
		v[i] = max(lo, min(hi, x))
	}
	v[a.N-1] = a.To
	return v
}

// String writes the axis as it would be typed, in the unit the user typed (or SI with a
// prefix) and six significant figures: "gas.pressure=20 Torr:760 Torr:20:log".
func (a Axis) String() string {
	s := fmt.Sprintf("%s=%s:%s:%d", a.Key, a.display(a.From), a.display(a.To), a.N)
	if a.Log {
		s += ":log"
	}
	return s
}

// display writes one value of the axis in the unit the user typed, or in SI with a prefix.
func (a Axis) display(v float64) string {
	if a.Display != "" {
		if f, _, err := units.ParseUnit(a.Display); err == nil {
			return strconv.FormatFloat(v/f, 'g', 6, 64) + " " + a.Display
		}
	}
	if a.Unit == "" {
		return strconv.FormatFloat(v, 'g', 6, 64)
	}
	return strings.ReplaceAll(units.FormatDigits(v, a.Unit, 6), " ", "")
}

// Header is the column heading of the axis in a results table: "gas.pressure [Pa]".
func (a Axis) Header() string {
	if a.Unit == "" {
		return a.Key
	}
	return a.Key + " [" + a.Unit + "]"
}

// formatNumber writes v as the shortest decimal that reads back to the same float64.
func formatNumber(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// siText writes an SI value of a design key as text that Design.Set reads back to the same
// float64: the shortest decimal and the key's SI unit (a bare number is refused for a
// dimensioned key).
func siText(key string, v float64) string {
	if u, _ := design.KeyUnit(key); u != "" {
		return formatNumber(v) + " " + u
	}
	return formatNumber(v)
}
