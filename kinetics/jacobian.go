package kinetics

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/ode"
	"n2pulse/units"
)

var (
	_ ode.Jacobian       = (*circuit)(nil)
	_ ode.TimeDerivative = (*circuit)(nil)
)

// switchSlopes are ∂R_s/∂q [Ω/(A² s)] and ∂R_s/∂t [Ω/s] of switchResistance at (t, q); on
// q = 0, the edge of max(q, 0), the derivative from above (q only grows from 0).
func (c *circuit) switchSlopes(t, q float64) (dq, dt float64) {
	s := c.sw
	switch s.Model {
	case design.ExponentialSwitch:
		return 0, -(s.OffResistance - s.OnResistance) / s.RiseTime * math.Exp(-t/s.RiseTime)
	case design.RompeWeizelSwitch:
		if q < 0 {
			return 0, 0
		}
		k := 2 * s.SparkConstant / s.Pressure
		u := k * (c.q0 + q)
		return -0.5 * s.Gap * k / (u * math.Sqrt(u)), 0
	}
	return 0, 0
}

// Jacobian implements ode.Jacobian: ∂f/∂y of Eval at (t, y), with the derivatives of the
// swarm coefficients taken from the table's interpolation (one-sided on a row of the table,
// where the interpolation has a corner).
func (c *circuit) Jacobian(t float64, y []float64, dst *mat.Dense) {
	dst.Zero()
	raw := dst.RawMatrix()
	set := func(i, j int, v float64) { raw.Data[i*raw.Stride+j] = v }
	add := func(i, j int, v float64) { raw.Data[i*raw.Stride+j] += v }
	vg, is := y[iVg], y[iIs]
	ne := math.Exp(y[iLnNe])

	// Plasma current I_p(V_g, ln n_e) and the net ionisation of ln n_e.
	var ip, dipdv float64
	if c.fixed {
		ip, dipdv = c.conductance*vg, c.conductance
	} else {
		en := c.reducedField(vg)
		var k, dk [nRates]float64
		c.rates.at(en, rateDrift, rateMean+1, &k, &dk)
		ip = math.Copysign(units.ElementaryCharge*ne*k[rateDrift]*c.area, vg)
		dipdv = units.ElementaryCharge * ne * dk[rateDrift] * c.area / (c.gap * c.density)
		sgn := math.Copysign(1, vg) / (c.gap * c.density) // ∂(E/N)/∂V_g, E/N = |V_g|/(d·N)
		// Recombination: ᾱ = Σ α_j(T_e(⟨ε⟩(E/N)))·x_j, x_O = 1 − x₂ − x₄.
		a, da := c.recombinationAt(k[rateMean])
		x2, x4 := y[iX2], y[iX4]
		abar := meanRecombination(x2, x4, a)
		var dav [3]float64 // ∂α_j/∂V_g
		for j := range da {
			dav[j] = da[j] * dk[rateMean] * sgn
		}
		dabar := meanRecombination(x2, x4, dav)                      // ∂ᾱ/∂V_g
		d2, d4 := a[0]-a[2], a[1]-a[2]                               // ∂ᾱ/∂x₂, ∂ᾱ/∂x₄
		nui, dnui := k[rateIon]*c.density, dk[rateIon]*c.density*sgn // ν_i and ∂ν_i/∂V_g
		// d ln n_e/dt = (k_ion − k_att)(E/N)·N − ᾱ·n_e.
		set(iLnNe, iVg, (dk[rateIon]-dk[rateAtt])*c.density*sgn-dabar*ne)
		set(iLnNe, iLnNe, -abar*ne)
		set(iLnNe, iX2, -d2*ne)
		set(iLnNe, iX4, -d4*ne)
		// The shares (ionChemistry.shareRates).
		set(iX2, iX2, -nui-c.ions.nu3-c.ions.nu2O+(abar-a[0])*ne+d2*ne*x2)
		set(iX2, iX4, d4*ne*x2)
		set(iX2, iLnNe, (abar-a[0])*ne*x2)
		set(iX2, iVg, dnui*(1-x2)+(dabar-dav[0])*ne*x2)
		set(iX4, iX2, c.ions.nu3+d2*ne*x4)
		set(iX4, iX4, -nui-c.ions.nu4O+(abar-a[1])*ne+d4*ne*x4)
		set(iX4, iLnNe, (abar-a[1])*ne*x4)
		set(iX4, iVg, -dnui*x4+(dabar-dav[1])*ne*x4)
		set(iVg, iLnNe, -ip/c.cg)
		set(iEPlasma, iLnNe, vg*ip)
	}
	set(iVg, iIc, 1/c.cg)
	set(iVg, iVg, -dipdv/c.cg)
	set(iEPlasma, iVg, ip+vg*dipdv)

	// Switch loop: R_s(t, q) with q = ∫I_s² dt.
	rs := c.switchResistance(t, y[iQ])
	drs, _ := c.switchSlopes(t, y[iQ])
	set(iIs, iIs, -rs/c.ls)
	set(iIs, iQ, -is*drs/c.ls)
	set(iQ, iIs, 2*is)
	set(iESwitch, iIs, 2*rs*is)
	set(iESwitch, iQ, drs*is*is)

	// Shunt across the channel capacitor, I_sh = I_L + V_sh/R_sh, with V_sh = V₂ − V₁
	// (Blumlein) or V₂ (charge transfer): its partial derivatives by I_L, V₁ and V₂.
	var vsh, dvsh1 float64
	if c.topo == design.Blumlein {
		vsh, dvsh1 = y[iV2]-y[iV1], -1
	} else {
		vsh = y[iV2]
	}
	var shL, sh1, sh2 float64
	if c.lsh > 0 {
		shL = 1
		set(iIsh, iV1, dvsh1/c.lsh)
		set(iIsh, iV2, 1/c.lsh)
	}
	if c.rsh > 0 {
		sh1, sh2 = dvsh1/c.rsh, 1/c.rsh
		set(iEShunt, iV1, 2*vsh*dvsh1/c.rsh)
		set(iEShunt, iV2, 2*vsh/c.rsh)
	}
	// shunt sets the terms ±I_sh/C of row.
	shunt := func(row int, f float64) {
		set(row, iIsh, f*shL)
		add(row, iV1, f*sh1)
		add(row, iV2, f*sh2)
	}

	switch c.topo {
	case design.Blumlein:
		// dV₁ = (I_c + I_sh − I_s)/C₁, dV₂ = −(I_c + I_sh)/C₂, dI_s = (V₁ − R_s I_s)/L_s,
		// dI_c = (V₂ − V₁ − V_g)/L_c.
		set(iV1, iIc, 1/c.c1)
		set(iV1, iIs, -1/c.c1)
		shunt(iV1, 1/c.c1)
		set(iV2, iIc, -1/c.c2)
		shunt(iV2, -1/c.c2)
		set(iIs, iV1, 1/c.ls)
		set(iIc, iV2, 1/c.lc)
		set(iIc, iV1, -1/c.lc)
		set(iIc, iVg, -1/c.lc)
	default:
		// dV₁ = −I_s/C₁, dV₂ = (I_s − I_c − I_sh)/C₂, dI_s = (V₁ − V₂ − R_s I_s)/L_s,
		// dI_c = (V₂ − V_g)/L_c.
		set(iV1, iIs, -1/c.c1)
		set(iV2, iIs, 1/c.c2)
		set(iV2, iIc, -1/c.c2)
		shunt(iV2, -1/c.c2)
		set(iIs, iV1, 1/c.ls)
		set(iIs, iV2, -1/c.ls)
		set(iIc, iV2, 1/c.lc)
		set(iIc, iVg, -1/c.lc)
	}
}

// TimeDerivative implements ode.TimeDerivative: ∂f/∂t at (t, y), which only an exponential
// switch has (R_s falls with t).
func (c *circuit) TimeDerivative(t float64, y, dst []float64) {
	for i := range dst {
		dst[i] = 0
	}
	_, drs := c.switchSlopes(t, y[iQ])
	if drs == 0 {
		return
	}
	is := y[iIs]
	dst[iIs] = -is * drs / c.ls
	dst[iESwitch] = drs * is * is
}
