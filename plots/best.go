package plots

import (
	"math"

	"n2pulse/kinetics/study"
)

// lasesColumn is the results-table column that says whether a point lases.
const lasesColumn = "lases"

// Masked reports why a point of a sweep has no value of metric to draw or rank: "failed" (or
// the status it has, such as "truncated") when it was not computed in full, "no laser pulse"
// for a property of the pulse at a point that does not lase, "undefined" for an empty cell; ""
// when the value counts.
func Masked(t *study.Table, r int, metric string) string {
	if !t.OK(r) {
		if c := t.Column(study.StatusColumn); c >= 0 && t.Rows[r][c] != "" {
			s := t.Rows[r][c]
			if len(s) > 6 && s[:6] == "failed" {
				return "failed"
			}
			return s
		}
		return "failed"
	}
	if LabelOf(metric).Pulse {
		if c := t.Column(lasesColumn); c >= 0 && t.Rows[r][c] == "false" {
			return "no laser pulse"
		}
	}
	c := t.Column(metric)
	if c < 0 {
		return "undefined"
	}
	if v := t.Float(r, c); math.IsNaN(v) || math.IsInf(v, 0) {
		return "undefined"
	}
	return ""
}

// values returns metric at every row of t, NaN where Masked says the value does not count.
func values(t *study.Table, metric string) []float64 {
	v := make([]float64, len(t.Rows))
	c := t.Column(metric)
	for r := range v {
		v[r] = math.NaN()
		if c >= 0 && Masked(t, r, metric) == "" {
			v[r] = t.Float(r, c)
		}
	}
	return v
}

// Best is the optimum of one metric over a sweep.
type Best struct {
	Metric string  `json:"metric"`
	Word   string  `json:"optimum"` // "maximum" or "minimum"
	Row    int     `json:"point"`   // row (point) of the table, −1 when no point counts
	Value  float64 `json:"value"`   // in the metric's stored (SI) unit
	// At holds the varied keys' values at the optimum, in SI, under their column headings.
	At map[string]float64 `json:"at,omitempty"`
	// Edge lists the varied keys at whose first or last grid value the optimum lies: the best
	// may lie beyond the range swept.
	Edge []string `json:"edge,omitempty"`
	// Masked counts the points left out: failed, not lasing (for pulse metrics), undefined.
	Masked int `json:"masked"`
}

// Optimum returns the best counted value of metric over a sweep of the given axes (the largest,
// or the smallest where LabelOf says so); points that Masked leaves out are never chosen.
func Optimum(t *study.Table, axes []study.Axis, metric string) Best {
	l := LabelOf(metric)
	b := Best{Metric: metric, Word: l.Optimum(), Row: -1}
	v := values(t, metric)
	for i, x := range v {
		if math.IsNaN(x) {
			b.Masked++
			continue
		}
		if b.Row < 0 || (l.Minimise && x < v[b.Row]) || (!l.Minimise && x > v[b.Row]) {
			b.Row = i
		}
	}
	if b.Row < 0 {
		return b
	}
	b.Value = v[b.Row]
	// Point index → grid indices, the last axis fastest.
	rest := b.Row
	idx := make([]int, len(axes))
	for k := len(axes) - 1; k >= 0; k-- {
		if axes[k].N > 0 {
			idx[k] = rest % axes[k].N
			rest /= axes[k].N
		}
	}
	b.At = map[string]float64{}
	for k, a := range axes {
		if c := t.Column(a.Header()); c >= 0 {
			b.At[a.Header()] = t.Float(b.Row, c)
		}
		if a.N > 2 && (idx[k] == 0 || idx[k] == a.N-1) {
			b.Edge = append(b.Edge, a.Key)
		}
	}
	return b
}
