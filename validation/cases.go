package validation

import (
	"fmt"

	"n2pulse/units"
)

// CaseInfo describes one experiment case for a reader of a report: which kind of laser the
// model has been compared with, without running it.
type CaseInfo struct {
	Name       string  // case name, "tea-transfer-88mm-v1"
	Topology   string  // circuit topology: "blumlein" or "transfer"
	Pressure   float64 // gas pressure [Pa]
	Length     float64 // channel length [m]
	Mirror     bool    // a rear or front reflectivity above zero
	SourceKind string  // how the source was published ("builder's report, not peer reviewed")
}

// Laser describes the case in words: "atmospheric charge-transfer laser, 8.8 cm, no mirror".
func (c CaseInfo) Laser() string {
	p := "atmospheric"
	if c.Pressure < 0.5*units.Atmosphere {
		p = fmt.Sprintf("reduced-pressure (%.3g Torr)", c.Pressure/units.Torr)
	}
	t := "Blumlein"
	if c.Topology == "transfer" {
		t = "charge-transfer laser"
	}
	m := "no mirror"
	if c.Mirror {
		m = "with a mirror"
	}
	return fmt.Sprintf("%s %s, %.3g cm, %s", p, t, 100*c.Length, m)
}

// Cases lists the experiment cases the registry compares the model with, read from the
// embedded case files.
func Cases() ([]CaseInfo, error) {
	cs, err := loadExperiments(experimentFiles)
	if err != nil {
		return nil, err
	}
	out := make([]CaseInfo, len(cs))
	for i, c := range cs {
		d := c.Design
		out[i] = CaseInfo{Name: c.Name, Topology: string(d.Circuit.Topology), Pressure: d.Gas.Pressure, Length: d.Channel.Length,
			Mirror: d.Optics.RearReflectivity > 0 || d.Optics.FrontReflectivity > 0, SourceKind: c.Measured.Kind}
	}
	return out, nil
}
