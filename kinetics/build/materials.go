package build

import (
	"bytes"
	"fmt"
	"sort"
	"strings"
	"sync"

	"github.com/BurntSushi/toml"

	"n2pulse/data"
)

// Dielectric is the insulation between two capacitor plates.
type Dielectric struct {
	Key                string  `json:"key"`                 // preset name used in design files ("pet", "fr4")
	Name               string  `json:"name"`                // name in words
	Permittivity       float64 `json:"permittivity"`        // relative permittivity ε_r
	Strength           float64 `json:"strength_V_m"`        // short-time dielectric strength [V/m]
	PermittivitySource string  `json:"permittivity_source"` // where ε_r comes from
	StrengthSource     string  `json:"strength_source"`     // where the strength comes from
}

// Townsend holds the Townsend constants of a gas and the secondary-emission coefficient of the
// cathode, for Paschen's law.
type Townsend struct {
	Key         string  `json:"key"`          // "nitrogen", "air"
	Name        string  `json:"name"`         // name in words
	A           float64 `json:"A_per_m_Pa"`   // first-coefficient fit α/p = A·exp(−B·p/E) [m⁻¹ Pa⁻¹]
	B           float64 `json:"B_V_per_m_Pa"` // [V m⁻¹ Pa⁻¹]
	Gamma       float64 `json:"gamma"`        // secondary-emission coefficient γ
	Source      string  `json:"source"`       // where A and B come from
	GammaSource string  `json:"gamma_source"` // where γ comes from
}

type materialsFile struct {
	Dielectric map[string]struct {
		Name               string  `toml:"name"`
		Permittivity       float64 `toml:"permittivity"`
		PermittivitySource string  `toml:"permittivity_source"`
		Strength           float64 `toml:"strength"`
		StrengthSource     string  `toml:"strength_source"`
	} `toml:"dielectric"`
	Townsend map[string]struct {
		Name        string  `toml:"name"`
		A           float64 `toml:"a"`
		B           float64 `toml:"b"`
		Source      string  `toml:"source"`
		Gamma       float64 `toml:"gamma"`
		GammaSource string  `toml:"gamma_source"`
	} `toml:"townsend"`
}

var (
	loadOnce    sync.Once
	dielectrics map[string]Dielectric
	gases       map[string]Townsend
	loadErr     error
)

func load() error {
	loadOnce.Do(func() {
		var f materialsFile
		md, err := toml.NewDecoder(bytes.NewReader(data.Materials())).Decode(&f)
		if err != nil {
			loadErr = fmt.Errorf("build: materials.toml: %w", err)
			return
		}
		if u := md.Undecoded(); len(u) > 0 {
			loadErr = fmt.Errorf("build: materials.toml: unknown key %s", u[0])
			return
		}
		dielectrics = map[string]Dielectric{}
		for k, v := range f.Dielectric {
			if v.Permittivity < 1 || v.Strength <= 0 || v.PermittivitySource == "" || v.StrengthSource == "" {
				loadErr = fmt.Errorf("build: materials.toml: dielectric %s needs permittivity ≥ 1, strength > 0 and both sources", k)
				return
			}
			dielectrics[k] = Dielectric{Key: k, Name: v.Name, Permittivity: v.Permittivity, Strength: v.Strength,
				PermittivitySource: v.PermittivitySource, StrengthSource: v.StrengthSource}
		}
		gases = map[string]Townsend{}
		for k, v := range f.Townsend {
			if v.A <= 0 || v.B <= 0 || v.Gamma <= 0 || v.Gamma >= 1 || v.Source == "" {
				loadErr = fmt.Errorf("build: materials.toml: townsend %s needs A, B > 0, 0 < γ < 1 and a source", k)
				return
			}
			gases[k] = Townsend{Key: k, Name: v.Name, A: v.A, B: v.B, Gamma: v.Gamma, Source: v.Source, GammaSource: v.GammaSource}
		}
	})
	return loadErr
}

// DielectricPreset returns the dielectric preset of the given key ("pet", "polypropylene",
// "polyimide", "polyethylene", "fr4", "ptfe", "glass").
func DielectricPreset(key string) (Dielectric, error) {
	if err := load(); err != nil {
		return Dielectric{}, err
	}
	d, ok := dielectrics[strings.ToLower(strings.TrimSpace(key))]
	if !ok {
		return Dielectric{}, fmt.Errorf("build: unknown dielectric %q: allowed %s", key, strings.Join(DielectricKeys(), ", "))
	}
	return d, nil
}

// DielectricKeys returns the names of the dielectric presets, sorted.
func DielectricKeys() []string {
	if load() != nil {
		return nil
	}
	k := make([]string, 0, len(dielectrics))
	for n := range dielectrics {
		k = append(k, n)
	}
	sort.Strings(k)
	return k
}

// Gas returns the Townsend constants of a gas: "nitrogen" or "air".
func Gas(key string) (Townsend, error) {
	if err := load(); err != nil {
		return Townsend{}, err
	}
	g, ok := gases[key]
	if !ok {
		k := make([]string, 0, len(gases))
		for n := range gases {
			k = append(k, n)
		}
		sort.Strings(k)
		return Townsend{}, fmt.Errorf("build: no Townsend constants for gas %q: allowed %s", key, strings.Join(k, ", "))
	}
	return g, nil
}
