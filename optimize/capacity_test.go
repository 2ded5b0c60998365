package optimize_test

import (
	"math"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// capacityPlant is two identical variable-speed units on the invented curve
// H₀ = 40 − 10·(Q/0.1)² m (shutoff 40 m, 30 m at 0.1 m³/s), runout
// 0.12 m³/s at rated speed, top speed 100 %, and a motor of the given
// shaft rating (service factor 1). The datasheet points lie on that
// parabola, so the quadratic fit is exact.
func capacityPlant(t *testing.T, motor curves.Power) *plant.Plant {
	t.Helper()
	var pts []curves.PumpPoint
	for _, x := range []float64{0, 0.4, 0.8, 1, 1.2, 1.3} {
		pts = append(pts, curves.PumpPoint{Flow: curves.Flow(0.1 * x), Head: curves.Head(40 - 10*x*x), Eff: 0.8 * x * (2 - x)})
	}
	pump, err := curves.NewPump(pts, curves.PumpOptions{})
	if err != nil {
		t.Fatal(err)
	}
	m := plant.Model{Name: "P", Count: 2, RatedSpeed: 1780, Pump: pump, MinSpeed: 0.3, MaxSpeed: 1,
		MinFlow: 0.02, Runout: 0.12,
		Motor: curves.Motor{Rated: motor, FullLoadEff: 0.93, ServiceFactor: 1}, Drive: curves.DOEDrive{}}
	return &plant.Plant{Name: "capacity", Fluid: curves.Fluid{Density: 999.7}, Models: []plant.Model{m},
		System:     curves.DPControl{DesignFlow: 0.3, DesignHead: 30, ControlHead: 12},
		DesignFlow: 0.3, DesignHead: 30}
}

// TestCapacityExactWithBindingLimit checks the capacity an unmet point
// reports against hand calculations on capacityPlant (affinity laws,
// H = s²·H₀(q/s); docs/sources.md §3), asking for 0.30 m³/s, more than
// the plant can give:
//
//   - required head 20 m: at top speed the curve gives √((40−20)/1000) =
//     0.1414 m³/s per unit, past runout, so runout binds; on the runout
//     parabola q = 0.12·√(h/25.6) grows with the head up to the corner
//     where it meets the top-speed curve, H₀(0.12) = 40 − 14.4 = 25.6 m:
//     2 × 0.12 = 0.24 m³/s (864 m³/h) at 25.6 m, at runout and top speed.
//     At the required head itself they give only 2 × 0.12·√(20/25.6) =
//     0.2121 m³/s. [derived by hand]
//   - required head 30 m: above the corner, top speed binds at the
//     required head: 2 × √((40−30)/1000) = 0.2 m³/s (720 m³/h).
//   - required head 30 m with a motor rated at the shaft power of 0.09 m³/s
//     at 30 m: the motor binds at 2 × 0.09 = 0.18 m³/s (648 m³/h); a
//     higher head only costs more power for the same flow.
func TestCapacityExactWithBindingLimit(t *testing.T) {
	big := curves.Power(200e3) // W, never binds (the shaft power here stays below 60 kW)
	small := func(t *testing.T) curves.Power {
		p := capacityPlant(t, big)
		s, ok := p.Models[0].Pump.SpeedFor(0.09, 30)
		if !ok {
			t.Fatal("no speed for 0.09 m³/s at 30 m")
		}
		return p.Models[0].Pump.ShaftPower(0.09, s, p.Fluid.Density)
	}(t)
	for _, c := range []struct {
		name     string
		motor    curves.Power
		head     curves.Head // required head, m
		capacity float64     // m³/s, derived by hand above
		says     []string    // in the reason
	}{
		{"runout below the corner", big, 20, 0.24, []string{"864.0 m³/h", "with the header raised to 25.6 m above the required 20.0 m", "at its runout and its maximum speed"}},
		{"top speed at the required head", big, 30, 0.2, []string{"720.0 m³/h", "at the required head of 30.0 m, which binds with", "at its maximum speed"}},
		{"motor at the required head", small, 30, 0.18, []string{"648.0 m³/h", "at the required head of 30.0 m, which binds with", "at its motor's rating × service factor"}},
	} {
		t.Run(c.name, func(t *testing.T) {
			p := capacityPlant(t, c.motor)
			const load = 0.3 // m³/s, above every capacity here
			r := optimize.New(p, optimize.Options{}).SolveWith(load, optimize.Constraint{Head: c.head})
			if r.Status != optimize.Unmet || r.Limit != optimize.LimitCapacity {
				t.Fatalf("status %v limit %q, want unmet on capacity: %s", r.Status, r.Limit, r.Reason)
			}
			if got := load - float64(r.Shortfall); math.Abs(got-c.capacity) > 1e-9*c.capacity {
				t.Errorf("capacity %.12g m³/s, want %.12g m³/s (reason: %s)", got, c.capacity, r.Reason)
			}
			t.Logf("%s", r.Reason)
			for _, w := range c.says {
				if !strings.Contains(r.Reason, w) {
					t.Errorf("reason %q does not say %q", r.Reason, w)
				}
			}
		})
	}
}
