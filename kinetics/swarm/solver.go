package swarm

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"

	"n2pulse/units"
)

// Sharing is the rule by which the primary and the secondary electron share the energy left
// after an ionising collision.
type Sharing int

const (
	// EqualSharing gives each of the two electrons half of (ε − u).
	EqualSharing Sharing = iota
	// OneTakesAll leaves the primary with ε − u and puts the secondary at zero energy.
	OneTakesAll
)

// Component is one gas of a mixture.
type Component struct {
	Species  *Species
	Fraction float64 // mole fraction in [0, 1]
}

// Settings tune the solver. A nil *Settings means the defaults.
type Settings struct {
	// Cells is the number of energy cells (default 200, allowed 20–5000).
	Cells int
	// GasTemperature is T_g [K] for the thermal term of elastic collisions (0 means the
	// default 300 K; allowed up to 5000 K).
	GasTemperature float64
	// ColdGas sets T_g = 0 (no heating of electrons by the gas), as in the Druyvesteyn limit.
	ColdGas bool
	// Sharing is the ionisation energy-sharing rule (default EqualSharing).
	Sharing Sharing
	// ReferenceDensity is the total gas density N_ref [m⁻³] at which three-body attachment to
	// O₂ is added to the attachment rate (default 101325 Pa / (k_B·300 K) = 2.446e25 m⁻³).
	ReferenceDensity float64
	// NoThreeBody leaves three-body attachment out.
	NoThreeBody bool
	// MaxEnergy fixes the top of the energy grid [J] instead of adapting it to the EEDF.
	MaxEnergy float64
}

// DefaultCells is the default number of energy cells.
const DefaultCells = 200

// gamma is (2e/m_e)^½ [m s⁻¹ eV^-½], the speed of a 1 eV electron.
var gamma = math.Sqrt(2 * units.ElementaryCharge / units.ElectronMass)

// Solver solves the steady two-term Boltzmann equation for one gas mixture.
// A Solver is not safe for concurrent use; make one per goroutine.
type Solver struct {
	mix []component
	set Settings
	xO2 float64
	xN2 float64

	// warm start: grid top [eV] and growth rate of the previous solve
	lastMax float64
	lastNu  float64
}

type component struct {
	name  string
	x     float64
	mass  float64 // [kg]
	ratio float64 // 2m/M
	el    table1
	procs []proc
}

// proc is a process with its cross section in eV units and a cumulative integral of ε·σ.
type proc struct {
	p    *Process
	u    float64 // threshold [eV]
	t    table1
	isN2 bool
}

// table1 is a piecewise linear σ(ε), ε in eV, with C[k] = ∫_{E0}^{E_k} ε σ dε.
type table1 struct {
	E, S, C   []float64
	zeroBelow bool
}

func newTable1(p *Process) table1 {
	t := table1{zeroBelow: p.Kind != Elastic}
	t.E = make([]float64, len(p.Energy))
	for i, e := range p.Energy {
		t.E[i] = e / units.ElectronVolt
	}
	t.S = append([]float64(nil), p.Sigma...)
	t.C = make([]float64, len(t.E))
	for k := 1; k < len(t.E); k++ {
		t.C[k] = t.C[k-1] + segInt(t.E[k-1], t.S[k-1], t.E[k], t.S[k], t.E[k-1], t.E[k])
	}
	return t
}

// segInt integrates ε·σ(ε) over [a, b] inside the segment (e0,s0)–(e1,s1).
func segInt(e0, s0, e1, s1, a, b float64) float64 {
	sl := (s1 - s0) / (e1 - e0)
	al := s0 - sl*e0
	F := func(x float64) float64 { return al*x*x/2 + sl*x*x*x/3 }
	return F(b) - F(a)
}

func (t *table1) at(e float64) float64 { return interpSigma(t.E, t.S, e, t.zeroBelow) }

// cum returns ∫_0^x ε σ dε (for an inelastic process σ = 0 below the first point).
func (t *table1) cum(x float64) float64 {
	n := len(t.E)
	if x <= t.E[0] {
		if t.zeroBelow {
			return 0
		}
		return t.S[0] * (x*x - 0) / 2 // elastic: held value below the first point
	}
	base := 0.0
	if !t.zeroBelow {
		base = t.S[0] * t.E[0] * t.E[0] / 2
	}
	if x >= t.E[n-1] {
		return base + t.C[n-1] + t.S[n-1]*(x*x-t.E[n-1]*t.E[n-1])/2
	}
	k := sort.SearchFloat64s(t.E, x) - 1
	return base + t.C[k] + segInt(t.E[k], t.S[k], t.E[k+1], t.S[k+1], t.E[k], x)
}

func (t *table1) integral(a, b float64) float64 {
	if b <= a {
		return 0
	}
	return t.cum(b) - t.cum(a)
}

// NewSolver checks the mixture (fractions not negative, summing to 1 within 1e-3; they are
// renormalised to sum exactly to 1; components with zero fraction are dropped) and settings.
func NewSolver(mix []Component, s *Settings) (*Solver, error) {
	set := Settings{Cells: DefaultCells, GasTemperature: 300,
		ReferenceDensity: ReferenceDensity}
	if s != nil {
		set = *s
		if set.Cells == 0 {
			set.Cells = DefaultCells
		}
		if set.ReferenceDensity == 0 {
			set.ReferenceDensity = ReferenceDensity
		}
		if set.GasTemperature == 0 {
			set.GasTemperature = 300
		}
	}
	if set.Cells < 20 || set.Cells > 5000 {
		return nil, fmt.Errorf("swarm: cells %d: allowed 20–5000", set.Cells)
	}
	if !(set.GasTemperature >= 0 && set.GasTemperature <= 5000) {
		return nil, fmt.Errorf("swarm: gas temperature %g K: allowed 0–5000 K", set.GasTemperature)
	}
	if !(set.ReferenceDensity > 0) || math.IsInf(set.ReferenceDensity, 0) {
		return nil, fmt.Errorf("swarm: reference density %g m⁻³: must be positive", set.ReferenceDensity)
	}
	if set.Sharing != EqualSharing && set.Sharing != OneTakesAll {
		return nil, fmt.Errorf("swarm: sharing %d: want EqualSharing or OneTakesAll", set.Sharing)
	}
	if set.MaxEnergy < 0 || math.IsNaN(set.MaxEnergy) {
		return nil, fmt.Errorf("swarm: max energy %g J: must be positive (or 0 for adaptive)", set.MaxEnergy)
	}
	sum := 0.0
	for i, c := range mix {
		if c.Species == nil {
			return nil, fmt.Errorf("swarm: component %d: no species", i+1)
		}
		if !(c.Fraction >= 0 && c.Fraction <= 1) {
			return nil, fmt.Errorf("swarm: fraction of %s %g: allowed 0–1", c.Species.Name, c.Fraction)
		}
		sum += c.Fraction
	}
	if math.Abs(sum-1) > 1e-3 {
		return nil, fmt.Errorf("swarm: mixture fractions sum to %g, want 1 (within 1e-3)", sum)
	}
	sv := &Solver{set: set}
	for _, c := range mix {
		if c.Fraction == 0 {
			continue
		}
		sp := c.Species
		cm := component{name: sp.Name, x: c.Fraction / sum, mass: sp.Mass, ratio: 2 * units.ElectronMass / sp.Mass}
		for i := range sp.Processes {
			p := &sp.Processes[i]
			if p.Kind == Elastic {
				cm.el = newTable1(p)
				continue
			}
			cm.procs = append(cm.procs, proc{p: p, u: p.Threshold / units.ElectronVolt, t: newTable1(p),
				isN2: sp.Name == "N2"})
		}
		if cm.el.E == nil {
			return nil, fmt.Errorf("swarm: species %s has no elastic process", sp.Name)
		}
		switch sp.Name {
		case "N2":
			sv.xN2 = cm.x
		case "O2":
			sv.xO2 = cm.x
		}
		sv.mix = append(sv.mix, cm)
	}
	if len(sv.mix) == 0 {
		return nil, errors.New("swarm: empty mixture")
	}
	return sv, nil
}

// Rate is the rate coefficient of one process at the solved reduced field.
type Rate struct {
	Species   string
	Name      string
	Label     string
	Kind      Kind
	Threshold float64 // [J]
	Fraction  float64 // mole fraction of the target species
	K         float64 // rate coefficient per target molecule [m³/s]
}

// Result is the solution at one reduced field. Powers are per electron and per unit total gas
// density [J m³/s]: the power from the field equals the sum of the collision powers and the
// growth term (PowerBalance reports the residual).
type Result struct {
	Coefficients
	Energy []float64 // energy at the cell centres [J]
	EEDF   []float64 // isotropic distribution F0 [J^-3/2], ∫ ε^½ F0 dε = 1
	Rates  []Rate

	GrowthRate          float64 // ν̄/N = Σ k_ion − Σ k_att (two-body) [m³/s]
	DiffusionN          float64 // transverse diffusion N·D_T = (γ/3) ∫ ε/σ̃ F0 dε [m⁻¹ s⁻¹]
	Characteristic      float64 // characteristic energy e·D_T/μ [J]
	ThreeBodyAttachment float64 // three-body part of Attachment at the reference density [m³/s]
	PowerField          float64 // (E/N)·e·w [J m³/s]
	PowerElastic        float64 // elastic recoil minus heating by the gas [J m³/s]
	PowerInelastic      float64 // Σ x·u·k over excitations and ionisations [J m³/s]
	PowerAttachment     float64 // energy carried away by attached electrons [J m³/s]
	PowerGrowth         float64 // (ν̄/N)·⟨ε⟩, energy given to new electrons [J m³/s]
	Normalisation       float64 // ∫ ε^½ F0 dε on the grid (1 by construction)
	MaxEnergy           float64 // top of the grid [J]
	Iterations          int     // linear solves used
}

// PowerBalance returns (field power − collision powers − growth)/field power.
func (r *Result) PowerBalance() float64 {
	return (r.PowerField - r.PowerElastic - r.PowerInelastic - r.PowerAttachment - r.PowerGrowth) / r.PowerField
}

// RateOf returns the summed rate coefficient (per target molecule) of the processes of species
// with the given label, and whether there was any.
func (r *Result) RateOf(species, label string) (float64, bool) {
	k, ok := 0.0, false
	for _, q := range r.Rates {
		if q.Species == species && q.Label == label {
			k += q.K
			ok = true
		}
	}
	return k, ok
}

// grid holds one energy grid and the quantities that do not depend on ν̄.
type grid struct {
	n       int
	f       []float64 // faces [eV], n+1
	c       []float64 // centres [eV]
	w       []float64 // ∫cell ε^½ dε
	we      []float64 // ∫cell ε^{3/2} dε
	sm      []float64 // total momentum-transfer σ at interior faces (index k = face k)
	se      []float64 // energy-loss σ_ε = Σ x 2m/M σ_el at faces
	inel    []float64 // n×n inelastic operator (loss on the diagonal, gains off it)
	loss    [][]float64
	procIdx []procRef
}

type procRef struct {
	comp int
	proc int
}

const (
	tailTarget = 1e-10 // wanted F0(ε_max)/F0(0)
	tailLo     = 1e-14
	tailHi     = 1e-7
)

func (s *Solver) buildGrid(emax float64) *grid {
	n := s.set.Cells
	g := &grid{n: n, f: make([]float64, n+1), c: make([]float64, n), w: make([]float64, n),
		we: make([]float64, n), sm: make([]float64, n+1), se: make([]float64, n+1)}
	// faces: ε_k = ε_max·(a·s + (1−a)·s²), s = k/n; cells 7× finer at the bottom than at the top
	const a = 0.25
	for k := 0; k <= n; k++ {
		x := float64(k) / float64(n)
		g.f[k] = emax * (a*x + (1-a)*x*x)
	}
	for i := 0; i < n; i++ {
		lo, hi := g.f[i], g.f[i+1]
		g.c[i] = (lo + hi) / 2
		g.w[i] = 2.0 / 3 * (math.Pow(hi, 1.5) - math.Pow(lo, 1.5))
		g.we[i] = 2.0 / 5 * (math.Pow(hi, 2.5) - math.Pow(lo, 2.5))
	}
	for k := 0; k <= n; k++ {
		e := g.f[k]
		for ci := range s.mix {
			cm := &s.mix[ci]
			sel := cm.el.at(e)
			g.se[k] += cm.x * cm.ratio * sel
			tot := sel
			for pi := range cm.procs {
				tot += cm.procs[pi].t.at(e)
			}
			g.sm[k] += cm.x * tot
		}
	}
	g.inel = make([]float64, n*n)
	for ci := range s.mix {
		cm := &s.mix[ci]
		for pi := range cm.procs {
			pr := &cm.procs[pi]
			l := make([]float64, n)
			for j := 0; j < n; j++ {
				l[j] = gamma * pr.t.integral(g.f[j], g.f[j+1])
			}
			g.loss = append(g.loss, l)
			g.procIdx = append(g.procIdx, procRef{ci, pi})
			s.addInelastic(g, pr, cm.x)
		}
	}
	return g
}

// cellOf returns the cell containing energy e (clamped to the grid).
func (g *grid) cellOf(e float64) int {
	i := sort.SearchFloat64s(g.f, e) - 1
	if i < 0 {
		return 0
	}
	if i >= g.n {
		return g.n - 1
	}
	return i
}

// addInelastic adds a process's loss and gain terms to the inelastic operator. The loss from
// source cell j is L_j = x·γ∫εσ dε over the cell (F0 constant in a cell). The scattered
// electrons go to energy T = ε_j − u (excitation, and the primary with one-takes-all), twice to
// T = (ε_j − u)/2 (ionisation with equal sharing), or nowhere (attachment); the secondary of a
// one-takes-all ionisation goes to the lowest cell (the primary then goes to ε_j − u − ε_0). A packet at energy T is split between the
// two cells whose centres bracket T so that both the number and the energy (in the cell-centre
// energies that the discrete energy balance uses) are conserved exactly: the discrete
// operator then loses exactly u per collision.
func (s *Solver) addInelastic(g *grid, pr *proc, x float64) {
	n := g.n
	u := pr.u
	kind := pr.p.Kind
	for j := 0; j < n; j++ {
		lj := x * gamma * pr.t.integral(g.f[j], g.f[j+1])
		if lj == 0 {
			continue
		}
		g.inel[j*n+j] += lj
		switch {
		case kind == Attachment:
		case kind == Ionisation && s.set.Sharing == EqualSharing:
			g.place(j, (g.c[j]-u)/2, 2*lj)
		case kind == Ionisation: // one takes all: the secondary sits in the lowest cell, at
			// energy c_0, which the primary gives up so that energy is conserved exactly
			g.place(j, g.c[j]-u-g.c[0], lj)
			g.inel[0*n+j] -= lj
		default:
			g.place(j, g.c[j]-u, lj)
		}
	}
}

// place adds electrons scattered out of cell j at rate coefficient w to the cells around
// energy e [eV], splitting linearly between the bracketing cell centres.
func (g *grid) place(j int, e, w float64) {
	n := g.n
	if e <= g.c[0] {
		g.inel[0*n+j] -= w
		return
	}
	if e >= g.c[n-1] {
		g.inel[(n-1)*n+j] -= w
		return
	}
	i := sort.SearchFloat64s(g.c, e) - 1 // c[i] < e <= c[i+1]
	p := (g.c[i+1] - e) / (g.c[i+1] - g.c[i])
	g.inel[i*n+j] -= p * w
	g.inel[(i+1)*n+j] -= (1 - p) * w
}

// bernoulli is x/(eˣ − 1).
func bernoulli(x float64) float64 {
	if math.Abs(x) < 1e-8 {
		return 1 - x/2
	}
	return x / math.Expm1(x)
}

// state is one linear solve's output.
type state struct {
	F           []float64
	kIon, kAtt  float64 // mixture-summed two-body rates per total N [m³/s]
	tailRatio   float64
	sigmaTilde  []float64
	iterations  int
	nu          float64
	reducedFld  float64
	g           *grid
	lu          mat.LU
	a           *mat.Dense
	rhs, xv     *mat.VecDense
	kT          float64
	fieldSquare float64
}

// solveLinear assembles and solves the system for a given ν̄/N [m³/s].
func (s *Solver) solveLinear(st *state, nu float64) error {
	g := st.g
	n := g.n
	A := st.a.RawMatrix().Data
	copy(A, g.inel)
	en2 := st.fieldSquare
	kT := st.kT
	for k := 1; k < n; k++ {
		e := g.f[k]
		h := g.c[k] - g.c[k-1]
		sm := g.sm[k] + nu/(gamma*math.Sqrt(e))
		if sm < 1e-3*g.sm[k] {
			sm = 1e-3 * g.sm[k] // guard against a negative σ̃ under strong attachment
		}
		st.sigmaTilde[k] = sm
		D := gamma/3*en2*e/sm + gamma*kT*e*e*g.se[k]
		W := -gamma * e * e * g.se[k]
		z := W * h / D
		dh := D / h
		up := dh * bernoulli(-z) // coefficient of F_{k-1} in Γ_k
		dn := dh * bernoulli(z)  // minus coefficient of F_k in Γ_k
		A[(k-1)*n+(k-1)] += up
		A[(k-1)*n+k] -= dn
		A[k*n+(k-1)] -= up
		A[k*n+k] += dn
	}
	for i := 0; i < n; i++ {
		A[i*n+i] += nu * g.w[i]
	}
	// normalisation replaces the first row
	for j := 0; j < n; j++ {
		A[j] = g.w[j]
	}
	st.lu.Factorize(st.a)
	if err := st.lu.SolveVecTo(st.xv, false, st.rhs); err != nil {
		var c mat.Condition
		if !errors.As(err, &c) {
			return fmt.Errorf("swarm: linear solve at E/N = %.4g Td: %w", st.reducedFld/units.Townsend, err)
		}
	}
	F := st.F
	for i := range F {
		F[i] = st.xv.AtVec(i)
		if math.IsNaN(F[i]) || math.IsInf(F[i], 0) {
			return fmt.Errorf("swarm: linear solve at E/N = %.4g Td gave a non-finite EEDF", st.reducedFld/units.Townsend)
		}
	}
	st.iterations++
	st.kIon, st.kAtt = 0, 0
	for r, ref := range g.procIdx {
		pr := &s.mix[ref.comp].procs[ref.proc]
		if pr.p.Kind != Ionisation && pr.p.Kind != Attachment {
			continue
		}
		k := 0.0
		for j, l := range g.loss[r] {
			k += l * F[j]
		}
		if pr.p.Kind == Ionisation {
			st.kIon += s.mix[ref.comp].x * k
		} else {
			st.kAtt += s.mix[ref.comp].x * k
		}
	}
	top := math.Max(math.Abs(F[n-1]), math.Abs(F[n-2]))
	st.tailRatio = top / math.Abs(F[0])
	st.nu = nu
	return nil
}

// solveNu iterates ν̄/N to self-consistency on the current grid (secant on ν − (k_ion − k_att)).
func (s *Solver) solveNu(st *state, nu0 float64) error {
	x0 := nu0
	if err := s.solveLinear(st, x0); err != nil {
		return err
	}
	g0 := st.kIon - st.kAtt - x0
	scale := func() float64 { return st.kIon + st.kAtt + 1e-40 }
	if math.Abs(g0) <= 1e-7*scale() {
		return nil
	}
	x1 := st.kIon - st.kAtt
	for it := 0; it < 60; it++ {
		if err := s.solveLinear(st, x1); err != nil {
			return err
		}
		g1 := st.kIon - st.kAtt - x1
		if math.Abs(g1) <= 1e-7*scale() {
			return nil
		}
		var x2 float64
		if g1 != g0 {
			x2 = x1 - g1*(x1-x0)/(g1-g0)
		} else {
			x2 = st.kIon - st.kAtt
		}
		x0, g0, x1 = x1, g1, x2
	}
	return fmt.Errorf("swarm: growth rate did not converge at E/N = %.4g Td", st.reducedFld/units.Townsend)
}

// Solve solves the Boltzmann equation at |reducedField| [V m²] (allowed 1e-3–1e5 Td).
func (s *Solver) Solve(reducedField float64) (*Result, error) {
	en := math.Abs(reducedField)
	td := en / units.Townsend
	if !(td >= 1e-3 && td <= 1e5) {
		return nil, fmt.Errorf("swarm: reduced field %g Td: allowed 1e-3–1e5 Td", td)
	}
	n := s.set.Cells
	st := &state{reducedFld: en, F: make([]float64, n), sigmaTilde: make([]float64, n+1),
		a: mat.NewDense(n, n, nil), rhs: mat.NewVecDense(n, nil), xv: mat.NewVecDense(n, nil),
		kT: units.Boltzmann * s.set.GasTemperature / units.ElementaryCharge, fieldSquare: en * en}
	if s.set.ColdGas {
		st.kT = 0
	}
	st.rhs.SetVec(0, 1)
	emax := s.set.MaxEnergy / units.ElectronVolt
	adaptive := emax == 0
	if adaptive {
		guess := 8 * math.Pow(td/10, 0.55) // [eV], a rough fit of the N₂ results
		emax = s.lastMax
		if emax == 0 || emax > 4*guess || emax < guess/4 {
			emax = guess
		}
	}
	nu := s.lastNu
	loB, hiB := 0.0, 0.0
	for iter := 0; ; iter++ {
		st.g = s.buildGrid(emax)
		if err := s.solveNu(st, nu); err != nil {
			return nil, err
		}
		nu = st.nu
		r := st.tailRatio
		if !adaptive || (r >= tailLo && r <= tailHi) {
			break
		}
		if iter >= 25 {
			return nil, fmt.Errorf("swarm: energy grid did not settle at E/N = %.4g Td (tail ratio %.3g at %.4g eV)", td, r, emax)
		}
		if math.IsNaN(r) {
			return nil, fmt.Errorf("swarm: EEDF not finite at E/N = %.4g Td", td)
		}
		if r > tailHi {
			loB = emax // the grid is too short: the tail has not decayed
		} else {
			hiB = emax // the tail decayed too far (possibly to zero)
		}
		if loB > 0 && hiB > 0 {
			emax = math.Sqrt(loB * hiB)
			continue
		}
		var f float64
		switch {
		case r >= 1:
			f = 2.5
		case r <= 1e-300:
			f = 0.5
		default:
			f = math.Log(tailTarget) / math.Log(r)
		}
		emax *= math.Max(0.5, math.Min(2.5, f))
	}
	if adaptive {
		s.lastMax = emax
	}
	s.lastNu = nu
	return s.result(st), nil
}

// Sweep solves at each reduced field in turn (ascending order is fastest: each solve starts
// from the previous grid and growth rate).
func (s *Solver) Sweep(fields []float64) ([]*Result, error) {
	out := make([]*Result, len(fields))
	for i, en := range fields {
		r, err := s.Solve(en)
		if err != nil {
			return nil, err
		}
		out[i] = r
	}
	return out, nil
}

// result turns a converged state into the Result: the EEDF, transport, each process's rate,
// the power balance and its split by channel.
func (s *Solver) result(st *state) *Result {
	g := st.g
	n := g.n
	en := st.reducedFld
	ev := units.ElectronVolt
	r := &Result{Energy: make([]float64, n), EEDF: make([]float64, n), MaxEnergy: g.f[n] * ev,
		Iterations: st.iterations, GrowthRate: st.nu}
	mean := fillEEDF(r, st)
	muN, dN, pel := transportSums(st)
	w := muN * en
	c := s.collisionSums(st, r)
	r.DiffusionN = dN
	if muN > 0 {
		r.Characteristic = dN / muN * ev
	}
	r.PowerField = en * w * ev
	r.PowerElastic = pel * ev
	r.PowerInelastic = c.pinel * ev
	r.PowerAttachment = c.patt * ev
	r.PowerGrowth = st.nu * mean * ev
	k3 := 0.0
	if !s.set.NoThreeBody && s.xO2 > 0 {
		k3 = s.threeBody(mean)
	}
	r.ThreeBodyAttachment = k3
	r.Coefficients = Coefficients{ReducedField: en, MeanEnergy: mean * ev, DriftVelocity: w,
		Ionisation: c.kIon, Attachment: c.kAtt + k3, ExciteA: c.kA, ExciteB: c.kB, ExciteC: c.kC,
		ThreeBodyAttachment: k3, ExciteW: c.kW, ExciteBPrime: c.kBp}
	// The power split: the elastic recoil, each channel's collisions, and the energy given to
	// new electrons counted with ionisation. Where attachment outpaces ionisation that last
	// term is negative; it is left out there (its size is the energy the lost electrons
	// carried, already in the attachment channel). Energies in eV as the sums above.
	split := c.split
	split[ChannelElastic] += max(pel, 0)
	split[ChannelIonisation] += max(st.nu*mean, 0)
	for ch := range split {
		r.Power[ch] = max(split[ch], 0) * ev
	}
	if w > 0 {
		r.AlphaN = c.kIon / w
		r.EtaN = (c.kAtt + k3) / w
	}
	return r
}

// fillEEDF sets r's cell energies [J], EEDF [J^-3/2] and normalisation from the state and
// returns the mean energy [eV].
func fillEEDF(r *Result, st *state) float64 {
	g := st.g
	ev := units.ElectronVolt
	conv := math.Pow(ev, -1.5)
	mean, norm := 0.0, 0.0
	for i := 0; i < g.n; i++ {
		r.Energy[i] = g.c[i] * ev
		r.EEDF[i] = st.F[i] * conv
		mean += st.F[i] * g.we[i]
		norm += st.F[i] * g.w[i]
	}
	r.Normalisation = norm
	return mean
}

// transportSums returns the reduced mobility μN from the face gradients,
// μN = −(γ/3) ∫ ε/σ̃ dF0/dε dε, the reduced diffusion DN = (γ/3) ∫ ε/σ̃ F0 dε and the power
// the elastic power pel (recoil less the gas's thermal share), all in the solver's internal
// units (energies in eV).
func transportSums(st *state) (muN, dN, pel float64) {
	g := st.g
	n := g.n
	F := st.F
	for i := 0; i < n; i++ {
		// σ̃ at the cell centre from the neighbouring faces (the end cells use their inner face)
		var st1 float64
		switch {
		case i == 0:
			st1 = st.sigmaTilde[1]
		case i == n-1:
			st1 = st.sigmaTilde[n-1]
		default:
			st1 = (st.sigmaTilde[i] + st.sigmaTilde[i+1]) / 2
		}
		dN += gamma / 3 * g.c[i] / st1 * F[i] * (g.f[i+1] - g.f[i])
	}
	for k := 1; k < n; k++ {
		e := g.f[k]
		h := g.c[k] - g.c[k-1]
		muN -= gamma / 3 * e / st.sigmaTilde[k] * (F[k] - F[k-1])
		pel += gamma * e * e * g.se[k] * ((F[k]+F[k-1])/2 + st.kT*(F[k]-F[k-1])/h) * h
	}
	// the half cells at both ends of the face sum
	pel += gamma * g.f[1] * g.f[1] * g.se[1] * F[0] * (g.c[0] - g.f[0]) / 3
	return muN, dN, pel
}

// collisionTotals are the sums over every process of a solve, per total gas molecule: the
// N₂ excitation rates by label, the ionisation and attachment rates [m³/s], the inelastic and
// attachment powers and the power by channel [eV m³/s].
type collisionTotals struct {
	kA, kB, kC, kW, kBp, kIon, kAtt, pinel, patt float64
	split                                        [NumChannels]float64
}

// collisionSums appends each process's rate to r.Rates and returns the totals.
func (s *Solver) collisionSums(st *state, r *Result) collisionTotals {
	g := st.g
	F := st.F
	var c collisionTotals
	for q, ref := range g.procIdx {
		cm := &s.mix[ref.comp]
		pr := &cm.procs[ref.proc]
		k, ke := 0.0, 0.0
		for j, l := range g.loss[q] {
			k += l * F[j]
			ke += l * F[j] * g.c[j]
		}
		r.Rates = append(r.Rates, Rate{Species: cm.name, Name: pr.p.Name, Label: pr.p.Label,
			Kind: pr.p.Kind, Threshold: pr.p.Threshold, Fraction: cm.x, K: k})
		ch := channelOf(cm.name, pr.p.Kind, pr.p.Label)
		switch pr.p.Kind {
		case Ionisation:
			c.kIon += cm.x * k
			c.pinel += cm.x * pr.u * k
			c.split[ch] += cm.x * pr.u * k
		case Attachment:
			c.kAtt += cm.x * k
			c.patt += cm.x * ke
			c.split[ch] += cm.x * ke
		default:
			c.pinel += cm.x * pr.u * k
			c.split[ch] += cm.x * pr.u * k
		}
		if pr.isN2 {
			c.addN2(pr.p.Label, k)
		}
	}
	return c
}

// addN2 adds an N₂ process's rate k to the excitation total its label names, if any.
func (c *collisionTotals) addN2(label string, k float64) {
	switch label {
	case "A":
		c.kA += k
	case "B":
		c.kB += k
	case "C":
		c.kC += k
	case "W":
		c.kW += k
	case "Bp":
		c.kBp += k
	}
}

// threeBody returns the three-body attachment e + O₂ + M → O₂⁻ + M as a two-body rate per total
// gas molecule at the reference density [m³/s], from the Kossyi et al. (1992) expressions with
// T_e = (2/3)⟨ε⟩/k_B:
//
//	k(M = O₂) = 1.4e-41 (300/T_e) exp(−600/T_g) exp(700 (T_e − T_g)/(T_e T_g)) m⁶/s
//	k(M = N₂) = 1.1e-43 (300/T_e)² exp(−70/T_g) exp(1500 (T_e − T_g)/(T_e T_g)) m⁶/s
func (s *Solver) threeBody(meanEV float64) float64 {
	te := 2.0 / 3 * meanEV * units.ElementaryCharge / units.Boltzmann
	tg := s.set.GasTemperature
	if tg < 1 {
		tg = 300
	}
	if te < tg {
		te = tg
	}
	kO2 := 1.4e-41 * (300 / te) * math.Exp(-600/tg) * math.Exp(700*(te-tg)/(te*tg))
	kN2 := 1.1e-43 * (300 / te) * (300 / te) * math.Exp(-70/tg) * math.Exp(1500*(te-tg)/(te*tg))
	nref := s.set.ReferenceDensity
	return s.xO2 * nref * (s.xO2*kO2 + s.xN2*kN2)
}
