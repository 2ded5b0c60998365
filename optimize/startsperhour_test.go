package optimize

import (
	"math"
	"testing"

	"wattstage/curves"
)

// NEMA MG 10's allowed starts per hour fall with motor size and rise with
// pole count (values from memory; the trend is what MG 10 and docs/sources.md §7
// state).
func TestStartsPerHourShape(t *testing.T) {
	prev := map[int]float64{2: math.Inf(1), 4: math.Inf(1), 6: math.Inf(1)}
	for _, hp := range []float64{1, 2, 5, 10, 25, 50, 100, 200, 250} {
		r := curves.Power(hp * curves.Horsepower)
		a2, a4, a6 := StartsPerHour(r, 2), StartsPerHour(r, 4), StartsPerHour(r, 6)
		if !(a2 < a4 && a4 < a6) {
			t.Errorf("%g hp: %g / %g / %g starts per hour at 2/4/6 poles should rise with poles", hp, a2, a4, a6)
		}
		for poles, a := range map[int]float64{2: a2, 4: a4, 6: a6} {
			if !(a < prev[poles]) {
				t.Errorf("%g hp %d-pole: %g starts per hour not below the smaller motor's %g", hp, poles, a, prev[poles])
			}
			prev[poles] = a
		}
	}
	for _, c := range []struct {
		hp    float64
		poles int
	}{{0.5, 4}, {300, 4}, {10, 8}} {
		if v := StartsPerHour(curves.Power(c.hp*curves.Horsepower), c.poles); !math.IsNaN(v) {
			t.Errorf("%g hp %d-pole: %g, want NaN outside the table", c.hp, c.poles, v)
		}
	}
}
