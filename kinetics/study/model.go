package study

import (
	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
)

// ModelRunner runs the full model on d (kinetics.Run without waveforms) and keeps only the
// figures of merit.
func ModelRunner(d *design.Design) (kinetics.Summary, error) {
	r, err := kinetics.Run(d, &kinetics.RunSettings{Light: true})
	if err != nil {
		return kinetics.Summary{}, err
	}
	return r.Summary, nil
}
