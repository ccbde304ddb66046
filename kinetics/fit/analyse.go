package fit

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Thresholds of the determination rules (package comment).
const (
	rankTolerance = 1e-3 // singular value below this fraction of the largest: a null direction
	nullShare     = 0.2  // component of a null direction that marks a key as not determined
	boundMargin   = 0.02 // in ln x: within 2 % of a bound is at the bound
)

// analyse fills res at the optimum theta: residuals, Jacobian, intervals, correlations,
// determination, the fitted design.
func (p *problem) analyse(res *Result, theta []float64, maxSpread float64) error {
	J, r, err := p.jacobian(theta)
	if err != nil {
		return fmt.Errorf("fit: the Jacobian at the optimum: %w", err)
	}
	n, np := J.Dims()
	res.ChiSquare = chi2(r)
	res.Params = make([]Param, np)
	for j, f := range p.free {
		start, _ := p.base.Get(f.Key)
		res.Params[j] = Param{Key: f.Key, Start: start, Lo: f.Lo, Hi: f.Hi, Value: math.Exp(theta[j]),
			SDLog: math.NaN(), Lo95: math.NaN(), Hi95: math.NaN(), Determined: true}
	}
	for k, pv := range p.valueOf {
		pt := p.data.Points[pv.point]
		v := pt.Values[pv.value]
		y := v.Value * math.Exp(r[k]*p.scale[k])
		res.Residuals = append(res.Residuals, Residual{Point: pv.point, Line: pt.Line, Quantity: v.Quantity,
			Measured: v.Value, Model: y, Uncertainty: v.Uncertainty, Normalised: r[k]})
	}

	// Null directions of J: keys the data cannot resolve.
	var svd mat.SVD
	if !svd.Factorize(J, mat.SVDThin) {
		return fmt.Errorf("fit: the singular value decomposition of the Jacobian failed")
	}
	res.Singular = svd.Values(nil)
	var V mat.Dense
	svd.VTo(&V)
	smax := res.Singular[0]
	for i, s := range res.Singular {
		if s > rankTolerance*smax && smax > 0 {
			continue
		}
		var involved []int
		for j := range np {
			if math.Abs(V.At(j, i)) > nullShare {
				involved = append(involved, j)
			}
		}
		for _, j := range involved {
			pr := &res.Params[j]
			if !pr.Determined {
				continue
			}
			pr.Determined = false
			if colNorm(J, j) <= rankTolerance*smax || smax == 0 {
				pr.Why = "the measured values do not change with this key (no point's figures move with it)"
				continue
			}
			var others []string
			for _, o := range involved {
				if o != j {
					others = append(others, p.free[o].Key)
				}
			}
			pr.Why = "the data see only a combination of this key with " + strings.Join(others, ", ") + ", not each alone"
		}
	}

	// Covariance of the keys J resolves.
	var keep []int
	for j := range np {
		if res.Params[j].Determined {
			keep = append(keep, j)
		}
	}
	res.DOF = n - len(keep)
	res.Correlation = make([][]float64, np)
	for j := range res.Correlation {
		res.Correlation[j] = make([]float64, np)
		for k := range res.Correlation[j] {
			res.Correlation[j][k] = math.NaN()
		}
	}
	scale2, t := 1.0, 1.959963984540054 // normal 97.5 % quantile
	res.RelScatter = math.NaN()
	if !p.data.Uncertain {
		res.ScatterEstimated = true
		if res.DOF > 0 {
			scale2 = res.ChiSquare / float64(res.DOF)
			res.RelScatter = math.Sqrt(scale2)
			t = distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(res.DOF)}.Quantile(0.975)
		} else {
			scale2 = math.NaN()
		}
	}
	if len(keep) > 0 {
		Jk := mat.NewDense(n, len(keep), nil)
		for a, j := range keep {
			for k := range n {
				Jk.Set(k, a, J.At(k, j))
			}
		}
		var sk mat.SVD
		if !sk.Factorize(Jk, mat.SVDThin) {
			return fmt.Errorf("fit: the singular value decomposition of the Jacobian failed")
		}
		s := sk.Values(nil)
		var Vk mat.Dense
		sk.VTo(&Vk)
		cov := mat.NewSymDense(len(keep), nil)
		for a := range keep {
			for b := a; b < len(keep); b++ {
				c := 0.0
				for i := range s {
					c += Vk.At(a, i) * Vk.At(b, i) / (s[i] * s[i])
				}
				cov.SetSym(a, b, c)
			}
		}
		// The correlations do not depend on the scale of the covariance, so they are known
		// even when the scatter is not.
		for a, j := range keep {
			for b, k := range keep {
				res.Correlation[j][k] = cov.At(a, b) / math.Sqrt(cov.At(a, a)*cov.At(b, b))
			}
			pr := &res.Params[j]
			pr.SDLog = math.Sqrt(cov.At(a, a) * scale2)
			pr.Lo95, pr.Hi95 = pr.Value*math.Exp(-t*pr.SDLog), pr.Value*math.Exp(t*pr.SDLog)
		}
	}

	if res.ScatterEstimated {
		for k := range res.Residuals {
			rs := &res.Residuals[k]
			rs.Normalised /= res.RelScatter // NaN when the scatter is unknown
			rs.Uncertainty = rs.Measured * res.RelScatter
		}
	}

	// Interval width and bounds.
	for j := range res.Params {
		pr := &res.Params[j]
		switch {
		case math.Abs(theta[j]-math.Log(pr.Lo)) < boundMargin:
			pr.AtBound = true
		case math.Abs(theta[j]-math.Log(pr.Hi)) < boundMargin:
			pr.AtBound = true
		}
		if !pr.Determined {
			continue
		}
		switch {
		case pr.AtBound:
			pr.Determined = false
			which := "lower"
			if theta[j] > math.Log(pr.Lo)+boundMargin {
				which = "upper"
			}
			pr.Why = "it ends on the " + which + " bound: the data pull it beyond the bounds given"
		case math.IsNaN(pr.SDLog):
			pr.Determined = false
			pr.Why = "no interval: as many free keys as measured values and no uncertainties given"
		case pr.Hi95/pr.Lo95 > maxSpread:
			pr.Determined = false
			pr.Why = fmt.Sprintf("its 95 %% interval spans a factor %.3g, more than %g", pr.Hi95/pr.Lo95, maxSpread)
		case pr.Lo95 <= pr.Lo && pr.Hi95 >= pr.Hi:
			pr.Determined = false
			pr.Why = "its 95 % interval covers the whole range between the bounds"
		}
	}

	// Another start ending as low elsewhere.
	best := res.Starts[res.Best]
	for i, st := range res.Starts {
		if i == res.Best || st.Err != "" {
			continue
		}
		if st.ChiSquare > best.ChiSquare+math.Max(1e-2*best.ChiSquare, tolChi(res)) {
			continue
		}
		for j, pr := range res.Params {
			d := math.Abs(math.Log(st.Values[j] / pr.Value))
			w := 0.05
			if pr.Determined {
				w = math.Max(w, t*pr.SDLog)
			}
			if d > w {
				res.SeveralOptima = true
			}
		}
	}

	d := p.base.Clone()
	for j, f := range p.free {
		u, _ := designUnit(f.Key)
		if err := d.Set(f.Key, fmt.Sprintf("%.6g %s", res.Params[j].Value, u)); err != nil {
			return fmt.Errorf("fit: %w", err)
		}
	}
	res.Design = d
	return nil
}

// tolChi is the χ² difference that counts as "as low": 1 with given uncertainties (one
// standard uncertainty on a single parameter), the estimated scatter otherwise.
func tolChi(res *Result) float64 {
	if res.ScatterEstimated && !math.IsNaN(res.RelScatter) {
		return res.RelScatter * res.RelScatter
	}
	if res.ScatterEstimated {
		return 1e-6
	}
	return 1
}

// colNorm is the Euclidean norm of column j of J.
func colNorm(J *mat.Dense, j int) float64 {
	return mat.Norm(J.ColView(j), 2)
}

// Undetermined lists the keys the data do not determine, sorted.
func (r *Result) Undetermined() []string {
	var out []string
	for _, p := range r.Params {
		if !p.Determined {
			out = append(out, p.Key)
		}
	}
	sort.Strings(out)
	return out
}
