package swarm

import (
	"errors"
	"fmt"
	"math"
	"sync/atomic"

	"n2pulse/units"
)

// Coefficients are the electron transport and rate coefficients at one reduced field (SI).
//
// Ionisation and Attachment are per molecule of the whole gas (the electron balance is
// dn_e/dt = (k_ion − k_att)·N·n_e with N the total density); ExciteA, ExciteB and ExciteC are per
// N₂ molecule (the excitation rate density is k·n_e·N_N₂). In pure N₂ the two are the same.
type Coefficients struct {
	ReducedField  float64 // E/N [V m²]
	MeanEnergy    float64 // [J]
	DriftVelocity float64 // [m/s]
	AlphaN        float64 // Townsend ionisation coefficient α/N [m²]
	EtaN          float64 // attachment coefficient η/N [m²]
	Ionisation    float64 // k_ion [m³/s]
	Attachment    float64 // k_att [m³/s]
	ExciteA       float64 // k for X → A³Σu⁺ (all v) [m³/s]
	ExciteB       float64 // k for X → B³Πg (all v) [m³/s]
	ExciteC       float64 // k for X → C³Πu (all v) [m³/s]

	// Optional: zero in a table that does not give them.
	// ThreeBodyAttachment is the part of Attachment (and of EtaN·DriftVelocity) that comes from
	// three-body attachment to O₂, taken at ReferenceDensity [m³/s]; see Table.AtDensity.
	ThreeBodyAttachment float64
	ExciteW             float64              // k for X → W³Δu, per N₂ molecule [m³/s]
	ExciteBPrime        float64              // k for X → B′³Σu⁻, per N₂ molecule [m³/s]
	Power               [NumChannels]float64 // power taken by each Channel, per electron and per molecule of the whole gas [J m³/s]
}

// nbase is the number of interpolated quantities after ReducedField that every table has;
// nfields counts the optional ones too.
const (
	nbase   = 9
	nfields = nbase + 3 + int(NumChannels)
)

func (c *Coefficients) values() [nfields]float64 {
	v := [nfields]float64{c.MeanEnergy, c.DriftVelocity, c.AlphaN, c.EtaN, c.Ionisation,
		c.Attachment, c.ExciteA, c.ExciteB, c.ExciteC, c.ThreeBodyAttachment, c.ExciteW, c.ExciteBPrime}
	copy(v[nbase+3:], c.Power[:])
	return v
}

func fromValues(en float64, v *[nfields]float64) Coefficients {
	c := Coefficients{ReducedField: en, MeanEnergy: v[0], DriftVelocity: v[1], AlphaN: v[2],
		EtaN: v[3], Ionisation: v[4], Attachment: v[5], ExciteA: v[6], ExciteB: v[7], ExciteC: v[8],
		ThreeBodyAttachment: v[9], ExciteW: v[10], ExciteBPrime: v[11]}
	copy(c.Power[:], v[nbase+3:])
	return c
}

// HasPowerSplit reports whether the coefficients carry a power split (tables written before
// the split was added, and user tables without its columns, do not).
func (c *Coefficients) HasPowerSplit() bool {
	for _, p := range c.Power {
		if p > 0 {
			return true
		}
	}
	return false
}

// Table is a swarm table: Coefficients at ascending reduced fields, interpolated linearly in
// log–log between rows (a zero value is interpolated linearly in E/N instead, so rates that
// vanish at low E/N stay zero there). A Table is immutable after construction and safe for
// concurrent use; only its out-of-range counters change, atomically.
//
// Lookups outside the rows' range are clamped and counted:
//   - above the last row every coefficient is the last row's;
//   - below the first row the drift velocity follows constant mobility, v = v₁·(E/N)/(E/N)₁, so
//     it goes to zero smoothly at E/N = 0, and the mean energy and rate coefficients are held at
//     the first row's values (they are tiny there for the excitation and ionisation rates),
//     and so are α/N and η/N (recomputing them from held rates and a vanishing velocity
//     would diverge).
//
// E/N = 0 returns zero drift velocity and the first row's other values; it is counted as below.
type Table struct {
	rows  []Coefficients
	all   *Selection // the interpolation of every column
	below atomic.Int64
	above atomic.Int64
}

// NewTable checks rows (at least two, E/N positive and strictly ascending, all values finite
// and not negative, drift velocity positive, the three-body part of the attachment not above
// the attachment) and builds a table over a copy of them.
func NewTable(rows []Coefficients) (*Table, error) {
	if len(rows) < 2 {
		return nil, fmt.Errorf("swarm: table needs at least 2 rows, got %d", len(rows))
	}
	t := &Table{rows: append([]Coefficients(nil), rows...)}
	for i, r := range t.rows {
		if !(r.ReducedField > 0) || math.IsInf(r.ReducedField, 0) {
			return nil, fmt.Errorf("swarm: row %d: reduced field %g V m²: must be positive and finite", i+1, r.ReducedField)
		}
		if i > 0 && r.ReducedField <= t.rows[i-1].ReducedField {
			return nil, fmt.Errorf("swarm: row %d: reduced field %g V m²: must be above the previous row's %g", i+1, r.ReducedField, t.rows[i-1].ReducedField)
		}
		if !(r.DriftVelocity > 0) {
			return nil, fmt.Errorf("swarm: row %d: drift velocity %g m/s: must be positive", i+1, r.DriftVelocity)
		}
		if r.ThreeBodyAttachment > r.Attachment*(1+1e-12) {
			return nil, fmt.Errorf("swarm: row %d: k_att3 %g m³/s: must not exceed k_att %g m³/s", i+1, r.ThreeBodyAttachment, r.Attachment)
		}
		v := r.values()
		for k, x := range v {
			if math.IsNaN(x) || math.IsInf(x, 0) || x < 0 {
				return nil, fmt.Errorf("swarm: row %d: %s %g: must be finite and not negative", i+1, fieldNames[k], x)
			}
		}
	}
	cols := make([]Column, nfields)
	for k := range cols {
		cols[k] = Column(k)
	}
	t.all = t.Select(cols...)
	return t, nil
}

// linearMark flags an interval where a value is zero at one end and is interpolated linearly.
var linearMark = math.Inf(1)

var fieldNames = func() [nfields]string {
	n := [nfields]string{"mean energy", "drift velocity", "alpha/N", "eta/N", "k_ion", "k_att", "k_A", "k_B", "k_C", "k_att3", "k_W", "k_Bp"}
	for c := range NumChannels {
		n[nbase+3+int(c)] = "power " + c.String()
	}
	return n
}()

// ErrEmpty is returned by readers when a table has no rows.
var ErrEmpty = errors.New("swarm: table has no rows")

// At returns the coefficients at |reducedField| [V m²]. It does not allocate.
func (t *Table) At(reducedField float64) Coefficients {
	en := math.Abs(reducedField)
	lo, hi := t.Range()
	switch {
	case !(en >= lo) || math.IsNaN(en): // below the range, zero, or NaN
		t.below.Add(1)
		if math.IsNaN(en) {
			en = 0
		}
	case en > hi:
		t.above.Add(1)
	}
	var v [nfields]float64
	t.all.At(en, 0, nfields, v[:], nil)
	return fromValues(en, &v)
}

// ReferenceDensity is the total gas density [m⁻³] at which the three-body attachment in the
// solver's tables is counted (101325 Pa at 300 K, 2.446e25 m⁻³): the k_att3_m3_s column and the
// part of k_att and η/N it gives.
var ReferenceDensity = units.GasDensity(units.Atmosphere, 300)

// AtDensity returns the table for a gas of total density n [m⁻³]: three-body attachment, a
// two-body rate proportional to the density, is rescaled from ReferenceDensity to n in the
// attachment rate, η/N and the k_att3 column; every other value is unchanged (the power split
// keeps its 1-atm attachment share, a small term below 100 Td). A table without three-body
// attachment (all k_att3 zero, as a user table without that column) is returned as it is.
// n must be positive and finite.
func (t *Table) AtDensity(n float64) (*Table, error) {
	if !(n > 0) || math.IsInf(n, 0) {
		return nil, fmt.Errorf("swarm: gas density %g m⁻³: must be positive and finite", n)
	}
	has := false
	for _, r := range t.rows {
		has = has || r.ThreeBodyAttachment > 0
	}
	if !has || n == ReferenceDensity {
		return t, nil
	}
	f := n / ReferenceDensity
	rows := t.Rows()
	for i := range rows {
		r := &rows[i]
		d := r.ThreeBodyAttachment * (f - 1)
		r.Attachment = max(0, r.Attachment+d)
		r.EtaN = max(0, r.EtaN+d/r.DriftVelocity)
		r.ThreeBodyAttachment *= f
	}
	return NewTable(rows)
}

// Range returns the lowest and highest reduced field of the rows [V m²].
func (t *Table) Range() (lo, hi float64) {
	return t.rows[0].ReducedField, t.rows[len(t.rows)-1].ReducedField
}

// OutOfRange returns how many lookups fell below and above the range since construction.
func (t *Table) OutOfRange() (below, above int64) { return t.below.Load(), t.above.Load() }

// Rows returns a copy of the table's rows.
func (t *Table) Rows() []Coefficients { return append([]Coefficients(nil), t.rows...) }
