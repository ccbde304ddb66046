package plots

import (
	"math"
	"os"
	"path/filepath"
	"testing"
)

// TestScoreboardFigure writes a PNG for points with and without a measured width, and refuses
// a file name that is neither .png nor .svg.
func TestScoreboardFigure(t *testing.T) {
	t.Parallel()
	dir := t.TempDir()
	pts := []ScorePoint{{0.09, 2.5, math.NaN()}, {0.11, 1.5, math.NaN()}, {2.5, 6.8, 1.5}}
	path := filepath.Join(dir, "s.png")
	if err := Scoreboard(path, pts); err != nil {
		t.Fatal(err)
	}
	if st, err := os.Stat(path); err != nil || st.Size() < 1000 {
		t.Errorf("figure missing or empty: %v", err)
	}
	if err := Scoreboard(filepath.Join(dir, "s.txt"), pts); err == nil {
		t.Error("a .txt figure was accepted")
	}
}
