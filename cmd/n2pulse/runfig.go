package main

import (
	"path/filepath"

	"n2pulse/kinetics"
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/study"
	"n2pulse/plots"
)

// writeRunFigures draws the pulse report and the gain map of one shot as PNG and SVG; env, when
// not nil, is shaded on the output power.
func writeRunFigures(dir string, d *design.Design, r *kinetics.Result, env *study.Envelope) error {
	pd := runPulseData(d, r, env)
	for _, ext := range []string{".png", ".svg"} {
		if err := plots.PulseReport(filepath.Join(dir, "pulse-report"+ext), pd); err != nil {
			return err
		}
		if err := plots.GainMapEnds(filepath.Join(dir, "gain-map"+ext), r.Z, r.GainTime, r.Gain,
			plots.Ends{Rear: d.Optics.RearReflectivity, Front: d.Optics.FrontReflectivity}); err != nil {
			return err
		}
	}
	return nil
}

// runPulseData is the pulse report's data of one shot: its waveforms, the half-maximum
// crossings, and the flags of its summary the half-maximum mark shows (separate pulses, an
// ill-conditioned width); env, when not nil, is the band shaded on the output power.
func runPulseData(d *design.Design, r *kinetics.Result, env *study.Envelope) plots.PulseData {
	pd := plots.PulseData{
		Title:           d.Name,
		Time:            r.Time,
		ChannelVoltage:  r.ChannelVoltage,
		Current:         r.Current,
		ReducedField:    r.ReducedField,
		ElectronDensity: r.ElectronDensity,
		UpperLevel:      r.UpperLevel,
		LowerLevel:      r.LowerLevel,
		PowerFront:      r.PowerFront,
		PowerRear:       r.PowerRear,
	}
	pd.FWHMStart, pd.FWHMEnd = plots.HalfMaxCrossings(r.Time, r.PowerFront)
	pd.Pulses = r.Summary.Pulses
	pd.FWHMIllConditioned, pd.FWHMAt45, pd.FWHMAt55 = r.Summary.FWHMIllConditioned, r.Summary.FWHMAt45, r.Summary.FWHMAt55
	pd.DetectorResponse = r.Summary.DetectorResponse
	pd.RearReflectivity, pd.FrontReflectivity = d.Optics.RearReflectivity, d.Optics.FrontReflectivity
	if env != nil {
		pd.Band = &plots.PowerBand{Time: env.Time, Low: env.P05, High: env.P95, Samples: env.Samples}
	}
	return pd
}
