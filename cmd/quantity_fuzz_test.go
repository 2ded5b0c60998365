package cmd

import (
	"math"
	"testing"

	"wattstage/curves"
)

// FuzzFlowArg: parseFlowArg never panics, and whatever it accepts is a
// finite number above zero with a known unit that converts to a finite
// flow in m³/s (one too small to be above zero there is refused by
// flowRange, which TestFlowRangeRefusesUnderflow checks).
func FuzzFlowArg(f *testing.F) {
	for _, s := range []string{"1800", "1800gpm", "114 L/s", "410m3/h", "60%", "NaN", "-1", "1e300", "1,800", ".5", "5e-3m³/h"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		a, err := parseFlowArg("flow", s)
		if err != nil {
			return
		}
		if !(a.Value > 0) || math.IsInf(a.Value, 0) {
			t.Fatalf("%q accepted as %v", s, a)
		}
		q := a.SI(curves.US, curves.Flow(0.2))
		if q < 0 || math.IsInf(float64(q), 0) || math.IsNaN(float64(q)) {
			t.Fatalf("%q gives %g m³/s", s, float64(q))
		}
	})
}

func TestFlowRangeRefusesUnderflow(t *testing.T) {
	// 1e-320 gpm is above zero as typed but 0 m³/s once converted.
	if q, err := flowRange("flow", "1e-320", curves.US, curves.Flow(0.2), 0, 5, "the design flow"); err == nil {
		t.Errorf("--flow 1e-320 accepted as %g m³/s", float64(q))
	}
}
