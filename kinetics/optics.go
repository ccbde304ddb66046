package kinetics

import "math"

// medium holds the C and B populations of every cell and the forward and backward photon
// fluxes on the characteristic grid Δz = c·Δt. Fluxes are photon flux densities
// [photons m⁻² s⁻¹]; fp[i] leaves cell i towards z = L, fm[i] leaves cell i towards z = 0.
type medium struct {
	n             int
	dz, dt        float64
	sigma, g      float64 // effective cross section [m²] and degeneracy ratio g_C/g_B
	js            float64 // saturation fluence 1/((1+g)σ) [photons m⁻²]
	invJs         float64 // 1/js [m²]
	invDz, invDt  float64 // 1/Δz [m⁻¹], 1/Δt [s⁻¹]
	spont         float64 // A₀₀·Ω/4π·Δz: flux [m⁻² s⁻¹] added per unit N_C [m⁻³] over one cell
	lossFactor    float64 // e^(−αΔz)
	rRear, rFront float64
	c, b          []float64 // N_C, N_B [m⁻³]
	fp, fm        []float64
	fpOld, fmOld  []float64
	ledger        photonLedger
	inject        float64 // flux entering the forward wave at z = 0 from outside (tests) [m⁻² s⁻¹]
}

// photonLedger counts photons per unit optical area [m⁻²] for the photon balance.
type photonLedger struct {
	spontaneous, stimulated float64 // created: spontaneous seed and net stimulated emission
	front, rear, lost       float64 // left through each end, absorbed by the distributed loss
	injected                float64 // entered from outside at z = 0
}

func newMedium(n int, dz, dt, sigma, g, spontPerC, loss, rRear, rFront float64) *medium {
	m := &medium{
		n: n, dz: dz, dt: dt, sigma: sigma, g: g, js: 1 / ((1 + g) * sigma), invJs: (1 + g) * sigma,
		invDz: 1 / dz, invDt: 1 / dt,
		spont: spontPerC * dz, lossFactor: math.Exp(-loss * dz), rRear: rRear, rFront: rFront,
		c: make([]float64, n), b: make([]float64, n),
		fp: make([]float64, n), fm: make([]float64, n),
		fpOld: make([]float64, n), fmOld: make([]float64, n),
	}
	return m
}

// amplify passes a photon packet of flux in through a cell with populations *c, *b, by the
// Frantz–Nodvik relation for the cell's small-signal gain factor G = e^(σΔN·Δz) and
// saturation fluence J_s = 1/((1+g)σ),
//
//	J_out = J_s·ln(1 + G·(e^(J_in/J_s) − 1)),
//
// and takes the stimulated transitions (J_out − J_in)/Δz from the populations. It returns the
// flux leaving the cell and the cell's gain factor afterwards, G·e^(−(J_out−J_in)/J_s), so
// that the second direction needs no new exponential of the populations.
func (m *medium) amplify(in, gain float64, c, b *float64) (out, gainAfter float64) {
	jin := in * m.dt
	jout := m.js * log1pSmall(gain*expm1Small(jin*m.invJs))
	dj := jout - jin
	stim := dj * m.invDz // transitions per volume
	*c -= stim
	*b += stim
	if *c < 0 { // rounding only: Frantz–Nodvik never takes more than the inversion holds
		*c = 0
	}
	if *b < 0 {
		*b = 0
	}
	m.ledger.stimulated += dj
	return jout * m.invDt, gain * expSmall(-dj*m.invJs)
}

// small bounds the arguments for which the series below are exact to rounding.
const small = 1.0 / 64

// expSmall is e^x; for |x| ≤ 1/64 a Taylor series to x⁶ (truncation below 1e-16).
func expSmall(x float64) float64 {
	if x > small || x < -small {
		return math.Exp(x)
	}
	const c2, c3, c4, c5, c6 = 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120, 1.0 / 720
	return 1 + x*(1+x*(c2+x*(c3+x*(c4+x*(c5+x*c6)))))
}

// expm1Small is e^x − 1; for 0 ≤ x ≤ 1/64 a Taylor series to x⁷.
func expm1Small(x float64) float64 {
	if x > small || x < 0 {
		return math.Expm1(x)
	}
	const c2, c3, c4, c5, c6, c7 = 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120, 1.0 / 720, 1.0 / 5040
	return x * (1 + x*(c2+x*(c3+x*(c4+x*(c5+x*(c6+x*c7))))))
}

// log1pSmall is ln(1+y); for 0 ≤ y ≤ 1/64 a Taylor series to y⁹.
func log1pSmall(y float64) float64 {
	if y > small || y < 0 {
		return math.Log1p(y)
	}
	const c2, c3, c4, c5, c6, c7, c8, c9 = -1.0 / 2, 1.0 / 3, -1.0 / 4, 1.0 / 5, -1.0 / 6, 1.0 / 7, -1.0 / 8, 1.0 / 9
	return y * (1 + y*(c2+y*(c3+y*(c4+y*(c5+y*(c6+y*(c7+y*(c8+y*c9))))))))
}

// propagate moves both waves one cell, applying spontaneous emission, gain and loss in every
// cell, and returns the fluxes leaving the front and rear ends during this step.
func (m *medium) propagate(step int) (front, rear float64) {
	m.fp, m.fpOld = m.fpOld, m.fp
	m.fm, m.fmOld = m.fmOld, m.fm
	n := m.n
	front = (1 - m.rFront) * m.fpOld[n-1]
	rear = (1 - m.rRear) * m.fmOld[0]
	dtL := m.dt
	for i := 0; i < n; i++ {
		var inP, inM float64
		if i == 0 {
			inP = m.rRear*m.fmOld[0] + m.inject
			m.ledger.injected += m.inject * dtL
		} else {
			inP = m.fpOld[i-1]
		}
		if i == n-1 {
			inM = m.rFront * m.fpOld[n-1]
		} else {
			inM = m.fmOld[i+1]
		}
		c, b := &m.c[i], &m.b[i]
		half := 0.5 * m.spont * *c
		m.ledger.spontaneous += 4 * half * dtL
		// Alternate the order of the two directions so neither sees the cell first on
		// average.
		gain := expSmall(m.sigma * (*c - m.g**b) * m.dz)
		var out float64
		if step&1 == 0 {
			out, gain = m.amplify(inP+half, gain, c, b)
			m.fp[i] = m.finish(out, half, dtL)
			out, _ = m.amplify(inM+half, gain, c, b)
			m.fm[i] = m.finish(out, half, dtL)
		} else {
			out, gain = m.amplify(inM+half, gain, c, b)
			m.fm[i] = m.finish(out, half, dtL)
			out, _ = m.amplify(inP+half, gain, c, b)
			m.fp[i] = m.finish(out, half, dtL)
		}
	}
	m.ledger.front += front * dtL
	m.ledger.rear += rear * dtL
	return front, rear
}

// finish applies the distributed loss to a packet leaving a cell and adds the second half of
// the spontaneous seed.
func (m *medium) finish(out, half, dt float64) float64 {
	kept := out * m.lossFactor
	m.ledger.lost += (out - kept) * dt
	return kept + half
}

// inFlight is the number of photons per unit area still travelling in the channel [m⁻²].
func (m *medium) inFlight() float64 {
	s := 0.0
	for i := 0; i < m.n; i++ {
		s += m.fp[i] + m.fm[i]
	}
	return s * m.dt
}
