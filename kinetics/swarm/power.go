package swarm

import "strings"

// Channel is a group of electron collision processes that the power the electrons take from
// the field is split into: where the energy deposited in a discharge goes.
type Channel int

// The channels of a power split. The electronic triplet states that feed and drain the laser
// levels (A, B, W, B′, C) have channels of their own; the other electronic excitations of
// every species (singlets, E, dissociation, the O₂ states) share one.
const (
	ChannelElastic         Channel = iota // elastic recoil (momentum transfer)
	ChannelVibrational                    // vibrational excitation of N₂ and O₂ (and rotational, where a set has it)
	ChannelA                              // N₂ A³Σu⁺
	ChannelB                              // N₂ B³Πg (all v)
	ChannelW                              // N₂ W³Δu
	ChannelBPrime                         // N₂ B′³Σu⁻
	ChannelC                              // N₂ C³Πu (all v)
	ChannelOtherElectronic                // every other electronic excitation and dissociation
	ChannelIonisation                     // ionisation, with the energy given to the new electrons
	ChannelAttachment                     // energy carried away by attached electrons
	NumChannels
)

var channelNames = [NumChannels]string{"elastic", "vibrational", "A", "B", "W", "Bp", "C", "other", "ion", "att"}

// String returns the channel's short name, as in the CSV column power_<name>_eV_m3_s.
func (c Channel) String() string {
	if c < 0 || c >= NumChannels {
		return "unknown"
	}
	return channelNames[c]
}

// channelOf returns the channel of a process of the given species, kind and label.
func channelOf(species string, k Kind, label string) Channel {
	switch k {
	case Elastic:
		return ChannelElastic
	case Ionisation:
		return ChannelIonisation
	case Attachment:
		return ChannelAttachment
	}
	if strings.HasPrefix(label, "vib") || label == "rot" { // rotation counted with vibration
		return ChannelVibrational
	}
	if species == "N2" {
		switch label {
		case "A":
			return ChannelA
		case "B":
			return ChannelB
		case "W":
			return ChannelW
		case "Bp":
			return ChannelBPrime
		case "C":
			return ChannelC
		}
	}
	return ChannelOtherElectronic
}
