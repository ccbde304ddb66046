package kinetics

import (
	"n2pulse/kinetics/design"
	"n2pulse/kinetics/swarm"
	"n2pulse/units"
)

// account fills the energy account of a shot and the loading figures derived from it: where
// the stored energy went, the energy per discharge volume and per molecule, and the peak
// current density.
//
// The plasma energy is the integrator's exact ∫V·I_p dt; its split follows the shares of the
// samples (each optical step's plasma power times the swarm's channel shares at that
// moment's E/N), scaled to that exact total, so the parts add up to it to rounding.
func account(d *design.Design, p *Parameters, wf *waveforms, s *Summary) {
	ch := d.Channel
	volume := ch.Length * ch.Width * ch.Gap
	a := &s.Energy
	a.Stored = wf.stored
	a.Switch, a.Shunt, a.Plasma, a.LeftInCircuit = wf.switchLoss, wf.shuntLoss, wf.deposited, wf.left
	if wf.split && wf.plasmaSampled > 0 {
		f := wf.deposited / wf.plasmaSampled
		e := wf.plasmaSplit
		a.PlasmaSplit = PlasmaSplit{
			Elastic: f * e[swarm.ChannelElastic], Vibrational: f * e[swarm.ChannelVibrational],
			StateA: f * e[swarm.ChannelA], StateB: f * e[swarm.ChannelB], StateW: f * e[swarm.ChannelW],
			StateBPrime: f * e[swarm.ChannelBPrime], StateC: f * e[swarm.ChannelC],
			OtherElectronic: f * e[swarm.ChannelOtherElectronic],
			Ionisation:      f * e[swarm.ChannelIonisation], Attachment: f * e[swarm.ChannelAttachment],
		}
	}
	pumped := 0.0 // ∫P_C dt at mid-channel [m⁻³]
	for _, pc := range wf.pumpC {
		pumped += pc * p.TimeStep
	}
	a.UpperLevel = pumped * volume * p.UpperEnergy
	a.Laser = s.EnergyTotal
	if volume > 0 {
		s.SpecificEnergy = wf.deposited / volume
		if p.GasDensity > 0 {
			s.EnergyPerMolecule = s.SpecificEnergy / p.GasDensity / units.ElectronVolt
		}
	}
	if foot := ch.Length * ch.Width; foot > 0 {
		s.PeakCurrentDensity = wf.peakCurrent / foot
	}
}

// sum returns the sum of the parts of the plasma split [J].
func (p PlasmaSplit) sum() float64 {
	return p.Elastic + p.Vibrational + p.StateA + p.StateB + p.StateW + p.StateBPrime + p.StateC +
		p.OtherElectronic + p.Ionisation + p.Attachment
}
