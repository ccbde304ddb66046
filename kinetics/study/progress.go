package study

import (
	"fmt"
	"io"
	"strings"
	"time"
)

// progress draws one self-overwriting line: a bar, points done, rate and time left.
type progress struct {
	w            io.Writer
	total, done  int
	start, drawn time.Time
}

func newProgress(w io.Writer, total int) *progress {
	return &progress{w: w, total: total, start: time.Now()}
}

func (p *progress) step() {
	p.done++
	if p.w == nil {
		return
	}
	if now := time.Now(); now.Sub(p.drawn) >= 200*time.Millisecond || p.done == p.total {
		p.drawn = now
		fmt.Fprint(p.w, "\r"+progressLine(p.done, p.total, now.Sub(p.start)))
	}
}

func (p *progress) finish() {
	if p.w != nil && p.done > 0 {
		fmt.Fprintln(p.w)
	}
}

// progressLine formats the state after done of total points in elapsed time.
func progressLine(done, total int, elapsed time.Duration) string {
	const width = 30
	filled := 0
	if total > 0 {
		filled = width * done / total
	}
	rate := float64(done) / elapsed.Seconds()
	left := "?"
	if done > 0 && rate > 0 {
		left = time.Duration(float64(total-done) / rate * float64(time.Second)).Round(time.Second).String()
	}
	return fmt.Sprintf("[%s%s] %d/%d points  %.3g points/s  %s left ",
		strings.Repeat("#", filled), strings.Repeat(".", width-filled), done, total, rate, left)
}
