package main

import (
	"bytes"
	"strings"
	"testing"

	"n2pulse/kinetics/study"
)

// TestSweepBandsWidthFlagLines: the sweep's uncertainty summary, its --json block and its report
// section count the points with samples of separate pulses and of an ill-conditioned FWHM
// (columns band_separate_pulses, band_fwhm_ill_conditioned), and say when no sample has
// either. Made-up table of three points: separate pulses at one, an ill-conditioned FWHM at two.
func TestSweepBandsWidthFlagLines(t *testing.T) {
	t.Parallel()
	tab := &study.Table{
		Columns: []string{study.MayNotLaseColumn, study.BandSeparatePulsesColumn, study.BandIllConditionedColumn, study.BandNoteColumn},
		Rows: [][]string{
			{"false", "0", "3", "3 of 10 samples have an ill-conditioned FWHM"},
			{"false", "2", "10", "2 of 10 samples make separate pulses; 10 of 10 samples have an ill-conditioned FWHM"},
			{"false", "0", "0", ""},
		},
	}
	b := sweepBands{Samples: 10, Seed: 1}
	var out bytes.Buffer
	printSweepBands(&out, tab, b)
	want := "FWHM band: samples with separate pulses at 1 of 3 points (column band_separate_pulses), samples with an ill-conditioned FWHM at 2 of 3 points (column band_fwhm_ill_conditioned)"
	if !strings.Contains(out.String(), want) || !strings.Contains(out.String(), "2 points flagged") {
		t.Errorf("summary lacks %q or the 2 flagged points:\n%s", want, out.String())
	}
	j := sweepBandBlock(tab, b, nil)
	if j.SeparatePulses != 1 || j.IllConditionedFWHM != 2 || j.Flagged != 2 {
		t.Errorf("json block: %d points with separate pulses, %d ill-conditioned, %d flagged; want 1, 2, 2", j.SeparatePulses, j.IllConditionedFWHM, j.Flagged)
	}
	sec := sweepBandSection(tab, b)
	if !strings.Contains(strings.Join(sec.Paragraphs, "\n"), want) {
		t.Errorf("report section lacks %q: %q", want, sec.Paragraphs)
	}
	// No sample with either flag: one line says so, the block counts 0.
	tab.Rows = tab.Rows[2:]
	out.Reset()
	printSweepBands(&out, tab, b)
	if !strings.Contains(out.String(), "no sample at any point makes separate pulses or an ill-conditioned FWHM") || strings.Contains(out.String(), "FWHM band:") {
		t.Errorf("clean summary:\n%s", out.String())
	}
	if j := sweepBandBlock(tab, b, nil); j.SeparatePulses != 0 || j.IllConditionedFWHM != 0 {
		t.Errorf("clean json block: %d, %d; want 0, 0", j.SeparatePulses, j.IllConditionedFWHM)
	}
}
