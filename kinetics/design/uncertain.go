package design

import (
	"fmt"
	"math"
	"sort"
)

// Distribution is how an uncertain constant is spread over its range when it is sampled.
type Distribution string

const (
	// Uniform spreads the value evenly over [Low, High].
	Uniform Distribution = "uniform"
	// LogUniform spreads ln(value) evenly over [ln Low, ln High]: for a factor range such as
	// ×0.5–2.
	LogUniform Distribution = "log-uniform"
)

// Spread is the published spread, or an estimate's range, of one design key's default:
// the range in SI, how the value is spread over it and where the range comes from.
type Spread struct {
	Key          string
	Low, High    float64 // closed range in SI units of the key
	Distribution Distribution
	Source       string // the publications the range is read from, each marked seen / from memory / estimate
}

// spreads lists the design keys whose default has a published spread or an estimate's range.
// Every range contains the default of Defaults (TestSpreadsHoldDefaults); the defaults
// themselves and their sources are in levels.go. Keys whose default has no range anywhere in
// the project (switch.spark_constant, a discharge.recombination set by hand, levels.lower_removal_*,
// levels.manifold_relaxation_oxygen) are not listed. levels.manifold_share and
// levels.manifold_relaxation_nitrogen are sampled independently, though the derivation of the
// share (levels.go) lowers it as the B → A transfer grows: the share sets how much of the
// manifold reaches B(0), the relaxation constant how fast.
var spreads = []Spread{
	{Key: "discharge.recombination_scale", Low: 0.5, High: 2, Distribution: LogUniform,
		Source: "estimate, range ×0.5–2: the per-ion fits (Mehr & Biondi, Phys. Rev. 181, 264 (1969); Kossyi et al., Plasma Sources Sci. Technol. 1, 207 (1992); Peverall et al., J. Chem. Phys. 114, 6679 (2001); seen, secondary) are measured up to a few thousand kelvin and used at 1–4 eV with T_e = ⅔⟨ε⟩; N₄⁺ 2e-6 against 2.4e-6 cm³/s in J. Appl. Phys. 125, 243301 (2019) Table I (seen)"},
	{Key: "levels.upper_quenching_nitrogen", Low: 1.0e-17, High: 1.5e-17, Distribution: Uniform,
		Source: "1.0–1.5e-11 cm³/s: Kossyi, Kostinsky, Matveyev & Silakov, Plasma Sources Sci. Technol. 1, 207 (1992) (seen, secondary) to Pancheshnyi et al., Chem. Phys. Lett. 294, 523 (1998) (from memory) and older measurements near 1.1–1.5e-11 (from memory)"},
	{Key: "levels.upper_quenching_oxygen", Low: 2.7e-16, High: 3.3e-16, Distribution: Uniform,
		Source: "2.7–3.3e-10 cm³/s, published spread: Kossyi et al., Plasma Sources Sci. Technol. 1, 207 (1992), 3.0e-10 (seen, secondary); Pancheshnyi et al., Chem. Phys. Lett. 294, 523 (1998), ≈3.0e-10 (from memory)"},
	{Key: "levels.upper_electron_scale", Low: 0.5, High: 2, Distribution: LogUniform,
		Source: "estimate, range ×0.5–2: accuracy of van Regemorter's form for allowed transitions of neutrals (from memory); up to ×3 if ionisation could leave the ion in its ground state is outside this range"},
	{Key: "levels.upper_excitation_scale", Low: 0.7, High: 1.3, Distribution: Uniform,
		Source: "±30 %: the uncertainty Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006), Table 10, states for the recommended C³Πu excitation cross section (seen, in the metadata of the table's public transcription in the nepc project); a scale on the rate, the EEDF feedback of the one channel left out"},
	{Key: "levels.lower_excitation_scale", Low: 0.65, High: 1.35, Distribution: Uniform,
		Source: "±35 %: the uncertainty Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006), Table 8, states for the recommended B³Πg excitation cross section (seen, as above); a scale on the rate, the EEDF feedback of the one channel left out"},
	{Key: "levels.upper_relaxation_nitrogen", Low: 1e-17, High: 2e-17, Distribution: Uniform,
		Source: "1–2e-11 cm³/s: Dilecce, Ambrico & De Benedictis, Chem. Phys. Lett. 431, 241 (2006) (abstract seen, values from memory)"},
	{Key: "levels.upper_v1_quenching_nitrogen", Low: 1e-17, High: 2e-17, Distribution: Uniform,
		Source: "1–2e-11 cm³/s: Dilecce, Ambrico & De Benedictis, Chem. Phys. Lett. 431, 241 (2006) (abstract seen, values from memory)"},
	{Key: "levels.lower_lifetime", Low: 7.5e-6, High: 13e-6, Distribution: Uniform,
		Source: "7.5 µs band average of Capitelli et al., Plasma Kinetics in Atmospheric Gases (Springer 2000) (seen, secondary) to 8–13 µs for B(v=0) of Eyler & Pipkin (1983) (from memory)"},
	{Key: "levels.manifold_share", Low: 0.05, High: 0.37, Distribution: Uniform,
		Source: "derived, range 0.05–0.37 (levels.go): Franck–Condon-weighted yield Σq_v·p^v of the B(v>0) ladder with p = k_VR/(k_VR + k_BA), k_VR = 1–3e-11 cm³/s (from memory) and k_BA = 1.2–3e-11 cm³/s (J. Appl. Phys. 125, 243301 (2019) Table I R25, seen; Kossyi et al. 1992, seen, secondary)"},
	{Key: "levels.manifold_relaxation_nitrogen", Low: 1.2e-17, High: 3e-17, Distribution: LogUniform,
		Source: "1.2–3e-11 cm³/s: J. Appl. Phys. 125, 243301 (2019), Table I, R25, 1.2e-11 (seen) to Kossyi et al., Plasma Sources Sci. Technol. 1, 207 (1992), 3e-11 (seen, secondary)"},
	{Key: "levels.fast_heating_share", Low: 0.03, High: 0.3, Distribution: LogUniform,
		Source: "estimate 0.1, range 0.03–0.3 (levels.go): 20–30 % of the electronic and dissociation energy in air from the fast-heating literature (Popov, Plasma Phys. Rep. 27, 886 (2001); Aleksandrov et al., J. Phys. D 43, 255201 (2010); Popov, J. Phys. D 44, 285201 (2011); all from memory), less in pure N₂"},
}

// Spreads returns the design keys whose default carries a published spread or an estimate's
// range, sorted by key: the constants an uncertainty or sensitivity study samples.
func Spreads() []Spread {
	out := append([]Spread(nil), spreads...)
	sort.Slice(out, func(i, j int) bool { return out[i].Key < out[j].Key })
	return out
}

// KeySpread returns the spread of a design key and whether it has one.
func KeySpread(key string) (Spread, bool) {
	for _, s := range spreads {
		if s.Key == key {
			return s, true
		}
	}
	return Spread{}, false
}

// Quantile returns the value at probability u ∈ [0, 1] of the spread's distribution (the
// inverse of its cumulative distribution): what a sampler maps its uniform numbers through.
func (s Spread) Quantile(u float64) (float64, error) {
	if !(u >= 0 && u <= 1) {
		return 0, fmt.Errorf("design: %s: probability %g outside 0…1", s.Key, u)
	}
	var x float64
	switch s.Distribution {
	case Uniform:
		x = s.Low + u*(s.High-s.Low)
	case LogUniform:
		if !(s.Low > 0) {
			return 0, fmt.Errorf("design: %s: log-uniform spread needs a positive low end, got %g", s.Key, s.Low)
		}
		x = s.Low * math.Pow(s.High/s.Low, u)
	default:
		return 0, fmt.Errorf("design: %s: distribution %q, want %q or %q", s.Key, s.Distribution, Uniform, LogUniform)
	}
	return math.Min(math.Max(x, s.Low), s.High), nil // rounding never leaves the range
}
