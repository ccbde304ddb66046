package spectro

import (
	"flag"
	"math"
	"runtime"
	"strings"
	"testing"

	"n2pulse/data"
	"n2pulse/internal/atomicfile"
	"n2pulse/units"
)

var update = flag.Bool("update", false, "rewrite data/n2-vibronic.csv from a fresh solve")

// TestShippedVibronic solves the radial equations afresh and compares with the shipped table
// data/n2-vibronic.csv: it is this package's own output, so on amd64 (where the Go compiler
// fuses no multiply–adds) every value must be equal bit for bit, and the recipe must name the
// embedded constants and DefaultGrid. Elsewhere fused multiply–adds may move the last bits, so
// 1e−12 relative is allowed there. With -update the file is rewritten.
func TestShippedVibronic(t *testing.T) {
	t.Parallel()
	m, err := defaultModel()
	if err != nil {
		t.Fatal(err)
	}
	fresh, err := computeVibronic(m, vibronicRecipe(data.Spectroscopy(), DefaultGrid, RKRCurve))
	if err != nil {
		t.Fatal(err)
	}
	if *update {
		if err := atomicfile.WriteFile("../../data/n2-vibronic.csv", fresh.format()); err != nil {
			t.Fatal(err)
		}
		return
	}
	shipped, err := parseVibronic(data.Vibronic())
	if err != nil {
		t.Fatal(err)
	}
	if shipped.recipe != fresh.recipe {
		t.Fatalf("shipped recipe %q, program's %q: run the test with -update", shipped.recipe, fresh.recipe)
	}
	tol := 0.0
	if runtime.GOARCH != "amd64" {
		tol = 1e-12
	}
	s, f := shipped.pointers(), fresh.pointers()
	for i := range s {
		if d := math.Abs(*s[i] - *f[i]); d > tol*math.Abs(*f[i]) {
			t.Errorf("%s: shipped %.17g, fresh %.17g", vibronicFields[i], *s[i], *f[i])
		}
	}
	// and the laser path reads exactly these values
	lp, err := Laser(units.Atmosphere, 300)
	if err != nil {
		t.Fatal(err)
	}
	if lp.EinsteinA00 != shipped.a00 || lp.UpperLifetime != shipped.tau || lp.UpperShare != shipped.fC || lp.UpperShare1 != shipped.fC1 || lp.LowerShare != shipped.fB {
		t.Errorf("Laser gives A00 %g, τ %g, f_C %g, f_B %g; table %+v", lp.EinsteinA00, lp.UpperLifetime, lp.UpperShare, lp.LowerShare, shipped)
	}
}

// TestVibronicRoundTrip checks that format and parseVibronic give back every bit.
func TestVibronicRoundTrip(t *testing.T) {
	t.Parallel()
	v := vibronic{recipe: "r", a00: 1.0 / 3, tau: 36.6e-9 * math.Pi, fC: 0.55 + 1e-16, fC1: 1e-300, fB: math.Nextafter(0.3, 1)}
	w, err := parseVibronic(v.format())
	if err != nil {
		t.Fatal(err)
	}
	if w != v {
		t.Errorf("round trip: %+v, want %+v", w, v)
	}
}

// TestVibronicErrors checks that a broken table is refused with a message naming the row.
func TestVibronicErrors(t *testing.T) {
	t.Parallel()
	good := vibronic{recipe: "r", a00: 1, tau: 2, fC: 0.5, fC1: 0.3, fB: 0.4}.format()
	cases := []struct{ text, want string }{
		{strings.Replace(string(good), "share_b0,0.4\n", "", 1), "share_b0 missing"},
		{strings.Replace(string(good), "share_b0,0.4", "share_b0,-1", 1), "share_b0"},
		{strings.Replace(string(good), "share_b0,0.4", "share_x,0.4", 1), "unknown name"},
		{string(good) + "share_c0,0.5\n", "twice"},
		{string(good) + "nonsense\n", "name,value"},
	}
	for _, c := range cases {
		if _, err := parseVibronic([]byte(c.text)); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("error %v, want one containing %q", err, c.want)
		}
	}
}

// TestVibronicStaleRecipe checks that a table made from other constants is not taken: the recipe
// changes with one byte of the constants text and with the grid.
func TestVibronicStaleRecipe(t *testing.T) {
	t.Parallel()
	text := data.Spectroscopy()
	r := vibronicRecipe(text, DefaultGrid, RKRCurve)
	other := append(append([]byte(nil), text...), ' ')
	if vibronicRecipe(other, DefaultGrid, RKRCurve) == r {
		t.Error("recipe ignores the constants text")
	}
	g := DefaultGrid
	g.N++
	if vibronicRecipe(text, g, RKRCurve) == r || vibronicRecipe(text, DefaultGrid, MorseCurve) == r {
		t.Error("recipe ignores the grid or the curve")
	}
}
