package optimize_test

import (
	"fmt"
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// TestUnequalSplitOfIdenticalUnits: two identical units whose drive is very
// poor at light load (a drive efficiency table that climbs steeply from
// light to half load — invented numbers chosen to make the point) draw less
// with one unit loaded and the other light than with both at one speed, once
// both must run. The solver must find that split (docs/sources.md §10: the equal split
// is always a stationary point, so a local search from it never leaves it),
// and the brute-force reference must agree with its power to 0.05 %.
func TestUnequalSplitOfIdenticalUnits(t *testing.T) {
	pts := []curves.PumpPoint{
		{Flow: 0, Head: 40},
		{Flow: 0.02, Head: 38.5, Eff: 0.60},
		{Flow: 0.04, Head: 34, Eff: 0.80},
		{Flow: 0.06, Head: 26, Eff: 0.78},
	}
	pump, err := curves.NewPump(pts, curves.PumpOptions{})
	if err != nil {
		t.Fatal(err)
	}
	drive := curves.TableDrive{Table: []curves.LoadEff{{Load: 0.05, Eff: 0.40}, {Load: 0.25, Eff: 0.55}, {Load: 0.45, Eff: 0.90}, {Load: 1, Eff: 0.97}}}
	m := plant.Model{Name: "P", Count: 2, RatedSpeed: 1480, Pump: pump, MinSpeed: 0.3, MaxSpeed: 1,
		MinFlow: 0.004, Runout: 0.06,
		Motor: curves.Motor{Rated: 20000, FullLoadEff: 0.93}, Drive: drive}
	p := &plant.Plant{Name: "split", Fluid: curves.Fluid{Density: 998.2}, Models: []plant.Model{m},
		System: curves.DPControl{DesignFlow: 0.1, DesignHead: 30, ControlHead: 15}, DesignFlow: 0.1, DesignHead: 30}
	s := optimize.New(p, optimize.Options{})
	found := false
	for _, q := range []curves.Flow{0.035, 0.045, 0.055, 0.065} {
		r := s.SolveWith(q, optimize.Constraint{Total: 2})
		eq := optimize.New(p, optimize.Options{CommonSpeed: true}).SolveWith(q, optimize.Constraint{Total: 2})
		if r.Status != optimize.Served || eq.Status != optimize.Served {
			continue
		}
		if r.Power > eq.Power*(1+1e-12) {
			t.Errorf("%.3f m³/s: unequal-allowed %.1f W above the equal split %.1f W", float64(q), float64(r.Power), float64(eq.Power))
		}
		unequal := math.Abs(r.Units[0].Speed-r.Units[1].Speed) > 1e-3
		if unequal {
			found = true
			t.Logf("%.3f m³/s: speeds %.3f/%.3f draw %.1f W; one common speed %.3f draws %.1f W (%.2f %% more)", float64(q),
				r.Units[0].Speed, r.Units[1].Speed, float64(r.Power), eq.Units[0].Speed, float64(eq.Power), 100*(float64(eq.Power/r.Power)-1))
		}
		// The brute-force reference over both units' speeds (the whole
		// plant: it may also run one unit; compare with its two-unit best).
		ref := refSolve(p, q, false)
		two, ok := ref.ByCounts[fmt.Sprint([]int{2})]
		if !ok {
			t.Errorf("%.3f m³/s: the reference finds no two-unit state", float64(q))
			continue
		}
		if d := float64(r.Power-two) / float64(two); d > 5e-4 {
			t.Errorf("%.3f m³/s: two units %.2f W, reference %.2f W (%+.3f %%)", float64(q), float64(r.Power), float64(two), 100*d)
		}
	}
	if !found {
		t.Errorf("no flow showed an unequal split: the case does not test what it claims")
	}
}
