// Package measured reads a builder's measured points from a CSV file: the design keys that
// differ from point to point (one column each, unit in the header) and the measured pulse
// figures (pulse energy at one end or both, peak power, FWHM), each with an optional
// uncertainty. It only reads text; package fit runs the model against the points.
//
// The file:
//
//	# lines starting with # are comments
//	channel.gap [mm], gas.pressure [Torr], energy_front [uJ], energy_front_uncertainty [%]
//	1.2,              760,                 48,                10
//	1.6,              760,                 61,                10
//
// A design-key column with a unit in brackets holds bare numbers in that unit; without a unit
// each cell is read as a design value would be on the command line ("1.2 mm", "transfer", a
// pure number). Every row gives every design-key column. A measured column needs its unit
// (energies in J, µJ/uJ …; peak power in W, kW …; FWHM in s, ns, ps). An uncertainty column
// is named after its quantity with "_uncertainty" and is one standard uncertainty, in the
// quantity's units or in % of the measured value. A row may leave a measured cell empty (not
// measured at that point); either every measured value carries an uncertainty or none does
// (the fit then estimates the scatter from the residuals). A column named "note" is free
// text. Measured values must be above zero: the fit compares logarithms.
package measured

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"slices"
	"strconv"
	"strings"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// Quantity is a measured figure of the output pulse the fit can compare with the model.
type Quantity struct {
	Name   string          // column name: "energy_front"
	Metric string          // the figure of merit of a shot it is compared with (JSON name of kinetics.Summary): "energy_front_J"
	Dim    units.Dimension // units.Energy, units.Power, units.Time
	Words  string          // "pulse energy, output end"
}

// Quantities are the measured figures a file may hold.
var Quantities = []Quantity{
	{"energy_front", "energy_front_J", units.Energy, "pulse energy, output end"},
	{"energy_rear", "energy_rear_J", units.Energy, "pulse energy, rear end"},
	{"energy_total", "energy_total_J", units.Energy, "pulse energy, both ends"},
	{"peak_power", "peak_power_W", units.Power, "peak power, output end"},
	// The model's width here is the FWHM of a Gaussian of the pulse's rms duration (see
	// package fit).
	{"fwhm", "rms_fwhm_s", units.Time, "pulse width (FWHM)"},
}

// uncertaintySuffix ends the name of an uncertainty column.
const uncertaintySuffix = "_uncertainty"

// Limits of a measured-points file: far above any bench's measurements, low enough that a
// wrong file (a waveform dump, /dev/zero) is refused before it fills memory.
const (
	MaxBytes   = 1 << 20
	MaxPoints  = 1000
	MaxColumns = 64
)

// Setting is one design value of a point, as text a design.Design.Set accepts ("1.55 mm").
type Setting struct {
	Key   string
	Value string
}

// Value is one measured figure at a point, in SI.
type Value struct {
	Quantity    string  // Quantity.Name
	Value       float64 // > 0 [SI]
	Uncertainty float64 // one standard uncertainty [SI]; 0 when the file gives none
}

// Point is one row of the file.
type Point struct {
	Line     int       // line of the file, for messages
	Settings []Setting // one per design-key column, in column order
	Values   []Value   // the measured figures of this row (empty cells left out)
	Note     string
}

// Column is a column of the file as the user headed it.
type Column struct {
	Name string // design key or quantity name
	Unit string // the unit written in the header ("mm", "uJ"); "" when none
}

// Set is a whole file.
type Set struct {
	Name       string   // file name, for messages
	Keys       []Column // design-key columns, in file order
	Quantities []Column // measured columns, in file order (uncertainty columns not included)
	Points     []Point
	// Uncertain is true when every measured value carries an uncertainty.
	Uncertain bool
}

// QuantityOf returns the quantity of a column name and whether there is one.
func QuantityOf(name string) (Quantity, bool) {
	for _, q := range Quantities {
		if q.Name == name {
			return q, true
		}
	}
	return Quantity{}, false
}

// Error is a problem with one place of the file.
type Error struct {
	File    string
	Line    int    // 0 when not tied to a line
	Column  string // header of the column, "" when not tied to one
	Problem string
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString("measured: " + e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, " line %d", e.Line)
	}
	if e.Column != "" {
		fmt.Fprintf(&b, ", column %q", e.Column)
	}
	return b.String() + ": " + e.Problem
}

// ReadFile reads and checks the measured points at path.
func ReadFile(path string) (*Set, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("measured: %w", err)
	}
	defer f.Close()
	b, err := io.ReadAll(io.LimitReader(f, MaxBytes+1))
	if err != nil {
		return nil, fmt.Errorf("measured: %s: %w", path, err)
	}
	return Parse(b, path)
}

// column is one header cell resolved.
type column struct {
	header string
	Column
	kind    int // colKey, colQuantity, colUncertainty, colNote
	dim     units.Dimension
	factor  float64 // SI per header unit (1 when none)
	percent bool    // an uncertainty in % of the value
}

const (
	colKey = iota
	colQuantity
	colUncertainty
	colNote
)

// Parse reads measured points from the CSV text b; name is used in messages.
func Parse(b []byte, name string) (*Set, error) {
	fail := func(line int, col, format string, a ...any) error {
		return &Error{File: name, Line: line, Column: col, Problem: fmt.Sprintf(format, a...)}
	}
	if len(b) > MaxBytes {
		return nil, fail(0, "", "longer than %d bytes, not a file of measured points", MaxBytes)
	}
	r := csv.NewReader(bytes.NewReader(b))
	r.Comment = '#'
	r.TrimLeadingSpace = true
	header, err := r.Read()
	if err == io.EOF {
		return nil, fail(0, "", "empty: want a header line of design keys and measured quantities, then one line per measured point")
	}
	if err != nil {
		return nil, csvError(name, err)
	}
	line, _ := r.FieldPos(0)
	if len(header) > MaxColumns {
		return nil, fail(line, "", "%d columns, at most %d allowed", len(header), MaxColumns)
	}
	cols, err := parseHeader(header, name, line)
	if err != nil {
		return nil, err
	}
	set := &Set{Name: name}
	for _, c := range cols {
		switch c.kind {
		case colKey:
			set.Keys = append(set.Keys, c.Column)
		case colQuantity:
			set.Quantities = append(set.Quantities, c.Column)
		}
	}
	if len(set.Quantities) == 0 {
		return nil, fail(line, "", "no measured column: want at least one of %s, with its unit, e.g. \"energy_front [uJ]\"", quantityNames())
	}
	uncertain, bare := 0, 0
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, csvError(name, err)
		}
		line, _ := r.FieldPos(0)
		if len(set.Points) == MaxPoints {
			return nil, fail(line, "", "more than %d measured points", MaxPoints)
		}
		p, err := parseRow(rec, cols, name, line)
		if err != nil {
			return nil, err
		}
		if len(p.Values) == 0 {
			return nil, fail(line, "", "no measured value in this row: give at least one of the measured columns")
		}
		for _, v := range p.Values {
			if v.Uncertainty > 0 {
				uncertain++
			} else {
				bare++
			}
		}
		set.Points = append(set.Points, p)
	}
	if len(set.Points) == 0 {
		return nil, fail(0, "", "no measured points: want one line per point after the header")
	}
	if uncertain > 0 && bare > 0 {
		return nil, fail(0, "", "%d measured values carry an uncertainty and %d do not: give an uncertainty for every value (a column named <quantity>%s) or for none", uncertain, bare, uncertaintySuffix)
	}
	set.Uncertain = uncertain > 0
	return set, nil
}

// csvError turns an error of encoding/csv into one naming the file and line.
func csvError(name string, err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		problem := pe.Err.Error()
		if errors.Is(pe.Err, csv.ErrFieldCount) {
			problem = "this row has a different number of cells from the header"
		}
		return &Error{File: name, Line: pe.Line, Problem: problem}
	}
	return fmt.Errorf("measured: %s: %w", name, err)
}

// quantityNames lists the measured column names for messages.
func quantityNames() string {
	var s []string
	for _, q := range Quantities {
		s = append(s, q.Name)
	}
	return strings.Join(s, ", ")
}

// parseHeader resolves every header cell: "name [unit]" or "name".
func parseHeader(header []string, file string, line int) ([]column, error) {
	cols := make([]column, len(header))
	seen := map[string]bool{}
	for i, h := range header {
		h = strings.TrimSpace(strings.TrimPrefix(h, "\uFEFF"))
		fail := func(format string, a ...any) error {
			return &Error{File: file, Line: line, Column: h, Problem: fmt.Sprintf(format, a...)}
		}
		name, unit := h, ""
		if k := strings.IndexByte(h, '['); k >= 0 {
			if !strings.HasSuffix(h, "]") {
				return nil, fail("write the unit in brackets at the end, e.g. \"channel.gap [mm]\"")
			}
			name, unit = strings.TrimSpace(h[:k]), strings.TrimSpace(h[k+1:len(h)-1])
		}
		if name == "" {
			return nil, fail("empty column name (column %d)", i+1)
		}
		if seen[name] {
			return nil, fail("%s appears twice", name)
		}
		seen[name] = true
		c := column{header: h, Column: Column{Name: name, Unit: unit}, factor: 1}
		switch {
		case name == "note":
			c.kind = colNote
		case strings.HasSuffix(name, uncertaintySuffix):
			qn := strings.TrimSuffix(name, uncertaintySuffix)
			q, ok := QuantityOf(qn)
			if !ok {
				return nil, fail("an uncertainty of %q, which is not a measured quantity (%s)", qn, quantityNames())
			}
			if !slices.Contains(header, qn) && !slices.ContainsFunc(header, func(x string) bool { return headName(x) == qn }) {
				return nil, fail("no column %q for this uncertainty", qn)
			}
			c.kind, c.dim = colUncertainty, q.Dim
			if unit == "%" {
				c.percent = true
			} else if err := c.setUnit(q.Dim); err != nil {
				return nil, fail("%v (or %% of the measured value)", err)
			}
		default:
			if q, ok := QuantityOf(name); ok {
				c.kind, c.dim = colQuantity, q.Dim
				if err := c.setUnit(q.Dim); err != nil {
					return nil, fail("%v", err)
				}
				break
			}
			if _, ok := design.KeyUnit(name); !ok {
				hint := ""
				if _, err := design.Defaults().Get(name); err != nil {
					if _, h, ok := strings.Cut(err.Error(), "(did you mean"); ok {
						hint = " (did you mean" + h
					}
				}
				return nil, fail("neither a design key nor a measured quantity (%s)%s; `n2pulse init --all` lists the design keys", quantityNames(), hint)
			}
			c.kind = colKey
			if unit != "" {
				// A unit must be one the key's values can be written in: checked on the cells.
				if _, _, err := units.ParseUnit(unit); err != nil {
					return nil, fail("unit %q: %v", unit, strings.TrimPrefix(err.Error(), "units: "))
				}
			}
		}
		cols[i] = c
	}
	return cols, nil
}

// headName is the column name of a header cell without its unit.
func headName(h string) string {
	name, _, _ := strings.Cut(h, "[")
	return strings.TrimSpace(name)
}

// setUnit checks that the header's unit is one of dim and keeps its SI factor.
func (c *column) setUnit(dim units.Dimension) error {
	if c.Unit == "" {
		return fmt.Errorf("give the unit in the header, e.g. \"%s [%s]\"", c.Name, exampleUnit(dim))
	}
	f, got, err := units.ParseUnit(c.Unit)
	if err != nil {
		return fmt.Errorf("unit %q: %v", c.Unit, strings.TrimPrefix(err.Error(), "units: "))
	}
	if got != dim || !(f > 0) {
		return fmt.Errorf("unit %q is not one of %v (e.g. %s)", c.Unit, dim, exampleUnit(dim))
	}
	c.factor = f
	return nil
}

func exampleUnit(dim units.Dimension) string {
	switch dim {
	case units.Energy:
		return "uJ"
	case units.Power:
		return "kW"
	case units.Time:
		return "ns"
	}
	return dim.String()
}

// parseRow reads one data row.
func parseRow(rec []string, cols []column, file string, line int) (Point, error) {
	p := Point{Line: line}
	fail := func(c column, format string, a ...any) error {
		return &Error{File: file, Line: line, Column: c.header, Problem: fmt.Sprintf(format, a...)}
	}
	values := map[string]int{}       // quantity → index in p.Values
	uncert := map[string]float64{}   // quantity → SI uncertainty (negative: percent, as −fraction)
	uncertCol := map[string]column{} // for messages
	for i, c := range cols {
		cell := strings.TrimSpace(rec[i])
		switch c.kind {
		case colNote:
			p.Note = cell
		case colKey:
			if cell == "" {
				return p, fail(c, "empty: every row gives every design-key column")
			}
			text := cell
			if c.Unit != "" {
				if _, err := strconv.ParseFloat(cell, 64); err != nil {
					return p, fail(c, "%q is not a number (the unit %s is in the header)", cell, c.Unit)
				}
				text = cell + " " + c.Unit
			}
			// Checked here against the key's units and allowed range, so a mistake names its row.
			if err := design.Defaults().Set(c.Name, text); err != nil {
				return p, fail(c, "%s", strings.TrimPrefix(err.Error(), "design: "))
			}
			p.Settings = append(p.Settings, Setting{Key: c.Name, Value: text})
		case colQuantity, colUncertainty:
			if cell == "" {
				continue
			}
			x, err := strconv.ParseFloat(cell, 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return p, fail(c, "%q is not a number (the unit %s is in the header)", cell, c.Unit)
			}
			if c.kind == colQuantity {
				v := x * c.factor
				if !(v > 0) || math.IsInf(v, 0) {
					return p, fail(c, "%s %s: a measured value must be above zero (the fit compares logarithms)", cell, c.Unit)
				}
				values[c.Name] = len(p.Values)
				p.Values = append(p.Values, Value{Quantity: c.Name, Value: v})
				continue
			}
			q := strings.TrimSuffix(c.Name, uncertaintySuffix)
			uncertCol[q] = c
			if c.percent {
				if !(x > 0 && x <= 1000) {
					return p, fail(c, "%s %%: an uncertainty in %% must be above 0 and at most 1000", cell)
				}
				uncert[q] = -x / 100
			} else {
				u := x * c.factor
				if !(u > 0) || math.IsInf(u, 0) {
					return p, fail(c, "%s %s: an uncertainty must be above zero", cell, c.Unit)
				}
				uncert[q] = u
			}
		}
	}
	for q, u := range uncert {
		k, ok := values[q]
		if !ok {
			return p, fail(uncertCol[q], "an uncertainty without a measured %s in this row", q)
		}
		if u < 0 {
			u = -u * p.Values[k].Value
			if !(u > 0) {
				return p, fail(uncertCol[q], "the uncertainty of %g is too small to represent", p.Values[k].Value)
			}
		}
		p.Values[k].Uncertainty = u
	}
	return p, nil
}
