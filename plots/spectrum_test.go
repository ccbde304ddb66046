package plots

import (
	"os"
	"path/filepath"
	"testing"
)

// Spectrum writes PNG and SVG, refuses other formats and unpaired sticks, and leaves no
// temporary files (the figure's content is checked in TestSpectrumFigureContent).
func TestSpectrumFiles(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	d := SpectrumData{Title: "test", XLabel: "x", YLabel: "y",
		StickX: []float64{1, 2, 3}, StickY: []float64{0.5, 1, 0.2},
		ProfileX: []float64{0, 1, 2, 3, 4}, ProfileY: []float64{0, 0.5, 1, 0.2, 0}}
	for _, name := range []string{"s.png", "s.svg"} {
		p := filepath.Join(dir, name)
		if err := Spectrum(p, d); err != nil {
			t.Fatal(err)
		}
		if st, err := os.Stat(p); err != nil || st.Size() == 0 {
			t.Errorf("%s not written: %v", name, err)
		}
	}
	if err := Spectrum(filepath.Join(dir, "s.gif"), d); err == nil {
		t.Error("no error for .gif")
	}
	d.StickY = d.StickY[:2]
	if err := Spectrum(filepath.Join(dir, "t.png"), d); err == nil {
		t.Error("no error for unpaired sticks")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("%d files in the folder, want 2 (no temporary files left)", len(ents))
	}
}
