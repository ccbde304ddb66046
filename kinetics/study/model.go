package study

import (
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// MemoryRunner is ModelRunner with a memory limit [bytes] for each point's run
// (kinetics.RunSettings.MemoryLimit; 0 means the default): a sweep computing W points at once
// gives each a W-th of the memory it may use.
func MemoryRunner(limit int64) Runner {
	return func(d *design.Design) (kinetics.Summary, error) {
		r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true, MemoryLimit: limit})
		if err != nil {
			return kinetics.Summary{}, err
		}
		return r.Summary, nil
	}
}

// ModelRunner runs the full model on d (kinetics.Run without waveforms) and keeps only the
// figures of merit.
func ModelRunner(d *design.Design) (kinetics.Summary, error) {
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		return kinetics.Summary{}, err
	}
	return r.Summary, nil
}
