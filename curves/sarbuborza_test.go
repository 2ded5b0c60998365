package curves

import (
	"math"
	"testing"
)

// TestSarbuBorzaMatchesPow checks the fast form of the step-down against
// the formula η₂ = 1 − (1 − η₁)(n₁/n₂)^0.1 (Sârbu & Borza 1998) evaluated
// with the standard library's math.Pow, bit for bit, across speeds from
// 0.01 % to 100 % of rated.
func TestSarbuBorzaMatchesPow(t *testing.T) {
	for _, eta := range []float64{0.3, 0.65, 0.84} {
		for i := 1; i <= 100000; i++ {
			s := float64(i) / 100000
			want := 1 - (1-eta)*math.Pow(1/s, 0.1)
			if got := SarbuBorza(eta, s); got != want {
				t.Fatalf("η %g, s %g: got %v, math.Pow gives %v", eta, s, got, want)
			}
		}
	}
}
