package study_test

import (
	"testing"

	"wattstage/optimize"
	"wattstage/study"
)

// With drive bypass contactors the plant may run a unit across the line
// where that draws less: at no step more than the lowest-power staging
// (no bypass is one of its choices) nor than fixed speed throttled (all
// bypassed is another), and over the year less than the lowest-power
// staging on the chilled-water example, where throttling wins 500 h near
// full speed.
func TestDriveBypassPricesTheChoice(t *testing.T) {
	p := examplePlant(t, "chilled-water.yaml")
	if r := runPlant(t, p, noRange); r.Strategy(study.KeyBypassed) != nil {
		t.Fatal("a drive-bypass strategy without drive_bypass in the file")
	}
	p.Models[0].DriveBypass = true
	r := runPlant(t, p, noRange)
	bp, lo, thr := r.Strategy(study.KeyBypassed), r.Strategy(study.KeyLowest), r.Strategy(study.KeyThrottled)
	if bp == nil {
		t.Fatal("no drive-bypass strategy")
	}
	for i := range r.Steps {
		b := bp.Run.Points[i]
		if b.Status != optimize.Served {
			t.Fatalf("step %d unmet with bypass", i)
		}
		for _, other := range []*study.Strategy{lo, thr} {
			if o := other.Run.Points[i]; o.Status == optimize.Served && b.Power > o.Power*(1+1e-9) {
				t.Errorf("step %d: with bypass %.3f kW, %s %.3f kW", i, float64(b.Power)/1000, other.Name, float64(o.Power)/1000)
			}
		}
		n := 0
		for _, c := range b.Counts {
			n += c
		}
		if n != len(b.Units) {
			t.Errorf("step %d: counts %v for %d units (remapped wrong)", i, b.Counts, len(b.Units))
		}
	}
	if bp.Annual.Energy >= lo.Annual.Energy {
		t.Errorf("with bypass %.0f kWh/yr, without %.0f: the bypass should win near full speed", bp.Annual.Energy, lo.Annual.Energy)
	}
	if !hasWarning(r, "with the drive bypass the plant draws") {
		t.Errorf("no priced note: %v", r.Warnings)
	}
	t.Logf("lowest %.0f kWh/yr, with drive bypass %.0f kWh/yr", lo.Annual.Energy, bp.Annual.Energy)
}
