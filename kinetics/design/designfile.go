package design

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"maps"
	"math"
	"os"
	"slices"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"n2pulse/data"
	"n2pulse/kinetics/build"
	"n2pulse/units"
)

// requiredKeys must appear in every design file: the defaults cover only published constants
// and numerics, never the apparatus. The circuit values (the keys of derivable) are required
// too, unless a [build] section describes the plates they come from.
var requiredKeys = []string{
	"channel.length", "channel.gap", "channel.width", "gas.pressure",
	"circuit.topology", "circuit.charge_voltage",
}

// LoadDesign reads and checks a design file.
func LoadDesign(path string) (*Design, error) {
	b, err := ReadFile(path)
	if err != nil {
		return nil, err
	}
	return ParseDesign(b, path)
}

// MaxDesignBytes bounds the text of a design: the listing of every key with comments is
// about 10 kB, so a larger input (a wrong file, /dev/zero) is refused before it fills memory.
const MaxDesignBytes = 1 << 20

// ReadFile returns the text of the design file at path, at most MaxDesignBytes.
func ReadFile(path string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("design: %w", err)
	}
	defer f.Close()
	return ReadText(f, path)
}

// ReadText reads a design's text from r (named name in messages), at most MaxDesignBytes.
func ReadText(r io.Reader, name string) ([]byte, error) {
	b, err := io.ReadAll(io.LimitReader(r, MaxDesignBytes+1))
	if err != nil {
		return nil, fmt.Errorf("design: %s: %w", name, err)
	}
	if len(b) > MaxDesignBytes {
		return nil, fmt.Errorf("design: %s: longer than %d bytes, not a design file", name, MaxDesignBytes)
	}
	return b, nil
}

// ExampleDesign returns the built-in example: a bench-top atmospheric Blumlein laser.
func ExampleDesign() *Design {
	d, err := ParseDesign(data.ExampleDesign(), "example.toml")
	if err != nil {
		panic("design: built-in example design is invalid: " + err.Error()) // programmer error
	}
	return d
}

// ParseDesign decodes a TOML design, rejecting unknown keys, wrong units and impossible
// values; name is used in messages. Keys absent from the file take the defaults of Defaults;
// a [build] section gives the circuit values the file leaves out (see ParseBuiltDesign, the
// one parse path).
func ParseDesign(b []byte, name string) (*Design, error) {
	flat, err := decodeFlat(b, name)
	if err != nil {
		return nil, err
	}
	built, err := parseBuilt(flat)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", name, err)
	}
	return built.Design, nil
}

// mixtureKeys are the mole-fraction keys of the gas, nitrogen first.
var mixtureKeys = []string{"gas.nitrogen", "gas.oxygen", "gas.helium"}

// BalanceMixture applies the one mixture rule after a group of keys was assigned together: the
// keys of a design file, the --set list of a run, the varied keys of a sweep point. When
// oxygen or helium is among them and nitrogen is not, nitrogen fills the rest: gas.nitrogen = 1 − gas.oxygen −
// gas.helium (so --set gas.oxygen=0.21 makes air of a nitrogen design). When nitrogen is among
// them, the fractions must already sum to one. A sum that does not hold, or oxygen and helium
// that leave no room for nitrogen, is a *KeyError naming the keys.
func (d *Design) BalanceMixture(changed []string) error {
	var named []string
	for _, k := range mixtureKeys {
		if slices.Contains(changed, k) {
			named = append(named, k)
		}
	}
	g := &d.Gas
	if len(named) == 0 {
		return nil // the mixture was not touched
	}
	if named[0] != "gas.nitrogen" {
		if n := 1 - g.Oxygen - g.Helium; n > 0 {
			g.Nitrogen = n
			return nil
		}
		return &KeyError{Key: "gas.oxygen + gas.helium", Value: fmt.Sprintf("%g + %g", g.Oxygen, g.Helium),
			Problem: "leave no room for nitrogen: their sum must stay below 1 (nitrogen fills the rest)"}
	}
	if s := g.Nitrogen + g.Oxygen + g.Helium; math.Abs(s-1) > 1e-6 {
		return &KeyError{Key: strings.Join(mixtureKeys, " + "), Value: fmt.Sprintf("%g + %g + %g", g.Nitrogen, g.Oxygen, g.Helium),
			Problem: fmt.Sprintf("mole fractions sum to %g, must sum to 1 (%s given; leave gas.nitrogen out and it fills the rest)", s, strings.Join(named, ", "))}
	}
	return nil
}

// decodeFlat decodes TOML text into dotted keys ("channel.length") and their values; syntax
// errors carry the file name and line.
func decodeFlat(b []byte, name string) (map[string]any, error) {
	var raw map[string]any
	if _, err := toml.NewDecoder(bytes.NewReader(b)).Decode(&raw); err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, fmt.Errorf("design: %s:%d: %s", name, pe.Position.Line, pe.Message)
		}
		return nil, fmt.Errorf("design: %s: %w", name, err)
	}
	flat := map[string]any{}
	flatten("", raw, flat)
	return flat, nil
}

func flatten(prefix string, m map[string]any, out map[string]any) {
	for k, v := range m {
		key := k
		if prefix != "" {
			key = prefix + "." + k
		}
		if sub, ok := v.(map[string]any); ok {
			flatten(key, sub, out)
			continue
		}
		out[key] = v
	}
}

// setValue assigns a decoded TOML value to a key.
func (d *Design) setValue(key string, v any) error {
	f, ok := fieldIndex[key]
	if !ok {
		return &KeyError{Key: key, Problem: "unknown key" + suggest(key)}
	}
	switch x := v.(type) {
	case string:
		return d.set(key, x)
	case int64:
		if f.str != nil {
			return &KeyError{Key: key, Value: strconv.FormatInt(x, 10), Problem: "want text in quotes"}
		}
		if err := bareNumber(key, f.dim, float64(x)); err != nil {
			return err
		}
		return f.setNumber(d, float64(x), strconv.FormatInt(x, 10))
	case float64:
		if f.str != nil {
			return &KeyError{Key: key, Value: strconv.FormatFloat(x, 'g', -1, 64), Problem: "want text in quotes"}
		}
		if err := bareNumber(key, f.dim, x); err != nil {
			return err
		}
		return f.setNumber(d, x, strconv.FormatFloat(x, 'g', -1, 64))
	case bool:
		if f.aliases != nil {
			return f.setString(d, strconv.FormatBool(x))
		}
	}
	return &KeyError{Key: key, Value: fmt.Sprint(v), Problem: "want a number or a quoted value with a unit"}
}

// Validate checks the relations between keys that no single range can: mole fractions that
// sum to one, the parameters each switch model needs, and a [build] section the bench can
// evaluate. It only reads the design, so any number of goroutines may validate (and run) one
// design at once.
func (d *Design) Validate() error {
	g := d.Gas
	if s := g.Nitrogen + g.Oxygen + g.Helium; math.Abs(s-1) > 1e-6 {
		return &KeyError{Key: "gas.nitrogen", Value: fmt.Sprintf("%g", g.Nitrogen),
			Problem: fmt.Sprintf("mole fractions nitrogen + oxygen + helium sum to %g, must sum to 1", s)}
	}
	if g.Nitrogen <= 0 {
		return &KeyError{Key: "gas.nitrogen", Value: fmt.Sprintf("%g", g.Nitrogen), Problem: "a nitrogen laser needs nitrogen: allowed above 0 to 1"}
	}
	for _, k := range []string{"circuit.topology", "switch.model"} {
		if err := checkChoice(fieldIndex[k], *fieldIndex[k].str(d)); err != nil {
			return err
		}
	}
	if d.Switch.Model != IdealSwitch && d.Switch.OffResistance <= d.Switch.OnResistance {
		return &KeyError{Key: "switch.off_resistance", Value: fmt.Sprintf("%g Ω", d.Switch.OffResistance),
			Problem: fmt.Sprintf("must exceed switch.on_resistance (%g Ω)", d.Switch.OnResistance)}
	}
	if l := d.Levels; l.RecombinationUpperShare+l.RecombinationLowerShare > 1+1e-12 {
		return &KeyError{Key: "levels.recombination_lower_share", Value: fmt.Sprintf("%g", l.RecombinationLowerShare),
			Problem: fmt.Sprintf("with levels.recombination_upper_share (%g) the shares sum above 1", l.RecombinationUpperShare)}
	}
	if d.Numerics.Cells < 4 {
		return &KeyError{Key: "numerics.cells", Value: strconv.Itoa(d.Numerics.Cells), Problem: "allowed 4 to 20000"}
	}
	if d.Optics.ExcitationVelocity == 0 {
		return &KeyError{Key: "optics.excitation_velocity", Value: "0", Problem: `must not be zero: use "infinite" for a simultaneous discharge`}
	}
	if d.Build != (build.Spec{}) {
		if _, err := build.Evaluate(d.Build, d.BenchConditions()); err != nil {
			return fmt.Errorf("design: [build]: %w", err)
		}
	}
	return nil
}

// checkChoice checks that the text key f holds one of its choices exactly as listed: a file
// and Set store the listed spelling, so another spelling can come only from a design filled in
// code, and the error says how to write it (Validate reports, never rewrites).
func checkChoice(f *field, v string) error {
	c, err := choose(f.key, v, f.choices())
	if err != nil {
		return err
	}
	if c != v {
		return &KeyError{Key: f.key, Value: strconv.Quote(v), Problem: fmt.Sprintf("write it as %q", c)}
	}
	return nil
}

// Clone returns an independent copy of the design.
func (d *Design) Clone() *Design {
	c := *d
	c.Derived = append([]string(nil), d.Derived...)
	c.given = maps.Clone(d.given)
	c.assigned = maps.Clone(d.assigned)
	return &c
}

// String lists the design as dotted key = value lines, in SI, the [build] keys last (a text
// "" or a number 0 there means "not given").
func (d *Design) String() string {
	var b strings.Builder
	for _, f := range fieldList {
		switch {
		case f.str != nil:
			fmt.Fprintf(&b, "%s = %q\n", f.key, *f.str(d))
		case f.integer:
			fmt.Fprintf(&b, "%s = %d\n", f.key, d.Numerics.Cells)
		default:
			fmt.Fprintf(&b, "%s = %g\n", f.key, *f.num(d))
		}
	}
	return b.String()
}

// Listing writes every key with the design's value as a TOML design file of dotted keys, each
// with what it means and its allowed range as a comment: numbers in SI with their unit
// ("0.2 m"), pure numbers and 0 bare, an infinite excitation velocity as "infinite". A key
// whose value could not be read back is written commented out: an apparatus key with no value
// given (the defaults give none), an empty choice, and the [build] keys of a design without a
// [build] section (giving one switches the file to a design described as built). So the
// listing always parses as TOML and, once the apparatus keys are given, as a design.
func (d *Design) Listing() string {
	var b strings.Builder
	hasBuild := d.Build != (build.Spec{})
	for _, f := range fieldList {
		var value string
		ok := true
		switch {
		case f.str != nil:
			v := *f.str(d)
			value = strconv.Quote(v)
			ok = v != "" || f.choices == nil
		case f.integer:
			value = strconv.Itoa(d.Numerics.Cells)
		default:
			v := *f.num(d)
			switch {
			case math.IsInf(v, 1):
				value = `"infinite"`
			case f.dim == units.Dimensionless || v == 0:
				value = strconv.FormatFloat(v, 'g', -1, 64)
			default:
				value = strconv.Quote(strconv.FormatFloat(v, 'g', -1, 64) + " " + f.unit)
			}
			ok = (v == 0 && f.zeroOK) || (v >= f.min && v <= f.max)
		}
		note := f.help
		switch {
		case f.num != nil || f.integer:
			note += "; allowed " + f.rangeText()
		case f.choices != nil:
			note += "; allowed " + strings.Join(f.choices(), ", ")
		}
		if isBuildKey(f.key) && !hasBuild {
			ok = false
		}
		if required(f.key) && !d.given[f.key] {
			ok = false
			note = "required: " + note
		}
		prefix := ""
		if !ok {
			prefix = "# "
		}
		fmt.Fprintf(&b, "%s%s = %s  # %s\n", prefix, f.key, value, note)
	}
	return b.String()
}

// required reports whether every design file must give key (requiredKeys, and the circuit
// values a [build] section can derive).
func required(key string) bool {
	if slices.Contains(requiredKeys, key) {
		return true
	}
	for _, x := range derivable {
		if x.key == key {
			return true
		}
	}
	return false
}
