package kinetics

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"n2pulse/kinetics/design"
	"n2pulse/units"
)

// hostileCellStepBound skips a design whose optical grid needs more cell updates than this
// (cells² · c · end time / length): the test is about inputs at the edges, not about speed or
// the memory limit, and such a design takes minutes.
const hostileCellStepBound = 2e7

// hostileValues returns, for a numeric key, its ends, values just outside them, 0 and a middle
// value: the inputs at and just beyond every edge of the key's allowed range.
func hostileValues(key string) []float64 {
	lo, hi, _, _ := design.KeyRange(key)
	v := []float64{lo, 0}
	if lo > 0 {
		v = append(v, lo*(1-1e-6), math.Sqrt(lo*min(hi, 1e300)))
	} else {
		v = append(v, -1e-6*max(1, math.Abs(lo)), lo-1e-6*max(1, math.Abs(lo)))
		if !math.IsInf(hi, 1) {
			v = append(v, (lo+hi)/2)
		}
	}
	if !math.IsInf(hi, 1) {
		v = append(v, hi, hi*(1+1e-6))
	}
	return v
}

// TestHostileDesigns runs the example at and just outside the range of every numeric key,
// with a small grid: each design gives a result whose energy and photon balances close within
// 1e-3, or an error that names a design key; none panics. The counts are logged (go test -v).
func TestHostileDesigns(t *testing.T) {
	if testing.Short() {
		t.Skip("runs about a hundred small shots")
	}
	t.Parallel()
	cache := t.TempDir()
	var ran, bySet, byValidate, byRun, skipped, total int
	for _, key := range design.Keys() {
		if _, _, _, numeric := design.KeyRange(key); !numeric {
			continue
		}
		unit, _ := design.KeyUnit(key)
		for _, v := range hostileValues(key) {
			total++
			text := strconv.FormatFloat(v, 'g', -1, 64)
			if unit != "" && v != 0 {
				text += " " + unit
			}
			name := fmt.Sprintf("%s=%s", key, text)
			d := design.ExampleDesign()
			if err := d.Set("numerics.cells", "8"); err != nil {
				t.Fatal(err)
			}
			if err := d.Set(key, text); err != nil {
				bySet++
				var ke *design.KeyError
				if !errors.As(err, &ke) || ke.Key != key {
					t.Errorf("%s: Set error does not name the key: %v", name, err)
				}
				continue
			}
			err := d.BalanceMixture([]string{key})
			if err == nil {
				err = d.Validate()
			}
			if err != nil {
				byValidate++
				if !namesKey(err) {
					t.Errorf("%s: Validate error names no key: %v", name, err)
				}
				continue
			}
			cells := float64(d.Numerics.Cells)
			if cells*cells*units.SpeedOfLight*d.Numerics.EndTime/d.Channel.Length > hostileCellStepBound {
				skipped++
				continue
			}
			res, err := runNoPanic(d, &RunSettings{Light: true, CacheDir: cache})
			if err != nil {
				byRun++
				t.Logf("%s: refused by Run: %v", name, err)
				if !namesKey(err) {
					t.Errorf("%s: Run error names no key: %v", name, err)
				}
				continue
			}
			ran++
			s := res.Summary
			if !(s.EnergyBalanceResidual < 1e-3) || !(s.PhotonBalanceResidual < 1e-3) {
				t.Errorf("%s: balance residuals %g (energy), %g (photons), want < 1e-3", name, s.EnergyBalanceResidual, s.PhotonBalanceResidual)
			}
		}
	}
	t.Logf("%d hostile designs: %d ran, %d refused by Set, %d by the mixture rule or Validate, %d by Run, %d skipped (more than %.0g cell updates)",
		total, ran, bySet, byValidate, byRun, skipped, hostileCellStepBound)
	if total < 200 {
		t.Errorf("only %d hostile designs, want at least 200", total)
	}
}

// runNoPanic runs d and turns a panic into a test-visible error.
func runNoPanic(d *design.Design, s *RunSettings) (res *Result, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("PANIC: %v", r)
		}
	}()
	return Run(d, s)
}

// namesKey reports whether an error names a design key: a *design.KeyError, or a message
// that contains a dotted key.
func namesKey(err error) bool {
	var ke *design.KeyError
	if errors.As(err, &ke) {
		return true
	}
	for _, k := range design.Keys() {
		if strings.Contains(err.Error(), k) {
			return true
		}
	}
	return false
}
