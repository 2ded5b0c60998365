package study_test

import (
	"math"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
)

// A fixed-speed current sequence is the baseline, and it draws what its
// units draw on their curves: on one bin at 60 m³/h the heating example's
// band runs two units across the line, each at 30 m³/h on its rated-speed
// curve. Hand check from the fitted curves: head H₀(q), shaft power
// ρ g q H₀(q) / η₀(q) (hydraulic power over pump efficiency, every pump
// handbook), input through the motor's part-load chain; the group draws
// twice that. Fewest-units throttling (one unit) is the lower figure.
func TestFixedSpeedCurrentSequenceBaseline(t *testing.T) {
	p := examplePlant(t, "heating-water.yaml")
	q := curves.Flow(60 * curves.M3PerH)
	p.Profile.Bins = []plant.Bin{{Flow: q, Hours: 1000}}
	r := runPlant(t, p, noRange)
	if b := r.BaselineStrategy(); b.Key != study.KeyCurrent {
		t.Fatalf("baseline %s, want the current sequence the file gives", b.Key)
	}
	cur := r.Strategy(study.KeyCurrent)
	pt := cur.Run.Points[0]
	if pt.Status != optimize.Served || pt.Running() != 2 {
		t.Fatalf("current sequence at 60 m³/h: %v with %d running; the band says 2", pt.Status, pt.Running())
	}
	m := p.Models[0]
	per := q / 2
	h := m.Pump.Head(per, 1)
	shaft := curves.Power(p.Fluid.Density * curves.Gravity * float64(per) * float64(h) / m.Pump.Eff(per, 1))
	unit := curves.FixedSpeed{}.Electrical(m.Motor, shaft, 1)
	wantKWh := 2 * float64(unit) / curves.KW * 1000
	if got := cur.Energy.KWh; math.Abs(got-wantKWh) > 1e-6*wantKWh {
		t.Errorf("current sequence %.3f kWh, hand check %.3f kWh (two units at %.1f m on the curve)", got, wantKWh, float64(h))
	}
	thr := r.Strategy(study.KeyThrottled)
	if thr.Energy.KWh >= cur.Energy.KWh || thr.Run.Points[0].Running() != 1 {
		t.Errorf("fewest units throttled %.1f kWh with %d running, current %.1f kWh: one unit should draw less here",
			thr.Energy.KWh, thr.Run.Points[0].Running(), cur.Energy.KWh)
	}
	if lo := r.Strategy(study.KeyLowest); lo.Savings.Energy <= thr.Energy.KWh-lo.Energy.KWh {
		t.Errorf("savings against the operators' two pumps %.1f kWh not above those against one pump %.1f kWh",
			lo.Savings.Energy, thr.Energy.KWh-lo.Energy.KWh)
	}
}

// The value of the setpoint reset is priced: the lowest-power staging
// with the file's reset against the same staging at the design setpoint;
// and a plant file without a current sequence says its throttled baseline
// is the lowest it could be.
func TestResetPricedAndBaselineStated(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water.yaml"), noRange)
	lo, nr := r.Strategy(study.KeyLowest), r.Strategy(study.KeyNoReset)
	if nr == nil {
		t.Fatal("no strategy without the reset on a plant with one")
	}
	if nr.Annual.Energy <= lo.Annual.Energy {
		t.Errorf("without the reset %.0f kWh/yr, with it %.0f: a lower setpoint at part load must draw less", nr.Annual.Energy, lo.Annual.Energy)
	}
	if !hasWarning(r, "the lowest the baseline could be") {
		t.Errorf("no warning that the fewest-units baseline is the lowest: %v", r.Warnings)
	}
	if s := runPlant(t, examplePlant(t, "condenser-water.yaml"), noRange); s.Strategy(study.KeyNoReset) != nil {
		t.Error("a no-reset strategy on a fixed-curve plant")
	}
}

// The ASHRAE 90.1 §6.5.4.2 part-load check applies to DP-controlled
// variable-flow loops only: the condenser (fixed curve) gets "not
// applicable" with the reason and no verdict.
func TestPartLoadFollowsSystemType(t *testing.T) {
	r := runPlant(t, examplePlant(t, "condenser-water.yaml"), noRange)
	if len(r.PartLoad) != 1 || r.PartLoad[0].DesignKW != 0 || r.PartLoad[0].Pass || !strings.Contains(r.PartLoad[0].Note, "not applicable") {
		t.Errorf("condenser part-load check %+v, want not applicable", r.PartLoad)
	}
	r = runPlant(t, examplePlant(t, "chilled-water.yaml"), noRange)
	if len(r.PartLoad) == 0 || r.PartLoad[0].DesignKW == 0 {
		t.Errorf("chilled-water part-load check %+v, want a verdict", r.PartLoad)
	}
}

// The trend's logged DP is priced and set against the modelled setpoint.
func TestLoggedDP(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water-trend.yaml"), noRange)
	if r.DP == nil || r.DP.N == 0 || r.Strategy(study.KeyLoggedDP) == nil {
		t.Fatalf("no logged-DP comparison on a trend with a DP column: %+v", r.DP)
	}
	if !(r.DP.MeanLogged > 0 && r.DP.MeanModel > 0) || math.Abs(float64(r.DP.MeanDiff-(r.DP.MeanLogged-r.DP.MeanModel))) > 1e-12 {
		t.Errorf("comparison %+v does not add up", *r.DP)
	}
	// Where the trend logs a higher DP than the model holds, the pumps draw
	// more at the logged DP.
	if (r.DP.MeanDiff > 0) != (r.DP.EnergyAtLogged > r.DP.EnergyAtSetpoints) {
		t.Errorf("mean DP difference %+.3f m but energy at the logged DP %.0f against %.0f kWh/yr", float64(r.DP.MeanDiff), r.DP.EnergyAtLogged, r.DP.EnergyAtSetpoints)
	}
}
