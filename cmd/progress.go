package cmd

import (
	"fmt"
	"io"
	"strings"
	"sync"
	"time"
)

// progressLine is the one-line progress of a long plan on a terminal's
// stderr: the step started last, the share of the solving done and, once
// a few percent are done, the time left at the pace so far. It is only
// made when stderr is a terminal, so pipes and --json stay silent.
type progressLine struct {
	w     io.Writer
	now   func() time.Time
	start time.Time
	mu    sync.Mutex
	label string
	i, n  int
	share float64
	width int // of the last line written, to blank it
}

func newProgressLine(w io.Writer, now func() time.Time) *progressLine {
	return &progressLine{w: w, now: now, start: now()}
}

// step is study.Options.Progress.
func (p *progressLine) step(label string, i, n int) {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.label, p.i, p.n = label, i, n
	p.write()
}

// advance is study.Options.Advance.
func (p *progressLine) advance(share float64) {
	p.mu.Lock()
	defer p.mu.Unlock()
	p.share = share
	p.write()
}

func (p *progressLine) write() {
	line := fmt.Sprintf("[%d/%d] %s", p.i+1, p.n, p.label)
	if p.share > 0 {
		line += fmt.Sprintf(" · %.0f %% solved", 100*p.share)
		if left, ok := timeLeft(p.now().Sub(p.start), p.share); ok {
			line += " · " + left
		}
	}
	pad := max(0, p.width-len(line))
	fmt.Fprint(p.w, "\r"+line+strings.Repeat(" ", pad))
	p.width = len(line)
}

// clear blanks the line; a nil line does nothing.
func (p *progressLine) clear() {
	if p == nil {
		return
	}
	p.mu.Lock()
	defer p.mu.Unlock()
	if p.width > 0 {
		fmt.Fprint(p.w, "\r"+strings.Repeat(" ", p.width)+"\r")
	}
}

// timeLeft estimates the time left from the time spent on a share of the
// work, at the same pace: spent × (1 − share) / share, rounded to what a
// person reads; not before 3 % is done (the first steps say little).
func timeLeft(spent time.Duration, share float64) (string, bool) {
	if share < 0.03 || share >= 1 {
		return "", false
	}
	left := time.Duration(float64(spent) * (1 - share) / share)
	switch {
	case left < 10*time.Second:
		return "a few seconds left", true
	case left < 90*time.Second:
		return fmt.Sprintf("about %d s left", int(left.Round(5*time.Second).Seconds())), true
	}
	return fmt.Sprintf("about %d min left", int(left.Round(time.Minute).Minutes())), true
}
