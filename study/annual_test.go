package study_test

import (
	"math"
	"testing"
	"time"

	"wattstage/study"
)

// noRange skips the savings range where a test does not need it.
var noRange = study.Options{Sensitivities: []study.Sensitivity{}}

// One week of data and the same week repeated for 52 weeks stand for the
// same year: annual energy within 1 % and simple payback within 2 % for
// every strategy (the invariant). The week's energy, cost and
// emissions are scaled by 8,760/168; its demand charge is its one month's
// peak times 12, as the 52 weeks' (12 to 13 months, the same weekly peak in
// each) mean monthly charge times 12.
func TestWeekStandsForItsYear(t *testing.T) {
	start := time.Date(2025, 3, 3, 0, 0, 0, 0, time.UTC) // a Monday
	ws, wf := hourly(start, 168)
	ys, yf := hourly(start, 52*168)
	week := runPlant(t, writeTrendPlant(t, ws, wf), noRange)
	year := runPlant(t, writeTrendPlant(t, ys, yf), noRange)
	if f := week.Period.Factor; !relClose(f, 8760.0/168, 1e-12) {
		t.Errorf("week's factor %v, want 8760/168", f)
	}
	if f := year.Period.Factor; !relClose(f, 8760.0/8736, 1e-12) {
		t.Errorf("52 weeks' factor %v, want 8760/8736", f)
	}
	for i, w := range week.Strategies {
		y := year.Strategies[i]
		if !relClose(w.Annual.Energy, y.Annual.Energy, 0.01) {
			t.Errorf("%s: a week gives %.0f kWh/yr, 52 weeks %.0f kWh/yr (want within 1 %%)", w.Name, w.Annual.Energy, y.Annual.Energy)
		}
		if !relClose(w.Annual.DemandCost, y.Annual.DemandCost, 0.01) {
			t.Errorf("%s: demand %.0f a year from a week, %.0f from 52 weeks", w.Name, w.Annual.DemandCost, y.Annual.DemandCost)
		}
		if w.Appraisal == nil || y.Appraisal == nil {
			continue
		}
		wp, yp := w.Appraisal.SimplePayback, y.Appraisal.SimplePayback
		if math.IsInf(wp, 1) != math.IsInf(yp, 1) || !math.IsInf(wp, 1) && !relClose(wp, yp, 0.02) {
			t.Errorf("%s: payback %.3f years from a week, %.3f from 52 weeks (want within 2 %%)", w.Name, wp, yp)
		}
	}
	lw, ly := week.Strategy(study.KeyLowest), year.Strategy(study.KeyLowest)
	t.Logf("lowest: week %.1f kWh in the period → %.0f kWh/yr; 52 weeks %.0f kWh/yr; payback %.2f and %.2f years",
		lw.Energy.KWh, lw.Annual.Energy, ly.Annual.Energy, lw.Appraisal.SimplePayback, ly.Appraisal.SimplePayback)
}

// A two-year trend whose second year repeats its first gives the first
// year's annual values: it counts once, not twice.
func TestTwoYearsCountOnce(t *testing.T) {
	if testing.Short() {
		t.Skip("slow (two years of hourly trend): run without -short")
	}
	start := time.Date(2025, 1, 6, 0, 0, 0, 0, time.UTC)
	stamps, flows := hourly(start, 8736) // 52 weeks
	one := runPlant(t, writeTrendPlant(t, stamps, flows), noRange)
	var stamps2 []time.Time
	var flows2 []float64
	for rep := 0; rep < 2; rep++ {
		for i, s := range stamps {
			stamps2 = append(stamps2, s.Add(time.Duration(rep)*8736*time.Hour))
			flows2 = append(flows2, flows[i])
		}
	}
	two := runPlant(t, writeTrendPlant(t, stamps2, flows2), noRange)
	if !relClose(two.Period.Factor, one.Period.Factor/2, 1e-12) {
		t.Errorf("two years' factor %v, want half of one year's %v", two.Period.Factor, one.Period.Factor)
	}
	for i, a := range one.Strategies {
		b := two.Strategies[i]
		// Time-ordered sequences start once, not twice, so their state at
		// the seam may differ for an interval: 0.1 % covers it.
		for _, c := range []struct {
			what string
			x, y float64
		}{
			{"energy (kWh/yr)", a.Annual.Energy, b.Annual.Energy},
			{"energy cost", a.Annual.EnergyCost, b.Annual.EnergyCost},
			{"demand cost", a.Annual.DemandCost, b.Annual.DemandCost},
			{"emissions", a.Annual.Emissions, b.Annual.Emissions},
		} {
			if !relClose(c.y, c.x, 1e-3) {
				t.Errorf("%s: %s %.2f from two years, %.2f from the first year alone", a.Name, c.what, c.y, c.x)
			}
		}
		if relClose(b.Energy.KWh, a.Energy.KWh, 0.5) {
			t.Errorf("%s: two years' period energy %.0f kWh should be about twice one year's %.0f", a.Name, b.Energy.KWh, a.Energy.KWh)
		}
	}
}

// Bins are hours a year with the plant off for the rest (plant file
// format): bins of 3,000 h are not scaled, and a warning says so; with
// profile.annual_hours the same bins are scaled to that many hours.
func TestBinsAreHoursAYear(t *testing.T) {
	p := examplePlant(t, "chilled-water.yaml")
	for i := range p.Profile.Bins {
		p.Profile.Bins[i].Hours *= 3000.0 / 8760
	}
	r := runPlant(t, p, noRange)
	if !relClose(r.Period.Factor, 1, 1e-12) || !relClose(r.Period.AnnualHours, 3000, 1e-9) {
		t.Errorf("bins of 3,000 h: factor %v, %v h a year; want 1 and 3,000", r.Period.Factor, r.Period.AnnualHours)
	}
	if !hasWarning(r, "taken as off for the other 5,760.0 h") {
		t.Errorf("no warning that the plant is off for the rest of the year: %v", r.Warnings)
	}
	lo := r.Strategy(study.KeyLowest)
	if !relClose(lo.Annual.Energy, lo.Energy.KWh, 1e-12) {
		t.Errorf("annual %v kWh, period %v kWh: bins are already a year", lo.Annual.Energy, lo.Energy.KWh)
	}
	p.Profile.AnnualHours = 8760
	s := runPlant(t, p, noRange)
	if !relClose(s.Period.Factor, 8760.0/3000, 1e-12) {
		t.Errorf("annual_hours 8760 on 3,000 h of bins: factor %v, want 2.92", s.Period.Factor)
	}
	if sl := s.Strategy(study.KeyLowest); !relClose(sl.Annual.Energy, 2.92*lo.Energy.KWh, 1e-12) {
		t.Errorf("scaled annual energy %v, want 2.92 × %v", sl.Annual.Energy, lo.Energy.KWh)
	}
}

// A trend longer than KeepStatesUpTo keeps no per-interval states, yet its
// load points still add up to the year and its figures are those of the
// same trend run keeping every state.
func TestLongTrendKeepsAggregatesOnly(t *testing.T) {
	if testing.Short() {
		t.Skip("a 60,000-interval study")
	}
	start := time.Date(2025, 1, 6, 0, 0, 0, 0, time.UTC)
	stamps, flows := hourly(start, 60_000) // 6.8 years of hours
	p := writeTrendPlant(t, stamps, flows)
	r := runPlant(t, p, noRange)
	kept := runPlant(t, p, study.Options{Sensitivities: []study.Sensitivity{}, KeepStates: true})
	for i, s := range r.Strategies {
		if s.Run.Points != nil {
			t.Errorf("%s: %d states kept on a %d-step trend", s.Name, len(s.Run.Points), len(r.Steps))
		}
		var kwh, cost float64
		for _, lp := range s.LoadPoints {
			kwh += lp.KWh
			cost += lp.Cost
		}
		if !relClose(kwh, s.Energy.KWh, 1e-9) || !relClose(cost, s.Bill.EnergyCost, 1e-9) {
			t.Errorf("%s: load points %.3f kWh, %.3f; the period %.3f kWh, %.3f", s.Name, kwh, cost, s.Energy.KWh, s.Bill.EnergyCost)
		}
		k := kept.Strategies[i]
		if len(k.Run.Points) != len(r.Steps) || k.Annual != s.Annual || k.Regions != s.Regions {
			t.Errorf("%s: with states kept %+v, without %+v", s.Name, k.Annual, s.Annual)
		}
	}
}
