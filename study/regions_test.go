package study_test

import (
	"testing"

	"wattstage/study"
)

// The preferred-region strategy keeps every served unit inside 70–120 % of
// BEP flow (ANSI/HI 9.6.3), never draws less than the lowest-power staging,
// and the report counts the unit-hours outside the region and into the
// service factor, with a warning for the latter.
func TestPreferredRegionAndServiceFactorHours(t *testing.T) {
	r := runPlant(t, examplePlant(t, "chilled-water.yaml"), noRange)
	lo, pr := r.Strategy(study.KeyLowest), r.Strategy(study.KeyPreferred)
	if pr == nil {
		t.Fatal("no preferred-region strategy")
	}
	if pr.Regions.OutsidePreferred != 0 {
		t.Errorf("the preferred-region strategy spends %v unit-hours outside it", pr.Regions.OutsidePreferred)
	}
	if lo.Regions.OutsidePreferred == 0 {
		t.Error("the lowest-power staging of the example never leaves the preferred region: the test would not tell")
	}
	if pr.Energy.HoursUnmet == lo.Energy.HoursUnmet && pr.Annual.Energy < lo.Annual.Energy*(1-1e-9) {
		t.Errorf("inside the preferred region %.0f kWh/yr, below the lowest-power staging's %.0f", pr.Annual.Energy, lo.Annual.Energy)
	}
	// Count by hand from the run: every served step's units.
	var outside, over float64
	for i, st := range r.Steps {
		for _, u := range lo.Run.Points[i].Units {
			if !u.Preferred {
				outside += st.Hours
			}
		}
		for _, u := range r.Strategy(study.KeyPartial).Run.Points[i].Units {
			if u.Load > 1 {
				over += st.Hours
			}
		}
	}
	if outside != lo.Regions.OutsidePreferred {
		t.Errorf("outside preferred %v unit-hours, counted %v", lo.Regions.OutsidePreferred, outside)
	}
	if p := r.Strategy(study.KeyPartial); p.Regions.Overload != over || over == 0 || !hasWarning(r, "into the service factor") {
		t.Errorf("partial retrofit into the service factor %v unit-hours, counted %v; warning %v", p.Regions.Overload, over, hasWarning(r, "into the service factor"))
	}
}
