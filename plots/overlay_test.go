package plots

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"testing"
)

// Overlay writes a PNG through a temporary file and leaves none behind (the figure's content
// is checked in TestOverlayFigureContent).
func TestOverlayWritesPNG(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	path := filepath.Join(dir, "gap.png")
	err := Overlay(path, OverlayData{
		Title: "energy against gap", XLabel: "gap [mm]", YLabel: "energy [µJ]",
		ModelX: []float64{1, 1.5, 2}, ModelY: []float64{10, 20, math.NaN()},
		MeasuredX: []float64{1.55}, MeasuredY: []float64{34},
	})
	if err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	// PNG signature (ISO/IEC 15948, section 5.2).
	if !bytes.HasPrefix(b, []byte("\x89PNG\r\n\x1a\n")) {
		t.Errorf("not a PNG file")
	}
	left, _ := filepath.Glob(filepath.Join(dir, ".*"))
	if len(left) != 0 {
		t.Errorf("temporary files left: %v", left)
	}
}

func TestOverlayErrors(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	if err := Overlay(filepath.Join(dir, "a.png"), OverlayData{ModelX: []float64{1}}); err == nil {
		t.Error("unpaired model values accepted")
	}
	if err := Overlay(filepath.Join(dir, "a.jpg"), OverlayData{}); err == nil {
		t.Error("unknown format accepted")
	}
}
