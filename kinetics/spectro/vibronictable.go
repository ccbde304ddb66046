package spectro

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"fmt"
	"strconv"
	"strings"
)

// vibronic holds the quantities of the laser model that come from the vibrational wave
// functions: they cost the three radial solves of NewModel, so they are shipped as a table
// (data/n2-vibronic.csv) made by this package from the embedded constants.
type vibronic struct {
	recipe string  // what the numbers were computed from (vibronicRecipe)
	a00    float64 // A(0,0) of C → B [s⁻¹]
	tau    float64 // radiative lifetime of C(v=0) [s]
	fC     float64 // Franck–Condon share of X(0) → C(0)
	fC1    float64 // Franck–Condon share of X(0) → C(1)
	fB     float64 // Franck–Condon share of X(0) → B(0)
}

// vibronicRecipe names everything the wave-function quantities depend on: the constants text
// (by its SHA-256), the grid, the curve, the number of levels and the RKR ranges. A shipped table
// whose recipe differs from the program's is not used.
func vibronicRecipe(constants []byte, g Grid, curve Curve) string {
	name := "rkr"
	if curve == MorseCurve {
		name = "morse"
	}
	return fmt.Sprintf("constants-sha256=%x grid=%g:%g:%d curve=%s levels=%d rkr-vmax=X%d:B%d:C%d",
		sha256.Sum256(constants), g.RMin, g.RMax, g.N, name, levelsPerState,
		rkrVmax["X"], rkrVmax["B"], rkrVmax["C"])
}

// computeVibronic derives the table from model m; recipe names what m was built from.
func computeVibronic(m *Model, recipe string) (vibronic, error) {
	v := vibronic{recipe: recipe}
	var err error
	if v.a00, err = m.EinsteinA(0, 0); err != nil {
		return vibronic{}, err
	}
	if v.tau, err = m.Lifetime(0); err != nil {
		return vibronic{}, err
	}
	if v.fC, err = m.ExcitationShare("C", 0); err != nil {
		return vibronic{}, err
	}
	if v.fC1, err = m.ExcitationShare("C", 1); err != nil {
		return vibronic{}, err
	}
	if v.fB, err = m.ExcitationShare("B", 0); err != nil {
		return vibronic{}, err
	}
	return v, nil
}

// vibronicFields are the rows of the table file after the recipe, in order.
var vibronicFields = []string{"einstein_a00_per_s", "lifetime_c0_s", "share_c0", "share_c1", "share_b0"}

// format writes the table file: comment lines, the recipe and one name,value row per quantity
// with the shortest decimal that reads back to the same float64.
func (v vibronic) format() []byte {
	var b bytes.Buffer
	b.WriteString("# Wave-function quantities of the N₂ C→B (0,0) laser band, computed by package\n")
	b.WriteString("# kinetics/spectro (NewModel on DefaultGrid with RKR curves) from data/n2-constants.toml;\n")
	b.WriteString("# they are this program's own output, shipped so that a run need not solve the radial\n")
	b.WriteString("# equations at start-up. Regenerate with\n")
	b.WriteString("#   go test ./kinetics/spectro -run TestShippedVibronic -update\n")
	b.WriteString("# The program ignores this file when the recipe does not match its constants and grid.\n")
	fmt.Fprintf(&b, "recipe,%s\n", v.recipe)
	for i, p := range v.pointers() {
		fmt.Fprintf(&b, "%s,%s\n", vibronicFields[i], strconv.FormatFloat(*p, 'g', -1, 64))
	}
	return b.Bytes()
}

// parseVibronic reads a table written by format.
func parseVibronic(text []byte) (vibronic, error) {
	var v vibronic
	seen := map[string]bool{}
	ptr := map[string]*float64{}
	for i, p := range v.pointers() {
		ptr[vibronicFields[i]] = p
	}
	sc := bufio.NewScanner(bytes.NewReader(text))
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		key, val, ok := strings.Cut(line, ",")
		if !ok {
			return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv line %d: want name,value", n)
		}
		if seen[key] {
			return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv line %d: %s given twice", n, key)
		}
		seen[key] = true
		if key == "recipe" {
			v.recipe = val
			continue
		}
		p, ok := ptr[key]
		if !ok {
			return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv line %d: unknown name %q, want recipe or one of %s",
				n, key, strings.Join(vibronicFields, ", "))
		}
		x, err := strconv.ParseFloat(val, 64)
		if err != nil || !(x > 0) {
			return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv line %d: %s = %q, want a positive number", n, key, val)
		}
		*p = x
	}
	if err := sc.Err(); err != nil {
		return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv: %w", err)
	}
	for _, k := range append([]string{"recipe"}, vibronicFields...) {
		if !seen[k] {
			return vibronic{}, fmt.Errorf("spectro: data/n2-vibronic.csv: %s missing", k)
		}
	}
	return v, nil
}

// pointers returns the addresses of the values in vibronicFields order.
func (v *vibronic) pointers() []*float64 { return []*float64{&v.a00, &v.tau, &v.fC, &v.fC1, &v.fB} }
