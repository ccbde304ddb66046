package kinetics

// Separate pulses in one output trace. This file knows no physics: it reads a sampled power
// and says how many pulses it holds, how far apart the first two are, how wide the strongest
// one is by itself, how much of the energy the half-maximum window holds and whether its
// half-maximum width is ill-conditioned (halfMaxConditioning).

// DipLevel is the fraction of the highest value the output (averaged over a round trip of
// the channel, see separatePulses) must fall below between two maxima for them to count as
// separate pulses. Each maximum reaches at least half the highest (the level of the FWHM);
// a quarter is half of that half, so the power halves again between the lowest maxima that
// count and the valley between them: the FWHM's own criterion applied to the valley. A
// choice of this project, no source; a tenth (the baseline level of the 10–90 % rise time)
// misses the two pulses of a reduced-pressure transfer tube whose valley sits at 0.11.
const DipLevel = 0.25

// pulseTrain describes the pulses of a sampled power trace (see separatePulses).
type pulseTrain struct {
	count int // separate pulses (0 for a trace with no positive value)
	// separation is the time between the peaks of the first two pulses [s]; 0 for one pulse.
	separation float64
	// strongestWidth is the half-maximum width of the pulse that holds the highest sample,
	// inside the dips that bound it [s]; with one pulse the width of the whole trace (FWHM).
	strongestWidth float64
	// energyShare is the share of the trace's energy between its first and last half-maximum
	// crossings (the window of the FWHM).
	energyShare float64
	// riseSpans is set when the trace first rises through 90 % of its highest value after the
	// first pulse has ended: a 10–90 % rise read off the whole trace then spans pulses.
	riseSpans bool
}

// separatePulses finds the pulses of p, sampled at the ends of steps of dt. Amplified
// spontaneous emission comes as spikes one transit of the channel apart (two with a rear
// mirror), which may fall to nothing between them and are still one pulse of their
// envelope; so the trace is first averaged over window samples, the round-trip time 2L/c
// (a running mean over a whole number of periods removes such a modulation exactly). On that
// mean a pulse starts where it rises through half its highest value and ends where it then
// falls below DipLevel of it: two pulses are two maxima that reach half the highest with a
// dip below DipLevel between them. The times are those of the mean's peaks; the widths are
// of p itself. scratch holds at least len(p) values, overwritten.
func separatePulses(p, scratch []float64, dt float64, window int) pulseTrain {
	pk, kp := peak(p)
	if !(pk > 0) {
		return pulseTrain{}
	}
	m := runningMean(scratch[:len(p)], p, window)
	mk, _ := peak(m)
	half, dip := 0.5*mk, DipLevel*mk
	var peaks []int       // index of each pulse's highest mean
	lo, hi := 0, len(p)-1 // the dips that bound the pulse holding kp: m[lo] and m[hi] below dip (or the ends)
	closed := false       // the pulse holding kp has ended
	firstEnd := len(p)    // where the first pulse ends (its mean falls below dip)
	armed, below := true, -1
	for i, v := range m {
		switch {
		case armed && v >= half:
			peaks = append(peaks, i)
			armed = false
			if i <= kp {
				lo = max(below, 0)
			}
		case !armed && v < dip:
			armed = true
			firstEnd = min(firstEnd, i)
			if i > kp && !closed {
				hi, closed = i, true
			}
		}
		if v < dip {
			below = i
		}
		if !armed && v > m[peaks[len(peaks)-1]] {
			peaks[len(peaks)-1] = i
		}
	}
	t := pulseTrain{count: len(peaks)}
	if len(peaks) < 2 {
		lo, hi = 0, len(p)-1
	} else {
		t.separation = float64(peaks[1]-peaks[0]) * dt
	}
	a, b := crossings(p[lo:hi+1], kp-lo, 0.5*pk)
	t.strongestWidth = (b - a) * dt
	t.energyShare = halfMaxShare(p, kp, 0.5*pk)
	r90, _ := crossings(p, kp, 0.9*pk)
	t.riseSpans = t.count > 1 && r90 > float64(firstEnd)
	return t
}

// runningMean writes into dst (of len(p)) the mean of p over window samples centred on each
// sample, samples beyond the ends counting as zero (the output is dark before and after the
// run), and returns it; window < 2 returns p itself. A sliding sum: the values are positive
// powers, so its rounding stays at the level of the largest sum times the machine epsilon.
func runningMean(dst, p []float64, window int) []float64 {
	if window < 2 {
		return p
	}
	h, n := window/2, len(p)
	sum := 0.0
	for j := range min(window-h, n) {
		sum += p[j] // the window of sample 0: indices −h … window−h−1
	}
	for i := range dst {
		dst[i] = sum / float64(window)
		if j := i + window - h; j < n {
			sum += p[j]
		}
		if j := i - h; j >= 0 {
			sum -= p[j]
		}
	}
	return dst
}

// halfMaxShare is the share of Σp between the first rise through half and the last fall
// through it (kp is the index of the maximum). Sample i stands for the index interval
// (i−½, i+½]; the edge samples count for the part of it inside the crossings.
func halfMaxShare(p []float64, kp int, half float64) float64 {
	a, b := crossings(p, kp, half)
	var in, all float64
	for i, v := range p {
		all += v
		if w := min(float64(i)+0.5, b) - max(float64(i)-0.5, a); w > 0 {
			in += v * w
		}
	}
	if !(all > 0) {
		return 0
	}
	return in / all
}

// HalfMaxBand is the half-width of the band of levels, as a fraction of the highest value,
// in which the FWHM's level is probed: the widths at ½ ∓ HalfMaxBand (45 % and 55 %) are
// reported, and an edge of the width that jumps while the level moves inside the band makes
// the FWHM ill-conditioned (see halfMaxConditioning). ±5 % of the peak is ±10 % of the
// half-maximum level itself, the same tenth as JumpLimit. A choice of this project, no source.
const HalfMaxBand = 0.05

// JumpLimit is the largest jump of an edge of the FWHM, as a fraction of the FWHM, that a
// level inside the half-maximum band may cause before the width is called ill-conditioned: a
// tenth, the bound the project holds the numerical error of a width to when the cell count
// changes (20 against 200 cells). A choice of this project, no source.
const JumpLimit = 0.1

// SpreadLimit is the largest difference of the widths at 45 % and 55 % of the highest value,
// as a fraction of the FWHM, of a well-conditioned width: a half. Smooth single pulses stay
// well below it (a Gaussian 0.14, a sudden rise with an exponential decay 0.29, a decay as
// 1/t 0.40); a shoulder of the trace lying flat near half the peak exceeds it without any
// leap, and may turn into a leap with a small change of the model. A choice of this project,
// no source.
const SpreadLimit = 0.5

// halfMax describes how the half-maximum width of a trace depends on the level it is read at.
type halfMax struct {
	// low and high are the widths at 45 % and 55 % of the highest value (½ ∓ HalfMaxBand),
	// first rise to last fall like the FWHM [samples].
	low, high float64
	// jump is the largest distance an edge of the width (the first rise or the last fall
	// through the level) leaps as the level moves continuously inside the band [samples].
	jump float64
}

// illConditioned says whether a half-maximum width fwhm (in the same unit as h) is
// ill-conditioned: an edge leaps by more than JumpLimit of it inside the band, or the widths
// at the band's ends differ by more than SpreadLimit of it.
func (h halfMax) illConditioned(fwhm float64) bool {
	return h.jump > JumpLimit*fwhm || h.low-h.high > SpreadLimit*fwhm
}

// halfMaxConditioning probes the half-maximum width of x (highest value pk at index kp)
// inside the band ½ ± HalfMaxBand of pk. The first rise through a level f moves smoothly with
// f except where a local maximum of the rising side, higher than all before it, is followed
// by a dip and a later rise above it: at f equal to that maximum's value the edge leaps from
// the maximum to the later rise. The last fall mirrors this from the end. Such a leap is
// caused by an arbitrarily small change of the level (or of the trace: a side spike whose
// top sits at half the highest flips in or out of the width); a smooth change of the width
// with the level (a long exponential tail: 29 % between 45 % and 55 %) is not a leap and
// shows in low − high instead.
func halfMaxConditioning(x []float64, kp int, pk float64) halfMax {
	lo, hi := (0.5-HalfMaxBand)*pk, (0.5+HalfMaxBand)*pk
	a, b := crossings(x, kp, lo)
	c, d := crossings(x, kp, hi)
	h := halfMax{low: b - a, high: d - c}
	// leap is the largest leap of the first rise through a level inside [lo, hi] of y, read
	// from y[0] towards y[k] (k the index of the highest value).
	leap := func(y func(int) float64, k int) float64 {
		largest := 0.0
		rec, at := y(0), 0 // the highest value so far and where it was reached
		for i := 1; i <= k; i++ {
			v := y(i)
			if v <= rec {
				continue
			}
			if i > at+1 && rec >= lo && rec <= hi {
				// y stayed at or below rec from at+1 to i−1: at a level just above rec the
				// edge is where y rises through rec between i−1 and i, at rec itself it is at.
				edge := float64(i-1) + (rec-y(i-1))/(v-y(i-1))
				largest = max(largest, edge-float64(at))
			}
			rec, at = v, i
		}
		return largest
	}
	n := len(x)
	h.jump = max(leap(func(i int) float64 { return x[i] }, kp), leap(func(i int) float64 { return x[n-1-i] }, n-1-kp))
	return h
}
