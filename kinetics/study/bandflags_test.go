package study

import (
	"context"
	"strings"
	"testing"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// flagRunner is bandRunner with the two width flags: a sample whose C(0)–N₂ quenching constant
// lies in the top fifth of its range (1.4–1.5e-17) makes two separate pulses, and every sample
// above 125 Torr has an ill-conditioned FWHM. Made-up figures.
func flagRunner(d *design.Design) (kinetics.Summary, error) {
	s, err := bandRunner(d)
	if err != nil {
		return s, err
	}
	s.Pulses = 1
	if d.Levels.UpperQuenchingNitrogen > 1.4e-17 {
		s.Pulses = 2
	}
	s.FWHM = 1e-9
	s.FWHMIllConditioned = d.Gas.Pressure/units.Torr > 125
	return s, nil
}

// TestSweepBandsWidthFlags: a sweep with --uncertainty counts per point the samples with
// separate pulses and with an ill-conditioned FWHM (band_separate_pulses,
// band_fwhm_ill_conditioned) and says so in band_note. The Latin hypercube puts one of the 20
// samples in each twentieth of the quenching constant's range (uniform 1.0–1.5e-17), so 4
// samples lie above 1.4e-17 at every point; at 50 Torr 2 samples fail (bandRunner) and failed
// samples count in neither: with seed 3 one of them is among those 4, leaving 3 of 18.
func TestSweepBandsWidthFlags(t *testing.T) {
	t.Parallel()
	s := bandSweep(t, t.TempDir(), 2)
	s.Runner = flagRunner
	tab, err := s.Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	cs, ci, cn := tab.Column(BandSeparatePulsesColumn), tab.Column(BandIllConditionedColumn), tab.Column(BandNoteColumn)
	if cs < 0 || ci < 0 || cn < 0 {
		t.Fatalf("columns %v: want %s, %s, %s", tab.Columns, BandSeparatePulsesColumn, BandIllConditionedColumn, BandNoteColumn)
	}
	for r, p := range []float64{50, 100, 150, 200} {
		sep, ill, note := tab.Rows[r][cs], tab.Rows[r][ci], tab.Rows[r][cn]
		ran := tab.Rows[r][tab.Column(BandSamplesColumn)]
		wantIll := "0"
		if p > 125 {
			wantIll = ran
		}
		wantSep := "4"
		if p == 50 {
			wantSep = "3"
		}
		if sep != wantSep {
			t.Errorf("%g Torr: %s of %s samples with separate pulses, want %s", p, sep, ran, wantSep)
		}
		if ill != wantIll {
			t.Errorf("%g Torr: %s samples with an ill-conditioned FWHM, want %s", p, ill, wantIll)
		}
		if sep != "0" && !strings.Contains(note, sep+" of "+ran+" samples make separate pulses") {
			t.Errorf("%g Torr: note %q lacks the %s samples with separate pulses", p, note, sep)
		}
		if hasIll := strings.Contains(note, "have an ill-conditioned FWHM"); hasIll != (p > 125) {
			t.Errorf("%g Torr: note %q: ill-conditioned clause %v, want %v", p, note, hasIll, p > 125)
		}
	}
	// Without the flags (bandRunner) both columns hold 0 and the 100 Torr note stays empty.
	plain, err := bandSweep(t, t.TempDir(), 2).Run(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	for r := range plain.Rows {
		if a, b := plain.Rows[r][plain.Column(BandSeparatePulsesColumn)], plain.Rows[r][plain.Column(BandIllConditionedColumn)]; a != "0" || b != "0" {
			t.Errorf("row %d without flags: %s, %s; want 0, 0", r, a, b)
		}
	}
	if note := plain.Rows[1][plain.Column(BandNoteColumn)]; note != "" {
		t.Errorf("100 Torr without flags: note %q, want none", note)
	}
}
