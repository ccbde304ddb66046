package kinetics

// Separate pulses in one output trace. This file knows no physics: it reads a sampled power
// and says how many pulses it holds, how far apart the first two are, how wide the strongest
// one is by itself and how much of the energy the half-maximum window holds.

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
