package study_test

import (
	"sync"
	"testing"

	"wattstage/study"
)

// TestAdvanceReachesDone checks the share of the work Advance reports: it
// only rises, and the last call says all of it is done.
func TestAdvanceReachesDone(t *testing.T) {
	p := examplePlant(t, "chilled-water.yaml")
	var mu sync.Mutex
	var shares []float64
	runPlant(t, p, study.Options{Advance: func(s float64) {
		mu.Lock()
		defer mu.Unlock()
		shares = append(shares, s)
	}})
	if len(shares) == 0 {
		t.Fatal("Advance never called")
	}
	for i := 1; i < len(shares); i++ {
		if shares[i] < shares[i-1] {
			t.Fatalf("share fell from %g to %g", shares[i-1], shares[i])
		}
	}
	if last := shares[len(shares)-1]; last != 1 {
		t.Errorf("last share %g, want 1", last)
	}
}
