package validation

import (
	"bytes"
	"fmt"
	"math"
	"strings"
)

// DerivedRow is one check that a case derives from a measured variation (the position of an
// optimum, the ratio of two points, the direction of a change, the shift of an optimum
// between cases), computed once per apparatus alternative by the same code as the default
// check (derivedChecks on the alternative's scan).
type DerivedRow struct {
	// Nominal is the default check (common block): its reference, tolerance, source and the
	// nominal value.
	Nominal Check
	// Low and High are the smallest and largest computed value over the alternatives, in the
	// check's unit; NaN when none ran, and for checks that only hold or not (Mode True).
	Low, High float64
	Runs      []DerivedRun // one per alternative, in the order of the case's alternatives
}

// DerivedRun is one alternative's value of a derived check.
type DerivedRun struct {
	Alternative string
	Check       Check // the check computed under the alternative; Err when a run failed
}

// Passing counts the alternatives under which the check passes and those under which it ran.
func (d DerivedRow) Passing() (pass, ran int) {
	for _, r := range d.Runs {
		if r.Check.Err == nil {
			ran++
			if r.Check.Pass() {
				pass++
			}
		}
	}
	return pass, ran
}

// MeasuredPosition says where the measurement lies against the alternatives' range: for a
// measured range (Mode Range) "overlaps", "below" or "above"; for a measured value "inside",
// "below" or "above"; "" for a check that only holds or not, or when no alternative ran.
func (d DerivedRow) MeasuredPosition() string {
	c := d.Nominal
	switch c.Mode {
	case True:
		return ""
	case Range:
		switch p := position(c.Low, d.Low, d.High); {
		case p == "" || p == "above":
			return p
		case position(c.High, d.Low, d.High) == "below":
			return "below"
		}
		return "overlaps"
	}
	return position(c.Reference, d.Low, d.High)
}

// MeasuredText is the measurement as the tables print it: the measured range, the value and
// its tolerance, or "holds" for a check that holds or not.
func (d DerivedRow) MeasuredText() string {
	c := d.Nominal
	switch c.Mode {
	case Range, True:
		return c.ToleranceText()
	}
	return strings.TrimSpace(fmt.Sprintf("%.4g %s", c.Reference, c.Unit)) + " " + c.ToleranceText()
}

// addDerived computes, after their runs, the derived checks of every alternative's scans
// (plans, grouped by alternative name) and adds them to the rows, with the nominal checks of
// the experiments group.
func addDerived(rows []*EnvelopeRow, altNames []string, plans map[string][]*scanPlan) {
	if len(altNames) == 0 {
		return
	}
	byAlt := map[string][]Check{}
	for _, name := range altNames {
		byAlt[name], _ = derivedChecks(plans[name])
	}
	nominal := map[string]Check{}
	for _, c := range experimentResults().checks {
		nominal[c.ID] = c
	}
	nan := math.NaN()
	for _, r := range rows {
		prefix := "exp." + r.Case + "."
		index := map[string]int{}
		for _, a := range r.Runs {
			for _, c := range byAlt[a.Name] {
				rest, ok := strings.CutPrefix(c.ID, prefix)
				if !ok || strings.Count(rest, ".") != 1 {
					continue // another case's check
				}
				k, seen := index[c.ID]
				if !seen {
					nom, ok := nominal[c.ID]
					if !ok {
						nom = c
						nom.Computed, nom.Err = nan, fmt.Errorf("validation: apparatus: no default check %s", c.ID)
					}
					k = len(r.Derived)
					index[c.ID] = k
					r.Derived = append(r.Derived, DerivedRow{Nominal: nom, Low: nan, High: nan})
				}
				d := &r.Derived[k]
				d.Runs = append(d.Runs, DerivedRun{Alternative: a.Name, Check: c})
				if c.Err == nil && c.Mode != True {
					d.Low, d.High = widen(d.Low, d.High, c.Computed)
				}
			}
		}
	}
}

// ValueText is a check's computed value as the apparatus tables print it: "0.008004",
// "1.991 mm", "holds" or "does not hold" for a check that holds or not, "error: …".
func ValueText(c Check) string {
	switch {
	case c.Err != nil:
		return "error: " + c.Err.Error()
	case c.Mode == True && c.Pass():
		return "holds"
	case c.Mode == True:
		return "does not hold"
	case math.IsNaN(c.Computed):
		return "–"
	}
	return strings.TrimSpace(fmt.Sprintf("%.4g %s", c.Computed, c.Unit))
}

// RangeText is the alternatives' range as the tables print it: "0.003 – 0.15", "1.4 – 2.3 mm",
// "–" when there is none (or the check only holds or not).
func (d DerivedRow) RangeText() string {
	if math.IsNaN(d.Low) || math.IsNaN(d.High) {
		return "–"
	}
	return strings.TrimSpace(fmt.Sprintf("%.4g – %.4g %s", d.Low, d.High, d.Nominal.Unit))
}

// writeDerived writes the report's table of the derived checks over the apparatus
// alternatives (nothing when no case has one): one summary row per check, then every
// alternative's value.
func writeDerived(w *bytes.Buffer, rows []EnvelopeRow) {
	if DerivedCount(rows) == 0 {
		return
	}
	fmt.Fprintf(w, "\nChecks derived from the measured variations (optimum, ratio, direction, optimum shift), each alternative's scan run as the default check runs it:\n\n")
	fmt.Fprintf(w, "| check | measured | nominal | alternatives min–max | measured lies | alternatives passing |\n| --- | --- | --- | --- | --- | --- |\n")
	for _, r := range rows {
		for _, d := range r.Derived {
			pass, ran := d.Passing()
			fmt.Fprintf(w, "| %s | %s | %s | %s | %s | %d of %d |\n", d.Nominal.ID, mdCell(d.MeasuredText()), mdCell(ValueText(d.Nominal)),
				d.RangeText(), dash(d.MeasuredPosition()), pass, ran)
		}
	}
	fmt.Fprintf(w, "\n| check | alternative | computed | result |\n| --- | --- | --- | --- |\n")
	for _, r := range rows {
		for _, d := range r.Derived {
			for _, a := range d.Runs {
				fmt.Fprintf(w, "| %s | %s | %s | %s |\n", d.Nominal.ID, a.Alternative, mdCell(ValueText(a.Check)), a.Check.Result())
			}
		}
	}
}

// DerivedCount is the number of derived checks over all the rows' cases.
func DerivedCount(rows []EnvelopeRow) int {
	n := 0
	for _, r := range rows {
		n += len(r.Derived)
	}
	return n
}
