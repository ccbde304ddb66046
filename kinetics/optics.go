package kinetics

import "math"

// medium holds the C and B populations of every cell and the forward and backward photon
// fluxes on the characteristic grid Δz = c·Δt: fp[i] leaves cell i towards z = L, fm[i]
// leaves cell i towards z = 0. The fluxes are kept as the fluence of one step over the
// saturation fluence, x = φ·Δt/J_s (φ the photon flux density [m⁻² s⁻¹]), the variable of
// the Frantz–Nodvik relation; fluxOf converts back.
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
	fp, fm        []float64 // x = φ·Δt/J_s of the fluxes leaving each cell
	fpOld, fmOld  []float64
	in1, in2      []float64 // scratch of advance: x entering each cell in its two passes
	half          []float64 // scratch of advance: x of the spontaneous emission added to each direction
	da1, da2      []float64 // scratch of advance: a = ln(G′/G) of each cell's two passes
	ledger        photonLedger
	inject        float64 // flux entering the forward wave at z = 0 from outside (tests) [m⁻² s⁻¹]
	// Sum and largest value of N_C − g·N_B over the cells after the last step [m⁻³].
	invSum, invMax float64
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
		in1: make([]float64, n), in2: make([]float64, n), half: make([]float64, n),
		da1: make([]float64, n), da2: make([]float64, n),
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

// retune gives the medium a new effective cross section sigma [m²] and degeneracy ratio g
// (a gas that heated): the fluxes, kept in units of the saturation fluence, are rescaled so
// that the photons in flight stay the same, and every gain factor is recomputed.
func (m *medium) retune(sigma, g float64) {
	js := 1 / ((1 + g) * sigma)
	f := m.js / js
	for i := range m.fp {
		m.fp[i] *= f
		m.fm[i] *= f
	}
	m.sigma, m.g, m.js, m.invJs = sigma, g, js, (1+g)*sigma
	m.resync()
}

// One Frantz–Nodvik pass through a cell of small-signal gain factor G = e^(σΔN·Δz) with an
// entering fluence J_in [m⁻²] gives (Frantz & Nodvik, J. Appl. Phys. 34, 2346 (1963))
//
//	J_out = J_s·ln(1 + G·(e^x − 1)),  x = J_in/J_s,  J_s = 1/((1+g)σ),
//
// and leaves the cell with the gain factor G′ = G·e^(−(J_out−J_in)/J_s). Written with
// r = 1 − e^(−x) and w = (G − 1)·r, the transferred fluence and the new factor are
//
//	ΔJ = J_out − J_in = J_s·ln(1 + w),  G′ = G/(1 + w),
//
// with no difference of nearly equal numbers however close G is to 1 (G − 1 is exact for
// ½ ≤ G ≤ 2). Far below saturation the expansion of a = ln(G′/G) = −ΔJ/J_s in x,
//
//	a = (1−G)·x·[1 − G·x·(1/2 + (1−2G)·x/6 + (1 − 6G + 6G²)·x²/24)] + O(G(1−G)·P₅(G)·x⁵),
//
// (the derivatives of ln(1 + G(eˣ−1)) at x = 0; P₅ = 1 − 14G + 36G² − 24G³) is exact to a
// relative 1e-17 when x and G·x are below tinyFluence = 2⁻¹⁴, and then G′ = G·e^a with
// e^a to a³ (|a| < 2⁻¹⁴, truncation below 1e-18); up to x = 1/64 short series for r and
// ln(1+w) are exact to rounding; beyond, passWide uses the library functions. The hot loop
// (medium.pass) calls only functions that inline, except passWide in its rare regime.

// tinyFluence bounds x = J_in/J_s and G·x for the expansion of a pass far below saturation.
const tinyFluence = 0x1p-14

// faintFluence bounds x and G·x for the shortest form of that expansion,
// a = (1−G)·x·(1 − G·x/2): the terms it leaves out are below G·x·x/6 + (G·x)²/3 < 2⁻⁵⁵ of a,
// and as then |a| < 2⁻²⁶, G′ = G·(1 + a + a²/2) leaves out less than a³/6 < 2⁻⁸⁰. Most
// passes of the light building up from spontaneous emission are that faint (x near 2⁻³⁰ in
// the example design), so the hot loop tests for it first: fewer operations, and a shorter
// chain of dependent ones, than passTiny.
const faintFluence = 0x1p-27

// passFaint returns a = ln(G′/G) of a pass with x and G·x below faintFluence, and whether
// they are; there a = (1−G)·x·(1 − G·x/2) is exact to a relative 3e-17.
func passFaint(x, g float64) (float64, bool) {
	gx := g * x
	if x >= faintFluence || gx >= faintFluence {
		return 0, false
	}
	qx := (1 - g) * x
	return qx - qx*(0.5*gx), true
}

// passTiny returns a = ln(G′/G) of a pass far below saturation and whether x and G·x are
// below tinyFluence, where the expansion is exact to a relative 1e-17.
func passTiny(x, g float64) (float64, bool) {
	gx := g * x
	if x >= tinyFluence || gx >= tinyFluence {
		return 0, false
	}
	// (1−2G)/6 = 1/6 − G/3 and (1 − 6G + 6G²)/24 = 1/24 − G(1−G)/4; the bracket in Estrin's
	// form, for a short chain of dependent operations.
	q := 1 - g
	qx := q * x
	p := (0.5 + x*(1.0/6-g*(1.0/3))) + x*x*(1.0/24-0.25*g*q)
	return qx - qx*gx*p, true
}

// expNegSeries returns r = 1 − e^(−x) and whether 0 ≤ x ≤ 1/64, where its series to x⁷ is
// exact to a relative 6e-18 (truncation x⁷/8!). The polynomial is summed in Estrin's form
// (pairs of terms combined by x² and x⁴): its chain of dependent operations is 5 long
// where Horner's is 13, and the hot loop waits on that chain.
func expNegSeries(x float64) (float64, bool) {
	const c2, c3, c4, c5, c6, c7 = -1.0 / 2, 1.0 / 6, -1.0 / 24, 1.0 / 120, -1.0 / 720, 1.0 / 5040
	x2 := x * x
	x4 := x2 * x2
	p := ((1 + c2*x) + x2*(c3+c4*x)) + x4*((c5+c6*x)+x2*c7)
	return x * p, x >= 0 && x <= small
}

// log1pSeries returns ln(1+w) and whether |w| ≤ 1/64, where its series to w¹⁰,
// w·(1 − w/2 + w²/3 − … − w⁹/10), is exact to a relative 1e-19 (truncation |w|¹⁰/11). It is
// summed in Estrin's form with no division, the shortest chain of dependent operations.
func log1pSeries(w float64) (float64, bool) {
	w2 := w * w
	w4 := w2 * w2
	q := ((1 - w*(1.0/2)) + w2*(1.0/3-w*(1.0/4))) + w4*((1.0/5-w*(1.0/6))+w2*(1.0/7-w*(1.0/8))) +
		(w4*w4)*(1.0/9-w*(1.0/10))
	return w * q, w <= small && w >= -small
}

// passWide is a Frantz–Nodvik pass at any x = J_in/J_s ≥ 0 and gain factor g > 0: it returns
// a = ln(G′/G) = −ΔJ/J_s and G′. Up to x = 1/8 and |w| = 1/16 (saturating passes through a
// short cell) it uses longer series, beyond them the library functions.
func passWide(x, g float64) (a, gNew float64) {
	var r float64
	if x >= 0 && x <= 1.0/8 {
		r = expNegSeriesWide(x)
	} else {
		r = -math.Expm1(-x)
	}
	w := (g - 1) * r
	var l float64
	if w <= 1.0/16 && w >= -1.0/16 {
		l = log1pSeriesWide(w)
	} else {
		l = math.Log1p(w)
	}
	return -l, g / (1 + w)
}

// expNegSeriesWide is 1 − e^(−x) for 0 ≤ x ≤ 1/8 by its series to x¹¹ (truncation x¹¹/12!
// relative, below 3e-19).
func expNegSeriesWide(x float64) float64 {
	const c2, c3, c4, c5, c6 = -1.0 / 2, 1.0 / 6, -1.0 / 24, 1.0 / 120, -1.0 / 720
	const c7, c8, c9, c10, c11 = 1.0 / 5040, -1.0 / 40320, 1.0 / 362880, -1.0 / 3628800, 1.0 / 39916800
	// Estrin's form, as in expNegSeries.
	x2 := x * x
	x4 := x2 * x2
	x8 := x4 * x4
	lo := ((1 + c2*x) + x2*(c3+c4*x)) + x4*((c5+c6*x)+x2*(c7+c8*x))
	hi := (c9 + c10*x) + x2*c11
	return x * (lo + x8*hi)
}

// log1pSeriesWide is ln(1+w) for |w| ≤ 1/16 as 2·atanh(s), s = w/(2+w), |s| ≤ 1/31, by the
// series to s¹¹ (truncation s¹²/13 relative, below 1e-19).
func log1pSeriesWide(w float64) float64 {
	s := w / (2 + w)
	s2 := s * s
	s4 := s2 * s2
	// Estrin's form, as in expNegSeries.
	return 2 * s * (((1 + s2*(1.0/3)) + s4*(1.0/5+s2*(1.0/7))) + s4*s4*(1.0/9+s2*(1.0/11)))
}

// small bounds the arguments for which the series below are exact to rounding.
const small = 1.0 / 64

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

// propagate moves both waves one cell, applying spontaneous emission, gain and loss in every
// cell, and returns the fluxes leaving the front and rear ends during this step. In each
// cell the two directions pass in turn (alternating the order from step to step); the
// stimulated transitions (J_out − J_in)/Δz of each pass are taken from the populations, so
// they stay non-negative at any flux and every photon gained is a transition of the medium.
func (m *medium) propagate(step int) (front, rear float64) { return m.advance(step, nil, false) }

// pumpStep is the pump and decay of every cell over one optical step, for constant
// coefficients: C' = C·e + cp, B' = B·eB + bp + wBh·(C + C′), with e, cp, bp and wBh the same
// for every cell when uniform, else per cell.
type pumpStep struct {
	uniform   bool
	e, cp, bp float64   // e^(−Γ_C Δt), P_C·(1−e^(−Γ_CΔt))/Γ_C [m⁻³], P_B·(1−e^(−Γ_BΔt))/Γ_B [m⁻³]
	es, cps   []float64 // per cell when not uniform: e and cp
	bps, wBhs []float64 // and bp and wBh
	eB, wBh   float64   // e^(−Γ_B Δt) and ½·(A₀₀ + X)·(1−e^(−Γ_BΔt))/Γ_B, X the electrons' C(0) → B(0) rate
}

// advance is one optical step of every cell: with pump non-nil, first the pump and decay of
// the cell (its gain factor following, or recomputed when resync), then propagate's two
// passes; it leaves the sum and the largest value of the inversions N_C − g·N_B of the cells
// in invSum and invMax [m⁻³].
//
// The cells are independent within a step (each pass reads the fluxes of the previous
// step), so the step is taken in sweeps over all cells: pump and entering fluxes, the first
// pass, the second pass, populations and the fluxes leaving. Each sweep is short and its
// cells independent, so the processor overlaps many cells, where one sweep doing all of a
// cell would wait on the long chain pump → pass → pass of every cell in turn. A pass needs
// only the gain factor; it records a = ln(G′/G), and the populations take both passes'
// transitions, N_C −= ΔJ/Δz = −a·J_s/Δz and N_B += ΔJ/Δz, in the last sweep.
func (m *medium) advance(step int, pump *pumpStep, resync bool) (front, rear float64) {
	m.fp, m.fpOld = m.fpOld, m.fp
	m.fm, m.fmOld = m.fmOld, m.fm
	n := m.n
	fluxPerX := m.js * m.invDt
	front = (1 - m.rFront) * m.fpOld[n-1] * fluxPerX
	rear = (1 - m.rRear) * m.fmOld[0] * fluxPerX
	in1, in2, halves := m.in1[:n], m.in2[:n], m.half[:n]
	forwardFirst := step&1 == 0
	spont := m.enter(pump, resync, forwardFirst)
	sumA := m.pass(in1, m.da1)
	sumA += m.pass(in2, m.da2)

	fp, fm := m.fp[:n], m.fm[:n]
	cs, bs := m.c[:n], m.b[:n]
	da1, da2 := m.da1[:n], m.da2[:n]
	loss, g, perA := m.lossFactor, m.g, m.js*m.invDz
	var lost float64
	sum, maxInv := 0.0, math.Inf(-1)
	for i := range cs {
		d := (da1[i] + da2[i]) * perA
		c, b := cs[i]+d, bs[i]-d
		// Rounding only: Frantz–Nodvik never takes more than the inversion holds.
		if c < 0 {
			c = 0
		}
		if b < 0 {
			b = 0
		}
		cs[i], bs[i] = c, b
		inv := c - g*b
		sum += inv
		if inv > maxInv {
			maxInv = inv
		}
		out1, out2 := in1[i], in2[i]
		k1, k2 := out1*loss, out2*loss
		lost += (out1 - k1) + (out2 - k2)
		half := halves[i]
		if forwardFirst {
			fp[i], fm[i] = k1+half, k2+half
		} else {
			fm[i], fp[i] = k1+half, k2+half
		}
	}
	m.invSum, m.invMax = sum, maxInv
	js, dt := m.js, m.dt
	m.ledger.injected += m.inject * dt
	m.ledger.spontaneous += spont * js
	m.ledger.stimulated += -sumA * js
	m.ledger.lost += lost * js
	m.ledger.front += front * dt
	m.ledger.rear += rear * dt
	return front, rear
}

// fluxOf is the photon flux density [m⁻² s⁻¹] of a flux kept as x = φ·Δt/J_s.
func (m *medium) fluxOf(x float64) float64 { return x * m.js * m.invDt }

// enter is the first sweep of advance: the pump and decay of every cell when ps is non-nil,
// each gain factor following its cell's populations (or recomputed from them when resync);
// then the spontaneous flux of each cell, half into each direction, and the fluxes entering
// each cell in its first and second pass (in1, in2, as x = φ·Δt/J_s). It returns the
// spontaneous emission added over all cells as x.
//
// It is two short loops over the cells, each without tests that stay the same through the
// loop: the pump (one for a simultaneous discharge, the common case, and one per cell
// otherwise), then the spontaneous emission and the entering fluxes, the end cells taking
// theirs from the mirrors.
func (m *medium) enter(ps *pumpStep, resync, forwardFirst bool) (spont float64) {
	n := m.n
	cs := m.c[:n]
	if ps != nil {
		m.pump(ps, m.n, !resync)
		if resync {
			m.resync()
		}
	}
	fpOld, fmOld := m.fpOld[:n], m.fmOld[:n]
	halves := m.half[:n]
	// The pass that carries the forward wave and the one that carries the backward wave.
	toP, toM := m.in1[:n], m.in2[:n]
	if !forwardFirst {
		toP, toM = toM, toP
	}
	xPerFlux := m.dt * m.invJs
	spontHalf := 0.5 * m.spont * xPerFlux
	var sum float64
	for i, c := range cs {
		half := spontHalf * c
		sum += half
		halves[i] = half
	}
	spont = 4 * sum
	toP[0] = m.rRear*fmOld[0] + m.inject*xPerFlux + halves[0]
	toM[n-1] = m.rFront*fpOld[n-1] + halves[n-1]
	// Cell i ≥ 1 takes the forward flux leaving cell i−1, cell i ≤ n−2 the backward flux
	// leaving cell i+1.
	p, fpPrev, hp := toP[1:n], fpOld[:n-1], halves[1:n]
	for j := range p {
		p[j] = fpPrev[j] + hp[j]
	}
	q, fmNext, hq := toM[:n-1], fmOld[1:n], halves[:n-1]
	for j := range q {
		q[j] = fmNext[j] + hq[j]
	}
	return spont
}

// pump advances the populations of the first cells cells through one step of pump and decay
// (see pumpStep) and, when follow, their gain factors with them.
func (m *medium) pump(ps *pumpStep, cells int, follow bool) {
	cs, bs, gf := m.c[:cells], m.b[:cells], m.gain[:cells]
	sdz, g := m.sigma*m.dz, m.g
	eB, wBh := ps.eB, ps.wBh
	e, pc, pb := ps.e, ps.cp, ps.bp
	for i := range cs {
		if !ps.uniform {
			e, pc, pb, wBh = ps.es[i], ps.cps[i], ps.bps[i], ps.wBhs[i]
		}
		c0, b0 := cs[i], bs[i]
		c := c0*e + pc
		b := b0*eB + pb + wBh*(c0+c)
		cs[i], bs[i] = c, b
		if follow {
			x := sdz * ((c - c0) - g*(b-b0))
			if f, ok := expTiny(x); ok {
				gf[i] *= f
			} else {
				gf[i] *= expMedium(x)
			}
		}
	}
}

// pass takes every cell through one Frantz–Nodvik pass: xs[i], the x = J_in/J_s entering
// cell i, is replaced by the x leaving it, J_out/J_s = x − a, before loss; the cell's gain
// factor G by G′; and da[i] is set to a = ln(G′/G) = −ΔJ/J_s. It returns Σa over the cells.
func (m *medium) pass(xs, da []float64) (sumA float64) {
	n := m.n
	gf, xs, da := m.gain[:n], xs[:n], da[:n]
	for i := range gf {
		x := xs[i]
		gain := gf[i]
		var a float64
		if t, ok := passFaint(x, gain); ok {
			// G′ = G·e^a to a², |a| < 2⁻²⁶.
			a = t
			ga := gain * a
			gain = (gain + ga) + ga*(0.5*a)
		} else if t, ok := passTiny(x, gain); ok {
			// G′ = G·e^a to a³, as G + G·a + G·a²·(1/2 + a/6) for a shorter chain.
			a = t
			ga := gain * a
			gain = (gain + ga) + (ga*a)*(0.5+a*(1.0/6))
		} else if r, ok := expNegSeries(x); ok {
			w := (gain - 1) * r
			if l, ok := log1pSeries(w); ok {
				a = -l
				gain /= 1 + w
			} else {
				a, gain = passWide(x, gain)
			}
		} else {
			a, gain = passWide(x, gain)
		}
		gf[i] = gain
		da[i] = a
		sumA += a
		xs[i] = x - a
	}
	return sumA
}

// inFlight is the number of photons per unit area still travelling in the channel [m⁻²].
func (m *medium) inFlight() float64 {
	s := 0.0
	for i := 0; i < m.n; i++ {
		s += m.fp[i] + m.fm[i]
	}
	return s * m.js
}
