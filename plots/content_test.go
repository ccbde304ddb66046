package plots

import (
	"image/png"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
)

// mark is one coloured path of an SVG figure: a data series, a marker or a legend sample
// (black axes, grey grid lines and the white background are left out).
type mark struct {
	line     bool // a stroked polyline (else a filled glyph)
	vertices int  // points of the path
}

var pathElement = regexp.MustCompile(`<path d="([^"]*)" style="([^"]*)"`)

// svgMarks lists the coloured paths of an SVG file in drawing order.
func svgMarks(svg string) []mark {
	var out []mark
	for _, m := range pathElement.FindAllStringSubmatch(svg, -1) {
		d, style := m[1], m[2]
		colour := ""
		line := strings.Contains(style, "fill:none")
		for _, part := range strings.Split(style, ";") {
			if k, v, ok := strings.Cut(part, ":"); ok && ((line && k == "stroke") || (!line && k == "fill")) {
				colour = strings.ToUpper(v)
			}
		}
		if colour == "" || slices.Contains([]string{"#000000", "#808080", "#FFFFFF", "NONE"}, colour) {
			continue
		}
		out = append(out, mark{line: line, vertices: strings.Count(d, "M") + strings.Count(d, "L")})
	}
	return out
}

// pngSize returns the pixel size of a PNG file.
func pngSize(t *testing.T, path string) (w, h int) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return img.Bounds().Dx(), img.Bounds().Dy()
}

// The overlay figure shows its title, axis labels and legend, one model line through the
// model's finite points only (the NaN left out), a marker per model point and one per
// measured point, plus the legend's samples; the PNG is 16 cm × 11 cm at 150 dpi.
func TestOverlayFigureContent(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	d := OverlayData{
		Title: "energy against gap", XLabel: "gap [mm]", YLabel: "energy [µJ]",
		ModelLabel: "model run", MeasuredLbl: "bench log",
		ModelX: []float64{1, 1.5, 2, 2.5}, ModelY: []float64{10, 20, math.NaN(), 25},
		MeasuredX: []float64{1.55, 1.8}, MeasuredY: []float64{34, 30},
	}
	for _, name := range []string{"o.svg", "o.png"} {
		if err := Overlay(filepath.Join(dir, name), d); err != nil {
			t.Fatal(err)
		}
	}
	b, err := os.ReadFile(filepath.Join(dir, "o.svg"))
	if err != nil {
		t.Fatal(err)
	}
	text := svgText(string(b))
	for _, w := range []string{"energy against gap", "gap [mm]", "energy [µJ]", "model run", "bench log"} {
		if !strings.Contains(text, w) {
			t.Errorf("no %q in the figure's text:\n%s", w, text)
		}
	}
	var lines []int
	glyphs := 0
	for _, m := range svgMarks(string(b)) {
		if m.line {
			lines = append(lines, m.vertices)
		} else {
			glyphs++
		}
	}
	// The model line through 3 finite points, then the legend's 2-point sample.
	if !slices.Equal(lines, []int{3, 2}) {
		t.Errorf("coloured lines with %v points, want [3 2] (model line, legend sample)", lines)
	}
	// 3 model markers + 2 measured markers + 1 legend marker.
	if glyphs != 6 {
		t.Errorf("%d coloured markers, want 6", glyphs)
	}
	// 16 cm and 11 cm at 150 dpi: 16/2.54·150 = 944.9, 11/2.54·150 = 649.6 pixels.
	if w, h := pngSize(t, filepath.Join(dir, "o.png")); math.Abs(float64(w)-944.9) > 1 || math.Abs(float64(h)-649.6) > 1 {
		t.Errorf("PNG %d × %d pixels, want 945 × 650", w, h)
	}
}

// The spectrum figure draws the sticks as one polyline that rises and falls at each stick
// (3 points per stick) and the profile through its points, each with a legend sample and
// entry; the PNG is 16 cm × 11 cm at 150 dpi.
func TestSpectrumFigureContent(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	d := SpectrumData{Title: "second positive band", XLabel: "wavelength [nm]", YLabel: "relative intensity",
		StickX: []float64{336.5, 337.0, 337.1, 337.2}, StickY: []float64{0.5, 1, 0.2, 0.1},
		ProfileX: []float64{336, 336.5, 337, 337.5, 338, 338.5}, ProfileY: []float64{0, 0.5, 1, 0.2, 0, 0}}
	for _, name := range []string{"s.svg", "s.png"} {
		if err := Spectrum(filepath.Join(dir, name), d); err != nil {
			t.Fatal(err)
		}
	}
	b, err := os.ReadFile(filepath.Join(dir, "s.svg"))
	if err != nil {
		t.Fatal(err)
	}
	text := svgText(string(b))
	for _, w := range []string{"second positive band", "wavelength [nm]", "relative intensity", "lines", "broadened"} {
		if !strings.Contains(text, w) {
			t.Errorf("no %q in the figure's text:\n%s", w, text)
		}
	}
	var lines []int
	for _, m := range svgMarks(string(b)) {
		if m.line {
			lines = append(lines, m.vertices)
		}
	}
	// Sticks 4 × 3 points, profile 6 points, then the two legend samples.
	if !slices.Equal(lines, []int{12, 6, 2, 2}) {
		t.Errorf("coloured lines with %v points, want [12 6 2 2]", lines)
	}
	// 16 cm and 11 cm at 150 dpi, as the overlay.
	if w, h := pngSize(t, filepath.Join(dir, "s.png")); math.Abs(float64(w)-944.9) > 1 || math.Abs(float64(h)-649.6) > 1 {
		t.Errorf("PNG %d × %d pixels, want 945 × 650", w, h)
	}
}

// The pulse report names every panel's quantity in words with its display unit, zooms the
// power panel on the pulse, names both ends and the half-maximum width, and draws the six
// whole-run series of the demo shot through all of its 600 samples — except the electron
// density, whose zero sample is left off the log axis — plus the zoomed output traces.
func TestPulseReportContent(t *testing.T) {
	t.Parallel()
	path := filepath.Join(t.TempDir(), "pulse.svg")
	if err := PulseReport(path, demoPulse()); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	text := svgText(string(b))
	for _, want := range []string{"demo shot", "channel voltage [kV]", "current [kA]", "E/N [Td]",
		"nₑ [1/cm³]", "upper level C", "lower level B", "time after switch closure [ns]",
		"zoomed on the pulse", "output power [kW]", "half maximum, output end: 1 ns",
		"output end (z = L)", "rear end (z = 0)"} {
		if !strings.Contains(text, want) {
			t.Errorf("pulse report text lacks %q", want)
		}
	}
	for _, raw := range []string{"_s", "_J", "_W", "e+", "[V]", "[A]", "[W]", "[s]"} {
		if strings.Contains(text, raw) {
			t.Errorf("pulse report text holds %q (a raw key or SI notation)", raw)
		}
	}
	whole, skipped, zoomed := 0, 0, 0
	for _, m := range svgMarks(string(b)) {
		switch {
		case !m.line:
		case m.vertices == 600:
			whole++
		case m.vertices == 599:
			skipped++
		case m.vertices > 50:
			zoomed++
		}
	}
	if whole != 5 || skipped != 1 {
		t.Errorf("whole-run series: %d with 600 points and %d with 599, want 5 and 1 (n_e's zero left out)", whole, skipped)
	}
	if zoomed < 2 {
		t.Errorf("zoomed power traces: %d, want both ends (≥ 2)", zoomed)
	}
}
