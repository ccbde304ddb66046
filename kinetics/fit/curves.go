package fit

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"sort"
	"strings"
	"sync"

	"n2pulse/kinetics/design"
	"n2pulse/kinetics/fit/measured"
	"n2pulse/kinetics/study"
)

// MaxCurves is the largest number of curves Curves draws: more groups of points than this
// make a figure no one can read.
const MaxCurves = 6

// Curve is the fitted model along one design key through a group of measured points: the
// points that share the values of every other key column.
type Curve struct {
	Key    string             // the key along the curve
	Fixed  []measured.Setting // the other key columns' values shared by the group
	Points []int              // indices of the group's measured points
	PointX []float64          // their values of Key [SI]
	X      []float64          // the curve's values of Key [SI]
	// Y holds the model's value of each measured quantity along X [SI]; NaN where a run failed.
	Y map[string][]float64
	// Stored and Pulse are the largest stored energy and pulse energy (both ends) along the
	// curve [J], for the safety caution.
	Stored, Pulse float64
}

// Curves runs the fitted design along the key column along (when empty: the column with the
// most distinct values, the first such column on a tie), n points from the smallest to the largest measured value
// widened by a fifth of the span on each side (a fifth of the value when all are equal),
// once for each group of points sharing the other columns' values (at most MaxCurves groups,
// the first in file order; dropped reports how many were left out). With no key column it
// returns no curves. s supplies Workers and Run.
func Curves(ctx context.Context, fitted *design.Design, data *measured.Set, along string, n int, s *Settings) (curves []Curve, dropped int, err error) {
	if len(data.Keys) == 0 || len(data.Points) == 0 {
		return nil, 0, nil
	}
	if n < 2 || n > 1000 {
		return nil, 0, fmt.Errorf("fit: %d curve points, want 2…1000", n)
	}
	run, workers := study.Runner(study.ModelRunner), runtime.GOMAXPROCS(0)
	if s != nil && s.Run != nil {
		run = s.Run
	}
	if s != nil && s.Workers > 0 {
		workers = s.Workers
	}
	// The key with the most distinct values.
	xi, most := 0, 0
	for c := range data.Keys {
		seen := map[string]bool{}
		for _, p := range data.Points {
			seen[p.Settings[c].Value] = true
		}
		if len(seen) > most {
			xi, most = c, len(seen)
		}
	}
	if along != "" {
		xi = -1
		for c, k := range data.Keys {
			if k.Name == along {
				xi = c
			}
		}
		if xi < 0 {
			return nil, 0, fmt.Errorf("fit: %s is not a design-key column of %s", along, data.Name)
		}
	}
	key := data.Keys[xi].Name
	xs := make([]float64, len(data.Points))
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, p := range data.Points {
		d := design.Defaults()
		if err := d.Set(key, p.Settings[xi].Value); err != nil {
			return nil, 0, fmt.Errorf("fit: line %d: %w", p.Line, err)
		}
		xs[i], _ = d.Get(key)
		lo, hi = math.Min(lo, xs[i]), math.Max(hi, xs[i])
	}
	pad := (hi - lo) / 5
	if pad == 0 {
		pad = math.Abs(lo) / 5
	}
	kmin, kmax, _, _ := design.KeyRange(key)
	lo, hi = math.Max(kmin, lo-pad), math.Min(kmax, hi+pad)
	// Groups in file order.
	index := map[string]int{}
	for i, p := range data.Points {
		var fixed []measured.Setting
		var parts []string
		for c, st := range p.Settings {
			if c != xi {
				fixed = append(fixed, st)
				parts = append(parts, st.Value)
			}
		}
		g := strings.Join(parts, "\x00")
		k, ok := index[g]
		if !ok {
			if len(curves) == MaxCurves {
				dropped++
				index[g] = -1
				continue
			}
			k = len(curves)
			index[g] = k
			curves = append(curves, Curve{Key: key, Fixed: fixed, Y: map[string][]float64{}})
		}
		if k < 0 {
			continue
		}
		curves[k].Points = append(curves[k].Points, i)
		curves[k].PointX = append(curves[k].PointX, xs[i])
	}
	unit, _ := design.KeyUnit(key)
	type job struct{ c, j int }
	var jobs []job
	for c := range curves {
		cv := &curves[c]
		cv.X = make([]float64, n)
		for j := range n {
			cv.X[j] = lo + (hi-lo)*float64(j)/float64(n-1)
			jobs = append(jobs, job{c, j})
		}
		for _, q := range data.Quantities {
			cv.Y[q.Name] = make([]float64, n)
		}
	}
	var mu sync.Mutex
	var wg sync.WaitGroup
	sem := make(chan struct{}, workers)
	var firstErr error
	for _, jb := range jobs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			cv := &curves[jb.c]
			nan := func() {
				for q := range cv.Y {
					cv.Y[q][jb.j] = math.NaN()
				}
			}
			select {
			case sem <- struct{}{}:
			case <-ctx.Done():
				nan()
				return
			}
			defer func() { <-sem }()
			d := fitted.Clone()
			var keys []string
			for _, st := range cv.Fixed {
				keys = append(keys, st.Key)
				if err := d.Set(st.Key, st.Value); err != nil {
					mu.Lock()
					firstErr = err
					mu.Unlock()
					nan()
					return
				}
			}
			err := d.Set(key, fmt.Sprintf("%.17g %s", cv.X[jb.j], unit))
			if err == nil {
				err = d.BalanceMixture(keys)
			}
			if err == nil {
				err = d.Validate()
			}
			if err != nil {
				nan()
				return
			}
			sum, err := run(d)
			if err != nil {
				nan()
				return
			}
			mu.Lock()
			defer mu.Unlock()
			for q := range cv.Y {
				cv.Y[q][jb.j] = metric(&sum, q)
			}
			cv.Stored, cv.Pulse = math.Max(cv.Stored, sum.StoredEnergy), math.Max(cv.Pulse, sum.EnergyTotal)
		}()
	}
	wg.Wait()
	if err := ctx.Err(); err != nil {
		return nil, 0, err
	}
	if firstErr != nil {
		return nil, 0, fmt.Errorf("fit: %w", firstErr)
	}
	for c := range curves {
		sort.Sort(byX{&curves[c]})
	}
	return curves, dropped, nil
}

// byX orders a curve's measured points by their x.
type byX struct{ c *Curve }

func (b byX) Len() int           { return len(b.c.Points) }
func (b byX) Less(i, j int) bool { return b.c.PointX[i] < b.c.PointX[j] }
func (b byX) Swap(i, j int) {
	b.c.Points[i], b.c.Points[j] = b.c.Points[j], b.c.Points[i]
	b.c.PointX[i], b.c.PointX[j] = b.c.PointX[j], b.c.PointX[i]
}
