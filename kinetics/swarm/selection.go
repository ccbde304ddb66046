package swarm

import (
	"math"
	"sort"
)

// Column names one interpolated coefficient of a Table, for Select.
type Column int

// The columns of a table, in the order of Coefficients; the power split takes NumChannels
// columns from ColPower on (ColPower + Column(c) for Channel c).
const (
	ColMeanEnergy Column = iota
	ColDrift
	ColAlphaN
	ColEtaN
	ColIonisation
	ColAttachment
	ColExciteA
	ColExciteB
	ColExciteC
	ColThreeBodyAttachment
	ColExciteW
	ColExciteBPrime
	ColPower
)

// Selection interpolates chosen columns of a Table by the rules of Table.At, with the same
// operations, so it returns the same numbers bit for bit; it computes only its columns, gives
// their derivatives d/d(E/N) when asked, and does not count out-of-range lookups. Table.At is
// a Selection of every column. A Selection is immutable and safe for concurrent use.
type Selection struct {
	m       int       // number of columns
	drift   int       // position of ColDrift among the columns, or −1
	x, logx []float64 // E/N of the rows [V m²] and its logarithm
	lin     []float64 // the values, m per row
	logv    []float64 // ln of the values, m per row (NaN where not positive)
	slope   []float64 // d ln v / d ln(E/N), m per interval, or linearMark
}

// Select returns the interpolation of the given columns of t; the values and derivatives of
// Selection.At come in the order of cols.
func (t *Table) Select(cols ...Column) *Selection {
	n, m := len(t.rows), len(cols)
	s := &Selection{
		m: m, drift: -1,
		x: make([]float64, n), logx: make([]float64, n),
		lin: make([]float64, n*m), logv: make([]float64, n*m), slope: make([]float64, (n-1)*m),
	}
	for j, c := range cols {
		if c == ColDrift {
			s.drift = j
		}
	}
	for i := range t.rows {
		s.x[i], s.logx[i] = t.rows[i].ReducedField, math.Log(t.rows[i].ReducedField)
		all := t.rows[i].values()
		for j, c := range cols {
			v := all[c]
			s.lin[i*m+j], s.logv[i*m+j] = v, math.NaN()
			if v > 0 {
				s.logv[i*m+j] = math.Log(v)
			}
		}
	}
	for i := 0; i+1 < n; i++ {
		for j := range m {
			a, b := s.logv[i*m+j], s.logv[(i+1)*m+j]
			if math.IsNaN(a) || math.IsNaN(b) {
				s.slope[i*m+j] = linearMark
				continue
			}
			s.slope[i*m+j] = (b - a) / (s.logx[i+1] - s.logx[i])
		}
	}
	return s
}

// At sets v[j] for first ≤ j < last to column j of the selection at |E/N| = en [V m²] and,
// when d is not nil, d[j] to its derivative with respect to E/N (one-sided, from above, on a
// row); other entries are left alone, so a caller asks only for the columns it needs. v and d
// must hold a value per column. Outside the rows it follows Table.At: above the last row every value is
// held; below the first row (and at zero or NaN) every value is held but the drift velocity,
// which is proportional to E/N.
func (s *Selection) At(en float64, first, last int, v, d []float64) {
	m, n := s.m, len(s.x)
	lo, hi := s.x[0], s.x[n-1]
	switch {
	case !(en >= lo) || math.IsNaN(en): // below the range, zero or NaN
		if math.IsNaN(en) {
			en = 0
		}
		s.held(0, first, last, v, d)
		if j := s.drift; j >= first && j < last {
			v[j] = s.lin[j] * en / lo
			if d != nil {
				d[j] = s.lin[j] / lo
			}
		}
		return
	case en > hi:
		s.held(n-1, first, last, v, d)
		return
	}
	x := math.Log(en)
	// The last row i with logx[i] ≤ x, within [0, n−2].
	i := max(0, min(sort.Search(n, func(k int) bool { return s.logx[k] > x })-1, n-2))
	dx := x - s.logx[i]
	a, b := s.lin[i*m:(i+1)*m], s.lin[(i+1)*m:(i+2)*m]
	la, sl := s.logv[i*m:(i+1)*m], s.slope[i*m:(i+1)*m]
	for j := first; j < last; j++ {
		if sl[j] == linearMark {
			f := (en - s.x[i]) / (s.x[i+1] - s.x[i])
			// Clamped at zero: where ln(E/N) rounds onto a row's logarithm from below, f is a
			// little below 0 and a value rising from zero would come out a little negative.
			v[j] = max(0, a[j]+f*(b[j]-a[j]))
			if d != nil {
				d[j] = (b[j] - a[j]) / (s.x[i+1] - s.x[i])
			}
			continue
		}
		v[j] = math.Exp(la[j] + sl[j]*dx)
		if d != nil {
			d[j] = v[j] * sl[j] / en
		}
	}
}

// held sets v[first:last] to the values of a row and d[first:last], when d is not nil, to zero.
func (s *Selection) held(row, first, last int, v, d []float64) {
	copy(v[first:last], s.lin[row*s.m+first:row*s.m+last])
	if d != nil {
		clear(d[first:last])
	}
}
