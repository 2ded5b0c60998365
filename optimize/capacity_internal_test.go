package optimize

import (
	"fmt"
	"math"
	"testing"

	"wattstage/curves"
)

// TestCapacityMatchesDenseScan checks the capacity search against brute
// force: the largest Σ n·span.hi over every allowed combination on 20001
// header heads from the required head to the highest any unit makes. The
// scan's points are all feasible, so the search may not fall below the
// scan's best (to 1e-9), and may exceed it only by what the scan's step
// misses between its points (below 1e-4 here: the flows change by less
// than 1e-4 of themselves per step of 1/20000 of the head range).
func TestCapacityMatchesDenseScan(t *testing.T) {
	small := testModel(t, "small", 1, 0.4, curves.DOEDrive{})
	small.Runout = curves.Flow(1300 * curves.GPM * 0.4) // its runout corner at another head than big's
	fixed := testModel(t, "big fixed", 1, 1, curves.FixedSpeed{})
	for _, tc := range []struct {
		name string
		p    func() *Solver
	}{
		{"two variable models", func() *Solver {
			return New(testPlant(t, testModel(t, "big", 3, 1, curves.DOEDrive{}), small), Options{})
		}},
		{"fixed beside variable", func() *Solver {
			return New(testPlant(t, testModel(t, "big", 2, 1, curves.DOEDrive{}), fixed, small), Options{})
		}},
	} {
		s := tc.p()
		for _, ft := range []float64{10, 30, 55, 70, 90, 110} {
			hr := ft * curves.Foot
			t.Run(fmt.Sprintf("%s/%g ft", tc.name, ft), func(t *testing.T) {
				got := s.capacity(hr, Constraint{})
				top := hr
				for _, u := range s.units {
					top = math.Max(top, u.topHead())
				}
				scan := 0.0
				spans := make([]span, len(s.units))
				const n = 20000
				for k := 0; k <= n; k++ {
					h := hr + (top-hr)*float64(k)/n
					for i, u := range s.units {
						spans[i] = u.bounds(h)
					}
					for _, cnt := range s.combos {
						if f, ok := comboFlow(cnt, spans); ok {
							scan = math.Max(scan, f)
						}
					}
				}
				if got.flow < scan*(1-1e-9) || got.flow > scan*(1+1e-4) {
					t.Errorf("capacity %.9g m³/s at %.6g m, dense scan %.9g m³/s", got.flow, got.head, scan)
				}
				t.Logf("capacity %.1f gpm at %.2f ft (dense scan %.1f gpm): %s", got.flow/curves.GPM, got.head/curves.Foot,
					scan/curves.GPM, s.describeCapacity(got, hr))
			})
		}
	}
}
