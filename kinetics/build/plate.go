package build

import (
	"math"

	"n2pulse/units"
)

// Fringe names a correction for the field outside the edges of a parallel-plate capacitor.
type Fringe string

const (
	// NoFringe is the ideal parallel-plate formula ε·A/d.
	NoFringe Fringe = "none"
	// Palmer multiplies by Palmer's (1937) edge factors for rectangular plates.
	Palmer Fringe = "palmer"
)

// Plates is a pair of rectangular capacitor plates with a dielectric between them.
type Plates struct {
	Length       float64 `json:"length_m"`     // along the current, away from the edge where the switch or channel sits [m]
	Width        float64 `json:"width_m"`      // along that edge, across the current [m]
	Thickness    float64 `json:"thickness_m"`  // dielectric thickness d [m]
	Permittivity float64 `json:"permittivity"` // relative permittivity ε_r
}

// Capacitance returns the capacitance of the plates [F]: ε₀ε_r·l·w/d, times Palmer's edge
// factors [1 + d/(πw)(1 + ln(2πw/d))]·[1 + d/(πl)(1 + ln(2πl/d))] when f is Palmer. The
// correction assumes the dielectric fills the fringe region (a board or film wider than the
// plates); it is a few per cent for d ≪ w, l.
func (p Plates) Capacitance(f Fringe) float64 {
	c := units.VacuumPermittivity * p.Permittivity * p.Length * p.Width / p.Thickness
	if f == Palmer {
		c *= palmerFactor(p.Width, p.Thickness) * palmerFactor(p.Length, p.Thickness)
	}
	return c
}

func palmerFactor(side, d float64) float64 {
	return 1 + d/(math.Pi*side)*(1+math.Log(2*math.Pi*side/d))
}

// InductancePerLength returns L' = μ₀·d/w of the plates as a parallel-plate line [H/m].
func (p Plates) InductancePerLength() float64 {
	return units.VacuumPermeability * p.Thickness / p.Width
}

// CapacitancePerLength returns C' = ε₀ε_r·w/d of the plates as a parallel-plate line [F/m].
func (p Plates) CapacitancePerLength() float64 {
	return units.VacuumPermittivity * p.Permittivity * p.Width / p.Thickness
}

// Impedance returns the characteristic impedance Z₀ = (d/w)·sqrt(μ₀/(ε₀ε_r)) [Ω].
func (p Plates) Impedance() float64 {
	return p.Thickness / p.Width * math.Sqrt(units.VacuumPermeability/(units.VacuumPermittivity*p.Permittivity))
}

// TransitTime returns the one-way transit time l·sqrt(ε_r)/c along the plates [s].
func (p Plates) TransitTime() float64 {
	return p.Length * math.Sqrt(p.Permittivity) / units.SpeedOfLight
}

// LoopInductance returns the inductance of the plates discharged from one edge [H]: L'·l/3
// (the current falls linearly from the edge to the far end; quasi-static, valid while the
// discharge is slower than a few transit times).
func (p Plates) LoopInductance() float64 {
	return p.InductancePerLength() * p.Length / 3
}

// Rails are the two electrodes of the channel, standing on the plates.
type Rails struct {
	Length float64 // along the optical axis [m]
	Height float64 // from the plate to the discharge [m]
	Gap    float64 // electrode separation [m]
}

// Inductance returns the loop inductance of the rails [H]: μ₀·g·h/L, a sheet current along
// the whole rail length around the cross-section g·h.
func (r Rails) Inductance() float64 {
	if r.Length <= 0 {
		return 0
	}
	return units.VacuumPermeability * r.Gap * r.Height / r.Length
}
