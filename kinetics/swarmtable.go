package kinetics

import (
	"fmt"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/swarm"
)

// swarmTable returns the table for the design: the user's file when numerics.swarm_table
// names one (read once per process by swarm.Load), else the built-in or solved table for the
// gas mixture and the cross-section set of numerics.cross_sections.
func swarmTable(d *design.Design, cacheDir string) (*swarm.Table, error) {
	path := d.Numerics.SwarmTable
	if path == "" {
		t, err := swarm.ForMixtureSet(d.Numerics.CrossSections, d.Gas.Nitrogen, d.Gas.Oxygen, d.Gas.Helium, cacheDir)
		if err != nil {
			return nil, fmt.Errorf("kinetics: swarm table for the mixture: %w", err)
		}
		return t, nil
	}
	t, err := swarm.Load(path)
	if err != nil {
		return nil, &design.KeyError{Key: "numerics.swarm_table", Value: path, Problem: err.Error()}
	}
	return t, nil
}
