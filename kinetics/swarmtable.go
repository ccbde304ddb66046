package kinetics

import (
	"fmt"
	"os"
	"sync"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/swarm"
)

// userTables caches swarm tables read from files, keyed by path and modification time, so a
// sweep reads a user table once.
var userTables sync.Map

// swarmTable returns the table for the design: the user's file when numerics.swarm_table
// names one, else the built-in or solved table for the gas mixture and the cross-section set
// of numerics.cross_sections.
func swarmTable(d *design.Design, cacheDir string) (*swarm.Table, error) {
	path := d.Numerics.SwarmTable
	if path == "" {
		t, err := swarm.ForMixtureSet(d.Numerics.CrossSections, d.Gas.Nitrogen, d.Gas.Oxygen, d.Gas.Helium, cacheDir)
		if err != nil {
			return nil, fmt.Errorf("kinetics: swarm table for the mixture: %w", err)
		}
		return t, nil
	}
	info, err := os.Stat(path)
	if err != nil {
		return nil, &design.KeyError{Key: "numerics.swarm_table", Value: path, Problem: err.Error()}
	}
	key := fmt.Sprintf("%s\x00%d\x00%d", path, info.ModTime().UnixNano(), info.Size())
	if t, ok := userTables.Load(key); ok {
		return t.(*swarm.Table), nil
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &design.KeyError{Key: "numerics.swarm_table", Value: path, Problem: err.Error()}
	}
	defer f.Close()
	t, err := swarm.ReadCSV(f, path)
	if err != nil {
		return nil, &design.KeyError{Key: "numerics.swarm_table", Value: path, Problem: err.Error()}
	}
	userTables.Store(key, t)
	return t, nil
}
