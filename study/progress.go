package study

import (
	"sync"
	"sync/atomic"
)

// ticker counts the steps the strategies and the range cases have solved,
// from every goroutine, and reports the share of the study done at most
// once per percent (Options.Advance).
type ticker struct {
	done   atomic.Int64
	total  int64
	every  int64
	mu     sync.Mutex
	last   int64 // the count last reported
	report func(share float64)
}

// newTicker returns a ticker over total steps reporting to report, or nil
// when there is no one to report to.
func newTicker(total int, report func(float64)) *ticker {
	if report == nil || total <= 0 {
		return nil
	}
	return &ticker{total: int64(total), every: max(1, int64(total)/100), report: report}
}

// tick counts one solved step; a nil ticker counts nothing.
func (t *ticker) tick() {
	if t == nil {
		return
	}
	if d := t.done.Add(1); d%t.every == 0 || d == t.total {
		t.mu.Lock()
		defer t.mu.Unlock()
		if d > t.last { // goroutines may take the lock out of order
			t.last = d
			t.report(min(1, float64(d)/float64(t.total)))
		}
	}
}
