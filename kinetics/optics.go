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
	gain          []float64 // small-signal gain factor e^(σ·(N_C − g·N_B)·Δz) of each cell
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
		c: make([]float64, n), b: make([]float64, n), gain: make([]float64, n),
		fp: make([]float64, n), fm: make([]float64, n),
		fpOld: make([]float64, n), fmOld: make([]float64, n),
	}
	m.resync()
	return m
}

// resync recomputes every cell's gain factor from its populations. Between resyncs the
// factors follow the populations multiplicatively (shot.run), which needs no exponential of
// a large argument in the hot loop.
func (m *medium) resync() {
	a := m.sigma * m.dz
	for i := range m.gain {
		m.gain[i] = math.Exp(a * (m.c[i] - m.g*m.b[i]))
	}
}

// frantzNodvik returns the fluence [m⁻²] leaving a cell of small-signal gain factor
// gain = e^(σΔN·Δz) for an entering fluence jin, by the Frantz–Nodvik relation
//
//	J_out = J_s·ln(1 + G·(e^(J_in/J_s) − 1)),  J_s = 1/((1+g)σ),
//
// with invJs = 1/J_s. Far below saturation (J_in/J_s and G·J_in/J_s under 1e-6) it uses the
// expansion J_in·G·(1 + x(1−G)/2), exact to a relative 1e-12; cells are short, so the
// remaining series are short too (the hot loop of a shot).
func frantzNodvik(jin, gain, js, invJs float64) float64 {
	x := jin * invJs
	if x < 1e-6 && gain*x < 1e-6 {
		return jin * gain * (1 + 0.5*x*(1-gain))
	}
	return js * log1pSmall(gain*expm1Small(x))
}

// small bounds the arguments for which the series below are exact to rounding.
const small = 1.0 / 64

// expSmall is e^x: 1 + x + x²/2 for |x| < 2⁻¹⁸ (truncation below 1e-16), short enough for
// the compiler to inline; else expMedium.
func expSmall(x float64) float64 {
	if x2 := x * x; x2 < 0x1p-36 {
		return 1 + x + 0.5*x2
	}
	return expMedium(x)
}

// expTiny returns 1 + x + x²/2 + x³/6 and whether |x| < 2⁻¹⁰, where that series is e^x to a
// relative 5e-14. It is the inlined exponential of the gain-factor updates in the hot loop;
// those factors are recomputed exactly every 64 steps, so such errors cannot build up.
func expTiny(x float64) (float64, bool) {
	x2 := x * x
	return 1 + x + x2*(0.5+x*(1.0/6)), x2 < 0x1p-20
}

// expMedium is e^x; for |x| ≤ 1/64 a Taylor series to x⁶ (truncation below 1e-16).
func expMedium(x float64) float64 {
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
	if x < 0x1p-13 { // to x⁵: truncation x⁵/720 below 1e-21 of the result
		return x * (1 + x*(c2+x*(c3+x*(c4+x*c5))))
	}
	return x * (1 + x*(c2+x*(c3+x*(c4+x*(c5+x*(c6+x*c7))))))
}

// log1pSmall is ln(1+y); for 0 ≤ y ≤ 1/64 a Taylor series to y⁹.
func log1pSmall(y float64) float64 {
	if y > small || y < 0 {
		return math.Log1p(y)
	}
	const c2, c3, c4, c5, c6, c7, c8, c9 = -1.0 / 2, 1.0 / 3, -1.0 / 4, 1.0 / 5, -1.0 / 6, 1.0 / 7, -1.0 / 8, 1.0 / 9
	if y < 0x1p-13 { // to y⁵: truncation y⁵/6 below 1e-20 of the result
		return y * (1 + y*(c2+y*(c3+y*(c4+y*c5))))
	}
	return y * (1 + y*(c2+y*(c3+y*(c4+y*(c5+y*(c6+y*(c7+y*(c8+y*c9))))))))
}

// propagate moves both waves one cell, applying spontaneous emission, gain and loss in every
// cell, and returns the fluxes leaving the front and rear ends during this step. In each
// cell the two directions pass in turn (alternating the order from step to step); the
// stimulated transitions (J_out − J_in)/Δz of each pass are taken from the populations, so
// they stay non-negative at any flux and every photon gained is a transition of the medium.
func (m *medium) propagate(step int) (front, rear float64) {
	m.fp, m.fpOld = m.fpOld, m.fp
	m.fm, m.fmOld = m.fmOld, m.fm
	n := m.n
	front = (1 - m.rFront) * m.fpOld[n-1]
	rear = (1 - m.rRear) * m.fmOld[0]
	dt, invDt, invDz := m.dt, m.invDt, m.invDz
	js, invJs := m.js, m.invJs
	loss, spontHalf := m.lossFactor, 0.5*m.spont
	fp, fm, fpOld, fmOld := m.fp, m.fm, m.fpOld, m.fmOld
	cs, bs, gf := m.c[:n], m.b[:n], m.gain[:n]
	var spont, stim, lost float64
	forwardFirst := step&1 == 0
	for i := 0; i < n; i++ {
		var inP, inM float64
		if i == 0 {
			inP = m.rRear*fmOld[0] + m.inject
		} else {
			inP = fpOld[i-1]
		}
		if i == n-1 {
			inM = m.rFront * fpOld[n-1]
		} else {
			inM = fmOld[i+1]
		}
		c, b := cs[i], bs[i]
		half := spontHalf * c
		spont += 4 * half
		gain := gf[i]
		first, second := inP+half, inM+half
		if !forwardFirst {
			first, second = second, first
		}
		// First pass.
		jin := first * dt
		dj := frantzNodvik(jin, gain, js, invJs) - jin
		c -= dj * invDz
		b += dj * invDz
		stim += dj
		out1 := (jin + dj) * invDt
		if f, ok := expTiny(-dj * invJs); ok {
			gain *= f
		} else {
			gain *= expMedium(-dj * invJs)
		}
		// Second pass.
		jin = second * dt
		dj2 := frantzNodvik(jin, gain, js, invJs) - jin
		c -= dj2 * invDz
		b += dj2 * invDz
		stim += dj2
		out2 := (jin + dj2) * invDt
		if f, ok := expTiny(-dj2 * invJs); ok {
			gf[i] = gain * f
		} else {
			gf[i] = gain * expMedium(-dj2*invJs)
		}
		// Rounding only: Frantz–Nodvik never takes more than the inversion holds.
		cs[i], bs[i] = max(c, 0), max(b, 0)
		k1, k2 := out1*loss, out2*loss
		lost += (out1 - k1) + (out2 - k2)
		if forwardFirst {
			fp[i], fm[i] = k1+half, k2+half
		} else {
			fm[i], fp[i] = k1+half, k2+half
		}
	}
	m.ledger.injected += m.inject * dt
	m.ledger.spontaneous += spont * dt
	m.ledger.stimulated += stim
	m.ledger.lost += lost * dt
	m.ledger.front += front * dt
	m.ledger.rear += rear * dt
	return front, rear
}

// inFlight is the number of photons per unit area still travelling in the channel [m⁻²].
func (m *medium) inFlight() float64 {
	s := 0.0
	for i := 0; i < m.n; i++ {
		s += m.fp[i] + m.fm[i]
	}
	return s * m.dt
}
