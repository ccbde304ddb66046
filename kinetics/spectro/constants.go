package spectro

import (
	"bytes"
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"

	"n2pulse/data"
)

// State holds the spectroscopic constants of one electronic state, in the units of the
// compilations: cm⁻¹ for term values and vibrational/rotational constants, Å for Re.
type State struct {
	Label        string  // spectroscopic symbol, "C³Πu"
	Lambda       int     // projection Λ of the electronic orbital angular momentum
	Multiplicity int     // 2S+1
	Te           float64 // electronic term value [cm⁻¹]
	We           float64 // ωe [cm⁻¹]
	WeXe         float64 // ωexe [cm⁻¹]
	WeYe         float64 // ωeye [cm⁻¹]
	WeZe         float64 // ωeze [cm⁻¹]
	Be           float64 // equilibrium rotational constant [cm⁻¹]
	AlphaE       float64 // αe [cm⁻¹]
	GammaE       float64 // γe [cm⁻¹]
	De           float64 // centrifugal distortion constant [cm⁻¹]
	Re           float64 // equilibrium internuclear distance [Å]
	A            float64 // spin–orbit constant [cm⁻¹] (documentation; not used in line positions)
}

// Constants is the parsed data set: states by name ("X", "A", "B", "C"), the C–B electronic
// transition moment and the collision-broadening coefficient.
type Constants struct {
	AtomicMass float64 // mass of one N atom [u]
	States     map[string]State
	// MomentCB is the constant C–B electronic transition moment |Re| [e·a₀].
	MomentCB float64
	// BroadeningFWHM is the collision FWHM per atmosphere at BroadeningTref [cm⁻¹ atm⁻¹].
	BroadeningFWHM float64
	// BroadeningTref is the reference temperature of BroadeningFWHM [K].
	BroadeningTref float64
	// BroadeningExponent is n in (T_ref/T)^n.
	BroadeningExponent float64
}

type tomlState struct {
	Label        string  `toml:"label"`
	Lambda       *int    `toml:"lambda"`
	Multiplicity *int    `toml:"multiplicity"`
	Te           float64 `toml:"Te"`
	We           float64 `toml:"we"`
	WeXe         float64 `toml:"wexe"`
	WeYe         float64 `toml:"weye"`
	WeZe         float64 `toml:"weze"`
	Be           float64 `toml:"Be"`
	AlphaE       float64 `toml:"alphae"`
	GammaE       float64 `toml:"gammae"`
	De           float64 `toml:"De"`
	Re           float64 `toml:"re"`
	A            float64 `toml:"A"`
}

type tomlFile struct {
	Molecule struct {
		AtomicMass float64 `toml:"atomic_mass_u"`
	} `toml:"molecule"`
	States     map[string]tomlState `toml:"states"`
	Transition struct {
		CB struct {
			Moment float64 `toml:"moment_ea0"`
		} `toml:"CB"`
	} `toml:"transition"`
	Broadening struct {
		FWHM     float64 `toml:"fwhm_cm_per_atm"`
		Tref     float64 `toml:"reference_temperature_K"`
		Exponent float64 `toml:"temperature_exponent"`
	} `toml:"broadening"`
}

// ParseConstants reads a constants file in the form of data/n2-constants.toml. Unknown keys and
// impossible values are errors that name the key.
func ParseConstants(text []byte) (*Constants, error) {
	var f tomlFile
	md, err := toml.NewDecoder(bytes.NewReader(text)).Decode(&f)
	if err != nil {
		return nil, fmt.Errorf("spectro: constants: %w", err)
	}
	if und := md.Undecoded(); len(und) > 0 {
		keys := make([]string, len(und))
		for i, k := range und {
			keys[i] = k.String()
		}
		return nil, fmt.Errorf("spectro: constants: unknown keys %s", strings.Join(keys, ", "))
	}
	c := &Constants{
		AtomicMass:         f.Molecule.AtomicMass,
		States:             map[string]State{},
		MomentCB:           f.Transition.CB.Moment,
		BroadeningFWHM:     f.Broadening.FWHM,
		BroadeningTref:     f.Broadening.Tref,
		BroadeningExponent: f.Broadening.Exponent,
	}
	if !(c.AtomicMass > 1 && c.AtomicMass < 300) {
		return nil, fmt.Errorf("spectro: constants: molecule.atomic_mass_u = %g, want 1…300 u", c.AtomicMass)
	}
	if !(c.MomentCB > 0 && c.MomentCB < 10) {
		return nil, fmt.Errorf("spectro: constants: transition.CB.moment_ea0 = %g, want 0…10 e·a₀", c.MomentCB)
	}
	if !(c.BroadeningFWHM >= 0 && c.BroadeningFWHM < 10) {
		return nil, fmt.Errorf("spectro: constants: broadening.fwhm_cm_per_atm = %g, want 0…10 cm⁻¹/atm", c.BroadeningFWHM)
	}
	if !(c.BroadeningTref > 0 && c.BroadeningTref < 10000) {
		return nil, fmt.Errorf("spectro: constants: broadening.reference_temperature_K = %g, want 0…10000 K", c.BroadeningTref)
	}
	if !(c.BroadeningExponent >= 0 && c.BroadeningExponent <= 2) {
		return nil, fmt.Errorf("spectro: constants: broadening.temperature_exponent = %g, want 0…2", c.BroadeningExponent)
	}
	names := make([]string, 0, len(f.States))
	for n := range f.States {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		s := f.States[n]
		if s.Lambda == nil || s.Multiplicity == nil {
			return nil, fmt.Errorf("spectro: constants: states.%s needs lambda and multiplicity", n)
		}
		st := State{Label: s.Label, Lambda: *s.Lambda, Multiplicity: *s.Multiplicity, Te: s.Te,
			We: s.We, WeXe: s.WeXe, WeYe: s.WeYe, WeZe: s.WeZe, Be: s.Be, AlphaE: s.AlphaE,
			GammaE: s.GammaE, De: s.De, Re: s.Re, A: s.A}
		if err := st.validate("states." + n); err != nil {
			return nil, err
		}
		c.States[n] = st
	}
	for _, n := range []string{"X", "B", "C"} {
		if _, ok := c.States[n]; !ok {
			return nil, fmt.Errorf("spectro: constants: states.%s missing", n)
		}
	}
	return c, nil
}

func (s State) validate(key string) error {
	checks := []struct {
		name      string
		v, lo, hi float64
	}{
		{"Te", s.Te, 0, 2e5}, {"we", s.We, 10, 5000}, {"wexe", s.WeXe, 0.01, 500},
		{"Be", s.Be, 0.01, 100}, {"alphae", s.AlphaE, 0, 10}, {"De", s.De, 0, 1},
		{"re", s.Re, 0.3, 10},
	}
	for _, c := range checks {
		if !(c.v >= c.lo && c.v <= c.hi) || math.IsNaN(c.v) {
			return fmt.Errorf("spectro: constants: %s.%s = %g, want %g…%g", key, c.name, c.v, c.lo, c.hi)
		}
	}
	if s.Lambda < 0 || s.Lambda > 3 {
		return fmt.Errorf("spectro: constants: %s.lambda = %d, want 0…3", key, s.Lambda)
	}
	if s.Multiplicity < 1 || s.Multiplicity > 5 {
		return fmt.Errorf("spectro: constants: %s.multiplicity = %d, want 1…5", key, s.Multiplicity)
	}
	return nil
}

// ReducedMass returns the reduced mass of the homonuclear molecule [u].
func (c *Constants) ReducedMass() float64 { return c.AtomicMass / 2 }

// Default returns the constants embedded in package data (data/n2-constants.toml).
func Default() (*Constants, error) { return ParseConstants(data.Spectroscopy()) }
